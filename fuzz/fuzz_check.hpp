// fuzz/fuzz_check.hpp — the check the fuzz targets use for properties beyond "no crash".
#pragma once

#include <cstdio>
#include <cstdlib>

// Aborts with the failed condition and its line, so libFuzzer keeps the input as a finding.
#define FUZZ_REQUIRE(condition)                                                          \
  do {                                                                                   \
    if (!(condition)) {                                                                  \
      std::fprintf(stderr, "%s:%d: FUZZ_REQUIRE(%s) failed\n", __FILE__, __LINE__, #condition); \
      std::abort();                                                                      \
    }                                                                                    \
  } while (false)

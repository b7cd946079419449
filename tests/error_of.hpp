// The shaftwork::Error a call throws, for tests of error kinds and messages (not a test
// program itself). Fails the test when the call throws nothing, or throws something
// other than shaftwork::Error: the library promises that type alone.
#pragma once

#include <exception>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"

namespace shaftwork::test {

template <class Call>
Error error_of(Call&& call) {
  try {
    call();
  } catch (const Error& e) {
    return e;
  } catch (const std::exception& e) {
    FAIL("a std::exception escaped, not shaftwork::Error: " << e.what());
  }
  FAIL("no error was thrown");
  return Error(ErrorKind::bad_input, "");
}

}  // namespace shaftwork::test

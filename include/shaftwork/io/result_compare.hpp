// shaftwork/io/result_compare.hpp — a result against its expectations and against a
// recorded result (`shaftwork check`).
//
// Both sides are the numbers of a result by row of result_keys(), as `rate --format json`
// writes them (15 significant digits): result_numbers() of a rating now, a RecordedResult
// of the baseline. A key moves when |now - expected| exceeds its tolerance
// (Tolerance::allows), or when it is present on one side only.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "shaftwork/io/baseline.hpp"
#include "shaftwork/io/expectations.hpp"
#include "shaftwork/io/result_keys.hpp"

namespace shaftwork::io {

// One result key that moved.
struct MovedKey {
  enum class Against { expectation, baseline };
  std::string key;                 // dotted result key
  std::string_view unit;           // its SI symbol ("K"; "" for a fraction or an unknown key)
  std::optional<double> now;       // absent: the result has no such key now
  std::optional<double> expected;  // absent: the baseline has no such key
  Tolerance tolerance;             // the one it was held to
  Against against = Against::expectation;
};

// One line for a report, SI throughout:
//   outlet.temperature: now 368.95 K, expected 368.9 K (expect), difference +0.05 K (+0.0136 %), allowed 0.01 K
//   mass_flow: absent now, expected 3.1 kg/s (baseline)
//   pump_efficiency: now 0.79, not in the baseline
std::string describe(const MovedKey& moved);

// The expectations of a case against its result; an expectation without a tolerance is held
// to `rtol` (relative). Throws bad_input when the result lacks an expected key:
//   expect.mass_flow: the result of this case has no mass_flow
std::vector<MovedKey> compare_expectations(const ResultNumbers& now, const std::vector<Expectation>& expectations,
                                           double rtol);

struct CompareOptions {
  double rtol = 1e-6;                     // relative tolerance (check --rtol)
  std::vector<std::string> ignored_keys;  // result keys the baseline comparison skips (check --ignore)
};

// Every numeric key of a recorded result against the result now: the result keys either
// side holds, at options.rtol unless an expectation of the case gives its own tolerance for
// the key, and every number the recorded result holds under a key that is no result key
// (a baseline from another version). Ignored keys are skipped.
std::vector<MovedKey> compare_with_baseline(const ResultNumbers& now, const RecordedResult& recorded,
                                            const std::vector<Expectation>& expectations,
                                            const CompareOptions& options);

}  // namespace shaftwork::io

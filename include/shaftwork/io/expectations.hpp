// shaftwork/io/expectations.hpp — a case's `expect` block: the results it must give.
//
//   "expect": {
//     "outlet.temperature": "165.8 degC",
//     "efficiency.isentropic": { "value": "81.2 %", "tolerance": "0.1 %" },
//     "power": { "value": "3.72 MW", "tolerance": "5 kW" }
//   }
//
// Each key is a dotted result key of result_keys() and takes a value as case values do: a
// JSON number in SI, or "<number> <unit>" in any unit of the key's dimension (a fraction
// also as a bare number or a percentage; gauge pressures against the case's barometer).
// A tolerance is relative when it is a percentage ("0.1 %" of the expected value), else
// absolute: "<number> <unit>" in a unit of the key's dimension, or a JSON number in SI.
// An absolute tolerance is a difference, so only the unit's scale counts: "0.09 degF" is
// 0.05 K, "0.1 barg" is 0.1 bar. A fraction's absolute tolerance is a bare number (0.002).
// Without a tolerance the run's relative tolerance applies (`check --rtol`, default 1e-6).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/io/result_keys.hpp"

namespace shaftwork::io {

// How far a result may lie from its expected value.
struct Tolerance {
  enum class Kind { relative, absolute };
  Kind kind = Kind::relative;
  double amount = 0;    // relative: a fraction of the expected value; absolute: SI
  std::string written;  // as the user wrote it ("0.1 %", "0.05 K"); "" for --rtol

  // Whether `now` lies within the tolerance of `expected` (always when they are equal).
  bool allows(double now, double expected) const;
  // For reports: "0.05 K" as written, or "1e-06 relative" for --rtol.
  std::string describe() const;
};

// The relative tolerance of a check run (--rtol): what an expectation without one and
// every baseline key are held to.
Tolerance relative_tolerance(double fraction);

struct Expectation {
  const ResultKey* key = nullptr;
  double value = 0;                    // SI
  std::string written;                 // the value as written ("165.8 degC", "0.812")
  std::optional<Tolerance> tolerance;  // absent: the run's relative tolerance
};

// The `expect` block of a case object, in the order of its keys (none when it has no
// block). `barometer` [Pa] reads gauge pressures. Throws bad_input naming the key and the
// problem:
//   expect: "efficiency.isentropc" is no result key; the keys are: inlet.pressure, ...
//   expect.outlet.temperature: tolerance: "0.05 bar": a pressure unit where a temperature belongs
std::vector<Expectation> read_expectations(const nlohmann::json& case_object, double barometer);

}  // namespace shaftwork::io

// shaftwork/io/case_reader.hpp — JSON case files into cases.
//
// A case file holds {"cases": [ ... ]} or a single case object (the contract, "A case
// file"). The keys of a case come from machines::kInputs: a dotted key "inlet.pressure"
// is the key "pressure" of the object "inlet"; "efficiency" may also be a bare number
// (isentropic). Values are read to SI here, keeping the text the user wrote.
#pragma once

#include <limits>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/io/case_input.hpp"
#include "shaftwork/io/fluid_factory.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::io {

// The case objects of a document. Throws bad_input when the document is not a case
// file (not an object, "cases" not an array, no cases): the whole file is unusable.
std::vector<const nlohmann::json*> case_objects(const nlohmann::json& document, const std::string& origin);

// The label of case `index` (0-based) for messages: its "id" when it is a string or a
// number, else "case N" (1-based).
std::string case_label(const nlohmann::json& case_object, size_t index);

// Reads one case from `origin`. Throws shaftwork::Error whose message names the key and
// the problem (the caller adds the case's label).
CaseInput read_case(const nlohmann::json& case_object, size_t index, FluidFactory& fluids,
                    const std::string& origin = "");

// The row of a case key as users write it: a dotted key of machines::kInputs, or the
// shorthand "efficiency" for an isentropic efficiency; nullptr for any other key.
const machines::InputSpec* find_case_input(std::string_view key);

// The problem with a given value beyond machines::value_problem: an efficiency written as
// "0.8 %" (a fraction in a percent column), a barometer in a gauge unit. "" when none.
std::string given_value_problem(machines::Input input, double si, std::string_view unit);
// The SI values for which given_value_problem(input, si, unit) is "" whatever the unit:
// low <= si <= high, a value in its range and at least 0.01 (no efficiency in % to doubt),
// finite; empty for the barometer (whose unit is checked). A batch tests every cell against
// its column's range, and calls given_value_problem() only where it fails.
struct PlainRange {
  double low = 0, high = 0;
  constexpr bool contains(double si) const { return si >= low && si <= high; }  // false for NaN
};
constexpr PlainRange plainly_acceptable_range(machines::Input input) {
  constexpr double kLeast = 0.01;
  if (input == machines::Input::barometric_pressure) return {1, 0};
  switch (machines::spec(input).accepts) {
    case machines::Accepts::fraction:
    case machines::Accepts::unit_closed: return {kLeast, 1};
    case machines::Accepts::positive:
    case machines::Accepts::any: break;
  }
  return {kLeast, std::numeric_limits<double>::max()};
}

// The warning of a case that gives a gauge pressure but no site barometer.
inline constexpr std::string_view kDefaultBarometerWarning =
    "a gauge pressure was given without site.barometric_pressure: 101.325 kPa assumed";

}  // namespace shaftwork::io

// shaftwork/io/case_reader.hpp — JSON case files into rating inputs.
//
// A case file holds {"cases": [ ... ]} or a single case object (the contract,
// "A case file"). Every value is converted to SI here; the unit the user wrote is
// kept so that messages and the table can echo values the way they were given.
#pragma once

#include <map>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/io/fluid_factory.hpp"
#include "shaftwork/machines/rating.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::io {

struct CaseInput {
  std::string id;
  machines::RatingInput rating;
  std::string fluid_name;                                // as given: a name, or the model name
  std::map<machines::Quantity, std::string> unit_written;  // "" or absent: SI number
  double barometric_pressure = units::kStandardAtmosphere;  // Pa
  std::vector<std::string> warnings;
};

// The case objects of a document. Throws bad_input when the document is not a case
// file (not an object, "cases" not an array, no cases): the whole file is unusable.
std::vector<const nlohmann::json*> case_objects(const nlohmann::json& document, const std::string& origin);

// The label of case `index` (0-based): its "id" when it is a string or number,
// else "case N" (1-based).
std::string case_label(const nlohmann::json& case_object, size_t index);

// Reads one case. Throws shaftwork::Error whose message names the key and the
// problem (the caller adds the case's label).
CaseInput read_case(const nlohmann::json& case_object, size_t index, FluidFactory& fluids);

// Writes SI values for messages the way the user wrote each quantity: in the unit of
// `unit_written` ("" or absent: kPa, K, kg/s, kW), gauge units against the barometer [Pa].
machines::ValueEcho make_value_echo(std::map<machines::Quantity, std::string> unit_written,
                                    double barometric_pressure);

// The warning of a case that gives a gauge pressure but no site barometer.
inline constexpr std::string_view kDefaultBarometerWarning =
    "a gauge pressure was given without site.barometric_pressure: 101.325 kPa assumed";

}  // namespace shaftwork::io

// shaftwork/io/uncertainty_input.hpp — reading the stated uncertainties of a case.
//
// A given value may carry its expanded uncertainty (k = 2, about 95 %), as on an instrument
// datasheet: { "value": "2.10 barg", "uncertainty": "0.25 %" }. "%" is a percent of the
// reading as written (0.25 % of 2.10 barg is 0.00525 bar; 1 % of 172.5 degC is 1.725 K);
// anything else is a difference in the value's own dimension ("0.3 K", "0.5 degF" =
// 0.2778 K, "0.01 bar"), a plain number one in SI (for an efficiency, 0.005 is half a
// point). A case, a case file (beside "cases") and a batch template may state uncertainties
// by dotted key: "uncertainty": { "outlet.temperature": "0.3 K", "power": "1.5 %" }; a
// value's own wins over its case's, the case's over its file's. docs/uncertainty.md.
#pragma once

#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/io/case_input.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::io {

// A value as a case file writes it: a number or "<number> <unit>", or an object
// { "value": ..., "uncertainty": ... }. `uncertainty` is nullptr when none is stated.
struct MeasuredJson {
  const nlohmann::json* value = nullptr;
  const nlohmann::json* uncertainty = nullptr;
};
// Throws bad_input "<path>: ..." for an object without "value" or with another key.
MeasuredJson split_measured(const nlohmann::json& value, const std::string& path);

// Reads one stated uncertainty of `input` (`path` names it in messages, as in
// "outlet.temperature.uncertainty"). Throws bad_input "<path>: ..." when it is negative,
// not a number, or of another dimension than the value ("0.3 kPa" for a temperature).
StatedUncertainty read_stated_uncertainty(const nlohmann::json& u, machines::Input input, const std::string& path,
                                          const units::ParseContext& context = {});

// Reads an "uncertainty" object of dotted case keys (`path` is its own path, "uncertainty").
// Throws bad_input for a key that names no case value and for a bad statement.
std::vector<StatedUncertainty> read_uncertainty_by_key(const nlohmann::json& object, const std::string& path,
                                                       const units::ParseContext& context = {});

// Gives each value of `c` that has no uncertainty yet the one `statements` hold for its key.
void apply_uncertainty_by_key(CaseInput& c, const std::vector<StatedUncertainty>& statements);

// The refusal of a case's statement by key for a value the case does not give (a solved
// quantity has no uncertainty to state), "" when every statement has its value.
std::string unused_uncertainty_problem(const CaseInput& c);

// The magnitude of the reading as written, as an SI difference: |number| x the unit's
// scale (210000 Pa for "2.10 barg", 172.5 K for "172.5 degC", |si| for a plain number).
// What a percent-of-reading uncertainty is a percent of; `barometer` [Pa] is the case's.
double reading_magnitude(const GivenValue& g, double barometer);

// The expanded uncertainty [SI] a statement gives a value whose reading is `reading`
// (reading_magnitude).
inline double expanded_of(const StatedUncertainty& s, double reading) {
  return s.relative ? s.value * reading : s.value;
}

// True when some given value of `c` carries an uncertainty.
bool has_uncertainty(const CaseInput& c);

// True when some case of a case document states an uncertainty (an "uncertainty" object, or
// a value written as {"value": ..., "uncertainty": ...}), read or not: the CSV of the
// document's results then carries the uncertainty columns from its header on.
bool states_uncertainty(const nlohmann::json& document);

}  // namespace shaftwork::io

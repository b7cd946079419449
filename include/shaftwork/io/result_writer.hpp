// shaftwork/io/result_writer.hpp — rating results as JSON (the contract's keys, SI),
// a table for a person, and CSV for spreadsheets.
#pragma once

#include <optional>
#include <ostream>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/machines/rating.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::io {

// One case's outcome: a rating, or the error that stopped it.
struct CaseOutcome {
  std::string id;
  std::optional<CaseInput> input;  // absent when the case could not be read
  std::optional<machines::Rating> rating;
  std::string error;               // set when !rating
  std::vector<std::string> warnings;

  bool ok() const { return rating.has_value(); }
};

enum class UnitSystem { si, us };

// The contract's result object for one case (SI numbers; no NaN or infinity: a
// non-finite value turns the case into an error naming the key).
nlohmann::ordered_json result_json(const CaseOutcome& outcome);
// The same from its parts, for callers that hold no CaseOutcome (the batch rater):
// a rated case (`fluid_name` empty: no "fluid" key) and a failed one.
nlohmann::ordered_json result_json(const std::string& id, std::string_view fluid_name,
                                   const machines::Rating& rating, const std::vector<std::string>& warnings);
nlohmann::ordered_json error_json(const std::string& id, const std::string& error,
                                  const std::vector<std::string>& warnings);

// The unit a result of dimension `d` is shown in by table and CSV output ("" for a
// fraction): kPa, degC, kg/s, m3/h, kW, kJ/kg ... in si; psia, degF, lb/h ... in us.
const char* display_unit(units::Dimension d, UnitSystem system);

// One flat result column of the CSV outputs: the dotted key, the dimension (its
// unit goes in brackets after the key), and the SI value from a rating.
struct ResultColumn {
  enum class Applies { always, two_phase, pump };  // which fluids or machines have a value
  const char* key;
  units::Dimension dimension;
  std::optional<double> (*value)(const machines::Rating&);
  bool in_batch;    // a column of the batch CSV (docs/batch.md says why some are not)
  Applies applies;
};
// Every column, in output order: write_csv writes them all.
const std::vector<ResultColumn>& result_columns();

// {"results": [...]} with two-space indentation.
void write_json(std::ostream& out, const std::vector<CaseOutcome>& outcomes);
// One block per case: values with units, given ones in the units they were given,
// solved ones marked, warnings under the case.
void write_table(std::ostream& out, const std::vector<CaseOutcome>& outcomes, UnitSystem system);
// A header row of dotted keys with units in brackets, then one row per case.
void write_csv(std::ostream& out, const std::vector<CaseOutcome>& outcomes, UnitSystem system);

// Quotes a CSV field when it holds a comma, quote or line break (RFC 4180).
std::string csv_field(const std::string& text);

}  // namespace shaftwork::io

// shaftwork/io/result_writer.hpp — rating results as JSON (the contract's keys, SI),
// a table for a person, and CSV for spreadsheets.
#pragma once

#include <optional>
#include <ostream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/machines/rating.hpp"

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

// shaftwork/io/result_writer.hpp — rated cases as JSON (the contract's keys, SI), a table
// for a person, and CSV for spreadsheets. Every writer takes its keys from result_keys().
#pragma once

#include <optional>
#include <ostream>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/io/case_input.hpp"
#include "shaftwork/io/display_units.hpp"
#include "shaftwork/machines/guarantee.hpp"
#include "shaftwork/machines/rating.hpp"

namespace shaftwork::io {

// One case's outcome: a rating, or the error that stopped it.
struct CaseOutcome {
  std::string id;
  std::string origin;              // the file it came from ("" when not from a file)
  std::optional<CaseInput> input;  // absent when the case could not be read
  std::optional<machines::Rating> rating;
  std::string error;  // set when !rating
  std::vector<std::string> warnings;
  // The case's own guarantee (io/guarantee_reader.hpp), judged; or why it could not be.
  std::optional<machines::GuaranteeResult> guarantee;
  std::string guarantee_error;

  bool ok() const { return rating.has_value(); }
  // A guarantee was judged and not met (exit status 3).
  bool guarantee_failed() const { return guarantee && guarantee->verdict == machines::Verdict::fail; }
};

// A file's guarantee judged on all its cases (the "test" beside "results").
struct TestOutcome {
  std::string origin;                  // the file
  std::vector<std::string> points;     // the ids of its test points
  std::optional<CaseInput> units_from;  // a test point's input: the table shows the test in its units
  std::optional<machines::GuaranteeResult> result;
  std::string error;  // set when !result
  std::vector<std::string> warnings;

  bool failed() const { return result && result->verdict == machines::Verdict::fail; }
};

// The guarantee object of a result: verdict, checks, similarity, converted values.
nlohmann::ordered_json guarantee_json(const machines::GuaranteeResult& g);
// The "test" object of a file's guarantee.
nlohmann::ordered_json test_json(const TestOutcome& t);

// The contract's result object for one case (SI numbers rounded to 15 significant digits,
// so that "41.208 bar" reads back as 4120800, not 4120800.0000000005; no NaN or infinity:
// a non-finite value turns the case into an error naming the key).
nlohmann::ordered_json result_json(const CaseOutcome& outcome);

// {"results": [...]} with two-space indentation; with file-level guarantees, "test" beside
// it: the one test's object, or an array of them when several files hold one.
void write_json(std::ostream& out, const std::vector<CaseOutcome>& outcomes, const std::vector<TestOutcome>& tests = {});

struct TableOptions {
  UnitSystem system = UnitSystem::si;
  bool system_forced = false;  // --units was given: it wins over the units of each case
  bool show_origin = false;    // several files: name each case's file
};
// One block per case: the given values as written, solved ones marked, then the results
// in the units of the case; redundant values beside their computed twins; warnings.
// A case's guarantee follows its block; each file's test follows all the cases.
void write_table(std::ostream& out, const std::vector<CaseOutcome>& outcomes, const TableOptions& options,
                 const std::vector<TestOutcome>& tests = {});
// The guarantee block of a table: one line per check (measured, converted, guaranteed,
// tolerance, deviation, verdict), then the similarity lines; in the units of `units`.
void write_guarantee_table(std::ostream& out, const machines::GuaranteeResult& g, const DisplayUnits& units);

// A header row of dotted keys with units in brackets, then one row per case; with
// case-level guarantees, the guarantee columns (guarantee_columns()) after the results.
void write_csv(std::ostream& out, const std::vector<CaseOutcome>& outcomes, UnitSystem system);

// The CSV columns of a guarantee's verdicts: guarantee.verdict, then for each check
// guarantee.<key>.converted [unit], .deviation_percent and .verdict, in that order.
struct GuaranteeColumns {
  std::vector<machines::Checked> checks;
  std::string header(UnitSystem system) const;  // ",guarantee.verdict,..." (a leading comma)
  // The cells (each with a leading comma) of one row: empty when `g` is empty.
  std::string cells(const machines::GuaranteeResult* g, UnitSystem system, const std::string& error) const;
};
// The columns for these guarantees (the checks any of them makes, in kAllChecked order).
GuaranteeColumns guarantee_columns(const std::vector<const machines::GuaranteeResult*>& guarantees);
// The columns a guarantee of `machine` will fill, before any row is judged (batches).
GuaranteeColumns guarantee_columns(const machines::Guarantee& g, machines::MachineKind machine);

// Quotes a CSV field when it holds a comma, quote or line break (RFC 4180).
std::string csv_field(std::string_view text);

}  // namespace shaftwork::io

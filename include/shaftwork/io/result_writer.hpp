// shaftwork/io/result_writer.hpp — rated cases as JSON (the contract's keys, SI), a table
// for a person, and CSV for spreadsheets. Every writer takes its keys from result_keys().
#pragma once

#include <cstddef>
#include <memory>
#include <optional>
#include <ostream>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/io/case_input.hpp"
#include "shaftwork/io/display_units.hpp"
#include "shaftwork/io/uncertainty.hpp"
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
  // Present when the case's given values carry uncertainties (the rating's, propagated).
  std::optional<UncertaintyResult> uncertainty = {};
  // The case's own guarantee (io/guarantee_reader.hpp), judged; or why it could not be.
  std::optional<machines::GuaranteeResult> guarantee = {};
  std::string guarantee_error = {};

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

// The CSV columns of a guarantee's verdicts: guarantee.verdict, then for each check
// guarantee.<key>.converted [unit], .deviation_percent and .verdict, in that order, then
// guarantee.error.
struct GuaranteeColumns {
  // A column's key and its unit ("" for none); a cell's number in that unit, or its text.
  struct Column {
    std::string key;
    std::string unit;
  };
  struct Cell {
    std::optional<double> number;
    std::string text;
  };
  std::vector<machines::Checked> checks;
  std::vector<Column> columns(UnitSystem system) const;
  // One row's cells, column for column: empty when `g` is empty (but the error).
  std::vector<Cell> row(const machines::GuaranteeResult* g, UnitSystem system, const std::string& error) const;
  std::string header(UnitSystem system) const;  // ",guarantee.verdict,..." (a leading comma)
  // The cells (each with a leading comma) of one row, as CSV.
  std::string cells(const machines::GuaranteeResult* g, UnitSystem system, const std::string& error) const;
  // Adds the checks of `other` (the order stays kAllChecked's).
  void add(const GuaranteeColumns& other);
};
// The columns for these guarantees (the checks any of them makes, in kAllChecked order).
GuaranteeColumns guarantee_columns(const std::vector<const machines::GuaranteeResult*>& guarantees);
// The columns a guarantee of `machine` will fill, before any row is judged (batches, and
// the cases' own guarantees before rate writes its header).
GuaranteeColumns guarantee_columns(const machines::Guarantee& g, machines::MachineKind machine);

struct TableOptions {
  UnitSystem system = UnitSystem::si;
  bool system_forced = false;  // --units was given: it wins over the units of each case
  bool show_origin = false;    // several files: name each case's file
  bool uncertainty_columns = false;  // csv, xlsx: the "uncertainty.<key>" columns (some case states an uncertainty)
  // csv, xlsx: the guarantee columns (some case has a guarantee of its own), decided before
  // the header as the uncertainty columns are.
  std::optional<GuaranteeColumns> guarantee_columns = {};
};
// One case's block of the table: the given values as written, solved ones marked, then
// the results in the units of the case; redundant values beside their computed twins;
// warnings; then the case's own guarantee.
void write_case_table(std::ostream& out, const CaseOutcome& outcome, const TableOptions& options);
// A file's test (its guarantee judged on all its cases), written after the file's cases.
void write_test_table(std::ostream& out, const TestOutcome& test, const TableOptions& options);
// The guarantee block of a table: one line per check (measured, converted, guaranteed,
// tolerance, deviation, verdict), then the similarity lines; in the units of `units`.
void write_guarantee_table(std::ostream& out, const machines::GuaranteeResult& g, const DisplayUnits& units);
// How the guarantee's table (and chart) write a checked value and a tolerance: fractions to
// 4 decimals, temperatures to 2, the rest to 5 significant digits; "-2 to +4 %", ">= -3 %",
// "<= +4 %", "any".
Precision guarantee_precision(units::Dimension d);
std::string tolerance_text(const machines::Tolerance& t);

// The CSV of cases: a header row of dotted keys with units in brackets, and one row per
// case (each with its CRLF line end); with options.uncertainty_columns, a column
// "uncertainty.<key> [unit]" for every result key follows the result columns (the results
// keep their places); with options.guarantee_columns, the guarantee columns follow those.
std::string csv_header(const TableOptions& options);
std::string csv_row(const CaseOutcome& outcome, const TableOptions& options);
// The expanded uncertainty of result key number `key` (in result_keys()) of a rated case, in
// its column's unit of `system` (a difference: K for degC); empty where none was propagated.
std::optional<double> uncertainty_in_column_unit(const CaseOutcome& outcome, std::size_t key, UnitSystem system);

// Results written one case at a time, so that a file of many cases needs memory for one
// of them: the table, JSON ({"results": [...]} with two-space indentation), JSON lines
// or CSV.
class ResultStream {
 public:
  virtual ~ResultStream() = default;
  virtual void add(const CaseOutcome& outcome) = 0;
  // A file's test, after the file's cases: the table writes its block at once; JSON writes
  // "test" beside "results" when it finishes (the one test's object, or an array of them
  // when several files hold one); JSON lines a line {"test": {...}}; the workbook a row per
  // check on its sheet "tests"; CSV carries the cases' own guarantees only.
  virtual void add_test(const TestOutcome& /*test*/) {}
  // Closes the document (JSON's brackets); nothing may be added after.
  virtual void finish() {}
};
enum class ResultFormat { table, json, jsonl, csv, xlsx };
std::unique_ptr<ResultStream> make_result_stream(ResultFormat format, std::ostream& out, const TableOptions& options);

// Excel's limit of rows in a worksheet (Microsoft, "Excel specifications and limits").
inline constexpr std::size_t kWorkbookRowLimit = 1048576;
// The workbook (ResultFormat::xlsx, through libxlsxwriter): a worksheet "results" with a row
// of the CSV's column keys (the uncertainty and guarantee columns too, as `options` asks), a
// row of their units (the system's, as the CSV's), then a row per case with its numbers as
// numbers; a failed case has its status "error" and the message. Files' tests (add_test)
// go to a second worksheet "tests", a row per check. Rows go to a temporary file as they
// come (flat memory); finish() writes the zipped workbook to `out`. A case beyond
// `row_limit` rows throws bad_input "the workbook would pass Excel's limit of 1048576
// rows: ..."; nothing is written to `out` then.
std::unique_ptr<ResultStream> make_workbook_stream(std::ostream& out, const TableOptions& options,
                                                   std::size_t row_limit = kWorkbookRowLimit);

// The whole document of `outcomes` (and the files' `tests`) in one format (tests, small
// outputs); the CSV's optional columns follow what the outcomes hold.
void write_results(std::ostream& out, ResultFormat format, const std::vector<CaseOutcome>& outcomes,
                   const TableOptions& options = {}, const std::vector<TestOutcome>& tests = {});

// Quotes a CSV field when it holds a comma, quote or line break (RFC 4180).
std::string csv_field(std::string_view text);

}  // namespace shaftwork::io

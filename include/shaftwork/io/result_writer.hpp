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

  bool ok() const { return rating.has_value(); }
};

// The contract's result object for one case (SI numbers rounded to 15 significant digits,
// so that "41.208 bar" reads back as 4120800, not 4120800.0000000005; no NaN or infinity:
// a non-finite value turns the case into an error naming the key).
nlohmann::ordered_json result_json(const CaseOutcome& outcome);


struct TableOptions {
  UnitSystem system = UnitSystem::si;
  bool system_forced = false;  // --units was given: it wins over the units of each case
  bool show_origin = false;    // several files: name each case's file
  bool uncertainty_columns = false;  // csv: the "uncertainty.<key>" columns (some case states an uncertainty)
};
// One case's block of the table: the given values as written, solved ones marked, then
// the results in the units of the case; redundant values beside their computed twins;
// warnings.
void write_case_table(std::ostream& out, const CaseOutcome& outcome, const TableOptions& options);

// The CSV of cases: a header row of dotted keys with units in brackets, and one row per
// case (each with its CRLF line end); with `uncertainty`, a column "uncertainty.<key> [unit]"
// for every result key follows the result columns (the results keep their places).
std::string csv_header(UnitSystem system, bool uncertainty = false);
std::string csv_row(const CaseOutcome& outcome, UnitSystem system, bool uncertainty = false);

// Results written one case at a time, so that a file of many cases needs memory for one
// of them: the table, JSON ({"results": [...]} with two-space indentation), JSON lines
// or CSV.
class ResultStream {
 public:
  virtual ~ResultStream() = default;
  virtual void add(const CaseOutcome& outcome) = 0;
  // Closes the document (JSON's brackets); nothing may be added after.
  virtual void finish() {}
};
enum class ResultFormat { table, json, jsonl, csv, xlsx };
std::unique_ptr<ResultStream> make_result_stream(ResultFormat format, std::ostream& out, const TableOptions& options);

// Excel's limit of rows in a worksheet (Microsoft, "Excel specifications and limits").
inline constexpr std::size_t kWorkbookRowLimit = 1048576;
// The workbook (ResultFormat::xlsx, through libxlsxwriter): one worksheet "results", a row of
// the CSV's column keys, a row of their units (the system's, as the CSV's), then a row per
// case with its numbers as numbers; a failed case has its status "error" and the message.
// Rows go to a temporary file as they come (flat memory); finish() writes the zipped
// workbook to `out`. A case beyond `row_limit` rows throws bad_input "the workbook would
// pass Excel's limit of 1048576 rows: ..."; nothing is written to `out` then.
std::unique_ptr<ResultStream> make_workbook_stream(std::ostream& out, UnitSystem system,
                                                   std::size_t row_limit = kWorkbookRowLimit);

// The whole document of `outcomes` in one format (tests, small outputs).
void write_results(std::ostream& out, ResultFormat format, const std::vector<CaseOutcome>& outcomes,
                   const TableOptions& options = {});

// Quotes a CSV field when it holds a comma, quote or line break (RFC 4180).
std::string csv_field(std::string_view text);

}  // namespace shaftwork::io

// shaftwork/io/case_check.hpp — the verdict of `shaftwork check` on one case, and the
// report lines it prints.
//
// A case passes when it rates, meets every expectation of its `expect` block and, with a
// baseline, matches its recorded result in every numeric key. The report gives one line
// per case, a failed case's problems on indented lines below it, and closes with
// "N passed, N failed" (every verdict but `passed` counts as failed).
#pragma once

#include <ostream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/io/baseline.hpp"
#include "shaftwork/io/result_compare.hpp"
#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::io {

enum class Verdict {
  passed,
  failed,    // a key moved, or the case is not in the baseline
  error,     // the case could not be rated, or its expect block is wrong
  missing,   // in the baseline, not among the cases checked
  unusable,  // a whole file could not be used (no case of it was checked)
};

struct CaseCheck {
  Verdict verdict = Verdict::passed;
  std::string file;  // as results name it (normal_file_name)
  std::string id;    // "" for an unusable file
  // failed: one line per problem (describe(MovedKey), "not in the baseline ...");
  // error, missing: one line, the reason; unusable: the reason, which names the file.
  std::vector<std::string> details;
};

// Checks one rated case: `case_object` is the case as read (for its expect block); with a
// baseline, the case's recorded result is taken from it (Baseline::take) and compared.
CaseCheck check_case(const CaseOutcome& outcome, const nlohmann::json& case_object, Baseline* baseline,
                     const CompareOptions& options);

// A recorded result that no case took.
CaseCheck missing_case(const RecordedResult& recorded);

// Writes a check's lines (each ending in a newline); text from files has its control
// characters escaped:
//   passed  examples/a.json: case "D1"
//   failed  examples/a.json: case "D2"
//     outlet.temperature: now 368.95 K, expected 368.9 K (expect), difference ...
//   error   examples/a.json: case "D3": outlet.pressure: "3 degC": a temperature unit where a pressure belongs
//   failed  examples/a.json: case "D4": in the baseline, not among the cases checked
//   error   examples/b.json: not valid JSON: ...        (an unusable file)
void write_check_lines(std::ostream& out, const CaseCheck& check);

// "N passed, N failed".
std::string summary_line(const std::vector<CaseCheck>& checks);

}  // namespace shaftwork::io

#include "shaftwork/io/case_check.hpp"

#include <algorithm>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/expectations.hpp"
#include "shaftwork/text.hpp"

namespace shaftwork::io {
namespace {

using nlohmann::json;
using nlohmann::ordered_json;

std::string string_or_empty(const json& j, const char* key) {
  const auto found = j.find(key);
  return found != j.end() && found->is_string() ? found->get<std::string>() : std::string();
}

// The problems of a rated case: its expectations, then its baseline.
std::vector<std::string> problems_of(const CaseOutcome& o, const ordered_json& result, const json& case_object,
                                     const Baseline* baseline, const json* recorded, const CompareOptions& options) {
  const double barometer = o.input ? o.input->barometer() : units::kStandardAtmosphere;
  const std::vector<Expectation> expectations = read_expectations(case_object, barometer);
  std::vector<MovedKey> moved = compare_expectations(result, expectations, options.rtol);
  std::vector<std::string> problems;
  if (baseline != nullptr && recorded == nullptr) {
    problems.emplace_back("not in the baseline (record it with --record once the case is reviewed)");
  } else if (recorded != nullptr && string_or_empty(*recorded, "status") != "ok") {
    problems.push_back(fmt::format("the baseline records this case as failed (\"{}\"); it rates now",
                                   string_or_empty(*recorded, "error")));
  } else if (recorded != nullptr) {
    const auto more = compare_with_baseline(result, *recorded, expectations, options);
    moved.insert(moved.end(), more.begin(), more.end());
  }
  for (const MovedKey& m : moved) problems.push_back(describe(m));
  return problems;
}

// "FILE: case "ID"", or "case "ID"" without a file.
std::string where(const CaseCheck& c) {
  const std::string id = fmt::format("case \"{}\"", escape_control(c.id));
  return c.file.empty() ? id : fmt::format("{}: {}", escape_control(c.file), id);
}

}  // namespace

CaseCheck check_case(const CaseOutcome& o, const json& case_object, Baseline* baseline,
                     const CompareOptions& options) {
  CaseCheck check;
  check.file = o.origin;
  check.id = o.id;
  const json* recorded = baseline != nullptr ? baseline->take(o.origin, o.id) : nullptr;
  ordered_json result;
  if (o.ok()) result = result_json(o);  // the result as `rate --format json` prints it
  if (!o.ok() || result["status"] != "ok") {
    check.verdict = Verdict::error;
    check.details.push_back(o.ok() ? result["error"].get<std::string>() : o.error);
    return check;
  }
  try {
    check.details = problems_of(o, result, case_object, baseline, recorded, options);
  } catch (const Error& e) {
    check.verdict = Verdict::error;
    check.details = {e.what()};
    return check;
  }
  check.verdict = check.details.empty() ? Verdict::passed : Verdict::failed;
  return check;
}

CaseCheck missing_case(const json& recorded) {
  CaseCheck check;
  check.verdict = Verdict::missing;
  check.file = normal_file_name(string_or_empty(recorded, "file"));
  check.id = string_or_empty(recorded, "id");
  check.details.emplace_back("in the baseline, not among the cases checked");
  return check;
}

void write_check_lines(std::ostream& out, const CaseCheck& c) {
  const std::string first = c.details.empty() ? std::string() : escape_control(c.details.front());
  switch (c.verdict) {
    case Verdict::passed: out << "passed  " << where(c) << '\n'; break;
    case Verdict::failed:
      out << "failed  " << where(c) << '\n';
      for (const std::string& d : c.details) out << "  " << escape_control(d) << '\n';
      break;
    case Verdict::error: out << "error   " << where(c) << ": " << first << '\n'; break;
    case Verdict::missing: out << "failed  " << where(c) << ": " << first << '\n'; break;
    case Verdict::unusable: out << "error   " << first << '\n'; break;  // the reason names the file
  }
}

std::string summary_line(const std::vector<CaseCheck>& checks) {
  const auto passed = std::count_if(checks.begin(), checks.end(),
                                    [](const CaseCheck& c) { return c.verdict == Verdict::passed; });
  return fmt::format("{} passed, {} failed", passed, static_cast<std::ptrdiff_t>(checks.size()) - passed);
}

}  // namespace shaftwork::io

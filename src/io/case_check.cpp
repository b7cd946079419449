#include "shaftwork/io/case_check.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/expectations.hpp"
#include "shaftwork/text.hpp"

namespace shaftwork::io {
namespace {

using nlohmann::json;

// The problems of a rated case: its expectations, then its baseline.
std::vector<std::string> problems_of(const CaseOutcome& o, const ResultNumbers& now, const json& case_object,
                                     const Baseline* baseline, const RecordedResult* recorded,
                                     const CompareOptions& options) {
  const double barometer = o.input ? o.input->barometer() : units::kStandardAtmosphere;
  const std::vector<Expectation> expectations = read_expectations(case_object, barometer);
  std::vector<MovedKey> moved = compare_expectations(now, expectations, options.rtol);
  std::vector<std::string> problems;
  if (baseline != nullptr && recorded == nullptr) {
    problems.emplace_back("not in the baseline (record it with --record once the case is reviewed)");
  } else if (recorded != nullptr && recorded->status != "ok") {
    problems.push_back(fmt::format("the baseline records this case as failed (\"{}\"); it rates now", recorded->error));
  } else if (recorded != nullptr) {
    const auto more = compare_with_baseline(now, *recorded, expectations, options);
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
  const RecordedResult* recorded = baseline != nullptr ? baseline->take(o.origin, o.id) : nullptr;
  const ResultNumbers now = o.ok() ? result_numbers(*o.rating) : ResultNumbers();
  const bool finite = std::all_of(now.begin(), now.end(), [](const auto& v) { return !v || std::isfinite(*v); });
  if (!o.ok() || !finite) {
    check.verdict = Verdict::error;
    check.details.push_back(o.ok() ? result_json(o)["error"].get<std::string>() : o.error);  // names the key
    return check;
  }
  try {
    check.details = problems_of(o, now, case_object, baseline, recorded, options);
  } catch (const Error& e) {
    check.verdict = Verdict::error;
    check.details = {e.what()};
    return check;
  }
  check.verdict = check.details.empty() ? Verdict::passed : Verdict::failed;
  return check;
}

CaseCheck missing_case(const RecordedResult& recorded) {
  CaseCheck check;
  check.verdict = Verdict::missing;
  check.file = recorded.file;
  check.id = recorded.id;
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

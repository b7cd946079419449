#include "shaftwork/io/case_runner.hpp"

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/guarantee_reader.hpp"

namespace shaftwork::io {

using nlohmann::json;

CaseOutcome rate_case(const json& case_object, size_t index, FluidFactory& fluids, const std::string& origin) {
  CaseOutcome outcome;
  outcome.id = case_label(case_object, index);
  outcome.origin = origin;
  try {
    CaseInput input = read_case(case_object, index, fluids, origin);
    outcome.warnings = input.warnings;
    machines::Rating rating = machines::rate(to_rating_input(input));
    outcome.warnings.insert(outcome.warnings.end(), rating.warnings.begin(), rating.warnings.end());
    outcome.input = std::move(input);
    outcome.rating = std::move(rating);
    const std::string guarantee(kGuaranteeKey);
    if (case_object.contains(guarantee)) judge_case_guarantee(case_object[guarantee], fluids, outcome);
  } catch (const Error& e) {
    outcome.error = e.what();
  } catch (const json::exception& e) {
    outcome.error = fmt::format("unexpected JSON content: {}", e.what());
  }
  return outcome;
}

std::vector<CaseOutcome> rate_document(const json& document, const std::string& origin, FluidFactory& fluids) {
  std::vector<CaseOutcome> outcomes;
  const auto cases = case_objects(document, origin);
  outcomes.reserve(cases.size());
  for (size_t i = 0; i < cases.size(); ++i) outcomes.push_back(rate_case(*cases[i], i, fluids, origin));
  return outcomes;
}

RatedFile rate_file(const json& document, const std::string& origin, FluidFactory& fluids) {
  RatedFile out;
  out.cases = rate_document(document, origin, fluids);
  const std::string guarantee(kGuaranteeKey);
  // A single case object's "guarantee" is the case's own, judged by rate_case.
  if (document.contains("cases") && document.contains(guarantee)) {
    out.test = judge_file_guarantee(document[guarantee], out.cases, origin, fluids);
  }
  return out;
}

}  // namespace shaftwork::io

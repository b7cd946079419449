#include "shaftwork/io/case_runner.hpp"

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::io {

using nlohmann::json;

CaseOutcome rate_case(const json& case_object, size_t index, FluidFactory& fluids) {
  CaseOutcome outcome;
  outcome.id = case_label(case_object, index);
  try {
    CaseInput input = read_case(case_object, index, fluids);
    outcome.warnings = input.warnings;
    machines::Rating rating = machines::rate(input.rating);
    outcome.warnings.insert(outcome.warnings.end(), rating.warnings.begin(), rating.warnings.end());
    outcome.input = std::move(input);
    outcome.rating = std::move(rating);
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
  for (size_t i = 0; i < cases.size(); ++i) outcomes.push_back(rate_case(*cases[i], i, fluids));
  return outcomes;
}

}  // namespace shaftwork::io

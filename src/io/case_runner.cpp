#include "shaftwork/io/case_runner.hpp"

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/case_reader.hpp"

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

}  // namespace shaftwork::io

namespace shaftwork::io {

void CaseIdRegister::check(CaseOutcome& outcome, size_t index) {
  const auto [at, added] = seen_.try_emplace(outcome.id, fmt::format("{}, case {}", outcome.origin, index + 1));
  if (added) return;
  outcome.warnings.push_back(fmt::format(
      "the id \"{}\" was used before ({}): results of one id are hard to tell apart", outcome.id, at->second));
}

}  // namespace shaftwork::io

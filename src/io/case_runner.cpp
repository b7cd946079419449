#include "shaftwork/io/case_runner.hpp"

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/guarantee_reader.hpp"
#include "shaftwork/io/uncertainty_input.hpp"

namespace shaftwork::io {

using nlohmann::json;

CaseOutcome rate_case(const json& case_object, size_t index, FluidFactory& fluids, const std::string& origin,
                      const std::vector<StatedUncertainty>& file_uncertainty) {
  CaseOutcome outcome;
  outcome.id = case_label(case_object, index);
  outcome.origin = origin;
  try {
    CaseInput input = read_case(case_object, index, fluids, origin);
    if (const std::string problem = unused_uncertainty_problem(input); !problem.empty()) {
      throw Error(ErrorKind::bad_input, problem);
    }
    apply_uncertainty_by_key(input, file_uncertainty);
    outcome.warnings = input.warnings;
    machines::Rating rating = machines::rate(to_rating_input(input));
    outcome.warnings.insert(outcome.warnings.end(), rating.warnings.begin(), rating.warnings.end());
    if (has_uncertainty(input)) {
      outcome.uncertainty = propagate_uncertainty(input, rating);
      const auto& w = outcome.uncertainty->warnings;
      outcome.warnings.insert(outcome.warnings.end(), w.begin(), w.end());
    }
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

std::vector<StatedUncertainty> file_uncertainty(const json& document, const std::string& origin) {
  const std::string key(kUncertaintyKey);
  // A document that is one case: its "uncertainty" is the case's own.
  if (!document.is_object() || !document.contains("cases") || !document.contains(key) || document[key].is_null()) {
    return {};
  }
  try {
    return read_uncertainty_by_key(document[key], key);
  } catch (const Error& e) {
    throw e.with_context(origin);
  }
}

std::vector<CaseOutcome> rate_document(const json& document, const std::string& origin, FluidFactory& fluids) {
  std::vector<CaseOutcome> outcomes;
  const auto cases = case_objects(document, origin);
  const std::vector<StatedUncertainty> defaults = file_uncertainty(document, origin);
  outcomes.reserve(cases.size());
  for (size_t i = 0; i < cases.size(); ++i) outcomes.push_back(rate_case(*cases[i], i, fluids, origin, defaults));
  return outcomes;
}

RatedFile rate_file(const json& document, const std::string& origin, FluidFactory& fluids) {
  RatedFile out;
  out.cases = rate_document(document, origin, fluids);
  FileTest test(document, origin);
  if (!test.active()) return out;
  for (const CaseOutcome& o : out.cases) test.add(o);
  out.test = test.finish(fluids);
  return out;
}

void CaseIdRegister::check(CaseOutcome& outcome, size_t index) {
  const auto [at, added] = seen_.try_emplace(outcome.id, fmt::format("{}, case {}", outcome.origin, index + 1));
  if (added) return;
  outcome.warnings.push_back(fmt::format(
      "the id \"{}\" was used before ({}): results of one id are hard to tell apart", outcome.id, at->second));
}

}  // namespace shaftwork::io

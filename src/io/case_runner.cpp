#include "shaftwork/io/case_runner.hpp"

#include <set>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::io {

using nlohmann::json;

json parse_json_strict(std::string_view text, const std::string& origin) {
  std::vector<std::set<std::string>> keys_per_object;
  std::string duplicate;
  auto watch = [&](int /*depth*/, json::parse_event_t event, json& parsed) {
    switch (event) {
      case json::parse_event_t::object_start: keys_per_object.emplace_back(); break;
      case json::parse_event_t::object_end: keys_per_object.pop_back(); break;
      case json::parse_event_t::key:
        if (!keys_per_object.back().insert(parsed.get<std::string>()).second && duplicate.empty()) {
          duplicate = parsed.get<std::string>();
        }
        break;
      default: break;
    }
    return true;
  };
  json document;
  try {
    document = json::parse(text.begin(), text.end(), watch);
  } catch (const json::parse_error& e) {
    // nlohmann's text reads "[json.exception.parse_error.101] parse error at line 3, column 5: ..."
    std::string what = e.what();
    if (auto at = what.find("parse error"); at != std::string::npos) what = what.substr(at);
    throw Error(ErrorKind::bad_input, fmt::format("{}: not valid JSON: {}", origin, what));
  }
  if (!duplicate.empty()) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: the key \"{}\" appears twice in one object; keep one", origin, duplicate));
  }
  return document;
}

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

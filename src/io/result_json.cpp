// Results as the contract's JSON: one object per case, its numbers placed by the dotted
// keys of result_keys().
#include <cmath>
#include <cstdlib>

#include <fmt/format.h>

#include "shaftwork/io/result_keys.hpp"
#include "shaftwork/io/result_writer.hpp"
#include "json_numbers.hpp"

namespace shaftwork::io {

using nlohmann::ordered_json;

double json_rounded(double x) {
  if (x == 0 || !std::isfinite(x)) return x + 0.0;
  const std::string text = fmt::format("{:.15g}", x);
  return std::strtod(text.c_str(), nullptr);
}

void json_place(ordered_json& j, std::string_view key, double value) {
  ordered_json* at = &j;
  for (auto dot = key.find('.'); dot != std::string_view::npos; dot = key.find('.')) {
    at = &(*at)[std::string(key.substr(0, dot))];
    key.remove_prefix(dot + 1);
  }
  (*at)[std::string(key)] = json_rounded(value);
}

namespace {

ordered_json error_json(const CaseOutcome& o) {
  ordered_json j;
  j["id"] = o.id;
  if (!o.origin.empty()) j["file"] = o.origin;
  j["status"] = "error";
  j["error"] = o.error;
  if (!o.warnings.empty()) j["warnings"] = o.warnings;
  return j;
}

ordered_json given_json(const CaseInput& in) {
  ordered_json given = ordered_json::object();
  for (const GivenValue& g : in.given) given[std::string(machines::key_of(g.input))] = g.written;
  return given;
}

}  // namespace

ordered_json result_json(const CaseOutcome& o) {
  if (!o.ok()) return error_json(o);
  const machines::Rating& r = *o.rating;
  ordered_json j;
  j["id"] = o.id;
  if (!o.origin.empty()) j["file"] = o.origin;
  j["status"] = "ok";
  j["machine"] = o.input ? o.input->machine_written : machines::machine_name(r.machine);
  if (o.input) j["fluid"] = o.input->fluid_label;
  j["model"] = r.model;
  j["solved_for"] = r.solved_for.keys();
  if (o.input) j["given"] = given_json(*o.input);
  for (const ResultKey& k : result_keys()) {
    const std::optional<double> v = k.value(r);
    if (!v) continue;
    if (!std::isfinite(*v)) {
      CaseOutcome failed;
      failed.id = o.id;
      failed.origin = o.origin;
      failed.error = fmt::format("the result {} is not a finite number; the case cannot be rated", k.key);
      failed.warnings = o.warnings;
      return error_json(failed);
    }
    json_place(j, k.key, *v);
  }
  if (r.efficiency_check) j["efficiency_check"]["key"] = machines::key_of(r.efficiency_check->input);
  if (o.guarantee) {
    j["guarantee"] = guarantee_json(*o.guarantee);
  } else if (!o.guarantee_error.empty()) {
    j["guarantee"] = ordered_json{{"status", "error"}, {"error", o.guarantee_error}};
  }
  j["warnings"] = o.warnings;
  return j;
}

void write_json(std::ostream& out, const std::vector<CaseOutcome>& outcomes, const std::vector<TestOutcome>& tests) {
  ordered_json doc;
  doc["results"] = ordered_json::array();
  for (const auto& o : outcomes) doc["results"].push_back(result_json(o));
  if (tests.size() == 1) doc["test"] = test_json(tests.front());
  if (tests.size() > 1) {
    doc["test"] = ordered_json::array();
    for (const TestOutcome& t : tests) doc["test"].push_back(test_json(t));
  }
  out << doc.dump(2, ' ', false, ordered_json::error_handler_t::replace) << '\n';
}

}  // namespace shaftwork::io

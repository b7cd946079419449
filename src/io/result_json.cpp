// Results as the contract's JSON: one object per case, its numbers placed by the dotted
// keys of result_keys().
#include <cmath>

#include <fmt/format.h>

#include "shaftwork/io/number_format.hpp"
#include "shaftwork/io/result_keys.hpp"
#include "shaftwork/io/result_writer.hpp"
#include "json_numbers.hpp"

namespace shaftwork::io {

using nlohmann::ordered_json;

void json_place(ordered_json& j, std::string_view key, double value) {
  ordered_json* at = &j;
  for (auto dot = key.find('.'); dot != std::string_view::npos; dot = key.find('.')) {
    at = &(*at)[std::string(key.substr(0, dot))];
    key.remove_prefix(dot + 1);
  }
  (*at)[std::string(key)] = rounded_for_output(value);
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

// An uncertainty's digits: six, far more than it is known to (GUM 7.2.6 quotes two), enough
// to compute with, and clear of the last digits' noise of the sensitivity differences.
constexpr int kUncertaintyDigits = 6;

// U of every result that has a value, by dotted key; null where it is not available.
ordered_json uncertainty_json(const UncertaintyResult& u, const machines::Rating& r) {
  ordered_json out = ordered_json::object();
  const auto& keys = result_keys();
  for (std::size_t k = 0; k < keys.size(); ++k) {
    const std::optional<double> v = keys[k].value(r);
    if (!v || !std::isfinite(*v)) continue;
    const std::optional<double> expanded = k < u.expanded.size() ? u.expanded[k] : std::nullopt;
    out[std::string(keys[k].key)] =
        expanded ? ordered_json(rounded_for_output(*expanded, kUncertaintyDigits)) : ordered_json(nullptr);
  }
  return out;
}

ordered_json contributions_json(const UncertaintyResult& u) {
  ordered_json out = ordered_json::object();
  for (const KeyContributions& c : u.contributions) {
    ordered_json shares = ordered_json::array();
    for (const Contribution& share : c.shares) {
      shares.push_back({{"input", machines::key_of(share.input)},
                        {"share_percent", std::round(10 * share.share_percent) / 10}});
    }
    out[std::string(c.key)] = std::move(shares);
  }
  return out;
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
  if (o.input && !o.input->standard_reference.empty()) j["standard_reference"] = o.input->standard_reference;
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
  if (o.uncertainty) {
    j["uncertainty"] = uncertainty_json(*o.uncertainty, r);
    j["uncertainty_contributions"] = contributions_json(*o.uncertainty);
  }
  if (o.guarantee) {
    j["guarantee"] = guarantee_json(*o.guarantee);
  } else if (!o.guarantee_error.empty()) {
    j["guarantee"] = ordered_json{{"status", "error"}, {"error", o.guarantee_error}};
  }
  j["warnings"] = o.warnings;
  return j;
}

}  // namespace shaftwork::io

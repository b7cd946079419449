#include "shaftwork/io/result_compare.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/case_input.hpp"
#include "shaftwork/io/json_quantity.hpp"
#include "shaftwork/io/number_format.hpp"

namespace shaftwork::io {
namespace {

using nlohmann::json;
using nlohmann::ordered_json;

template <class Json>
std::optional<double> number_along(const Json& result, std::string_view key) {
  const Json* at = &result;
  for (;;) {
    if (!at->is_object()) return std::nullopt;
    const auto dot = key.find('.');
    const auto found = at->find(key.substr(0, dot));
    if (found == at->end()) return std::nullopt;
    at = &*found;
    if (dot == std::string_view::npos) break;
    key.remove_prefix(dot + 1);
  }
  if (!at->is_number()) return std::nullopt;
  return at->template get<double>();
}

// " K" after a number, or nothing for a fraction.
std::string with_unit(double x, std::string_view unit) {
  return unit.empty() ? fmt::format("{}", x) : fmt::format("{} {}", x, unit);
}

// A difference to 3 significant digits, with its sign: "+0.047", "-14300", "+6.5e-07".
std::string signed_3(double x) {
  std::string text = x < 0 ? "" : "+";
  append_significant(text, x, 3);
  return text;
}

const Expectation* expectation_of(const std::vector<Expectation>& expectations, const ResultKey& k) {
  for (const Expectation& e : expectations) {
    if (e.key == &k) return &e;
  }
  return nullptr;
}

// The numbers of a JSON object and of the objects inside it (not inside arrays).
std::size_t count_numbers(const json& j) {
  std::size_t n = 0;
  for (const auto& item : j.items()) {
    if (item.value().is_number()) ++n;
    if (item.value().is_object()) n += count_numbers(item.value());
  }
  return n;
}

// Moves for every number of `recorded` whose dotted key (`prefix` + its key) is no result key.
void add_unknown_numbers(const json& recorded, const std::string& prefix, const Tolerance& tolerance,
                         std::vector<MovedKey>& moved) {
  for (const auto& item : recorded.items()) {
    const std::string key = prefix + item.key();
    if (item.value().is_object()) add_unknown_numbers(item.value(), key + ".", tolerance, moved);
    if (!item.value().is_number() || find_result_key(key) != nullptr) continue;
    moved.push_back({key, "", std::nullopt, item.value().get<double>(), tolerance, MovedKey::Against::baseline});
  }
}

}  // namespace

std::optional<double> number_at(const ordered_json& result, std::string_view key) {
  return number_along(result, key);
}

std::optional<double> number_at(const json& result, std::string_view key) { return number_along(result, key); }

std::string describe(const MovedKey& m) {
  const char* source = m.against == MovedKey::Against::baseline ? "baseline" : "expect";
  if (!m.now) return fmt::format("{}: absent now, expected {} ({})", m.key, with_unit(*m.expected, m.unit), source);
  if (!m.expected) return fmt::format("{}: now {}, not in the baseline", m.key, with_unit(*m.now, m.unit));
  const double difference = *m.now - *m.expected;
  std::string line = fmt::format("{}: now {}, expected {} ({}), difference {}{}{}", m.key,
                                 with_unit(*m.now, m.unit), with_unit(*m.expected, m.unit), source,
                                 signed_3(difference), m.unit.empty() ? "" : " ", m.unit);
  if (*m.expected != 0) line += fmt::format(" ({} %)", signed_3(100 * difference / std::abs(*m.expected)));
  return line + ", allowed " + m.tolerance.describe();
}

std::vector<MovedKey> compare_expectations(const ordered_json& result, const std::vector<Expectation>& expectations,
                                           double rtol) {
  std::vector<MovedKey> moved;
  for (const Expectation& e : expectations) {
    const std::optional<double> now = number_at(result, e.key->key);
    if (!now) {
      throw Error(ErrorKind::bad_input,
                  fmt::format("{}.{}: the result of this case has no {}", kExpectKey, e.key->key, e.key->key));
    }
    const Tolerance tolerance = e.tolerance.value_or(relative_tolerance(rtol));
    if (!tolerance.allows(*now, e.value)) {
      moved.push_back({std::string(e.key->key), si_symbol(e.key->dimension), now, e.value, tolerance,
                       MovedKey::Against::expectation});
    }
  }
  return moved;
}

std::vector<MovedKey> compare_with_baseline(const ordered_json& result, const json& recorded,
                                            const std::vector<Expectation>& expectations,
                                            const CompareOptions& options) {
  std::vector<MovedKey> moved;
  const Tolerance rtol = relative_tolerance(options.rtol);
  std::size_t recorded_numbers = 0;
  for (const ResultKey& k : result_keys()) {
    const std::optional<double> was = number_at(recorded, k.key);
    if (was) ++recorded_numbers;
    const auto& ignored = options.ignored_keys;
    if (std::find(ignored.begin(), ignored.end(), k.key) != ignored.end()) continue;
    const std::optional<double> now = number_at(result, k.key);
    if (!now && !was) continue;
    const Expectation* e = expectation_of(expectations, k);
    const Tolerance tolerance = e && e->tolerance ? *e->tolerance : rtol;
    if (now && was && tolerance.allows(*now, *was)) continue;
    moved.push_back({std::string(k.key), si_symbol(k.dimension), now, was, tolerance, MovedKey::Against::baseline});
  }
  if (recorded_numbers != count_numbers(recorded)) add_unknown_numbers(recorded, "", rtol, moved);
  return moved;
}

}  // namespace shaftwork::io

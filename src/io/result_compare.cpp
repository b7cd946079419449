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

}  // namespace

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

std::vector<MovedKey> compare_expectations(const ResultNumbers& now, const std::vector<Expectation>& expectations,
                                           double rtol) {
  std::vector<MovedKey> moved;
  for (const Expectation& e : expectations) {
    const std::optional<double> value = now[row_of(*e.key)];
    if (!value) {
      throw Error(ErrorKind::bad_input,
                  fmt::format("{}.{}: the result of this case has no {}", kExpectKey, e.key->key, e.key->key));
    }
    const Tolerance tolerance = e.tolerance.value_or(relative_tolerance(rtol));
    if (!tolerance.allows(*value, e.value)) {
      moved.push_back({std::string(e.key->key), si_symbol(e.key->dimension), value, e.value, tolerance,
                       MovedKey::Against::expectation});
    }
  }
  return moved;
}

std::vector<MovedKey> compare_with_baseline(const ResultNumbers& now, const RecordedResult& recorded,
                                            const std::vector<Expectation>& expectations,
                                            const CompareOptions& options) {
  std::vector<MovedKey> moved;
  const Tolerance rtol = relative_tolerance(options.rtol);
  const auto& ignored = options.ignored_keys;
  for (const ResultKey& k : result_keys()) {
    const std::optional<double> is = now[row_of(k)];
    const std::optional<double> was = recorded.numbers[row_of(k)];
    if ((!is && !was) || std::find(ignored.begin(), ignored.end(), k.key) != ignored.end()) continue;
    const Expectation* e = expectation_of(expectations, k);
    const Tolerance tolerance = e && e->tolerance ? *e->tolerance : rtol;
    if (is && was && tolerance.allows(*is, *was)) continue;
    moved.push_back({std::string(k.key), si_symbol(k.dimension), is, was, tolerance, MovedKey::Against::baseline});
  }
  for (const auto& [key, value] : recorded.unknown) {
    moved.push_back({key, "", std::nullopt, value, rtol, MovedKey::Against::baseline});
  }
  return moved;
}

}  // namespace shaftwork::io

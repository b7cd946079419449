// A guarantee's verdicts as CSV columns: case files' csv (write_csv) and batches, where a
// logger's rows are each judged against the template's guarantee.
#include <algorithm>
#include <cmath>
#include <utility>

#include <fmt/format.h>

#include "shaftwork/io/number_format.hpp"
#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::io {

namespace {
constexpr int kDigits = 10;  // as the result columns
}  // namespace

std::string GuaranteeColumns::header(UnitSystem system) const {
  std::string out = ",guarantee.verdict";
  for (machines::Checked q : checks) {
    const machines::CheckedSpec& spec = machines::checked_spec(q);
    const std::string_view unit = column_unit(spec.dimension, system);
    const std::string converted = fmt::format("guarantee.{}.converted", spec.key);
    out += ',' + csv_field(unit.empty() ? converted : fmt::format("{} [{}]", converted, unit));
    out += fmt::format(",guarantee.{}.deviation_percent,guarantee.{}.verdict", spec.key, spec.key);
  }
  return out + ",guarantee.error";
}

std::string GuaranteeColumns::cells(const machines::GuaranteeResult* g, UnitSystem system,
                                    const std::string& error) const {
  std::string out = ",";
  if (g) out += machines::verdict_name(g->verdict);
  for (machines::Checked q : checks) {
    const machines::Check* check = nullptr;
    if (g) {
      for (const machines::Check& c : g->checks) {
        if (c.quantity == q) check = &c;
      }
    }
    out += ',';
    const machines::CheckedSpec& spec = machines::checked_spec(q);
    if (check && check->converted && std::isfinite(*check->converted)) {
      const std::string_view unit = column_unit(spec.dimension, system);
      append_significant(out, unit.empty() ? *check->converted : units::from_si(*check->converted, unit, spec.dimension),
                         kDigits);
    }
    out += ',';
    if (check && check->deviation_percent) append_significant(out, *check->deviation_percent, kDigits);
    out += ',';
    if (check) out += machines::verdict_name(check->verdict);
  }
  return out + ',' + csv_field(error);
}

void GuaranteeColumns::add(const GuaranteeColumns& other) {
  std::vector<machines::Checked> merged;
  for (machines::Checked q : machines::kAllChecked) {
    const auto has = [q](const std::vector<machines::Checked>& v) { return std::find(v.begin(), v.end(), q) != v.end(); };
    if (has(checks) || has(other.checks)) merged.push_back(q);
  }
  checks = std::move(merged);
}

GuaranteeColumns guarantee_columns(const std::vector<const machines::GuaranteeResult*>& guarantees) {
  GuaranteeColumns columns;
  for (machines::Checked q : machines::kAllChecked) {
    bool used = false;
    for (const machines::GuaranteeResult* g : guarantees) {
      for (const machines::Check& c : g->checks) used = used || c.quantity == q;
    }
    if (used) columns.checks.push_back(q);
  }
  return columns;
}

GuaranteeColumns guarantee_columns(const machines::Guarantee& g, machines::MachineKind machine) {
  GuaranteeColumns columns;
  for (machines::Checked q : machines::kAllChecked) {
    const bool exhaust = machine == machines::MachineKind::turbine && q == machines::Checked::outlet_pressure;
    if ((g.value(q) && !exhaust) || g.tolerance[static_cast<std::size_t>(q)]) columns.checks.push_back(q);
  }
  return columns;
}

}  // namespace shaftwork::io

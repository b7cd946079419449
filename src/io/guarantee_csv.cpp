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

std::vector<GuaranteeColumns::Column> GuaranteeColumns::columns(UnitSystem system) const {
  std::vector<Column> out{{"guarantee.verdict", ""}};
  for (machines::Checked q : checks) {
    const machines::CheckedSpec& spec = machines::checked_spec(q);
    out.push_back({fmt::format("guarantee.{}.converted", spec.key), std::string(column_unit(spec.dimension, system))});
    out.push_back({fmt::format("guarantee.{}.deviation_percent", spec.key), ""});
    out.push_back({fmt::format("guarantee.{}.verdict", spec.key), ""});
  }
  out.push_back({"guarantee.error", ""});
  return out;
}

std::vector<GuaranteeColumns::Cell> GuaranteeColumns::row(const machines::GuaranteeResult* g, UnitSystem system,
                                                          const std::string& error) const {
  std::vector<Cell> out;
  out.push_back({std::nullopt, g ? std::string(machines::verdict_name(g->verdict)) : std::string()});
  for (machines::Checked q : checks) {
    const machines::Check* check = nullptr;
    if (g) {
      for (const machines::Check& c : g->checks) {
        if (c.quantity == q) check = &c;
      }
    }
    Cell converted, deviation, verdict;
    const machines::CheckedSpec& spec = machines::checked_spec(q);
    if (check && check->converted && std::isfinite(*check->converted)) {
      const std::string_view unit = column_unit(spec.dimension, system);
      converted.number = unit.empty() ? *check->converted : units::from_si(*check->converted, unit, spec.dimension);
    }
    if (check && check->deviation_percent) deviation.number = *check->deviation_percent;
    if (check) verdict.text = machines::verdict_name(check->verdict);
    out.push_back(std::move(converted));
    out.push_back(std::move(deviation));
    out.push_back(std::move(verdict));
  }
  out.push_back({std::nullopt, error});
  return out;
}

std::string GuaranteeColumns::header(UnitSystem system) const {
  std::string out;
  for (const Column& c : columns(system)) {
    out += ',' + csv_field(c.unit.empty() ? c.key : fmt::format("{} [{}]", c.key, c.unit));
  }
  return out;
}

std::string GuaranteeColumns::cells(const machines::GuaranteeResult* g, UnitSystem system,
                                    const std::string& error) const {
  std::string out;
  for (const Cell& c : row(g, system, error)) {
    out += ',';
    if (c.number) {
      append_significant(out, *c.number, kDigits);
    } else {
      out += csv_field(c.text);
    }
  }
  return out;
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
  using machines::Checked;
  using machines::MachineKind;
  GuaranteeColumns columns;
  // A pump's guaranteed head is checked at the tolerance cross, which checks its flow too
  // (ISO 9906:2012, 4.4.2; src/machines/guarantee_pump.cpp).
  const bool pump_head = machine == MachineKind::pump && (g.value(Checked::head_height) || g.value(Checked::outlet_pressure));
  for (Checked q : machines::kAllChecked) {
    const bool exhaust = machine == MachineKind::turbine && q == Checked::outlet_pressure;
    const bool cross = pump_head && (q == Checked::volume_flow || q == Checked::head_height);
    if (cross || (g.value(q) && !exhaust) || g.tolerance[static_cast<std::size_t>(q)]) columns.checks.push_back(q);
  }
  return columns;
}

}  // namespace shaftwork::io

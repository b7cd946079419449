// A guarantee's verdict as a table a person reads at a glance: one line per guaranteed
// quantity, then one per similarity parameter and test point.
#include <fmt/format.h>

#include "shaftwork/io/result_writer.hpp"
#include "shaftwork/text.hpp"

namespace shaftwork::io {
namespace {

using machines::Check;

constexpr int kLabelWidth = 24;
constexpr int kValueWidth = 16;

std::string value_text(const std::optional<double>& v, units::Dimension d, const DisplayUnits& units) {
  return v ? units.text(*v, d, guarantee_precision(d)) : "-";
}

// "-2", "+4", "0".
std::string signed_percent(double x) { return x == 0 ? "0" : fmt::format("{:+g}", x); }

void line(std::ostream& out, std::string text) {
  text.erase(text.find_last_not_of(' ') + 1);
  out << escape_control(text) << '\n';
}

// A check's line: the measured value as the test read it, the converted and guaranteed ones
// at the guarantee (its gauge pressures on its own site barometer, `at_guarantee`).
void check_line(std::ostream& out, const Check& c, const DisplayUnits& units, const DisplayUnits& at_guarantee) {
  const machines::CheckedSpec& spec = machines::checked_spec(c.quantity);
  std::string tolerance = tolerance_text(c.tolerance);
  if (c.tolerance_from == machines::ToleranceFrom::none_given) tolerance += " (none given)";
  std::string deviation = c.deviation_percent ? fmt::format("{:+.2f} %", *c.deviation_percent) : "-";
  if (c.uncertainty_percent) deviation += fmt::format(" (U {:.2f} %)", *c.uncertainty_percent);
  line(out, fmt::format("    {:<{}}{:<{}}{:<{}}{:<{}}{:<{}}{:<{}}{}", spec.label, kLabelWidth,
                        value_text(c.measured, spec.dimension, units), kValueWidth,
                        value_text(c.converted, spec.dimension, at_guarantee), kValueWidth,
                        at_guarantee.text(c.guaranteed, spec.dimension, guarantee_precision(spec.dimension)), kValueWidth,
                        tolerance,
                        kValueWidth + 6, deviation, kValueWidth, machines::verdict_name(c.verdict)));
  if (!c.note.empty()) line(out, fmt::format("    {:<{}}{}", "", kLabelWidth, c.note));
}

void similarity_line(std::ostream& out, const machines::SimilarityCheck& s) {
  const std::string value = s.difference ? fmt::format("difference {:+.4f}", *s.difference)
                                         : fmt::format("ratio {:.4f}", s.ratio.value_or(0));
  const std::string limits = s.difference ? fmt::format("{:+.3f} to {:+.3f}", s.low, s.high)
                                          : fmt::format("{:.3f} to {:.3f}", s.low, s.high);
  line(out, fmt::format("    {:<{}}{:<{}}{:<{}}{:<{}}{:<{}}{}", s.parameter, kLabelWidth, fmt::format("\"{}\"", s.point),
                        kValueWidth * 2, value, kValueWidth + 6, limits, kValueWidth + 6,
                        s.within ? "within" : "OUTSIDE", kValueWidth, s.source));
}

}  // namespace

Precision guarantee_precision(units::Dimension d) {
  if (d == units::Dimension::fraction) return {Precision::Kind::decimals, 4};
  if (d == units::Dimension::temperature) return {Precision::Kind::decimals, 2};
  return {Precision::Kind::significant, 5};
}

std::string tolerance_text(const machines::Tolerance& t) {
  if (t.min_percent && t.max_percent) {
    return fmt::format("{} to {} %", signed_percent(*t.min_percent), signed_percent(*t.max_percent));
  }
  if (t.min_percent) return fmt::format(">= {} %", signed_percent(*t.min_percent));
  if (t.max_percent) return fmt::format("<= {} %", signed_percent(*t.max_percent));
  return "any";
}

void write_guarantee_table(std::ostream& out, const machines::GuaranteeResult& g, const DisplayUnits& units) {
  const DisplayUnits at_guarantee = units.on_barometer(g.barometer);
  line(out, fmt::format("  guarantee: {}", machines::verdict_name(g.verdict)));
  line(out, fmt::format("    {}", g.method));
  // Where the guarantee point came out: its flow and outlet state.
  std::string at;
  for (const machines::NamedValue& v : g.converted) {
    const std::string_view label = v.key == "volume_flow"          ? "inlet volume flow"
                                   : v.key == "mass_flow"          ? "mass flow"
                                   : v.key == "outlet.temperature" ? "outlet temperature"
                                   : v.key == "outlet.quality"     ? "outlet quality"
                                                                   : "";
    if (label.empty()) continue;
    at += fmt::format("{}{} {}", at.empty() ? "" : ", ", label, at_guarantee.text(v.value, v.dimension, guarantee_precision(v.dimension)));
  }
  if (!at.empty()) line(out, fmt::format("    at the guarantee: {}", at));
  line(out, fmt::format("    {:<{}}{:<{}}{:<{}}{:<{}}{:<{}}{:<{}}{}", "quantity", kLabelWidth, "measured", kValueWidth,
                        "converted", kValueWidth, "guaranteed", kValueWidth, "tolerance", kValueWidth + 6, "deviation",
                        kValueWidth, "verdict"));
  for (const Check& c : g.checks) check_line(out, c, units, at_guarantee);
  line(out, fmt::format("    measured: test point \"{}\" (nearest the guaranteed flow)", g.nearest_point));
  if (!g.similarity.empty()) {
    line(out, fmt::format("    {:<{}}{:<{}}{:<{}}{:<{}}{:<{}}{}", "similarity", kLabelWidth, "test point",
                          kValueWidth * 2, "test vs guarantee", kValueWidth + 6, "limits", kValueWidth + 6, "",
                          kValueWidth, "limits from"));
    for (const machines::SimilarityCheck& s : g.similarity) similarity_line(out, s);
  }
  for (const std::string& w : g.warnings) line(out, fmt::format("    note: {}", w));
}

}  // namespace shaftwork::io

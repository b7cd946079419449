// The data of a guarantee chart: the judge's readings (machines::CurveReadings) in the
// display units of the case or test, and the checks as the legend lists them.
#include "shaftwork/charts/guarantee_chart.hpp"

#include <algorithm>
#include <cmath>
#include <filesystem>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/display_units.hpp"

namespace shaftwork::charts {
namespace {

using units::Dimension;
using machines::CurveReading;
using machines::GuaranteeResult;

constexpr int kCurveSamples = 64;

// From SI to the chart's display units.
struct Converter {
  const io::DisplayUnits& du;
  double operator()(double si, Dimension d) const { return units::from_si(si, du.unit(d), d, du.barometer()); }
  double flow(double si) const { return (*this)(si, Dimension::volume_flow); }
};

std::string unit_text(std::string_view unit) { return unit.empty() ? "-" : std::string(unit); }

// The flows a curve is drawn across: those the judge may read it at.
std::pair<double, double> reach(const CurveReading& q) {
  const auto [low, high] = std::minmax_element(q.flow.begin(), q.flow.end());
  return {*low * (1 - machines::kExtrapolationLimit), *high * (1 + machines::kExtrapolationLimit)};
}

std::vector<Point> sampled_curve(const CurveReading& q, const Converter& conv) {
  const auto [low, high] = reach(q);
  std::vector<double> flows;
  if (q.coefficients.empty()) {  // straight lines: their corners and the extended ends
    flows = q.flow;
    flows.insert(flows.begin(), low);
    flows.push_back(high);
  } else {
    for (int k = 0; k <= kCurveSamples; ++k) flows.push_back(low + (high - low) * k / kCurveSamples);
  }
  std::vector<Point> out;
  for (const double f : flows) out.push_back({conv.flow(f), conv(q.at(f), q.dimension)});
  return out;
}

std::optional<double> shown(const std::optional<double>& si, Dimension d, const Converter& conv) {
  return si ? std::optional(conv(*si, d)) : std::nullopt;
}

GuaranteePanel panel_of(const CurveReading& q, const GuaranteeResult& g, const Converter& conv) {
  GuaranteePanel p;
  const machines::CheckedSpec* spec = machines::find_checked(q.key);
  p.y_title = fmt::format("{} [{}]", spec ? spec->label : q.key, unit_text(conv.du.unit(q.dimension)));
  for (std::size_t i = 0; i < q.flow.size(); ++i) p.points.push_back({conv.flow(q.flow[i]), conv(q.value[i], q.dimension)});
  p.curve = sampled_curve(q, conv);
  p.read = {conv.flow(q.read_flow), conv(q.read_value, q.dimension)};
  if (q.guaranteed) {
    p.guarantee = Point{conv.flow(g.readings->guaranteed_flow), conv(*q.guaranteed, q.dimension)};
    p.low = shown(q.low, q.dimension, conv);
    p.high = shown(q.high, q.dimension, conv);
    p.tolerance = true;
  }
  if (q.check) {
    if (const machines::Check* c = machines::find_check(g, *q.check)) p.verdict = c->verdict;
  }
  if (q.check == machines::Checked::outlet_pressure) {
    const machines::Check& c = *machines::find_check(g, *q.check);
    p.guarantee_note = fmt::format("{} as a head", conv.du.text(c.guaranteed, Dimension::pressure,
                                                                 io::guarantee_precision(Dimension::pressure)));
  }
  return p;
}

GuaranteeCheckLine check_line(const machines::Check& c, const Converter& conv) {
  const machines::CheckedSpec& spec = machines::checked_spec(c.quantity);
  const io::Precision precision = io::guarantee_precision(spec.dimension);
  GuaranteeCheckLine line;
  line.label = std::string(spec.label);
  line.values = fmt::format("{} against {}", c.converted ? conv.du.text(*c.converted, spec.dimension, precision) : "-",
                            conv.du.text(c.guaranteed, spec.dimension, precision));
  line.deviation = fmt::format("{}, tolerance {}", c.deviation_percent ? fmt::format("{:+.2f} %", *c.deviation_percent) : "-",
                               io::tolerance_text(c.tolerance));
  line.verdict = c.verdict;
  return line;
}

// The window: every point, curve, bar and mark, with room around them.
void set_windows(GuaranteeChart& chart) {
  std::vector<double> xs = {chart.guaranteed_flow};
  for (const auto& f : {chart.flow_low, chart.flow_high}) {
    if (f) xs.push_back(*f);
  }
  for (GuaranteePanel& p : chart.panels) {
    std::vector<double> ys = {p.read.y};
    for (const std::vector<Point>* line : {&p.points, &p.curve}) {
      for (const Point& q : *line) {
        xs.push_back(q.x);
        ys.push_back(q.y);
      }
    }
    for (const auto& v : {p.low, p.high}) {
      if (v) ys.push_back(*v);
    }
    if (p.guarantee) ys.push_back(p.guarantee->y);
    const auto [low, high] = std::minmax_element(ys.begin(), ys.end());
    p.y_low = *low;
    p.y_high = *high;
    pad_range(p.y_low, p.y_high, 0.15);
  }
  const auto [low, high] = std::minmax_element(xs.begin(), xs.end());
  chart.x_low = *low;
  chart.x_high = *high;
  pad_range(chart.x_low, chart.x_high, 0.06);
}

// Everything on the chart is at the guarantee: its gauge pressures on the guarantee's site
// barometer.
GuaranteeChart chart_of(const GuaranteeResult& g, const io::DisplayUnits& test_units) {
  const io::DisplayUnits du = test_units.on_barometer(g.barometer);
  const Converter conv{du};
  const machines::CurveReadings& rd = *g.readings;
  GuaranteeChart chart;
  chart.verdict = g.verdict;
  chart.method = g.method;
  chart.guaranteed_flow = conv.flow(rd.guaranteed_flow);
  chart.x_title = fmt::format("{} [{}]", g.machine == machines::MachineKind::pump ? "volume flow Q" : "inlet volume flow Q",
                              du.unit(Dimension::volume_flow));
  for (const CurveReading& q : rd.quantities) chart.panels.push_back(panel_of(q, g, conv));
  chart.cross = rd.cross;
  chart.flow_low = shown(rd.flow_low, Dimension::volume_flow, conv);
  chart.flow_high = shown(rd.flow_high, Dimension::volume_flow, conv);
  const machines::Check* flow = machines::find_check(g, machines::Checked::volume_flow);
  if (rd.cross && flow && flow->converted && chart.panels.front().guarantee) {
    chart.flow_read = Point{conv.flow(*flow->converted), chart.panels.front().guarantee->y};
  }
  if (g.machine == machines::MachineKind::pump && rd.quantities.size() > 1) {
    chart.eta_read_flow = conv.flow(rd.quantities[1].read_flow);
  }
  for (const machines::Check& c : g.checks) chart.checks.push_back(check_line(c, conv));
  set_windows(chart);
  return chart;
}

std::string grade_text(const GuaranteeResult& g) { return g.grade ? fmt::format(", ISO 9906 grade {}", *g.grade) : ""; }

}  // namespace

bool has_guarantee_chart(const machines::GuaranteeResult& g) {
  return g.readings && !g.readings->quantities.empty() && !g.readings->quantities.front().flow.empty();
}

GuaranteeChart make_guarantee_chart(const io::CaseOutcome& o, const ProcessChartOptions& options) {
  if (!o.ok() || !o.input || !o.guarantee || !has_guarantee_chart(*o.guarantee)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("case \"{}\": no guarantee chart: {}", o.id,
                            !o.guarantee ? "no guarantee was judged" : "a turbine's guarantee is read at one flow"));
  }
  const io::DisplayUnits du(options.system, options.system_forced, &*o.input, *o.rating);
  GuaranteeChart chart = chart_of(*o.guarantee, du);
  chart.title = o.id;
  chart.subtitle = fmt::format("guarantee of the {} on {}{}", o.input->machine_written, o.input->fluid_label,
                               grade_text(*o.guarantee));
  return chart;
}

GuaranteeChart make_guarantee_chart(const io::TestOutcome& t, const ProcessChartOptions& options) {
  if (!t.result || !has_guarantee_chart(*t.result)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("test of {}: no guarantee chart: {}", t.origin,
                            !t.result ? "the guarantee was not judged" : "a turbine's guarantee is read at one flow"));
  }
  machines::Rating shape;  // the machine chooses some units (a pump's flows in m3/h or gpm), as in the table
  shape.machine = t.result->machine;
  const io::DisplayUnits du(options.system, options.system_forced, t.units_from ? &*t.units_from : nullptr, shape);
  GuaranteeChart chart = chart_of(*t.result, du);
  chart.title = fmt::format("test of {}", std::filesystem::path(t.origin).filename().string());
  const std::string what = t.units_from ? fmt::format("the {} on {}", t.units_from->machine_written,
                                                      t.units_from->fluid_label)
                                        : std::string(machines::machine_name(t.result->machine));
  chart.subtitle = fmt::format("guarantee of {}, {} test points{}", what, t.points.size(), grade_text(*t.result));
  return chart;
}

Mark verdict_mark(machines::Verdict v) {
  switch (v) {
    case machines::Verdict::pass: return Mark::square;
    case machines::Verdict::inconclusive: return Mark::triangle;
    case machines::Verdict::fail: break;
  }
  return Mark::cross;
}

Colour verdict_colour(machines::Verdict v) {
  switch (v) {
    case machines::Verdict::pass: return kPassColour;
    case machines::Verdict::inconclusive: return kInconclusiveColour;
    case machines::Verdict::fail: break;
  }
  return kFailColour;
}

}  // namespace shaftwork::charts

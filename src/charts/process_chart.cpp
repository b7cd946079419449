// The data of a process chart: states sampled along the path, the isobars and the
// saturation line, converted to the case's display units.
#include "shaftwork/charts/process_chart.hpp"

#include <algorithm>
#include <cmath>
#include <tuple>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/display_units.hpp"
#include "shaftwork/io/result_keys.hpp"
#include "shaftwork/machines/polytropic.hpp"

namespace shaftwork::charts {
namespace {

using units::Dimension;

constexpr int kPathSteps = 32;
constexpr int kIsobarPoints = 80;
constexpr int kSaturationPoints = 160;
// IAPWS-IF97 (IAPWS R7-97(2012)): the triple-point pressure 611.657 Pa and the critical
// pressure 22.064 MPa bound the saturation line.
constexpr double kTriplePressure = 611.657;
constexpr double kCriticalPressure = 22.064e6;

// From SI states to the chart's display coordinates.
struct Converter {
  Diagram diagram;
  std::string s_unit, y_unit;
  double barometer;

  Point of(const fluids::State& st) const {
    const double x = units::from_si(st.entropy, s_unit, Dimension::specific_entropy);
    const double y = diagram == Diagram::enthalpy_entropy
                         ? units::from_si(st.enthalpy, y_unit, Dimension::specific_energy)
                         : units::from_si(st.temperature, y_unit, Dimension::temperature, barometer);
    return {x, y};
  }
};

// States along the polytropic path from the inlet to the outlet pressure.
std::vector<fluids::State> path_states(const fluids::FluidModel& fluid, const machines::Rating& r) {
  std::vector<fluids::State> states{r.inlet};
  const double p1 = r.inlet.pressure;
  const double ratio = r.outlet.pressure / p1;
  for (int k = 1; k < kPathSteps; ++k) {
    const double p = p1 * std::pow(ratio, static_cast<double>(k) / kPathSteps);
    states.push_back(fluid.from_ph(p, machines::polytropic_outlet_enthalpy(fluid, r.inlet, p, r.efficiency_polytropic)));
  }
  states.push_back(r.outlet);
  return states;
}

// The isobar p over entropies [s_low, s_high]; states the model cannot give are left out.
std::vector<fluids::State> isobar(const fluids::FluidModel& fluid, double p, double s_low, double s_high) {
  std::vector<fluids::State> states;
  for (int k = 0; k <= kIsobarPoints; ++k) {
    try {
      states.push_back(fluid.from_ps(p, s_low + (s_high - s_low) * k / kIsobarPoints));
    } catch (const Error&) {
    }
  }
  return states;
}

// Pressures from the triple point to just below the critical point, closer near the top.
std::vector<double> saturation_pressures() {
  std::vector<double> ps;
  for (int k = 0; k < kSaturationPoints; ++k) {
    ps.push_back(kTriplePressure * std::pow(0.9995 * kCriticalPressure / kTriplePressure,
                                            static_cast<double>(k) / (kSaturationPoints - 1)));
  }
  return ps;
}

// The line of quality x (0: saturated liquid, 1: saturated vapour), in order of pressure.
std::vector<Point> quality_line(const fluids::FluidModel& fluid, double x, const Converter& conv) {
  std::vector<Point> points;
  for (const double p : saturation_pressures()) {
    try {
      points.push_back(conv.of(fluid.from_p_quality(p, x)));
    } catch (const Error&) {
    }
  }
  return points;
}

void add_steam_lines(const fluids::FluidModel& fluid, const Converter& conv, ProcessChart& chart) {
  chart.saturation.label = "saturation line";
  chart.saturation.points = quality_line(fluid, 0.0, conv);
  std::vector<Point> vapour = quality_line(fluid, 1.0, conv);
  chart.saturation.points.insert(chart.saturation.points.end(), vapour.rbegin(), vapour.rend());
  for (int tenth = 1; tenth <= 9; ++tenth) {
    chart.qualities.push_back({quality_line(fluid, tenth / 10.0, conv), fmt::format("x = {:.1f}", tenth / 10.0)});
  }
}

void add_numbers(const io::CaseOutcome& o, const io::DisplayUnits& du, ProcessChart& chart) {
  static constexpr std::string_view kKeys[] = {
      "efficiency.isentropic", "efficiency.polytropic", "pressure_ratio", "head.isentropic",
      "head.polytropic",       "outlet.quality",        "mass_flow",      "power"};
  for (const std::string_view key : kKeys) {
    const io::ResultKey* k = io::find_result_key(key);
    const std::optional<double> v = k ? k->value(*o.rating) : std::nullopt;
    if (v && std::isfinite(*v)) chart.numbers.emplace_back(std::string(k->label), du.text(*v, k->dimension, k->precision));
  }
}

// The window: the process points with room around them.
void set_window(ProcessChart& chart, const std::vector<Point>& points) {
  chart.x_low = chart.x_high = points.front().x;
  chart.y_low = chart.y_high = points.front().y;
  for (const Point& p : points) {
    chart.x_low = std::min(chart.x_low, p.x);
    chart.x_high = std::max(chart.x_high, p.x);
    chart.y_low = std::min(chart.y_low, p.y);
    chart.y_high = std::max(chart.y_high, p.y);
  }
  pad_range(chart.x_low, chart.x_high, 0.3);
  pad_range(chart.y_low, chart.y_high, 0.15);
}

// An isobar's pressure as the case wrote it ("2.10 barg"), unless --units asks for its
// system or the pressure was solved for; then in the case's unit for pressures.
std::string pressure_label(const io::CaseInput& input, machines::Input key, double p, bool forced,
                           const io::DisplayUnits& du) {
  const io::GivenValue* given = input.find(key);
  if (given != nullptr && !forced && !given->unit.empty()) return given->written;
  return du.text(p, Dimension::pressure, io::Precision{io::Precision::Kind::significant, 4});
}

void add_isobars(const fluids::FluidModel& fluid, const io::CaseInput& input, bool forced, const machines::Rating& r,
                 const Converter& conv, const io::DisplayUnits& du, ProcessChart& chart) {
  // The entropy window back in SI: the isobars span it.
  // (Entropy units are plain factors: no offset.)
  const double per_si = units::from_si(1.0, conv.s_unit, Dimension::specific_entropy);
  const double s_low = chart.x_low / per_si;
  const double s_high = chart.x_high / per_si;
  for (const auto& [p, name, key] : {std::tuple{r.inlet.pressure, "p1", machines::Input::inlet_pressure},
                                     std::tuple{r.outlet.pressure, "p2", machines::Input::outlet_pressure}}) {
    Curve c{{}, fmt::format("{} = {}", name, pressure_label(input, key, p, forced, du))};
    for (const fluids::State& st : isobar(fluid, p, s_low, s_high)) c.points.push_back(conv.of(st));
    chart.isobars.push_back(std::move(c));
  }
}

}  // namespace

ProcessChart make_process_chart(const io::CaseOutcome& o, const ProcessChartOptions& options) {
  if (!o.ok() || !o.input || !o.input->fluid) {
    throw Error(ErrorKind::bad_input, fmt::format("case \"{}\": no chart: the case was not rated", o.id));
  }
  const machines::Rating& r = *o.rating;
  const fluids::FluidModel& fluid = *o.input->fluid;
  const io::DisplayUnits du(options.system, options.system_forced, &*o.input, r);
  const Converter conv{options.diagram, std::string(du.unit(Dimension::specific_entropy)),
                       std::string(du.unit(options.diagram == Diagram::enthalpy_entropy ? Dimension::specific_energy
                                                                                         : Dimension::temperature)),
                       du.barometer()};
  ProcessChart chart;
  chart.title = o.id;
  chart.subtitle = fmt::format("{} on {} ({})", o.input->machine_written, o.input->fluid_label, r.model);
  chart.x_title = fmt::format("specific entropy s [{}]", conv.s_unit);
  chart.y_title = options.diagram == Diagram::enthalpy_entropy ? fmt::format("specific enthalpy h [{}]", conv.y_unit)
                                                               : fmt::format("temperature T [{}]", conv.y_unit);
  chart.inlet = conv.of(r.inlet);
  chart.outlet = conv.of(r.outlet);
  chart.outlet_isentropic = conv.of(r.outlet_isentropic);
  chart.path.label = "polytropic path";
  try {
    for (const fluids::State& st : path_states(fluid, r)) chart.path.points.push_back(conv.of(st));
  } catch (const Error& e) {
    chart.path.points.clear();
    chart.notes.push_back(fmt::format("polytropic path not drawn: {}", e.what()));
  }
  std::vector<Point> process = chart.path.points;
  process.insert(process.end(), {chart.inlet, chart.outlet, chart.outlet_isentropic});
  set_window(chart, process);
  add_isobars(fluid, *o.input, options.system_forced, r, conv, du, chart);
  if (fluid.fluid_kind() == fluids::FluidKind::water_steam) add_steam_lines(fluid, conv, chart);
  add_numbers(o, du, chart);
  return chart;
}

}  // namespace shaftwork::charts

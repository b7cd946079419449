// The guarantee's common parts: the checked quantities, tolerances and verdicts, the
// guarantee's inlet, flow and speed ratio, and judge(), which checks what a machine may be
// guaranteed and hands the points to the machine's conversion.
#include "shaftwork/machines/guarantee.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "curve.hpp"
#include "guarantee_common.hpp"
#include "problem.hpp"
#include "shaftwork/error.hpp"

namespace shaftwork::machines {
namespace {

using D = units::Dimension;

constexpr CheckedSpec kChecked[kCheckedCount] = {
    {Checked::outlet_pressure, "outlet.pressure", D::pressure, "discharge pressure"},
    {Checked::head_polytropic, "head.polytropic", D::specific_energy, "polytropic head"},
    {Checked::head_height, "head_height", D::length, "pump head"},
    {Checked::efficiency_isentropic, "efficiency.isentropic", D::fraction, "isentropic efficiency"},
    {Checked::efficiency_polytropic, "efficiency.polytropic", D::fraction, "polytropic efficiency"},
    {Checked::pump_efficiency, "pump_efficiency", D::fraction, "pump efficiency"},
    {Checked::power, "power", D::power, "shaft power"},
    {Checked::mass_flow, "mass_flow", D::mass_flow, "mass flow"},
    {Checked::volume_flow, "volume_flow", D::volume_flow, "volume flow"},
};

// What each machine may be guaranteed (a value) and checked (a tolerance).
bool may_guarantee(MachineKind m, Checked q) {
  switch (m) {
    case MachineKind::compressor:
      return q == Checked::outlet_pressure || q == Checked::head_polytropic || q == Checked::efficiency_isentropic ||
             q == Checked::efficiency_polytropic || q == Checked::power;
    case MachineKind::pump:
      return q == Checked::outlet_pressure || q == Checked::head_height || q == Checked::pump_efficiency ||
             q == Checked::power;
    case MachineKind::turbine:
      return q == Checked::outlet_pressure || q == Checked::efficiency_isentropic ||
             q == Checked::efficiency_polytropic || q == Checked::power;
  }
  return false;
}

// The zero tolerance of a quantity with no tolerance given: the guaranteed value is a
// limit on its unfavourable side (efficiencies, heads, pressures, a compressor's or pump's
// flow and a turbine's power no less; a compressor's or pump's power no more); a turbine's
// flow both ways.
Tolerance zero_tolerance(Checked q, MachineKind m) {
  if (q == Checked::power) return m == MachineKind::turbine ? Tolerance{0.0, std::nullopt} : Tolerance{std::nullopt, 0.0};
  if (q == Checked::mass_flow && m == MachineKind::turbine) return {0.0, 0.0};
  return {0.0, std::nullopt};
}

// Why a tolerance on q would go unused (a quantity this guarantee never checks), or "".
std::string unused_tolerance(const Guarantee& g, MachineKind m, Checked q, std::size_t points) {
  const bool pump_head = m == MachineKind::pump && (g.value(Checked::head_height) || g.value(Checked::outlet_pressure));
  switch (q) {
    case Checked::outlet_pressure:
      if (m == MachineKind::pump) return "a pump's discharge pressure is checked as its head: give the tolerance as head_height";
      if (m == MachineKind::turbine) return "a turbine's outlet pressure is the guarantee's exhaust, not a checked quantity";
      break;
    case Checked::mass_flow:
    case Checked::volume_flow:
      if (m == MachineKind::compressor) {
        return "a compressor's guarantee is read at its flow, so the flow is not a checked quantity; check "
               "outlet.pressure or head.polytropic at the guaranteed flow";
      }
      if (m == MachineKind::pump) {
        if (q == Checked::mass_flow) return "a pump's flow is checked as volume_flow (the tolerance cross)";
        return pump_head ? "" : "a pump's flow is checked on the tolerance cross, which needs the guaranteed head";
      }
      if (q != Checked::mass_flow || points != 1) {
        return "a turbine's flow is checked as mass_flow, for a single test point (the choked-nozzle law)";
      }
      return g.flow_given() ? "" : "the guarantee gives no flow to check the test's against; give its mass_flow";
    case Checked::head_height:
      if (pump_head) return "";
      break;
    default: break;
  }
  if (g.value(q)) return "";
  return fmt::format("{} is not guaranteed; give its guaranteed value or drop its tolerance", checked_spec(q).key);
}

void check_tolerances(const Guarantee& g, MachineKind m, std::size_t points) {
  if (g.grade && m != MachineKind::pump) {
    refuse(fmt::format("tolerances.grade: the ISO 9906 acceptance grades ({}) are for pumps, and this is a {}; give "
                       "percentages instead, such as \"tolerances\": {{ \"power\": {{ \"max\": \"+4 %\" }} }}",
                       g.grade.value(), machine_name(m)));
  }
  for (Checked q : kAllChecked) {
    const auto& t = g.tolerance[static_cast<std::size_t>(q)];
    const std::string_view key = checked_spec(q).key;
    if (g.value(q) && !may_guarantee(m, q)) refuse(fmt::format("{}: not a guarantee of a {}", key, machine_name(m)));
    if (!t) continue;
    if (const std::string why = unused_tolerance(g, m, q, points); !why.empty()) {
      refuse(fmt::format("tolerances.{}: {}", key, why));
    }
    if (t->min_percent && t->max_percent && *t->min_percent > *t->max_percent) {
      refuse(fmt::format("tolerances.{}: min {:+g} % lies above max {:+g} %", key, *t->min_percent, *t->max_percent));
    }
  }
}

}  // namespace

const CheckedSpec& checked_spec(Checked quantity) { return kChecked[static_cast<std::size_t>(quantity)]; }

const CheckedSpec* find_checked(std::string_view key) {
  for (const CheckedSpec& s : kChecked) {
    if (s.key == key) return &s;
  }
  return nullptr;
}

const char* verdict_name(Verdict v) {
  switch (v) {
    case Verdict::pass: return "pass";
    case Verdict::inconclusive: return "inconclusive";
    case Verdict::fail: return "fail";
  }
  return "?";
}

Verdict judge_deviation(double deviation_percent, const Tolerance& t, std::optional<double> uncertainty_percent) {
  double beyond = 0;  // how far outside the tolerance, in percent of the guaranteed value
  if (t.min_percent && deviation_percent < *t.min_percent) beyond = *t.min_percent - deviation_percent;
  if (t.max_percent && deviation_percent > *t.max_percent) beyond = deviation_percent - *t.max_percent;
  if (beyond == 0) return Verdict::pass;
  if (uncertainty_percent && beyond < *uncertainty_percent) return Verdict::inconclusive;
  return Verdict::fail;
}

std::optional<Tolerance> grade_tolerance(const Guarantee& g, Checked q) {
  if (!g.grade) return std::nullopt;
  const PumpGrade* grade = find_pump_grade(*g.grade);
  if (!grade) return std::nullopt;
  switch (q) {
    case Checked::volume_flow: return grade->flow;
    case Checked::head_height: return grade->head;
    case Checked::power: return grade->power;
    case Checked::pump_efficiency: return grade->efficiency;
    default: return std::nullopt;
  }
}

Check make_check(const Guarantee& g, MachineKind machine, Checked q, std::optional<double> measured,
                 std::optional<double> converted, const TestPoint& nearest, std::string note) {
  Check c;
  c.quantity = q;
  c.measured = measured;
  c.converted = converted;
  c.guaranteed = g.value(q).value();
  c.note = std::move(note);
  if (const auto& given = g.tolerance[static_cast<std::size_t>(q)]) {
    c.tolerance = *given;
    c.tolerance_from = ToleranceFrom::given;
  } else if (const auto grade = grade_tolerance(g, q)) {
    c.tolerance = *grade;
    c.tolerance_from = ToleranceFrom::grade;
  } else {
    c.tolerance = zero_tolerance(q, machine);
  }
  if (!converted) return c;  // the curve never reaches the guarantee: fail
  c.deviation_percent = 100 * (*converted - c.guaranteed) / c.guaranteed;
  // The measured value's relative uncertainty, carried to the converted one. A grade's
  // tolerance already holds the measurement uncertainty (ISO 9906:2012, 4.4).
  const auto u = nearest.uncertainty.find(checked_spec(q).key);
  if (u != nearest.uncertainty.end() && measured && *measured != 0 && c.tolerance_from != ToleranceFrom::grade) {
    c.uncertainty_percent = 100 * u->second / std::fabs(*measured) * std::fabs(*converted / c.guaranteed);
  }
  c.verdict = judge_deviation(*c.deviation_percent, c.tolerance, c.uncertainty_percent);
  return c;
}

GuaranteeInlet guarantee_inlet(const Guarantee& g, const TestPoint& first) {
  GuaranteeInlet in;
  in.fluid = g.fluid ? g.fluid : first.input.fluid;
  in.fluid_changed = g.fluid && g.fluid != first.input.fluid;  // the factory shares one model per fluid
  const fluids::State& test = first.rating.inlet;
  if (!g.inlet_pressure && !g.inlet_temperature && !in.fluid_changed) {
    in.state = test;
  } else {
    in.state = in.fluid->from_pt(g.inlet_pressure.value_or(test.pressure), g.inlet_temperature.value_or(test.temperature));
  }
  return in;
}

double guaranteed_mass_flow(const Guarantee& g, const fluids::State& inlet) {
  if (g.mass_flow) return *g.mass_flow;
  if (g.volume_flow) return *g.volume_flow * inlet.density;
  return *g.standard_volume_flow * inlet.molar_mass;
}

void require_flow(const Guarantee& g, MachineKind machine) {
  if (g.flow_given()) return;
  refuse(fmt::format("no flow: a {} guarantee is read at its guaranteed flow; give mass_flow, volume_flow or "
                     "standard_volume_flow",
                     machine_name(machine)));
}

double speed_ratio(const Guarantee& g, const TestPoint& p) {
  if (!p.input.speed) return 1.0;
  if (!g.speed) {
    refuse(fmt::format("speed: missing; the test point \"{}\" gives its speed ({:.6g} rpm), so the rated speed is "
                       "needed to convert it",
                       p.id, 60 * *p.input.speed));
  }
  return *g.speed / *p.input.speed;
}

std::optional<double> rating_value(const Rating& r, Checked q) {
  switch (q) {
    case Checked::outlet_pressure: return r.outlet.pressure;
    case Checked::head_polytropic: return r.head_polytropic;
    case Checked::head_height: return r.head_height;
    case Checked::efficiency_isentropic: return r.efficiency_isentropic;
    case Checked::efficiency_polytropic: return r.efficiency_polytropic;
    case Checked::pump_efficiency: return r.pump_efficiency;
    case Checked::power: return r.power;
    case Checked::mass_flow: return r.mass_flow;
    case Checked::volume_flow: return r.volume_flow;
  }
  return std::nullopt;
}

std::vector<NamedValue> rating_values(const Rating& r) {
  std::vector<NamedValue> v = {
      {"inlet.pressure", D::pressure, r.inlet.pressure},
      {"inlet.temperature", D::temperature, r.inlet.temperature},
      {"outlet.pressure", D::pressure, r.outlet.pressure},
      {"outlet.temperature", D::temperature, r.outlet.temperature},
  };
  if (r.outlet.quality) v.push_back({"outlet.quality", D::fraction, *r.outlet.quality});
  if (r.mass_flow) v.push_back({"mass_flow", D::mass_flow, *r.mass_flow});
  if (r.volume_flow) v.push_back({"volume_flow", D::volume_flow, *r.volume_flow});
  if (r.power) v.push_back({"power", D::power, *r.power});
  v.push_back({"efficiency.isentropic", D::fraction, r.efficiency_isentropic});
  v.push_back({"efficiency.polytropic", D::fraction, r.efficiency_polytropic});
  v.push_back({"head.isentropic", D::specific_energy, r.head_isentropic});
  v.push_back({"head.polytropic", D::specific_energy, r.head_polytropic});
  return v;
}

std::string show_volume_flow(double m3_per_s) { return fmt::format("{:.6g} m3/h", 3600 * m3_per_s); }
std::string show_mass_flow(double kg_per_s) { return fmt::format("{:.6g} kg/s", kg_per_s); }

SimilarityCheck ratio_check(const std::string& parameter, const std::string& point, std::optional<double> test,
                            std::optional<double> guarantee, double ratio) {
  const SimilarityLimits& limits = similarity_limits(parameter);
  SimilarityCheck s;
  s.parameter = parameter;
  s.point = point;
  s.test = test;
  s.guarantee = guarantee;
  s.ratio = ratio;
  s.low = limits.low;
  s.high = limits.high;
  s.within = ratio >= limits.low && ratio <= limits.high;
  s.source = limits.source;
  return s;
}

GuaranteeResult judge(const Guarantee& g, std::span<const TestPoint> points) {
  if (points.empty()) refuse("no test point to judge");
  const MachineKind m = points.front().rating.machine;
  for (const TestPoint& p : points) {
    if (p.rating.machine != m) {
      refuse(fmt::format("the test points \"{}\" ({}) and \"{}\" ({}) are of different machines", points.front().id,
                         machine_name(m), p.id, machine_name(p.rating.machine)));
    }
  }
  check_tolerances(g, m, points.size());
  GuaranteeResult r = m == MachineKind::compressor ? judge_compressor(g, points)
                      : m == MachineKind::pump     ? judge_pump(g, points)
                                                   : judge_turbine(g, points);
  r.machine = m;
  r.grade = g.grade;
  r.barometer = g.barometer;
  if (r.checks.empty()) {
    refuse(fmt::format("nothing to check: a {} guarantee needs a guaranteed {}", machine_name(m),
                       m == MachineKind::compressor ? "outlet.pressure, head.polytropic, efficiency or power"
                       : m == MachineKind::pump     ? "head (or outlet.pressure), efficiency or power"
                                                    : "efficiency or power"));
  }
  r.verdict = Verdict::pass;
  for (const Check& c : r.checks) {
    r.verdict = std::max(r.verdict, c.verdict);
    if (c.tolerance_from == ToleranceFrom::none_given) {
      r.warnings.push_back(fmt::format("{}: no tolerance given: checked against zero tolerance", checked_spec(c.quantity).key));
    }
  }
  for (const SimilarityCheck& s : r.similarity) {
    if (!s.within) {
      r.warnings.push_back(fmt::format("test point \"{}\": {} lies outside the limits of {}: the test is not similar "
                                       "enough for that code to accept it",
                                       s.point, s.parameter, s.source));
    }
  }
  return r;
}

double CurveReading::at(double q) const {
  return coefficients.empty() ? read_linear(flow, value, q) : polynomial(coefficients, q);
}

const Check* find_check(const GuaranteeResult& r, Checked q) {
  for (const Check& c : r.checks) {
    if (c.quantity == q) return &c;
  }
  return nullptr;
}

std::optional<double> tolerance_bound(double value, const std::optional<double>& percent) {
  if (!percent) return std::nullopt;
  return value * (1 + *percent / 100);
}

void set_guarantee(CurveReading& reading, const Check& check) {
  reading.guaranteed = check.guaranteed;
  reading.low = tolerance_bound(check.guaranteed, check.tolerance.min_percent);
  reading.high = tolerance_bound(check.guaranteed, check.tolerance.max_percent);
  reading.check = check.quantity;
}

}  // namespace shaftwork::machines

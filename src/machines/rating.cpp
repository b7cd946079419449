// The solve: classify the pattern of knowns, find the two states by the pattern's
// function (endpoints.cpp), then assemble the result (efficiencies, size, checks).
#include "shaftwork/machines/rating.hpp"

#include <algorithm>
#include <cmath>
#include <utility>

#include <fmt/format.h>

#include "endpoints.hpp"
#include "problem.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/compressibility_estimate.hpp"
#include "shaftwork/machines/impeller.hpp"
#include "shaftwork/machines/polytropic.hpp"

namespace shaftwork::machines {

using fluids::State;

std::size_t SolvedFor::size() const {
  // Seven bits at most: clearing the lowest set one at a time beats std::popcount, which
  // without a -march that has the instruction is a call into libgcc (every rating asks).
  std::size_t n = 0;
  for (unsigned b = bits_; b != 0; b &= b - 1) ++n;
  return n;
}

std::vector<std::string> SolvedFor::keys() const {
  std::vector<std::string> out;
  for (Quantity q : kAllQuantities) {
    if (contains(q)) out.emplace_back(quantity_key(q));
  }
  return out;
}

std::string SolvedFor::joined(const char* separator) const {
  std::string out;
  for (Quantity q : kAllQuantities) {
    if (!contains(q)) continue;
    if (!out.empty()) out += separator;
    out += quantity_key(q);
  }
  return out;
}

bool operator==(const SolvedFor& solved, const std::vector<std::string>& keys) { return solved.keys() == keys; }

namespace {

using Q = Quantity;
using Solve = Endpoints (*)(const Problem&);

// ---- Classification -----------------------------------------------------------------

struct Pattern {
  SolvedFor unknown;  // among p1, T1, p2, T2 and the efficiency
  Solve solve;
};

constexpr Pattern kPatterns[] = {
    {{}, from_given_states},
    {{Q::efficiency}, from_given_states},
    {{Q::outlet_temperature}, outlet_by_efficiency},
    {{Q::outlet_pressure}, outlet_pressure_by_efficiency},
    {{Q::inlet_pressure}, inlet_pressure_by_efficiency},
    {{Q::inlet_temperature}, inlet_temperature_by_efficiency},
    // Two specific unknowns: the energy balance (flow and power given) is the second relation.
    {{Q::outlet_temperature, Q::efficiency}, outlet_by_balance},
    {{Q::outlet_pressure, Q::outlet_temperature}, outlet_pressure_by_efficiency},
    {{Q::inlet_pressure, Q::outlet_temperature}, inlet_pressure_by_efficiency},
    {{Q::inlet_temperature, Q::outlet_temperature}, inlet_temperature_by_efficiency},
    {{Q::inlet_temperature, Q::efficiency}, inlet_by_balance},
    {{Q::inlet_temperature, Q::outlet_pressure}, outlet_pressure_with_inlet_by_balance},
    {{Q::inlet_pressure, Q::inlet_temperature}, inlet_pressure_with_inlet_by_balance},
};

// "a, b and c"
std::string key_list(const SolvedFor& set) {
  const std::vector<std::string> keys = set.keys();
  std::string out;
  for (std::size_t i = 0; i < keys.size(); ++i) {
    if (i) out += i + 1 == keys.size() ? " and " : ", ";
    out += keys[i];
  }
  return out;
}

void refuse_too_few(const SolvedFor& unknown, const SolvedFor& specific) {
  const bool unsized = unknown.contains(Q::flow) && unknown.contains(Q::power);
  if (unsized && specific.size() >= 2) {
    refuse(fmt::format("too few knowns: {} are unknown, and neither the flow nor the power is given; give {} "
                       "more of p1, T1, p2, T2 and the efficiency (four of the five fix the efficiencies, heads "
                       "and outlet state), or give the flow and the power as well",
                       key_list(specific), specific.size() - 1));
  }
  if (!unsized && unknown.size() > 2) {
    refuse(fmt::format("too few knowns: {} are all unknown; give {} more of them (five of the seven quantities "
                       "fix a machine)",
                       key_list(unknown), unknown.size() - 2));
  }
}

Solve choose_pattern(const Problem& problem, const SolvedFor& unknown) {
  SolvedFor specific = unknown;
  specific.remove(Q::flow);
  specific.remove(Q::power);
  refuse_too_few(unknown, specific);
  if (problem.in.head && (unknown.contains(Q::inlet_pressure) || unknown.contains(Q::inlet_temperature))) {
    refuse("head needs the inlet state to give the outlet pressure; give outlet.pressure instead");
  }
  // An incompressible liquid's isentropic work v (p2 - p1) and its enthalpy rise do not
  // depend on the temperature level: flow, power and efficiency fix only T2 - T1.
  if (problem.fluid.fluid_kind() == fluids::FluidKind::liquid &&
      specific == SolvedFor{Q::inlet_temperature, Q::outlet_temperature}) {
    refuse("inlet.temperature and outlet.temperature cannot both be solved for an incompressible liquid: the "
           "pressures, flow, power and efficiency fix only the temperature rise; give one of the temperatures");
  }
  for (const Pattern& p : kPatterns) {
    if (p.unknown == specific) return p.solve;
  }
  // Two unknowns among p1, p2 and the efficiency: the efficiency definition has two
  // unknowns while the balance only checks itself.
  refuse(fmt::format("{} cannot both be solved: the temperatures, flow and power only check one another; give "
                     "one of them and drop power or the flow",
                     key_list(specific)));
}

// ---- Efficiencies ---------------------------------------------------------------------

// Why an isentropic efficiency outside (0, 1] came out of the knowns.
[[noreturn]] void refuse_impossible(const Problem& problem, const Endpoints& e, double eta_s, const State& s2) {
  const bool comp = problem.compression;
  if (!std::isfinite(eta_s)) {
    refuse("the efficiency is not a finite number: the given values lie beyond what the property model and "
           "double-precision arithmetic hold; check their magnitudes and units");
  }
  if (e.balance_used) {
    const double m = problem.mass_flow_for(e.inlet);
    const double ideal = m * std::fabs(s2.enthalpy - e.inlet.enthalpy);
    const double shaft = comp ? ideal / problem.in.eta_m() : ideal * problem.in.eta_m();
    refuse(fmt::format("efficiency would be {:.4g}: the power {} is {} the isentropic {} {} for this flow", eta_s,
                       problem.show(Q::power, *problem.in.power), comp ? "below" : "above",
                       comp ? "minimum" : "maximum",
                       std::isfinite(shaft) ? problem.show(Q::power, shaft) : "(more than 1.8e308 W)"));
  }
  const double dh = e.outlet.enthalpy - e.inlet.enthalpy;
  if ((dh > 0) != comp) {
    refuse(fmt::format("efficiency would be {:.4g}: a {} must {} the enthalpy, and the given outlet {} it by {:.6g} "
                       "kJ/kg",
                       eta_s, machine_name(problem.in.machine), comp ? "raise" : "lower", comp ? "lowers" : "raises",
                       std::fabs(dh) / 1e3));
  }
  if (e.outlet.is_wet() || s2.is_wet() || problem.in.outlet_enthalpy) {
    refuse(fmt::format("efficiency would be {:.4g}: the outlet enthalpy {:.6g} kJ/kg lies {} the isentropic outlet "
                       "enthalpy {:.6g} kJ/kg at the same pressure, which no real {} reaches; check the outlet state",
                       eta_s, e.outlet.enthalpy / 1e3, comp ? "below" : "above", s2.enthalpy / 1e3,
                       machine_name(problem.in.machine)));
  }
  refuse(fmt::format("efficiency would be {:.4g}: the outlet temperature {} is on the wrong side of the isentropic "
                     "outlet temperature {}",
                     eta_s, problem.show(Q::outlet_temperature, e.outlet.temperature),
                     problem.show(Q::outlet_temperature, s2.temperature)));
}

// An efficiency within rounding of 1 is reported as 1: none above 1 is ever printed.
double at_most_one(double eta) { return eta > 1 && eta <= 1 + 1e-9 ? 1.0 : eta; }

// Both efficiencies and the isentropic outlet; a given efficiency that fixed the outlet is
// reported as given.
void rate_efficiencies(const Problem& problem, const Endpoints& e, bool efficiency_used, const RatingOptions& options,
                       Rating& r) {
  const State s2 = e.isentropic ? *e.isentropic : problem.fluid.from_ps(e.outlet.pressure, e.inlet.entropy);
  const double dh = e.outlet.enthalpy - e.inlet.enthalpy;
  const double dhs = s2.enthalpy - e.inlet.enthalpy;
  double eta_s = problem.compression ? dhs / dh : dh / dhs;
  if (efficiency_used && problem.in.efficiency_isentropic) eta_s = *problem.in.efficiency_isentropic;
  if (!(eta_s > 0 && eta_s <= 1 + 1e-9)) refuse_impossible(problem, e, eta_s, s2);
  r.outlet_isentropic = s2;
  r.efficiency_isentropic = at_most_one(eta_s);
  r.head_isentropic = std::fabs(dhs);
  r.specific_work = std::fabs(dh);
  r.polytropic = options.polytropic || problem.in.efficiency_polytropic.has_value();
  if (!r.polytropic) return;
  r.efficiency_polytropic = efficiency_used && problem.in.efficiency_polytropic
                                ? *problem.in.efficiency_polytropic
                                : at_most_one(polytropic_efficiency(problem.fluid, e.inlet, e.outlet, eta_s));
  r.head_polytropic = problem.compression ? r.efficiency_polytropic * r.specific_work
                                          : r.specific_work / r.efficiency_polytropic;
  if (problem.fluid.fluid_kind() == fluids::FluidKind::real_gas) {
    r.schultz = schultz_method(problem.fluid, e.inlet, e.outlet, s2);
  }
}

// ---- Size and checks --------------------------------------------------------------------

void size_machine(const Problem& problem, const Endpoints& e, Rating& r) {
  const bool flow_given = problem.known(Q::flow);
  const bool power_given = problem.known(Q::power);
  if (!flow_given && !power_given) return;
  const double eta_m = problem.in.eta_m();
  const bool comp = problem.compression;
  const double m = flow_given ? problem.mass_flow_for(e.inlet)
                              : (comp ? *problem.in.power * eta_m : *problem.in.power / eta_m) / r.specific_work;
  const double fluid_power = m * r.specific_work;
  const double shaft_from_fluid = comp ? fluid_power / eta_m : fluid_power * eta_m;
  r.mass_flow = m;
  r.volume_flow = m / e.inlet.density;
  r.fluid_power = fluid_power;
  r.power = power_given ? *problem.in.power : shaft_from_fluid;
  if (flow_given && power_given && !e.balance_used) {
    const double given = *problem.in.power;
    r.power_balance = PowerBalance{fluid_power, shaft_from_fluid, given, 100.0 * (shaft_from_fluid - given) / given};
  }
}

void check_redundant(const Problem& problem, bool efficiency_used, Rating& r) {
  if (!problem.known(Q::efficiency) || efficiency_used) return;
  const bool isentropic = problem.in.efficiency_isentropic.has_value();
  const Input input = isentropic ? Input::efficiency_isentropic : Input::efficiency_polytropic;
  const double given = isentropic ? *problem.in.efficiency_isentropic : *problem.in.efficiency_polytropic;
  const double computed = isentropic ? r.efficiency_isentropic : r.efficiency_polytropic;
  r.efficiency_check = EfficiencyCheck{input, given, computed};
  if (std::fabs(given - computed) > kEfficiencyWarningPoints) {
    r.warnings.push_back(fmt::format("the given {} {:.4f} and the {:.4f} from the temperatures differ by {:.1f} "
                                     "points: check the temperatures and the given value",
                                     key_of(input), given, computed, 100 * std::fabs(given - computed)));
  }
}

void rate_pump(const Problem& problem, Rating& r) {
  if (problem.in.machine != MachineKind::pump) return;
  const double dp = r.outlet.pressure - r.inlet.pressure;
  r.head_height = dp / (r.inlet.density * units::kStandardGravity);
  if (r.mass_flow) {
    r.hydraulic_power = *r.mass_flow * dp / r.inlet.density;
    r.pump_efficiency = *r.hydraulic_power / *r.power;
  }
  if (r.solved_for.contains(Q::efficiency) && problem.in.outlet_temperature) {
    // Thermodynamic method: eta = dh_s / dh, and dh rises with cp per kelvin.
    const double per_centikelvin = r.efficiency_isentropic * r.outlet.cp * 0.01 / r.specific_work;
    r.warnings.push_back(fmt::format("efficiency from the measured temperature rise: 0.01 K of rise changes it by "
                                     "{:.2g} percentage points",
                                     100 * per_centikelvin));
  }
}

// An ideal gas is warned about where an estimate of the real gas's compressibility factor
// departs from 1 by more than this (the error of p v = R T in density, and about as much in
// power and flow), at the inlet or the outlet (issue 11; common practice, not a code's figure).
constexpr double kIdealGasZTolerance = 0.01;
// Without an estimate (constant cp, a species without critical data): above this pressure,
// where natural gas and CO2 depart from p v = R T by a few percent near ambient temperature
// (common practice, not a standard's figure).
constexpr double kIdealGasWarningPressure = 1.0e6;  // Pa

// The ideal-gas warning, or "" when the gas is near ideal (or not an ideal-gas model).
std::string ideal_gas_warning(const Problem& problem, const Rating& r) {
  if (problem.fluid.fluid_kind() != fluids::FluidKind::ideal_gas) return {};
  for (const State* s : {&r.inlet, &r.outlet}) {
    // The cheap proof first; the estimate itself (a cubic's roots) where it does not settle it.
    if (problem.fluid.estimated_compressibility_within(s->pressure, s->temperature, kIdealGasZTolerance)) continue;
    const auto z = problem.fluid.estimated_compressibility(s->pressure, s->temperature);
    if (!z) continue;
    if (std::fabs(1 - *z) <= kIdealGasZTolerance) continue;
    return fmt::format("the {} model is an ideal gas, and {} puts the compressibility factor at Z = {:.3f} at the {} "
                       "({}, {}): density, power and flow are off by about {:.0f} %; rate it on peng-robinson or "
                       "soave-redlich-kwong instead",
                       problem.fluid.model_name(), fluids::kCompressibilityEstimate, *z,
                       s == &r.inlet ? "inlet" : "outlet", problem.show(Q::inlet_pressure, s->pressure),
                       problem.show(Q::inlet_temperature, s->temperature), 100 * std::fabs(1 - *z));
  }
  const double p_max = std::max(r.inlet.pressure, r.outlet.pressure);
  // The pressure first: below it the estimate (a cubic's roots) is not needed.
  if (p_max > kIdealGasWarningPressure && !problem.fluid.estimated_compressibility(p_max, r.inlet.temperature)) {
    return fmt::format("the {} model is an ideal gas, and this machine runs up to {}: real-gas effects are not "
                       "modelled and can move efficiency and power by several percent",
                       problem.fluid.model_name(), problem.show(Q::outlet_pressure, p_max));
  }
  return {};
}

void add_warnings(const Problem& problem, const Endpoints& e, Rating& r) {
  if (std::string warning = ideal_gas_warning(problem, r); !warning.empty()) r.warnings.push_back(std::move(warning));
  // Below the dew point of the gas's water vapour (humid air): the inlet's stated moisture
  // cannot all be vapour; at the outlet water would condense, which the model leaves out.
  const auto dew_warning = [&](const fluids::State& st, Q q, std::string_view end, std::string_view consequence) {
    const auto dew = problem.fluid.dew_point(st.pressure);
    if (!dew || st.temperature >= *dew) return;
    r.warnings.push_back(fmt::format("the {} temperature {} lies below the dew point {} of the gas's water vapour: {}",
                                     end, problem.show(q, st.temperature), problem.show(q, *dew), consequence));
  };
  dew_warning(r.inlet, Q::inlet_temperature, "inlet",
              "the stated moisture cannot be all vapour there; check the humidity");
  dew_warning(r.outlet, Q::outlet_temperature, "outlet", "water would condense, which the model does not describe");
  if (r.power_balance && std::fabs(r.power_balance->difference_percent) > kPowerBalanceWarningPercent) {
    r.warnings.push_back(fmt::format("the shaft power from the fluid side and the given power differ by {:+.1f} %: "
                                     "check the flow, the temperatures and the power reading",
                                     r.power_balance->difference_percent));
  }
  if (e.second) {
    const SecondSolution& s = *e.second;
    r.warnings.push_back(fmt::format("{} has a second solution near {}; the one reported is the first from {}: "
                                     "check which the machine runs at",
                                     quantity_key(s.quantity), problem.show(s.quantity, s.value),
                                     problem.show(s.quantity, s.searched_from)));
  }
}

// Calls f(name, value) for each value of a result that must be a finite number.
template <class F>
void each_checked_value(const Rating& r, F&& f) {
  f("inlet density", r.inlet.density);
  f("outlet density", r.outlet.density);
  f("inlet enthalpy", r.inlet.enthalpy);
  f("outlet enthalpy", r.outlet.enthalpy);
  f("inlet entropy", r.inlet.entropy);
  f("outlet entropy", r.outlet.entropy);
  f("mass flow", r.mass_flow.value_or(0));
  f("inlet volume flow", r.volume_flow.value_or(0));
  f("power", r.power.value_or(0));
  f("fluid power", r.fluid_power.value_or(0));
  f("polytropic efficiency", r.efficiency_polytropic);
  f("isentropic head", r.head_isentropic);
  f("polytropic head", r.head_polytropic);
  f("pressure ratio", r.pressure_ratio);
  f("head height", r.head_height.value_or(0));
  f("hydraulic power", r.hydraulic_power.value_or(0));
  f("tip speed", r.tip_speed.value_or(0));
  f("flow coefficient", r.flow_coefficient.value_or(0));
  f("machine Mach number", r.machine_mach_number.value_or(0));
}

// Inputs at the edges of what a double holds (an inlet pressure of 1e-308 Pa) can give a
// density or a volume flow that underflows or overflows; such a result is refused, never
// printed as inf or nan. One pass of independent tests for every rating; the names only
// for a refusal.
void refuse_non_finite(const Rating& r) {
  bool all_finite = true;
  each_checked_value(r, [&](const char*, double value) { all_finite &= std::isfinite(value); });
  if (all_finite) return;
  each_checked_value(r, [&](const char* name, double value) {
    if (!std::isfinite(value)) {
      refuse(fmt::format("the {} is not a finite number (inlet density {:.6g} kg/m3): the inputs lie beyond what "
                         "double-precision arithmetic holds; check their magnitudes and units",
                         name, r.inlet.density));
    }
  });
}

}  // namespace

Rating rate(const RatingInput& input, const RatingOptions& options) {
  const Problem problem(input);
  SolvedFor unknown;
  for (Quantity q : kAllQuantities) {
    if (!problem.known(q)) unknown.add(q);
  }
  const Endpoints e = choose_pattern(problem, unknown)(problem);
  problem.check_pressure_direction(e.inlet.pressure, e.outlet.pressure);

  Rating r;
  r.machine = input.machine;
  r.model = problem.fluid.model_name();
  r.fluid_kind = problem.fluid.fluid_kind();
  r.mechanical_efficiency = input.eta_m();
  r.solved_for = unknown;
  r.humidity_ratio = problem.fluid.humidity_ratio();
  r.inlet = e.inlet;
  r.outlet = e.outlet;
  r.pressure_ratio = problem.compression ? e.outlet.pressure / e.inlet.pressure : e.inlet.pressure / e.outlet.pressure;
  // The given efficiency fixed the states unless p1, T1, p2 and T2 were all given.
  const bool efficiency_used = problem.known(Q::efficiency) &&
                               (unknown.contains(Q::inlet_pressure) || unknown.contains(Q::inlet_temperature) ||
                                unknown.contains(Q::outlet_pressure) || unknown.contains(Q::outlet_temperature));
  rate_efficiencies(problem, e, efficiency_used, options, r);
  size_machine(problem, e, r);
  if (!r.mass_flow) {  // unsized: neither flow nor power was solved
    r.solved_for.remove(Q::flow);
    r.solved_for.remove(Q::power);
  }
  check_redundant(problem, efficiency_used, r);
  rate_pump(problem, r);
  rate_impeller(input, problem.fluid, r);
  add_warnings(problem, e, r);
  refuse_non_finite(r);
  return r;
}

}  // namespace shaftwork::machines

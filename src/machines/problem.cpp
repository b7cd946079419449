#include "problem.hpp"

#include <cmath>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/machines/polytropic.hpp"

namespace shaftwork::machines {

using fluids::State;

void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

namespace {

const fluids::FluidModel& checked_fluid(const RatingInput& in) {
  if (!in.fluid) refuse("no fluid given");
  return *in.fluid;
}

// The smallest relative pressure change rated: below it the efficiencies are the
// quotient of two rounding errors.
constexpr double kSmallestPressureChange = 1e-7;

}  // namespace

Problem::Problem(const RatingInput& input)
    : in(input), fluid(checked_fluid(input)), compression(compresses(input.machine)) {
  if (!input_acceptable(in, known_)) refuse(input_problem(in));
  if (in.inlet_pressure && in.outlet_pressure) check_pressure_direction(*in.inlet_pressure, *in.outlet_pressure);
}

std::string Problem::show(Quantity q, double si) const {
  if (in.echo) return in.echo(q, si);
  switch (q) {
    case Quantity::inlet_pressure:
    case Quantity::outlet_pressure: return fmt::format("{:.6g} Pa", si);
    case Quantity::inlet_temperature:
    case Quantity::outlet_temperature: return fmt::format("{:.6g} K", si);
    case Quantity::flow: return fmt::format("{:.6g} kg/s", si);
    case Quantity::power: return fmt::format("{:.6g} W", si);
    case Quantity::efficiency: return fmt::format("{:.6g}", si);
  }
  return fmt::format("{:.6g}", si);
}

void Problem::check_pressure_direction(double p1, double p2) const {
  if (in.machine == MachineKind::turbine && !(p2 < p1)) {
    refuse(fmt::format("a turbine's outlet pressure ({}) must be below its inlet pressure ({})",
                       show(Quantity::outlet_pressure, p2), show(Quantity::inlet_pressure, p1)));
  }
  if (compression && !(p2 > p1)) {
    refuse(fmt::format("a {}'s outlet pressure ({}) must be above its inlet pressure ({})", machine_name(in.machine),
                       show(Quantity::outlet_pressure, p2), show(Quantity::inlet_pressure, p1)));
  }
  if (std::fabs(p2 - p1) <= kSmallestPressureChange * std::max(p1, p2)) {
    refuse(fmt::format("the outlet pressure ({}) and the inlet pressure ({}) differ by less than 1e-7 of "
                       "either: there is no pressure change to rate; check the pressures and their units",
                       show(Quantity::outlet_pressure, p2), show(Quantity::inlet_pressure, p1)));
  }
}

State Problem::inlet_at(double p1) const {
  try {
    if (in.inlet_enthalpy) return fluid.from_ph(p1, *in.inlet_enthalpy);
    if (in.inlet_quality) return fluid.from_p_quality(p1, *in.inlet_quality);
    return fluid.from_pt(p1, *in.inlet_temperature);
  } catch (const Error& e) {
    throw e.with_context("inlet");
  }
}

State Problem::inlet_at(double p1, double T1) const {
  try {
    return fluid.from_pt(p1, T1);
  } catch (const Error& e) {
    throw e.with_context("inlet");
  }
}

double Problem::outlet_pressure_for(const State& inlet) const {
  if (in.outlet_pressure) return *in.outlet_pressure;
  return inlet.pressure + inlet.density * *in.head;
}

State Problem::outlet_given(double p2) const {
  if (in.outlet_temperature) refuse_wet_outlet_temperature(p2, *in.outlet_temperature);
  try {
    if (in.outlet_enthalpy) return fluid.from_ph(p2, *in.outlet_enthalpy);
    if (in.outlet_quality) return fluid.from_p_quality(p2, *in.outlet_quality);
    return fluid.from_pt(p2, *in.outlet_temperature);
  } catch (const Error& e) {
    throw e.with_context("outlet");
  }
}

void Problem::refuse_wet_outlet_temperature(double p2, double T2) const {
  const auto Tsat = fluid.saturation_temperature(p2);
  if (!Tsat) return;
  // A measured temperature at (or, for a turbine, below) saturation does not fix a wet
  // state: the quality could be anything from 0 to 1.
  constexpr double kBand = 0.5;  // K; a thermometer's usual uncertainty (common practice)
  const bool at_saturation = std::fabs(T2 - *Tsat) <= kBand;
  const bool wet_turbine_exhaust = in.machine == MachineKind::turbine && T2 < *Tsat;
  if (at_saturation || wet_turbine_exhaust) {
    refuse(fmt::format("outlet.temperature {} is {} the saturation temperature {} at the outlet pressure: a "
                       "temperature does not fix a wet state; give outlet.enthalpy or outlet.quality, or power "
                       "with the flow, instead",
                       show(Quantity::outlet_temperature, T2), at_saturation ? "within 0.5 K of" : "below",
                       show(Quantity::outlet_temperature, *Tsat)));
  }
}

double Problem::mass_flow_for(const State& inlet) const {
  if (in.mass_flow) return *in.mass_flow;
  if (in.volume_flow) return *in.volume_flow * inlet.density;
  if (!(inlet.molar_mass > 0)) {
    refuse(fmt::format("standard_volume_flow needs the fluid's molar mass, which the {} model does not have; "
                       "give mass_flow or volume_flow",
                       fluid.model_name()));
  }
  return *in.standard_volume_flow * inlet.molar_mass;
}

double Problem::enthalpy_rise(double m, double P) const {
  return compression ? P * in.eta_m() / m : -P / (in.eta_m() * m);
}

double Problem::outlet_enthalpy_by_balance(const State& inlet) const {
  return inlet.enthalpy + enthalpy_rise(mass_flow_for(inlet), *in.power);
}

double Problem::outlet_enthalpy_by_efficiency(const State& inlet, double p2, State* isentropic) const {
  if (in.efficiency_polytropic) {
    if (isentropic) *isentropic = fluid.from_ps(p2, inlet.entropy);
    return polytropic_outlet_enthalpy(fluid, inlet, p2, *in.efficiency_polytropic);
  }
  const State s2 = fluid.from_ps(p2, inlet.entropy);
  if (isentropic) *isentropic = s2;
  const double dhs = s2.enthalpy - inlet.enthalpy;
  const double eta = *in.efficiency_isentropic;
  return compression ? inlet.enthalpy + dhs / eta : inlet.enthalpy + eta * dhs;
}

}  // namespace shaftwork::machines

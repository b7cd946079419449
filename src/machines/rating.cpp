#include "shaftwork/machines/rating.hpp"

#include <algorithm>
#include <cmath>
#include <functional>
#include <string>
#include <utility>
#include <vector>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/machines/polytropic.hpp"
#include "shaftwork/numerics/root.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::machines {

using fluids::FluidModel;
using fluids::State;

const char* machine_name(MachineKind kind) {
  switch (kind) {
    case MachineKind::compressor: return "compressor";
    case MachineKind::turbine: return "turbine";
    case MachineKind::pump: return "pump";
  }
  return "?";
}

const char* quantity_key(Quantity q) {
  switch (q) {
    case Quantity::inlet_pressure: return "inlet.pressure";
    case Quantity::inlet_temperature: return "inlet.temperature";
    case Quantity::outlet_pressure: return "outlet.pressure";
    case Quantity::outlet_temperature: return "outlet.temperature";
    case Quantity::flow: return "mass_flow";
    case Quantity::power: return "power";
    case Quantity::efficiency: return "efficiency";
  }
  return "?";
}

bool SolvedFor::contains(Quantity q) const { return std::find(begin(), end(), q) != end(); }

bool SolvedFor::contains(std::string_view key) const {
  return std::any_of(begin(), end(), [key](Quantity q) { return key == quantity_key(q); });
}

std::vector<std::string> SolvedFor::keys() const {
  std::vector<std::string> out;
  out.reserve(size());
  for (Quantity q : *this) out.emplace_back(quantity_key(q));
  return out;
}

bool operator==(const SolvedFor& solved, const std::vector<std::string>& keys) {
  if (solved.size() != keys.size()) return false;
  for (std::size_t i = 0; i < keys.size(); ++i) {
    if (keys[i] != quantity_key(solved.begin()[i])) return false;
  }
  return true;
}

namespace {

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

// Above this pressure an ideal-gas result gets a warning: 1 MPa is where natural gas
// and CO2 depart from p v = R T by a few percent near ambient temperature (common
// practice, not a standard's figure).
constexpr double kIdealGasWarningPressure = 1.0e6;  // Pa

bool compresses(MachineKind kind) { return kind != MachineKind::turbine; }

OutletFromEfficiency isentropic_outlet(const FluidModel& fluid, MachineKind machine, const State& inlet,
                                       double p2, double eta_s) {
  const State s2 = fluid.from_ps(p2, inlet.entropy);
  const double dhs = s2.enthalpy - inlet.enthalpy;
  const double h2 = compresses(machine) ? inlet.enthalpy + dhs / eta_s : inlet.enthalpy + eta_s * dhs;
  return {h2, s2};
}

// The isentropic part of efficiencies_of: cheap, and checked before the polytropic
// efficiency is sought (which has no solution when eta_s is outside (0, 1]).
// `known_isentropic_outlet`, when the caller already holds the state at (p2, s1),
// saves computing it a second time.
ProcessEfficiencies isentropic_efficiency_of(const FluidModel& fluid, MachineKind machine, const State& inlet,
                                             const State& outlet,
                                             const State* known_isentropic_outlet = nullptr) {
  ProcessEfficiencies e;
  e.isentropic_outlet =
      known_isentropic_outlet ? *known_isentropic_outlet : fluid.from_ps(outlet.pressure, inlet.entropy);
  const double dh = outlet.enthalpy - inlet.enthalpy;
  const double dhs = e.isentropic_outlet.enthalpy - inlet.enthalpy;
  e.isentropic = compresses(machine) ? dhs / dh : dh / dhs;
  return e;
}

// The root of a scanning search, and where f changes sign again if it does: a
// second solution the user should hear of.
struct ScanResult {
  double x;
  std::optional<double> another;
};

// Scans [low, high] (in log space when `log_scale`) for the first sign change of f,
// then closes on it with TOMS 748, and scans on for a second one; a scan that meets
// no sign change is repeated eight times finer before giving up. Points where f cannot be evaluated (a state
// outside the model's range) are skipped. Throws bad_input with `no_solution` when
// f does not change sign anywhere in the interval.
ScanResult solve_scanning(const std::function<double(double)>& f, double low, double high, bool log_scale,
                          const std::string& what, const std::string& no_solution) {
  auto value = [&](double x) -> std::optional<double> {
    try {
      const double v = f(x);
      if (std::isfinite(v)) return v;
    } catch (const Error&) {
    }
    return std::nullopt;
  };
  // A coarse scan first; when it meets no sign change, a scan eight times finer, since
  // two roots close together (or a narrow valid interval at a range's edge) can hide
  // between coarse points.
  for (const int points : {48, 384}) {
    auto at = [&](int i) {
      const double t = static_cast<double>(i) / points;
      return log_scale ? low * std::pow(high / low, t) : low + (high - low) * t;
    };
    std::optional<ScanResult> found;
    std::optional<double> previous;
    double previous_x = low;
    for (int i = 0; i <= points; ++i) {
      const double x = at(i);
      const auto v = value(x);
      if (!v) continue;
      const bool crossed = *v == 0 || (previous && *previous != 0 && ((*previous > 0) != (*v > 0)));
      if (crossed && found) {
        found->another = x;  // a second solution: the scan goes no further
        return *found;
      }
      if (crossed) {
        numerics::RootOptions options;
        options.relative_tolerance = 1e-13;
        found = ScanResult{*v == 0 ? x : numerics::find_root(f, previous_x, x, what, options).x, std::nullopt};
      }
      previous = v;
      previous_x = x;
    }
    if (found) return *found;
  }
  refuse(no_solution);
}

// The solve: holds the input and the pieces every pattern of knowns is built from.
class Solver {
 public:
  explicit Solver(const RatingInput& in) : in_(in), fluid_(*in.fluid) {}

  Rating run();

 private:
  std::string show(Quantity q, double si) const {
    if (in_.echo) return in_.echo(q, si);
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

  bool known(Quantity q) const {
    switch (q) {
      case Quantity::inlet_pressure: return in_.inlet_pressure.has_value();
      case Quantity::inlet_temperature: return in_.inlet_temperature || in_.inlet_enthalpy;
      case Quantity::outlet_pressure: return in_.outlet_pressure || in_.pump_head;
      case Quantity::outlet_temperature:
        return in_.outlet_temperature || in_.outlet_enthalpy || in_.outlet_quality;
      case Quantity::flow: return in_.flow.has_value();
      case Quantity::power: return in_.power.has_value();
      case Quantity::efficiency: return in_.efficiency.has_value();
    }
    return false;
  }

  void check_given_values() const;
  void check_pressure_direction(double p1, double p2) const;

  State inlet_at(double p1, std::optional<double> T1) const {
    try {
      if (T1) return fluid_.from_pt(p1, *T1);
      if (in_.inlet_enthalpy) return fluid_.from_ph(p1, *in_.inlet_enthalpy);
      return fluid_.from_pt(p1, *in_.inlet_temperature);
    } catch (const Error& e) {
      throw e.with_context("inlet");
    }
  }
  double outlet_pressure_for(const State& inlet) const {
    if (in_.outlet_pressure) return *in_.outlet_pressure;
    return inlet.pressure + inlet.density * *in_.pump_head;
  }
  // The outlet as given (temperature, enthalpy or quality) at pressure p2.
  State outlet_given(double p2) const;
  void refuse_wet_outlet_temperature(double p2, double T2) const;
  double mass_flow_for(const State& inlet) const;
  // h2 - h1 from the energy balance, signed.
  double enthalpy_rise(double mass_flow, double power) const {
    return compresses(in_.machine) ? power * in_.mechanical_efficiency / mass_flow
                                   : -power / (in_.mechanical_efficiency * mass_flow);
  }
  double outlet_enthalpy_by_efficiency(const State& inlet, double p2) const {
    return outlet_from_efficiency(fluid_, in_.machine, inlet, p2, *in_.efficiency).enthalpy;
  }
  fluids::Range temperature_range() const { return fluid_.temperature_range(); }

  // Root searches over one unknown, each returning the solved value.
  double solve_inlet_temperature(double p1, const std::function<double(const State&)>& residual) const;
  // A scanning search for quantity q in [low, high] (log scale); a second solution of
  // the outermost search is kept for a warning.
  double scan(Quantity q, const std::function<double(double)>& f, double low, double high,
              const std::string& no_solution) const;
  double solve_pressure(bool inlet_side, double other_pressure,
                        const std::function<double(double)>& residual) const;

  std::string unknown_list(const SolvedFor& unknown) const;

  const RatingInput& in_;
  const FluidModel& fluid_;
  mutable int search_depth_ = 0;                       // nesting of scanning searches
  mutable std::vector<std::string> second_solutions_;  // warnings from the outermost one
};

void Solver::check_given_values() const {
  if (in_.inlet_temperature && in_.inlet_enthalpy) {
    refuse("inlet: give temperature or enthalpy, not both");
  }
  const int outlet_forms = in_.outlet_temperature.has_value() + in_.outlet_enthalpy.has_value() +
                           in_.outlet_quality.has_value();
  if (outlet_forms > 1) refuse("outlet: give one of temperature, enthalpy or quality");
  if (in_.outlet_pressure && in_.pump_head) refuse("give outlet.pressure or head, not both");
  if (in_.pump_head && in_.machine != MachineKind::pump) refuse("head stands for the outlet pressure of pumps only");
  if (in_.pump_head && !(*in_.pump_head > 0)) refuse(fmt::format("head must be above 0, got {:.6g} J/kg", *in_.pump_head));
  if (in_.efficiency && !(in_.efficiency->value > 0 && in_.efficiency->value <= 1)) {
    refuse(fmt::format("efficiency must be above 0 and at most 1, got {:.6g}", in_.efficiency->value));
  }
  if (!(in_.mechanical_efficiency > 0 && in_.mechanical_efficiency <= 1)) {
    refuse(fmt::format("mechanical_efficiency must be above 0 and at most 1, got {:.6g}",
                       in_.mechanical_efficiency));
  }
  if (in_.power && !(*in_.power > 0)) refuse(fmt::format("power must be above 0, got {}", show(Quantity::power, *in_.power)));
  if (in_.flow && !(in_.flow->value > 0)) refuse("the flow must be above 0");
  if (in_.outlet_quality && !(*in_.outlet_quality >= 0 && *in_.outlet_quality <= 1)) {
    refuse(fmt::format("outlet.quality must be between 0 and 1, got {:.6g}", *in_.outlet_quality));
  }
  if (in_.inlet_pressure && in_.outlet_pressure) check_pressure_direction(*in_.inlet_pressure, *in_.outlet_pressure);
}

void Solver::check_pressure_direction(double p1, double p2) const {
  if (in_.machine == MachineKind::turbine && !(p2 < p1)) {
    refuse(fmt::format("a turbine's outlet pressure ({}) must be below its inlet pressure ({})",
                       show(Quantity::outlet_pressure, p2), show(Quantity::inlet_pressure, p1)));
  }
  if (in_.machine != MachineKind::turbine && !(p2 > p1)) {
    refuse(fmt::format("a {}'s outlet pressure ({}) must be above its inlet pressure ({})",
                       machine_name(in_.machine), show(Quantity::outlet_pressure, p2),
                       show(Quantity::inlet_pressure, p1)));
  }
}

State Solver::outlet_given(double p2) const {
  if (in_.outlet_temperature) refuse_wet_outlet_temperature(p2, *in_.outlet_temperature);
  try {
    if (in_.outlet_enthalpy) return fluid_.from_ph(p2, *in_.outlet_enthalpy);
    if (in_.outlet_quality) return fluid_.from_p_quality(p2, *in_.outlet_quality);
    return fluid_.from_pt(p2, *in_.outlet_temperature);
  } catch (const Error& e) {
    throw e.with_context("outlet");
  }
}

void Solver::refuse_wet_outlet_temperature(double p2, double T2) const {
  const auto Tsat = fluid_.saturation_temperature(p2);
  if (!Tsat) return;
  // A measured temperature at (or, for a turbine, below) saturation does not fix a
  // wet state: the quality could be anything from 0 to 1.
  constexpr double kBand = 0.5;  // K; a thermometer's usual uncertainty (common practice)
  const bool at_saturation = std::fabs(T2 - *Tsat) <= kBand;
  const bool wet_turbine_exhaust = in_.machine == MachineKind::turbine && T2 < *Tsat;
  if (at_saturation || wet_turbine_exhaust) {
    refuse(fmt::format(
        "outlet.temperature {} is {} the saturation temperature {} at the outlet pressure: a "
        "temperature does not fix a wet state; give outlet.enthalpy or outlet.quality, or power "
        "with the flow, instead",
        show(Quantity::outlet_temperature, T2), at_saturation ? "within 0.5 K of" : "below",
        show(Quantity::outlet_temperature, *Tsat)));
  }
}

double Solver::mass_flow_for(const State& inlet) const {
  const Flow& flow = *in_.flow;
  switch (flow.kind) {
    case Flow::Kind::mass: return flow.value;
    case Flow::Kind::actual_volume: return flow.value * inlet.density;
    case Flow::Kind::molar:
      if (!(inlet.molar_mass > 0)) {
        refuse(fmt::format("standard_volume_flow needs the fluid's molar mass, which the {} model "
                           "does not have; give mass_flow or volume_flow",
                           fluid_.model_name()));
      }
      return flow.value * inlet.molar_mass;
  }
  return flow.value;
}

double Solver::solve_inlet_temperature(double p1,
                                       const std::function<double(const State&)>& residual) const {
  const fluids::Range range = temperature_range();
  return scan(Quantity::inlet_temperature, [&](double T1) { return residual(fluid_.from_pt(p1, T1)); },
              range.low, range.high,
              fmt::format("no inlet temperature between {} and {} satisfies the other knowns",
                          show(Quantity::inlet_temperature, range.low),
                          show(Quantity::inlet_temperature, range.high)));
}

double Solver::scan(Quantity q, const std::function<double(double)>& f, double low, double high,
                    const std::string& no_solution) const {
  ++search_depth_;
  struct Leave {
    int& depth;
    ~Leave() { --depth; }
  } leave{search_depth_};
  const ScanResult result = solve_scanning(f, low, high, true, quantity_key(q), no_solution);
  if (result.another && search_depth_ == 1) {
    second_solutions_.push_back(fmt::format(
        "{} has a second solution near {}; the one reported is the first from {}: check which the "
        "machine runs at",
        quantity_key(q), show(q, *result.another), show(q, low)));
  }
  return result.x;
}

double Solver::solve_pressure(bool inlet_side, double other, const std::function<double(double)>& residual) const {
  fluids::Range range = fluid_.pressure_range();
  range.low = std::max(range.low, 1.0);  // Pa; a log-scale search needs a positive floor
  // The unknown pressure lies on the side of `other` that the machine demands.
  const bool unknown_is_higher = inlet_side != compresses(in_.machine);
  const double low = unknown_is_higher ? other * (1 + 1e-9) : range.low;
  const double high = unknown_is_higher ? range.high : other * (1 - 1e-9);
  const Quantity q = inlet_side ? Quantity::inlet_pressure : Quantity::outlet_pressure;
  return scan(q, residual, low, high,
              fmt::format("no {} between {} and {} satisfies the other knowns", quantity_key(q), show(q, low),
                          show(q, high)));
}

std::string Solver::unknown_list(const SolvedFor& unknown) const {
  std::string out;
  for (size_t i = 0; i < unknown.size(); ++i) {
    if (i) out += i + 1 == unknown.size() ? " and " : ", ";
    out += quantity_key(unknown.begin()[i]);
  }
  return out;
}

// Inputs at the edges of what a double holds (an inlet pressure of 1e-308 Pa) can give a
// density or a volume flow that underflows or overflows; such a result is refused, never
// printed as inf or nan.
void refuse_non_finite(const Rating& r) {
  const std::pair<const char*, double> values[] = {
      {"inlet density", r.inlet.density},     {"outlet density", r.outlet.density},
      {"inlet enthalpy", r.inlet.enthalpy},   {"outlet enthalpy", r.outlet.enthalpy},
      {"inlet entropy", r.inlet.entropy},     {"outlet entropy", r.outlet.entropy},
      {"mass flow", r.mass_flow},             {"inlet volume flow", r.volume_flow},
      {"power", r.power},                     {"fluid power", r.fluid_power},
      {"polytropic efficiency", r.efficiency_polytropic},
      {"isentropic head", r.head_isentropic}, {"polytropic head", r.head_polytropic},
      {"pressure ratio", r.pressure_ratio},   {"head height", r.head_height.value_or(0.0)},
  };
  for (const auto& [name, value] : values) {
    if (!std::isfinite(value)) {
      refuse(fmt::format("the {} is not a finite number (inlet density {:.6g} kg/m3): the inputs lie "
                         "beyond what double-precision arithmetic holds; check their magnitudes and units",
                         name, r.inlet.density));
    }
  }
}

Rating Solver::run() {
  if (!in_.fluid) refuse("no fluid given");
  check_given_values();

  const Quantity all[] = {Quantity::inlet_pressure, Quantity::inlet_temperature, Quantity::outlet_pressure,
                          Quantity::outlet_temperature, Quantity::flow, Quantity::power,
                          Quantity::efficiency};
  SolvedFor unknown;  // a fixed list: nothing allocated per case
  for (Quantity q : all) {
    if (!known(q)) unknown.push_back(q);
  }
  auto is_unknown = [&](Quantity q) { return unknown.contains(q); };

  if (unknown.size() > 2) {
    refuse(fmt::format("too few knowns: {} are all unknown; give {} more of them (five of the seven "
                       "quantities fix a machine)",
                       unknown_list(unknown), unknown.size() - 2));
  }
  if (in_.pump_head && (is_unknown(Quantity::inlet_pressure) || is_unknown(Quantity::inlet_temperature))) {
    refuse("head needs the inlet state to give the outlet pressure; give outlet.pressure instead");
  }
  const bool flow_unknown = is_unknown(Quantity::flow);
  const bool power_unknown = is_unknown(Quantity::power);
  if (flow_unknown && power_unknown) {
    refuse("the flow and the power are both unknown, and nothing else fixes the size of the machine: "
           "give mass_flow (or volume_flow, standard_volume_flow) or power");
  }
  // Two unknowns among p1, p2 and the efficiency leave the efficiency definition
  // with two unknowns while the balance only checks itself.
  {
    const Quantity only_in_definition[] = {Quantity::inlet_pressure, Quantity::outlet_pressure,
                                           Quantity::efficiency};
    int count = 0;
    for (Quantity q : only_in_definition) count += is_unknown(q);
    if (count == 2) {
      refuse(fmt::format("{} cannot both be solved: the temperatures, flow and power only check one "
                         "another; give one of them and drop power or the flow",
                         unknown_list(unknown)));
    }
  }
  // An incompressible liquid's isentropic work v (p2 - p1) and its enthalpy rise do not depend
  // on the temperature level, so flow, power and efficiency fix only T2 - T1: any T1 would do.
  if (fluid_.is_incompressible() && is_unknown(Quantity::inlet_temperature) &&
      is_unknown(Quantity::outlet_temperature)) {
    refuse("inlet.temperature and outlet.temperature cannot both be solved for an incompressible liquid: "
           "the pressures, flow, power and efficiency fix only the temperature rise; give one of the "
           "temperatures");
  }

  Rating r;
  r.machine = in_.machine;
  r.model = fluid_.model_name();
  r.mechanical_efficiency = in_.mechanical_efficiency;
  r.solved_for = unknown;  // quantity_key(Quantity::flow) is "mass_flow"

  // --- Find the inlet and outlet states. ---------------------------------------
  const bool T1_unknown = is_unknown(Quantity::inlet_temperature);
  const bool p1_unknown = is_unknown(Quantity::inlet_pressure);
  const bool p2_unknown = is_unknown(Quantity::outlet_pressure);
  const bool T2_unknown = is_unknown(Quantity::outlet_temperature);
  const bool eta_unknown = is_unknown(Quantity::efficiency);
  bool balance_used = false;  // the energy balance fixed h1 or h2
  // The state at (p2, s1) when the efficiency gave h2 directly, kept for the efficiencies.
  std::optional<State> isentropic_at_p2;

  // h2 fixed by the balance from an inlet state (flow and power known).
  auto h2_by_balance = [&](const State& in) {
    return in.enthalpy + enthalpy_rise(mass_flow_for(in), *in_.power);
  };
  // T1 at p1 such that the balance carries the inlet to the outlet enthalpy h2.
  auto inlet_by_balance = [&](double p1, double h2) {
    const double T1 = solve_inlet_temperature(p1, [&](const State& in) { return h2_by_balance(in) - h2; });
    return fluid_.from_pt(p1, T1);
  };

  State inlet;
  double p2 = 0;
  double h2 = 0;
  if (!T1_unknown && !p1_unknown) {
    inlet = inlet_at(*in_.inlet_pressure, std::nullopt);
    if (p2_unknown) {
      auto target = [&](double p) { return T2_unknown ? h2_by_balance(inlet) : outlet_given(p).enthalpy; };
      p2 = solve_pressure(false, inlet.pressure,
                          [&](double p) { return outlet_enthalpy_by_efficiency(inlet, p) - target(p); });
      h2 = target(p2);
      balance_used = T2_unknown;
    } else {
      p2 = outlet_pressure_for(inlet);
      check_pressure_direction(inlet.pressure, p2);
      if (!T2_unknown) {
        h2 = outlet_given(p2).enthalpy;
      } else if (!eta_unknown) {
        OutletFromEfficiency by_efficiency = outlet_from_efficiency(fluid_, in_.machine, inlet, p2, *in_.efficiency);
        h2 = by_efficiency.enthalpy;
        isentropic_at_p2 = by_efficiency.isentropic;
      } else {
        h2 = h2_by_balance(inlet);
        balance_used = true;
      }
    }
  } else if (p1_unknown && !T1_unknown) {
    // p2 and the efficiency are known (the other pairs were refused above).
    p2 = *in_.outlet_pressure;
    const std::optional<double> h2_given =
        T2_unknown ? std::nullopt : std::optional<double>(outlet_given(p2).enthalpy);
    auto target = [&](const State& in) { return h2_given ? *h2_given : h2_by_balance(in); };
    const double p1 = solve_pressure(true, p2, [&](double p) {
      const State in = inlet_at(p, std::nullopt);
      return outlet_enthalpy_by_efficiency(in, p2) - target(in);
    });
    inlet = inlet_at(p1, std::nullopt);
    h2 = target(inlet);
    balance_used = T2_unknown;
  } else if (T1_unknown && !p1_unknown) {
    const double p1 = *in_.inlet_pressure;
    if (p2_unknown) {
      // Balance gives the inlet for each trial p2; the efficiency then fixes p2.
      p2 = solve_pressure(false, p1, [&](double p) {
        const double h = outlet_given(p).enthalpy;
        return outlet_enthalpy_by_efficiency(inlet_by_balance(p1, h), p) - h;
      });
      h2 = outlet_given(p2).enthalpy;
      inlet = inlet_by_balance(p1, h2);
      balance_used = true;
    } else {
      p2 = *in_.outlet_pressure;
      if (T2_unknown) {
        const double T1 = solve_inlet_temperature(p1, [&](const State& in) {
          return outlet_enthalpy_by_efficiency(in, p2) - h2_by_balance(in);
        });
        inlet = fluid_.from_pt(p1, T1);
        h2 = h2_by_balance(inlet);
        balance_used = true;
      } else if (eta_unknown) {
        h2 = outlet_given(p2).enthalpy;
        inlet = inlet_by_balance(p1, h2);
        balance_used = true;
      } else {
        h2 = outlet_given(p2).enthalpy;
        const double T1 = solve_inlet_temperature(
            p1, [&](const State& in) { return outlet_enthalpy_by_efficiency(in, p2) - h2; });
        inlet = fluid_.from_pt(p1, T1);
      }
    }
  } else {
    // Both inlet quantities unknown: the balance gives T1 for each trial p1.
    p2 = *in_.outlet_pressure;
    h2 = outlet_given(p2).enthalpy;
    const double p1 = solve_pressure(true, p2, [&](double p) {
      return outlet_enthalpy_by_efficiency(inlet_by_balance(p, h2), p2) - h2;
    });
    inlet = inlet_by_balance(p1, h2);
    balance_used = true;
  }
  check_pressure_direction(inlet.pressure, p2);
  const State outlet = T2_unknown ? fluid_.from_ph(p2, h2) : outlet_given(p2);

  // --- Efficiencies, checked against what a real machine can do. -----------------
  ProcessEfficiencies eff = isentropic_efficiency_of(fluid_, in_.machine, inlet, outlet,
                                                     isentropic_at_p2 ? &*isentropic_at_p2 : nullptr);
  const double mass_flow = flow_unknown ? 0.0 : mass_flow_for(inlet);
  if (!(eff.isentropic > 0 && eff.isentropic <= 1 + 1e-9)) {
    const bool comp = compresses(in_.machine);
    if (balance_used) {
      const double ideal = mass_flow * std::fabs(eff.isentropic_outlet.enthalpy - inlet.enthalpy);
      const double shaft = comp ? ideal / in_.mechanical_efficiency : ideal * in_.mechanical_efficiency;
      refuse(fmt::format("efficiency would be {:.4g}: the power {} is {} the isentropic {} {} for this flow",
                         eff.isentropic, show(Quantity::power, *in_.power), comp ? "below" : "above",
                         comp ? "minimum" : "maximum",
                         std::isfinite(shaft) ? show(Quantity::power, shaft) : "(more than 1.8e308 W)"));
    }
    if ((outlet.enthalpy - inlet.enthalpy > 0) != comp) {
      refuse(fmt::format("efficiency would be {:.4g}: a {} must {} the enthalpy, and the outlet state ({}) "
                         "{} it",
                         eff.isentropic, machine_name(in_.machine), comp ? "raise" : "lower",
                         show(Quantity::outlet_temperature, outlet.temperature), comp ? "lowers" : "raises"));
    }
    refuse(fmt::format("efficiency would be {:.4g}: the outlet temperature {} is on the wrong side of the "
                       "isentropic outlet temperature {}",
                       eff.isentropic, show(Quantity::outlet_temperature, outlet.temperature),
                       show(Quantity::outlet_temperature, eff.isentropic_outlet.temperature)));
  }

  eff.polytropic = polytropic_efficiency(fluid_, inlet, outlet, eff.isentropic);

  // --- Flow and power. -------------------------------------------------------------
  const double rise = std::fabs(outlet.enthalpy - inlet.enthalpy);
  const double eta_m = in_.mechanical_efficiency;
  const bool comp = compresses(in_.machine);
  r.mass_flow = mass_flow;
  if (flow_unknown) {
    r.mass_flow = comp ? *in_.power * eta_m / rise : *in_.power / (eta_m * rise);
  }
  r.fluid_power = r.mass_flow * rise;
  const double shaft_from_fluid = comp ? r.fluid_power / eta_m : r.fluid_power * eta_m;
  r.power = power_unknown ? shaft_from_fluid : *in_.power;
  if (!flow_unknown && !power_unknown && !balance_used) {
    PowerBalance pb;
    pb.fluid_power = r.fluid_power;
    pb.shaft_power = shaft_from_fluid;
    pb.given_power = *in_.power;
    pb.difference_percent = 100.0 * (shaft_from_fluid - *in_.power) / *in_.power;
    r.power_balance = pb;
  }
  if (!eta_unknown && !T2_unknown && !p1_unknown && !p2_unknown && !T1_unknown) {
    const bool isentropic = in_.efficiency->basis == EfficiencyBasis::isentropic;
    r.checks.push_back({isentropic ? "efficiency.isentropic" : "efficiency.polytropic", in_.efficiency->value,
                        isentropic ? eff.isentropic : eff.polytropic});
  }

  r.inlet = inlet;
  r.outlet = outlet;
  r.outlet_isentropic = eff.isentropic_outlet;
  r.volume_flow = r.mass_flow / inlet.density;
  r.efficiency_isentropic = eff.isentropic;
  r.efficiency_polytropic = eff.polytropic;
  r.head_isentropic = std::fabs(eff.isentropic_outlet.enthalpy - inlet.enthalpy);
  r.head_polytropic = comp ? eff.polytropic * rise : rise / eff.polytropic;
  r.pressure_ratio = comp ? outlet.pressure / inlet.pressure : inlet.pressure / outlet.pressure;
  if (fluid_.ideal_gas_constant() && std::max(inlet.pressure, outlet.pressure) > kIdealGasWarningPressure) {
    r.warnings.push_back(fmt::format(
        "the {} model is an ideal gas, and this machine runs up to {}: real-gas effects are not modelled "
        "and can move efficiency and power by several percent",
        fluid_.model_name(), show(Quantity::outlet_pressure, std::max(inlet.pressure, outlet.pressure))));
  }
  if (in_.machine == MachineKind::pump) {
    r.head_height = (outlet.pressure - inlet.pressure) / (inlet.density * units::kStandardGravity);
    if (eta_unknown && !T2_unknown && in_.outlet_temperature) {
      // Thermodynamic method: eta = dh_s / dh, and dh rises with cp per kelvin.
      const double per_centikelvin = eff.isentropic * outlet.cp * 0.01 / rise;
      r.warnings.push_back(fmt::format(
          "efficiency from the measured temperature rise: 0.01 K of rise changes it by {:.2g} "
          "percentage points",
          100 * per_centikelvin));
    }
  }
  r.warnings.insert(r.warnings.end(), second_solutions_.begin(), second_solutions_.end());
  refuse_non_finite(r);
  return r;
}
}  // namespace

OutletFromEfficiency outlet_from_efficiency(const FluidModel& fluid, MachineKind machine, const State& inlet,
                                            double p2, const Efficiency& efficiency) {
  if (efficiency.basis == EfficiencyBasis::isentropic) {
    return isentropic_outlet(fluid, machine, inlet, p2, efficiency.value);
  }
  const double h2 = polytropic_outlet_enthalpy(fluid, inlet, p2, efficiency.value);
  return {h2, fluid.from_ps(p2, inlet.entropy)};
}

ProcessEfficiencies efficiencies_of(const FluidModel& fluid, MachineKind machine, const State& inlet,
                                    const State& outlet) {
  ProcessEfficiencies e = isentropic_efficiency_of(fluid, machine, inlet, outlet);
  e.polytropic = polytropic_efficiency(fluid, inlet, outlet, e.isentropic);
  return e;
}

Rating rate(const RatingInput& input) { return Solver(input).run(); }

}  // namespace shaftwork::machines

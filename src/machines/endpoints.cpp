#include "endpoints.hpp"

#include <algorithm>
#include <functional>
#include <string>

#include <fmt/format.h>

#include "search.hpp"

namespace shaftwork::machines {

using fluids::State;

namespace {

// ---- Searches over one unknown --------------------------------------------------

// A search's root, with a second solution kept for the user.
double keep_root(const ScanRoot& root, Quantity q, double searched_from, Endpoints& out) {
  if (root.another) out.second = SecondSolution{q, *root.another, searched_from};
  return root.x;
}

// The inlet temperature at p1 for which residual(inlet state) vanishes.
ScanRoot search_inlet_temperature(const Problem& problem, double p1,
                                  const std::function<double(const State&)>& residual) {
  const fluids::Range range = problem.fluid.temperature_range();
  const Quantity q = Quantity::inlet_temperature;
  return scan_for_root([&](double T1) { return residual(problem.inlet_at(p1, T1)); }, range.low, range.high,
                       std::string(quantity_key(q)),
                       fmt::format("no inlet temperature between {} and {} satisfies the other knowns",
                                   problem.show(q, range.low), problem.show(q, range.high)));
}

// The pressure `q` (inlet or outlet) on the side of `other` that the machine demands,
// for which residual(p) vanishes.
ScanRoot search_pressure(const Problem& problem, Quantity q, double other,
                         const std::function<double(double)>& residual) {
  fluids::Range range = problem.fluid.pressure_range();
  range.low = std::max(range.low, 1.0);  // Pa; a log-scale search needs a positive floor
  const bool unknown_is_higher = (q == Quantity::inlet_pressure) != problem.compression;
  const double low = unknown_is_higher ? other * (1 + 2e-7) : range.low;
  const double high = unknown_is_higher ? range.high : other * (1 - 2e-7);
  if (!(low < high)) {
    const Quantity known = q == Quantity::inlet_pressure ? Quantity::outlet_pressure : Quantity::inlet_pressure;
    refuse(fmt::format("the {} {} leaves no room for the {} within the {} model's range ({} to {})", quantity_key(known),
                       problem.show(known, other), quantity_key(q), problem.fluid.model_name(),
                       problem.show(q, range.low), problem.show(q, range.high)));
  }
  return scan_for_root(residual, low, high, std::string(quantity_key(q)),
                       fmt::format("no {} between {} and {} satisfies the other knowns", quantity_key(q),
                                   problem.show(q, low), problem.show(q, high)));
}

double search_start(const Problem& problem, Quantity q, double other) {
  if (q == Quantity::inlet_temperature) return problem.fluid.temperature_range().low;
  const bool unknown_is_higher = (q == Quantity::inlet_pressure) != problem.compression;
  return unknown_is_higher ? other : std::max(problem.fluid.pressure_range().low, 1.0);
}

// ---- Pieces of the patterns ----------------------------------------------------

// h2 the outlet must reach from this inlet at p2: the given outlet, or the balance's.
double outlet_target(const Problem& problem, const State& inlet, double p2) {
  return problem.known(Quantity::outlet_temperature) ? problem.outlet_given(p2).enthalpy
                                                     : problem.outlet_enthalpy_by_balance(inlet);
}

// The inlet at p1 that the balance carries to the outlet enthalpy h2.
State inlet_by_balance_at(const Problem& problem, double p1, double h2) {
  const ScanRoot root = search_inlet_temperature(
      problem, p1, [&](const State& in) { return problem.outlet_enthalpy_by_balance(in) - h2; });
  return problem.inlet_at(p1, root.x);
}

// The outlet at p2 with enthalpy h2, as solved or as given.
State outlet_at(const Problem& problem, double p2, double h2) {
  if (problem.known(Quantity::outlet_temperature)) return problem.outlet_given(p2);
  return problem.fluid.from_ph(p2, h2);
}

// The outlet at p2 that the efficiency's target (the outlet temperature, or the power
// balance without it) gives from e's inlet: the end of the searches by efficiency.
Endpoints with_target_outlet(const Problem& problem, Endpoints e, double p2) {
  e.outlet = outlet_at(problem, p2, outlet_target(problem, e.inlet, p2));
  e.balance_used = !problem.known(Quantity::outlet_temperature);
  return e;
}

}  // namespace

// ---- The patterns --------------------------------------------------------------------

Endpoints from_given_states(const Problem& problem) {
  Endpoints e;
  e.inlet = problem.inlet_at(*problem.in.inlet_pressure);
  const double p2 = problem.outlet_pressure_for(e.inlet);
  problem.check_pressure_direction(e.inlet.pressure, p2);
  e.outlet = problem.outlet_given(p2);
  return e;
}

Endpoints outlet_by_efficiency(const Problem& problem) {
  Endpoints e;
  e.inlet = problem.inlet_at(*problem.in.inlet_pressure);
  const double p2 = problem.outlet_pressure_for(e.inlet);
  problem.check_pressure_direction(e.inlet.pressure, p2);
  State isentropic;
  const double h2 = problem.outlet_enthalpy_by_efficiency(e.inlet, p2, &isentropic);
  e.isentropic = isentropic;
  e.outlet = problem.fluid.from_ph(p2, h2);
  return e;
}

Endpoints outlet_by_balance(const Problem& problem) {
  Endpoints e;
  e.inlet = problem.inlet_at(*problem.in.inlet_pressure);
  const double p2 = problem.outlet_pressure_for(e.inlet);
  problem.check_pressure_direction(e.inlet.pressure, p2);
  e.outlet = problem.fluid.from_ph(p2, problem.outlet_enthalpy_by_balance(e.inlet));
  e.balance_used = true;
  return e;
}

Endpoints inlet_by_balance(const Problem& problem) {
  Endpoints e;
  const double p2 = *problem.in.outlet_pressure;
  e.outlet = problem.outlet_given(p2);
  e.inlet = inlet_by_balance_at(problem, *problem.in.inlet_pressure, e.outlet.enthalpy);
  e.balance_used = true;
  return e;
}

Endpoints outlet_pressure_by_efficiency(const Problem& problem) {
  Endpoints e;
  e.inlet = problem.inlet_at(*problem.in.inlet_pressure);
  const Quantity q = Quantity::outlet_pressure;
  const ScanRoot root = search_pressure(problem, q, e.inlet.pressure, [&](double p) {
    return problem.outlet_enthalpy_by_efficiency(e.inlet, p) - outlet_target(problem, e.inlet, p);
  });
  const double p2 = keep_root(root, q, search_start(problem, q, e.inlet.pressure), e);
  return with_target_outlet(problem, e, p2);
}

Endpoints inlet_pressure_by_efficiency(const Problem& problem) {
  Endpoints e;
  const double p2 = *problem.in.outlet_pressure;
  const Quantity q = Quantity::inlet_pressure;
  const ScanRoot root = search_pressure(problem, q, p2, [&](double p) {
    const State in = problem.inlet_at(p);
    return problem.outlet_enthalpy_by_efficiency(in, p2) - outlet_target(problem, in, p2);
  });
  e.inlet = problem.inlet_at(keep_root(root, q, search_start(problem, q, p2), e));
  return with_target_outlet(problem, e, p2);
}

Endpoints inlet_temperature_by_efficiency(const Problem& problem) {
  Endpoints e;
  const double p1 = *problem.in.inlet_pressure;
  const double p2 = *problem.in.outlet_pressure;
  problem.check_pressure_direction(p1, p2);
  const Quantity q = Quantity::inlet_temperature;
  const ScanRoot root = search_inlet_temperature(problem, p1, [&](const State& in) {
    return problem.outlet_enthalpy_by_efficiency(in, p2) - outlet_target(problem, in, p2);
  });
  e.inlet = problem.inlet_at(p1, keep_root(root, q, search_start(problem, q, p1), e));
  return with_target_outlet(problem, e, p2);
}

Endpoints outlet_pressure_with_inlet_by_balance(const Problem& problem) {
  Endpoints e;
  const double p1 = *problem.in.inlet_pressure;
  const Quantity q = Quantity::outlet_pressure;
  const ScanRoot root = search_pressure(problem, q, p1, [&](double p) {
    const double h2 = problem.outlet_given(p).enthalpy;
    return problem.outlet_enthalpy_by_efficiency(inlet_by_balance_at(problem, p1, h2), p) - h2;
  });
  const double p2 = keep_root(root, q, search_start(problem, q, p1), e);
  e.outlet = problem.outlet_given(p2);
  e.inlet = inlet_by_balance_at(problem, p1, e.outlet.enthalpy);
  e.balance_used = true;
  return e;
}

Endpoints inlet_pressure_with_inlet_by_balance(const Problem& problem) {
  Endpoints e;
  const double p2 = *problem.in.outlet_pressure;
  e.outlet = problem.outlet_given(p2);
  const double h2 = e.outlet.enthalpy;
  const Quantity q = Quantity::inlet_pressure;
  const ScanRoot root = search_pressure(problem, q, p2, [&](double p) {
    return problem.outlet_enthalpy_by_efficiency(inlet_by_balance_at(problem, p, h2), p2) - h2;
  });
  e.inlet = inlet_by_balance_at(problem, keep_root(root, q, search_start(problem, q, p2), e), h2);
  e.balance_used = true;
  return e;
}

}  // namespace shaftwork::machines

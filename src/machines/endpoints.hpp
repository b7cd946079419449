// The inlet and outlet states of a rating, one function per pattern of unknowns among
// the five specific quantities (p1, T1, p2, T2, efficiency). rating.cpp chooses the
// function from the unknowns; none of them sizes the machine. Internal to the machines
// layer.
#pragma once

#include <optional>

#include "problem.hpp"
#include "shaftwork/fluids/state.hpp"

namespace shaftwork::machines {

// A second value of the solved quantity that also satisfies the knowns, found by the
// outermost search: the user is told of it.
struct SecondSolution {
  Quantity quantity;
  double value = 0;
  double searched_from = 0;  // where the search started, for the message
};

struct Endpoints {
  fluids::State inlet;
  fluids::State outlet;
  std::optional<fluids::State> isentropic;  // (p2, s1), when the efficiency gave h2 from it
  bool balance_used = false;                // the energy balance fixed h1 or h2
  std::optional<SecondSolution> second;
};

// Nothing unknown, or only the efficiency: both states as given.
Endpoints from_given_states(const Problem& problem);
// T2: the efficiency carries the inlet to p2.
Endpoints outlet_by_efficiency(const Problem& problem);
// T2 and the efficiency: the balance gives h2 (flow and power given).
Endpoints outlet_by_balance(const Problem& problem);
// T1 and the efficiency: the balance gives the inlet from the outlet.
Endpoints inlet_by_balance(const Problem& problem);
// p2, or p2 and T2: the p2 at which the efficiency reaches the given outlet, or the
// outlet the balance gives.
Endpoints outlet_pressure_by_efficiency(const Problem& problem);
// p1, or p1 and T2: likewise for the inlet pressure.
Endpoints inlet_pressure_by_efficiency(const Problem& problem);
// T1, or T1 and T2: likewise for the inlet temperature.
Endpoints inlet_temperature_by_efficiency(const Problem& problem);
// T1 and p2: for each trial p2 the balance gives the inlet; the efficiency fixes p2.
Endpoints outlet_pressure_with_inlet_by_balance(const Problem& problem);
// p1 and T1: for each trial p1 the balance gives the inlet; the efficiency fixes p1.
Endpoints inlet_pressure_with_inlet_by_balance(const Problem& problem);

}  // namespace shaftwork::machines

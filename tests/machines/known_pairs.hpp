// Shared by the random and sweep tests of machines::rate: a point's seven quantities, the
// rating input that keeps all but a pair of them, and the pairs no rating can solve.
#pragma once

#include "shaftwork/machines/rating.hpp"

namespace shaftwork::test {

// A rated point's values of the seven quantities (the outlet by enthalpy when its
// temperature does not fix it: a wet outlet).
struct SevenValues {
  double p1 = 0, T1 = 0, p2 = 0, T2 = 0, h2 = 0, m = 0, P = 0, eta = 0;
  bool outlet_by_enthalpy = false;
  machines::EfficiencyBasis basis = machines::EfficiencyBasis::isentropic;
};

// Both pressures, or one pressure with the efficiency, sought together: the other knowns
// leave a family of solutions (the solver refuses these pairs).
inline bool pressure_pair(machines::Quantity a, machines::Quantity b) {
  using machines::Quantity;
  const auto is = [&](Quantity q) { return a == q || b == q; };
  return (is(Quantity::inlet_pressure) && is(Quantity::outlet_pressure)) ||
         (is(Quantity::inlet_pressure) && is(Quantity::efficiency)) ||
         (is(Quantity::outlet_pressure) && is(Quantity::efficiency));
}

// `base` (machine and fluid) with every quantity of `v` but a and b.
inline machines::RatingInput without_pair(machines::RatingInput base, const SevenValues& v, machines::Quantity a,
                                          machines::Quantity b) {
  using machines::Quantity;
  const auto keep = [&](Quantity q) { return a != q && b != q; };
  if (keep(Quantity::inlet_pressure)) base.inlet_pressure = v.p1;
  if (keep(Quantity::inlet_temperature)) base.inlet_temperature = v.T1;
  if (keep(Quantity::outlet_pressure)) base.outlet_pressure = v.p2;
  if (keep(Quantity::outlet_temperature)) {
    if (v.outlet_by_enthalpy) {
      base.outlet_enthalpy = v.h2;
    } else {
      base.outlet_temperature = v.T2;
    }
  }
  if (keep(Quantity::flow)) base.mass_flow = v.m;
  if (keep(Quantity::power)) base.power = v.P;
  if (keep(Quantity::efficiency)) machines::set_efficiency(base, v.basis, v.eta);
  return base;
}

}  // namespace shaftwork::test

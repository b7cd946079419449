// shaftwork/machines/polytropic.hpp — polytropic efficiency by its path-integral definition.
//
// Along the polytropic path (ASME PTC 10-1997 sec. 5; Huntington, ASME J. Eng. Gas
// Turbines Power 107 (1985) 872) each small step follows
//   compression  dh = v dp / eta_p,        expansion  dh = eta_p v dp.
// Ideal gas (p v = R T, h = h(T)): T ds = dh - v dp gives, exactly,
//   compression  s2 - s1 = R (1/eta_p - 1) ln(p2/p1)
//   expansion    s2 - s1 = R (1 - eta_p) ln(p1/p2)
// so eta_p follows from s°(T) with no constant-k approximation.
// Incompressible liquid: T stays fixed on the isentrope and eta_p = eta_s.
// Other models: the path is integrated with classical RK4 in ln p, the step count
// doubled until h2 changes by less than 1e-10 relative to the enthalpy rise.
#pragma once

#include "shaftwork/fluids/fluid_model.hpp"

namespace shaftwork::machines {

// Outlet enthalpy [J/kg] at p2 along the polytropic path from `inlet` with
// efficiency eta_p. compression is p2 > p1.
double polytropic_outlet_enthalpy(const fluids::FluidModel& fluid, const fluids::State& inlet,
                                  double p2, double eta_p);

// Polytropic efficiency of the process inlet -> outlet (outlet.pressure != inlet.pressure).
// `isentropic_efficiency` of the same process, when known, narrows the search of the
// stepwise method to [eta_s / 2, 1]. Throws bad_input when no efficiency reaches the outlet.
double polytropic_efficiency(const fluids::FluidModel& fluid, const fluids::State& inlet,
                             const fluids::State& outlet, double isentropic_efficiency = 0);

}  // namespace shaftwork::machines

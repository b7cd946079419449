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
// Any other model (IAPWS-IF97, equations of state): dh/d(ln p) = f p v(p, h), f = 1/eta_p or
// eta_p, is integrated by Chebyshev collocation in segments cut where the fluid changes region
// (src/machines/polytropic_path.hpp describes the method). The outlet enthalpy comes to about
// 1e-10 of the enthalpy change and eta_p to 1e-10 relative; tests/machines/test_polytropic_path.cpp
// holds both to 1e-9 against an independent Runge-Kutta integration, over every part of IF97.
// At eta_p = 1 the path is the isentrope, h2 = h(p2, s1), for every model (IF97's wet states
// meet T ds = dh - v dp only to about 3e-5, so the integral of v dp strays from the isentrope
// by that much there).
#pragma once

#include "shaftwork/fluids/fluid_model.hpp"

namespace shaftwork::machines {

// Outlet enthalpy [J/kg] at p2 along the polytropic path from `inlet` (a state of `fluid`)
// with efficiency eta_p in (0, 1]. compression is p2 > p1. Throws bad_input for eta_p outside
// (0, 1], and the model's out_of_range when the path leaves the model's range.
double polytropic_outlet_enthalpy(const fluids::FluidModel& fluid, const fluids::State& inlet,
                                  double p2, double eta_p);

// Polytropic efficiency of the process inlet -> outlet (outlet.pressure != inlet.pressure),
// at most 1. An outlet on the isentrope within the rounding of the entropies is 1 (and so is
// an efficiency up to 1e-4 above 1, IF97's inconsistency between dh - v dp and T ds in its wet
// region). Throws bad_input when the outlet lies below the isentrope, when the pressures are
// equal, and when they differ so little that the entropy change they allow is lost in
// rounding. `isentropic_efficiency` is no longer used (the solve needs no bracket).
double polytropic_efficiency(const fluids::FluidModel& fluid, const fluids::State& inlet,
                             const fluids::State& outlet, double isentropic_efficiency = 0);

}  // namespace shaftwork::machines

// The polytropic path of a real fluid (internal to the machines layer).
//
// The path is the definition itself (ASME PTC 10-1997 sec. 5; Huntington, ASME J. Eng. Gas
// Turbines Power 107 (1985) 872), with x = ln p:
//   dh/dx = f H(p, h),   H = p v,   f = 1/eta_p in compression, eta_p in expansion.     (1)
// (The form T ds = (f - 1) v dp is the same only for a model that meets T ds = dh - v dp
// exactly; IF97's wet states and region boundaries do so only to about 3e-5.)
//
// Method. The pressure range is cut into segments; on each, h(x) is the polynomial of degree
// 12 through Chebyshev-Lobatto points, and (1) is met at every point (collocation, with the
// integration weights of numerics::ChebyshevLobatto). The nodal enthalpies of all segments,
// and f when the outlet is given instead, are solved together by Newton's method, with
// (dH/dh)_p = H alpha_v / cp in one phase and p v_fg / h_fg in the wet region, where H is
// linear in h at fixed p. Segments are cut
//   - where the fluid changes region (State::region): at the saturation line (where H is
//     continuous but its slope is not) as the root of h - h_sat(p) on the segment's
//     polynomial; at other boundaries (IF97's regions 1/3, 2/3 and 2/5, where H jumps within
//     IF97's consistency limits) by bisection on the region of the state at (p, h). The ends
//     of a segment at such a crossing are evaluated a hair inside it, so each side sees its
//     own region's equation; the crossings follow the path as it converges;
//   - where the last Chebyshev coefficients of H show a truncation error above the tolerance.
// Accuracy: h at the outlet to 1e-11 of f max(H) |ln(p2/p1)| (about 1e-11 of the enthalpy
// change by the error estimate; 1e-10 measured, see tests/machines/test_polytropic_path.cpp).
// States come from (p, T), T predicted from a node's previous state or its neighbour's, else
// from (p, h); a wet node needs only the saturated states at its pressure.
#pragma once

#include "shaftwork/fluids/fluid_model.hpp"

namespace shaftwork::machines::detail {

struct PathResult {
  double outlet_enthalpy = 0;  // J/kg
  double factor = 0;           // f: 1/eta_p in compression, eta_p in expansion
  int segments = 0;            // how the path was cut, for tests and benchmarks
  int sweeps = 0;
  int evaluations = 0;         // nodes and crossing tests that asked the model for a state
};

// The path from `inlet` (a state of `fluid`) to pressure p2 with the given factor f > 0.
PathResult integrate_path(const fluids::FluidModel& fluid, const fluids::State& inlet, double p2, double factor);

// The factor f of the path from `inlet` that ends at `outlet` (outlet.pressure != inlet.pressure).
PathResult solve_path_factor(const fluids::FluidModel& fluid, const fluids::State& inlet,
                             const fluids::State& outlet);

}  // namespace shaftwork::machines::detail

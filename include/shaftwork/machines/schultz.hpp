// shaftwork/machines/schultz.hpp — polytropic head and efficiency by the Schultz method.
//
// J. M. Schultz, "The Polytropic Analysis of Centrifugal Compressors", J. Eng. Power 84
// (1962) 69-82, as ASME PTC 10-1997 (Performance Test Code on Compressors and Exhausters),
// section 5, uses it for real gases:
//   compressibility functions  X = (T/v)(dv/dT)_p - 1,   Y = -(p/v)(dv/dp)_T
//   isentropic volume exponent n_s = ln(p2/p1) / ln(v1/v2s)
//   polytropic volume exponent n   = ln(p2/p1) / ln(v1/v2)
//   Schultz factor             f   = (h2s - h1) / [ n_s/(n_s - 1) (p2 v2s - p1 v1) ]
//   polytropic head            W_p = f n/(n - 1) (p2 v2 - p1 v1)
//   polytropic efficiency      eta_p = W_p / (h2 - h1)   (compression)
//                                    = (h2 - h1) / W_p   (expansion)
// with v = 1/density and 2s the isentropic outlet at p2. (Equation numbers in the code
// were not checked against the printed standard; the relations are Schultz's.) X and Y are
// reported at both ends; f corrects the volume-exponent head so that it equals the
// isentropic enthalpy rise on the isentrope. For an ideal gas X = 0, Y = 1, n_s = k when cp
// is constant, f = 1, and eta_p equals the path-integral value of polytropic.hpp exactly.
//
// X and Y come from the model by central differences of its volume in T (step 1e-5 T)
// and p (step 1e-5 p); a model with exact derivatives (fluids::CubicGas::
// compressibility_functions) agrees to about 1e-8.
#pragma once

#include "shaftwork/fluids/fluid_model.hpp"

namespace shaftwork::machines {

struct SchultzResult {
  double x_inlet = 0;            // compressibility function X at the inlet
  double y_inlet = 1;            // Y at the inlet
  double x_outlet = 0;           // at the outlet
  double y_outlet = 1;
  double isentropic_exponent = 0;  // n_s
  double polytropic_exponent = 0;  // n
  double schultz_factor = 1;       // f
  double polytropic_head = 0;      // |W_p|, J/kg
  double polytropic_efficiency = 0;
};

// The Schultz method for the process inlet -> outlet, with `outlet_isentropic` the state at
// the outlet pressure and the inlet entropy. Throws bad_input when the pressures are equal,
// a volume ratio is not above 0, or the head or the enthalpy change is zero.
SchultzResult schultz_method(const fluids::FluidModel& fluid, const fluids::State& inlet,
                             const fluids::State& outlet, const fluids::State& outlet_isentropic);

}  // namespace shaftwork::machines

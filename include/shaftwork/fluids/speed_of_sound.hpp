// shaftwork/fluids/speed_of_sound.hpp — the speed of sound of any property model.
//
// Thermodynamic definition (e.g. Cengel & Boles, Thermodynamics, sec. 17-2; IAPWS-IF97
// Table 3, w):  a^2 = (dp/drho)_s.
// No model carries a itself, so it is taken from the model's own states by a central
// difference along the isentrope through `state`:
//   a^2 ~ (p+ - p-) / (rho(p+, s) - rho(p-, s)),   p+- = p (1 +- delta),  delta = 1e-4.
// Accuracy: the truncation error is (delta^2 / 6) p^2 |rho'''/rho'| relative, about 1e-9
// for an ideal gas (rho ~ p^(1/k)); the models' inverse solves (T to 1e-10 relative) add
// rounding of order 1e-10 / delta. Measured: within 1e-9 of sqrt(k R T) for ideal gases
// (tests/fluids/test_speed_of_sound.cpp holds it to 1e-8) and within 3e-10 of IAPWS-IF97's
// own w for steam (python3-iapws; tests/python/test_guarantee_steam.py holds it to 1e-7).
#pragma once

#include "shaftwork/fluids/fluid_model.hpp"

namespace shaftwork::fluids {

// Speed of sound [m/s] at `state` (a single-phase state of `fluid`). Throws
// not_available for a wet state, for an incompressible model (no finite speed of sound)
// and where the difference would cross a phase boundary; a model's own errors at p+-
// (out of range) propagate.
double speed_of_sound(const FluidModel& fluid, const State& state);

}  // namespace shaftwork::fluids

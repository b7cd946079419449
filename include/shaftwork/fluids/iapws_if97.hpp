// shaftwork/fluids/iapws_if97.hpp — water and steam on IAPWS-IF97.
//
// The basic equations of IAPWS R7-97(2012): Gibbs functions g(p,T) for regions 1 (liquid),
// 2 (vapour) and 5 (high temperature), the Helmholtz function f(rho,T) for region 3 (around
// the critical point) and the saturation line ps(T), Ts(p) (region 4). From (p,h) and (p,s)
// the backward equations of IF97 (regions 1, 2a, 2b, 2c) and of SR3-03(2014) (region 3), and
// from (p,T) in region 3 SR5-05(2016)'s v(p,T), give starting values only: Newton's method
// on the basic equations refines them until its step is below 1e-10 of the temperature
// (and of the density in region 3), so states agree with the basic equations, not with
// the backward equations' own tolerances (up to 25 mK in T).
//
// Range (IF97 Sec. 2): 273.15 K <= T <= 1073.15 K at p <= 100 MPa, and
// 1073.15 K < T <= 2273.15 K at p <= 50 MPa; p > 0.
//
// Reference state (IF97's): u = 0 and s = 0 for the saturated liquid at the triple point
// (273.16 K, 611.657 Pa). Molar mass 0.018015268 kg/mol and R = 461.526 J/(kg K) are
// IF97's; compressibility is Z = p/(rho R T) with that R.
//
// Wet states (two-phase, p < 22.064 MPa) come from from_ph and from_ps when (p,h) or (p,s)
// falls between the saturated liquid and vapour, and from from_p_quality. They carry the
// quality x and the mixture's h, s and density (v = vf + x (vg - vf)); cp and cv are not
// defined in the two-phase region and are set to 0 (State::is_wet() tells callers).
// State::region is IF97's region number (1, 2, 3, 5) for a single phase; wet states are
// region 4 up to psat(623.15 K) and 43 above, where the saturated liquid and vapour come from
// region 3 instead of regions 1 and 2.
#pragma once

#include <optional>
#include <string>

#include "shaftwork/fluids/fluid_model.hpp"

namespace shaftwork::fluids {

class IapwsIf97 final : public FluidModel {
 public:
  // Throws out_of_range outside the range above, naming it, and bad_input at exactly the
  // saturation temperature: |T - Ts(p)| <= 1e-9 T with p < 22.064 MPa (about 0.4 uK at
  // 400 K; the rounding of a unit conversion stays well inside it), because (p, Tsat) does
  // not fix a wet state.
  State from_pt(double p, double T) const override;
  // Single-phase or wet. Throws out_of_range when (p,h) or (p,s) lies outside the range.
  State from_ph(double p, double h) const override;
  State from_ps(double p, double s) const override;

  // Saturation temperature Ts(p) [K] (IF97 Eq. 31) for 611.212677 Pa <= p < 22.064 MPa;
  // empty outside (above the critical pressure there is no saturation).
  std::optional<double> saturation_temperature(double p) const override;
  // Wet state at p [Pa] (611.212677 Pa to 22.064 MPa, exclusive at the top) and quality
  // x in [0, 1]; x = 0 and x = 1 give the saturated liquid and vapour, still marked wet.
  State from_p_quality(double p, double quality) const override;
  // Both ends of the saturation line at p from one evaluation of it.
  Saturated saturated(double p) const override;

  // Saturation pressure ps(T) [Pa] (IF97 Eq. 30), 273.15 K <= T <= 647.096 K.
  static double saturation_pressure(double T);

  std::string model_name() const override { return "iapws-if97"; }
  FluidKind fluid_kind() const override { return FluidKind::water_steam; }
  std::string description() const override;
  Range temperature_range() const override { return {273.15, 2273.15}; }
  // 0 stands for "above 0": IF97's region 2 reaches down to the ideal-gas limit. Above
  // 1073.15 K the limit is 50 MPa.
  Range pressure_range() const override { return {0.0, 100e6}; }
};

}  // namespace shaftwork::fluids

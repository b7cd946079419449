// shaftwork/fluids/incompressible.hpp — incompressible liquid (constant density and cp).
//
//   h = c (T - T0) + (p - p0)/rho,   s = c ln(T/T0),   cp = cv = c
// with T0 = 298.15 K, p0 = 100 kPa (Moran & Shapiro, Fundamentals of Engineering
// Thermodynamics, 5th ed., eqs. 3.20 and 6.13). An isentropic process keeps T, so
// the isentropic pump work is v (p2 - p1) exactly.
#pragma once

#include "shaftwork/fluids/fluid_model.hpp"

namespace shaftwork::fluids {

class IncompressibleLiquid final : public FluidModel {
 public:
  // density [kg/m3] and specific heat [J/(kg K)], both > 0, else bad_input.
  IncompressibleLiquid(double density, double specific_heat);

  State from_pt(double p, double T) const override;
  State from_ph(double p, double h) const override;
  State from_ps(double p, double s) const override;
  std::string model_name() const override { return "incompressible"; }
  FluidKind fluid_kind() const override { return FluidKind::liquid; }
  std::string description() const override;
  Range temperature_range() const override { return {1.0, 10000.0}; }
  Range pressure_range() const override { return {1e-3, 1e10}; }
  bool is_incompressible() const override { return true; }

 private:
  double density_;
  double c_;
};

}  // namespace shaftwork::fluids

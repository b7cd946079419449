// shaftwork/fluids/constant_cp.hpp — calorically perfect ideal gas (cp constant).
//
//   h = cp (T - T0),   s = cp ln(T/T0) - R ln(p/p0),   rho = p / (R T),   cv = cp - R
// with the reference state T0 = 298.15 K, p0 = 100 kPa where h = 0 and s = 0.
// (Any thermodynamics text, e.g. Moran & Shapiro, Fundamentals of Engineering
// Thermodynamics, 5th ed., sec. 6.5.)
#pragma once

#include <optional>

#include "shaftwork/fluids/fluid_model.hpp"

namespace shaftwork::fluids {

// The inputs a user may give; exactly two of them must be set.
struct ConstantCpInputs {
  std::optional<double> cp;          // J/(kg K)
  std::optional<double> cv;          // J/(kg K)
  std::optional<double> k;           // cp/cv
  std::optional<double> R;           // specific gas constant, J/(kg K)
  std::optional<double> molar_mass;  // kg/mol
};

class ConstantCpGas final : public FluidModel {
 public:
  // Throws bad_input unless exactly two inputs are given, they are not R with
  // molar_mass (one fact, twice), and they give cp > cv > 0 (so k > 1).
  explicit ConstantCpGas(const ConstantCpInputs& inputs);

  State from_pt(double p, double T) const override;
  State from_ph(double p, double h) const override;
  State from_ps(double p, double s) const override;
  std::string model_name() const override { return "constant-cp"; }
  FluidKind fluid_kind() const override { return FluidKind::ideal_gas; }
  std::string description() const override;
  Range temperature_range() const override { return {1.0, 10000.0}; }
  Range pressure_range() const override { return {1e-3, 1e9}; }
  std::optional<double> ideal_gas_constant() const override { return R_; }

  double cp() const { return cp_; }
  double k() const { return cp_ / (cp_ - R_); }

 private:
  double cp_ = 0;  // J/(kg K)
  double R_ = 0;   // J/(kg K)
};

}  // namespace shaftwork::fluids

// shaftwork/fluids/humid_air_gas.hpp — moist air as an ideal-gas mixture of dry air and water vapour.
//
// The water content is fixed where the case fixes it (a relative humidity at the inlet
// state, or a humidity ratio; humid_air.hpp computes the mole fraction from IAPWS-IF97's
// saturation pressure), and the gas is then a NASA-polynomial mixture of the dry air's
// species and H2O: properties, ranges and reference states are those of
// NasaPolynomialGas. Water stays vapour at every state: dew_point() tells where that
// stops being true, so that a rating can warn.
#pragma once

#include <memory>
#include <string>

#include "shaftwork/fluids/humid_air.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

namespace shaftwork::fluids {

class HumidAirGas final : public FluidModel {
 public:
  // `air`: the moist air at the state that fixed its water content (its humidity ratio
  // and water mole fraction are used); `humid`: the dry gas it was computed for.
  HumidAirGas(const HumidAir& humid, const MoistAirState& air);
  // At a humidity ratio W [kg water / kg dry gas] alone, with no state to relate it to (a
  // batch template, whose rows each bring their inlet).
  HumidAirGas(const HumidAir& humid, double humidity_ratio);

  State from_pt(double p, double T) const override { return gas_->from_pt(p, T); }
  State from_ph(double p, double h) const override { return gas_->from_ph(p, h); }
  State from_ps(double p, double s) const override { return gas_->from_ps(p, s); }
  std::string model_name() const override { return "humid-air"; }
  FluidKind fluid_kind() const override { return FluidKind::ideal_gas; }
  // "humid air, humidity ratio 0.01234 kg/kg (60 % relative humidity at 308.15 K, 100 kPa)"
  std::string description() const override { return description_; }
  Range temperature_range() const override { return gas_->temperature_range(); }
  Range pressure_range() const override { return gas_->pressure_range(); }
  std::optional<double> ideal_gas_constant() const override { return gas_->ideal_gas_constant(); }
  std::optional<double> humidity_ratio() const override { return humidity_ratio_; }
  std::optional<double> estimated_compressibility(double p, double T) const override {
    return gas_->estimated_compressibility(p, T);
  }
  bool estimated_compressibility_within(double p, double T, double tolerance) const override {
    return gas_->estimated_compressibility_within(p, T, tolerance);
  }
  // The dew point of the water vapour at total pressure p: water_dew_point(y_w p).
  std::optional<double> dew_point(double p) const override;

  const NasaPolynomialGas& gas() const { return *gas_; }

 private:
  std::shared_ptr<const NasaPolynomialGas> gas_;
  double humidity_ratio_ = 0;
  double water_mole_fraction_ = 0;
  std::string description_;
};

}  // namespace shaftwork::fluids

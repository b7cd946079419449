#include "shaftwork/fluids/humid_air_gas.hpp"

#include <fmt/format.h>

namespace shaftwork::fluids {

HumidAirGas::HumidAirGas(const HumidAir& humid, const MoistAirState& air)
    : gas_(std::make_shared<NasaPolynomialGas>(humid.components(air.water_mole_fraction), CompositionBasis::mole)),
      humidity_ratio_(air.humidity_ratio),
      water_mole_fraction_(air.water_mole_fraction),
      description_(fmt::format("humid air, humidity ratio {:.5f} kg/kg ({:.3g} % relative humidity at {:.2f} K, "
                               "{:.6g} kPa)",
                               air.humidity_ratio, 100 * air.relative_humidity, air.temperature,
                               air.pressure / 1000)) {}

HumidAirGas::HumidAirGas(const HumidAir& humid, double humidity_ratio)
    : humidity_ratio_(humidity_ratio),
      water_mole_fraction_(humidity_ratio / (humid.water_molar_mass() / humid.dry_gas_molar_mass() + humidity_ratio)),
      description_(fmt::format("humid air, humidity ratio {:.5f} kg/kg", humidity_ratio)) {
  gas_ = std::make_shared<NasaPolynomialGas>(humid.components(water_mole_fraction_), CompositionBasis::mole);
}

std::optional<double> HumidAirGas::dew_point(double p) const {
  if (!(water_mole_fraction_ > 0)) return std::nullopt;
  return water_dew_point(water_mole_fraction_ * p);
}

}  // namespace shaftwork::fluids

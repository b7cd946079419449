// shaftwork/fluids/humid_air.hpp — moist air: a dry gas and water vapour, from a relative
// humidity or a humidity ratio at a state (p, T), as an ideal mixture of ideal gases.
//
// Water vapour saturation pressure p_ws(T), over a plane surface:
//   of liquid water, 273.16 K <= T <= 647.096 K: IAPWS-IF97's saturation line,
//     IAPWS R7-97(2012) eq. 30 (fluids::IapwsIf97::saturation_pressure);
//   of ice, 50 K <= T < 273.16 K: the sublimation pressure of IAPWS R14-08(2011) eq. 6,
//     ln(p_subl / p_t) = (1/theta) sum_i a_i theta^b_i,  theta = T / T_t,
//     T_t = 273.16 K, p_t = 611.657 Pa, a = (-21.2144006, 27.3203819, -6.1059813),
//     b = (0.00333333333, 1.20666667, 1.70333333).
//   The two meet at the triple point (IF97 gives ps(273.16 K) = 611.657 Pa), so p_ws is
//   continuous. Below 0.01 degC a relative humidity is therefore taken over ice, as the
//   ASHRAE Handbook's psychrometric tables do (meteorological practice, WMO, takes it over
//   supercooled water: at -10 degC the two differ by 10 % in p_w, 0.01 % in the gas
//   constant of the air).
//
// Moist air (Dalton's law and ideal gases; e.g. ASHRAE Handbook—Fundamentals (2017),
// ch. 1, "Perfect gas relationships for dry and moist air"):
//   p_w = phi p_ws(T)                      water partial pressure, relative humidity phi
//   y_w = p_w / p                          water mole fraction
//   W   = (M_w / M_da) p_w / (p - p_w)     humidity ratio, kg water per kg dry gas
//   p_w = p W / (M_w / M_da + W)           its inverse
//   y_i = (1 - y_w) x_i, y_H2O = y_w       the mixture's mole fractions (x_i: the dry gas)
//   T_d : p_ws(T_d) = p_w                  dew point (a frost point below 273.16 K)
// M_w and M_da are the molar masses of the NASA species (H2O: 18.01528 g/mol).
//
// No enhancement factor: real moist air near 1 atm holds about 0.4-0.6 % more water at
// saturation than p_ws / p (the factor f of Hyland & Wexler, 1983, which the ASHRAE tables
// include), more at higher pressures. Field-test practice (relative humidity from a
// hygrometer, p_w = phi p_ws) leaves it out, and so does shaftwork: a humidity ratio at
// saturation comes out that much below the handbook's table (tests/fluids/test_humid_air.cpp).
#pragma once

#include <optional>
#include <vector>

#include "shaftwork/fluids/nasa_polynomial.hpp"

namespace shaftwork::fluids {

// p_ws(T) [Pa] over liquid water or ice, as above; T in 50 K to 647.096 K, else throws
// out_of_range.
double water_saturation_pressure(double T);

// The temperature [K] at which p_w [Pa] is the saturation pressure: the dew point (a frost
// point below the triple-point pressure 611.657 Pa). Empty for p_w = 0 (no water) and at or
// above the critical pressure 22.064 MPa (no saturation). Throws bad_input for a negative
// or non-finite p_w, out_of_range below p_ws(50 K) (about 2e-40 Pa).
std::optional<double> water_dew_point(double p_w);

// Moist air at one state.
struct MoistAirState {
  double pressure = 0;             // p, Pa
  double temperature = 0;          // T, K
  double saturation_pressure = 0;  // p_ws(T), Pa
  double vapour_pressure = 0;      // p_w, Pa
  double water_mole_fraction = 0;  // y_w
  double humidity_ratio = 0;       // W, kg water per kg dry gas
  double relative_humidity = 0;    // phi = p_w / p_ws(T), 0 to 1
  std::optional<double> dew_point;  // K (frost point below 273.16 K); empty for dry gas
};

// A dry gas (dry air: the NASA "Air" record's N2, O2, Ar, CO2 in data/fluids.txt) to which
// water vapour is added.
class HumidAir {
 public:
  // `dry_gas`: mole fractions summing to 1 (within 1e-6; rescaled to 1), without H2O.
  // `library` must hold H2O and outlive this object, as must the species of `dry_gas`.
  // Throws bad_input for an empty gas, a negative fraction, a sum away from 1, H2O among
  // the dry species, or a library without H2O.
  explicit HumidAir(const std::vector<Component>& dry_gas,
                    const SpeciesLibrary& library = SpeciesLibrary::built_in());

  // The state at p [Pa], T [K] (50 K to 647.096 K) and relative humidity phi in [0, 1].
  // Throws bad_input for phi outside [0, 1] and when p_w = phi p_ws(T) is not below p (the
  // air would be all steam: above the boiling point at p), out_of_range for T.
  MoistAirState at_relative_humidity(double p, double T, double relative_humidity) const;
  // The state at p, T and a humidity ratio W >= 0 (kg water per kg dry gas). Throws
  // bad_input for W negative or not finite and for supersaturated air (p_w above p_ws(T)
  // by more than 1e-9 relative), out_of_range for T.
  MoistAirState at_humidity_ratio(double p, double T, double humidity_ratio) const;

  // The humid mixture's components on a mole basis (sum 1) for a water mole fraction
  // y_w in [0, 1): the dry gas scaled by 1 - y_w, then H2O. For NasaPolynomialGas with
  // CompositionBasis::mole (a zero H2O fraction is dropped there).
  std::vector<Component> components(double water_mole_fraction) const;

  double dry_gas_molar_mass() const { return dry_molar_mass_; }  // kg/mol
  double water_molar_mass() const;                               // kg/mol

 private:
  MoistAirState state(double p, double T, double p_ws, double p_w) const;

  std::vector<Component> dry_;
  const NasaSpecies* water_ = nullptr;
  double dry_molar_mass_ = 0;
};

}  // namespace shaftwork::fluids

// Backward equations of IF97 (regions 1 and 2) and of SR3-03 (region 3). They give
// starting values only: fluids::IapwsIf97 refines each against the basic equations.
// Equation numbers and tables are cited in shaftwork/fluids/iapws_if97_equations.hpp and
// at each coefficient array in iapws_if97_coefficients.hpp.
#include <cmath>

#include "iapws_if97_coefficients.hpp"
#include "iapws_if97_powers.hpp"
#include "shaftwork/fluids/iapws_if97_equations.hpp"

namespace shaftwork::fluids::if97 {
namespace {

namespace coef = coefficients;
using detail::powers_i;
using detail::powers_j;
using detail::sum_terms;

// sum n_i x^I_i y^J_i over one table.
template <const auto& Table>
double sum_over(double x, double y) {
  return sum_terms(Table, powers_i<Table>(x), powers_j<Table>(y));
}

constexpr double kP2ab = 4e6;       // Pa, the 2a/2b split (IF97 Sec. 6.3.1)
constexpr double kS2bc = 5.85e3;    // J/(kg K), the 2b/2c split for T(p,s) (IF97 Sec. 6.3.2)

}  // namespace

// IF97 Eq. 11: theta = sum n_i pi^I_i (eta + 1)^J_i, pi = p/1 MPa, eta = h/2500 kJ/kg.
double region1_T_ph(double p, double h) {
  return sum_over<coef::kRegion1_T_ph>(p / 1e6, h / 2500e3 + 1.0);
}

// IF97 Eq. 13: theta = sum n_i pi^I_i (sigma + 2)^J_i, pi = p/1 MPa, sigma = s/1 kJ/(kg K).
double region1_T_ps(double p, double s) {
  return sum_over<coef::kRegion1_T_ps>(p / 1e6, s / 1e3 + 2.0);
}

Subregion2 region2_subregion_ph(double p, double h) {
  if (p <= kP2ab) return Subregion2::a;
  return h >= b2bc_enthalpy(p) ? Subregion2::b : Subregion2::c;
}

Subregion2 region2_subregion_ps(double p, double s) {
  if (p <= kP2ab) return Subregion2::a;
  return s >= kS2bc ? Subregion2::b : Subregion2::c;
}

// IF97 Eqs. 22-24, eta = h/2000 kJ/kg, pi = p/1 MPa:
//   2a: theta = sum n_i pi^I_i (eta - 2.1)^J_i
//   2b: theta = sum n_i (pi - 2)^I_i (eta - 2.6)^J_i
//   2c: theta = sum n_i (pi + 25)^I_i (eta - 1.8)^J_i
double region2_T_ph(double p, double h) {
  const double pi = p / 1e6;
  const double eta = h / 2000e3;
  switch (region2_subregion_ph(p, h)) {
    case Subregion2::a:
      return sum_over<coef::kRegion2a_T_ph>(pi, eta - 2.1);
    case Subregion2::b:
      return sum_over<coef::kRegion2b_T_ph>(pi - 2.0, eta - 2.6);
    case Subregion2::c:
      break;
  }
  return sum_over<coef::kRegion2c_T_ph>(pi + 25.0, eta - 1.8);
}

// IF97 Eqs. 25-27, pi = p/1 MPa:
//   2a: theta = sum n_i pi^I_i (sigma - 2)^J_i,  sigma = s/2 kJ/(kg K), I_i multiples of 1/4
//   2b: theta = sum n_i pi^I_i (10 - sigma)^J_i, sigma = s/0.7853 kJ/(kg K)
//   2c: theta = sum n_i pi^I_i (2 - sigma)^J_i,  sigma = s/2.9251 kJ/(kg K)
double region2_T_ps(double p, double s) {
  const double pi = p / 1e6;
  switch (region2_subregion_ps(p, s)) {
    case Subregion2::a:
      // The table holds 4*I: powers of pi^(1/4) give pi^I.
      return sum_over<coef::kRegion2a_T_ps>(std::sqrt(std::sqrt(pi)), s / 2e3 - 2.0);
    case Subregion2::b:
      return sum_over<coef::kRegion2b_T_ps>(pi, 10.0 - s / 0.7853e3);
    case Subregion2::c:
      break;
  }
  return sum_over<coef::kRegion2c_T_ps>(pi, 2.0 - s / 2.9251e3);
}

// SR3-03 Eqs. 2 and 3, pi = p/100 MPa:
//   3a: T/760 K = sum n_i (pi + 0.240)^I_i (eta - 0.615)^J_i, eta = h/2300 kJ/kg
//   3b: T/860 K = sum n_i (pi + 0.298)^I_i (eta - 0.720)^J_i, eta = h/2800 kJ/kg
double region3_T_ph(double p, double h) {
  const double pi = p / 100e6;
  if (h <= b3ab_enthalpy(p)) {
    return 760.0 * sum_over<coef::kRegion3a_T_ph>(pi + 0.240, h / 2300e3 - 0.615);
  }
  return 860.0 * sum_over<coef::kRegion3b_T_ph>(pi + 0.298, h / 2800e3 - 0.720);
}

// SR3-03 Eqs. 4 and 5, pi = p/100 MPa:
//   3a: v/(0.0028 m3/kg) = sum n_i (pi + 0.128)^I_i (eta - 0.727)^J_i,  eta = h/2100 kJ/kg
//   3b: v/(0.0088 m3/kg) = sum n_i (pi + 0.0661)^I_i (eta - 0.720)^J_i, eta = h/2800 kJ/kg
double region3_v_ph(double p, double h) {
  const double pi = p / 100e6;
  if (h <= b3ab_enthalpy(p)) {
    return 0.0028 * sum_over<coef::kRegion3a_v_ph>(pi + 0.128, h / 2100e3 - 0.727);
  }
  return 0.0088 * sum_over<coef::kRegion3b_v_ph>(pi + 0.0661, h / 2800e3 - 0.720);
}

// SR3-03 Eqs. 6 and 7, pi = p/100 MPa:
//   3a: T/760 K = sum n_i (pi + 0.240)^I_i (sigma - 0.703)^J_i, sigma = s/4.4 kJ/(kg K)
//   3b: T/860 K = sum n_i (pi + 0.760)^I_i (sigma - 0.818)^J_i, sigma = s/5.3 kJ/(kg K)
double region3_T_ps(double p, double s) {
  const double pi = p / 100e6;
  if (s <= kScritical) {
    return 760.0 * sum_over<coef::kRegion3a_T_ps>(pi + 0.240, s / 4.4e3 - 0.703);
  }
  return 860.0 * sum_over<coef::kRegion3b_T_ps>(pi + 0.760, s / 5.3e3 - 0.818);
}

// SR3-03 Eqs. 8 and 9, pi = p/100 MPa:
//   3a: v/(0.0028 m3/kg) = sum n_i (pi + 0.187)^I_i (sigma - 0.755)^J_i, sigma = s/4.4 kJ/(kg K)
//   3b: v/(0.0088 m3/kg) = sum n_i (pi + 0.298)^I_i (sigma - 0.816)^J_i, sigma = s/5.3 kJ/(kg K)
double region3_v_ps(double p, double s) {
  const double pi = p / 100e6;
  if (s <= kScritical) {
    return 0.0028 * sum_over<coef::kRegion3a_v_ps>(pi + 0.187, s / 4.4e3 - 0.755);
  }
  return 0.0088 * sum_over<coef::kRegion3b_v_ps>(pi + 0.298, s / 5.3e3 - 0.816);
}

}  // namespace shaftwork::fluids::if97

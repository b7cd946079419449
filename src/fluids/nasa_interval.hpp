// Evaluation of one NASA polynomial interval (internal to the fluids layer).
//
// McBride, Zehe & Gordon, NASA/TP-2002-211556, eqs. 2-4, with the interval's a0..a6, b1, b2:
//   cp°/R = a0 T^-2 + a1 T^-1 + a2 + a3 T + a4 T^2 + a5 T^3 + a6 T^4
//   H°/R  = -a0 T^-1 + a1 ln T + a2 T + a3 T^2/2 + a4 T^3/3 + a5 T^4/4 + a6 T^5/5 + b1   [K]
//   S°/R  = -a0 T^-2/2 - a1 T^-1 + a2 ln T + a3 T + a4 T^2/2 + a5 T^3/3 + a6 T^4/4 + b2
// This is the plain, readable form, used where speed does not matter (load checks,
// construction); NasaPolynomialGas evaluates a pre-scaled copy on its hot paths.
#pragma once

#include <cmath>

#include "shaftwork/fluids/nasa_polynomial.hpp"

namespace shaftwork::fluids::detail {

// Dimensionless standard-state properties at one temperature.
struct NasaValues {
  double cp_over_r = 0;  // cp°/R
  double h_over_r = 0;   // H°/R, K
  double s_over_r = 0;   // S°/R at p° = 1 bar
};

inline NasaValues evaluate(const NasaInterval& in, double T) {
  const auto& a = in.a;
  const double ln_t = std::log(T);
  NasaValues v;
  v.cp_over_r = a[0] / (T * T) + a[1] / T + a[2] + T * (a[3] + T * (a[4] + T * (a[5] + T * a[6])));
  v.h_over_r = -a[0] / T + a[1] * ln_t +
               T * (a[2] + T * (a[3] / 2 + T * (a[4] / 3 + T * (a[5] / 4 + T * a[6] / 5)))) + in.b1;
  v.s_over_r = -a[0] / (2 * T * T) - a[1] / T + a[2] * ln_t +
               T * (a[3] + T * (a[4] / 2 + T * (a[5] / 3 + T * a[6] / 4))) + in.b2;
  return v;
}

}  // namespace shaftwork::fluids::detail

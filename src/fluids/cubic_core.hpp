// The cubic equations of state themselves (internal to the fluids layer): constants, the
// roots in Z, and the residual properties. CubicGas (cubic_eos.cpp) and the phase tests
// (cubic_phase.cpp) are built on these.
//
// Both equations in one form (e.g. Michelsen & Mollerup, Thermodynamic Models:
// Fundamentals & Computational Aspects, 2nd ed. 2007, ch. 3):
//   p = R T / (v - b) - a(T) / ((v + d1 b)(v + d2 b))
//   Peng & Robinson, Ind. Eng. Chem. Fundam. 15 (1976) 59:  d1 = 1 + sqrt 2, d2 = 1 - sqrt 2
//   Soave, Chem. Eng. Sci. 27 (1972) 1197:                  d1 = 1, d2 = 0
// a_i(T) = Omega_a (R Tc_i)^2 / pc_i * [1 + m_i (1 - sqrt(T/Tc_i))]^2, b_i = Omega_b R Tc_i / pc_i,
// Omega_a, Omega_b the exact roots of the critical conditions (PR 0.457235529, 0.0777960740;
// SRK 1/(9 (2^(1/3) - 1)) = 0.427480234, (2^(1/3) - 1)/3 = 0.0866403500; the papers print
// them rounded: 0.45724, 0.07780; 0.42747, 0.08664), and
//   PR 1976:  m = 0.37464 + 1.54226 w - 0.26992 w^2
//   PR 1978:  m = 0.379642 + 1.48503 w - 0.164423 w^2 + 0.016666 w^3   for w > 0.491
//             (Robinson & Peng, GPA Research Report RR-28, 1978, as quoted in the later PR
//             literature, e.g. Pedersen, Christensen & Shaikh, Phase Behavior of Petroleum
//             Reservoir Fluids, 2nd ed., eq. 4.48; the threshold 0.491 as given there)
//   SRK:      m = 0.480 + 1.574 w - 0.176 w^2
// van der Waals one-fluid mixing: a = sum_i sum_j x_i x_j (1 - k_ij) sqrt(a_i a_j), b = sum x_i b_i.
// Since sqrt(a_i) = c0_i + c1_i sqrt(T), a(T) of a fixed composition is a quadratic in sqrt(T),
//   a = A0 + A1 sqrt(T) + A2 T,
// so a, da/dT and d2a/dT2 cost the same for any number of components.
//
// Residual properties (departures from the ideal gas at the same T and p), with
// A = a p/(R T)^2, B = b p/(R T), F = ln[(Z + d1 B)/(Z + d2 B)] / (d1 - d2) (from the residual
// Helmholtz energy A_r/(RT) = -ln(1 - b/v) - a F/(b R T); Michelsen & Mollerup ch. 2-3):
//   h_r  = R T (Z - 1) + (T a' - a) F / b
//   s_r  = R ln(Z - B) + a' F / b
//   cv_r = T a'' F / b
//   ln phi (of the phase) = Z - 1 - ln(Z - B) - a F / (b R T)
//   ln phi_i = (b_i/b)(Z - 1) - ln(Z - B) - a F/(b R T) (2 sum_j x_j a_ij / a - b_i/b)
//   (dp/dT)_v = R/(v - b) - a'/((v + d1 b)(v + d2 b))
//   (dp/dv)_T = -R T/(v - b)^2 + a (2 v + (d1 + d2) b)/((v + d1 b)(v + d2 b))^2
// and cp = cv - T (dp/dT)_v^2 / (dp/dv)_T, w^2 = -(v^2/M)(cp/cv)(dp/dv)_T.
#pragma once

#include <algorithm>
#include <cmath>
#include <numbers>
#include <utility>

#include "shaftwork/fluids/critical_data.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::fluids::detail {

inline constexpr double kR = units::kGasConstant;  // J/(mol K)

struct CubicConstants {
  double omega_a;
  double omega_b;
  double d1;
  double d2;
  double z_critical;  // the equation's own critical compressibility (PR 0.3074, SRK 1/3)
};

inline CubicConstants cubic_constants(CubicKind kind) {
  if (kind == CubicKind::peng_robinson) {
    return {0.45723552892138203, 0.07779607390388842, 1 + std::numbers::sqrt2, 1 - std::numbers::sqrt2,
            0.30740130869870386};
  }
  const double c = std::cbrt(2.0) - 1;
  return {1 / (9 * c), c / 3, 1, 0, 1.0 / 3};
}

// The slope m of Soave's alpha function, [1 + m (1 - sqrt(T/Tc))]^2.
inline double alpha_slope(CubicKind kind, double w) {
  if (kind == CubicKind::soave_redlich_kwong) return 0.480 + w * (1.574 - 0.176 * w);
  if (w > 0.491) return 0.379642 + w * (1.48503 + w * (-0.164423 + w * 0.016666));
  return 0.37464 + w * (1.54226 - 0.26992 * w);
}

// The roots Z > B of the cubic in Z, ascending (one or three).
struct CubicRoots {
  int count = 0;
  double z[3] = {0, 0, 0};
};

// Z^3 + c2 Z^2 + c1 Z + c0 = 0 with, for u = d1 + d2 and w = d1 d2,
//   c2 = (u - 1) B - 1,  c1 = A + w B^2 - u B - u B^2,  c0 = -(A B + w B^2 + w B^3);
// solved in closed form (trigonometric for three real roots, Cardano for one; e.g.
// Press et al., Numerical Recipes, 3rd ed., sec. 5.6) and polished by two Newton steps.
inline CubicRoots cubic_roots(double A, double B, const CubicConstants& k) {
  const double u = k.d1 + k.d2;
  const double w = k.d1 * k.d2;
  const double c2 = (u - 1) * B - 1;
  const double c1 = A + w * B * B - u * B - u * B * B;
  const double c0 = -(A * B + w * B * B + w * B * B * B);
  const double q = (c2 * c2 - 3 * c1) / 9;
  const double r = (2 * c2 * c2 * c2 - 9 * c2 * c1 + 27 * c0) / 54;
  double z[3];
  int n = 0;
  if (r * r < q * q * q) {
    const double sq = std::sqrt(q);
    const double theta = std::acos(std::clamp(r / (sq * sq * sq), -1.0, 1.0));
    constexpr double kTwoPi = 2 * std::numbers::pi;
    z[0] = -2 * sq * std::cos(theta / 3) - c2 / 3;
    z[1] = -2 * sq * std::cos((theta + kTwoPi) / 3) - c2 / 3;
    z[2] = -2 * sq * std::cos((theta - kTwoPi) / 3) - c2 / 3;
    n = 3;
  } else {
    const double big = -std::copysign(std::cbrt(std::fabs(r) + std::sqrt(r * r - q * q * q)), r);
    z[0] = big + (big != 0 ? q / big : 0) - c2 / 3;
    n = 1;
  }
  CubicRoots roots;
  for (int i = 0; i < n; ++i) {
    double x = z[i];
    for (int step = 0; step < 2; ++step) {
      const double f = ((x + c2) * x + c1) * x + c0;
      const double df = (3 * x + 2 * c2) * x + c1;
      if (df != 0) x -= f / df;
    }
    if (x > B && std::isfinite(x)) roots.z[roots.count++] = x;
  }
  for (int i = 1; i < roots.count; ++i) {  // at most three: insertion sort
    for (int j = i; j > 0 && roots.z[j] < roots.z[j - 1]; --j) std::swap(roots.z[j], roots.z[j - 1]);
  }
  return roots;
}

// True when the cubic has one root Z > B and that root is proven to lie within [lo, hi]
// (lo above 1/3, on the gas side): it is then the root stable_root() returns, found without
// the closed form's acos, cos and cbrt. False when that is not proven (another root may lie
// above B, the root lies outside [lo, hi] or too close to an end to tell); the caller then
// solves with cubic_roots(). For f(Z) = Z^3 + c2 Z^2 + c1 Z + c0 (coefficients as there):
//  - a root z near 1 is estimated from f's expansion about 1 to second order in A and B,
//    Z = 1 + e, e = -f(1) (1 - A - (u - 2) B) - (2 + (u - 1) B) f(1)^2 (u = d1 + d2), which
//    needs no division; where the proof below fails around it, Newton's method from it
//    (held within [lo, hi], or from hi where f falls there) refines it and the proof is
//    tried once more. f is convex there, so the steps reach a root in [lo, hi] from above;
//  - f(z - d) < 0 < f(z + d), each beyond the rounding of f, brackets a root; f is convex
//    beyond its inflection point -c2/3, so with z + d past it and f'(z + d) > 0, f rises
//    beyond z + d and the bracket holds the largest root r3;
//  - f(B) = -(1 + d1 + d2 + d1 d2) B^2 < 0 (for both equations), so the other two roots
//    lie on the same side of B, or are complex;
//  - the other two roots have the sum -c2 - r3 and the product -c0/r3 (Vieta). Both above
//    B needs a sum above 2 B, a positive product, and real roots (sum^2 >= 4 product); the
//    bracket bounds the sum and the product, and any of the three failing proves r3 the
//    only root above B.
inline bool only_root_within(double A, double B, const CubicConstants& k, double lo, double hi) {
  if (!(std::isfinite(A) && B > 0 && lo > 1.0 / 3)) return false;  // three roots in [lo, hi] would sum above 1
  const double u = k.d1 + k.d2;
  const double w = k.d1 * k.d2;
  const double c2 = (u - 1) * B - 1;
  const double c1 = A + w * B * B - u * B - u * B * B;
  const double c0 = -(A * B + w * B * B + w * B * B * B);
  const auto f = [&](double z) { return ((z + c2) * z + c1) * z + c0; };
  const auto df = [&](double z) { return (3 * z + 2 * c2) * z + c1; };
  // A bound on the rounding error of f(z) near z ~ 1 (a few ulps of its largest term).
  const auto rounding = [&](double z) {
    const double a = std::fabs(z);
    return 1e-15 * (((a + std::fabs(c2)) * a + std::fabs(c1)) * a + std::fabs(c0));
  };
  // The proof around z, with the bracket [z - d, z + d].
  const auto proven = [&](double z, double d) {
    const double zl = z - d;
    const double zu = z + d;
    if (!(zl >= lo && zu <= hi && 3 * zu > -c2 && df(zu) > 0)) return false;
    if (!(f(zl) < -rounding(zl) && f(zu) > rounding(zu))) return false;
    // The other two roots: sum between -c2 - zu and -c2 - zl, product above -c0/zu.
    constexpr double kSlack = 1e-12;  // covers the rounding of these few operations
    const double sum_high = -c2 - zl;
    if (sum_high + kSlack <= 2 * B || -c0 <= 0) return true;
    const double sum_low = -c2 - zu;
    const double sum_squared = std::max(sum_low * sum_low, sum_high * sum_high);
    return (sum_squared * (1 + kSlack) + kSlack * kSlack) * zu < 4 * -c0;  // zu > 0
  };
  const double f1 = 1 + c2 + c1 + c0;
  const double expanded = 1 - f1 * (1 - A - (u - 2) * B) - (2 + (u - 1) * B) * f1 * f1;
  const double size = std::fabs(A) + B;
  if (proven(expanded, 1e-9 + 8 * size * size * size)) return true;  // the third-order terms bound its error
  double z = std::clamp(expanded, lo, hi);
  if (!(df(z) > 0)) z = hi;
  for (int i = 0;; ++i) {
    const double slope = df(z);
    if (!(slope > 0) || i == 16) return false;
    const double step = f(z) / slope;
    z -= step;
    if (std::fabs(step) <= 1e-7) break;  // then z is off by about step^2, far inside the bracket
  }
  return proven(z, 1e-9);
}

// a(T) and its first two temperature derivatives [Pa m6/mol2, per K, per K^2].
struct Attraction {
  double a;
  double da;
  double d2a;
};

// a(T) = A0 + A1 sqrt(T) + A2 T for a fixed composition (see the file comment).
struct AttractionPolynomial {
  double A0 = 0;
  double A1 = 0;
  double A2 = 0;
  Attraction at(double T) const {
    const double r = std::sqrt(T);
    return {A0 + A1 * r + A2 * T, 0.5 * A1 / r + A2, -0.25 * A1 / (r * T)};
  }
};

// F = ln[(Z + d1 B)/(Z + d2 B)] / (d1 - d2).
inline double log_term(double Z, double B, const CubicConstants& k) {
  return std::log((Z + k.d1 * B) / (Z + k.d2 * B)) / (k.d1 - k.d2);
}

// ln phi of a whole phase at root Z: Z - 1 - ln(Z - B) - a F/(b R T), i.e. its residual
// Gibbs energy over R T; the root with the lower value is the stable one.
inline double ln_phi_phase(double Z, double A, double B, const CubicConstants& k) {
  return Z - 1 - std::log(Z - B) - A / B * log_term(Z, B, k);
}

// The root of lower Gibbs energy (the stable phase of the equation); *largest tells whether
// it is the largest root (the vapour's).
inline double stable_root(const CubicRoots& roots, double A, double B, const CubicConstants& k,
                          bool* largest = nullptr) {
  const double vapour = roots.z[roots.count - 1];
  const bool liquid = roots.count == 3 && ln_phi_phase(roots.z[0], A, B, k) < ln_phi_phase(vapour, A, B, k);
  if (largest) *largest = !liquid;
  return liquid ? roots.z[0] : vapour;
}

// Residual properties at (T, p) on root Z (see the file comment), per mole.
struct Residual {
  double v;      // m3/mol
  double h;      // J/mol
  double s;      // J/(mol K)
  double cv;     // J/(mol K)
  double dp_dt;  // (dp/dT)_v, Pa/K
  double dp_dv;  // (dp/dv)_T, Pa mol/m3
};

inline Residual residual(const Attraction& at, double b, double T, double p, double Z, const CubicConstants& k) {
  const double RT = kR * T;
  const double B = b * p / RT;
  const double F = log_term(Z, B, k);
  Residual r;
  r.v = Z * RT / p;
  r.h = RT * (Z - 1) + (T * at.da - at.a) * F / b;
  r.s = kR * std::log(Z - B) + at.da * F / b;
  r.cv = T * at.d2a * F / b;
  const double e1 = r.v + k.d1 * b;
  const double e2 = r.v + k.d2 * b;
  const double vb = r.v - b;
  r.dp_dt = kR / vb - at.da / (e1 * e2);
  r.dp_dv = -RT / (vb * vb) + at.a * (2 * r.v + (k.d1 + k.d2) * b) / ((e1 * e2) * (e1 * e2));
  return r;
}

}  // namespace shaftwork::fluids::detail

// The basic equations of IAPWS-IF97 (regions 1, 2, 3, 5 and the saturation line) and the
// region boundaries B23, B2bc and B3ab. Equations and tables are cited at each function in
// shaftwork/fluids/iapws_if97_equations.hpp.
//
// Each Gibbs (or Helmholtz) function is summed once, together with the sums weighted by its
// exponents, and every property comes from those six sums (IF97 Tables 3, 12, 31 and 39
// give the relations between the properties and the derivatives of gamma or phi).
#include <cmath>

#include "iapws_if97_coefficients.hpp"
#include "iapws_if97_internal.hpp"
#include "iapws_if97_powers.hpp"
#include "shaftwork/fluids/iapws_if97_equations.hpp"

namespace shaftwork::fluids::if97 {
namespace {

namespace coef = coefficients;
using detail::powers_i;
using detail::powers_j;
using detail::weighted_sums;

// The dimensionless derivatives of a Gibbs function, each scaled by its variables:
// g = gamma, gp = pi*gamma_pi, gpp = pi^2*gamma_pipi, gt = tau*gamma_tau,
// gtt = tau^2*gamma_tautau, gpt = pi*tau*gamma_pitau.
struct Gibbs {
  double g, gp, gpp, gt, gtt, gpt;
};

// Properties from a Gibbs function g(p,T)/(RT) = gamma(pi, tau) (IF97 Table 3); alpha_v =
// (1 - tau gamma_pitau / gamma_pi) / T.
Point from_gibbs(const Gibbs& d, double p, double T, int region) {
  Point pt;
  pt.region = region;
  pt.p = p;
  pt.T = T;
  const double RT = kR * T;
  pt.rho = p / (RT * d.gp);
  pt.h = RT * d.gt;
  pt.s = kR * (d.gt - d.g);
  pt.cp = -kR * d.gtt;
  const double x = d.gp - d.gpt;  // pi*(gamma_pi - tau*gamma_pitau)
  pt.cv = kR * (-d.gtt + x * x / d.gpp);
  pt.w = std::sqrt(RT * d.gp * d.gp / (x * x / d.gtt - d.gpp));
  pt.alpha_v = (1.0 - d.gpt / d.gp) / T;
  return pt;
}

}  // namespace

Point region1(double p, double T) {
  const double pi = p / 16.53e6;
  const double tau = 1386.0 / T;
  const double a = 7.1 - pi;
  const double b = tau - 1.222;
  const auto w = weighted_sums(coef::kRegion1, powers_i<coef::kRegion1>(a),
                               powers_j<coef::kRegion1>(b));
  // d/dpi of (7.1 - pi)^I is -I (7.1 - pi)^(I-1): hence the signs and the divisions by a.
  Gibbs d;
  d.g = w.s;
  d.gp = -pi * w.si / a;
  d.gpp = pi * pi * w.sii / (a * a);
  d.gt = tau * w.sj / b;
  d.gtt = tau * tau * w.sjj / (b * b);
  d.gpt = -pi * tau * w.sij / (a * b);
  return from_gibbs(d, p, T, 1);
}

namespace {

// Regions 2 and 5 share the form gamma = ln(pi) + gamma0(tau) + gamma_r(pi, tau - shift).
template <const auto& Ideal, const auto& Residual>
Point ideal_plus_residual(double p, double T, double pi, double tau, double shift, int region) {
  const double b = tau - shift;
  const auto r = weighted_sums(Residual, powers_i<Residual>(pi), powers_j<Residual>(b));
  const auto o = weighted_sums(Ideal, powers_i<Ideal>(1.0), powers_j<Ideal>(tau));
  Gibbs d;
  d.g = std::log(pi) + o.s + r.s;
  d.gp = 1.0 + r.si;
  d.gpp = -1.0 + r.sii;
  d.gt = o.sj + tau * r.sj / b;
  d.gtt = o.sjj + tau * tau * r.sjj / (b * b);
  d.gpt = tau * r.sij / b;
  return from_gibbs(d, p, T, region);
}

}  // namespace

Point region2(double p, double T) {
  return ideal_plus_residual<coef::kRegion2Ideal, coef::kRegion2Residual>(p, T, p / 1e6, 540.0 / T,
                                                                          0.5, 2);
}

Point region5(double p, double T) {
  return ideal_plus_residual<coef::kRegion5Ideal, coef::kRegion5Residual>(p, T, p / 1e6,
                                                                          1000.0 / T, 0.0, 5);
}

namespace detail {

Region3Point region3_with_derivatives(double rho, double T) {
  const double delta = rho / kRhoc;
  const double tau = kTc / T;
  const auto w = weighted_sums(coef::kRegion3, powers_i<coef::kRegion3>(delta),
                               powers_j<coef::kRegion3>(tau));
  const double n1 = coef::kRegion3LogTerm;
  const double phi = n1 * std::log(delta) + w.s;
  const double dphi_d = n1 + w.si;     // delta*phi_delta
  const double dphi_dd = -n1 + w.sii;  // delta^2*phi_deltadelta
  const double tphi_t = w.sj;          // tau*phi_tau
  const double tphi_tt = w.sjj;        // tau^2*phi_tautau
  const double dtphi_dt = w.sij;       // delta*tau*phi_deltatau

  const double RT = kR * T;
  const double x = dphi_d - dtphi_dt;
  const double y = 2.0 * dphi_d + dphi_dd;
  Region3Point out;
  Point& pt = out.point;
  pt.region = 3;
  pt.T = T;
  pt.rho = rho;
  pt.p = rho * RT * dphi_d;
  pt.h = RT * (tphi_t + dphi_d);
  pt.s = kR * (tphi_t - phi);
  pt.cv = -kR * tphi_tt;
  pt.cp = kR * (-tphi_tt + x * x / y);
  pt.w = std::sqrt(RT * (y - x * x / tphi_tt));
  pt.alpha_v = x / (y * T);  // (phi_delta - tau phi_deltatau) / (2 phi_delta + delta phi_deltadelta) / T
  out.dp_drho = RT * y;
  out.dp_dT = rho * kR * x;
  out.dh_dT = kR * (-tphi_tt + x);
  out.dh_drho = RT / rho * (dtphi_dt + dphi_d + dphi_dd);
  return out;
}

}  // namespace detail

Point region3(double rho, double T) { return detail::region3_with_derivatives(rho, T).point; }

double saturation_pressure(double T) {
  const double* n = coef::kRegion4;  // n[0] is n1 of IF97 Table 34
  const double theta = T + n[8] / (T - n[9]);
  const double A = theta * theta + n[0] * theta + n[1];
  const double B = n[2] * theta * theta + n[3] * theta + n[4];
  const double C = n[5] * theta * theta + n[6] * theta + n[7];
  const double root = 2.0 * C / (-B + std::sqrt(B * B - 4.0 * A * C));
  const double root2 = root * root;
  return root2 * root2 * 1e6;
}

double saturation_temperature(double p) {
  const double* n = coef::kRegion4;
  const double beta = std::sqrt(std::sqrt(p / 1e6));
  const double E = beta * beta + n[2] * beta + n[5];
  const double F = n[0] * beta * beta + n[3] * beta + n[6];
  const double G = n[1] * beta * beta + n[4] * beta + n[7];
  const double D = 2.0 * G / (-F - std::sqrt(F * F - 4.0 * E * G));
  const double m = n[9] + D;
  return 0.5 * (m - std::sqrt(m * m - 4.0 * (n[8] + n[9] * D)));
}

double b23_pressure(double T) {
  const double* n = coef::kB23;
  return (n[0] + n[1] * T + n[2] * T * T) * 1e6;
}

double b23_temperature(double p) {
  const double* n = coef::kB23;
  return n[3] + std::sqrt((p / 1e6 - n[4]) / n[2]);
}

double b2bc_pressure(double h) {
  const double* n = coef::kB2bc;
  const double eta = h / 1e3;
  return (n[0] + n[1] * eta + n[2] * eta * eta) * 1e6;
}

double b2bc_enthalpy(double p) {
  const double* n = coef::kB2bc;
  return (n[3] + std::sqrt((p / 1e6 - n[4]) / n[2])) * 1e3;
}

double b3ab_enthalpy(double p) {
  const double* n = coef::kB3ab;
  const double pi = p / 1e6;
  return (n[0] + pi * (n[1] + pi * (n[2] + pi * n[3]))) * 1e3;
}

}  // namespace shaftwork::fluids::if97

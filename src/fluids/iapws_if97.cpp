// fluids::IapwsIf97: region selection, the refinement of the backward equations on the
// basic equations, and wet states. See shaftwork/fluids/iapws_if97.hpp for the contract.
#include "shaftwork/fluids/iapws_if97.hpp"

#include <algorithm>
#include <cmath>
#include <optional>

#include <fmt/format.h>

#include "checks.hpp"
#include "iapws_if97_internal.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/iapws_if97_equations.hpp"
#include "shaftwork/numerics/root.hpp"

namespace shaftwork::fluids {
namespace {

using if97::Point;
using if97::Side;

constexpr const char* kName = "iapws-if97";
// A Newton solve stops once its step moves T (and rho) by at most this fraction; that last
// step is still taken and the state evaluated there, so with Newton's quadratic convergence
// the state returned agrees with the given h or s to about machine precision.
constexpr double kTolerance = 1e-10;
// A step this small (relative) changes nothing worth another evaluation.
constexpr double kNegligible = 1e-15;
// from_pt refuses |T - Ts(p)| <= kSaturationBand * T as "exactly saturated".
constexpr double kSaturationBand = 1e-9;
// Newton steps tried before the bracketed fallback takes over.
constexpr int kNewtonSteps = 12;
// How far past a region's edge (K) the region-3 and region-5 solves may look for a root: the basic
// equations of neighbouring regions agree on the boundaries only within IF97's
// consistency tolerances (IF97 Sec. 10), a few hundredths of a kelvin.
constexpr double kEdgeAllowance = 1.0;

constexpr const char* kRangeText =
    "273.15–1073.15 K up to 100 MPa, 1073.15–2273.15 K up to 50 MPa";

[[noreturn]] void outside(const std::string& what, double p) {
  throw Error(ErrorKind::out_of_range, fmt::format("iapws-if97: {} at {:g} MPa is outside IF97's range: {}",
                                                   what, p / 1e6, kRangeText));
}

// Which property a (p, value) call fixes.
enum class Given { enthalpy, entropy };

double value_of(const Point& pt, Given given) { return given == Given::enthalpy ? pt.h : pt.s; }
// d(value)/dT at constant p: cp for h, cp/T for s.
double slope_of(const Point& pt, Given given) {
  return given == Given::enthalpy ? pt.cp : pt.cp / pt.T;
}

std::string describe(Given given, double value) {
  if (given == Given::enthalpy) return fmt::format("enthalpy {:g} kJ/kg", value / 1e3);
  return fmt::format("entropy {:g} kJ/(kg K)", value / 1e3);
}

State single_phase(const Point& pt, double p) {
  State st;
  st.pressure = p;
  st.temperature = pt.T;
  st.enthalpy = pt.h;
  st.entropy = pt.s;
  st.density = pt.rho;
  st.cp = pt.cp;
  st.cv = pt.cv;
  st.molar_mass = if97::kMolarMass;
  st.compressibility = p / (pt.rho * if97::kR * pt.T);
  st.expansivity = pt.alpha_v;
  st.region = pt.region;
  return st;
}

// ---- Temperature solves in regions 1, 2 and 5 ----------------------------------------------

// Newton's method alone for T in [low, high] with value(eval(p, T)) = target, from T0 (the
// backward equation's value): the state when it converges without leaving the bracket,
// else empty.
template <class Eval>
std::optional<Point> newton_temperature(Eval eval, double p, Given given, double target, double T0,
                                        double low, double high) {
  double T = std::clamp(T0, low, high);
  for (int i = 0; i < kNewtonSteps; ++i) {
    const Point pt = eval(p, T);
    const double step = (value_of(pt, given) - target) / slope_of(pt, given);
    if (std::fabs(step) <= kNegligible * T) return pt;
    const double next = T - step;
    if (!(next >= low && next <= high)) return std::nullopt;  // also catches NaN
    if (std::fabs(step) <= kTolerance * T) return eval(p, next);
    T = next;
  }
  return std::nullopt;
}

// As newton_temperature, falling back on a bracketed Newton over [low, high] when Newton's
// method alone fails. Empty when the target lies outside [value(low), value(high)].
template <class Eval>
std::optional<Point> solve_temperature(Eval eval, double p, Given given, double target, double T0,
                                       double low, double high) {
  if (auto pt = newton_temperature(eval, p, given, target, T0, low, high)) return pt;
  const double f_low = value_of(eval(p, low), given) - target;
  const double f_high = value_of(eval(p, high), given) - target;
  if (f_low > 0 || f_high < 0) return std::nullopt;
  auto f = [&](double t) {
    const Point pt = eval(p, t);
    return numerics::ValueAndSlope{value_of(pt, given) - target, slope_of(pt, given)};
  };
  const double T = numerics::newton_bracketed(f, T0, low, high, 0.01 * kTolerance, 200,
                                 "iapws-if97: temperature");
  return eval(p, T);
}

// ---- Region 3 ---------------------------------------------------------------------------

// Density in region 3 at (p, T) on the branch `side` names: Newton's method on
// p(rho, T) = p from SR5-05's v(p,T); a bracketed solve around that start if Newton fails.
if97::detail::Region3Point region3_at(double p, double T, Side side) {
  const double rho0 = 1.0 / if97::region3_v_pt(p, T, side);
  double rho = rho0;
  for (int i = 0; i < kNewtonSteps; ++i) {
    const auto d = if97::detail::region3_with_derivatives(rho, T);
    if (!(d.dp_drho > 0)) break;  // on the unstable part of an isotherm: Newton is lost
    const double step = (d.point.p - p) / d.dp_drho;
    if (std::fabs(step) <= kNegligible * rho) return d;
    const double next = rho - step;
    if (!(next > 0.7 * rho0 && next < 1.3 * rho0)) break;
    if (std::fabs(step) <= kTolerance * rho) return if97::detail::region3_with_derivatives(next, T);
    rho = next;
  }
  // Fallback: widen a bracket around the start until the pressure changes sign across it
  // with p rising in rho (the stable branch).
  auto f = [&](double r) {
    const auto d = if97::detail::region3_with_derivatives(r, T);
    return numerics::ValueAndSlope{d.point.p - p, d.dp_drho};
  };
  for (double width : {0.01, 0.03, 0.1, 0.3}) {
    const double low = rho0 * (1.0 - width);
    const double high = rho0 * (1.0 + width);
    if (f(low).value < 0 && f(high).value > 0) {
      rho = numerics::newton_bracketed(f, rho0, low, high, 0.01 * kTolerance, 200,
                                       "iapws-if97: region 3 density");
      return if97::detail::region3_with_derivatives(rho, T);
    }
  }
  throw Error(ErrorKind::no_convergence,
              fmt::format("iapws-if97: no region 3 density found at {:.9g} MPa and {:.9g} K "
                          "(SR5-05 start {:.9g} kg/m3)",
                          p / 1e6, T, rho0));
}

// Region 3 from (p, h) or (p, s): Newton's method in (rho, T) on the pair of equations
// p(rho, T) = p, value(rho, T) = target, from SR3-03's backward equations. Falls back on a
// bracketed solve in T over [T_low, T_high], the density found at each T by region3_at.
Point region3_solve(double p, Given given, double target, double T_low, double T_high, Side side) {
  double T = given == Given::enthalpy ? if97::region3_T_ph(p, target) : if97::region3_T_ps(p, target);
  double v = given == Given::enthalpy ? if97::region3_v_ph(p, target) : if97::region3_v_ps(p, target);
  double rho = 1.0 / v;
  const double T0 = T;
  // A root of the pair is the state sought only on the stable part of an isotherm and
  // within the temperatures the caller allows (on the caller's side of Ts(p)). At the
  // critical point (dp/drho)_T is zero and its rounding may come out negative (about -6e-7
  // Pa m3/kg against R T = 3e5 there): the pair's Jacobian is regular all the same, so a
  // slope that small counts as stable.
  auto acceptable = [&](const if97::detail::Region3Point& d) {
    return d.dp_drho > -1e-9 * if97::kR * d.point.T && d.point.T >= T_low && d.point.T <= T_high;
  };
  if (std::isfinite(T) && std::isfinite(rho) && rho > 0) {
    for (int i = 0; i < 2 * kNewtonSteps; ++i) {
      const auto d = if97::detail::region3_with_derivatives(rho, T);
      const double f1 = d.point.p - p;
      const double f2 = value_of(d.point, given) - target;
      const double a11 = d.dp_drho;
      const double a12 = d.dp_dT;
      const double a21 = given == Given::enthalpy ? d.dh_drho : d.ds_drho();
      const double a22 = given == Given::enthalpy ? d.dh_dT : d.ds_dT();
      const double det = a11 * a22 - a12 * a21;
      const double d_rho = (f1 * a22 - f2 * a12) / det;
      const double d_T = (a11 * f2 - a21 * f1) / det;
      if (!(std::isfinite(d_rho) && std::isfinite(d_T))) break;
      if (std::fabs(d_rho) <= kNegligible * rho && std::fabs(d_T) <= kNegligible * T) {
        if (acceptable(d)) return d.point;
        break;
      }
      // Keep the iterate near the start: a step this large means Newton is lost.
      if (std::fabs(d_T) > 20.0 || std::fabs(d_rho) > 0.3 * rho) break;
      rho -= d_rho;
      T -= d_T;
      if (std::fabs(d_rho) <= kTolerance * rho && std::fabs(d_T) <= kTolerance * T) {
        const auto last = if97::detail::region3_with_derivatives(rho, T);
        if (acceptable(last)) return last.point;
        break;
      }
    }
  }
  auto eval = [side](double pp, double t) {
    Point pt = region3_at(pp, t, side).point;
    pt.p = pp;
    return pt;
  };
  // region3_at's Newton step bounds keep each evaluation on its branch; cp from it is exact.
  const auto pt = solve_temperature(eval, p, given, target, std::isfinite(T0) ? T0 : 0.5 * (T_low + T_high),
                                    T_low, T_high);
  if (!pt) {
    throw Error(ErrorKind::no_convergence,
                fmt::format("iapws-if97: no region 3 state found for {} at {:.9g} MPa",
                            describe(given, target), p / 1e6));
  }
  return *pt;
}

// ---- Saturation -----------------------------------------------------------------------

struct Saturation {
  double T;
  Point liquid;
  Point vapour;
};

// Saturated liquid and vapour at p (611.212677 Pa <= p < 22.064 MPa): regions 1 and 2 up
// to psat(623.15 K), region 3 (densities refined at T = Ts(p)) above.
Saturation saturation_at(double p) {
  const double T = if97::saturation_temperature(p);
  if (p <= if97::kPsat623) return {T, if97::region1(p, T), if97::region2(p, T)};
  Point liquid = region3_at(p, T, Side::liquid).point;
  Point vapour = region3_at(p, T, Side::vapour).point;
  liquid.p = p;
  vapour.p = p;
  return {T, liquid, vapour};
}

State wet(double p, const Saturation& sat, double x) {
  State st;
  st.pressure = p;
  st.temperature = sat.T;
  st.enthalpy = sat.liquid.h + x * (sat.vapour.h - sat.liquid.h);
  st.entropy = sat.liquid.s + x * (sat.vapour.s - sat.liquid.s);
  const double v = 1.0 / sat.liquid.rho + x * (1.0 / sat.vapour.rho - 1.0 / sat.liquid.rho);
  st.density = 1.0 / v;
  st.cp = 0;  // not defined for a wet state
  st.cv = 0;
  st.molar_mass = if97::kMolarMass;
  st.compressibility = p / (st.density * if97::kR * sat.T);
  st.expansivity = 0;  // not defined for a wet state
  st.region = p <= if97::kPsat623 ? 4 : 43;
  st.quality = x;
  return st;
}

// ---- (p, h) and (p, s) ------------------------------------------------------------------

Point region1_eval(double p, double T) { return if97::region1(p, T); }
Point region2_eval(double p, double T) { return if97::region2(p, T); }
Point region5_eval(double p, double T) { return if97::region5(p, T); }

// Starting temperatures from the backward equations of regions 1 and 2.
double backward_liquid(double p, Given given, double target) {
  return given == Given::enthalpy ? if97::region1_T_ph(p, target) : if97::region1_T_ps(p, target);
}
double backward_vapour(double p, Given given, double target) {
  return given == Given::enthalpy ? if97::region2_T_ph(p, target) : if97::region2_T_ps(p, target);
}

// The fast path of (p, h) and (p, s) outside region 3: Newton's method from the backward
// equation of the phase the target suggests, kept on that phase's side of T_split (the
// saturation temperature, or 623.15 K and the B23 temperature above psat(623.15 K)).
// A root found there settles the phase without evaluating the saturated states: h and s
// rise with T at constant p, so a region 2 root at or above T_vapour means the target is
// at or above the vapour's value there, and a region 1 root at or below T_liquid means it
// is at or below the liquid's. Empty when the guess or Newton's method fails; the caller
// then classifies the target against the saturated (or boundary) states.
std::optional<Point> fast_single_phase(double p, Given given, double target, double T_liquid,
                                       double T_vapour) {
  // Between the liquid's and the vapour's values for any p up to psat(623.15 K).
  const double middle = given == Given::enthalpy ? 2.1e6 : 4.5e3;
  if (target > middle) {
    const double T0 = backward_vapour(p, given, target);
    // Far outside its region (in the wet region, say) the backward equation extrapolates
    // wildly, to 10^5 K and more: such a start is no guess at all.
    if (T0 > T_vapour && T0 <= if97::kT25) {
      return newton_temperature(region2_eval, p, given, target, T0, T_vapour, if97::kT25);
    }
  } else {
    const double T0 = backward_liquid(p, given, target);
    if (T0 < T_liquid && T0 >= if97::kTmin) {
      return newton_temperature(region1_eval, p, given, target, T0, if97::kTmin, T_liquid);
    }
  }
  return std::nullopt;
}

Point solve_region1(double p, Given given, double target, double T_high) {
  const double T0 = backward_liquid(p, given, target);
  const auto pt = solve_temperature(region1_eval, p, given, target, T0, if97::kTmin, T_high);
  if (!pt) outside(describe(given, target), p);  // below the liquid at 273.15 K
  return *pt;
}

// Vapour at or above T_low: region 2 up to 1073.15 K, region 5 above (p <= 50 MPa).
Point solve_vapour(double p, Given given, double target, double T_low) {
  const double T0 = backward_vapour(p, given, target);
  if (const auto pt = solve_temperature(region2_eval, p, given, target, T0, T_low, if97::kT25)) {
    return *pt;
  }
  const Point edge = if97::region2(p, if97::kT25);
  if (value_of(edge, given) > target || p > if97::kPmax5) outside(describe(given, target), p);
  // Region 5: start from a constant-cp step off the region 2 edge. Where region 5 gives a
  // higher h (or s) at 1073.15 K than region 2 does (IF97 Sec. 10 allows such small
  // differences), the target may lie between the two: the root is then region 5's, a few
  // hundredths of a kelvin below 1073.15 K, so the bracket reaches a little below.
  const double gap = target - value_of(edge, given);
  const double T5 = given == Given::enthalpy ? if97::kT25 + gap / edge.cp
                                             : if97::kT25 * std::exp(gap / edge.cp);
  const auto pt = solve_temperature(region5_eval, p, given, target, T5, if97::kT25 - kEdgeAllowance,
                                    if97::kTmax);
  if (!pt) outside(describe(given, target), p);
  return *pt;
}

State solve_ph_or_ps(double p, Given given, double target) {
  detail::check_pressure(p, kName);
  detail::check_finite(target, given == Given::enthalpy ? "enthalpy" : "entropy", kName);
  if (p > if97::kPmax) outside(describe(given, target), p);

  if (p <= if97::kPsat623) {
    if (p < if97::kPsatTmin) return single_phase(solve_vapour(p, given, target, if97::kTmin), p);
    const double Ts = if97::saturation_temperature(p);
    if (const auto pt = fast_single_phase(p, given, target, Ts, Ts)) return single_phase(*pt, p);
    const Point vapour = if97::region2(p, Ts);
    if (target >= value_of(vapour, given)) return single_phase(solve_vapour(p, given, target, Ts), p);
    const Point liquid = if97::region1(p, Ts);
    if (target <= value_of(liquid, given)) return single_phase(solve_region1(p, given, target, Ts), p);
    const double x = (target - value_of(liquid, given)) / (value_of(vapour, given) - value_of(liquid, given));
    return wet(p, Saturation{Ts, liquid, vapour}, x);
  }

  const double T23 = if97::b23_temperature(p);
  if (const auto pt = fast_single_phase(p, given, target, if97::kT13, T23)) return single_phase(*pt, p);
  if (target <= value_of(if97::region1(p, if97::kT13), given)) {
    return single_phase(solve_region1(p, given, target, if97::kT13), p);
  }
  if (target >= value_of(if97::region2(p, T23), given)) {
    return single_phase(solve_vapour(p, given, target, T23), p);
  }
  double T_low = if97::kT13 - kEdgeAllowance;
  double T_high = T23 + kEdgeAllowance;
  Side side = Side::by_temperature;
  if (p < if97::kPc) {
    const Saturation sat = saturation_at(p);
    const double f = value_of(sat.liquid, given);
    const double g = value_of(sat.vapour, given);
    if (target > f && target < g) return wet(p, sat, (target - f) / (g - f));
    if (target <= f) {
      T_high = sat.T;
      side = Side::liquid;
    } else {
      T_low = sat.T;
      side = Side::vapour;
    }
  }
  return single_phase(region3_solve(p, given, target, T_low, T_high, side), p);
}

}  // namespace

State IapwsIf97::from_pt(double p, double T) const {
  detail::check_pressure(p, kName);
  detail::check_finite(T, "temperature", kName);
  const bool in_range = T >= if97::kTmin && T <= if97::kTmax && p <= if97::kPmax &&
                        (T <= if97::kT25 || p <= if97::kPmax5);
  if (!in_range) outside(fmt::format("{:g} K", T), p);

  auto refuse_if_saturated = [&](double Ts) {
    if (std::fabs(T - Ts) <= kSaturationBand * T) {
      throw Error(ErrorKind::bad_input,
                  fmt::format("iapws-if97: {:.6g} K is the saturation temperature at {:.6g} MPa, "
                              "where (p, Tsat) does not fix a wet state; give enthalpy, quality, "
                              "or power with flow instead",
                              T, p / 1e6));
    }
  };

  if (T > if97::kT25) return single_phase(if97::region5(p, T), p);
  if (T <= if97::kT13) {
    const double ps = if97::saturation_pressure(T);
    // Only near ps(T) can T be Ts(p); the band in p is far wider than the band in T.
    if (std::fabs(p - ps) <= 1e-6 * ps) refuse_if_saturated(if97::saturation_temperature(p));
    return single_phase(p > ps ? if97::region1(p, T) : if97::region2(p, T), p);
  }
  if (p <= if97::b23_pressure(T)) return single_phase(if97::region2(p, T), p);
  Side side = Side::by_temperature;
  if (p < if97::kPc) {
    const double Ts = if97::saturation_temperature(p);
    refuse_if_saturated(Ts);
    side = T < Ts ? Side::liquid : Side::vapour;
  }
  return single_phase(region3_at(p, T, side).point, p);
}

State IapwsIf97::from_ph(double p, double h) const { return solve_ph_or_ps(p, Given::enthalpy, h); }

State IapwsIf97::from_ps(double p, double s) const { return solve_ph_or_ps(p, Given::entropy, s); }

std::optional<double> IapwsIf97::saturation_temperature(double p) const {
  if (!(p >= if97::kPsatTmin && p < if97::kPc)) return std::nullopt;
  return if97::saturation_temperature(p);
}

namespace {

// The pressure of a wet state: 611.212677 Pa up to (not including) the critical pressure.
void check_wet_pressure(double p) {
  detail::check_pressure(p, kName);
  if (!(p >= if97::kPsatTmin && p < if97::kPc)) {
    throw Error(ErrorKind::out_of_range,
                fmt::format("iapws-if97: a wet state needs a pressure from 611.213 Pa up to the "
                            "critical pressure 22.064 MPa, got {:g} MPa",
                            p / 1e6));
  }
}

}  // namespace

State IapwsIf97::from_p_quality(double p, double quality) const {
  detail::check_pressure(p, kName);
  if (!(quality >= 0.0 && quality <= 1.0)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("iapws-if97: quality must be between 0 and 1, got {:g}", quality));
  }
  check_wet_pressure(p);
  return wet(p, saturation_at(p), quality);
}

Saturated IapwsIf97::saturated(double p) const {
  check_wet_pressure(p);
  const Saturation sat = saturation_at(p);
  return {wet(p, sat, 0.0), wet(p, sat, 1.0)};
}

double IapwsIf97::saturation_pressure(double T) {
  if (!(T >= if97::kTmin && T <= if97::kTc)) {
    throw Error(ErrorKind::out_of_range,
                fmt::format("iapws-if97: saturation pressure is defined from 273.15 K to the "
                            "critical temperature 647.096 K, got {:g} K",
                            T));
  }
  return if97::saturation_pressure(T);
}

std::string IapwsIf97::description() const {
  return "water and steam, IAPWS-IF97 (IAPWS R7-97(2012); backward equations of IF97, "
         "SR3-03(2014) and SR5-05(2016) refined on the basic equations)";
}

}  // namespace shaftwork::fluids

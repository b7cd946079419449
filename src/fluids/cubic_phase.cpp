// CubicGas: fugacities, the phase tests and the phase boundaries named in refusals.
//
// Pure fluid: below Tc, the vapour is the stable phase when its root has the lower Gibbs
// energy (ln phi_V < ln phi_L, i.e. p below the vapour pressure); the vapour pressure
// itself solves ln phi_L = ln phi_V by Newton's method in ln p, whose slope is
// d(ln phi_L - ln phi_V)/d ln p = Z_L - Z_V, started from Wilson's estimate
// ln(p/pc) = 5.373 (1 + w)(1 - Tc/T) (Wilson 1968; e.g. Michelsen & Mollerup, 2nd ed., ch. 9)
// and kept inside the bracket of pressures known to lie below and above it.
//
// Mixture: Michelsen's tangent-plane-distance test (Michelsen, Fluid Phase Equilib. 9 (1982)
// 1-19): with d_i = ln y_i + ln phi_i(y) of the feed, a trial phase W (mole numbers) is
// iterated by successive substitution ln W_i = d_i - ln phi_i(W/sum W) from a vapour-like
// (W = y K) and a liquid-like (W = y/K) start, K from Wilson's equation; the feed is unstable
// when the modified distance tm = 1 + sum W_i (ln W_i + ln phi_i - d_i - 1) drops below 0
// (at a stationary point tm = 1 - sum W). The test costs tens of microseconds, so the model
// keeps a screen: when it is built, the highest temperature at which the test finds a split
// is found on a grid of pressures (a 2 % scan down from 1.5 times the highest critical
// temperature, then bisection to 0.01 K); a state hotter than the largest of the four
// nearest grid values plus 2 % and 2 K is one phase without a test. Everything else is tested.
#include <algorithm>
#include <cmath>
#include <optional>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "cubic_impl.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/numerics/root.hpp"

namespace shaftwork::fluids {
namespace {

using detail::kR;

constexpr int kStabilityIterations = 200;
constexpr double kStabilityTolerance = 1e-10;  // on sum (delta ln W)^2
constexpr double kUnstable = -1e-8;            // tm below this: a phase split
constexpr double kScreenLowP = 1e3;            // Pa
constexpr double kScreenHighP = 2e8;           // Pa
constexpr double kScreenPressureRatio = 1.4;
constexpr double kScanRatio = 1.02;

double wilson_ln_k(const CriticalConstants& c, double p, double T) {
  return std::log(c.critical_pressure / p) + 5.373 * (1 + c.acentric_factor) * (1 - c.critical_temperature / T);
}

std::string bar(double p) { return fmt::format("{:.6g} bar", p / 1e5); }

}  // namespace

std::vector<double> CubicGas::Impl::sqrt_a(double T) const {
  std::vector<double> s(n);
  for (std::size_t i = 0; i < n; ++i) {
    s[i] = sqrt_ac[i] * (1 + m[i] * (1 - std::sqrt(T / critical[i].critical_temperature)));
  }
  return s;
}

std::vector<double> CubicGas::Impl::ln_phi(double p, double T, const std::vector<double>& x, double* Z) const {
  const std::vector<double> s = sqrt_a(T);
  std::vector<double> sum(n, 0.0);  // sum_j x_j a_ij
  double a = 0;
  double bx = 0;
  for (std::size_t i = 0; i < n; ++i) {
    for (std::size_t j = 0; j < n; ++j) sum[i] += one_minus_k[i * n + j] * s[i] * s[j] * x[j];
    a += x[i] * sum[i];
    bx += x[i] * b_i[i];
  }
  const double RT = kR * T;
  const double A = a * p / (RT * RT);
  const double B = bx * p / RT;
  const detail::CubicRoots roots = detail::cubic_roots(A, B, k);
  const double z = detail::stable_root(roots, A, B, k);
  const double F = detail::log_term(z, B, k);
  const double log_zb = std::log(z - B);
  std::vector<double> out(n);
  for (std::size_t i = 0; i < n; ++i) {
    const double bi = b_i[i] / bx;
    out[i] = bi * (z - 1) - log_zb - A / B * F * (2 * sum[i] / a - bi);
  }
  if (Z) *Z = z;
  return out;
}

bool CubicGas::Impl::stable(double p, double T) const {
  const std::vector<double> phi_feed = ln_phi(p, T, y, nullptr);
  std::vector<double> feed(n), ln_k(n);
  for (std::size_t i = 0; i < n; ++i) {
    feed[i] = std::log(y[i]) + phi_feed[i];
    ln_k[i] = wilson_ln_k(critical[i], p, T);
  }
  for (const double sign : {1.0, -1.0}) {  // vapour-like, then liquid-like trial
    std::vector<double> ln_w(n), x(n);
    for (std::size_t i = 0; i < n; ++i) ln_w[i] = std::log(y[i]) + sign * ln_k[i];
    for (int iteration = 0; iteration < kStabilityIterations; ++iteration) {
      double total = 0;
      for (std::size_t i = 0; i < n; ++i) total += std::exp(ln_w[i]);
      for (std::size_t i = 0; i < n; ++i) x[i] = std::exp(ln_w[i]) / total;
      const std::vector<double> phi = ln_phi(p, T, x, nullptr);
      double tm = 1;
      double change = 0;
      double from_feed = 0;
      for (std::size_t i = 0; i < n; ++i) {
        tm += std::exp(ln_w[i]) * (ln_w[i] + phi[i] - feed[i] - 1);
        const double next = feed[i] - phi[i];
        change += (next - ln_w[i]) * (next - ln_w[i]);
        from_feed += (next - std::log(y[i])) * (next - std::log(y[i]));
        ln_w[i] = next;
      }
      if (tm < kUnstable) return false;
      if (change < kStabilityTolerance || from_feed < 1e-10) break;  // stationary, or the trivial solution
    }
  }
  return true;
}

std::optional<double> CubicGas::Impl::saturation_pressure(double T) const {
  const CriticalConstants& c = critical[0];
  if (!pure() || !(T < c.critical_temperature)) return std::nullopt;
  double ln_p = std::log(c.critical_pressure) + 5.373 * (1 + c.acentric_factor) * (1 - c.critical_temperature / T);
  double low = -HUGE_VAL;  // ln p known to lie below the vapour pressure
  double high = HUGE_VAL;  // and above it
  const detail::Attraction at = attraction.at(T);
  for (int iteration = 0; iteration < 200; ++iteration) {
    const double p = std::exp(ln_p);
    const double A = at.a * p / (kR * T * kR * T);
    const double B = b * p / (kR * T);
    const detail::CubicRoots roots = detail::cubic_roots(A, B, k);
    double next = 0;
    if (roots.count == 3) {
      const double g = detail::ln_phi_phase(roots.z[0], A, B, k) - detail::ln_phi_phase(roots.z[2], A, B, k);
      (g > 0 ? low : high) = ln_p;
      next = ln_p + g / (roots.z[2] - roots.z[0]);
    } else {
      const bool vapour_only = roots.z[0] > k.z_critical;
      (vapour_only ? low : high) = ln_p;
      next = ln_p + (vapour_only ? 0.5 : -0.5);
    }
    if (!(next > low && next < high)) {  // outside the bracket: bisect, or step 0.5 from its one end
      next = !std::isfinite(high) ? low + 0.5 : !std::isfinite(low) ? high - 0.5 : 0.5 * (low + high);
    }
    if (std::fabs(next - ln_p) < 1e-13 || high - low < 1e-13) return std::exp(next);
    ln_p = next;
  }
  return std::nullopt;
}

std::optional<double> CubicGas::Impl::saturation_temperature(double p) const {
  const CriticalConstants& c = critical[0];
  if (!pure() || !(p < c.critical_pressure)) return std::nullopt;
  const auto f = [&](double T) {
    const auto ps = saturation_pressure(T);
    if (!ps) throw Error(ErrorKind::no_convergence, "vapour pressure");
    return std::log(*ps / p);
  };
  try {
    return numerics::find_root(f, 0.3 * c.critical_temperature, c.critical_temperature * (1 - 1e-9),
                               "saturation temperature", {1e-10, 200})
        .x;
  } catch (const Error&) {
    return std::nullopt;
  }
}

std::optional<double> CubicGas::Impl::mixture_dew_temperature(double p, double from) const {
  // Up from `from` (a split state) until one phase, then bisection.
  double split = from;
  for (double T = from * kScanRatio; T <= range.high; T *= kScanRatio) {
    if (stable(p, T)) {
      double one_phase = T;
      while (one_phase - split > 0.01) {
        const double middle = 0.5 * (split + one_phase);
        (stable(p, middle) ? one_phase : split) = middle;
      }
      return one_phase;
    }
    split = T;
  }
  return std::nullopt;
}

void CubicGas::Impl::build_screen() {
  double top_tc = 0;
  for (const CriticalConstants& c : critical) top_tc = std::max(top_tc, c.critical_temperature);
  const double top = std::min(range.high, std::max(1.5 * top_tc, range.low * kScanRatio));
  for (double p = kScreenLowP; p <= kScreenHighP * 1.0001; p *= kScreenPressureRatio) {
    double boundary = range.low;  // one phase all the way down
    if (!stable(p, top)) {
      boundary = range.high;  // no screen at this pressure
    } else {
      for (double T = top / kScanRatio; T >= range.low; T /= kScanRatio) {
        if (!stable(p, T)) {
          boundary = mixture_dew_temperature(p, T).value_or(range.high);
          break;
        }
      }
    }
    screen_lnp.push_back(std::log(p));
    screen_t.push_back(boundary);
  }
}

bool CubicGas::Impl::one_phase(const CubicPoint& pt) const {
  if (pure()) {
    const CriticalConstants& c = critical[0];
    if (pt.T >= c.critical_temperature) return true;
    if (pt.roots == 3) return pt.largest;
    const auto ps = saturation_pressure(pt.T);
    return ps ? pt.p < *ps : pt.Z > k.z_critical;
  }
  if (!screen_lnp.empty()) {
    const double ln_p = std::log(pt.p);
    const auto above = std::upper_bound(screen_lnp.begin(), screen_lnp.end(), ln_p);
    if (above != screen_lnp.begin() && above != screen_lnp.end()) {
      const auto i = static_cast<std::size_t>(above - screen_lnp.begin());  // ln p in [i-1, i]
      double bound = 0;
      for (std::size_t j = i > 1 ? i - 2 : 0; j <= std::min(i + 1, screen_t.size() - 1); ++j) {
        bound = std::max(bound, screen_t[j]);
      }
      if (pt.T > bound * 1.02 + 2) return true;
    }
  }
  return stable(pt.p, pt.T);
}

void CubicGas::Impl::refuse_phase(const CubicPoint& pt, const char* given, double value, const char* unit) const {
  const std::string where = given == nullptr
                                ? fmt::format("{} at {}, {:.6g} K", phase_label, bar(pt.p), pt.T)
                                : fmt::format("{}: {} {:.6g} {} at {}", phase_label, given, value, unit, bar(pt.p));
  if (pure()) {
    const CriticalConstants& c = critical[0];
    if (!(pt.p < c.critical_pressure)) {
      throw Error(ErrorKind::out_of_range,
                  fmt::format("{} is a liquid (above the critical pressure {} and below the critical temperature "
                              "{:.6g} K): the model describes the gas only",
                              where, bar(c.critical_pressure), c.critical_temperature));
    }
    const auto dew = saturation_temperature(pt.p);
    throw Error(ErrorKind::out_of_range,
                fmt::format("{} lies below its dew point ({}): it would condense; the model describes the gas only",
                            where, dew ? fmt::format("about {:.1f} K at {}", *dew, bar(pt.p)) : "not found"));
  }
  const auto dew = stable(pt.p, pt.T) ? std::optional<double>(pt.T) : mixture_dew_temperature(pt.p, pt.T);
  throw Error(ErrorKind::out_of_range,
              fmt::format("{} lies inside its two-phase region (below its dew point, {}): part of it would "
                          "condense; the model describes one gas phase only",
                          where, dew ? fmt::format("about {:.1f} K at {}", *dew, bar(pt.p)) : "not found"));
}

std::vector<double> CubicGas::ln_fugacity_coefficients(double p, double T, const std::vector<double>& x) const {
  if (x.size() != impl_->n) {
    throw Error(ErrorKind::bad_input, fmt::format("{}: {} mole fractions given for {} components", impl_->label,
                                                  x.size(), impl_->n));
  }
  return impl_->ln_phi(p, T, x, nullptr);
}

std::optional<double> CubicGas::vapour_pressure(double T) const { return impl_->saturation_pressure(T); }

std::optional<double> CubicGas::dew_temperature(double p) const {
  const Impl& m = *impl_;
  if (m.pure()) return m.saturation_temperature(p);
  for (double T = m.range.high; T >= m.range.low; T /= kScanRatio) {
    if (!m.stable(p, T)) return m.mixture_dew_temperature(p, T);
  }
  return std::nullopt;
}

}  // namespace shaftwork::fluids

// A reference integration of the polytropic path for the tests, written apart from the
// solver in src/machines/: the definition dh/d(ln p) = f p v (Huntington, ASME J. Eng. Gas
// Turbines Power 107 (1985) 872; f = 1/eta_p in compression, eta_p in expansion) with states
// from (p, h) only, the classical fourth-order Runge-Kutta method in fixed steps, a step that
// changes region cut by bisection at the change (with steps shrinking geometrically toward it,
// so that no stage sees the far side's equation), and Richardson's extrapolation from N and 2N
// steps. The solver instead collocates on Chebyshev points, mostly in the entropy form, with
// states from (p, T).
#pragma once

#include <algorithm>
#include <cmath>
#include <utility>

#include "shaftwork/fluids/fluid_model.hpp"

namespace shaftwork::test {

using fluids::FluidModel;
using fluids::State;

// dh/d(ln p) = f p v(p, h) along the path, RK4 in fixed steps of ln p.
class ReferencePath {
 public:
  ReferencePath(const FluidModel& fluid, const State& inlet, double p2, double factor)
      : fluid_(fluid), inlet_(inlet), p2_(p2), factor_(factor) {}

  // h at p2 and the estimate of its error, from N and 2N steps.
  std::pair<double, double> outlet_enthalpy(int steps) const {
    const double coarse = integrate(steps);
    const double fine = integrate(2 * steps);
    return {fine + (fine - coarse) / 15.0, std::fabs(fine - coarse) / 15.0};
  }

 private:
  double pressure(double x) const {
    const double lo = std::min(inlet_.pressure, p2_), hi = std::max(inlet_.pressure, p2_);
    if (x == x2()) return p2_;
    return std::clamp(std::exp(x), lo, hi);
  }
  double x1() const { return std::log(inlet_.pressure); }
  double x2() const { return std::log(p2_); }
  State state(double x, double h) const { return fluid_.from_ph(pressure(x), h); }
  double slope(double x, double h) const {
    const double p = pressure(x);
    return factor_ * p / fluid_.from_ph(p, h).density;
  }
  // One RK4 step from (xa, h) to xb; the first and last stages are taken at xa_eval and
  // xb_eval, which differ from xa and xb by 1e-13 in ln p next to a change of region, so that
  // each stage sees the side its step lies on.
  double step(double xa, double h, double xb, double xa_eval, double xb_eval) const {
    const double d = xb - xa;
    const double k1 = slope(xa_eval, h);
    const double k2 = slope(xa + 0.5 * d, h + 0.5 * d * k1);
    const double k3 = slope(xa + 0.5 * d, h + 0.5 * d * k2);
    const double k4 = slope(xb_eval, h + d * k3);
    return h + d / 6.0 * (k1 + 2 * k2 + 2 * k3 + k4);
  }
  // From (xa, h) to xb in RK4 steps that shrink geometrically toward xb (toward_end) or grow
  // away from xa: next to a change of region a stage may fall on the other side (its h is off
  // the path by the step's truncation error), which costs the jump of f p v times the step, so
  // the steps there are made tiny.
  double graded(double xa, double h, double xb, double xa_eval, double xb_eval, bool toward_end) const {
    constexpr int kPieces = 40;
    double x = xa;
    for (int k = 1; k <= kPieces; ++k) {
      const double fraction = toward_end ? 1.0 - std::ldexp(1.0, -k) : std::ldexp(1.0, k - kPieces);
      const double next = k == kPieces ? xb : xa + (xb - xa) * fraction;
      h = step(x, h, next, x == xa ? xa_eval : x, next == xb ? xb_eval : next);
      x = next;
    }
    return h;
  }
  double integrate(int steps) const {
    const double d = (x2() - x1()) / steps;
    const double tiny = 1e-13 * (x2() - x1());
    double x = x1(), h = inlet_.enthalpy, x_eval = x1();
    int region = inlet_.region;
    for (int i = 0; i < steps; ++i) {
      const double xb = i + 1 == steps ? x2() : x1() + (i + 1) * d;
      const double hb = step(x, h, xb, x_eval, xb);
      const int rb = state(xb, hb).region;
      if (rb == region) {
        x = x_eval = xb;
        h = hb;
        continue;
      }
      // The region changes within the step: bisect for where, end this step there, and go on
      // from the other side.
      double lo = x, hi = xb;
      while (std::fabs(hi - lo) > std::fabs(tiny)) {
        const double mid = 0.5 * (lo + hi);
        (state(mid, graded(x, h, mid, x_eval, mid, true)).region == region ? lo : hi) = mid;
      }
      const double h_cross = graded(x, h, lo, x_eval, lo, true);
      h = graded(lo, h_cross, xb, hi, xb, false);
      x = x_eval = xb;
      region = state(xb, h).region;
    }
    return h;
  }

  const FluidModel& fluid_;
  State inlet_;
  double p2_;
  double factor_;
};

}  // namespace shaftwork::test

// Implementation of numerics::newton_root (header-only: it sits in hot loops and must
// inline the caller's function object). The contract is in root.hpp.
#pragma once

#include <algorithm>
#include <cmath>

namespace shaftwork::numerics {

template <class F>
RootResult newton_root(F&& f, double x0, double low, double high, const char* what,
                       const RootOptions& options) {
  detail::check_bracket(low, high, what);
  const ValueAndSlope at_low = f(low);
  if (!std::isfinite(at_low.value)) detail::throw_not_finite(low, at_low.value, what);
  if (at_low.value == 0) return {low, low, low, 0};
  const ValueAndSlope at_high = f(high);
  if (!std::isfinite(at_high.value)) detail::throw_not_finite(high, at_high.value, what);
  if (at_high.value == 0) return {high, high, high, 0};
  if ((at_low.value > 0) == (at_high.value > 0)) detail::throw_no_sign_change(low, high, what);

  const bool rising = at_high.value > 0;
  double x = (x0 > low && x0 < high) ? x0 : 0.5 * (low + high);
  for (std::uintmax_t i = 1; i <= options.max_iterations; ++i) {
    const ValueAndSlope here = f(x);
    if (!std::isfinite(here.value)) detail::throw_not_finite(x, here.value, what);
    if (here.value == 0) return {x, x, x, i};
    // Shrink the bracket around the root.
    if ((here.value > 0) == rising) {
      high = x;
    } else {
      low = x;
    }
    double next = x - here.value / here.slope;
    if (!(next > low && next < high)) next = 0.5 * (low + high);  // also catches NaN and inf
    const double step = std::fabs(next - x);
    x = next;
    const double tolerance = std::max(options.absolute_tolerance, options.relative_tolerance * std::fabs(x));
    if (step <= tolerance || high - low <= tolerance) return {x, low, high, i};
  }
  detail::throw_no_convergence(options, low, high, what);
}

template <class F>
double newton_bracketed(F&& f, double x0, double low, double high, double relative_tolerance,
                        int max_iterations, const char* what) {
  RootOptions options;
  options.relative_tolerance = relative_tolerance;
  options.max_iterations = max_iterations > 0 ? static_cast<std::uintmax_t>(max_iterations) : 0;
  return newton_root(f, x0, low, high, what, options).x;
}

}  // namespace shaftwork::numerics

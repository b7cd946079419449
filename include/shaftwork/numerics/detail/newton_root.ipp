// Implementation of numerics::newton_root and newton_from_start (header-only: they sit in hot
// loops and must inline the caller's function object). The contract is in root.hpp.
#pragma once

#include <algorithm>
#include <cmath>

namespace shaftwork::numerics {

namespace detail {

// How Newton's iteration from x ended: a root, or where the unchecked form gives up.
enum class NewtonEnd { converged, not_finite, left_bracket, budget_spent };

// The iteration both forms share: Newton steps from x, each shrinking [low, high] around the
// root (`rising`: f increases through it). A step that would leave the bracket bisects it,
// when the bracket is known to hold a sign change: its ends were checked (`ends_checked`,
// newton_root), or both have since moved to points where f was evaluated. Otherwise it ends
// the iteration (newton_from_start). On `converged`, result holds the root, the bracket and
// the iterations; on not_finite, result.x and value_at_x tell where.
template <class F>
NewtonEnd newton_iterate(F& f, double x, double low, double high, bool rising, bool ends_checked,
                         const RootOptions& options, RootResult& result, double& value_at_x) {
  bool low_seen = ends_checked;
  bool high_seen = ends_checked;
  for (std::uintmax_t i = 1; i <= options.max_iterations; ++i) {
    const ValueAndSlope here = f(x);
    if (!std::isfinite(here.value)) {
      result.x = x;
      value_at_x = here.value;
      return NewtonEnd::not_finite;
    }
    if (here.value == 0) {
      result = {x, x, x, i};
      return NewtonEnd::converged;
    }
    // Shrink the bracket around the root.
    if ((here.value > 0) == rising) {
      high = x;
      high_seen = true;
    } else {
      low = x;
      low_seen = true;
    }
    double next = x - here.value / here.slope;
    bool newton_step = true;
    if (!(next > low && next < high)) {  // also catches NaN and inf
      if (!(low_seen && high_seen)) return NewtonEnd::left_bracket;
      next = 0.5 * (low + high);
      newton_step = false;
    }
    const double step = std::fabs(next - x);
    x = next;
    const double tolerance = std::max(options.absolute_tolerance, options.relative_tolerance * std::fabs(x));
    // RootOptions::curvature: a Newton step (not a bisection) that leaves x settled.
    const bool settled = newton_step && options.curvature > 0 &&
                         options.curvature * step * step <= 0x1p-54 * std::fabs(x);
    if (step <= tolerance || high - low <= tolerance || settled) {
      result = {x, low, high, i};
      return NewtonEnd::converged;
    }
  }
  result = {x, low, high, options.max_iterations};
  return NewtonEnd::budget_spent;
}

}  // namespace detail

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
  const double x = (x0 > low && x0 < high) ? x0 : 0.5 * (low + high);
  RootResult result;
  double value = 0;
  switch (detail::newton_iterate(f, x, low, high, rising, true, options, result, value)) {
    case detail::NewtonEnd::converged: return result;
    case detail::NewtonEnd::not_finite: detail::throw_not_finite(result.x, value, what);
    default: detail::throw_no_convergence(options, result.low, result.high, what);
  }
}

template <class F>
std::optional<double> newton_from_start(F&& f, double x0, double low, double high, const RootOptions& options) {
  if (!(x0 > low && x0 < high)) return std::nullopt;
  RootResult result;
  double value = 0;
  if (detail::newton_iterate(f, x0, low, high, true, false, options, result, value) != detail::NewtonEnd::converged) {
    return std::nullopt;
  }
  return result.x;
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

// Implementation of numerics::newton_bracketed (header-only: it sits in hot loops
// and must inline the caller's function object).
#pragma once

#include <cmath>
#include <string>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::numerics {

template <class F>
double newton_bracketed(F&& f, double x0, double low, double high, double relative_tolerance,
                        int max_iterations, const char* what) {
  ValueAndSlope at_low = f(low);
  ValueAndSlope at_high = f(high);
  if (at_low.value == 0) return low;
  if (at_high.value == 0) return high;
  if ((at_low.value > 0) == (at_high.value > 0)) {
    throw Error(ErrorKind::out_of_range,
                fmt::format("{}: no solution between {:.6g} and {:.6g}", what, low, high));
  }
  const bool rising = at_high.value > 0;
  double x = (x0 > low && x0 < high) ? x0 : 0.5 * (low + high);
  for (int i = 0; i < max_iterations; ++i) {
    const ValueAndSlope here = f(x);
    if (here.value == 0) return x;
    // Shrink the bracket around the root.
    if ((here.value > 0) == rising) {
      high = x;
    } else {
      low = x;
    }
    double next = x - here.value / here.slope;
    if (!(next > low && next < high)) next = 0.5 * (low + high);  // also catches NaN
    const double step = std::fabs(next - x);
    x = next;
    if (step <= relative_tolerance * std::fabs(x) || high - low <= relative_tolerance * std::fabs(x)) {
      return x;
    }
  }
  throw Error(ErrorKind::no_convergence,
              fmt::format("{}: no convergence to {:.0e} within {} iterations (last {:.12g})", what,
                          relative_tolerance, max_iterations, x));
}

}  // namespace shaftwork::numerics

#include "shaftwork/numerics/root.hpp"

#include <cmath>

#include <boost/math/tools/roots.hpp>
#include <boost/math/tools/toms748_solve.hpp>
#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::numerics {

RootResult find_root(const std::function<double(double)>& f, double low, double high,
                     const std::string& what, const RootOptions& options) {
  const double f_low = f(low);
  const double f_high = f(high);
  if (!std::isfinite(f_low) || !std::isfinite(f_high)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: the function is not finite at the bracket [{:.6g}, {:.6g}]", what,
                            low, high));
  }
  if (f_low == 0) return {low, low, low, 0};
  if (f_high == 0) return {high, high, high, 0};
  if ((f_low > 0) == (f_high > 0)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: no solution between {:.6g} and {:.6g}", what, low, high));
  }
  const double tol = options.relative_tolerance;
  auto stop = [tol](double a, double b) {
    return std::fabs(b - a) <= tol * std::fmin(std::fabs(a), std::fabs(b)) || a == b;
  };
  std::uintmax_t iterations = options.max_iterations;
  auto [a, b] = boost::math::tools::toms748_solve(f, low, high, f_low, f_high, stop, iterations);
  if (iterations >= options.max_iterations && !stop(a, b)) {
    throw Error(ErrorKind::no_convergence,
                fmt::format("{}: no convergence to {:.0e} within {} iterations (bracket [{:.12g}, "
                            "{:.12g}])",
                            what, tol, options.max_iterations, a, b));
  }
  return {0.5 * (a + b), a, b, iterations};
}

}  // namespace shaftwork::numerics

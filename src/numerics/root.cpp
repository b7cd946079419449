#include "shaftwork/numerics/root.hpp"

#include <algorithm>
#include <cmath>
#include <utility>

#include <boost/math/policies/policy.hpp>
#include <boost/math/tools/toms748_solve.hpp>
#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::numerics {

namespace detail {

void check_bracket(double low, double high, const char* what) {
  if (!std::isfinite(low) || !std::isfinite(high)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: the search bracket [{:.6g}, {:.6g}] has an end that is not a finite number",
                            what, low, high));
  }
  if (low > high) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: the search bracket [{:.12g}, {:.12g}] is reversed (its low end lies above "
                            "its high end)",
                            what, low, high));
  }
}

void throw_not_finite(double x, double fx, const char* what) {
  throw Error(ErrorKind::out_of_range,
              fmt::format("{}: the function searched is not a finite number at {:.12g} (it gave {})", what, x, fx));
}

void throw_no_sign_change(double low, double high, const char* what) {
  throw Error(ErrorKind::out_of_range, fmt::format("{}: no solution between {:.6g} and {:.6g}", what, low, high));
}

void throw_no_convergence(const RootOptions& options, double low, double high, const char* what) {
  throw Error(ErrorKind::no_convergence,
              fmt::format("{}: no convergence to {:.0e} within {} iterations (bracket [{:.12g}, {:.12g}])", what,
                          options.relative_tolerance, options.max_iterations, low, high));
}

bool narrow_enough(double a, double b, const RootOptions& options) {
  const double tolerance =
      std::max(options.absolute_tolerance, options.relative_tolerance * std::fmin(std::fabs(a), std::fabs(b)));
  return std::fabs(b - a) <= tolerance || std::nextafter(a, b) == b || a == b;
}

}  // namespace detail

namespace {

// Boost reports its own errors (a bracket out of order or without a sign change) through
// this policy by returning NaN instead of throwing std::domain_error; find_root checks
// those conditions before calling, and turns a NaN that still comes back into an Error.
using BoostPolicy = boost::math::policies::policy<
    boost::math::policies::domain_error<boost::math::policies::ignore_error>,
    boost::math::policies::evaluation_error<boost::math::policies::ignore_error>,
    boost::math::policies::overflow_error<boost::math::policies::ignore_error>,
    boost::math::policies::pole_error<boost::math::policies::ignore_error>,
    boost::math::policies::rounding_error<boost::math::policies::ignore_error>>;

}  // namespace

RootResult find_root(const std::function<double(double)>& f, double low, double high, const std::string& what,
                     const RootOptions& options) {
  const char* name = what.c_str();
  detail::check_bracket(low, high, name);
  // Every value TOMS 748 sees is finite: a NaN would pass its sign tests as positive.
  auto finite_f = [&](double x) {
    const double fx = f(x);
    if (!std::isfinite(fx)) detail::throw_not_finite(x, fx, name);
    return fx;
  };
  const double f_low = finite_f(low);
  if (f_low == 0) return {low, low, low, 0};
  const double f_high = finite_f(high);
  if (f_high == 0) return {high, high, high, 0};
  if ((f_low > 0) == (f_high > 0)) detail::throw_no_sign_change(low, high, name);

  auto stop = [&options](double a, double b) { return detail::narrow_enough(a, b, options); };
  std::uintmax_t iterations = options.max_iterations;
  const auto [a, b] =
      boost::math::tools::toms748_solve(finite_f, low, high, f_low, f_high, stop, iterations, BoostPolicy());
  if (std::isnan(a) || std::isnan(b)) {
    // Only Boost's own domain checks give NaN, and they were made above; kept as a guard.
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: the root finder refused the bracket [{:.12g}, {:.12g}]", what, low, high));
  }
  if (!stop(a, b)) detail::throw_no_convergence(options, a, b, name);
  return {0.5 * (a + b), a, b, iterations};
}

}  // namespace shaftwork::numerics

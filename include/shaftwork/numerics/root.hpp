// shaftwork/numerics/root.hpp — bracketed scalar root finding with a contract.
//
// find_root() wraps Boost.Math's TOMS 748 (Alefeld, Potra & Shi, ACM TOMS 21 (1995)
// 327-344), which converges superlinearly and never leaves its bracket: a root is
// found whenever f(low) and f(high) differ in sign. Boost is used rather than a
// hand-written Brent because it is tested far more widely than we could test ours.
#pragma once

#include <cstdint>
#include <functional>
#include <string>

namespace shaftwork::numerics {

struct RootOptions {
  double relative_tolerance = 1e-12;  // on the bracket width, relative to |x|
  std::uintmax_t max_iterations = 200;
};

struct RootResult {
  double x = 0;            // best estimate of the root
  double low = 0;          // final bracket
  double high = 0;
  std::uintmax_t iterations = 0;
};

// Finds x in [low, high] with f(x) = 0. Throws shaftwork::Error:
//   bad_input      when f(low) and f(high) have the same sign (no root bracketed);
//                  the message says `what` and the bracket,
//   no_convergence when the budget is spent before the tolerance is met.
// `what` names the quantity sought, for messages ("outlet pressure").
RootResult find_root(const std::function<double(double)>& f, double low, double high,
                     const std::string& what, const RootOptions& options = {});

// Newton iteration safeguarded by a bracket (bisection when a step leaves it),
// for smooth monotone functions whose derivative is cheap: the hot path of the
// property models. f returns {value, derivative}. Converges when |dx| <= tol*|x|.
// Throws no_convergence after max_iterations.
struct ValueAndSlope {
  double value;
  double slope;
};

template <class F>
double newton_bracketed(F&& f, double x0, double low, double high, double relative_tolerance,
                        int max_iterations, const char* what);

}  // namespace shaftwork::numerics

#include "shaftwork/numerics/detail/newton_bracketed.ipp"

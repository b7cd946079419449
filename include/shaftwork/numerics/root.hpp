// shaftwork/numerics/root.hpp — bracketed scalar root finding with one contract.
//
// Two finders, one contract:
//   find_root()   Boost.Math's TOMS 748 (Alefeld, Potra & Shi, ACM TOMS 21 (1995)
//                 327-344): superlinear, never leaves its bracket, needs f alone.
//                 Boost is used rather than a hand-written Brent because it is tested
//                 far more widely than we could test ours.
//   newton_root() Newton's method safeguarded by the bracket (a bisection whenever a
//                 step would leave it), for smooth functions whose derivative is cheap:
//                 the hot path of the property models. Header-only, so that it inlines
//                 the caller's function object.
//
// The contract, shared by both:
// - In: a function, a bracket [low, high], `what` (the quantity sought, for messages,
//   e.g. "outlet pressure") and RootOptions (stopping rule and budget).
// - Out: RootResult: the root, the final bracket around it and the iterations used.
//   An end of the bracket where f is exactly 0 is returned at once (0 iterations).
// - Stopping rule: the bracket (or, for Newton, the last step) has shrunk to at most
//   max(absolute_tolerance, relative_tolerance * |x|), or to two neighbouring doubles.
// - Failures throw shaftwork::Error, and nothing else escapes from the finder itself
//   (Boost's own errors are returned by its error policy and turned into these):
//     bad_input      the bracket is unusable: an end is not finite, or low > high;
//     out_of_range   f(low) and f(high) have the same sign (no root in the bracket:
//                    "<what>: no solution between <low> and <high>"), or f is not a
//                    finite number somewhere it is evaluated;
//     no_convergence the budget (max_iterations evaluations after the two ends) is
//                    spent before the stopping rule is met.
//   Each message starts with `what` and names the values involved.
// - An exception thrown by f itself (a shaftwork::Error from a property model, say)
//   propagates unchanged.
#pragma once

#include <cstdint>
#include <functional>
#include <optional>
#include <string>

namespace shaftwork::numerics {

struct RootOptions {
  double relative_tolerance = 1e-12;  // on the bracket width, relative to |x|
  std::uintmax_t max_iterations = 200;
  double absolute_tolerance = 0;  // on the bracket width, for roots at or near 0 (last: {rtol, budget} still reads)
  // Newton's methods only: where known, a bound K on |f''| / (2 |f'|) over the bracket [1/x].
  // A step s then leaves the next x within K s^2 of the root, and the iteration ends at once
  // when that is below a quarter of the spacing of doubles at x (2^-54 |x|): another step
  // could move x by rounding alone. 0: unknown, the tolerances alone decide.
  double curvature = 0;
};

struct RootResult {
  double x = 0;  // best estimate of the root
  double low = 0;  // final bracket, low <= x <= high
  double high = 0;
  std::uintmax_t iterations = 0;  // evaluations of f after the two ends
};

// Finds x in [low, high] with f(x) = 0 by TOMS 748; see the contract above.
RootResult find_root(const std::function<double(double)>& f, double low, double high,
                     const std::string& what, const RootOptions& options = {});

// What newton_root's function returns at x: f(x) and f'(x).
struct ValueAndSlope {
  double value;
  double slope;
};

// Finds x in [low, high] with f(x).value = 0 by Newton's method from x0 (the middle of
// the bracket when x0 lies outside it), safeguarded by the bracket; see the contract
// above. A non-finite or zero slope only costs a bisection step.
template <class F>
RootResult newton_root(F&& f, double x0, double low, double high, const char* what,
                       const RootOptions& options = {});

// Newton's method for an f known to rise through one root in [low, high], from a start x0
// inside it that is usually close (an interpolated inverse): the steps of newton_root from
// x0, without evaluating f at the ends first. Returns the root newton_root returns, or empty
// where newton_root would bisect towards an end of the bracket, meet a non-finite f, or
// spend the budget; the caller then calls newton_root, which takes the same steps with its
// checks. (A bisection between two points already evaluated is taken, as newton_root takes
// it.) Nothing is checked about the bracket: where f(low) or f(high) is exactly 0,
// newton_root returns that end and this the Newton estimate beside it (within the tolerance).
template <class F>
std::optional<double> newton_from_start(F&& f, double x0, double low, double high, const RootOptions& options);

// newton_root(...).x with a relative tolerance alone: the spelling the property models use.
template <class F>
double newton_bracketed(F&& f, double x0, double low, double high, double relative_tolerance,
                        int max_iterations, const char* what);

namespace detail {
// The pieces of the contract both finders share (root.cpp), so that their checks and
// messages cannot drift apart.
void check_bracket(double low, double high, const char* what);                // bad_input
[[noreturn]] void throw_not_finite(double x, double fx, const char* what);     // out_of_range
[[noreturn]] void throw_no_sign_change(double low, double high, const char* what);  // out_of_range
[[noreturn]] void throw_no_convergence(const RootOptions& options, double low, double high,
                                       const char* what);                      // no_convergence
// The stopping rule: [a, b] is no wider than the tolerance at its ends allows.
bool narrow_enough(double a, double b, const RootOptions& options);
}  // namespace detail

}  // namespace shaftwork::numerics

#include "shaftwork/numerics/detail/newton_root.ipp"

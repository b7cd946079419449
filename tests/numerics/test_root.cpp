// The root finders' one contract (include/shaftwork/numerics/root.hpp), checked on both
// find_root (TOMS 748) and newton_root: roots of functions whose roots are known, the
// result's bracket and iteration count, the budget, and every failure with its kind and
// its whole message.
//
// Reference roots, each confirmed here to 30 digits with mpmath.findroot (mpmath 1.3):
// - cos x = x: the Dottie number 0.739085133215160641655... (OEIS A003957);
// - x^3 - 2x - 5 = 0: Wallis's cubic, the example of Newton's method in Wallis's Algebra
//   (1685), real root 2.094551481542326591482... (OEIS A007493, number from memory,
//   digits confirmed with mpmath);
// - e^x = 10: ln 10 = 2.302585092994045684017... (Abramowitz & Stegun, table 4.1 gives
//   ln 10 = 2.30258 50929 94045 68402).
#include <cmath>
#include <limits>
#include <optional>
#include <string>
#include <utility>

#include <catch2/catch.hpp>

#include "error_of.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/numerics/root.hpp"

using namespace shaftwork;
using numerics::RootOptions;
using numerics::RootResult;
using numerics::ValueAndSlope;
using test::error_of;

namespace {

constexpr double kDottie = 0.7390851332151606416553;
constexpr double kWallis = 2.0945514815423265914824;
constexpr double kLn10 = 2.3025850929940456840180;
const double kNaN = std::numeric_limits<double>::quiet_NaN();
const double kInf = std::numeric_limits<double>::infinity();

// The same function for both finders: value for find_root, value and slope for newton_root.
struct Fn {
  double (*value)(double);
  double (*slope)(double);
};
const Fn kDottieFn{[](double x) { return std::cos(x) - x; }, [](double x) { return -std::sin(x) - 1; }};
const Fn kWallisFn{[](double x) { return x * x * x - 2 * x - 5; }, [](double x) { return 3 * x * x - 2; }};
const Fn kExpFn{[](double x) { return std::exp(x) - 10; }, [](double x) { return std::exp(x); }};

enum class Finder { toms748, newton };

RootResult solve(Finder finder, const Fn& fn, double low, double high, const RootOptions& options = {}) {
  if (finder == Finder::toms748) return numerics::find_root(fn.value, low, high, "x", options);
  auto f = [&fn](double x) { return ValueAndSlope{fn.value(x), fn.slope(x)}; };
  return numerics::newton_root(f, 0.5 * (low + high), low, high, "x", options);
}

}  // namespace

TEST_CASE("both finders find known roots within the tolerance, inside their bracket") {
  for (const Finder finder : {Finder::toms748, Finder::newton}) {
    CAPTURE(finder == Finder::toms748 ? "toms748" : "newton");
    struct Known {
      const Fn& fn;
      double low, high, root;
    };
    for (const Known& k : {Known{kDottieFn, 0.0, 1.0, kDottie}, Known{kWallisFn, 2.0, 3.0, kWallis},
                           Known{kExpFn, 0.0, 5.0, kLn10}}) {
      RootOptions options;
      options.relative_tolerance = 1e-14;
      const RootResult r = solve(finder, k.fn, k.low, k.high, options);
      CAPTURE(r.x, r.low, r.high, r.iterations);
      CHECK(std::fabs(r.x - k.root) <= 4e-14 * k.root);
      CHECK(r.low <= r.x);
      CHECK(r.x <= r.high);
      CHECK(r.low >= k.low);
      CHECK(r.high <= k.high);
      CHECK(r.iterations >= 1);
      CHECK(r.iterations <= options.max_iterations);
    }
  }
}

TEST_CASE("the tolerance sets how far the finder goes: a looser one takes fewer evaluations") {
  for (const Finder finder : {Finder::toms748, Finder::newton}) {
    RootOptions loose;
    loose.relative_tolerance = 1e-4;
    RootOptions tight;
    tight.relative_tolerance = 1e-14;
    const RootResult a = solve(finder, kWallisFn, 2.0, 3.0, loose);
    const RootResult b = solve(finder, kWallisFn, 2.0, 3.0, tight);
    CHECK(std::fabs(a.x - kWallis) <= 1e-4 * kWallis);
    CHECK(a.iterations < b.iterations);
  }
}

TEST_CASE("a root at 0 is found with an absolute tolerance") {
  for (const Finder finder : {Finder::toms748, Finder::newton}) {
    RootOptions options;
    options.absolute_tolerance = 1e-12;
    const Fn sine{[](double x) { return std::sin(x); }, [](double x) { return std::cos(x); }};
    const RootResult r = solve(finder, sine, -1.0, 2.0, options);
    CHECK(std::fabs(r.x) <= 1e-12);
  }
}

TEST_CASE("a tolerance below the spacing of doubles stops at neighbouring doubles, not at the budget") {
  for (const Finder finder : {Finder::toms748, Finder::newton}) {
    RootOptions options;
    options.relative_tolerance = 1e-30;
    const RootResult r = solve(finder, kWallisFn, 2.0, 3.0, options);
    CHECK(std::fabs(r.x - kWallis) <= 4.5e-16 * kWallis);
    CHECK(r.iterations < options.max_iterations);
  }
}

TEST_CASE("an end of the bracket that is a root is returned at once") {
  const Fn line{[](double x) { return x - 1; }, [](double) { return 1.0; }};
  for (const Finder finder : {Finder::toms748, Finder::newton}) {
    const RootResult at_low = solve(finder, line, 1.0, 4.0);
    CHECK(at_low.x == 1.0);
    CHECK(at_low.iterations == 0);
    const RootResult at_high = solve(finder, line, -3.0, 1.0);
    CHECK(at_high.x == 1.0);
    CHECK(at_high.iterations == 0);
    const RootResult equal_ends = solve(finder, line, 1.0, 1.0);
    CHECK(equal_ends.x == 1.0);
  }
}

TEST_CASE("a spent budget is no_convergence, naming the bracket reached") {
  RootOptions options;
  options.max_iterations = 3;
  options.relative_tolerance = 1e-15;
  const Error toms = error_of([&] { solve(Finder::toms748, kExpFn, 0.0, 5.0, options); });
  CHECK(toms.kind() == ErrorKind::no_convergence);
  CHECK_THAT(toms.what(), Catch::StartsWith("x: no convergence to 1e-15 within 3 iterations (bracket ["));
  // Newton with a zero slope everywhere bisects: three halvings of [0, 8] leave [2, 3].
  const Fn flat{[](double x) { return x - 2.5; }, [](double) { return 0.0; }};
  const Error newton = error_of([&] { solve(Finder::newton, flat, 0.0, 8.0, options); });
  CHECK(newton.kind() == ErrorKind::no_convergence);
  CHECK(std::string(newton.what()) == "x: no convergence to 1e-15 within 3 iterations (bracket [2, 3])");
  // A budget of nothing at all.
  options.max_iterations = 0;
  CHECK(error_of([&] { solve(Finder::toms748, kExpFn, 0.0, 5.0, options); }).kind() == ErrorKind::no_convergence);
  CHECK(error_of([&] { solve(Finder::newton, kExpFn, 0.0, 5.0, options); }).kind() == ErrorKind::no_convergence);
}

TEST_CASE("no sign change over the bracket: out_of_range, the same message from both finders") {
  const Fn above{[](double x) { return x * x + 1; }, [](double x) { return 2 * x; }};
  for (const Finder finder : {Finder::toms748, Finder::newton}) {
    const Error e = error_of([&] { solve(finder, above, -1.0, 2.5); });
    CHECK(e.kind() == ErrorKind::out_of_range);
    CHECK(std::string(e.what()) == "x: no solution between -1 and 2.5");
    const Error equal = error_of([&] { solve(finder, above, 2.0, 2.0); });
    CHECK(equal.kind() == ErrorKind::out_of_range);
    CHECK(std::string(equal.what()) == "x: no solution between 2 and 2");
  }
}

TEST_CASE("a reversed or non-finite bracket is bad_input, before f is called") {
  int calls = 0;
  const auto counted = [&calls](double x) {
    ++calls;
    return x - 1;
  };
  const auto counted_newton = [&calls](double x) {
    ++calls;
    return ValueAndSlope{x - 1, 1};
  };
  struct Bracket {
    double low, high;
    const char* message;
  };
  for (const Bracket& b : {
           Bracket{3.0, 0.0, "x: the search bracket [3, 0] is reversed (its low end lies above its high end)"},
           Bracket{kNaN, 2.0, "x: the search bracket [nan, 2] has an end that is not a finite number"},
           Bracket{0.0, kInf, "x: the search bracket [0, inf] has an end that is not a finite number"},
           Bracket{-kInf, kInf, "x: the search bracket [-inf, inf] has an end that is not a finite number"},
       }) {
    const Error toms = error_of([&] { numerics::find_root(counted, b.low, b.high, "x"); });
    CHECK(toms.kind() == ErrorKind::bad_input);
    CHECK(std::string(toms.what()) == b.message);
    const Error newton = error_of([&] { numerics::newton_root(counted_newton, 1.0, b.low, b.high, "x"); });
    CHECK(newton.kind() == ErrorKind::bad_input);
    CHECK(std::string(newton.what()) == b.message);
  }
  CHECK(calls == 0);
}

TEST_CASE("a NaN or infinity from f is out_of_range naming where, at an end or inside") {
  const Fn nan_at_end{[](double x) { return x < 0.5 ? kNaN : x - 1; }, [](double) { return 1.0; }};
  const Fn nan_inside{[](double x) { return (x > 0.3 && x < 0.9) ? kNaN : x - 0.5; }, [](double) { return 1.0; }};
  const Fn inf_inside{[](double x) { return (x > 0.3 && x < 0.9) ? -kInf : x - 0.5; }, [](double) { return 1.0; }};
  for (const Finder finder : {Finder::toms748, Finder::newton}) {
    const Error end = error_of([&] { solve(finder, nan_at_end, 0.0, 2.0); });
    CHECK(end.kind() == ErrorKind::out_of_range);
    CHECK(std::string(end.what()) == "x: the function searched is not a finite number at 0 (it gave nan)");
    const Error inside = error_of([&] { solve(finder, nan_inside, 0.0, 1.0); });
    CHECK(inside.kind() == ErrorKind::out_of_range);
    CHECK_THAT(inside.what(), Catch::StartsWith("x: the function searched is not a finite number at 0."));
    CHECK_THAT(inside.what(), Catch::EndsWith("(it gave nan)"));
    const Error infinite = error_of([&] { solve(finder, inf_inside, 0.0, 1.0); });
    CHECK_THAT(infinite.what(), Catch::EndsWith("(it gave -inf)"));
  }
}

TEST_CASE("an Error thrown by f passes through unchanged") {
  const auto throws_inside = [](double x) -> double {
    if (x > 0.2 && x < 0.8) throw Error(ErrorKind::not_available, "model: no state at this point");
    return x - 0.5;
  };
  const Error toms = error_of([&] { numerics::find_root(throws_inside, 0.0, 1.0, "x"); });
  CHECK(toms.kind() == ErrorKind::not_available);
  CHECK(std::string(toms.what()) == "model: no state at this point");
  const auto throws_newton = [&](double x) { return ValueAndSlope{throws_inside(x), 1.0}; };
  const Error newton = error_of([&] { numerics::newton_root(throws_newton, 0.5, 0.0, 1.0, "x"); });
  CHECK(newton.kind() == ErrorKind::not_available);
  CHECK(std::string(newton.what()) == "model: no state at this point");
}

TEST_CASE("newton_root: a start outside the bracket begins at its middle; a wild slope costs a bisection") {
  int calls = 0;
  const auto f = [&calls](double x) {
    ++calls;
    return ValueAndSlope{std::cos(x) - x, 1e-300};  // every Newton step would leave the bracket
  };
  const RootResult r = numerics::newton_root(f, 99.0, 0.0, 1.0, "x");
  CHECK(std::fabs(r.x - kDottie) <= 1e-12 * kDottie);
  CHECK(r.iterations + 2 == static_cast<std::uintmax_t>(calls));
}

TEST_CASE("newton_bracketed is newton_root's root with a relative tolerance and budget") {
  const auto f = [](double x) { return ValueAndSlope{x * x * x - 2 * x - 5, 3 * x * x - 2}; };
  RootOptions options;
  options.relative_tolerance = 1e-10;
  options.max_iterations = 50;
  CHECK(numerics::newton_bracketed(f, 2.5, 2.0, 3.0, 1e-10, 50, "x") ==
        numerics::newton_root(f, 2.5, 2.0, 3.0, "x", options).x);
  const Error e = error_of([&] { numerics::newton_bracketed(f, 2.5, 3.0, 4.0, 1e-10, 50, "wallis"); });
  CHECK(e.kind() == ErrorKind::out_of_range);
  CHECK(std::string(e.what()) == "wallis: no solution between 3 and 4");
}

TEST_CASE("newton_from_start: newton_root's root from a close start, without the ends") {
  // Wallis's cubic and e^x = 10 rise through their roots (reference roots at the top).
  for (const Fn* fn : {&kWallisFn, &kExpFn}) {
    int calls = 0;
    const auto f = [&](double x) {
      ++calls;
      return ValueAndSlope{fn->value(x), fn->slope(x)};
    };
    const double root = fn == &kWallisFn ? kWallis : kLn10;
    RootOptions options;
    options.relative_tolerance = 1e-10;  // the property models' tolerance
    const double start = root * (1 + 1e-3);
    const std::optional<double> x = numerics::newton_from_start(f, start, 1.0, 4.0, options);
    REQUIRE(x.has_value());
    CHECK(std::fabs(*x - root) <= 1e-10 * root);
    const int unchecked_calls = calls;
    calls = 0;
    const RootResult checked = numerics::newton_root(f, start, 1.0, 4.0, "x", options);
    CHECK(*x == checked.x);  // the same steps, bit for bit
    CHECK(unchecked_calls + 2 == calls);  // less the two ends
    CHECK(checked.iterations == static_cast<std::uintmax_t>(unchecked_calls));
  }
}

TEST_CASE("newton_from_start: empty where newton_root would bisect, meet a non-finite f or spend its budget") {
  const auto wallis = [](double x) { return ValueAndSlope{kWallisFn.value(x), kWallisFn.slope(x)}; };
  // From 1.0 (slope 1) the first step goes to 7, beyond the bracket's high end 3.
  CHECK_FALSE(numerics::newton_from_start(wallis, 1.0, 0.5, 3.0, {}).has_value());
  // A start outside the bracket, or on an end.
  CHECK_FALSE(numerics::newton_from_start(wallis, 3.5, 2.0, 3.0, {}).has_value());
  CHECK_FALSE(numerics::newton_from_start(wallis, 2.0, 2.0, 3.0, {}).has_value());
  const auto nan_inside = [](double x) { return ValueAndSlope{x > 0.3 && x < 0.9 ? kNaN : x - 0.5, 1.0}; };
  CHECK_FALSE(numerics::newton_from_start(nan_inside, 0.6, 0.0, 1.0, {}).has_value());
  RootOptions two_steps;
  two_steps.max_iterations = 2;
  two_steps.relative_tolerance = 1e-15;
  CHECK_FALSE(numerics::newton_from_start(wallis, 2.9, 2.0, 3.0, two_steps).has_value());
  // Steps that settle only by rounding onto an end never evaluated (e^x = 10 from above,
  // at 1e-15): newton_root bisects towards that end; this form leaves it to newton_root.
  const auto exp10 = [](double x) { return ValueAndSlope{kExpFn.value(x), kExpFn.slope(x)}; };
  RootOptions tight;
  tight.relative_tolerance = 1e-15;
  CHECK_FALSE(numerics::newton_from_start(exp10, kLn10 * (1 + 1e-3), 1.0, 4.0, tight).has_value());
  // The exact root as the start is returned as it is.
  const auto line = [](double x) { return ValueAndSlope{2 * x - 1, 2.0}; };
  CHECK(numerics::newton_from_start(line, 0.5, 0.0, 1.0, {}) == std::optional<double>(0.5));
}

TEST_CASE("a curvature bound ends Newton's iteration once a step leaves x settled") {
  // e^x = 10: f''/(2 f') = 1/2 everywhere. From 1e-5 below the root the first step lands within
  // about 3e-10, the second within rounding; with the bound the third evaluation is not
  // needed, since (1/2) s^2 of the second step (about 4e-20) is far below 2^-54 x.
  int calls = 0;
  const auto f = [&](double x) {
    ++calls;
    return ValueAndSlope{kExpFn.value(x), kExpFn.slope(x)};
  };
  RootOptions plain;
  plain.relative_tolerance = 1e-12;
  RootOptions bounded = plain;
  bounded.curvature = 0.5;
  const double start = kLn10 * (1 - 1e-5);  // from below: from above, rounding ends it on an unevaluated end
  const std::optional<double> x_plain = numerics::newton_from_start(f, start, 1.0, 4.0, plain);
  const int plain_calls = std::exchange(calls, 0);
  const std::optional<double> x_bounded = numerics::newton_from_start(f, start, 1.0, 4.0, bounded);
  REQUIRE(x_plain.has_value());
  REQUIRE(x_bounded.has_value());
  CHECK(calls < plain_calls);
  // Within a last bit of the reference root, as the plain iteration is.
  CHECK(std::fabs(*x_bounded - kLn10) <= std::nextafter(kLn10, 4.0) - kLn10);
  CHECK(std::fabs(*x_plain - kLn10) <= std::nextafter(kLn10, 4.0) - kLn10);
  // A bound that holds nowhere near (the step's error would not be below rounding) leaves
  // the tolerance to decide: the same root and count as without it.
  calls = 0;
  RootOptions weak = plain;
  weak.curvature = 1e30;
  CHECK(numerics::newton_from_start(f, start, 1.0, 4.0, weak) == x_plain);
  CHECK(calls == plain_calls);
}

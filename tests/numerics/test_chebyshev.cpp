// numerics::ChebyshevLobatto and numerics::dense_solve against exact results.
#include <array>
#include <cmath>
#include <string>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/numerics/chebyshev.hpp"
#include "shaftwork/numerics/dense_solve.hpp"

using shaftwork::numerics::ChebyshevLobatto;

TEST_CASE("Chebyshev-Lobatto points run from 0 to 1, clustered at the ends", "[chebyshev]") {
  const ChebyshevLobatto<12> rule;
  CHECK(rule.node(0) == 0.0);
  CHECK(rule.node(12) == Approx(1.0).epsilon(1e-15));
  CHECK(rule.node(6) == Approx(0.5).epsilon(1e-15));
  CHECK(rule.node(1) == Approx((1 - std::cos(M_PI / 12)) / 2).epsilon(1e-15));
}

TEST_CASE("the cumulative integral is exact for polynomials up to the degree", "[chebyshev]") {
  const ChebyshevLobatto<12> rule;
  for (int power = 0; power <= 12; ++power) {
    INFO("t^" << power);
    ChebyshevLobatto<12>::Values f;
    for (int j = 0; j <= 12; ++j) f[static_cast<std::size_t>(j)] = std::pow(rule.node(j), power);
    for (int k = 0; k <= 12; ++k) {
      double integral = 0;
      for (int j = 0; j <= 12; ++j) integral += rule.integral_weight(k, j) * f[static_cast<std::size_t>(j)];
      CHECK(integral == Approx(std::pow(rule.node(k), power + 1) / (power + 1)).margin(1e-15));
    }
  }
}

TEST_CASE("for exp(t) the integral converges geometrically: degree 12 to rounding", "[chebyshev]") {
  const ChebyshevLobatto<12> rule;
  ChebyshevLobatto<12>::Values f;
  for (int j = 0; j <= 12; ++j) f[static_cast<std::size_t>(j)] = std::exp(rule.node(j));
  double integral = 0;
  for (int j = 0; j <= 12; ++j) integral += rule.integral_weight(12, j) * f[static_cast<std::size_t>(j)];
  CHECK(std::fabs(integral - (std::exp(1.0) - 1)) < 1e-15);
  // The last coefficients tell how far the series has fallen: exp's fall like 1/(2^m m!).
  const auto a = rule.coefficients(f);
  CHECK(std::fabs(a[12]) < 1e-15);
  CHECK(std::fabs(a[4]) > 1e-6);
}

TEST_CASE("interpolation gives the nodal values back and extrapolates a polynomial exactly", "[chebyshev]") {
  const ChebyshevLobatto<8> rule;
  ChebyshevLobatto<8>::Values f;
  auto cubic = [](double t) { return 2 - 3 * t + 0.5 * t * t * t; };
  for (int j = 0; j <= 8; ++j) f[static_cast<std::size_t>(j)] = cubic(rule.node(j));
  for (int j = 0; j <= 8; ++j) CHECK(rule.interpolate(f, rule.node(j)) == Approx(f[static_cast<std::size_t>(j)]).margin(1e-14));
  CHECK(rule.interpolate(f, 0.3) == Approx(cubic(0.3)).epsilon(1e-14));
  CHECK(rule.interpolate(f, 1.2) == Approx(cubic(1.2)).margin(1e-12));
  CHECK(rule.interpolate(f, -0.1) == Approx(cubic(-0.1)).margin(1e-12));
}

TEST_CASE("dense_solve solves with pivoting and refuses a singular matrix", "[dense]") {
  // A x = b with x = (1, -2, 3) in two right-hand sides (the second 2 x); a zero first pivot.
  std::array<std::array<double, 3>, 3> A{{{0, 2, 1}, {1, 1, 1}, {4, -1, 2}}};
  std::array<std::array<double, 2>, 3> b{{{-1, -2}, {2, 4}, {12, 24}}};
  shaftwork::numerics::dense_solve(A, b, "test system");
  CHECK(b[0][0] == Approx(1).epsilon(1e-14));
  CHECK(b[1][0] == Approx(-2).epsilon(1e-14));
  CHECK(b[2][0] == Approx(3).epsilon(1e-14));
  CHECK(b[2][1] == Approx(6).epsilon(1e-14));
  std::array<std::array<double, 2>, 2> S{{{1, 2}, {2, 4}}};
  std::array<std::array<double, 1>, 2> c{{{1}, {2}}};
  CHECK_THROWS_WITH(shaftwork::numerics::dense_solve(S, c, "test system"), "test system: singular linear system");
}

// The folded NASA polynomial of an ideal-gas mixture (internal to the fluids layer).
//
// IdealGasMixture builds this once; NasaPolynomialGas and CubicGas evaluate it inline.
// Each piece is pre-scaled for Horner evaluation (per mole of mixture, divided by R):
//   cp/R = c0/T^2 + c1/T + c2 + T (c3 + T (c4 + T (c5 + T c6)))
//   H/R  = -c0/T + c1 ln T + T (c2 + T (c3/2 + T (c4/3 + T (c5/4 + T c6/5)))) + b1
//   S/R  = -c0/(2T^2) - c1/T + c2 ln T + T (c3 + T (c4/2 + T (c5/3 + T c6/4))) + b2
// (McBride, Zehe & Gordon, NASA/TP-2002-211556, eqs. 2-4, with the mixing entropy
// -sum y ln y in b2). A grid of cells of about 4 % in T gives the inverse solves a
// starting point by cubic Hermite interpolation of T(S°) or T(H°).
#pragma once

#include <algorithm>
#include <array>
#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include "shaftwork/fluids/nasa_polynomial.hpp"
#include "shaftwork/numerics/root.hpp"

namespace shaftwork::fluids::detail {

struct MixturePiece {
  double t_low = 0;
  double t_high = 0;
  std::array<double, 7> c{};
  std::array<double, 4> h{};  // c3/2, c4/3, c5/4, c6/5
  std::array<double, 3> s{};  // c4/2, c5/3, c6/4
  double half_c0 = 0;
  double b1 = 0;
  double b2 = 0;
};

struct MixtureValues {
  double cp_r;  // cp°/R
  double h_r;   // H°/R, K
  double s_r;   // S°/R at p° (mixing term included)
};

inline MixtureValues evaluate(const MixturePiece& q, double T) {
  const double inv_t = 1.0 / T;
  const double ln_t = std::log(T);
  const auto& c = q.c;
  MixtureValues v;
  v.cp_r = inv_t * (c[0] * inv_t + c[1]) + c[2] + T * (c[3] + T * (c[4] + T * (c[5] + T * c[6])));
  v.h_r = -c[0] * inv_t + c[1] * ln_t +
          T * (c[2] + T * (q.h[0] + T * (q.h[1] + T * (q.h[2] + T * q.h[3])))) + q.b1;
  v.s_r = -inv_t * (q.half_c0 * inv_t + c[1]) + c[2] * ln_t +
          T * (c[3] + T * (q.s[0] + T * (q.s[1] + T * q.s[2]))) + q.b2;
  return v;
}

// One grid cell [t0, t1] within a single piece, for the starting guesses of the inverse solves.
struct MixtureCell {
  double t0, t1;
  double s0, s1, dtds0, dtds1;  // S°/R at the ends and dT/d(S°/R) = T/(cp°/R)
  double h0, h1, dtdh0, dtdh1;  // H°/R at the ends and dT/d(H°/R) = 1/(cp°/R)
};

// Cubic Hermite interpolation of the inverse function T(y) on [y0, y1].
inline double hermite(double y, double y0, double y1, double x0, double x1, double m0, double m1) {
  const double dy = y1 - y0;
  const double t = (y - y0) / dy;
  const double t2 = t * t;
  const double t3 = t2 * t;
  return (2 * t3 - 3 * t2 + 1) * x0 + (t3 - 2 * t2 + t) * dy * m0 + (-2 * t3 + 3 * t2) * x1 +
         (t3 - t2) * dy * m1;
}

struct IdealGasMixtureData {
  static constexpr double kTolerance = 1e-10;  // relative, on T, of the inverse solves
  static constexpr int kMaxIterations = 60;    // Newton steps (each falls back to bisection)

  std::vector<MixturePiece> pieces;
  std::vector<MixtureCell> cells;
  std::vector<double> s_grid;  // S°/R at cells[k].t0, then at the last cell's t1
  std::vector<double> h_grid;  // H°/R likewise
  double molar_mass = 0;       // kg/mol
  double gas_constant = 0;     // J/(kg K)
  Range range;
  std::vector<std::pair<std::string, double>> mole_fractions;
  std::vector<NasaSpecies> species;
  bool renormalised = false;
  double given_sum = 0;
  std::string label;           // "<model> N2" or "<model> mixture of ..."
  std::string description;
  std::string solve_h_label;   // for no_convergence messages
  std::string solve_s_label;

  const MixturePiece& piece_at(double T) const {
    std::size_t i = 0;
    while (i + 1 < pieces.size() && T >= pieces[i + 1].t_low) ++i;
    return pieces[i];
  }

  MixtureValues at(double T) const { return evaluate(piece_at(T), T); }

  // The grid cell whose [y(t0), y(t1)] holds `target`, for a grid in ascending order.
  std::size_t cell_of(const std::vector<double>& grid, double target) const {
    const auto above = std::upper_bound(grid.begin(), grid.end(), target);
    const auto k = static_cast<std::size_t>(std::max<std::ptrdiff_t>(above - grid.begin() - 1, 0));
    return std::min(k, cells.size() - 1);
  }

  // The temperature at which H°/R (by_entropy false) or S°/R at p° (true) reaches `target`:
  // a Hermite guess in its grid cell, then Newton within the neighbouring cells (safeguarded
  // by them where the plain steps stray).
  // A target outside the grid by no more than `slack` (a state the model gave at an end of
  // its range, rounded) stands for that end; further out, `refuse(below)` is called, which
  // throws the caller's out-of-range error (or returns for the optional form).
  template <class Refuse>
  double temperature_for(double target, bool by_entropy, double slack, Refuse refuse) const {
    const std::vector<double>& grid = by_entropy ? s_grid : h_grid;
    if (!(target >= grid.front() && target <= grid.back())) {
      if (target < grid.front() && target >= grid.front() - slack) return range.low;
      if (target > grid.back() && target <= grid.back() + slack) return range.high;
      return refuse(target < grid.front());
    }
    const std::size_t k = cell_of(grid, target);
    const MixtureCell& c = cells[k];
    const double low = cells[k == 0 ? 0 : k - 1].t0;
    const double high = cells[std::min(k + 1, cells.size() - 1)].t1;
    numerics::RootOptions options;
    options.relative_tolerance = kTolerance;
    options.max_iterations = kMaxIterations;
    // Both functions rise with T (cp > 0) and cross the target within the neighbouring
    // cells, so the steps from the guess need no evaluation at the ends unless they stray.
    const auto solve = [&](const auto& f, double guess, const std::string& what) {
      if (const auto t = numerics::newton_from_start(f, guess, low, high, options)) return *t;
      return numerics::newton_root(f, guess, low, high, what.c_str(), options).x;
    };
    if (by_entropy) {
      const auto f = [&](double t) {
        const MixtureValues v = at(t);
        return numerics::ValueAndSlope{v.s_r - target, v.cp_r / t};
      };
      return solve(f, hermite(target, c.s0, c.s1, c.t0, c.t1, c.dtds0, c.dtds1), solve_s_label);
    }
    const auto f = [&](double t) {
      const MixtureValues v = at(t);
      return numerics::ValueAndSlope{v.h_r - target, v.cp_r};
    };
    return solve(f, hermite(target, c.h0, c.h1, c.t0, c.t1, c.dtdh0, c.dtdh1), solve_h_label);
  }
};

}  // namespace shaftwork::fluids::detail

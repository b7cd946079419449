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

// ln_t = ln T, when the caller has it already (log_near, MixtureCell::log_of).
inline MixtureValues evaluate(const MixturePiece& q, double T, double ln_t) {
  const double inv_t = 1.0 / T;
  const auto& c = q.c;
  MixtureValues v;
  v.cp_r = inv_t * (c[0] * inv_t + c[1]) + c[2] + T * (c[3] + T * (c[4] + T * (c[5] + T * c[6])));
  v.h_r = -c[0] * inv_t + c[1] * ln_t +
          T * (c[2] + T * (q.h[0] + T * (q.h[1] + T * (q.h[2] + T * q.h[3])))) + q.b1;
  v.s_r = -inv_t * (q.half_c0 * inv_t + c[1]) + c[2] * ln_t +
          T * (c[3] + T * (q.s[0] + T * (q.s[1] + T * q.s[2]))) + q.b2;
  return v;
}

inline MixtureValues evaluate(const MixturePiece& q, double T) { return evaluate(q, T, std::log(T)); }

// A temperature whose logarithm is known, for the logarithms of the temperatures next to it.
struct LogAnchor {
  double t;
  double inv_t;  // 1/t
  double ln_t;   // ln t
};

// ln T from an anchor a close to T: ln a.t + log1p(u), u = (T - a.t)/a.t, by the series
// u - u^2/2 + u^3/3, whose remainder is below u^4/(4 (1 - |u|)): under 2.6e-21 for
// |u| <= 1e-5, against a last bit of ln T of 4.4e-16 or more (T > 7.4 K). T - a.t is exact
// (Sterbenz), u carries two roundings, so the result is ln a.t plus one rounding. Farther
// from the anchor, std::log(T), and T becomes the anchor. The Newton steps of the inverse
// solves move T by 1e-8 relative or less after the Hermite guess, so only the guess needs
// a logarithm of its own.
inline double log_near(double T, LogAnchor& a) {
  constexpr double kSeriesLimit = 1e-5;
  const double u = (T - a.t) * a.inv_t;
  if (std::fabs(u) <= kSeriesLimit) return a.ln_t + u * (1.0 - u * (0.5 - u * (1.0 / 3.0)));
  a = {T, 1.0 / T, std::log(T)};
  return a.ln_t;
}

// One grid cell [t0, t1] within a single piece, for the starting guesses of the inverse solves.
struct MixtureCell {
  double t0, t1;
  double s0, s1, dtds0, dtds1;  // S°/R at the ends and dT/d(S°/R) = T/(cp°/R)
  double h0, h1, dtdh0, dtdh1;  // H°/R at the ends and dT/d(H°/R) = 1/(cp°/R)
  double tm;                    // (t0 + t1)/2
  double ln_tm, ln_tm_low;      // ln tm in two parts (ln_tm + ln_tm_low, from long double)

  // ln T for T in or near the cell: ln tm + 2 atanh(z), z = (T - tm)/(T + tm), by the
  // series 2 (z + z^3/3 + z^5/5 + z^7/7), whose remainder is below 2 z^9/(9 (1 - z^2)):
  // under 5.3e-19 for |z| <= 0.011 (a cell spans 4 % in T, so |z| <= 0.01 within it),
  // against a last bit of ln T of 4.4e-16 or more (T > 7.4 K). T - tm is exact (Sterbenz);
  // the roundings of z and of the series come to about 1e-17 and ln tm + ln_tm_low is
  // within 1e-18 of ln tm, so the result carries one rounding, as std::log's does.
  // Farther out, std::log(T).
  double log_of(double T) const {
    constexpr double kSeriesLimit = 0.011;
    const double z = (T - tm) / (T + tm);
    if (!(std::fabs(z) <= kSeriesLimit)) return std::log(T);
    const double z2 = z * z;
    const double series = 2.0 * z * (1.0 + z2 * (1.0 / 3.0 + z2 * (1.0 / 5.0 + z2 * (1.0 / 7.0))));
    return ln_tm + (ln_tm_low + series);
  }
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
  // Bounds on |f''| / (2 |f'|) of the inverse solves' functions, S°/R(T) and H°/R(T), over
  // the whole range (numerics::RootOptions::curvature): (1/2) |cp°'/cp° - 1/T| and
  // (1/2) |cp°'/cp°|, sampled densely when the grid is built, with a margin.
  double curvature_s = 0;
  double curvature_h = 0;

  const MixturePiece& piece_at(double T) const {
    std::size_t i = 0;
    while (i + 1 < pieces.size() && T >= pieces[i + 1].t_low) ++i;
    return pieces[i];
  }

  MixtureValues at(double T) const { return evaluate(piece_at(T), T); }
  MixtureValues at(double T, double ln_t) const { return evaluate(piece_at(T), T, ln_t); }

  // The grid cell whose [y(t0), y(t1)] holds `target`, for a grid in ascending order.
  // (A branch-free search, its halving a conditional move, took 24 instructions a batch row
  // fewer, but bm_from_ps took 91 ns against 61-68: each step's load then waits on the last.)
  std::size_t cell_of(const std::vector<double>& grid, double target) const {
    const auto above = std::upper_bound(grid.begin(), grid.end(), target);
    const auto k = static_cast<std::size_t>(std::max<std::ptrdiff_t>(above - grid.begin() - 1, 0));
    return std::min(k, cells.size() - 1);
  }

  // A temperature and its logarithm (solve_temperature's result).
  struct TemperatureAndLog {
    double t;
    double ln_t;
  };

  // The temperature at which H°/R (by_entropy false) or S°/R at p° (true) reaches `target`:
  // a Hermite guess in its grid cell, then Newton within the neighbouring cells (safeguarded
  // by them where the plain steps stray), and ln T of the result for the state calls.
  // Only the guess takes a logarithm from scratch (the cell's series, MixtureCell::log_of);
  // the steps' and the result's come from it (log_near), unless newton_root takes over.
  // A target outside the grid by no more than `slack` (a state the model gave at an end of
  // its range, rounded) stands for that end; further out, `refuse(below)` is called, which
  // throws the caller's out-of-range error (or returns for the optional form).
  template <class Refuse>
  TemperatureAndLog solve_temperature(double target, bool by_entropy, double slack, Refuse refuse) const {
    const std::vector<double>& grid = by_entropy ? s_grid : h_grid;
    if (!(target >= grid.front() && target <= grid.back())) {
      double t = 0;
      if (target < grid.front() && target >= grid.front() - slack) {
        t = range.low;
      } else if (target > grid.back() && target <= grid.back() + slack) {
        t = range.high;
      } else {
        t = refuse(target < grid.front());
      }
      return {t, std::log(t)};
    }
    const std::size_t k = cell_of(grid, target);
    const MixtureCell& c = cells[k];
    const double low = cells[k == 0 ? 0 : k - 1].t0;
    const double high = cells[std::min(k + 1, cells.size() - 1)].t1;
    numerics::RootOptions options;
    options.relative_tolerance = kTolerance;
    options.max_iterations = kMaxIterations;
    options.curvature = by_entropy ? curvature_s : curvature_h;
    const double guess = by_entropy ? hermite(target, c.s0, c.s1, c.t0, c.t1, c.dtds0, c.dtds1)
                                    : hermite(target, c.h0, c.h1, c.t0, c.t1, c.dtdh0, c.dtdh1);
    LogAnchor anchor{guess, 1.0 / guess, c.log_of(guess)};
    // Both functions rise with T (cp > 0) and cross the target within the neighbouring
    // cells, so the steps from the guess need no evaluation at the ends unless they stray.
    // Where they do, newton_root's checked steps take std::log, as the grid and the state
    // calls do, so that the signs at the bracket's ends are the grid's (a root at an end of
    // the range gives exactly 0 there, not a last bit either side).
    const auto solve = [&](const auto& value, const std::string& what) -> TemperatureAndLog {
      const auto near = [&](double t) { return value(t, at(t, log_near(t, anchor))); };
      if (const auto t = numerics::newton_from_start(near, guess, low, high, options)) {
        return {*t, log_near(*t, anchor)};
      }
      const auto plain = [&](double t) { return value(t, at(t)); };
      const double root = numerics::newton_root(plain, guess, low, high, what.c_str(), options).x;
      return {root, std::log(root)};
    };
    if (by_entropy) {
      return solve(
          [&](double t, const MixtureValues& v) { return numerics::ValueAndSlope{v.s_r - target, v.cp_r / t}; },
          solve_s_label);
    }
    return solve([&](double, const MixtureValues& v) { return numerics::ValueAndSlope{v.h_r - target, v.cp_r}; },
                 solve_h_label);
  }

  // solve_temperature's T alone.
  template <class Refuse>
  double temperature_for(double target, bool by_entropy, double slack, Refuse refuse) const {
    return solve_temperature(target, by_entropy, slack, refuse).t;
  }
};

}  // namespace shaftwork::fluids::detail

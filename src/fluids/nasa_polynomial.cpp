// NasaPolynomialGas: an ideal gas (pure or ideal mixture) on NASA polynomials.
//
// Construction does all the work that can be done once:
//  * the composition is checked, renormalised and turned into mole fractions;
//  * the species' polynomials are folded into one piecewise polynomial of the mixture over
//    the union of their interval joints (mixing is linear in the coefficients), with the
//    mixing entropy -sum y ln y added to b2;
//  * at each joint, b1 and b2 of the upper piece are shifted so that H° and S° meet
//    exactly. The database's fits already meet to 1e-7 relative or better (the load check
//    demands 1e-4); closing the last gap makes h(T) and s(T) strictly increasing with no
//    step, so T from (p, h) or (p, s) is unique and round trips hold to rounding error.
//    cp° keeps its (tiny) step: nothing inverts it;
//  * the coefficients are pre-scaled for Horner evaluation, and a table of T, S°/R, H°/R
//    and cp°/R on a grid (about 4 % steps in T, joints included) gives the inverse solves
//    a starting point from cubic Hermite interpolation of T(S°) or T(H°): typically within
//    1e-8 relative, so the safeguarded Newton iteration needs two steps.
// The state calls then allocate nothing and call nothing virtual.
#include "shaftwork/fluids/nasa_polynomial.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include <fmt/format.h>

#include "checks.hpp"
#include "nasa_interval.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/numerics/root.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::fluids {
namespace {

constexpr double kStandardPressure = 1e5;      // Pa, p° of the NASA data (1 bar)
constexpr double kSumTolerance = 0.01;         // fractions may miss 1 by this much, then renormalised
constexpr double kRenormaliseNotice = 1e-9;    // below this the sum counts as exactly 1 (rounding)
constexpr double kGridRatio = 1.04;            // ratio of neighbouring grid temperatures
constexpr double kTolerance = 1e-10;           // relative, on T, of the inverse solves
constexpr int kMaxIterations = 60;             // Newton steps (each falls back to bisection)
constexpr double kEndSlack = 1e-12;            // relative rounding allowance at the range ends

// One piece of the mixture's polynomial, pre-scaled for evaluation (per mole of mixture,
// divided by R):
//   cp/R = c0/T^2 + c1/T + c2 + T (c3 + T (c4 + T (c5 + T c6)))
//   H/R  = -c0/T + c1 ln T + T (c2 + T (c3/2 + T (c4/3 + T (c5/4 + T c6/5)))) + b1
//   S/R  = -c0/(2T^2) - c1/T + c2 ln T + T (c3 + T (c4/2 + T (c5/3 + T c6/4))) + b2
struct Piece {
  double t_low = 0;
  double t_high = 0;
  std::array<double, 7> c{};
  std::array<double, 4> h{};  // c3/2, c4/3, c5/4, c6/5
  std::array<double, 3> s{};  // c4/2, c5/3, c6/4
  double half_c0 = 0;
  double b1 = 0;
  double b2 = 0;
};

struct Values {
  double cp_r;  // cp°/R
  double h_r;   // H°/R, K
  double s_r;   // S°/R at p° (mixing term included)
};

inline Values evaluate(const Piece& q, double T) {
  const double inv_t = 1.0 / T;
  const double ln_t = std::log(T);
  const auto& c = q.c;
  Values v;
  v.cp_r = inv_t * (c[0] * inv_t + c[1]) + c[2] + T * (c[3] + T * (c[4] + T * (c[5] + T * c[6])));
  v.h_r = -c[0] * inv_t + c[1] * ln_t +
          T * (c[2] + T * (q.h[0] + T * (q.h[1] + T * (q.h[2] + T * q.h[3])))) + q.b1;
  v.s_r = -inv_t * (q.half_c0 * inv_t + c[1]) + c[2] * ln_t +
          T * (c[3] + T * (q.s[0] + T * (q.s[1] + T * q.s[2]))) + q.b2;
  return v;
}

Piece prepare(const NasaInterval& in) {
  Piece q;
  q.t_low = in.t_low;
  q.t_high = in.t_high;
  q.c = in.a;
  q.b1 = in.b1;
  q.b2 = in.b2;
  q.h = {in.a[3] / 2, in.a[4] / 3, in.a[5] / 4, in.a[6] / 5};
  q.s = {in.a[4] / 2, in.a[5] / 3, in.a[6] / 4};
  q.half_c0 = in.a[0] / 2;
  return q;
}

// One grid cell [t0, t1] within a single piece, for the starting guesses of the inverse solves.
struct Cell {
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

std::string basis_name(CompositionBasis basis) {
  return basis == CompositionBasis::mole ? "mole" : "mass";
}

}  // namespace

struct NasaPolynomialGas::Impl {
  std::vector<Piece> pieces;
  std::vector<Cell> cells;
  std::vector<double> s_grid;  // S°/R at cells[k].t0, then at the last cell's t1
  std::vector<double> h_grid;  // H°/R likewise
  double molar_mass = 0;       // kg/mol
  double gas_constant = 0;     // J/(kg K)
  Range range;
  std::vector<std::pair<std::string, double>> mole_fractions;
  bool renormalised = false;
  double given_sum = 0;
  std::string label;           // "nasa-polynomial N2" or "nasa-polynomial mixture of ..."
  std::string solve_ph_label;  // for no_convergence messages
  std::string solve_ps_label;
  std::string description;

  const Piece& piece_at(double T) const {
    std::size_t i = 0;
    while (i + 1 < pieces.size() && T >= pieces[i + 1].t_low) ++i;
    return pieces[i];
  }

  // The temperature at which a property tabulated on `grid` (H°/R or S°/R at the cell
  // ends) reaches `target`: a Hermite guess in its cell (`guess`), then safeguarded
  // Newton on `residual` within the neighbouring cells. A target outside the grid by no
  // more than `slack` (a state this model gave at an end of its range, rounded) stands
  // for that end; further out, `refuse(below)` throws the caller's out-of-range error.
  template <class Guess, class Residual, class Refuse>
  double temperature_for(double target, const std::vector<double>& grid, double slack, Guess guess,
                         Residual residual, const std::string& solve_label, Refuse refuse) const {
    if (!(target >= grid.front() && target <= grid.back())) {
      if (target < grid.front() && target >= grid.front() - slack) return range.low;
      if (target > grid.back() && target <= grid.back() + slack) return range.high;
      refuse(target < grid.front());
    }
    const std::size_t k = cell_of(grid, target);
    const double low = cells[k == 0 ? 0 : k - 1].t0;
    const double high = cells[std::min(k + 1, cells.size() - 1)].t1;
    return numerics::newton_bracketed(residual, guess(cells[k]), low, high, kTolerance, kMaxIterations,
                                      solve_label.c_str());
  }

  State state(double p, double T) const {
    const Values v = evaluate(piece_at(T), T);
    State st;
    st.pressure = p;
    st.temperature = T;
    st.enthalpy = gas_constant * v.h_r;
    st.entropy = gas_constant * (v.s_r - std::log(p / kStandardPressure));
    st.cp = gas_constant * v.cp_r;
    st.cv = st.cp - gas_constant;
    st.density = p / (gas_constant * T);
    st.molar_mass = molar_mass;
    st.compressibility = 1.0;
    st.expansivity = 1.0 / T;
    return st;
  }

  // The grid cell whose [y(t0), y(t1)] holds `target`, for a grid in ascending order.
  std::size_t cell_of(const std::vector<double>& grid, double target) const {
    const auto above = std::upper_bound(grid.begin(), grid.end(), target);
    const auto k = static_cast<std::size_t>(std::max<std::ptrdiff_t>(above - grid.begin() - 1, 0));
    return std::min(k, cells.size() - 1);
  }
};

NasaPolynomialGas::NasaPolynomialGas(const std::vector<Component>& components, CompositionBasis basis) {
  auto impl = std::make_shared<Impl>();
  const std::string basis_text = basis_name(basis);

  // --- The composition.
  if (components.empty()) {
    throw Error(ErrorKind::bad_input, "nasa-polynomial: a fluid needs at least one species");
  }
  std::vector<Component> kept;
  double sum = 0;
  for (std::size_t i = 0; i < components.size(); ++i) {
    const Component& c = components[i];
    if (c.species == nullptr) {
      throw Error(ErrorKind::bad_input,
                  fmt::format("nasa-polynomial mixture: component {} names no species", i + 1));
    }
    if (!std::isfinite(c.fraction) || c.fraction < 0) {
      throw Error(ErrorKind::bad_input,
                  fmt::format("nasa-polynomial mixture: the {} fraction of {} must be a number of 0 or "
                              "more, got {:.6g}",
                              basis_text, c.species->name, c.fraction));
    }
    for (std::size_t j = 0; j < i; ++j) {
      if (components[j].species != nullptr && components[j].species->name == c.species->name) {
        throw Error(ErrorKind::bad_input,
                    fmt::format("nasa-polynomial mixture: {} appears twice", c.species->name));
      }
    }
    if (c.fraction > 0) {
      kept.push_back(c);
      sum += c.fraction;
    }
  }
  if (kept.empty()) {
    throw Error(ErrorKind::bad_input, "nasa-polynomial mixture: every fraction is zero");
  }
  if (std::fabs(sum - 1.0) > kSumTolerance) {
    throw Error(ErrorKind::bad_input,
                fmt::format("nasa-polynomial mixture: the {} fractions sum to {:.6g}; they must sum "
                            "to 1 within 1 %",
                            basis_text, sum));
  }
  impl->given_sum = sum;
  impl->renormalised = std::fabs(sum - 1.0) > kRenormaliseNotice;
  std::vector<double> y(kept.size());
  double moles = 0;
  for (std::size_t i = 0; i < kept.size(); ++i) {
    y[i] = basis == CompositionBasis::mole ? kept[i].fraction : kept[i].fraction / kept[i].species->molar_mass;
    moles += y[i];
  }
  double molar_mass = 0;
  for (std::size_t i = 0; i < kept.size(); ++i) {
    y[i] /= moles;
    molar_mass += y[i] * kept[i].species->molar_mass;
    impl->mole_fractions.emplace_back(kept[i].species->name, y[i]);
  }
  impl->molar_mass = molar_mass;
  impl->gas_constant = units::kGasConstant / molar_mass;

  // --- Names for messages and listings.
  if (kept.size() == 1) {
    impl->label = "nasa-polynomial " + kept[0].species->name;
    impl->description = kept[0].species->name;
  } else {
    std::string names;
    std::string listing;
    for (std::size_t i = 0; i < kept.size(); ++i) {
      names += (i ? ", " : "") + kept[i].species->name;
      listing += fmt::format("{}{} {:.6g}", i ? ", " : "", kept[i].species->name, y[i]);
    }
    impl->label = "nasa-polynomial mixture of " + names;
    impl->description = listing + " (mole fractions)";
  }
  impl->solve_ph_label = impl->label + ": temperature from pressure and enthalpy";
  impl->solve_ps_label = impl->label + ": temperature from pressure and entropy";

  // --- The temperature range: where every species has data.
  Range range{kept[0].species->intervals.front().t_low, kept[0].species->intervals.back().t_high};
  for (const Component& c : kept) {
    range.low = std::max(range.low, c.species->intervals.front().t_low);
    range.high = std::min(range.high, c.species->intervals.back().t_high);
  }
  if (!(range.low < range.high)) {
    std::string ranges;
    for (const Component& c : kept) {
      ranges += fmt::format("{}{} {:g} to {:g} K", ranges.empty() ? "" : ", ", c.species->name,
                            c.species->intervals.front().t_low, c.species->intervals.back().t_high);
    }
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: the species' temperature ranges have no temperature in common ({})",
                            impl->label, ranges));
  }
  impl->range = range;

  // --- Fold the species into one piecewise polynomial over the union of the joints.
  std::vector<double> joints{range.low, range.high};
  for (const Component& c : kept) {
    for (const NasaInterval& in : c.species->intervals) {
      if (in.t_low > range.low && in.t_low < range.high) joints.push_back(in.t_low);
    }
  }
  std::sort(joints.begin(), joints.end());
  joints.erase(std::unique(joints.begin(), joints.end()), joints.end());
  double mixing = 0;  // -sum y ln y
  for (double yi : y) mixing -= yi * std::log(yi);
  for (std::size_t j = 0; j + 1 < joints.size(); ++j) {
    NasaInterval folded;
    folded.t_low = joints[j];
    folded.t_high = joints[j + 1];
    const double middle = 0.5 * (joints[j] + joints[j + 1]);
    for (std::size_t i = 0; i < kept.size(); ++i) {
      const auto& intervals = kept[i].species->intervals;
      const auto in = std::find_if(intervals.begin(), intervals.end(),
                                   [&](const NasaInterval& x) { return middle < x.t_high; });
      for (std::size_t k = 0; k < 7; ++k) folded.a[k] += y[i] * in->a[k];
      folded.b1 += y[i] * in->b1;
      folded.b2 += y[i] * in->b2;
    }
    folded.b2 += mixing;
    Piece piece = prepare(folded);
    if (j > 0) {  // meet the piece below exactly in H° and S° (see the file comment)
      const Values below = evaluate(impl->pieces.back(), piece.t_low);
      const Values above = evaluate(piece, piece.t_low);
      piece.b1 += below.h_r - above.h_r;
      piece.b2 += below.s_r - above.s_r;
    }
    impl->pieces.push_back(piece);
  }

  // --- The grid for starting guesses: cells of about kGridRatio in T within each piece.
  for (const Piece& piece : impl->pieces) {
    const double span = std::log(piece.t_high / piece.t_low);
    const auto n = static_cast<std::size_t>(std::max(1.0, std::ceil(span / std::log(kGridRatio))));
    for (std::size_t k = 0; k < n; ++k) {
      const double t0 = k == 0 ? piece.t_low : piece.t_low * std::exp(span * static_cast<double>(k) / static_cast<double>(n));
      const double t1 = k + 1 == n ? piece.t_high : piece.t_low * std::exp(span * static_cast<double>(k + 1) / static_cast<double>(n));
      const Values a = evaluate(piece, t0);
      const Values b = evaluate(piece, t1);
      // An ideal gas has cv° = cp° - R > 0; a fit that breaks this (a bad species file)
      // would give states with cv <= 0 and k negative or infinite. And coefficients near
      // the largest double would give infinite h or s. Both checked on the grid.
      for (const auto& [t, v] : {std::pair{t0, a}, std::pair{t1, b}}) {
        const double R = impl->gas_constant;
        if (!std::isfinite(R * v.cp_r) || !std::isfinite(R * v.h_r) || !std::isfinite(R * v.s_r)) {
          throw Error(ErrorKind::bad_input,
                      fmt::format("{}: cp°, H° or S° is not a finite number at {:g} K; check the "
                                  "species data",
                                  impl->label, t));
        }
        if (!(v.cp_r > 1.0)) {
          throw Error(ErrorKind::bad_input,
                      fmt::format("{}: cp° is {:.6g} R at {:g} K, not above R (cv° would not be "
                                  "positive); check the species data",
                                  impl->label, v.cp_r, t));
        }
      }
      impl->cells.push_back({t0, t1, a.s_r, b.s_r, t0 / a.cp_r, t1 / b.cp_r, a.h_r, b.h_r,
                             1.0 / a.cp_r, 1.0 / b.cp_r});
    }
  }
  // The search grids hold the values the state calls compute at the cell ends (at a joint,
  // those of the piece above), so a target between two of them is bracketed by those cells.
  for (const Cell& cell : impl->cells) {
    const Values v = evaluate(impl->piece_at(cell.t0), cell.t0);
    impl->s_grid.push_back(v.s_r);
    impl->h_grid.push_back(v.h_r);
  }
  const double t_end = impl->cells.back().t1;
  const Values end = evaluate(impl->piece_at(t_end), t_end);
  impl->s_grid.push_back(end.s_r);
  impl->h_grid.push_back(end.h_r);
  for (std::size_t k = 1; k < impl->s_grid.size(); ++k) {
    if (!(impl->s_grid[k] > impl->s_grid[k - 1] && impl->h_grid[k] > impl->h_grid[k - 1])) {
      throw Error(ErrorKind::bad_input,
                  fmt::format("{}: cp° is not positive near {:g} K, so enthalpy and entropy do not "
                              "rise with temperature; check the species data",
                              impl->label, impl->cells[k - 1].t1));
    }
  }
  impl_ = std::move(impl);
}

State NasaPolynomialGas::from_pt(double p, double T) const {
  const Impl& m = *impl_;
  detail::check_pressure(p, m.label.c_str());
  detail::check_finite(T, "temperature", m.label.c_str());
  detail::check_temperature(T, m.range, m.label.c_str());
  return m.state(p, T);
}

State NasaPolynomialGas::from_ph(double p, double h) const {
  const Impl& m = *impl_;
  detail::check_pressure(p, m.label.c_str());
  detail::check_finite(h, "enthalpy", m.label.c_str());
  const double target = h / m.gas_constant;  // H°/R, K
  const double T = m.temperature_for(
      target, m.h_grid, kEndSlack * (std::fabs(target) + m.range.high),
      [&](const Cell& c) { return hermite(target, c.h0, c.h1, c.t0, c.t1, c.dtdh0, c.dtdh1); },
      [&](double t) {
        const Values v = evaluate(m.piece_at(t), t);
        return numerics::ValueAndSlope{v.h_r - target, v.cp_r};
      },
      m.solve_ph_label,
      [&](bool below) {
        throw Error(ErrorKind::out_of_range,
                    fmt::format("{}: enthalpy {:.6g} J/kg needs a temperature {} the model's range {:g} "
                                "to {:g} K",
                                m.label, h, below ? "below" : "above", m.range.low, m.range.high));
      });
  return m.state(p, T);
}

State NasaPolynomialGas::from_ps(double p, double s) const {
  const Impl& m = *impl_;
  detail::check_pressure(p, m.label.c_str());
  detail::check_finite(s, "entropy", m.label.c_str());
  const double log_p = std::log(p / kStandardPressure);
  const double target = s / m.gas_constant + log_p;  // S°/R at p°
  const double T = m.temperature_for(
      target, m.s_grid, kEndSlack * (std::fabs(target) + std::fabs(log_p) + 1.0),
      [&](const Cell& c) { return hermite(target, c.s0, c.s1, c.t0, c.t1, c.dtds0, c.dtds1); },
      [&](double t) {
        const Values v = evaluate(m.piece_at(t), t);
        return numerics::ValueAndSlope{v.s_r - target, v.cp_r / t};
      },
      m.solve_ps_label,
      [&](bool below) {
        throw Error(ErrorKind::out_of_range,
                    fmt::format("{}: entropy {:.6g} J/(kg K) at {:.6g} Pa needs a temperature {} the "
                                "model's range {:g} to {:g} K",
                                m.label, s, p, below ? "below" : "above", m.range.low, m.range.high));
      });
  return m.state(p, T);
}

std::string NasaPolynomialGas::description() const { return impl_->description; }

Range NasaPolynomialGas::temperature_range() const { return impl_->range; }

// An ideal gas has no pressure limit of its own; these bounds only keep inputs sane for
// listings. States are computed for any finite p > 0.
Range NasaPolynomialGas::pressure_range() const { return {1e-3, 1e9}; }

std::optional<double> NasaPolynomialGas::ideal_gas_constant() const { return impl_->gas_constant; }

std::vector<std::pair<std::string, double>> NasaPolynomialGas::mole_fractions() const {
  return impl_->mole_fractions;
}

bool NasaPolynomialGas::renormalised() const { return impl_->renormalised; }

double NasaPolynomialGas::given_sum() const { return impl_->given_sum; }

}  // namespace shaftwork::fluids

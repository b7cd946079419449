// IdealGasMixture: the composition checked, the species folded into one piecewise
// polynomial, and the grid for the inverse solves.
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
//    1e-8 relative, so the safeguarded Newton iteration needs two steps, and its second
//    evaluation is mostly spared: a bound on the functions' curvature (bound_curvature) shows
//    when the first step has left T within rounding of the root. Each cell also holds
//    ln of its middle temperature, to long-double accuracy, for the guess's ln T
//    (MixtureCell::log_of in ideal_gas_mixture_data.hpp).
#include "shaftwork/fluids/ideal_gas_mixture.hpp"

#include <algorithm>
#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include <fmt/format.h>

#include "ideal_gas_mixture_data.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::fluids {
namespace {

using detail::IdealGasMixtureData;
using detail::MixturePiece;
using detail::MixtureValues;

constexpr double kSumTolerance = 0.01;       // fractions may miss 1 by this much, then renormalised
constexpr double kRenormaliseNotice = 1e-9;  // below this the sum counts as exactly 1 (rounding)
constexpr double kGridRatio = 1.04;          // ratio of neighbouring grid temperatures

MixturePiece prepare(const NasaInterval& in) {
  MixturePiece q;
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

// The components with a positive fraction, after the checks of the header; sets the sum.
std::vector<Component> checked_components(const std::vector<Component>& components, const std::string& model,
                                          const std::string& basis, double& sum) {
  if (components.empty()) throw Error(ErrorKind::bad_input, model + ": a fluid needs at least one species");
  std::vector<Component> kept;
  sum = 0;
  for (std::size_t i = 0; i < components.size(); ++i) {
    const Component& c = components[i];
    if (c.species == nullptr) {
      throw Error(ErrorKind::bad_input, fmt::format("{} mixture: component {} names no species", model, i + 1));
    }
    if (!std::isfinite(c.fraction) || c.fraction < 0) {
      throw Error(ErrorKind::bad_input,
                  fmt::format("{} mixture: the {} fraction of {} must be a number of 0 or more, got {:.6g}",
                              model, basis, c.species->name, c.fraction));
    }
    for (std::size_t j = 0; j < i; ++j) {
      if (components[j].species != nullptr && components[j].species->name == c.species->name) {
        throw Error(ErrorKind::bad_input, fmt::format("{} mixture: {} appears twice", model, c.species->name));
      }
    }
    if (c.fraction > 0) {
      kept.push_back(c);
      sum += c.fraction;
    }
  }
  if (kept.empty()) throw Error(ErrorKind::bad_input, model + " mixture: every fraction is zero");
  if (std::fabs(sum - 1.0) > kSumTolerance) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{} mixture: the {} fractions sum to {:.6g}; they must sum to 1 within 1 %", model,
                            basis, sum));
  }
  return kept;
}

// Mole fractions, molar mass, names and the common temperature range.
void set_composition(IdealGasMixtureData& d, const std::vector<Component>& kept, CompositionBasis basis,
                     const std::string& model) {
  std::vector<double> y(kept.size());
  double moles = 0;
  for (std::size_t i = 0; i < kept.size(); ++i) {
    y[i] = basis == CompositionBasis::mole ? kept[i].fraction : kept[i].fraction / kept[i].species->molar_mass;
    moles += y[i];
  }
  for (std::size_t i = 0; i < kept.size(); ++i) {
    y[i] /= moles;
    d.molar_mass += y[i] * kept[i].species->molar_mass;
    d.mole_fractions.emplace_back(kept[i].species->name, y[i]);
    d.species.push_back(*kept[i].species);
  }
  d.gas_constant = units::kGasConstant / d.molar_mass;
  if (kept.size() == 1) {
    d.label = model + " " + kept[0].species->name;
    d.description = kept[0].species->name;
  } else {
    std::string names;
    std::string listing;
    for (std::size_t i = 0; i < kept.size(); ++i) {
      names += (i ? ", " : "") + kept[i].species->name;
      listing += fmt::format("{}{} {:.6g}", i ? ", " : "", kept[i].species->name, y[i]);
    }
    d.label = model + " mixture of " + names;
    d.description = listing + " (mole fractions)";
  }
  d.solve_h_label = d.label + ": temperature from pressure and enthalpy";
  d.solve_s_label = d.label + ": temperature from pressure and entropy";
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
                fmt::format("{}: the species' temperature ranges have no temperature in common ({})", d.label,
                            ranges));
  }
  d.range = range;
}

// Folds the species into one piecewise polynomial over the union of their joints.
void fold(IdealGasMixtureData& d) {
  std::vector<double> joints{d.range.low, d.range.high};
  for (const NasaSpecies& sp : d.species) {
    for (const NasaInterval& in : sp.intervals) {
      if (in.t_low > d.range.low && in.t_low < d.range.high) joints.push_back(in.t_low);
    }
  }
  std::sort(joints.begin(), joints.end());
  joints.erase(std::unique(joints.begin(), joints.end()), joints.end());
  double mixing = 0;  // -sum y ln y
  for (const auto& entry : d.mole_fractions) mixing -= entry.second * std::log(entry.second);
  for (std::size_t j = 0; j + 1 < joints.size(); ++j) {
    NasaInterval folded;
    folded.t_low = joints[j];
    folded.t_high = joints[j + 1];
    const double middle = 0.5 * (joints[j] + joints[j + 1]);
    for (std::size_t i = 0; i < d.species.size(); ++i) {
      const double yi = d.mole_fractions[i].second;
      const auto& intervals = d.species[i].intervals;
      const auto in = std::find_if(intervals.begin(), intervals.end(),
                                   [&](const NasaInterval& x) { return middle < x.t_high; });
      for (std::size_t k = 0; k < 7; ++k) folded.a[k] += yi * in->a[k];
      folded.b1 += yi * in->b1;
      folded.b2 += yi * in->b2;
    }
    folded.b2 += mixing;
    MixturePiece piece = prepare(folded);
    if (j > 0) {  // meet the piece below exactly in H° and S° (see the file comment)
      const MixtureValues below = evaluate(d.pieces.back(), piece.t_low);
      const MixtureValues above = evaluate(piece, piece.t_low);
      piece.b1 += below.h_r - above.h_r;
      piece.b2 += below.s_r - above.s_r;
    }
    d.pieces.push_back(piece);
  }
}

// An ideal gas has cv° = cp° - R > 0; a fit that breaks this (a bad species file) would give
// states with cv <= 0 and k negative or infinite. Coefficients near the largest double would
// give infinite h or s. Both are checked on the grid.
void check_grid_point(const IdealGasMixtureData& d, double t, const MixtureValues& v) {
  const double R = d.gas_constant;
  if (!std::isfinite(R * v.cp_r) || !std::isfinite(R * v.h_r) || !std::isfinite(R * v.s_r)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: cp°, H° or S° is not a finite number at {:g} K; check the species data", d.label,
                            t));
  }
  if (!(v.cp_r > 1.0)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: cp° is {:.6g} R at {:g} K, not above R (cv° would not be positive); check the "
                            "species data",
                            d.label, v.cp_r, t));
  }
}

// d cp°/R / dT of a piece (the derivative of its Horner form for cp°/R).
double cp_slope(const MixturePiece& q, double T) {
  const auto& c = q.c;
  const double inv_t = 1.0 / T;
  return -inv_t * inv_t * (2 * c[0] * inv_t + c[1]) + c[3] + T * (2 * c[4] + T * (3 * c[5] + T * 4 * c[6]));
}

// The curvature bounds of the inverse solves (IdealGasMixtureData::curvature_s, _h): the
// largest of (1/2) |cp'/cp - 1/T| and (1/2) |cp'/cp| at kCurvatureSamples points a cell,
// doubled (the functions are smooth within a piece, whose ends are sampled too).
void bound_curvature(IdealGasMixtureData& d) {
  constexpr int kCurvatureSamples = 16;
  constexpr double kMargin = 2.0;
  double ks = 0, kh = 0;
  for (const detail::MixtureCell& cell : d.cells) {
    const MixturePiece& piece = d.piece_at(0.5 * (cell.t0 + cell.t1));
    for (int i = 0; i <= kCurvatureSamples; ++i) {
      const double T = cell.t0 + (cell.t1 - cell.t0) * i / kCurvatureSamples;
      const double log_slope = cp_slope(piece, T) / evaluate(piece, T).cp_r;
      ks = std::max(ks, 0.5 * std::fabs(log_slope - 1.0 / T));
      kh = std::max(kh, 0.5 * std::fabs(log_slope));
    }
  }
  d.curvature_s = kMargin * ks;
  d.curvature_h = kMargin * kh;
}

// The grid for starting guesses: cells of about kGridRatio in T within each piece.
void build_grid(IdealGasMixtureData& d) {
  for (const MixturePiece& piece : d.pieces) {
    const double span = std::log(piece.t_high / piece.t_low);
    const auto n = static_cast<std::size_t>(std::max(1.0, std::ceil(span / std::log(kGridRatio))));
    for (std::size_t k = 0; k < n; ++k) {
      const double f0 = static_cast<double>(k) / static_cast<double>(n);
      const double f1 = static_cast<double>(k + 1) / static_cast<double>(n);
      const double t0 = k == 0 ? piece.t_low : piece.t_low * std::exp(span * f0);
      const double t1 = k + 1 == n ? piece.t_high : piece.t_low * std::exp(span * f1);
      const MixtureValues a = evaluate(piece, t0);
      const MixtureValues b = evaluate(piece, t1);
      check_grid_point(d, t0, a);
      check_grid_point(d, t1, b);
      const double tm = 0.5 * (t0 + t1);
      const long double ln_tm = std::log(static_cast<long double>(tm));  // 64-bit significand on x86-64
      const auto ln_tm_high = static_cast<double>(ln_tm);
      d.cells.push_back({t0, t1, a.s_r, b.s_r, t0 / a.cp_r, t1 / b.cp_r, a.h_r, b.h_r, 1.0 / a.cp_r, 1.0 / b.cp_r,
                         tm, ln_tm_high, static_cast<double>(ln_tm - ln_tm_high)});
    }
  }
  // The search grids hold the values the state calls compute at the cell ends (at a joint,
  // those of the piece above), so a target between two of them is bracketed by those cells.
  for (const auto& cell : d.cells) {
    const MixtureValues v = d.at(cell.t0);
    d.s_grid.push_back(v.s_r);
    d.h_grid.push_back(v.h_r);
  }
  const MixtureValues end = d.at(d.cells.back().t1);
  d.s_grid.push_back(end.s_r);
  d.h_grid.push_back(end.h_r);
  for (std::size_t k = 1; k < d.s_grid.size(); ++k) {
    if (!(d.s_grid[k] > d.s_grid[k - 1] && d.h_grid[k] > d.h_grid[k - 1])) {
      throw Error(ErrorKind::bad_input,
                  fmt::format("{}: cp° is not positive near {:g} K, so enthalpy and entropy do not rise with "
                              "temperature; check the species data",
                              d.label, d.cells[k - 1].t1));
    }
  }
}

// The temperature of H° (by_entropy false) or S° (true) per mole, or empty outside the range.
std::optional<double> temperature_for(const IdealGasMixtureData& d, double target, bool by_entropy) {
  if (!std::isfinite(target)) return std::nullopt;
  bool outside = false;
  const double T = d.temperature_for(target / units::kGasConstant, by_entropy, 0.0, [&](bool) {
    outside = true;
    return 0.0;
  });
  return outside ? std::nullopt : std::optional<double>(T);
}

}  // namespace

IdealGasMixture::IdealGasMixture(const std::vector<Component>& components, CompositionBasis basis,
                                 const std::string& model) {
  auto d = std::make_shared<IdealGasMixtureData>();
  const std::string basis_text = basis == CompositionBasis::mole ? "mole" : "mass";
  double sum = 0;
  const std::vector<Component> kept = checked_components(components, model, basis_text, sum);
  d->given_sum = sum;
  d->renormalised = std::fabs(sum - 1.0) > kRenormaliseNotice;
  set_composition(*d, kept, basis, model);
  fold(*d);
  build_grid(*d);
  bound_curvature(*d);
  data_ = std::move(d);
}

IdealGasProperties IdealGasMixture::molar(double T) const {
  const MixtureValues v = data_->at(T);
  constexpr double R = units::kGasConstant;
  return {R * v.cp_r, R * v.h_r, R * v.s_r};
}

IdealGasProperties IdealGasMixture::mass(double T) const {
  const MixtureValues v = data_->at(T);
  const double R = data_->gas_constant;
  return {R * v.cp_r, R * v.h_r, R * v.s_r};
}

std::optional<double> IdealGasMixture::temperature_from_enthalpy(double h) const {
  return temperature_for(*data_, h, false);
}

std::optional<double> IdealGasMixture::temperature_from_entropy(double s) const {
  return temperature_for(*data_, s, true);
}

double IdealGasMixture::molar_mass() const { return data_->molar_mass; }
double IdealGasMixture::gas_constant() const { return data_->gas_constant; }
const std::vector<std::pair<std::string, double>>& IdealGasMixture::mole_fractions() const {
  return data_->mole_fractions;
}
const std::vector<NasaSpecies>& IdealGasMixture::species() const { return data_->species; }
Range IdealGasMixture::temperature_range() const { return data_->range; }
bool IdealGasMixture::renormalised() const { return data_->renormalised; }
double IdealGasMixture::given_sum() const { return data_->given_sum; }
const std::string& IdealGasMixture::description() const { return data_->description; }
const std::string& IdealGasMixture::label() const { return data_->label; }

}  // namespace shaftwork::fluids

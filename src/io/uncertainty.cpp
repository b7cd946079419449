#include "shaftwork/io/uncertainty.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/json_quantity.hpp"
#include "shaftwork/io/result_keys.hpp"
#include "shaftwork/io/uncertainty_input.hpp"

namespace shaftwork::io {
namespace {

using machines::Input;

constexpr double kStepFraction = 0.1;        // h_i = U_i / 10 ...
constexpr double kRelativeStepFloor = 1e-5;  // ... and at least 1e-5 |x_i| (the header says why)
constexpr double kNoiseFloor = 1e-9;         // |c_i U_i| at most this part of |y|: solver noise
// Above this U / eta the efficiency's distribution is visibly skewed and +-U misplaces its
// 95 % interval (tests/io/test_uncertainty.cpp: at U / eta = 0.14 the interval reaches
// +1.11 U and -0.86 U). A rule of thumb of this code, not a published limit.
constexpr double kNonlinearShare = 0.1;

std::size_t index_of(Input input) { return static_cast<std::size_t>(input); }

// A result's value, NaN when it has none or none that is finite. (NaN rather than an
// optional: storing optionals returned in registers stalls on store forwarding, a fifth of
// a batch row's time.)
double value_or_nan(const ResultKey& k, const machines::Rating& r) {
  const std::optional<double> v = k.value(r);
  return v && std::isfinite(*v) ? *v : std::numeric_limits<double>::quiet_NaN();
}

// "outlet.temperature raised by 0.05 K", for warnings.
std::string step_text(Input input, std::string_view moved, double h) {
  const std::string_view unit = si_symbol(machines::spec(input).dimension);
  return fmt::format("{} {} by {:.3g}{}{}", machines::key_of(input), moved, h, unit.empty() ? "" : " ", unit);
}

// Warns where an efficiency's U is so large a part of it that first order does not hold.
void warn_if_nonlinear(const ResultKey& k, double value, double u, UncertaintyResult& out) {
  if (k.section != Section::efficiency || u <= kNonlinearShare * std::fabs(value)) return;
  out.warnings.push_back(fmt::format("uncertainty: {} is {:.4f} ± {:.2g}: U above a tenth of the value, where "
                                     "first-order propagation misplaces the 95 % interval (docs/uncertainty.md)",
                                     k.key, value, u));
}

}  // namespace

std::optional<double> UncertaintyResult::of(std::string_view key) const {
  const auto& keys = result_keys();
  for (std::size_t k = 0; k < keys.size() && k < expanded.size(); ++k) {
    if (keys[k].key == key) return expanded[k];
  }
  return std::nullopt;
}

const std::vector<Contribution>* UncertaintyResult::contributions_of(std::string_view key) const {
  for (const KeyContributions& c : contributions) {
    if (c.key == key) return &c.shares;
  }
  return nullptr;
}

void UncertaintySources::add(Input input, double expanded) {
  if (expanded > 0 && count < varied.size()) varied[count++] = {input, expanded};
}

void UncertaintySources::add_barometer_move(Input input) {
  if (moves < barometer_moves.size()) barometer_moves[moves++] = input;
}

UncertaintySources uncertainty_sources(const CaseInput& c) {
  UncertaintySources s;
  s.barometer = c.barometer();
  for (const GivenValue& g : c.given) {
    if (g.uncertainty) s.add(g.input, expanded_of(*g.uncertainty, reading_magnitude(g, s.barometer)));
    if (g.on_barometer) s.add_barometer_move(g.input);
  }
  return s;
}

UncertaintyPropagator::UncertaintyPropagator() {
  const auto& all = result_keys();
  for (std::size_t k = 0; k < all.size(); ++k) {
    keys_.push_back(k);
    const auto found = std::find(kContributionKeys.begin(), kContributionKeys.end(), all[k].key);
    const bool reported = found != kContributionKeys.end();
    contribution_slot_.push_back(reported ? static_cast<int>(found - kContributionKeys.begin()) : -1);
  }
  nominal_.resize(keys_.size());
  plus_.resize(keys_.size());
  minus_.resize(keys_.size());
}

UncertaintyPropagator::UncertaintyPropagator(std::vector<std::size_t> keys)
    : keys_(std::move(keys)), contribution_slot_(keys_.size(), -1) {
  nominal_.resize(keys_.size());
  plus_.resize(keys_.size());
  minus_.resize(keys_.size());
}

UncertaintyResult propagate_uncertainty(const CaseInput& c, const machines::Rating& nominal) {
  machines::RatingInput input = to_rating_input(c);
  UncertaintyResult out;
  UncertaintyPropagator().propagate(input, uncertainty_sources(c), nominal, out);
  return out;
}

void UncertaintyPropagator::propagate(machines::RatingInput& input, const UncertaintySources& sources,
                                      const machines::Rating& nominal, UncertaintyResult& out) {
  const auto& keys = result_keys();
  out.expanded.assign(keys.size(), std::nullopt);
  out.warnings.clear();
  out.ratings = 0;
  for (std::size_t j = 0; j < keys_.size(); ++j) nominal_[j] = value_or_nan(keys[keys_[j]], nominal);
  sum_squares_.assign(keys_.size(), 0.0);
  unavailable_.assign(keys_.size(), 0);
  for (auto& row : squares_) row.fill(0.0);
  for (const machines::InputSpec& s : machines::kInputs) saved_[index_of(s.input)] = machines::given(input, s.input);
  for (std::size_t i = 0; i < sources.count; ++i) vary(input, sources, i, out);
  finish(sources, out);
}

// Adds input i's (c_i U_i)^2 to every result it moves.
void UncertaintyPropagator::vary(machines::RatingInput& input, const UncertaintySources& sources, std::size_t i,
                                 UncertaintyResult& out) {
  const UncertaintySources::Varied v = sources.varied[i];
  const bool barometer = v.input == Input::barometric_pressure;
  if (barometer && sources.moves == 0) return;  // no reading is read against it
  const double x = barometer ? sources.barometer : saved_[index_of(v.input)].value_or(0.0);
  const double h = std::max(kStepFraction * v.expanded, kRelativeStepFloor * std::fabs(x));
  std::string why_up, why_down;
  const bool up = rate_shifted(input, sources, v.input, h, plus_, why_up);
  const bool down = rate_shifted(input, sources, v.input, -h, minus_, why_down);
  out.ratings += 2;
  if (!up && !down) {
    out.warnings.push_back(fmt::format("uncertainty: the case cannot be rated with {} ({}): the uncertainties of the "
                                       "results are not available",
                                       step_text(v.input, "raised or lowered", h), why_up));
    std::fill(unavailable_.begin(), unavailable_.end(), 1);
    return;
  }
  if (!up || !down) {
    out.warnings.push_back(fmt::format("uncertainty: the case cannot be rated with {} ({}): a one-sided difference "
                                       "was used",
                                       step_text(v.input, up ? "lowered" : "raised", h), up ? why_down : why_up));
  }
  std::string missing;
  for (std::size_t j = 0; j < keys_.size(); ++j) {
    const double y = nominal_[j];
    if (std::isnan(y)) continue;
    const double p = up ? plus_[j] : std::numeric_limits<double>::quiet_NaN();
    const double m = down ? minus_[j] : std::numeric_limits<double>::quiet_NaN();
    double c = 0;
    if (!std::isnan(p) && !std::isnan(m)) {
      c = (p - m) / (2 * h);
    } else if (!std::isnan(p) || !std::isnan(m)) {
      c = std::isnan(m) ? (p - y) / h : (y - m) / h;
    } else {
      unavailable_[j] = 1;
      missing += (missing.empty() ? "" : ", ") + std::string(result_keys()[keys_[j]].key);
      continue;
    }
    double d = c * v.expanded;
    if (std::fabs(d) <= kNoiseFloor * std::fabs(y)) d = 0;
    sum_squares_[j] += d * d;
    if (contribution_slot_[j] >= 0) squares_[static_cast<std::size_t>(contribution_slot_[j])][i] = d * d;
  }
  if (!missing.empty()) {
    out.warnings.push_back(fmt::format("uncertainty: {} not available: no value with {}", missing,
                                       step_text(v.input, "raised or lowered", h)));
  }
}

// The results with `varied` moved by `delta` into `values`; false, with the reason, when
// that case cannot be rated. The input is as given again on return.
bool UncertaintyPropagator::rate_shifted(machines::RatingInput& input, const UncertaintySources& sources,
                                         Input varied, double delta, std::vector<double>& values,
                                         std::string& why) {
  shift(input, sources, varied, delta);
  bool rated = true;
  try {
    scratch_ = machines::rate(input);
  } catch (const Error& e) {
    why = e.what();
    rated = false;
  }
  shift(input, sources, varied, 0.0);
  if (!rated) return false;
  const auto& keys = result_keys();
  for (std::size_t j = 0; j < keys_.size(); ++j) values[j] = value_or_nan(keys[keys_[j]], scratch_);
  return true;
}

// Sets `varied` (or, for the barometer, every reading read against it) to its given value
// plus `delta`.
void UncertaintyPropagator::shift(machines::RatingInput& input, const UncertaintySources& sources, Input varied,
                                  double delta) {
  const auto move = [&](Input moved) {
    const auto field = machines::spec(moved).field;
    const std::optional<double>& given = saved_[index_of(moved)];
    if (field && given) input.*field = *given + delta;
  };
  if (varied != Input::barometric_pressure) {
    move(varied);
    return;
  }
  for (std::size_t m = 0; m < sources.moves; ++m) move(sources.barometer_moves[m]);
}

void UncertaintyPropagator::finish(const UncertaintySources& sources, UncertaintyResult& out) const {
  for (std::size_t j = 0; j < keys_.size(); ++j) {
    if (std::isnan(nominal_[j]) || unavailable_[j]) continue;
    const double u = std::sqrt(sum_squares_[j]);
    if (std::isfinite(u)) {
      out.expanded[keys_[j]] = u;
      warn_if_nonlinear(result_keys()[keys_[j]], nominal_[j], u, out);
    } else {  // only from absurd statements, such as 1e200 K
      out.warnings.push_back(fmt::format("uncertainty: {} not available: it overflows", result_keys()[keys_[j]].key));
    }
  }
  out.contributions.clear();
  for (std::size_t slot = 0; slot < kContributionKeys.size(); ++slot) {
    const auto j = static_cast<std::size_t>(
        std::find(contribution_slot_.begin(), contribution_slot_.end(), static_cast<int>(slot)) -
        contribution_slot_.begin());
    const std::optional<double> u = j < keys_.size() ? out.expanded[keys_[j]] : std::nullopt;
    if (!u || *u <= 0) continue;
    KeyContributions c{kContributionKeys[slot], {}};
    for (std::size_t i = 0; i < sources.count; ++i) {
      const double square = squares_[slot][i];
      if (square > 0) c.shares.push_back({sources.varied[i].input, 100 * square / (*u * *u)});
    }
    std::stable_sort(c.shares.begin(), c.shares.end(),
                     [](const Contribution& a, const Contribution& b) { return a.share_percent > b.share_percent; });
    out.contributions.push_back(std::move(c));
  }
}

}  // namespace shaftwork::io

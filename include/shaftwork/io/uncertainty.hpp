// shaftwork/io/uncertainty.hpp — the measurement uncertainty of every rated quantity.
//
// The law of propagation of uncertainty for independent inputs, to first order (GUM,
// JCGM 100:2008, 5.1.2 eq. (10); ASME PTC 19.1-2018, the root-sum-square of the
// sensitivity-weighted input uncertainties):
//   U(y) = sqrt( sum_i (c_i U(x_i))^2 ),   c_i = dy/dx_i,
// with expanded uncertainties (k = 2, about 95 %) on the inputs and therefore on the
// results. The sensitivity coefficients come from the model itself: central differences
// through machines::rate, the same solve as the nominal rating,
//   c_i = (y(x_i + h_i) - y(x_i - h_i)) / (2 h_i),   h_i = max(U_i / 10, 1e-5 |x_i|).
// The step: the central difference's error is (h^2 / 6) y''' / y' relative to c_i, so a
// tenth of U_i keeps it at a hundredth of the curvature that first-order propagation itself
// neglects over +-U_i; and the solver's relative tolerances (1e-13 on a searched
// temperature, 1e-10 on a real fluid's polytropic path) stay at least five orders of
// magnitude below the step, the floor 1e-5 |x_i| included. A change below a part in 10^9
// of a result is taken as solver noise and counted as zero.
//
// The barometer is an input of its own: varying it moves every gauge or vacuum reading one
// for one (a reading's uncertainty and the barometer's are separate, independent inputs).
// A step that makes the case unratable (across a phase boundary, out of a model's range)
// leaves a one-sided difference, with a warning; with neither side ratable the results
// that depend on the input have no uncertainty (empty, with a warning), never a guess.
// A case with n inputs that carry an uncertainty costs 2 n ratings beyond its nominal one.
// docs/uncertainty.md describes the method for users.
#pragma once

#include <array>
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "shaftwork/io/case_input.hpp"
#include "shaftwork/machines/rating.hpp"

namespace shaftwork::io {

// One input's share of a result's U^2.
struct Contribution {
  machines::Input input;
  double share_percent = 0;  // 100 (c_i U_i)^2 / U^2
};

struct KeyContributions {
  std::string_view key;             // a result key of kContributionKeys
  std::vector<Contribution> shares;  // largest first; inputs that do not move the result left out
};

// The results whose contributions are reported.
inline constexpr std::array<std::string_view, 3> kContributionKeys = {"efficiency.isentropic",
                                                                      "efficiency.polytropic", "power"};

struct UncertaintyResult {
  // The expanded uncertainty (k = 2) of each result key, SI, in the order of result_keys():
  // empty where the rating has no value for the key or its uncertainty is not available.
  std::vector<std::optional<double>> expanded;
  // For the keys of kContributionKeys that have a value and a U above 0.
  std::vector<KeyContributions> contributions;
  std::vector<std::string> warnings;  // "uncertainty: ..."
  int ratings = 0;                    // calls of machines::rate made (the nominal one not counted)

  // U of a result key [SI], empty when it has none.
  std::optional<double> of(std::string_view key) const;
  // The shares of a key of kContributionKeys, or nullptr.
  const std::vector<Contribution>* contributions_of(std::string_view key) const;
};

// The uncertainty of every result of `c`, rated as `nominal` (machines::rate of
// to_rating_input(c)), from the uncertainties its given values carry.
UncertaintyResult propagate_uncertainty(const CaseInput& c, const machines::Rating& nominal);

// What the propagation varies, without allocating (a batch fills one per row).
struct UncertaintySources {
  struct Varied {
    machines::Input input = machines::Input::inlet_pressure;
    double expanded = 0;  // U_i, SI, > 0
  };
  std::array<Varied, machines::kInputCount> varied{};
  std::size_t count = 0;
  // The inputs read against the barometer: they move with it.
  std::array<machines::Input, machines::kInputCount> barometer_moves{};
  std::size_t moves = 0;
  double barometer = units::kStandardAtmosphere;  // Pa

  void add(machines::Input input, double expanded);  // ignored when expanded is 0
  void add_barometer_move(machines::Input input);
};

// The sources of a case: each given value's stated uncertainty, as an SI difference.
UncertaintySources uncertainty_sources(const CaseInput& c);

// The propagation with its work space, reused from case to case (one per thread).
class UncertaintyPropagator {
 public:
  // Finds the uncertainties and contributions of every result key; or with `keys`
  // (indices into result_keys(): a batch's csv columns) the uncertainties of only those,
  // without contributions, the others left empty.
  UncertaintyPropagator();
  explicit UncertaintyPropagator(std::vector<std::size_t> keys);

  // Propagates `sources` through `input` around `nominal`, its rating. `input` is changed
  // during the call and restored before it returns.
  void propagate(machines::RatingInput& input, const UncertaintySources& sources, const machines::Rating& nominal,
                 UncertaintyResult& out);

 private:
  void vary(machines::RatingInput& input, const UncertaintySources& sources, std::size_t i, UncertaintyResult& out);
  bool rate_shifted(machines::RatingInput& input, const UncertaintySources& sources, machines::Input varied,
                    double delta, std::vector<double>& values, std::string& why);
  void shift(machines::RatingInput& input, const UncertaintySources& sources, machines::Input varied, double delta);
  void finish(const UncertaintySources& sources, UncertaintyResult& out) const;

  std::vector<std::size_t> keys_;                                     // result keys found
  std::vector<int> contribution_slot_;  // by position in keys_: its place in kContributionKeys, or -1
  std::array<std::optional<double>, machines::kInputCount> saved_{};  // the input's fields as given
  std::vector<double> nominal_, plus_, minus_;  // by position in keys_; NaN: no value
  std::vector<double> sum_squares_;
  std::vector<char> unavailable_;
  std::array<std::array<double, machines::kInputCount>, kContributionKeys.size()> squares_{};  // (c_i U_i)^2
  machines::Rating scratch_;
};

}  // namespace shaftwork::io

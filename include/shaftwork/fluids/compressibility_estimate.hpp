// shaftwork/fluids/compressibility_estimate.hpp — an estimate of Z for a gas of NASA species,
// for warnings on ideal-gas models.
//
// Z at (p, T) from the Peng-Robinson equation (cubic_eos.hpp, equations in
// src/fluids/cubic_core.hpp) with the built-in critical constants and k_ij
// (critical_data.hpp), on the root of lower Gibbs energy. No phase test: near or inside the
// two-phase region it is the Z of whichever root is stable, still far from 1, which is
// what a warning needs. No model is built.
#pragma once

#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace shaftwork::fluids {

// Names the estimate in messages.
inline constexpr const char* kCompressibilityEstimate =
    "Peng-Robinson with the built-in critical constants";

// The estimate prepared for one composition: Z then costs one cubic solve (about 0.1 us),
// for a caller that checks many states of the same gas.
class CompressibilityEstimator {
 public:
  // Empty when a species has no built-in critical constants or is unknown, or when the
  // fractions do not sum to a positive number. Names as for estimate_compressibility().
  static std::optional<CompressibilityEstimator> for_mixture(
      const std::vector<std::pair<std::string, double>>& mole_fractions);
  // Z at p [Pa], T [K] (both positive and finite; else NaN).
  double z(double p, double T) const;
  // True when Z at (p, T) is proven to lie within 1 +- tolerance (below 0.5) by a test much
  // cheaper than z(): Newton's method on the gas root, with a bracket and a proof that no
  // other root could be the stable one (detail::only_root_within, src/fluids/cubic_core.hpp).
  // Then |1 - z(p, T)| <= tolerance as well. False when that is not proven, either way:
  // z() then tells.
  bool proven_within(double p, double T, double tolerance) const;

 private:
  double a0_ = 0, a1_ = 0, a2_ = 0;  // a(T) = a0 + a1 sqrt(T) + a2 T, Pa m6/mol2
  double b_ = 0;                     // m3/mol
};

// Z for mole fractions by species name (library names or aliases, e.g. from
// NasaPolynomialGas::mole_fractions()) at p [Pa], T [K]; empty when a species has no built-in
// critical constants or is unknown, when the fractions do not sum to a positive number, or
// when p or T is not a positive finite number.
std::optional<double> estimate_compressibility(const std::vector<std::pair<std::string, double>>& mole_fractions,
                                               double p, double T);

}  // namespace shaftwork::fluids

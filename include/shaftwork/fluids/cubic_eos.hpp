// shaftwork/fluids/cubic_eos.hpp — real gases on a cubic equation of state: Peng-Robinson
// (Peng & Robinson, Ind. Eng. Chem. Fundam. 15 (1976) 59, with the 1978 alpha for acentric
// factors above 0.491) and Soave-Redlich-Kwong (Soave, Chem. Eng. Sci. 27 (1972) 1197).
//
// h and s are the NASA ideal-gas part (ideal_gas_mixture.hpp) plus the equation's
// departure functions; cp, cv, the speed of sound and Z come from the same equation
// (src/fluids/cubic_core.hpp holds the equations with their sources). Mixtures use van der
// Waals one-fluid mixing with k_ij. Critical constants and k_ij are the built-in tables
// (critical_data.hpp), or the case's own values.
//
// Phases: a state is the equation's stable phase, the vapour root for a gas. A state in the
// two-phase region, or a pure fluid's liquid below its critical temperature, is refused
// with out_of_range naming the phase boundary ("C3H8 on peng-robinson at 9.8 bar, 290 K
// lies below its dew point (about 300.1 K at 9.8 bar): ..."): a pure fluid by equal
// fugacities of its liquid and vapour roots, a mixture by Michelsen's tangent-plane-distance
// stability test (Michelsen, Fluid Phase Equilib. 9 (1982) 1-19), screened by the mixture's
// dew-temperature curve found with the same test when the model is built. from_ph and
// from_ps that land in the two-phase region are refused the same way.
//
// The temperature range is the NASA part's, capped where a species' alpha function reaches
// zero (T = Tc (1 + 1/m)^2, above 2400 K for the built-in species). Immutable and safe to
// share between threads.
#pragma once

#include <memory>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "shaftwork/fluids/critical_data.hpp"
#include "shaftwork/fluids/fluid_model.hpp"
#include "shaftwork/fluids/ideal_gas_mixture.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

namespace shaftwork::fluids {

// A case's own values, replacing the built-in ones (species by library name).
struct CubicOverrides {
  std::vector<std::pair<std::string, CriticalConstants>> critical;
  std::vector<InteractionParameter> interaction;  // first, second, k; the equation flags are ignored
};

// Derivatives of the volume for the Schultz method (ASME PTC 10-1997, sec. 5; Schultz,
// J. Eng. Power 84 (1962) 69-82): X = (T/v)(dv/dT)_p - 1, Y = -(p/v)(dv/dp)_T.
// An ideal gas has X = 0, Y = 1.
struct CompressibilityFunctions {
  double x = 0;
  double y = 1;
};

class CubicGas final : public FluidModel {
 public:
  // Composition as for NasaPolynomialGas (sum within 1 %, renormalised). Throws bad_input
  // when a species has no critical constants (built in or in `overrides`), naming it.
  CubicGas(CubicKind kind, const std::vector<Component>& components, CompositionBasis basis,
           const CubicOverrides& overrides = {}, const CriticalData& data = CriticalData::built_in());

  State from_pt(double p, double T) const override;
  State from_ph(double p, double h) const override;
  State from_ps(double p, double s) const override;
  std::string model_name() const override;
  FluidKind fluid_kind() const override { return FluidKind::real_gas; }
  std::string description() const override;
  Range temperature_range() const override;
  Range pressure_range() const override;

  CubicKind kind() const;
  const IdealGasMixture& ideal_gas() const;
  std::vector<std::pair<std::string, double>> mole_fractions() const;
  bool renormalised() const;
  double given_sum() const;
  // The critical constants in use, in the order of mole_fractions(), and k_ij between the
  // i-th and j-th of them.
  const std::vector<CriticalConstants>& critical_constants() const;
  double interaction(std::size_t i, std::size_t j) const;

  // The equation's real roots Z > B at (p, T), ascending (one or three), whatever the phase:
  // the smallest of three is the liquid's, the largest the vapour's.
  std::vector<double> compressibility_roots(double p, double T) const;
  // X and Y of the Schultz method at (p, T), from the equation's exact derivatives.
  CompressibilityFunctions compressibility_functions(double p, double T) const;
  // ln of the fugacity coefficients of the components at (p, T) in a phase of mole fractions
  // x (the order of mole_fractions()), on the root of lower Gibbs energy.
  std::vector<double> ln_fugacity_coefficients(double p, double T, const std::vector<double>& x) const;
  // A pure fluid's vapour pressure at T from equal fugacities [Pa]; empty for a mixture,
  // at or above the critical temperature, or when the iteration fails.
  std::optional<double> vapour_pressure(double T) const;
  // The temperature [K] above which the gas at p is one phase: a pure fluid's saturation
  // temperature, a mixture's (upper) dew temperature from the stability test; empty above
  // the critical (pure) or when no phase split is found below the top of the range.
  std::optional<double> dew_temperature(double p) const;

  struct Impl;

 private:
  std::shared_ptr<const Impl> impl_;
};

}  // namespace shaftwork::fluids

// shaftwork/fluids/ideal_gas_mixture.hpp — the ideal-gas (reference) part of a gas of NASA species.
//
// Every gas model of shaftwork splits a property into its ideal-gas part and a residual
// (h = h° + h_res, the split Cantera makes): NasaPolynomialGas has no residual, the cubic
// equations of state (cubic_eos.hpp) add theirs. This class is the ideal-gas part, in the
// open, for one species or an ideal mixture of them:
//
//   cp°(T) = sum y_i cp°_i(T),    H°(T) = sum y_i H°_i(T),
//   S°(T)  = sum y_i S°_i(T) - R sum y_i ln y_i                  (at p° = 1 bar)
//
// per mole of mixture, with y_i the mole fractions and the species' NASA polynomials
// (McBride, Zehe & Gordon, NASA/TP-2002-211556, eqs. 2-4; nasa_polynomial.hpp repeats
// them); per unit mass divide by M = sum y_i M_i. At pressure p the ideal gas has
// h = H°(T) and s = S°(T) - R ln(p/p°) (Smith, Van Ness & Abbott, 7th ed., sec. 11.8).
// H° includes the enthalpy of formation at 298.15 K and S° is the third-law entropy.
//
// Mixing is linear in the coefficients, so the species are folded into one piecewise
// polynomial when the mixture is built (nasa_polynomial.cpp describes how, and why the
// pieces are made to meet exactly in H° and S°); an evaluation then costs what one
// species costs, allocates nothing and calls nothing virtual. Immutable and safe to
// share between threads.
#pragma once

#include <memory>
#include <optional>
#include <string>
#include <utility>
#include <vector>

#include "shaftwork/fluids/nasa_polynomial.hpp"
#include "shaftwork/fluids/state.hpp"

namespace shaftwork::fluids {

namespace detail {
struct IdealGasMixtureData;  // src/fluids/ideal_gas_mixture_data.hpp
}

// The ideal-gas properties of the mixture at one temperature.
struct IdealGasProperties {
  double cp = 0;        // cp°(T): J/(mol K) per mole, J/(kg K) per mass
  double enthalpy = 0;  // H°(T): J/mol or J/kg
  double entropy = 0;   // S°(T) at p° = 1 bar, ideal mixing included: J/(mol K) or J/(kg K)
};

class IdealGasMixture {
 public:
  static constexpr double kStandardPressure = 1e5;  // Pa, p° of the NASA data (1 bar)

  // Fractions on `basis` must sum to 1 within 1 %: they are renormalised, and
  // renormalised() tells the caller to warn; beyond 1 % throws bad_input. Zero fractions
  // are dropped; negative ones, duplicate species and species whose temperature ranges do
  // not overlap throw bad_input. `model` names the model in messages ("nasa-polynomial",
  // "peng-robinson"). The species' coefficients are copied.
  IdealGasMixture(const std::vector<Component>& components, CompositionBasis basis,
                  const std::string& model = "nasa-polynomial");

  // cp°, H°, S° per mole [J/(mol K), J/mol, J/(mol K)] and per unit mass [J/(kg K), J/kg,
  // J/(kg K)] at T [K]. T must lie in temperature_range(); it is not checked here.
  IdealGasProperties molar(double T) const;
  IdealGasProperties mass(double T) const;

  // The temperature [K] at which H° per mole equals h [J/mol], or S° per mole at p° equals
  // s [J/(mol K)] (to 1e-10 relative); empty when it lies outside temperature_range().
  std::optional<double> temperature_from_enthalpy(double h) const;
  std::optional<double> temperature_from_entropy(double s) const;

  double molar_mass() const;    // kg/mol
  double gas_constant() const;  // R/M, J/(kg K)
  // Mole fractions after renormalisation, by species name as the library spells it.
  const std::vector<std::pair<std::string, double>>& mole_fractions() const;
  // The species in the order of mole_fractions().
  const std::vector<NasaSpecies>& species() const;
  // Where every species has data (the intersection of their ranges), K.
  Range temperature_range() const;
  bool renormalised() const;  // the fractions given did not sum to 1 and were scaled
  double given_sum() const;   // their sum as given
  // "N2" or "N2 0.78, O2 0.21, ... (mole fractions)", and "<model> N2" or
  // "<model> mixture of N2, O2, ..." for messages.
  const std::string& description() const;
  const std::string& label() const;

  // The folded polynomial itself, for the property models of this layer, which inline its
  // evaluation on their hot paths (src/fluids/ideal_gas_mixture_data.hpp).
  const detail::IdealGasMixtureData& data() const { return *data_; }

 private:
  std::shared_ptr<const detail::IdealGasMixtureData> data_;
};

}  // namespace shaftwork::fluids

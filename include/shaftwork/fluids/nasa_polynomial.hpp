// shaftwork/fluids/nasa_polynomial.hpp — ideal gases on NASA polynomials, pure or mixed.
//
// Per species, on each temperature interval (McBride, Zehe & Gordon,
// NASA/TP-2002-211556, eqs. 2-4), with a0..a6, b1, b2 the interval's coefficients:
//   cp°/R  = a0 T^-2 + a1 T^-1 + a2 + a3 T + a4 T^2 + a5 T^3 + a6 T^4
//   H°/RT  = -a0 T^-2 + a1 ln(T)/T + a2 + a3 T/2 + a4 T^2/3 + a5 T^3/4 + a6 T^4/5 + b1/T
//   S°/R   = -a0 T^-2/2 - a1/T + a2 ln T + a3 T + a4 T^2/2 + a5 T^3/3 + a6 T^4/4 + b2
// The older 7-coefficient form (NASA TM-4513, Gordon & McBride 1994; the CHEMKIN
// layout) is the same with a0 = a1 = 0, so both are held in the 9-coefficient layout.
// H° includes the enthalpy of formation at 298.15 K; S° is the third-law entropy at
// the standard pressure p° = 1 bar. Those are this model's reference states.
//
// Ideal mixing (e.g. Smith, Van Ness & Abbott, Introduction to Chemical Engineering
// Thermodynamics, 7th ed., sec. 11.8), mole fractions y_i, molar mass M = sum y_i M_i:
//   h = sum y_i H°_i(T) / M,
//   s = [ sum y_i S°_i(T) - R ln(p/p°) - R sum y_i ln y_i ] / M.
// Since mixing is linear in the coefficients, a mixture is folded into one
// piecewise polynomial over the union of the species' interval joints; it then
// costs what one species costs.
#pragma once

#include <array>
#include <memory>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "shaftwork/fluids/fluid_model.hpp"

namespace shaftwork::fluids {

class IdealGasMixture;

// One temperature interval of a species' NASA polynomial.
struct NasaInterval {
  double t_low = 0;   // K
  double t_high = 0;  // K
  std::array<double, 7> a{};  // a0..a6, dimensionless (cp°/R coefficients)
  double b1 = 0;      // K (enthalpy integration constant)
  double b2 = 0;      // dimensionless (entropy integration constant)
};

struct NasaSpecies {
  std::string name;         // as the database spells it: "N2", "C4H10,n-butane"
  std::string source;       // the record's reference text and where it came from
  double molar_mass = 0;    // kg/mol
  std::vector<NasaInterval> intervals;  // contiguous, ascending
};

// A set of species, loaded and checked: intervals contiguous and ascending, and
// cp°, H°, S° continuous at every joint (to 1e-4 relative, NASA's own fits meet this;
// src/fluids/species_library.cpp says how "relative" is meant for H° and S°).
class SpeciesLibrary {
 public:
  // The species built into the program (data/species.txt).
  static const SpeciesLibrary& built_in();

  // Parses the project's own species format (see data/species.txt for its layout).
  // `origin` names the file in messages. Throws bad_input naming origin and line.
  static SpeciesLibrary parse_own_format(std::string_view text, const std::string& origin);
  // Parses the published NASA Glenn 9-coefficient format (NASA/TP-2002-211556, Appendix A):
  // fixed-column records, an optional 'thermo' header with its global-range line, and
  // 'END PRODUCTS' / 'END REACTANTS' lines. Condensed-phase records (non-zero phase
  // column) and records without intervals are skipped: this model is an ideal gas.
  static SpeciesLibrary parse_nasa9(std::string_view text, const std::string& origin);
  // Parses the older NASA 7-coefficient format (two intervals, 4 lines per species; the
  // CHEMKIN THERMO layout). The molar mass comes from the record's elemental formula with
  // the atomic weights of data/elements.txt. Records of phase L or S are skipped.
  static SpeciesLibrary parse_nasa7(std::string_view text, const std::string& origin);

  // The species of that name, with aliases ("n-C4H10" for "C4H10,n-butane"), or nullptr.
  // Names are matched exactly (chemical formulas are case-sensitive: CO is not Co);
  // a species' own name wins over another species' alias.
  const NasaSpecies* find(std::string_view name) const;
  const std::vector<NasaSpecies>& species() const { return species_; }
  // The aliases of the species named `name` (empty when it has none or is unknown).
  std::vector<std::string> aliases_of(std::string_view name) const;

  // Adds (or, by name, replaces) species from another library, with its aliases.
  void merge(const SpeciesLibrary& other);

 private:
  // A library of species already checked, with their aliases (the parsers' last step).
  static SpeciesLibrary from_parts(std::vector<NasaSpecies> species,
                                   std::vector<std::pair<std::string, std::string>> aliases);

  std::vector<NasaSpecies> species_;
  std::vector<std::pair<std::string, std::string>> aliases_;  // {alias, species name}
};

enum class CompositionBasis { mole, mass };

// A component of a mixture: a species and its fraction.
struct Component {
  const NasaSpecies* species;
  double fraction;
};

// Ideal gas on NASA polynomials: one species or an ideal mixture; a FluidModel over
// IdealGasMixture (the ideal-gas part, which the cubic equations of state share).
//
// The temperature range is the intersection of the species' ranges; a temperature outside
// it throws out_of_range naming the species or mixture and the range (nothing is
// extrapolated). Pressure may be any finite p > 0 (pressure_range() reports 1e-3 to 1e9 Pa
// for listings). from_ph and from_ps solve for T by safeguarded Newton iteration to 1e-10
// relative. At each joint of the folded polynomial, b1 and b2 of the upper interval are
// shifted so that H° and S° meet exactly (the database's own gaps are 1e-7 relative or
// less), which makes h(T) and s(T) strictly increasing and their inverses unique.
// The states are immutable and the model is safe to share between threads.
class NasaPolynomialGas final : public FluidModel {
 public:
  // Fractions on `basis` must sum to 1 within 1 %: they are renormalised, and
  // `renormalised()` tells the caller to warn; beyond 1 % throws bad_input.
  // Zero fractions are dropped; negative ones throw. Duplicate species throw.
  // The species are copied: the library they came from need not outlive the gas.
  NasaPolynomialGas(const std::vector<Component>& components, CompositionBasis basis);

  State from_pt(double p, double T) const override;
  State from_ph(double p, double h) const override;
  State from_ps(double p, double s) const override;
  std::string model_name() const override { return "nasa-polynomial"; }
  FluidKind fluid_kind() const override { return FluidKind::ideal_gas; }
  std::string description() const override;
  Range temperature_range() const override;
  Range pressure_range() const override;
  std::optional<double> ideal_gas_constant() const override;
  // Peng-Robinson on the composition with the built-in critical constants
  // (compressibility_estimate.hpp); empty when a species has none.
  std::optional<double> estimated_compressibility(double p, double T) const override;
  bool estimated_compressibility_within(double p, double T, double tolerance) const override;

  // Mole fractions after renormalisation, by species name, in the order given.
  std::vector<std::pair<std::string, double>> mole_fractions() const;
  // True when the given fractions did not sum to 1 (beyond 1e-9, i.e. more than the
  // rounding of decimal fractions) and were scaled to do so.
  bool renormalised() const;
  // The sum of the fractions as given, before renormalisation.
  double given_sum() const;
  // The ideal-gas part this model is made of (ideal_gas_mixture.hpp).
  const IdealGasMixture& ideal_gas() const;

 private:
  struct Impl;
  std::shared_ptr<const Impl> impl_;
};

}  // namespace shaftwork::fluids

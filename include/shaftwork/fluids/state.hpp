// shaftwork/fluids/state.hpp — an immutable thermodynamic state, SI, per unit mass.
#pragma once

#include <optional>

namespace shaftwork::fluids {

struct State {
  double pressure = 0;         // Pa, absolute
  double temperature = 0;      // K
  double enthalpy = 0;         // J/kg, on the model's own reference state
  double entropy = 0;          // J/(kg K), on the model's own reference state
  double density = 0;          // kg/m3
  double cp = 0;               // J/(kg K), isobaric; not defined for a wet state
  double cv = 0;               // J/(kg K), isochoric; not defined for a wet state
  double molar_mass = 0;       // kg/mol
  double compressibility = 0;  // Z = p / (rho R_specific T), dimensionless
  // Vapour mass fraction of a two-phase (wet) state; empty for a single phase.
  std::optional<double> quality;

  bool is_wet() const { return quality.has_value(); }
  // Ratio of specific heats cp/cv; only meaningful when !is_wet().
  double k() const { return cp / cv; }
};

// A closed interval [low, high] in SI units.
struct Range {
  double low = 0;
  double high = 0;
  bool contains(double x) const { return x >= low && x <= high; }
};

}  // namespace shaftwork::fluids

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
  // Isobaric expansivity alpha_v = (1/v)(dv/dT)_p [1/K]: 1/T for an ideal gas, 0 for an
  // incompressible liquid; not defined for a wet state (0 there, like cp and cv).
  double expansivity = 0;
  // Which of the model's equations gave this state. Two states of one model in different
  // regions lie on either side of a boundary where properties jump a little (IF97's regions
  // agree on their boundaries only within its consistency tolerances) or where their slopes
  // change (the saturation line): a path integrated across one is split there (the
  // polytropic path does). A model with one equation of state gives its single-phase states
  // region 0; wet states get numbers of their own, one per set of equations that gives the
  // saturated liquid and vapour. IF97: 1, 2, 3 and 5 as IF97 numbers its regions; wet states
  // 4 up to psat(623.15 K) = 16.529 MPa (saturated states from regions 1 and 2) and 43 above
  // (from region 3).
  int region = 0;
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

// shaftwork/fluids/fluid_model.hpp — the one narrow interface every property model serves.
//
// A model answers a state from (p, T), (p, h) or (p, s), all SI and per unit mass.
// Models are immutable once built and safe to share between threads.
// Failures throw shaftwork::Error: out_of_range for a state outside the model's
// validity (the message names the model or species and its range), no_convergence
// when an inverse solve misses its tolerance, bad_input for p <= 0 or non-finite input.
#pragma once

#include <optional>
#include <string>

#include "shaftwork/error.hpp"

#include "shaftwork/fluids/state.hpp"

namespace shaftwork::fluids {

// Saturated liquid and vapour at one pressure (wet states of quality 0 and 1).
struct Saturated {
  State liquid;
  State vapour;
};

// What a model describes; the machine layer chooses its methods by it (the polytropic
// path exact from s°(T) for an ideal gas, stepwise otherwise; Schultz and compressibility
// reported for a real gas; eta_p = eta_s for a liquid).
enum class FluidKind {
  ideal_gas,    // p v = R T, h = h(T): constant cp, NASA polynomials, humid air
  real_gas,     // one gas phase of an equation of state: the cubic models
  water_steam,  // a liquid, a vapour and the wet region between: IAPWS-IF97
  liquid,       // density independent of the state: incompressible
};

class FluidModel {
 public:
  virtual ~FluidModel() = default;

  // State at pressure p [Pa] and temperature T [K]. A model with two phases throws
  // bad_input at exactly the saturation temperature: (p, Tsat) does not fix a state.
  virtual State from_pt(double p, double T) const = 0;
  // State at pressure p [Pa] and specific enthalpy h [J/kg]; T converges to 1e-10 relative.
  virtual State from_ph(double p, double h) const = 0;
  // State at pressure p [Pa] and specific entropy s [J/(kg K)]; T converges to 1e-10 relative.
  virtual State from_ps(double p, double s) const = 0;

  virtual FluidKind fluid_kind() const = 0;

  // For ideal-gas models of a known composition: an estimate of the compressibility factor
  // Z the real gas has at (p, T) (fluids/compressibility_estimate.hpp), so that a rating
  // can warn where the ideal gas is off. Empty for other models and unknown compositions.
  virtual std::optional<double> estimated_compressibility(double /*p*/, double /*T*/) const { return std::nullopt; }
  // True when estimated_compressibility(p, T) is proven to lie within 1 +- tolerance by a
  // test cheaper than the estimate itself (a batch asks it at every row's inlet and
  // outlet). False when not proven either way: estimated_compressibility() then tells.
  virtual bool estimated_compressibility_within(double /*p*/, double /*T*/, double /*tolerance*/) const {
    return false;
  }

  // The model's name as case files write it: "constant-cp", "nasa-polynomial",
  // "iapws-if97", "incompressible".
  virtual std::string model_name() const = 0;
  // One line for `shaftwork fluids` and result headers, e.g. "N2 0.7808, O2 0.2095, ...".
  virtual std::string description() const = 0;

  // Validity ranges (K, Pa). Ideal gases have no upper pressure bound of their own.
  virtual Range temperature_range() const = 0;
  virtual Range pressure_range() const = 0;

  // Specific gas constant R = R_u / M [J/(kg K)] when the model is an ideal gas
  // (p v = R T exactly, h a function of T alone); empty otherwise. The machine
  // layer uses it for the exact polytropic relations of ideal gases.
  virtual std::optional<double> ideal_gas_constant() const { return std::nullopt; }

  // Saturation temperature [K] at pressure p for a model with a liquid-vapour
  // boundary; empty for single-phase models or above the critical pressure.
  virtual std::optional<double> saturation_temperature(double /*p*/) const { return std::nullopt; }

  // Wet state at pressure p [Pa] and vapour mass fraction `quality` in [0, 1].
  // Single-phase models throw not_available.
  virtual State from_p_quality(double p, double quality) const;
  // The saturated liquid and vapour at p: from_p_quality(p, 0) and from_p_quality(p, 1),
  // with the same range and errors. A model that finds both at once overrides it.
  virtual Saturated saturated(double p) const { return {from_p_quality(p, 0.0), from_p_quality(p, 1.0)}; }

  // Moist gases (humid air): the humidity ratio [kg water / kg dry gas] the model was
  // made with, and the dew point [K] of its water vapour at pressure p [Pa]; the model
  // keeps the water as vapour below it, so a state there is worth a warning. Empty for
  // every other model.
  virtual std::optional<double> humidity_ratio() const { return std::nullopt; }
  virtual std::optional<double> dew_point(double /*p*/) const { return std::nullopt; }

  // True when density does not depend on state (incompressible liquid): the
  // polytropic efficiency then equals the isentropic one.
  virtual bool is_incompressible() const { return false; }
};

inline State FluidModel::from_p_quality(double /*p*/, double /*quality*/) const {
  throw Error(ErrorKind::not_available,
              "quality applies only to a fluid with a liquid and a vapour phase (iapws-if97); the " +
                  model_name() + " model has one phase");
}

}  // namespace shaftwork::fluids

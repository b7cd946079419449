// CubicGas's data and the functions its two source files share (internal).
//   cubic_eos.cpp    construction, states from (p, T), (p, h), (p, s)
//   cubic_phase.cpp  fugacities, the stability test, saturation and dew temperatures
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "cubic_core.hpp"
#include "ideal_gas_mixture_data.hpp"
#include "shaftwork/fluids/cubic_eos.hpp"

namespace shaftwork::fluids {

// One state of the equation: the stable root at (p, T) and what follows from it.
struct CubicPoint {
  double p = 0;
  double T = 0;
  double Z = 0;
  int roots = 0;         // real roots above B: 1 or 3
  bool largest = true;   // Z is the largest of them (the vapour root)
  detail::Attraction at{};
  detail::Residual r{};
  detail::MixtureValues ideal{};
};

struct CubicGas::Impl {
  Impl(CubicKind kind, IdealGasMixture mixture);

  CubicKind kind;
  detail::CubicConstants k;
  IdealGasMixture mixture;
  const detail::IdealGasMixtureData& d;
  std::size_t n = 0;
  std::vector<double> y;                  // mole fractions
  std::vector<CriticalConstants> critical;
  std::vector<double> m;                  // alpha slopes
  std::vector<double> sqrt_ac;            // sqrt(Omega_a) R Tc / sqrt(pc), sqrt(Pa) m3/mol
  std::vector<double> b_i;                // m3/mol
  std::vector<double> one_minus_k;        // 1 - k_ij, n x n
  detail::AttractionPolynomial attraction;
  double b = 0;                           // of the mixture, m3/mol
  Range range;
  std::string label;        // "peng-robinson C3H8", "peng-robinson mixture of ..."
  std::string phase_label;  // "C3H8 on peng-robinson", "mixture of CH4, ... on peng-robinson"
  // The mixture's screen: above screen_t[i] at ln p = screen_lnp[i] (with the neighbours'
  // values and a margin, see cubic_phase.cpp) the gas is one phase without running the test.
  std::vector<double> screen_lnp;
  std::vector<double> screen_t;

  bool pure() const { return n == 1; }
  // The root of lower Gibbs energy of the mixture (or pure fluid) at (p, T).
  CubicPoint point(double p, double T) const;
  State state(const CubicPoint& pt) const;

  // --- cubic_phase.cpp
  // sqrt(a_i(T)) of each component.
  std::vector<double> sqrt_a(double T) const;
  // ln phi_i of a phase of composition x at (p, T), its stable root written to *Z.
  std::vector<double> ln_phi(double p, double T, const std::vector<double>& x, double* Z) const;
  // Michelsen's tangent-plane test of the feed y at (p, T): true when it is stable.
  bool stable(double p, double T) const;
  std::optional<double> saturation_pressure(double T) const;
  std::optional<double> saturation_temperature(double p) const;
  std::optional<double> mixture_dew_temperature(double p, double from) const;
  void build_screen();
  // True when (p, T) is a one-phase gas (or supercritical) state of the model.
  bool one_phase(const CubicPoint& pt) const;
  // Throws out_of_range naming the phase boundary; `given` names the quantity T was solved
  // from, if any ("enthalpy"), with its value and unit.
  [[noreturn]] void refuse_phase(const CubicPoint& pt, const char* given = nullptr, double value = 0,
                                 const char* unit = "") const;
};

}  // namespace shaftwork::fluids

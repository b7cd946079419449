// shaftwork/fluids/critical_data.hpp — critical constants and binary interaction parameters
// of the species, for the cubic equations of state (cubic_eos.hpp) and the compressibility
// estimate (compressibility_estimate.hpp).
//
// The built-in tables are data/critical.txt (Tc, pc, omega per species, with the source of
// each row) and data/interaction.txt (k_ij per pair and equation, with its source); their
// header comments name the published compilations. Both are checked when loaded: species
// known to the species library, 1 K < Tc < 5000 K, 1 kPa < pc < 1 GPa, -1 < omega < 2,
// |k_ij| < 1, no species or pair (in either order, per equation) twice.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "shaftwork/fluids/nasa_polynomial.hpp"

namespace shaftwork::fluids {

enum class CubicKind { peng_robinson, soave_redlich_kwong };

// "peng-robinson" or "soave-redlich-kwong", as case files write the model.
std::string cubic_model_name(CubicKind kind);

struct CriticalConstants {
  double critical_temperature = 0;  // K
  double critical_pressure = 0;     // Pa
  double acentric_factor = 0;       // dimensionless
  std::string source;               // where the figures come from
};

struct InteractionParameter {
  std::string first;   // species names as the species library spells them
  std::string second;
  double k = 0;        // k_ij = k_ji, dimensionless
  bool peng_robinson = false;        // applies to that equation
  bool soave_redlich_kwong = false;
  std::string source;
};

class CriticalData {
 public:
  // The tables built into the program, checked against the built-in species library.
  static const CriticalData& built_in();

  // Parses the two tables (formats at the top of data/critical.txt and data/interaction.txt);
  // names are resolved with `species` (aliases allowed) and stored as the library spells
  // them. `critical_origin` and `interaction_origin` name the texts in messages, which are
  // bad_input "ORIGIN:LINE: what".
  static CriticalData parse(std::string_view critical_text, const std::string& critical_origin,
                            std::string_view interaction_text, const std::string& interaction_origin,
                            const SpeciesLibrary& species);

  // The constants of the species of that library name, or nullptr.
  const CriticalConstants* find(std::string_view species_name) const;
  // The built-in k_ij of a pair for one equation (library names, either order), or nullptr.
  const InteractionParameter* interaction(std::string_view a, std::string_view b, CubicKind kind) const;

  const std::vector<std::pair<std::string, CriticalConstants>>& constants() const { return constants_; }
  const std::vector<InteractionParameter>& interactions() const { return interactions_; }

 private:
  std::vector<std::pair<std::string, CriticalConstants>> constants_;
  std::vector<InteractionParameter> interactions_;
};

// Throws bad_input naming `where` when the constants are out of the ranges above.
void check_critical_constants(const CriticalConstants& c, const std::string& where);

}  // namespace shaftwork::fluids

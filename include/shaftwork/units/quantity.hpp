// shaftwork/units/quantity.hpp — quantities with units, converted to SI at the edge.
//
// Every dimensional input is a plain number in SI base units or a string
// "<number> <unit>". Inside the library all values are SI:
//   pressure Pa (absolute), temperature K, mass flow kg/s, actual volume flow m3/s,
//   standard volume flow mol/s (see below), power W, specific energy J/kg,
//   length (pump head, impeller diameters) m, specific heat J/(kg K), density kg/m3,
//   molar mass kg/mol, rotational speed rev/s (= 1/s, the rotational frequency n of
//   ISO 80000-3; rad/s is 1/(2 pi) of it), velocity m/s, efficiency and other ratios
//   dimensionless (a fraction, not percent).
//
// Pressures: a symbol ending in "g" is read relative to the site barometer (gauge);
// "inHgV" is a vacuum below it, p = barometer - reading; every other symbol is
// absolute, "psi", "inH2O" and "mmH2O" included (the contract's rule).
//
// Standard volume flows (Nm3/h, Sm3/h, scfm, MMSCFD, ...) are converted to a molar
// flow n = p_ref V / (R_u T_ref) at a reference state; the machine layer multiplies by
// the gas's molar mass. Each unit has a default reference:
//   Nm3: 273.15 K, 101325 Pa (DIN 1343); Sm3: 288.15 K, 101325 Pa (ISO 13443);
//   scf: 60 degF = 288.7056 K, 14.696 psia = 101325.35 Pa (common US gas practice).
// A case's site.standard_conditions (ParseContext::standard_conditions) replaces it
// for the "standard" units (Sm3 and scf families), never for Nm3, whose name fixes
// DIN 1343's state. Molar units (kmol/h, lbmol/h, mol/s) have no reference.
//
// Unit factors from NIST SP 811 (2008), Appendix B, unless stated beside them;
// docs/units.md lists every unit with its definition and source.
#pragma once

#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace shaftwork::units {

enum class Dimension {
  pressure,
  temperature,
  mass_flow,
  volume_flow,           // actual volume flow, m3/s
  standard_volume_flow,  // converted to mol/s (molar flows are written in it too)
  power,
  specific_energy,       // J/kg (also heads given as energy per mass)
  length,                // m (pump head as a height, impeller diameters)
  specific_heat,         // J/(kg K), also gas constants; above 0
  specific_entropy,      // J/(kg K) in the units of a specific heat; any sign
  density,
  molar_mass,            // kg/mol
  fraction,              // efficiencies, mole fractions: 0.845 or "84.5 %"
  rotational_speed,      // rev/s (1/s): rpm, 1/min, rev/s, Hz, rad/s
  velocity,              // m/s (tip speed)
};

// The name users see in messages, e.g. "pressure".
std::string_view dimension_name(Dimension d);

// The reference state of a standard volume: an ideal gas at `pressure` and
// `temperature` holds p V / (R_u T) moles in V.
struct StandardConditions {
  double pressure = 0;     // Pa, absolute
  double temperature = 0;  // K
};

// A standard volume unit's reference as used, for results to state.
struct StandardReference {
  StandardConditions conditions;
  std::string_view basis;  // "DIN 1343", "ISO 13443", "US gas practice", "site.standard_conditions"
  bool us_customary;       // state it in degF and psia (else degC and kPa)
};

// One unit a user may write.
struct UnitInfo {
  std::string_view symbol;  // as written, e.g. "barg"
  Dimension dimension;
  double scale;   // SI value = scale * number + offset (+ barometer for gauge units)
  double offset;  // non-zero only for temperature scales
  bool gauge;     // pressure relative to the site barometer: SI = scale * number + barometer.
                  // Vacuum units (inHgV) are gauge units with scale < 0: p = barometer - reading.
  // Standard volume units only: the default reference state (nullptr for every other
  // unit, molar flows included), and whether site.standard_conditions replaces it.
  // `scale` is the value at the default reference; effective_scale() gives the one in use.
  const StandardReference* reference = nullptr;
  bool follows_site_conditions = false;

  constexpr bool vacuum() const { return gauge && scale < 0; }
};

// The unit with this symbol, or nullptr. Symbols are case-sensitive ("MW" vs "mW"
// matters), aliases included ("C", "degC", "°C").
const UnitInfo* find_unit(std::string_view symbol);

// Every unit of a dimension, in a stable order (for --help and docs).
std::vector<const UnitInfo*> units_of(Dimension d);

// What parsing needs from the case: the site barometer for gauge and vacuum
// pressures, and the site's standard conditions for standard volume flows.
struct ParseContext {
  std::optional<double> barometric_pressure = {};              // Pa, absolute
  std::optional<StandardConditions> standard_conditions = {};  // site.standard_conditions
};

// What parsing reports besides the value.
struct ParseNotes {
  bool used_default_barometer = false;  // a gauge unit met no site barometer: 101325 Pa used
  bool absolute_water_column = false;   // inH2O or mmH2O, read as an absolute pressure
  // The reference of the last standard volume unit read (empty for molar units).
  std::optional<StandardReference> standard_reference;
};

// The default site barometer when a case gives none: one standard atmosphere.
inline constexpr double kStandardAtmosphere = 101325.0;  // Pa, exact (ISO 2533)

// Parses "<number> <unit>" (one or more spaces; "84.5 %", "21 degC", "5e3 kg/h")
// as a quantity of dimension `expected` and returns its SI value.
// Syntax: leading and trailing whitespace is ignored; the number is read with
// std::from_chars (locale-independent: "." is the decimal point, an exponent is
// allowed, a leading "+" is accepted); everything after the whitespace that follows
// the number is the unit symbol, so "1005 J/(kg K)" works. Only "%" may follow the
// number without a space ("84.5%"). A fraction may also be a bare number ("0.845");
// any other dimension needs a unit ("5" alone is refused: missing unit).
// Gauge and vacuum units use context.barometric_pressure, or kStandardAtmosphere with
// notes.used_default_barometer set when the context has none. Standard volume units
// use context.standard_conditions where the unit follows them (see the top of this
// file) and record the reference used in notes.standard_reference.
// Throws shaftwork::Error (bad_input) naming the text and the problem when:
// the number or unit is missing or malformed, the unit is unknown, the unit is of
// another dimension, the result is not finite, an absolute pressure is <= 0 (a vacuum
// reading at or above the barometer included), a temperature is <= 0 K, a
// length/flow/power/speed is negative, a density/specific heat/molar mass is <= 0, or
// the context's barometer or standard conditions are not finite and above 0.
// Range checks that depend on the key (an efficiency in (0, 1]) belong to the caller.
double parse(std::string_view text, Dimension expected, const ParseContext& context,
             ParseNotes& notes);

// Converts a plain number given with a separate unit symbol (a CSV column
// "inlet.pressure [barg]") to SI, with the same checks as parse(). Messages quote
// the pair as "<number> <unit>". An empty unit is accepted for a fraction only.
double to_si(double number, std::string_view unit, Dimension expected,
             const ParseContext& context, ParseNotes& notes);

// A quantity whose unit may be of several dimensions: a pump head as a height (m, ft)
// or as energy per mass (kJ/kg). `what` names it in messages ("head"): an unknown or
// missing unit lists the units of every dimension in `allowed`, a unit of another
// dimension is "a mass flow unit where a head belongs". Otherwise as parse().
struct AnyQuantity {
  double si;
  Dimension dimension;  // the dimension of the unit written
};
AnyQuantity parse_any(std::string_view text, std::span<const Dimension> allowed, std::string_view what,
                      const ParseContext& context, ParseNotes& notes);
AnyQuantity to_si_any(double number, std::string_view unit, std::span<const Dimension> allowed,
                      std::string_view what, const ParseContext& context, ParseNotes& notes);

// Converts an SI value to the given unit for output. For gauge units the
// barometer is subtracted (vacuum units: barometer minus the value); temperature
// scales subtract their offset. An empty unit is accepted for a fraction only.
// Throws bad_input for an unknown or mismatched unit. Every unit round-trips:
// from_si(to_si(x, u), u) == x up to rounding. This form takes standard volumes at
// each unit's default reference; the ParseContext form uses the context's barometer
// (101325 Pa without one) and standard conditions, as parse() does.
double from_si(double si_value, std::string_view unit, Dimension expected,
               double barometric_pressure = kStandardAtmosphere);
double from_si(double si_value, std::string_view unit, Dimension expected, const ParseContext& context);

// The scale of `unit` in `context`: unit.scale, except for a standard volume unit that
// follows site standard conditions when the context has them (the molar content of
// one unit scales with p_site T_ref / (p_ref T_site)). For callers that convert many
// numbers with one unit (the batch rater): SI = effective_scale * x + offset (+ barometer
// when gauge). Throws bad_input when the context's standard conditions are unusable.
double effective_scale(const UnitInfo& unit, const ParseContext& context);

// The reference a standard volume unit is taken at in `context` (the site's when the
// unit follows it and the context has one, else the unit's default); empty for every
// other unit, molar flows included.
std::optional<StandardReference> standard_reference(const UnitInfo& unit, const ParseContext& context);

// The reference in words for results: "60 degF, 14.696 psia (US gas practice)",
// "0 degC, 101.325 kPa (DIN 1343)", "20 degC, 100 kPa (site.standard_conditions)".
std::string describe(const StandardReference& reference);

// Universal gas constant, J/(mol K): CODATA 2018, exact as N_A k =
// 6.02214076e23 mol^-1 * 1.380649e-23 J/K = 8.31446261815324 J/(mol K).
inline constexpr double kGasConstant = 8.31446261815324;
// Standard acceleration of gravity, m/s2 (CGPM 1901, exact).
inline constexpr double kStandardGravity = 9.80665;

}  // namespace shaftwork::units

// shaftwork/units/quantity.hpp — quantities with units, converted to SI at the edge.
//
// Every dimensional input is a plain number in SI base units or a string
// "<number> <unit>". Inside the library all values are SI:
//   pressure Pa (absolute), temperature K, mass flow kg/s, actual volume flow m3/s,
//   standard volume flow mol/s (see below), power W, specific energy J/kg,
//   length (pump head) m, specific heat J/(kg K), density kg/m3, molar mass kg/mol,
//   efficiency and other ratios dimensionless (a fraction, not percent).
//
// Standard volume flows (Nm3/h, Sm3/h, scfm, MMSCFD) are converted to a molar
// flow n = p_ref V / (R_u T_ref) at the unit's own reference conditions; the
// machine layer multiplies by the gas's molar mass. Reference conditions:
//   Nm3: 273.15 K, 101325 Pa (DIN 1343); Sm3: 288.15 K, 101325 Pa (ISO 13443);
//   scf: 60 degF = 288.7056 K, 14.696 psia = 101325.35 Pa (common US gas practice).
//
// Unit factors from NIST SP 811 (2008), Appendix B, unless stated beside them.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

namespace shaftwork::units {

enum class Dimension {
  pressure,
  temperature,
  mass_flow,
  volume_flow,           // actual volume flow, m3/s
  standard_volume_flow,  // converted to mol/s
  power,
  specific_energy,       // J/kg (also heads given as energy per mass)
  length,                // m (pump head as a height)
  specific_heat,         // J/(kg K), also gas constants; above 0
  specific_entropy,      // J/(kg K) in the units of a specific heat; any sign
  density,
  molar_mass,            // kg/mol
  fraction,              // efficiencies, mole fractions: 0.845 or "84.5 %"
};

// The name users see in messages, e.g. "pressure".
std::string_view dimension_name(Dimension d);

// One unit a user may write.
struct UnitInfo {
  std::string_view symbol;  // as written, e.g. "barg"
  Dimension dimension;
  double scale;   // SI value = scale * number + offset (before the barometer for gauge units)
  double offset;  // non-zero only for temperature scales
  bool gauge;     // pressure relative to the site barometer
};

// The unit with this symbol, or nullptr. Symbols are case-sensitive ("MW" vs "mW"
// matters), aliases included ("C", "degC", "°C").
const UnitInfo* find_unit(std::string_view symbol);

// Every unit of a dimension, in a stable order (for --help and docs).
std::vector<const UnitInfo*> units_of(Dimension d);

// What parsing needs from the case: the site barometer for gauge pressures.
struct ParseContext {
  std::optional<double> barometric_pressure;  // Pa, absolute
};

// What parsing reports besides the value.
struct ParseNotes {
  bool used_default_barometer = false;  // a gauge unit met no site barometer: 101325 Pa used
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
// Gauge units add context.barometric_pressure, or kStandardAtmosphere with
// notes.used_default_barometer set when the context has none.
// Throws shaftwork::Error (bad_input) naming the text and the problem when:
// the number or unit is missing or malformed, the unit is unknown, the unit is of
// another dimension, the result is not finite, an absolute pressure is <= 0, a
// temperature is <= 0 K, a length/flow/power/density/specific heat is negative
// where it cannot be. Range checks that depend on the key (an efficiency in (0, 1])
// belong to the caller.
double parse(std::string_view text, Dimension expected, const ParseContext& context,
             ParseNotes& notes);

// Converts a plain number given with a separate unit symbol (a CSV column
// "inlet.pressure [barg]") to SI, with the same checks as parse(). Messages quote
// the pair as "<number> <unit>". An empty unit is accepted for a fraction only.
double to_si(double number, std::string_view unit, Dimension expected,
             const ParseContext& context, ParseNotes& notes);

// Converts an SI value to the given unit for output. For gauge units the
// barometer is subtracted; temperature scales subtract their offset. An empty unit
// is accepted for a fraction only. Throws bad_input for an unknown or mismatched
// unit. Every unit round-trips: from_si(to_si(x, u), u) == x up to rounding.
double from_si(double si_value, std::string_view unit, Dimension expected,
               double barometric_pressure = kStandardAtmosphere);

// Universal gas constant, J/(mol K): CODATA 2018, exact as N_A k =
// 6.02214076e23 mol^-1 * 1.380649e-23 J/K = 8.31446261815324 J/(mol K).
inline constexpr double kGasConstant = 8.31446261815324;
// Standard acceleration of gravity, m/s2 (CGPM 1901, exact).
inline constexpr double kStandardGravity = 9.80665;

}  // namespace shaftwork::units

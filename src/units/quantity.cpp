// The unit table and the "<number> <unit>" parser.
//
// Each unit is one row: SI value = scale * number + offset (+ barometer for gauge
// units). Factors are built from exact defining values where one exists, so that a
// row can be checked against its source by hand; each row names its source.
// NIST SP 811 (2008), Appendix B.8 (factors by alphabet) and B.9 (by kind) are the
// main source; the contract's "Definitions" fix inHg, mmHg, hp and the Btu.
#include "shaftwork/units/quantity.hpp"

#include <charconv>
#include <cmath>
#include <string>
#include <system_error>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::units {
namespace {

// ---- Defining values ----------------------------------------------------------
constexpr double kPound = 0.45359237;    // kg, exact (NIST SP 811 B.8)
constexpr double kFoot = 0.3048;         // m, exact (NIST SP 811 B.8)
constexpr double kInch = 0.0254;         // m, exact (NIST SP 811 B.8)
constexpr double kCubicFoot = kFoot * kFoot * kFoot;  // m3, exact: 0.028316846592
constexpr double kUsGallon = 3.785411784e-3;          // m3, exact: 231 in3 (NIST SP 811 B.8)
constexpr double kPoundForce = kPound * kStandardGravity;  // N, exact: 4.4482216152605
constexpr double kPsi = kPoundForce / (kInch * kInch);     // Pa: 6894.757293168...
constexpr double kKilogramForcePerCm2 = kStandardGravity / 1e-4;  // Pa, exact: 98066.5
// International Table Btu: 1 Btu_IT/lb = 2.326 kJ/kg exactly (NIST SP 811 B.8), so
// 1 Btu_IT = 2326 J/kg * 0.45359237 kg = 1055.05585262 J; the contract's
// 1055.05585 J is this value rounded.
constexpr double kBtu = 2326.0 * kPound;
constexpr double kRankine = 5.0 / 9.0;  // K per degR, and per degF of difference (exact)
constexpr double kMinute = 60.0;        // s
constexpr double kHour = 3600.0;        // s
constexpr double kDay = 86400.0;        // s

// ---- Standard volumes as amounts of substance ---------------------------------
// An ideal gas at (p_ref, T_ref) holds n = p_ref V / (R_u T_ref) moles in V.
constexpr double moles_per_m3(double p_ref, double T_ref) {
  return p_ref / (kGasConstant * T_ref);
}
// Normal m3: 0 degC, 101.325 kPa (DIN 1343).
constexpr double kMolesPerNormalM3 = moles_per_m3(kStandardAtmosphere, 273.15);
// Standard m3: 15 degC, 101.325 kPa (ISO 13443).
constexpr double kMolesPerStandardM3 = moles_per_m3(kStandardAtmosphere, 288.15);
// Standard cubic foot: 60 degF, 14.696 psia (US gas practice).
constexpr double kScfTemperature = (60.0 + 459.67) * kRankine;  // K: 288.7055...
constexpr double kScfPressure = 14.696 * kPsi;                   // Pa: 101325.353...
constexpr double kMolesPerScf = kCubicFoot * moles_per_m3(kScfPressure, kScfTemperature);

// ---- The table -----------------------------------------------------------------
// `listed`: shown in the "known units" list of error messages. The contract's
// spellings are listed; extra spellings this parser also accepts are not, to keep
// the messages short (docs/units.md lists them all).
struct Entry {
  UnitInfo info;
  bool listed;
};

constexpr Entry absolute(std::string_view symbol, Dimension d, double scale, bool listed = true) {
  return {{symbol, d, scale, 0.0, false}, listed};
}
constexpr Entry gauge(std::string_view symbol, double scale, bool listed = true) {
  return {{symbol, Dimension::pressure, scale, 0.0, true}, listed};
}
constexpr Entry scale_with_zero(std::string_view symbol, double scale, double offset,
                                bool listed = true) {
  return {{symbol, Dimension::temperature, scale, offset, false}, listed};
}
constexpr bool kAlias = false;  // for readability in the rows below

using D = Dimension;
constexpr Entry kUnits[] = {
    // pressure: Pa absolute
    absolute("Pa", D::pressure, 1.0),
    absolute("kPa", D::pressure, 1e3),
    absolute("MPa", D::pressure, 1e6),
    absolute("bar", D::pressure, 1e5),          // NIST SP 811 B.8: bar = 1.0 E+05 Pa (exact)
    absolute("bara", D::pressure, 1e5, kAlias),
    absolute("mbar", D::pressure, 1e2),         // NIST SP 811 B.8: millibar = 1.0 E+02 Pa (exact)
    absolute("psi", D::pressure, kPsi),         // contract: psi is absolute; NIST SP 811 B.8: 6.894757 E+03 Pa
    absolute("psia", D::pressure, kPsi),
    gauge("psig", kPsi),
    gauge("barg", 1e5),
    gauge("kPag", 1e3),
    gauge("MPag", 1e6, kAlias),
    absolute("atm", D::pressure, 101325.0),     // NIST SP 811 B.8: standard atmosphere = 1.01325 E+05 Pa (exact)
    absolute("inHg", D::pressure, 3386.389),    // contract (0 degC); NIST SP 811 B.8: inHg, conventional = 3.386389 E+03 Pa
    absolute("mmHg", D::pressure, 133.322),     // contract (0 degC); NIST SP 811 B.8: mmHg, conventional = 1.333224 E+02 Pa
    absolute("kgf/cm2", D::pressure, kKilogramForcePerCm2),  // NIST SP 811 B.8: 9.80665 E+04 Pa (exact)
    gauge("kgf/cm2g", kKilogramForcePerCm2),

    // temperature: K. NIST SP 811 B.9 / 4.2.1.1: T = t_C + 273.15; T = (t_F + 459.67)/1.8;
    // T = T_R/1.8. Offsets are written as the scale times the unit's own zero, so that
    // the unit's absolute zero converts to exactly 0 K.
    scale_with_zero("K", 1.0, 0.0),
    scale_with_zero("degC", 1.0, 273.15),
    scale_with_zero("C", 1.0, 273.15),
    scale_with_zero("\u00b0C", 1.0, 273.15),
    scale_with_zero("degF", kRankine, 459.67 * kRankine),
    scale_with_zero("F", kRankine, 459.67 * kRankine),
    scale_with_zero("\u00b0F", kRankine, 459.67 * kRankine),
    scale_with_zero("degR", kRankine, 0.0),
    scale_with_zero("R", kRankine, 0.0),
    scale_with_zero("\u00b0R", kRankine, 0.0, kAlias),

    // mass flow: kg/s
    absolute("kg/s", D::mass_flow, 1.0),
    absolute("kg/h", D::mass_flow, 1.0 / kHour),
    absolute("kg/hr", D::mass_flow, 1.0 / kHour, kAlias),
    absolute("t/h", D::mass_flow, 1e3 / kHour),  // NIST SP 811 B.8: metric ton = 1.0 E+03 kg
    absolute("lb/s", D::mass_flow, kPound),      // NIST SP 811 B.8: lb/s = 4.535924 E-01 kg/s
    absolute("lb/h", D::mass_flow, kPound / kHour),  // NIST SP 811 B.8: lb/h = 1.259979 E-04 kg/s
    absolute("lb/hr", D::mass_flow, kPound / kHour, kAlias),
    absolute("klb/h", D::mass_flow, 1e3 * kPound / kHour),
    absolute("klb/hr", D::mass_flow, 1e3 * kPound / kHour, kAlias),

    // actual volume flow: m3/s
    absolute("m3/s", D::volume_flow, 1.0),
    absolute("m3/h", D::volume_flow, 1.0 / kHour),
    absolute("L/s", D::volume_flow, 1e-3),  // NIST SP 811 B.8: liter = 1.0 E-03 m3 (exact)
    absolute("l/s", D::volume_flow, 1e-3, kAlias),
    absolute("gpm", D::volume_flow, kUsGallon / kMinute),  // NIST SP 811 B.8: gpm = 6.309020 E-05 m3/s
    absolute("GPM", D::volume_flow, kUsGallon / kMinute, kAlias),
    absolute("acfm", D::volume_flow, kCubicFoot / kMinute),  // NIST SP 811 B.8: ft3/min = 4.719474 E-04 m3/s
    absolute("ACFM", D::volume_flow, kCubicFoot / kMinute, kAlias),
    absolute("cfm", D::volume_flow, kCubicFoot / kMinute),
    absolute("CFM", D::volume_flow, kCubicFoot / kMinute, kAlias),

    // standard volume flow: converted to mol/s at each unit's reference conditions
    absolute("Nm3/h", D::standard_volume_flow, kMolesPerNormalM3 / kHour),
    absolute("Sm3/h", D::standard_volume_flow, kMolesPerStandardM3 / kHour),
    absolute("scfm", D::standard_volume_flow, kMolesPerScf / kMinute),
    absolute("SCFM", D::standard_volume_flow, kMolesPerScf / kMinute, kAlias),
    absolute("MMSCFD", D::standard_volume_flow, 1e6 * kMolesPerScf / kDay),
    absolute("MMscfd", D::standard_volume_flow, 1e6 * kMolesPerScf / kDay, kAlias),
    absolute("mol/s", D::standard_volume_flow, 1.0, kAlias),  // the SI value itself

    // power: W
    absolute("W", D::power, 1.0),
    absolute("kW", D::power, 1e3),
    absolute("MW", D::power, 1e6),
    absolute("hp", D::power, 745.7),  // contract; NIST SP 811 B.8: hp (550 ft lbf/s) = 7.456999 E+02 W
    absolute("Btu/h", D::power, kBtu / kHour),  // NIST SP 811 B.8: Btu_IT/h = 2.930711 E-01 W
    absolute("Btu/hr", D::power, kBtu / kHour, kAlias),

    // specific energy: J/kg
    absolute("J/kg", D::specific_energy, 1.0),
    absolute("kJ/kg", D::specific_energy, 1e3),
    absolute("Btu/lb", D::specific_energy, kBtu / kPound),  // NIST SP 811 B.8: Btu_IT/lb = 2.326 E+03 J/kg (exact)
    // ft lbf per lb: 0.3048 m * 9.80665 m/s2 = 2.98906692 J/kg (exact, from B.8's ft and lbf)
    absolute("ft-lbf/lb", D::specific_energy, kFoot * kPoundForce / kPound),

    // length (pump head): m
    absolute("m", D::length, 1.0),
    absolute("ft", D::length, kFoot),  // NIST SP 811 B.8: foot = 3.048 E-01 m (exact)

    // specific heat: J/(kg K). A difference of 1 degF equals one of 1 degR.
    absolute("J/(kg K)", D::specific_heat, 1.0),
    absolute("J/(kg*K)", D::specific_heat, 1.0, kAlias),
    absolute("J/kg/K", D::specific_heat, 1.0, kAlias),
    absolute("J/kg-K", D::specific_heat, 1.0, kAlias),
    absolute("kJ/(kg K)", D::specific_heat, 1e3),
    absolute("kJ/(kg*K)", D::specific_heat, 1e3, kAlias),
    absolute("kJ/kg/K", D::specific_heat, 1e3, kAlias),
    absolute("kJ/kg-K", D::specific_heat, 1e3, kAlias),
    // NIST SP 811 B.8: Btu_IT/(lb degR) = 4.1868 E+03 J/(kg K) (exact)
    absolute("Btu/(lb R)", D::specific_heat, kBtu / (kPound * kRankine)),
    absolute("Btu/(lb*R)", D::specific_heat, kBtu / (kPound * kRankine), kAlias),
    absolute("Btu/lb/R", D::specific_heat, kBtu / (kPound * kRankine), kAlias),
    absolute("Btu/lb-R", D::specific_heat, kBtu / (kPound * kRankine), kAlias),
    absolute("Btu/(lb F)", D::specific_heat, kBtu / (kPound * kRankine), kAlias),
    absolute("Btu/(lb*F)", D::specific_heat, kBtu / (kPound * kRankine), kAlias),
    absolute("Btu/lb/F", D::specific_heat, kBtu / (kPound * kRankine), kAlias),
    absolute("Btu/lb-F", D::specific_heat, kBtu / (kPound * kRankine), kAlias),

    // density: kg/m3
    absolute("kg/m3", D::density, 1.0),
    absolute("lb/ft3", D::density, kPound / kCubicFoot),  // NIST SP 811 B.8: 1.601846 E+01 kg/m3

    // molar mass: kg/mol
    absolute("kg/mol", D::molar_mass, 1.0),
    absolute("g/mol", D::molar_mass, 1e-3),
    absolute("kg/kmol", D::molar_mass, 1e-3),

    // fraction: a bare number, or percent
    absolute("%", D::fraction, 1e-2),
};

// ---- Helpers -------------------------------------------------------------------
constexpr bool is_space(char c) {
  return c == ' ' || c == '\t' || c == '\n' || c == '\r' || c == '\f' || c == '\v';
}

std::string_view trim(std::string_view s) {
  while (!s.empty() && is_space(s.front())) s.remove_prefix(1);
  while (!s.empty() && is_space(s.back())) s.remove_suffix(1);
  return s;
}

// What an error message quotes: the user's text, or "<number> <unit>" for to_si().
struct Subject {
  std::string_view text;
  double number = 0;
  std::string_view unit;
  bool has_text = true;

  std::string quoted() const {
    if (has_text) return fmt::format("\"{}\"", text);
    if (unit.empty()) return fmt::format("\"{}\"", number);
    return fmt::format("\"{} {}\"", number, unit);
  }
};

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

std::string known_units(Dimension d) {
  std::string list;
  for (const Entry& e : kUnits) {
    if (e.info.dimension != d || !e.listed) continue;
    if (!list.empty()) list += ", ";
    list += e.info.symbol;
  }
  return list;
}

// The dimension whose units a quantity is written in: a specific entropy is written
// in the units of a specific heat.
Dimension unit_dimension(Dimension d) {
  return d == Dimension::specific_entropy ? Dimension::specific_heat : d;
}

// "for a pressure; known units: Pa, kPa, ..."
std::string for_dimension(Dimension d) {
  return fmt::format("for a {}; known units: {}", dimension_name(d), known_units(unit_dimension(d)));
}

const UnitInfo& find_unit_of(std::string_view unit, Dimension expected, const std::string& prefix) {
  if (unit.empty()) refuse(fmt::format("{}missing unit {}", prefix, for_dimension(expected)));
  const UnitInfo* info = find_unit(unit);
  if (info == nullptr) {
    refuse(fmt::format("{}unknown unit \"{}\" {}", prefix, unit, for_dimension(expected)));
  }
  return *info;
}

double checked_barometer(double barometer) {
  if (!(std::isfinite(barometer) && barometer > 0)) {
    refuse(fmt::format("the site barometric pressure must be a finite number above 0 Pa, got {:.6g} Pa",
                       barometer));
  }
  return barometer;
}

// The SI value of `number` in `unit`, with the checks that parse() documents.
double convert(double number, const UnitInfo& unit, Dimension expected, const Subject& subject,
               const ParseContext& context, ParseNotes& notes) {
  if (!std::isfinite(number)) refuse(subject.quoted() + ": not a finite number");
  double si = unit.scale * number + unit.offset;
  double barometer = 0;
  if (unit.gauge) {
    barometer = checked_barometer(context.barometric_pressure.value_or(kStandardAtmosphere));
    si += barometer;
  }
  if (!std::isfinite(si)) refuse(subject.quoted() + ": out of range (the value in SI units is not finite)");

  switch (expected) {
    case Dimension::pressure:
      if (!(si > 0)) {
        if (!unit.gauge) refuse(subject.quoted() + ": absolute pressure must be above 0");
        refuse(fmt::format("{} with {}barometer {:.6g} kPa gives an absolute pressure of {:.6g} Pa: "
                           "must be above 0",
                           subject.quoted(), context.barometric_pressure ? "" : "the default ",
                           barometer / 1e3, si));
      }
      break;
    case Dimension::temperature:
      if (si < 0) refuse(subject.quoted() + " is below absolute zero");
      if (si == 0) refuse(subject.quoted() + " is absolute zero: a temperature must be above 0 K");
      break;
    case Dimension::mass_flow:
    case Dimension::volume_flow:
    case Dimension::standard_volume_flow:
    case Dimension::power:
    case Dimension::length:
      if (si < 0) {
        refuse(fmt::format("{}: a {} cannot be negative", subject.quoted(), dimension_name(unit.dimension)));
      }
      break;
    case Dimension::specific_heat:
    case Dimension::density:
    case Dimension::molar_mass:
      if (!(si > 0)) {
        refuse(fmt::format("{}: a {} must be above 0", subject.quoted(), dimension_name(unit.dimension)));
      }
      break;
    case Dimension::specific_energy:   // enthalpies may be negative on a model's reference state
    case Dimension::specific_entropy:  // so may entropies
    case Dimension::fraction:         // ranges depend on the key: the caller checks them
      break;
  }
  if (unit.gauge && !context.barometric_pressure) notes.used_default_barometer = true;
  return si + 0.0;  // turns -0.0 into 0.0
}

// The whole conversion once the number and the unit text are known.
double to_si_checked(double number, std::string_view unit, Dimension expected,
                     const Subject& subject, const ParseContext& context, ParseNotes& notes) {
  if (unit.empty() && expected == Dimension::fraction) {
    if (!std::isfinite(number)) refuse(subject.quoted() + ": not a finite number");
    return number + 0.0;
  }
  const UnitInfo& info = find_unit_of(unit, expected, subject.quoted() + ": ");
  if (info.dimension != unit_dimension(expected)) {
    refuse(fmt::format("{}: a {} unit where a {} belongs", subject.quoted(),
                       dimension_name(info.dimension), dimension_name(expected)));
  }
  return convert(number, info, expected, subject, context, notes);
}

}  // namespace

std::string_view dimension_name(Dimension d) {
  switch (d) {
    case Dimension::pressure: return "pressure";
    case Dimension::temperature: return "temperature";
    case Dimension::mass_flow: return "mass flow";
    case Dimension::volume_flow: return "volume flow";
    case Dimension::standard_volume_flow: return "standard volume flow";
    case Dimension::power: return "power";
    case Dimension::specific_energy: return "specific energy";
    case Dimension::length: return "length";
    case Dimension::specific_heat: return "specific heat";
    case Dimension::specific_entropy: return "specific entropy";
    case Dimension::density: return "density";
    case Dimension::molar_mass: return "molar mass";
    case Dimension::fraction: return "fraction";
  }
  return "quantity";
}

const UnitInfo* find_unit(std::string_view symbol) {
  for (const Entry& e : kUnits) {
    if (e.info.symbol == symbol) return &e.info;
  }
  return nullptr;
}

std::vector<const UnitInfo*> units_of(Dimension d) {
  std::vector<const UnitInfo*> out;
  for (const Entry& e : kUnits) {
    if (e.info.dimension == unit_dimension(d)) out.push_back(&e.info);
  }
  return out;
}

double parse(std::string_view text, Dimension expected, const ParseContext& context,
             ParseNotes& notes) {
  const std::string_view t = trim(text);
  const Subject subject{t, 0.0, {}, true};
  if (t.empty()) refuse(subject.quoted() + ": missing number");

  // The number: std::from_chars is locale-independent; it takes no leading '+',
  // so one is skipped here (but not "+-5" or "++5").
  const char* first = t.data();
  const char* const last = t.data() + t.size();
  if (*first == '+' && t.size() > 1 && t[1] != '+' && t[1] != '-') ++first;
  double number = 0;
  const auto [end, ec] = std::from_chars(first, last, number, std::chars_format::general);

  // The first whitespace-separated word, to name a malformed number.
  std::string_view word = t;
  for (std::size_t i = 0; i < t.size(); ++i) {
    if (is_space(t[i])) {
      word = t.substr(0, i);
      break;
    }
  }
  if (ec == std::errc::invalid_argument) {
    if (word.size() == t.size()) refuse(subject.quoted() + ": missing number");
    refuse(fmt::format("{}: \"{}\" is not a number", subject.quoted(), word));
  }
  if (ec == std::errc::result_out_of_range) {
    refuse(fmt::format("{}: the number \"{}\" is out of range", subject.quoted(), word));
  }

  const std::string_view rest(end, static_cast<std::size_t>(last - end));
  std::string_view unit;
  if (rest.empty() || is_space(rest.front())) {
    unit = trim(rest);
  } else if (rest == "%") {
    unit = rest;  // "84.5%": the one unit that may follow the number without a space
  } else if (find_unit(rest) != nullptr) {
    refuse(fmt::format("{}: put a space between the number and the unit", subject.quoted()));
  } else {
    refuse(fmt::format("{}: \"{}\" is not a number", subject.quoted(), word));
  }
  return to_si_checked(number, unit, expected, subject, context, notes);
}

double to_si(double number, std::string_view unit, Dimension expected, const ParseContext& context,
             ParseNotes& notes) {
  const std::string_view u = trim(unit);
  const Subject subject{{}, number, u, false};
  return to_si_checked(number, u, expected, subject, context, notes);
}

double from_si(double si_value, std::string_view unit, Dimension expected,
               double barometric_pressure) {
  const std::string_view u = trim(unit);
  if (u.empty() && expected == Dimension::fraction) return si_value;
  const UnitInfo& info = find_unit_of(u, expected, "");
  if (info.dimension != unit_dimension(expected)) {
    refuse(fmt::format("\"{}\" is a {} unit where a {} belongs", u, dimension_name(info.dimension),
                       dimension_name(expected)));
  }
  if (info.gauge) return (si_value - checked_barometer(barometric_pressure)) / info.scale;
  return (si_value - info.offset) / info.scale;
}

}  // namespace shaftwork::units

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

// Water columns at 4 degC (= 39.2 degF): rho g h with the density NIST SP 811 uses for
// its "4 degC" and "39.2 degF" water-column factors, 999.972 kg/m3 (the maximum density
// of water in the litre of 1901), and standard gravity. NIST SP 811 B.8 prints the
// results: inch of water (39.2 degF) 2.49082 E+02 Pa, foot of water (39.2 degF)
// 2.98898 E+03 Pa, centimeter of water (4 degC) 9.80638 E+01 Pa.
constexpr double kWaterAt4C = 999.972;  // kg/m3
constexpr double kInchOfWater = kWaterAt4C * kStandardGravity * kInch;   // Pa: 249.08194
constexpr double kMillimetreOfWater = kWaterAt4C * kStandardGravity * 1e-3;  // Pa: 9.8063754
// Inch of mercury at 0 degC as the contract fixes it (NIST SP 811 B.8: conventional
// inHg 3.386389 E+03 Pa).
constexpr double kInchOfMercury = 3386.389;
constexpr double kPoundMole = 1e3 * kPound;  // mol: a lbmol holds 453.59237 mol (exact, from the pound)
constexpr double kTwoPi = 6.283185307179586;  // rad per revolution

// ---- Standard volumes as amounts of substance ---------------------------------
// An ideal gas at (p_ref, T_ref) holds n = p_ref V / (R_u T_ref) moles in V.
constexpr double moles_per_m3(const StandardConditions& c) {
  return c.pressure / (kGasConstant * c.temperature);
}
// Normal m3: 0 degC, 101.325 kPa (DIN 1343).
constexpr StandardReference kNormal{{kStandardAtmosphere, 273.15}, "DIN 1343", false};
// Standard m3: 15 degC, 101.325 kPa (ISO 13443).
constexpr StandardReference kStandardMetric{{kStandardAtmosphere, 288.15}, "ISO 13443", false};
// Standard cubic foot: 60 degF = 288.7055... K, 14.696 psia = 101325.353... Pa (US gas practice).
constexpr StandardReference kStandardUs{{14.696 * kPsi, (60.0 + 459.67) * kRankine}, "US gas practice", true};

// ---- The table -----------------------------------------------------------------
// `listed`: shown in the "known units" list of error messages: one spelling of each
// unit; other spellings this parser also accepts (aliases) are not, to keep the
// messages short (docs/units.md lists them all).
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
// A vacuum below the barometer: p = barometer - scale * reading.
constexpr Entry vacuum(std::string_view symbol, double scale, bool listed = true) {
  return {{symbol, Dimension::pressure, -scale, 0.0, true}, listed};
}
constexpr Entry scale_with_zero(std::string_view symbol, double scale, double offset,
                                bool listed = true) {
  return {{symbol, Dimension::temperature, scale, offset, false}, listed};
}
// `volume_rate`: the volume at the reference that one unit of the number stands for,
// per second (m3/s). `follows`: site.standard_conditions replaces the reference.
constexpr Entry standard(std::string_view symbol, double volume_rate, const StandardReference& reference,
                         bool listed = true) {
  const bool follows = &reference != &kNormal;
  return {{symbol, Dimension::standard_volume_flow, volume_rate * moles_per_m3(reference.conditions), 0.0,
           false, &reference, follows},
          listed};
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
    absolute("hPa", D::pressure, 1e2),          // SI prefix (= mbar); the barometer unit of weather reports
    absolute("psi", D::pressure, kPsi),         // contract: psi is absolute; NIST SP 811 B.8: 6.894757 E+03 Pa
    absolute("psia", D::pressure, kPsi),
    gauge("psig", kPsi),
    gauge("barg", 1e5),
    gauge("mbarg", 1e2),
    gauge("Pag", 1.0),
    gauge("kPag", 1e3),
    gauge("MPag", 1e6, kAlias),
    absolute("atm", D::pressure, 101325.0),     // NIST SP 811 B.8: standard atmosphere = 1.01325 E+05 Pa (exact)
    absolute("inHg", D::pressure, kInchOfMercury),  // contract (0 degC); NIST SP 811 B.8: inHg, conventional = 3.386389 E+03 Pa
    absolute("inHgA", D::pressure, kInchOfMercury, kAlias),  // "absolute", as condenser pressures are written
    vacuum("inHgV", kInchOfMercury),            // contract: vacuum below the site barometer
    absolute("mmHg", D::pressure, 133.322),     // contract (0 degC); NIST SP 811 B.8: mmHg, conventional = 1.333224 E+02 Pa
    absolute("inH2O", D::pressure, kInchOfWater),  // contract (4 degC); NIST SP 811 B.8: 2.49082 E+02 Pa
    gauge("inH2Og", kInchOfWater),
    absolute("mmH2O", D::pressure, kMillimetreOfWater),  // contract (4 degC); NIST SP 811 B.8: cmH2O (4 degC) = 9.80638 E+01 Pa
    gauge("mmH2Og", kMillimetreOfWater),
    absolute("kgf/cm2", D::pressure, kKilogramForcePerCm2),  // NIST SP 811 B.8: 9.80665 E+04 Pa (exact)
    absolute("kg/cm2", D::pressure, kKilogramForcePerCm2, kAlias),
    gauge("kgf/cm2g", kKilogramForcePerCm2),
    gauge("kg/cm2g", kKilogramForcePerCm2, kAlias),  // contract: as kgf/cm2g

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
    absolute("lbm/s", D::mass_flow, kPound, kAlias),
    absolute("lb/h", D::mass_flow, kPound / kHour),  // NIST SP 811 B.8: lb/h = 1.259979 E-04 kg/s
    absolute("lb/hr", D::mass_flow, kPound / kHour, kAlias),
    absolute("lbm/h", D::mass_flow, kPound / kHour, kAlias),
    absolute("lbm/hr", D::mass_flow, kPound / kHour, kAlias),
    absolute("klb/h", D::mass_flow, 1e3 * kPound / kHour),
    absolute("klb/hr", D::mass_flow, 1e3 * kPound / kHour, kAlias),

    // actual volume flow: m3/s
    absolute("m3/s", D::volume_flow, 1.0),
    absolute("m3/min", D::volume_flow, 1.0 / kMinute),
    absolute("m3/h", D::volume_flow, 1.0 / kHour),
    absolute("m3/hr", D::volume_flow, 1.0 / kHour, kAlias),
    absolute("L/s", D::volume_flow, 1e-3),  // NIST SP 811 B.8: liter = 1.0 E-03 m3 (exact)
    absolute("l/s", D::volume_flow, 1e-3, kAlias),
    absolute("L/min", D::volume_flow, 1e-3 / kMinute),
    absolute("l/min", D::volume_flow, 1e-3 / kMinute, kAlias),
    absolute("gpm", D::volume_flow, kUsGallon / kMinute),  // NIST SP 811 B.8: gpm = 6.309020 E-05 m3/s
    absolute("GPM", D::volume_flow, kUsGallon / kMinute, kAlias),
    absolute("acfm", D::volume_flow, kCubicFoot / kMinute),  // NIST SP 811 B.8: ft3/min = 4.719474 E-04 m3/s
    absolute("ACFM", D::volume_flow, kCubicFoot / kMinute, kAlias),
    absolute("cfm", D::volume_flow, kCubicFoot / kMinute),
    absolute("CFM", D::volume_flow, kCubicFoot / kMinute, kAlias),

    // standard volume flow: converted to mol/s at each unit's reference conditions
    standard("Nm3/h", 1.0 / kHour, kNormal),
    standard("Nm3/hr", 1.0 / kHour, kNormal, kAlias),
    standard("Sm3/h", 1.0 / kHour, kStandardMetric),
    standard("Sm3/hr", 1.0 / kHour, kStandardMetric, kAlias),
    standard("Sm3/d", 1.0 / kDay, kStandardMetric),
    standard("MMSCMD", 1e6 / kDay, kStandardMetric),  // million standard m3 per day
    standard("scfm", kCubicFoot / kMinute, kStandardUs),
    standard("SCFM", kCubicFoot / kMinute, kStandardUs, kAlias),
    standard("scfh", kCubicFoot / kHour, kStandardUs),
    standard("SCFH", kCubicFoot / kHour, kStandardUs, kAlias),
    standard("MSCFD", 1e3 * kCubicFoot / kDay, kStandardUs),   // M = thousand, as US gas practice writes it
    standard("Mscfd", 1e3 * kCubicFoot / kDay, kStandardUs, kAlias),
    standard("MMSCFD", 1e6 * kCubicFoot / kDay, kStandardUs),  // MM = million
    standard("MMscfd", 1e6 * kCubicFoot / kDay, kStandardUs, kAlias),
    // molar flows: amounts of substance, no reference state
    absolute("mol/s", D::standard_volume_flow, 1.0),  // the SI value itself
    absolute("kmol/s", D::standard_volume_flow, 1e3),
    absolute("kmol/h", D::standard_volume_flow, 1e3 / kHour),
    absolute("kmol/hr", D::standard_volume_flow, 1e3 / kHour, kAlias),
    absolute("lbmol/h", D::standard_volume_flow, kPoundMole / kHour),
    absolute("lbmol/hr", D::standard_volume_flow, kPoundMole / kHour, kAlias),

    // power: W
    absolute("W", D::power, 1.0),
    absolute("kW", D::power, 1e3),
    absolute("MW", D::power, 1e6),
    absolute("hp", D::power, 745.7),  // contract; NIST SP 811 B.8: hp (550 ft lbf/s) = 7.456999 E+02 W
    absolute("bhp", D::power, 745.7, kAlias),  // contract: brake horsepower, as hp
    absolute("Btu/h", D::power, kBtu / kHour),  // NIST SP 811 B.8: Btu_IT/h = 2.930711 E-01 W
    absolute("Btu/hr", D::power, kBtu / kHour, kAlias),

    // specific energy: J/kg
    absolute("J/kg", D::specific_energy, 1.0),
    absolute("kJ/kg", D::specific_energy, 1e3),
    absolute("Btu/lb", D::specific_energy, kBtu / kPound),  // NIST SP 811 B.8: Btu_IT/lb = 2.326 E+03 J/kg (exact)
    absolute("Btu/lbm", D::specific_energy, kBtu / kPound, kAlias),
    // ft lbf per lb: 0.3048 m * 9.80665 m/s2 = 2.98906692 J/kg (exact, from B.8's ft and lbf)
    absolute("ft-lbf/lb", D::specific_energy, kFoot * kPoundForce / kPound),
    absolute("ft-lbf/lbm", D::specific_energy, kFoot * kPoundForce / kPound, kAlias),

    // length (pump head, impeller diameters): m
    absolute("m", D::length, 1.0),
    absolute("mm", D::length, 1e-3),
    absolute("cm", D::length, 1e-2),
    absolute("in", D::length, kInch),  // NIST SP 811 B.8: inch = 2.54 E-02 m (exact)
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
    absolute("Btu/(lbm R)", D::specific_heat, kBtu / (kPound * kRankine), kAlias),
    absolute("Btu/lbm-R", D::specific_heat, kBtu / (kPound * kRankine), kAlias),

    // density: kg/m3
    absolute("kg/m3", D::density, 1.0),
    absolute("lb/ft3", D::density, kPound / kCubicFoot),  // NIST SP 811 B.8: 1.601846 E+01 kg/m3
    absolute("lbm/ft3", D::density, kPound / kCubicFoot, kAlias),

    // molar mass: kg/mol
    absolute("kg/mol", D::molar_mass, 1.0),
    absolute("g/mol", D::molar_mass, 1e-3),
    absolute("kg/kmol", D::molar_mass, 1e-3),

    // fraction: a bare number, or percent
    absolute("%", D::fraction, 1e-2),

    // rotational speed: rev/s (= 1/s, the rotational frequency n of ISO 80000-3)
    absolute("rpm", D::rotational_speed, 1.0 / kMinute),
    absolute("RPM", D::rotational_speed, 1.0 / kMinute, kAlias),
    absolute("r/min", D::rotational_speed, 1.0 / kMinute, kAlias),  // SI Brochure's spelling
    absolute("rev/min", D::rotational_speed, 1.0 / kMinute, kAlias),
    absolute("1/min", D::rotational_speed, 1.0 / kMinute),
    absolute("rev/s", D::rotational_speed, 1.0),
    absolute("r/s", D::rotational_speed, 1.0, kAlias),
    absolute("1/s", D::rotational_speed, 1.0, kAlias),
    absolute("Hz", D::rotational_speed, 1.0),  // a shaft's rotational frequency: 1 Hz = 1 rev/s
    absolute("rad/s", D::rotational_speed, 1.0 / kTwoPi),  // angular velocity: 2 pi rad per revolution

    // velocity: m/s
    absolute("m/s", D::velocity, 1.0),
    absolute("ft/s", D::velocity, kFoot),  // NIST SP 811 B.8: ft/s = 3.048 E-01 m/s (exact)
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

// The dimension whose units a quantity is written in: a specific entropy is written
// in the units of a specific heat.
Dimension unit_dimension(Dimension d) {
  return d == Dimension::specific_entropy ? Dimension::specific_heat : d;
}

// "for a head; known units: m, mm, ..., J/kg, ..."
std::string for_quantity(std::string_view what, std::span<const Dimension> dimensions) {
  std::string list;
  for (Dimension d : dimensions) {
    for (const Entry& e : kUnits) {
      if (e.info.dimension != unit_dimension(d) || !e.listed) continue;
      if (!list.empty()) list += ", ";
      list += e.info.symbol;
    }
  }
  return fmt::format("for a {}; known units: {}", what, list);
}

// "for a pressure; known units: Pa, kPa, ..."
std::string for_dimension(Dimension d) { return for_quantity(dimension_name(d), std::span(&d, 1)); }

// The unit named `unit`; a missing or unknown one is refused, `known` listing the units
// the quantity may take ("for a pressure; known units: ...").
const UnitInfo& find_unit_of(std::string_view unit, const std::string& known, const std::string& prefix) {
  if (unit.empty()) refuse(fmt::format("{}missing unit {}", prefix, known));
  const UnitInfo* info = find_unit(unit);
  if (info == nullptr) refuse(fmt::format("{}unknown unit \"{}\" {}", prefix, unit, known));
  return *info;
}

double checked_barometer(double barometer) {
  if (!(std::isfinite(barometer) && barometer > 0)) {
    refuse(fmt::format("the site barometric pressure must be a finite number above 0 Pa, got {:.6g} Pa",
                       barometer));
  }
  return barometer;
}

const StandardConditions& checked(const StandardConditions& c) {
  if (!(std::isfinite(c.pressure) && c.pressure > 0 && std::isfinite(c.temperature) && c.temperature > 0)) {
    refuse(fmt::format("the site standard conditions must have a finite pressure and temperature above 0, "
                       "got {:.6g} Pa and {:.6g} K",
                       c.pressure, c.temperature));
  }
  return c;
}

// The absolute unit's gauge twin, for a hint: "bar" -> "barg", "psia" -> "psig".
const UnitInfo* gauge_twin(const UnitInfo& unit) {
  if (unit.dimension != Dimension::pressure || unit.gauge) return nullptr;
  const std::string_view s = unit.symbol;
  const UnitInfo* twin = find_unit(std::string(s) + "g");
  if (twin == nullptr && s.size() > 1 && s.back() == 'a') twin = find_unit(std::string(s.substr(0, s.size() - 1)) + "g");
  return twin != nullptr && twin->gauge && !twin->vacuum() ? twin : nullptr;
}

// Water columns are differential readings in practice: an absolute one is noted.
bool is_absolute_water_column(const UnitInfo& unit) { return unit.symbol == "inH2O" || unit.symbol == "mmH2O"; }

// A pressure that came out at or below 0 Pa absolute: the message says why.
[[noreturn]] void refuse_pressure(double number, double si, const UnitInfo& unit, const Subject& subject,
                                  const ParseContext& context, double barometer) {
  const char* which = context.barometric_pressure ? "" : "the default ";
  if (unit.vacuum()) {
    refuse(fmt::format("{}: a vacuum of {:.6g} kPa is not below {}barometer {:.6g} kPa; a vacuum reading "
                       "must be less than the barometer",
                       subject.quoted(), -unit.scale * number / 1e3, which, barometer / 1e3));
  }
  if (unit.gauge) {
    refuse(fmt::format("{} with {}barometer {:.6g} kPa gives an absolute pressure of {:.6g} Pa: must be above 0",
                       subject.quoted(), which, barometer / 1e3, si));
  }
  if (const UnitInfo* twin = gauge_twin(unit)) {
    refuse(fmt::format("{}: absolute pressure must be above 0 ({} is absolute; a reading relative to the "
                       "barometer is written {})",
                       subject.quoted(), unit.symbol, twin->symbol));
  }
  refuse(subject.quoted() + ": absolute pressure must be above 0");
}

// The checks parse() documents on the SI value `si` of a quantity of dimension `expected`.
void check_domain(double number, double si, const UnitInfo& unit, Dimension expected, const Subject& subject,
                  const ParseContext& context, double barometer) {
  switch (expected) {
    case Dimension::pressure:
      if (unit.vacuum() && number < 0) {
        refuse(fmt::format("{}: a vacuum reading cannot be negative ({} counts down from the barometer)",
                           subject.quoted(), unit.symbol));
      }
      if (!(si > 0)) refuse_pressure(number, si, unit, subject, context, barometer);
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
    case Dimension::rotational_speed:
    case Dimension::velocity:
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
}

// The SI value of `number` in `unit`, with the checks that parse() documents.
double convert(double number, const UnitInfo& unit, Dimension expected, const Subject& subject,
               const ParseContext& context, ParseNotes& notes) {
  if (!std::isfinite(number)) refuse(subject.quoted() + ": not a finite number");
  double si = effective_scale(unit, context) * number + unit.offset;
  double barometer = 0;
  if (unit.gauge) {
    barometer = checked_barometer(context.barometric_pressure.value_or(kStandardAtmosphere));
    si += barometer;
  }
  if (!std::isfinite(si)) refuse(subject.quoted() + ": out of range (the value in SI units is not finite)");
  check_domain(number, si, unit, expected, subject, context, barometer);
  if (unit.gauge && !context.barometric_pressure) notes.used_default_barometer = true;
  if (is_absolute_water_column(unit)) notes.absolute_water_column = true;
  if (unit.dimension == Dimension::standard_volume_flow) notes.standard_reference = standard_reference(unit, context);
  return si + 0.0;  // turns -0.0 into 0.0
}

// The whole conversion once the number and the unit text are known.
double to_si_checked(double number, std::string_view unit, Dimension expected,
                     const Subject& subject, const ParseContext& context, ParseNotes& notes) {
  if (unit.empty() && expected == Dimension::fraction) {
    if (!std::isfinite(number)) refuse(subject.quoted() + ": not a finite number");
    return number + 0.0;
  }
  const UnitInfo& info = find_unit_of(unit, for_dimension(expected), subject.quoted() + ": ");
  if (info.dimension != unit_dimension(expected)) {
    refuse(fmt::format("{}: a {} unit where a {} belongs", subject.quoted(),
                       dimension_name(info.dimension), dimension_name(expected)));
  }
  return convert(number, info, expected, subject, context, notes);
}

// As to_si_checked, for a quantity that may be written in units of any of `allowed`.
AnyQuantity any_checked(double number, std::string_view unit, std::span<const Dimension> allowed,
                        std::string_view what, const Subject& subject, const ParseContext& context,
                        ParseNotes& notes) {
  for (Dimension d : allowed) {
    if (unit.empty() && d == Dimension::fraction) return {to_si_checked(number, unit, d, subject, context, notes), d};
  }
  const UnitInfo& info = find_unit_of(unit, for_quantity(what, allowed), subject.quoted() + ": ");
  for (Dimension d : allowed) {
    if (info.dimension == unit_dimension(d)) return {convert(number, info, d, subject, context, notes), d};
  }
  refuse(fmt::format("{}: a {} unit where a {} belongs", subject.quoted(), dimension_name(info.dimension), what));
}

// "<number> <unit>" split, with the syntax checks parse() documents.
struct Written {
  double number;
  std::string_view unit;
};

Written split(std::string_view t, const Subject& subject) {
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
  if (rest.empty() || is_space(rest.front())) return {number, trim(rest)};
  if (rest == "%") return {number, rest};  // "84.5%": the one unit that may follow the number without a space
  if (find_unit(rest) != nullptr) refuse(fmt::format("{}: put a space between the number and the unit", subject.quoted()));
  refuse(fmt::format("{}: \"{}\" is not a number", subject.quoted(), word));
}

// The unit of `unit_text` for output, checked against `expected`.
const UnitInfo& output_unit(std::string_view unit, Dimension expected) {
  const UnitInfo& info = find_unit_of(unit, for_dimension(expected), "");
  if (info.dimension != unit_dimension(expected)) {
    refuse(fmt::format("\"{}\" is a {} unit where a {} belongs", unit, dimension_name(info.dimension),
                       dimension_name(expected)));
  }
  return info;
}

// The number in `info` for the SI value, with the barometer and scale given.
double to_unit(double si_value, const UnitInfo& info, double barometer, double scale) {
  if (info.gauge) return (si_value - checked_barometer(barometer)) / scale;
  return (si_value - info.offset) / scale;
}

// A temperature and a pressure in one unit family, for describe().
std::string format_conditions(const StandardConditions& c, bool us_customary) {
  const UnitInfo& t = *find_unit(us_customary ? "degF" : "degC");
  const UnitInfo& p = *find_unit(us_customary ? "psia" : "kPa");
  return fmt::format("{:.6g} {}, {:.6g} {}", (c.temperature - t.offset) / t.scale, t.symbol, c.pressure / p.scale,
                     p.symbol);
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
    case Dimension::rotational_speed: return "rotational speed";
    case Dimension::velocity: return "velocity";
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
  const Written w = split(t, subject);
  return to_si_checked(w.number, w.unit, expected, subject, context, notes);
}

double to_si(double number, std::string_view unit, Dimension expected, const ParseContext& context,
             ParseNotes& notes) {
  const std::string_view u = trim(unit);
  const Subject subject{{}, number, u, false};
  return to_si_checked(number, u, expected, subject, context, notes);
}

AnyQuantity parse_any(std::string_view text, std::span<const Dimension> allowed, std::string_view what,
                      const ParseContext& context, ParseNotes& notes) {
  const std::string_view t = trim(text);
  const Subject subject{t, 0.0, {}, true};
  const Written w = split(t, subject);
  return any_checked(w.number, w.unit, allowed, what, subject, context, notes);
}

AnyQuantity to_si_any(double number, std::string_view unit, std::span<const Dimension> allowed,
                      std::string_view what, const ParseContext& context, ParseNotes& notes) {
  const std::string_view u = trim(unit);
  const Subject subject{{}, number, u, false};
  return any_checked(number, u, allowed, what, subject, context, notes);
}

double from_si(double si_value, std::string_view unit, Dimension expected,
               double barometric_pressure) {
  const std::string_view u = trim(unit);
  if (u.empty() && expected == Dimension::fraction) return si_value;
  const UnitInfo& info = output_unit(u, expected);
  return to_unit(si_value, info, barometric_pressure, info.scale);
}

double from_si(double si_value, std::string_view unit, Dimension expected, const ParseContext& context) {
  const std::string_view u = trim(unit);
  if (u.empty() && expected == Dimension::fraction) return si_value;
  const UnitInfo& info = output_unit(u, expected);
  return to_unit(si_value, info, context.barometric_pressure.value_or(kStandardAtmosphere),
                 effective_scale(info, context));
}

double effective_scale(const UnitInfo& unit, const ParseContext& context) {
  if (unit.reference == nullptr || !unit.follows_site_conditions || !context.standard_conditions) return unit.scale;
  const StandardConditions& site = checked(*context.standard_conditions);
  const StandardConditions& own = unit.reference->conditions;
  return unit.scale * (site.pressure / own.pressure) * (own.temperature / site.temperature);
}

std::optional<StandardReference> standard_reference(const UnitInfo& unit, const ParseContext& context) {
  if (unit.reference == nullptr) return std::nullopt;
  if (!unit.follows_site_conditions || !context.standard_conditions) return *unit.reference;
  return StandardReference{checked(*context.standard_conditions), "site.standard_conditions",
                           unit.reference->us_customary};
}

std::string describe(const StandardReference& reference) {
  return fmt::format("{} ({})", format_conditions(reference.conditions, reference.us_customary), reference.basis);
}

}  // namespace shaftwork::units

// Tests of shaftwork/units/quantity.hpp.
//
// Every expected value below is written from the unit's definition, with its source
// beside it, never read back from the code's table: exact definitions (1 lb =
// 0.45359237 kg, 1 ft = 0.3048 m, g = 9.80665 m/s2, 1 US gal = 231 in3) are
// multiplied out here, and NIST SP 811 (2008) Appendix B.8 rounded factors are
// checked to the 7 digits NIST prints.
#include <catch2/catch.hpp>

#include <cmath>
#include <functional>
#include <limits>
#include <set>
#include <string>

#include "shaftwork/error.hpp"
#include "shaftwork/units/quantity.hpp"

using shaftwork::Error;
using shaftwork::ErrorKind;
using namespace shaftwork::units;
using D = Dimension;

namespace {

constexpr double kExact = 1e-14;   // relative: the same number up to rounding
constexpr double kNist7 = 5e-7;    // relative: NIST SP 811 prints 7 significant digits

// The SI value of `text`, with no site barometer.
double si(std::string_view text, Dimension d) {
  ParseNotes notes;
  return parse(text, d, ParseContext{}, notes);
}

// The message of the shaftwork::Error that `f` throws (checking it is bad_input),
// or a marker that makes the comparison fail.
std::string error_of(const std::function<void()>& f) {
  try {
    f();
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_input);
    return e.what();
  }
  return "<no error thrown>";
}

std::string parse_error(std::string_view text, Dimension d, ParseContext context = {}) {
  return error_of([&] {
    ParseNotes notes;
    parse(text, d, context, notes);
  });
}

constexpr Dimension kAllDimensions[] = {
    D::pressure,        D::temperature,   D::mass_flow, D::volume_flow,
    D::standard_volume_flow, D::power,    D::specific_energy, D::length,
    D::specific_heat,   D::density,       D::molar_mass, D::fraction,
};

}  // namespace

TEST_CASE("pressure units against their definitions", "[units][pressure]") {
  CHECK(si("1 Pa", D::pressure) == 1.0);
  CHECK(si("1 kPa", D::pressure) == 1000.0);
  CHECK(si("1 MPa", D::pressure) == 1e6);
  CHECK(si("1 bar", D::pressure) == 1e5);         // NIST SP 811 B.8: 1 bar = 1.0 E+05 Pa (exact)
  CHECK(si("1 bara", D::pressure) == 1e5);
  CHECK(si("1 mbar", D::pressure) == Approx(100.0).epsilon(kExact));  // NIST SP 811 B.8: 1 mbar = 1.0 E+02 Pa
  CHECK(si("1 atm", D::pressure) == 101325.0);    // NIST SP 811 B.8: standard atmosphere = 1.01325 E+05 Pa (exact)
  // 1 psi = 1 lbf/in2 = 0.45359237 kg * 9.80665 m/s2 / (0.0254 m)^2 = 6894.757293168 Pa.
  CHECK(si("1 psi", D::pressure) == Approx(6894.757293168).epsilon(1e-12));
  CHECK(si("1 psi", D::pressure) == Approx(6.894757e3).epsilon(kNist7));  // NIST SP 811 B.8: 1 psi = 6.894757 E+03 Pa
  CHECK(si("1 psia", D::pressure) == Approx(6894.757293168).epsilon(1e-12));  // contract: psi is absolute, as psia
  CHECK(si("1 inHg", D::pressure) == Approx(3386.389).epsilon(kExact));  // contract (0 degC); NIST SP 811 B.8: 3.386389 E+03 Pa
  CHECK(si("1 mmHg", D::pressure) == Approx(133.322).epsilon(kExact));   // contract (0 degC)
  CHECK(si("1 mmHg", D::pressure) == Approx(1.333224e2).epsilon(5e-6));  // NIST SP 811 B.8: mmHg, conventional = 1.333224 E+02 Pa
  // 1 kgf/cm2 = 9.80665 N / 1e-4 m2 = 98066.5 Pa; NIST SP 811 B.8: 9.80665 E+04 Pa (exact).
  CHECK(si("1 kgf/cm2", D::pressure) == Approx(98066.5).epsilon(kExact));
}

TEST_CASE("gauge pressures add the site barometer, or 101325 Pa with a note", "[units][pressure]") {
  struct Row {
    const char* text;
    double gauge_pa;  // the reading in Pa, from the unit's definition
  };
  const Row rows[] = {
      {"2 barg", 2e5},                                // 1 bar = 1e5 Pa
      {"50 kPag", 5e4},
      {"1.5 MPag", 1.5e6},
      {"10 psig", 10 * 0.45359237 * 9.80665 / (0.0254 * 0.0254)},  // lbf/in2 from lb, g, in
      {"3 kgf/cm2g", 3 * 9.80665e4},                  // NIST SP 811 B.8: kgf/cm2 = 9.80665 E+04 Pa
  };
  for (const Row& row : rows) {
    INFO(row.text);
    ParseNotes notes;
    CHECK(parse(row.text, D::pressure, ParseContext{}, notes) ==
          Approx(row.gauge_pa + 101325.0).epsilon(kExact));
    CHECK(notes.used_default_barometer);

    ParseNotes site_notes;
    ParseContext site{98000.0};
    CHECK(parse(row.text, D::pressure, site, site_notes) == Approx(row.gauge_pa + 98000.0).epsilon(kExact));
    CHECK_FALSE(site_notes.used_default_barometer);
  }

  SECTION("absolute units leave the note alone") {
    ParseNotes notes;
    CHECK(parse("2 bar", D::pressure, ParseContext{}, notes) == 2e5);
    CHECK_FALSE(notes.used_default_barometer);
  }
  SECTION("a zero gauge reading is the barometer") {
    ParseNotes notes;
    CHECK(parse("0 barg", D::pressure, ParseContext{0.98e5}, notes) == 0.98e5);
  }
  SECTION("to_si with a gauge unit (a CSV column) behaves the same") {
    ParseNotes notes;
    CHECK(to_si(2.0, "barg", D::pressure, ParseContext{}, notes) == Approx(301325.0).epsilon(kExact));
    CHECK(notes.used_default_barometer);
  }
  SECTION("from_si subtracts the barometer") {
    CHECK(from_si(301325.0, "barg", D::pressure) == Approx(2.0).epsilon(kExact));
    CHECK(from_si(298000.0, "barg", D::pressure, 98000.0) == Approx(2.0).epsilon(kExact));
    CHECK(from_si(101325.0, "psig", D::pressure) == 0.0);
  }
}

TEST_CASE("temperature scales", "[units][temperature]") {
  // NIST SP 811 section 4.2.1.1 and B.9: T/K = t/degC + 273.15; T/K = (t/degF + 459.67)/1.8;
  // T/K = (T/degR)/1.8.
  CHECK(si("300 K", D::temperature) == 300.0);
  CHECK(si("21 degC", D::temperature) == Approx(294.15).epsilon(kExact));
  CHECK(si("21 C", D::temperature) == Approx(294.15).epsilon(kExact));
  CHECK(si("21 \u00b0C", D::temperature) == Approx(294.15).epsilon(kExact));
  CHECK(si("212 degF", D::temperature) == Approx((212 + 459.67) / 1.8).epsilon(kExact));  // 373.15 K
  CHECK(si("212 F", D::temperature) == Approx(373.15).epsilon(kExact));
  CHECK(si("32 \u00b0F", D::temperature) == Approx(273.15).epsilon(kExact));
  CHECK(si("519.67 degR", D::temperature) == Approx(519.67 / 1.8).epsilon(kExact));
  CHECK(si("491.67 R", D::temperature) == Approx(273.15).epsilon(kExact));
  CHECK(si("491.67 \u00b0R", D::temperature) == Approx(273.15).epsilon(kExact));
  CHECK(si("-40 degF", D::temperature) == Approx(si("-40 degC", D::temperature)).epsilon(kExact));

  CHECK(from_si(373.15, "degF", D::temperature) == Approx(212.0).epsilon(kExact));
  CHECK(from_si(373.15, "degC", D::temperature) == Approx(100.0).epsilon(1e-12));
  CHECK(from_si(273.15, "R", D::temperature) == Approx(491.67).epsilon(kExact));
}

TEST_CASE("mass flow units", "[units][flow]") {
  CHECK(si("1 kg/s", D::mass_flow) == 1.0);
  CHECK(si("3600 kg/h", D::mass_flow) == Approx(1.0).epsilon(kExact));
  CHECK(si("3600 kg/hr", D::mass_flow) == Approx(1.0).epsilon(kExact));
  CHECK(si("3.6 t/h", D::mass_flow) == Approx(1.0).epsilon(kExact));  // NIST SP 811 B.8: metric ton = 1000 kg
  CHECK(si("1 lb/s", D::mass_flow) == Approx(0.45359237).epsilon(kExact));  // 1 lb = 0.45359237 kg exact
  CHECK(si("1 lb/h", D::mass_flow) == Approx(0.45359237 / 3600).epsilon(kExact));
  CHECK(si("1 lb/h", D::mass_flow) == Approx(1.259979e-4).epsilon(kNist7));  // NIST SP 811 B.8: lb/h = 1.259979 E-04 kg/s
  CHECK(si("1 lb/hr", D::mass_flow) == Approx(0.45359237 / 3600).epsilon(kExact));
  CHECK(si("1 klb/h", D::mass_flow) == Approx(453.59237 / 3600).epsilon(kExact));
  CHECK(si("1 klb/hr", D::mass_flow) == Approx(453.59237 / 3600).epsilon(kExact));
}

TEST_CASE("actual volume flow units", "[units][flow]") {
  CHECK(si("1 m3/s", D::volume_flow) == 1.0);
  CHECK(si("3600 m3/h", D::volume_flow) == Approx(1.0).epsilon(kExact));
  CHECK(si("1 L/s", D::volume_flow) == Approx(1e-3).epsilon(kExact));  // NIST SP 811 B.8: liter = 1.0 E-03 m3
  CHECK(si("1 l/s", D::volume_flow) == Approx(1e-3).epsilon(kExact));
  // 1 US gallon = 231 in3 = 231 * 0.0254^3 m3 = 3.785411784e-3 m3 exact.
  CHECK(si("60 gpm", D::volume_flow) == Approx(231 * 0.0254 * 0.0254 * 0.0254).epsilon(kExact));
  CHECK(si("1 gpm", D::volume_flow) == Approx(6.309020e-5).epsilon(kNist7));  // NIST SP 811 B.8: gpm = 6.309020 E-05 m3/s
  CHECK(si("60 GPM", D::volume_flow) == Approx(3.785411784e-3).epsilon(kExact));
  // 1 ft3 = 0.3048^3 m3 = 0.028316846592 m3 exact; acfm and cfm are actual ft3/min.
  CHECK(si("60 acfm", D::volume_flow) == Approx(0.028316846592).epsilon(kExact));
  CHECK(si("60 ACFM", D::volume_flow) == Approx(0.028316846592).epsilon(kExact));
  CHECK(si("60 cfm", D::volume_flow) == Approx(0.028316846592).epsilon(kExact));
  CHECK(si("60 CFM", D::volume_flow) == Approx(0.028316846592).epsilon(kExact));
  CHECK(si("1 cfm", D::volume_flow) == Approx(4.719474e-4).epsilon(kNist7));  // NIST SP 811 B.8: ft3/min = 4.719474 E-04 m3/s
}

TEST_CASE("standard volume flows become molar flows at each unit's reference", "[units][flow]") {
  const double R = 8.31446261815324;  // J/(mol K), CODATA 2018 (exact)
  // Nm3: 273.15 K, 101325 Pa (DIN 1343): n = p V / (R T).
  CHECK(si("1 Nm3/h", D::standard_volume_flow) == Approx(101325 / (R * 273.15) / 3600).epsilon(kExact));
  // The molar volume at 0 degC and 1 atm is 22.413 969 54 L/mol (CODATA 2018).
  CHECK(si("3600 Nm3/h", D::standard_volume_flow) == Approx(1 / 22.41396954e-3).epsilon(1e-9));
  // Sm3: 288.15 K, 101325 Pa (ISO 13443).
  CHECK(si("1 Sm3/h", D::standard_volume_flow) == Approx(101325 / (R * 288.15) / 3600).epsilon(kExact));
  // scf: 60 degF = 519.67 degR = 288.70555... K; 14.696 psia = 14.696 * 6894.757293168 Pa.
  const double p_scf = 14.696 * 6894.757293168;
  const double T_scf = 519.67 / 1.8;
  const double mol_per_scf = p_scf * 0.028316846592 / (R * T_scf);
  CHECK(si("1 scfm", D::standard_volume_flow) == Approx(mol_per_scf / 60).epsilon(1e-12));
  CHECK(si("1 SCFM", D::standard_volume_flow) == Approx(mol_per_scf / 60).epsilon(1e-12));
  // 1 MMSCFD, worked independently in US field units: the gas constant is
  // 10.7316 psia ft3/(lbmol degR) (8.31446261815324 J/(mol K) * 453.59237 mol/lbmol / 1.8
  // degR/K / (6894.757 Pa/psi * 0.0283168 m3/ft3)), so one lbmol fills
  // 10.7316 * 519.67 / 14.696 = 379.48 scf. 1e6 scf/day is then
  // 1e6 / 379.48 * 453.59237 mol / 86400 s = 13.8344 mol/s.
  const double scf_per_lbmol = 10.7316 * 519.67 / 14.696;
  const double mmscfd = 1e6 / scf_per_lbmol * 453.59237 / 86400;
  CHECK(mmscfd == Approx(13.8344).epsilon(1e-5));
  CHECK(si("1 MMSCFD", D::standard_volume_flow) == Approx(mmscfd).epsilon(1e-5));
  CHECK(si("1 MMscfd", D::standard_volume_flow) == Approx(mmscfd).epsilon(1e-5));
  // A day has 1440 minutes: 1 MMSCFD = 1e6/1440 scfm.
  CHECK(si("1 MMSCFD", D::standard_volume_flow) ==
        Approx(si("694.44444444444444 scfm", D::standard_volume_flow)).epsilon(1e-12));
  CHECK(si("2.5 mol/s", D::standard_volume_flow) == 2.5);
}

TEST_CASE("power units", "[units][power]") {
  CHECK(si("1 W", D::power) == 1.0);
  CHECK(si("1 kW", D::power) == 1e3);
  CHECK(si("1 MW", D::power) == 1e6);
  CHECK(si("1 hp", D::power) == Approx(745.7).epsilon(kExact));  // contract: hp is 745.7 W
  CHECK(si("1 hp", D::power) == Approx(7.456999e2).epsilon(kNist7));  // NIST SP 811 B.8: hp (550 ft lbf/s) = 7.456999 E+02 W
  // contract: International Table Btu = 1055.05585 J (exact: 1055.05585262 J).
  CHECK(si("3600 Btu/h", D::power) == Approx(1055.05585).epsilon(1e-8));
  CHECK(si("1 Btu/h", D::power) == Approx(2.930711e-1).epsilon(kNist7));  // NIST SP 811 B.8: Btu_IT/h = 2.930711 E-01 W
  CHECK(si("3600 Btu/hr", D::power) == Approx(1055.05585).epsilon(1e-8));
}

TEST_CASE("specific energy and length units", "[units][energy]") {
  CHECK(si("1 J/kg", D::specific_energy) == 1.0);
  CHECK(si("1 kJ/kg", D::specific_energy) == 1e3);
  CHECK(si("1 Btu/lb", D::specific_energy) == Approx(2326.0).epsilon(kExact));  // NIST SP 811 B.8: Btu_IT/lb = 2.326 E+03 J/kg (exact)
  CHECK(si("1 Btu/lb", D::specific_energy) == Approx(1055.05585 / 0.45359237).epsilon(1e-8));  // contract's Btu / lb
  // ft lbf / lb = 0.3048 m * (0.45359237 kg * 9.80665 m/s2) / 0.45359237 kg = 2.98906692 J/kg.
  CHECK(si("1 ft-lbf/lb", D::specific_energy) == Approx(2.98906692).epsilon(kExact));
  CHECK(si("-12.5 kJ/kg", D::specific_energy) == -12500.0);  // enthalpies may be negative

  CHECK(si("85 m", D::length) == 85.0);
  CHECK(si("1 ft", D::length) == Approx(0.3048).epsilon(kExact));  // NIST SP 811 B.8: ft = 3.048 E-01 m (exact)
}

TEST_CASE("specific heat, density and molar mass units", "[units][properties]") {
  for (const char* text : {"1005 J/(kg K)", "1005 J/(kg*K)", "1005 J/kg/K", "1005 J/kg-K",
                           "1.005 kJ/(kg K)", "1.005 kJ/(kg*K)", "1.005 kJ/kg/K", "1.005 kJ/kg-K"}) {
    INFO(text);
    CHECK(si(text, D::specific_heat) == Approx(1005.0).epsilon(kExact));
  }
  // NIST SP 811 B.8: Btu_IT/(lb degF) = Btu_IT/(lb degR) = 4.1868 E+03 J/(kg K) (exact).
  for (const char* text : {"1 Btu/(lb R)", "1 Btu/(lb*R)", "1 Btu/lb/R", "1 Btu/lb-R", "1 Btu/(lb F)",
                           "1 Btu/(lb*F)", "1 Btu/lb/F", "1 Btu/lb-F"}) {
    INFO(text);
    CHECK(si(text, D::specific_heat) == Approx(4186.8).epsilon(kExact));
  }

  CHECK(si("998.2 kg/m3", D::density) == 998.2);
  // 1 lb/ft3 = 0.45359237 kg / 0.028316846592 m3; NIST SP 811 B.8: 1.601846 E+01 kg/m3.
  CHECK(si("1 lb/ft3", D::density) == Approx(0.45359237 / 0.028316846592).epsilon(kExact));
  CHECK(si("1 lb/ft3", D::density) == Approx(16.01846).epsilon(kNist7));

  CHECK(si("0.02897 kg/mol", D::molar_mass) == 0.02897);
  CHECK(si("28.97 g/mol", D::molar_mass) == Approx(0.02897).epsilon(kExact));
  CHECK(si("28.97 kg/kmol", D::molar_mass) == Approx(0.02897).epsilon(kExact));
}

TEST_CASE("fractions: percent or a bare number", "[units][fraction]") {
  CHECK(si("84.5 %", D::fraction) == Approx(0.845).epsilon(kExact));
  CHECK(si("84.5%", D::fraction) == Approx(0.845).epsilon(kExact));  // no space needed before %
  CHECK(si("0.845", D::fraction) == 0.845);
  CHECK(si(" 5 ", D::fraction) == 5.0);  // ranges are the caller's to check
  CHECK(from_si(0.845, "%", D::fraction) == Approx(84.5).epsilon(kExact));
  CHECK(from_si(0.845, "", D::fraction) == 0.845);
  ParseNotes notes;
  CHECK(to_si(0.845, "", D::fraction, ParseContext{}, notes) == 0.845);
}

TEST_CASE("number syntax", "[units][syntax]") {
  CHECK(si("  5   bar  ", D::pressure) == 5e5);
  CHECK(si("\t5\tbar\r\n", D::pressure) == 5e5);
  CHECK(si("+5 bar", D::pressure) == 5e5);
  CHECK(si("5e3 kg/h", D::mass_flow) == Approx(5000.0 / 3600).epsilon(kExact));
  CHECK(si("2.5E-1 MPa", D::pressure) == 2.5e5);
  CHECK(si(".5 bar", D::pressure) == 0.5e5);
  CHECK(si("5. bar", D::pressure) == 5e5);
  CHECK(si("1005 J/(kg K)", D::specific_heat) == 1005.0);  // a unit may hold a space
  CHECK(si("0 kg/s", D::mass_flow) == 0.0);
  CHECK(std::signbit(si("-0 kg/s", D::mass_flow)) == false);  // no negative zero
}

TEST_CASE("every unit: parse agrees with to_si, and from_si inverts it", "[units][roundtrip]") {
  std::set<std::string_view> seen;
  std::size_t count = 0;
  for (Dimension d : kAllDimensions) {
    const auto units = units_of(d);
    CHECK_FALSE(units.empty());
    for (const UnitInfo* u : units) {
      INFO(u->symbol);
      CHECK(u->dimension == d);
      CHECK(find_unit(u->symbol) == u);            // symbols are unique
      CHECK(seen.insert(u->symbol).second);
      ++count;
      // 321.5 is above absolute zero on every temperature scale.
      const double x = 321.5;
      for (std::optional<double> barometer : {std::optional<double>{}, std::optional<double>{97500.0}}) {
        ParseContext context{barometer};
        ParseNotes notes;
        const double value = to_si(x, u->symbol, d, context, notes);
        ParseNotes text_notes;
        CHECK(parse("321.5 " + std::string(u->symbol), d, context, text_notes) == value);
        CHECK(notes.used_default_barometer == (u->gauge && !barometer));
        CHECK(text_notes.used_default_barometer == notes.used_default_barometer);
        CHECK(from_si(value, u->symbol, d, barometer.value_or(kStandardAtmosphere)) ==
              Approx(x).epsilon(1e-13));
      }
    }
  }
  CHECK(count == 87);  // update with docs/units.md when a unit is added
}

TEST_CASE("dimension names", "[units]") {
  CHECK(dimension_name(D::pressure) == "pressure");
  CHECK(dimension_name(D::standard_volume_flow) == "standard volume flow");
  CHECK(dimension_name(D::specific_heat) == "specific heat");
  CHECK(find_unit("kgs") == nullptr);
  CHECK(find_unit("mw") == nullptr);  // symbols are case-sensitive
  CHECK(find_unit("MW")->dimension == D::power);
}

TEST_CASE("the messages users see", "[units][errors]") {
  SECTION("unknown unit") {
    CHECK(parse_error("3.2 kgs", D::mass_flow) ==
          "\"3.2 kgs\": unknown unit \"kgs\" for a mass flow; known units: kg/s, kg/h, t/h, lb/s, "
          "lb/h, klb/h");
    CHECK(parse_error("21 deg C", D::temperature) ==
          "\"21 deg C\": unknown unit \"deg C\" for a temperature; known units: K, degC, C, \u00b0C, "
          "degF, F, \u00b0F, degR, R");
    CHECK(parse_error("1 mw", D::power) ==
          "\"1 mw\": unknown unit \"mw\" for a power; known units: W, kW, MW, hp, Btu/h");
  }
  SECTION("a unit of another dimension") {
    CHECK(parse_error("21 degC", D::pressure) == "\"21 degC\": a temperature unit where a pressure belongs");
    CHECK(parse_error("84.5 %", D::pressure) == "\"84.5 %\": a fraction unit where a pressure belongs");
    CHECK(parse_error("5 kg/s", D::power) == "\"5 kg/s\": a mass flow unit where a power belongs");
  }
  SECTION("missing number or unit") {
    CHECK(parse_error("bar", D::pressure) == "\"bar\": missing number");
    CHECK(parse_error("   ", D::pressure) == "\"\": missing number");
    CHECK(parse_error("5", D::pressure) ==
          "\"5\": missing unit for a pressure; known units: Pa, kPa, MPa, bar, mbar, psi, psia, psig, "
          "barg, kPag, atm, inHg, mmHg, kgf/cm2, kgf/cm2g");
  }
  SECTION("malformed numbers") {
    CHECK(parse_error("3,2 bar", D::pressure) == "\"3,2 bar\": \"3,2\" is not a number");
    CHECK(parse_error("x5 bar", D::pressure) == "\"x5 bar\": \"x5\" is not a number");
    CHECK(parse_error("+-5 bar", D::pressure) == "\"+-5 bar\": \"+-5\" is not a number");
    CHECK(parse_error("0x10 bar", D::pressure) == "\"0x10 bar\": \"0x10\" is not a number");
    CHECK(parse_error("3.2kg/s", D::mass_flow) ==
          "\"3.2kg/s\": put a space between the number and the unit");
  }
  SECTION("numbers that are not finite") {
    CHECK(parse_error("1e400 bar", D::pressure) == "\"1e400 bar\": the number \"1e400\" is out of range");
    CHECK(parse_error("nan bar", D::pressure) == "\"nan bar\": not a finite number");
    CHECK(parse_error("inf K", D::temperature) == "\"inf K\": not a finite number");
    CHECK(parse_error("1e308 MW", D::power) ==
          "\"1e308 MW\": out of range (the value in SI units is not finite)");
  }
  SECTION("pressures at or below zero") {
    CHECK(parse_error("-0.5 bar", D::pressure) == "\"-0.5 bar\": absolute pressure must be above 0");
    CHECK(parse_error("0 psia", D::pressure) == "\"0 psia\": absolute pressure must be above 0");
    CHECK(parse_error("-1.2 barg", D::pressure) ==
          "\"-1.2 barg\" with the default barometer 101.325 kPa gives an absolute pressure of -18675 Pa: "
          "must be above 0");
    CHECK(parse_error("-1 barg", D::pressure, ParseContext{98000.0}) ==
          "\"-1 barg\" with barometer 98 kPa gives an absolute pressure of -2000 Pa: must be above 0");
    CHECK(parse_error("1 barg", D::pressure, ParseContext{-1.0}) ==
          "the site barometric pressure must be a finite number above 0 Pa, got -1 Pa");
  }
  SECTION("temperatures at or below absolute zero") {
    CHECK(parse_error("-300 degC", D::temperature) == "\"-300 degC\" is below absolute zero");
    CHECK(parse_error("-1 K", D::temperature) == "\"-1 K\" is below absolute zero");
    CHECK(parse_error("-273.15 degC", D::temperature) ==
          "\"-273.15 degC\" is absolute zero: a temperature must be above 0 K");
    CHECK(parse_error("-459.67 degF", D::temperature) ==
          "\"-459.67 degF\" is absolute zero: a temperature must be above 0 K");
  }
  SECTION("negative flows, power, length; non-positive properties") {
    CHECK(parse_error("-5 kg/s", D::mass_flow) == "\"-5 kg/s\": a mass flow cannot be negative");
    CHECK(parse_error("-1 m3/h", D::volume_flow) == "\"-1 m3/h\": a volume flow cannot be negative");
    CHECK(parse_error("-1 Nm3/h", D::standard_volume_flow) ==
          "\"-1 Nm3/h\": a standard volume flow cannot be negative");
    CHECK(parse_error("-1 kW", D::power) == "\"-1 kW\": a power cannot be negative");
    CHECK(parse_error("-3 ft", D::length) == "\"-3 ft\": a length cannot be negative");
    CHECK(parse_error("0 kg/m3", D::density) == "\"0 kg/m3\": a density must be above 0");
    CHECK(parse_error("-1 J/(kg K)", D::specific_heat) == "\"-1 J/(kg K)\": a specific heat must be above 0");
    CHECK(parse_error("0 g/mol", D::molar_mass) == "\"0 g/mol\": a molar mass must be above 0");
  }
  SECTION("to_si quotes the number and the unit") {
    auto to_si_error = [](double x, std::string_view unit, Dimension d) {
      return error_of([&] {
        ParseNotes notes;
        to_si(x, unit, d, ParseContext{}, notes);
      });
    };
    CHECK(to_si_error(-1.2, "barg", D::pressure) ==
          "\"-1.2 barg\" with the default barometer 101.325 kPa gives an absolute pressure of -18675 Pa: "
          "must be above 0");
    CHECK(to_si_error(3.2, "kgs", D::mass_flow) ==
          "\"3.2 kgs\": unknown unit \"kgs\" for a mass flow; known units: kg/s, kg/h, t/h, lb/s, lb/h, "
          "klb/h");
    CHECK(to_si_error(std::numeric_limits<double>::quiet_NaN(), "bar", D::pressure) ==
          "\"nan bar\": not a finite number");
    CHECK(to_si_error(5, "", D::length) == "\"5\": missing unit for a length; known units: m, ft");
  }
  SECTION("from_si") {
    CHECK(error_of([] { from_si(1.0, "degC", D::pressure); }) ==
          "\"degC\" is a temperature unit where a pressure belongs");
    CHECK(error_of([] { from_si(1.0, "kWh", D::power); }) ==
          "unknown unit \"kWh\" for a power; known units: W, kW, MW, hp, Btu/h");
  }
}

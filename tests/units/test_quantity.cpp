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
#include <utility>

#include <fmt/format.h>

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
    D::rotational_speed, D::velocity,
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
  CHECK(si("1 kg/cm2", D::pressure) == Approx(98066.5).epsilon(kExact));  // accepted as kgf/cm2
  CHECK(si("1013.25 hPa", D::pressure) == Approx(101325.0).epsilon(kExact));  // SI prefix hecto = 1e2
  CHECK(si("29.92 inHgA", D::pressure) == Approx(29.92 * 3386.389).epsilon(kExact));  // absolute, as inHg
  // Water columns at 4 degC = 39.2 degF: rho g h with rho = 999.972 kg/m3 (the density behind
  // NIST SP 811's "4 degC" water-column factors) and g = 9.80665 m/s2.
  CHECK(si("1 inH2O", D::pressure) == Approx(999.972 * 9.80665 * 0.0254).epsilon(kExact));
  CHECK(si("1 inH2O", D::pressure) == Approx(2.49082e2).epsilon(2e-6));  // NIST SP 811 B.8: inch of water (39.2 degF) = 2.49082 E+02 Pa
  CHECK(si("1 mmH2O", D::pressure) == Approx(999.972 * 9.80665 * 1e-3).epsilon(kExact));
  CHECK(si("10 mmH2O", D::pressure) == Approx(9.80638e1).epsilon(1e-6));  // NIST SP 811 B.8: centimeter of water (4 degC) = 9.80638 E+01 Pa
  // Both differ from the conventional water column (1000 kg/m3: NIST SP 811 B.8 inH2O,
  // conventional = 2.490889 E+02 Pa) by 28 parts per million.
  CHECK(si("1 inH2O", D::pressure) / 2.490889e2 == Approx(0.999972).epsilon(1e-6));
}

TEST_CASE("absolute water columns are noted", "[units][pressure]") {
  ParseNotes notes;
  CHECK(parse("3 inH2O", D::pressure, ParseContext{}, notes) == Approx(3 * 249.08194).epsilon(1e-7));
  CHECK(notes.absolute_water_column);
  ParseNotes mm_notes;
  parse("300 mmH2O", D::pressure, ParseContext{}, mm_notes);
  CHECK(mm_notes.absolute_water_column);
  ParseNotes gauge_notes;
  parse("3 inH2Og", D::pressure, ParseContext{}, gauge_notes);
  CHECK_FALSE(gauge_notes.absolute_water_column);
  ParseNotes bar_notes;
  parse("3 bar", D::pressure, ParseContext{}, bar_notes);
  CHECK_FALSE(bar_notes.absolute_water_column);
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
      {"3 kg/cm2g", 3 * 9.80665e4},                   // contract: kg/cm2g as kgf/cm2g
      {"25 mbarg", 25 * 100.0},                       // NIST SP 811 B.8: millibar = 1.0 E+02 Pa
      {"-120 Pag", -120.0},
      {"8 inH2Og", 8 * 2.49082e2},                    // NIST SP 811 B.8: inch of water (39.2 degF) = 2.49082 E+02 Pa
      {"-35 mmH2Og", -3.5 * 9.80638e1},               // NIST SP 811 B.8: centimeter of water (4 degC) = 9.80638 E+01 Pa
  };
  for (const Row& row : rows) {
    INFO(row.text);
    ParseNotes notes;
    CHECK(parse(row.text, D::pressure, ParseContext{}, notes) ==
          Approx(row.gauge_pa + 101325.0).epsilon(1e-8));
    CHECK(notes.used_default_barometer);

    ParseNotes site_notes;
    ParseContext site{98000.0};
    CHECK(parse(row.text, D::pressure, site, site_notes) == Approx(row.gauge_pa + 98000.0).epsilon(1e-8));
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
  // lbm is the pound mass, the same avoirdupois pound (NIST SP 811 B.8)
  CHECK(si("1 lbm/h", D::mass_flow) == Approx(0.45359237 / 3600).epsilon(kExact));
  CHECK(si("1 lbm/hr", D::mass_flow) == Approx(0.45359237 / 3600).epsilon(kExact));
  CHECK(si("1 lbm/s", D::mass_flow) == Approx(0.45359237).epsilon(kExact));
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
  CHECK(si("3600 m3/hr", D::volume_flow) == Approx(1.0).epsilon(kExact));
  CHECK(si("60 m3/min", D::volume_flow) == Approx(1.0).epsilon(kExact));
  CHECK(si("60 L/min", D::volume_flow) == Approx(1e-3).epsilon(kExact));
  CHECK(si("60 l/min", D::volume_flow) == Approx(1e-3).epsilon(kExact));
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

  // The further spellings and the daily units (a day is 86400 s).
  CHECK(si("1 Nm3/hr", D::standard_volume_flow) == Approx(101325 / (R * 273.15) / 3600).epsilon(kExact));
  CHECK(si("1 Sm3/hr", D::standard_volume_flow) == Approx(101325 / (R * 288.15) / 3600).epsilon(kExact));
  CHECK(si("1 Sm3/d", D::standard_volume_flow) == Approx(101325 / (R * 288.15) / 86400).epsilon(kExact));
  // MMSCMD: a million standard m3 per day (ISO 13443 reference, as Sm3).
  CHECK(si("1 MMSCMD", D::standard_volume_flow) == Approx(1e6 * 101325 / (R * 288.15) / 86400).epsilon(kExact));
  CHECK(si("1 scfh", D::standard_volume_flow) == Approx(mol_per_scf / 3600).epsilon(1e-12));
  CHECK(si("1 SCFH", D::standard_volume_flow) == Approx(mol_per_scf / 3600).epsilon(1e-12));
  // MSCFD: a thousand standard cubic feet per day (M = 1000 in US gas practice).
  CHECK(si("1 MSCFD", D::standard_volume_flow) == Approx(mmscfd / 1000).epsilon(1e-5));
  CHECK(si("1 Mscfd", D::standard_volume_flow) == Approx(1e3 * mol_per_scf / 86400).epsilon(1e-12));
  CHECK(si("1000 MSCFD", D::standard_volume_flow) ==
        Approx(si("1 MMSCFD", D::standard_volume_flow)).epsilon(1e-12));
}

TEST_CASE("molar flows carry no reference state", "[units][flow]") {
  CHECK(si("3.6 kmol/h", D::standard_volume_flow) == Approx(1.0).epsilon(kExact));
  CHECK(si("3.6 kmol/hr", D::standard_volume_flow) == Approx(1.0).epsilon(kExact));
  CHECK(si("0.002 kmol/s", D::standard_volume_flow) == Approx(2.0).epsilon(kExact));
  // A pound-mole is 453.59237 mol: the pound in grams (NIST SP 811 B.8: lb = 0.45359237 kg).
  CHECK(si("1 lbmol/h", D::standard_volume_flow) == Approx(453.59237 / 3600).epsilon(kExact));
  CHECK(si("1 lbmol/hr", D::standard_volume_flow) == Approx(453.59237 / 3600).epsilon(kExact));
  // One lbmol at 60 degF, 14.696 psia fills 379.48 scf (see MMSCFD above): 379.48 scfh = 1 lbmol/h.
  CHECK(si("379.48 scfh", D::standard_volume_flow) ==
        Approx(si("1 lbmol/h", D::standard_volume_flow)).epsilon(2e-5));

  ParseContext site;
  site.standard_conditions = StandardConditions{1e5, 293.15};
  ParseNotes notes;
  CHECK(parse("3.6 kmol/h", D::standard_volume_flow, site, notes) == Approx(1.0).epsilon(kExact));
  CHECK_FALSE(notes.standard_reference.has_value());
  CHECK_FALSE(standard_reference(*find_unit("kmol/h"), site).has_value());
}

TEST_CASE("site standard conditions replace the reference of the standard units, not of Nm3",
          "[units][flow][standard]") {
  const double R = 8.31446261815324;          // J/(mol K), CODATA 2018 (exact)
  const double psi = 6894.757293168;          // Pa, lbf/in2 from the exact lb, g and in
  const double ft3 = 0.028316846592;          // m3, exact
  // Air-compressor practice (common practice, see docs/units.md): 68 degF, 14.7 psia.
  ParseContext site;
  site.standard_conditions = StandardConditions{14.7 * psi, (68 + 459.67) / 1.8};
  ParseNotes notes;
  CHECK(parse("1 scfm", D::standard_volume_flow, site, notes) ==
        Approx(14.7 * psi * ft3 / (R * (68 + 459.67) / 1.8) / 60).epsilon(1e-12));
  REQUIRE(notes.standard_reference.has_value());
  CHECK(notes.standard_reference->basis == "site.standard_conditions");
  CHECK(describe(*notes.standard_reference) == "68 degF, 14.7 psia (site.standard_conditions)");
  // Against the default 60 degF, 14.696 psia: 527.67/519.67 * 14.696/14.7, 1.5 % less gas per scf.
  CHECK(parse("1 scfm", D::standard_volume_flow, site, notes) / si("1 scfm", D::standard_volume_flow) ==
        Approx((14.7 / 14.696) * (519.67 / 527.67)).epsilon(1e-12));

  SECTION("Sm3 follows; Nm3 keeps DIN 1343's state") {
    ParseContext metric;
    metric.standard_conditions = StandardConditions{101325.0, 293.15};  // 20 degC, 1 atm
    ParseNotes n;
    CHECK(parse("1 Sm3/h", D::standard_volume_flow, metric, n) == Approx(101325 / (R * 293.15) / 3600).epsilon(1e-12));
    CHECK(describe(*n.standard_reference) == "20 degC, 101.325 kPa (site.standard_conditions)");
    CHECK(parse("1 MMSCMD", D::standard_volume_flow, metric, n) ==
          Approx(1e6 * 101325 / (R * 293.15) / 86400).epsilon(1e-12));
    CHECK(parse("1 Nm3/h", D::standard_volume_flow, metric, n) == Approx(101325 / (R * 273.15) / 3600).epsilon(kExact));
    CHECK(describe(*n.standard_reference) == "0 degC, 101.325 kPa (DIN 1343)");
  }
  SECTION("the default references, in words") {
    const ParseContext none;
    CHECK(describe(*standard_reference(*find_unit("scfm"), none)) == "60 degF, 14.696 psia (US gas practice)");
    CHECK(describe(*standard_reference(*find_unit("MMSCFD"), none)) == "60 degF, 14.696 psia (US gas practice)");
    CHECK(describe(*standard_reference(*find_unit("Sm3/d"), none)) == "15 degC, 101.325 kPa (ISO 13443)");
    CHECK(describe(*standard_reference(*find_unit("Nm3/hr"), site)) == "0 degC, 101.325 kPa (DIN 1343)");
    CHECK(describe(*standard_reference(*find_unit("MSCFD"), site)) == "68 degF, 14.7 psia (site.standard_conditions)");
    CHECK_FALSE(standard_reference(*find_unit("kg/s"), site).has_value());
  }
  SECTION("every standard unit: the override applies to all but Nm3 and the molar units") {
    for (const UnitInfo* u : units_of(D::standard_volume_flow)) {
      INFO(u->symbol);
      const bool molar = u->symbol.find("mol") != std::string_view::npos;
      const bool normal = u->symbol.front() == 'N';
      CHECK((u->reference == nullptr) == molar);
      CHECK(u->follows_site_conditions == (!molar && !normal));
      CHECK((effective_scale(*u, site) == u->scale) == (molar || normal));
    }
  }
  SECTION("from_si with the context inverts parse") {
    ParseNotes n;
    const double mol_s = parse("2850 scfm", D::standard_volume_flow, site, n);
    CHECK(from_si(mol_s, "scfm", D::standard_volume_flow, site) == Approx(2850.0).epsilon(1e-13));
    CHECK(from_si(mol_s, "scfm", D::standard_volume_flow) == Approx(2850.0 * (14.7 / 14.696) * (519.67 / 527.67)).epsilon(1e-12));
  }
  SECTION("the batch's way: effective_scale times the number") {
    CHECK(effective_scale(*find_unit("scfm"), site) * 2850.0 ==
          Approx(parse("2850 scfm", D::standard_volume_flow, site, notes)).epsilon(1e-15));
    CHECK(effective_scale(*find_unit("scfm"), ParseContext{}) == find_unit("scfm")->scale);
  }
  SECTION("unusable standard conditions") {
    ParseContext bad;
    bad.standard_conditions = StandardConditions{101325.0, 0.0};
    CHECK(parse_error("1 scfm", D::standard_volume_flow, bad) ==
          "the site standard conditions must have a finite pressure and temperature above 0, got 101325 Pa and 0 K");
    bad.standard_conditions = StandardConditions{-1.0, 288.15};
    CHECK(parse_error("1 Sm3/h", D::standard_volume_flow, bad) ==
          "the site standard conditions must have a finite pressure and temperature above 0, got -1 Pa and 288.15 K");
    CHECK(parse("1 Nm3/h", D::standard_volume_flow, bad, notes) > 0);  // Nm3 does not read them
  }
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
  CHECK(si("1 bhp", D::power) == Approx(745.7).epsilon(kExact));  // contract: bhp as hp
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
  CHECK(si("450 mm", D::length) == Approx(0.45).epsilon(kExact));
  CHECK(si("45 cm", D::length) == Approx(0.45).epsilon(kExact));
  CHECK(si("18 in", D::length) == Approx(18 * 0.0254).epsilon(kExact));  // NIST SP 811 B.8: in = 2.54 E-02 m (exact)

  CHECK(si("1 Btu/lbm", D::specific_energy) == Approx(2326.0).epsilon(kExact));
  CHECK(si("1 ft-lbf/lbm", D::specific_energy) == Approx(2.98906692).epsilon(kExact));
}

TEST_CASE("rotational speed in rev/s, velocity in m/s", "[units][speed]") {
  CHECK(si("3000 rpm", D::rotational_speed) == Approx(50.0).epsilon(kExact));  // 1 min = 60 s
  CHECK(si("3000 RPM", D::rotational_speed) == Approx(50.0).epsilon(kExact));
  CHECK(si("3000 r/min", D::rotational_speed) == Approx(50.0).epsilon(kExact));  // SI Brochure spelling
  CHECK(si("3000 rev/min", D::rotational_speed) == Approx(50.0).epsilon(kExact));
  CHECK(si("3000 1/min", D::rotational_speed) == Approx(50.0).epsilon(kExact));
  CHECK(si("50 rev/s", D::rotational_speed) == 50.0);
  CHECK(si("50 r/s", D::rotational_speed) == 50.0);
  CHECK(si("50 1/s", D::rotational_speed) == 50.0);
  CHECK(si("50 Hz", D::rotational_speed) == 50.0);  // one revolution per period
  // 2 pi rad per revolution: 3000 rpm = 100 pi rad/s = 314.159265... rad/s.
  CHECK(si("314.1592653589793 rad/s", D::rotational_speed) == Approx(50.0).epsilon(1e-15));
  CHECK(from_si(50.0, "rpm", D::rotational_speed) == Approx(3000.0).epsilon(kExact));
  CHECK(parse_error("-3000 rpm", D::rotational_speed) == "\"-3000 rpm\": a rotational speed cannot be negative");

  CHECK(si("250 m/s", D::velocity) == 250.0);
  CHECK(si("1000 ft/s", D::velocity) == Approx(304.8).epsilon(kExact));  // NIST SP 811 B.8: ft/s = 3.048 E-01 m/s
  CHECK(parse_error("-1 m/s", D::velocity) == "\"-1 m/s\": a velocity cannot be negative");
  CHECK(parse_error("3000 rps", D::rotational_speed) ==
        "\"3000 rps\": unknown unit \"rps\" for a rotational speed; known units: rpm, 1/min, rev/s, Hz, rad/s");
}

TEST_CASE("vacuum below the site barometer: inHgV", "[units][pressure][vacuum]") {
  // p = barometer - reading; inHg at 0 degC = 3386.389 Pa (contract; NIST SP 811 B.8).
  ParseNotes notes;
  CHECK(parse("20 inHgV", D::pressure, ParseContext{100000.0}, notes) ==
        Approx(100000.0 - 20 * 3386.389).epsilon(kExact));
  CHECK_FALSE(notes.used_default_barometer);
  ParseNotes default_notes;
  CHECK(parse("28 inHgV", D::pressure, ParseContext{}, default_notes) ==
        Approx(101325.0 - 28 * 3386.389).epsilon(kExact));
  CHECK(default_notes.used_default_barometer);
  CHECK(to_si(0.0, "inHgV", D::pressure, ParseContext{99000.0}, notes) == 99000.0);  // no vacuum: the barometer
  CHECK(from_si(100000.0 - 20 * 3386.389, "inHgV", D::pressure, 100000.0) == Approx(20.0).epsilon(kExact));
  CHECK(from_si(5000.0, "inHgV", D::pressure, ParseContext{96000.0}) == Approx(91000.0 / 3386.389).epsilon(kExact));
  const UnitInfo& u = *find_unit("inHgV");
  CHECK(u.vacuum());
  CHECK(u.gauge);
  // The batch's formula SI = scale * x + barometer holds with the negative scale.
  CHECK(u.scale * 20 + 100000.0 == Approx(100000.0 - 20 * 3386.389).epsilon(kExact));
  CHECK_FALSE(find_unit("inHg")->vacuum());
  CHECK_FALSE(find_unit("psig")->vacuum());

  CHECK(parse_error("31 inHgV", D::pressure) ==
        "\"31 inHgV\": a vacuum of 104.978 kPa is not below the default barometer 101.325 kPa; a vacuum reading "
        "must be less than the barometer");
  CHECK(parse_error("29 inHgV", D::pressure, ParseContext{98000.0}) ==
        "\"29 inHgV\": a vacuum of 98.2053 kPa is not below barometer 98 kPa; a vacuum reading must be less "
        "than the barometer");
  CHECK(parse_error("-25 inHgV", D::pressure) ==
        "\"-25 inHgV\": a vacuum reading cannot be negative (inHgV counts down from the barometer)");
}

TEST_CASE("a quantity of several dimensions: the pump head", "[units][head]") {
  const Dimension head[] = {D::length, D::specific_energy};
  ParseNotes notes;
  const AnyQuantity feet = parse_any("280 ft", head, "head", ParseContext{}, notes);
  CHECK(feet.dimension == D::length);
  CHECK(feet.si == Approx(280 * 0.3048).epsilon(kExact));
  const AnyQuantity mm = parse_any("850 mm", head, "head", ParseContext{}, notes);
  CHECK(mm.dimension == D::length);
  CHECK(mm.si == Approx(0.85).epsilon(kExact));
  const AnyQuantity energy = parse_any("0.83 kJ/kg", head, "head", ParseContext{}, notes);
  CHECK(energy.dimension == D::specific_energy);
  CHECK(energy.si == Approx(830.0).epsilon(kExact));
  CHECK(to_si_any(85.0, "m", head, "head", ParseContext{}, notes).si == 85.0);

  auto head_error = [&](std::string_view text) {
    return error_of([&] { parse_any(text, head, "head", ParseContext{}, notes); });
  };
  CHECK(head_error("85 yd") ==
        "\"85 yd\": unknown unit \"yd\" for a head; known units: m, mm, cm, in, ft, J/kg, kJ/kg, Btu/lb, ft-lbf/lb");
  CHECK(head_error("85") ==
        "\"85\": missing unit for a head; known units: m, mm, cm, in, ft, J/kg, kJ/kg, Btu/lb, ft-lbf/lb");
  CHECK(head_error("85 kg/s") == "\"85 kg/s\": a mass flow unit where a head belongs");
  CHECK(head_error("-85 m") == "\"-85 m\": a length cannot be negative");
  CHECK(error_of([&] { to_si_any(85.0, "yd", head, "head", ParseContext{}, notes); }) ==
        "\"85 yd\": unknown unit \"yd\" for a head; known units: m, mm, cm, in, ft, J/kg, kJ/kg, Btu/lb, ft-lbf/lb");
  // A fraction among the allowed dimensions takes a bare number.
  const Dimension ratio[] = {D::fraction};
  CHECK(parse_any("0.8", ratio, "efficiency", ParseContext{}, notes).si == 0.8);
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
  CHECK(si("1 Btu/(lbm R)", D::specific_heat) == Approx(4186.8).epsilon(kExact));
  CHECK(si("1 Btu/lbm-R", D::specific_heat) == Approx(4186.8).epsilon(kExact));

  CHECK(si("998.2 kg/m3", D::density) == 998.2);
  // 1 lb/ft3 = 0.45359237 kg / 0.028316846592 m3; NIST SP 811 B.8: 1.601846 E+01 kg/m3.
  CHECK(si("1 lb/ft3", D::density) == Approx(0.45359237 / 0.028316846592).epsilon(kExact));
  CHECK(si("1 lb/ft3", D::density) == Approx(16.01846).epsilon(kNist7));
  CHECK(si("1 lbm/ft3", D::density) == Approx(16.01846).epsilon(kNist7));

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
      // 321.5 is above absolute zero on every temperature scale; a vacuum of 7.25 inHg
      // (24.6 kPa) stays below both barometers.
      const double x = u->vacuum() ? 7.25 : 321.5;
      const std::string text = fmt::format("{} {}", x, u->symbol);
      for (std::optional<double> barometer : {std::optional<double>{}, std::optional<double>{97500.0}}) {
        for (std::optional<StandardConditions> standard :
             {std::optional<StandardConditions>{}, std::optional<StandardConditions>{{100000.0, 293.15}}}) {
          ParseContext context{barometer, standard};
          ParseNotes notes;
          const double value = to_si(x, u->symbol, d, context, notes);
          ParseNotes text_notes;
          CHECK(parse(text, d, context, text_notes) == value);
          CHECK(notes.used_default_barometer == (u->gauge && !barometer));
          CHECK(text_notes.used_default_barometer == notes.used_default_barometer);
          CHECK(from_si(value, u->symbol, d, context) == Approx(x).epsilon(1e-13));
          if (!standard) {
            CHECK(from_si(value, u->symbol, d, barometer.value_or(kStandardAtmosphere)) == Approx(x).epsilon(1e-13));
          }
        }
      }
    }
  }
  CHECK(count == 139);  // update with docs/units.md when a unit is added
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
          "\"5\": missing unit for a pressure; known units: Pa, kPa, MPa, bar, mbar, hPa, psi, psia, psig, "
          "barg, mbarg, Pag, kPag, atm, inHg, inHgV, mmHg, inH2O, inH2Og, mmH2O, mmH2Og, kgf/cm2, kgf/cm2g");
    CHECK(parse_error("5", D::standard_volume_flow) ==
          "\"5\": missing unit for a standard volume flow; known units: Nm3/h, Sm3/h, Sm3/d, MMSCMD, scfm, scfh, "
          "MSCFD, MMSCFD, mol/s, kmol/s, kmol/h, lbmol/h");
    CHECK(parse_error("5", D::volume_flow) ==
          "\"5\": missing unit for a volume flow; known units: m3/s, m3/min, m3/h, L/s, L/min, gpm, acfm, cfm");
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
    // An absolute unit with a gauge twin names it.
    const std::pair<const char*, const char*> absolute_units[] = {
        {"-0.5 bar", "bar is absolute; a reading relative to the barometer is written barg"},
        {"0 psia", "psia is absolute; a reading relative to the barometer is written psig"},
        {"-4 inH2O", "inH2O is absolute; a reading relative to the barometer is written inH2Og"},
        {"-4 mmH2O", "mmH2O is absolute; a reading relative to the barometer is written mmH2Og"},
        {"0 Pa", "Pa is absolute; a reading relative to the barometer is written Pag"},
    };
    for (const auto& [text, hint] : absolute_units) {
      CHECK(parse_error(text, D::pressure) ==
            fmt::format("\"{}\": absolute pressure must be above 0 ({})", text, hint));
    }
    CHECK(parse_error("-1 atm", D::pressure) == "\"-1 atm\": absolute pressure must be above 0");  // no atmg
    CHECK(parse_error("-1 inHg", D::pressure) == "\"-1 inHg\": absolute pressure must be above 0");  // inHgV is no twin
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
    CHECK(to_si_error(5, "", D::length) == "\"5\": missing unit for a length; known units: m, mm, cm, in, ft");
  }
  SECTION("from_si") {
    CHECK(error_of([] { from_si(1.0, "degC", D::pressure); }) ==
          "\"degC\" is a temperature unit where a pressure belongs");
    CHECK(error_of([] { from_si(1.0, "kWh", D::power); }) ==
          "unknown unit \"kWh\" for a power; known units: W, kW, MW, hp, Btu/h");
  }
}

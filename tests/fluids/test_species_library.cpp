// SpeciesLibrary: the built-in species, the three file formats and their error messages.
#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

using shaftwork::Error;
using shaftwork::ErrorKind;
using shaftwork::fluids::CompositionBasis;
using shaftwork::fluids::NasaInterval;
using shaftwork::fluids::NasaPolynomialGas;
using shaftwork::fluids::NasaSpecies;
using shaftwork::fluids::SpeciesLibrary;

namespace {

// Runs `parse` and returns the message of the bad_input error it must throw.
template <class Parse>
std::string parse_error(Parse&& parse) {
  try {
    parse();
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_input);
    return e.what();
  }
  FAIL("no error was thrown");
  return {};
}

bool same_interval(const NasaInterval& x, const NasaInterval& y) {
  return x.t_low == y.t_low && x.t_high == y.t_high && x.a == y.a && x.b1 == y.b1 && x.b2 == y.b2;
}

// The N2 record of the NASA Glenn database (McBride, Zehe & Gordon, NASA/TP-2002-211556;
// thermo.inp dated 9/09/04), copied figure for figure, all three intervals.
const std::string kN2Record =
    "N2                Ref-Elm. Gurvich,1978 pt1 p280 pt2 p207.\n"
    " 3 tpis78 N   2.00    0.00    0.00    0.00    0.00 0   28.0134000          0.000\n"
    "    200.000   1000.0007 -2.0 -1.0  0.0  1.0  2.0  3.0  4.0  0.0         8670.104\n"
    " 2.210371497D+04-3.818461820D+02 6.082738360D+00-8.530914410D-03 1.384646189D-05\n"
    "-9.625793620D-09 2.519705809D-12                 7.108460860D+02-1.076003744D+01\n"
    "   1000.000   6000.0007 -2.0 -1.0  0.0  1.0  2.0  3.0  4.0  0.0         8670.104\n"
    " 5.877124060D+05-2.239249073D+03 6.066949220D+00-6.139685500D-04 1.491806679D-07\n"
    "-1.923105485D-11 1.061954386D-15                 1.283210415D+04-1.586640027D+01\n"
    "   6000.000  20000.0007 -2.0 -1.0  0.0  1.0  2.0  3.0  4.0  0.0         8670.104\n"
    " 8.310139160D+08-6.420733540D+05 2.020264635D+02-3.065092046D-02 2.486903333D-06\n"
    "-9.705954110D-11 1.437538881D-15                 4.938707040D+06-1.672099740D+03\n";

// The first two intervals of the same record, as a two-interval record.
const std::string kN2TwoIntervals =
    "N2                Ref-Elm. Gurvich,1978 pt1 p280 pt2 p207.\n"
    " 2 tpis78 N   2.00    0.00    0.00    0.00    0.00 0   28.0134000          0.000\n"
    "    200.000   1000.0007 -2.0 -1.0  0.0  1.0  2.0  3.0  4.0  0.0         8670.104\n"
    " 2.210371497D+04-3.818461820D+02 6.082738360D+00-8.530914410D-03 1.384646189D-05\n"
    "-9.625793620D-09 2.519705809D-12                 7.108460860D+02-1.076003744D+01\n"
    "   1000.000   6000.0007 -2.0 -1.0  0.0  1.0  2.0  3.0  4.0  0.0         8670.104\n"
    " 5.877124060D+05-2.239249073D+03 6.066949220D+00-6.139685500D-04 1.491806679D-07\n"
    "-1.923105485D-11 1.061954386D-15                 1.283210415D+04-1.586640027D+01\n";

// The N2 record of GRI-Mech 3.0 (Smith et al., thermo30.dat), a published 7-coefficient
// record: 300-1000 K and 1000-5000 K.
const std::string kGriN2 =
    "N2                121286N   2               G   300.000  5000.000  1000.000    1\n"
    " 0.02926640E+02 0.14879768E-02-0.05684760E-05 0.10097038E-09-0.06753351E-13    2\n"
    "-0.09227977E+04 0.05980528E+02 0.03298677E+02 0.14082404E-02-0.03963222E-04    3\n"
    " 0.05641515E-07-0.02444854E-10-0.10208999E+04 0.03950372E+02                   4\n";

std::string replaced(std::string text, const std::string& from, const std::string& to) {
  const auto at = text.find(from);
  REQUIRE(at != std::string::npos);
  return text.replace(at, from.size(), to);
}

}  // namespace

TEST_CASE("the built-in library holds the documented species and aliases") {
  const SpeciesLibrary& library = SpeciesLibrary::built_in();
  std::vector<std::string> names;
  for (const NasaSpecies& sp : library.species()) names.push_back(sp.name);
  const std::vector<std::string> expected = {
      "N2",  "O2",  "Ar",  "CO2", "H2O", "CH4", "C2H6", "C3H8", "C4H10,n-butane", "C4H10,isobutane",
      "C5H12,n-pentane", "C5H12,i-pentane", "C6H14,n-hexane", "H2", "He", "CO", "H2S", "NH3", "SO2",
      "Ne", "Kr", "Xe", "C2H4", "C3H6,propylene", "NO", "NO2", "N2O"};
  CHECK(names == expected);

  CHECK(library.find("n-C4H10") == library.find("C4H10,n-butane"));
  CHECK(library.find("i-C4H10") == library.find("C4H10,isobutane"));
  CHECK(library.find("n-C5H12") == library.find("C5H12,n-pentane"));
  CHECK(library.find("i-C5H12") == library.find("C5H12,i-pentane"));
  CHECK(library.find("n-C6H14") == library.find("C6H14,n-hexane"));
  CHECK(library.find("C3H6") == library.find("C3H6,propylene"));
  CHECK(library.find("n-C4H10")->name == "C4H10,n-butane");
  CHECK(library.aliases_of("C4H10,n-butane") == std::vector<std::string>{"n-C4H10"});
  CHECK(library.aliases_of("N2").empty());
  CHECK(library.find("co") == nullptr);  // formulas are case-sensitive
  CHECK(library.find("air") == nullptr);

  for (const NasaSpecies& sp : library.species()) {
    INFO(sp.name);
    REQUIRE(sp.intervals.size() == 2);
    CHECK(sp.intervals.front().t_low == 200.0);
    CHECK(sp.intervals[0].t_high == 1000.0);
    CHECK(sp.intervals.back().t_high == 6000.0);
    CHECK(sp.source.rfind("NASA Glenn thermo.inp record " + sp.name + ", code ", 0) == 0);
  }
  // Molar masses as the database gives them, g/mol (NASA/TP-2002-211556 record line 2).
  CHECK(library.find("N2")->molar_mass == Approx(28.0134e-3).epsilon(1e-12));
  CHECK(library.find("CH4")->molar_mass == Approx(16.04246e-3).epsilon(1e-12));
  CHECK(library.find("H2O")->source ==
        "NASA Glenn thermo.inp record H2O, code g 8/89: Hf:Cox,1989. Woolley,1987. TRC(10/88) tuv25.");
}

TEST_CASE("parse_nasa9 reads a database record exactly as the built-in data hold it") {
  const std::string text = "! a small file in the published layout\n"
                           "thermo\n"
                           "    200.00   1000.00   6000.00  20000.     9/09/04\n" +
                           kN2Record +
                           // A condensed phase (skipped) and the end of the products.
                           "ALI3(L)           Liquid. Gurvich,1996a pt1 p193 pt2 p155.\n"
                           " 1 tpis96 AL  1.00I   3.00    0.00    0.00    0.00 2  407.6949480    -302900.000\n"
                           "    461.470   6000.0007 -2.0 -1.0  0.0  1.0  2.0  3.0  4.0  0.0        22300.000\n"
                           " 0.000000000D+00 0.000000000D+00 1.455287203D+01 0.000000000D+00 0.000000000D+00\n"
                           " 0.000000000D+00 0.000000000D+00                -3.913903150D+04-5.670488781D+01\n"
                           "END PRODUCTS\n"
                           // A reactant with an assigned enthalpy and no intervals (skipped).
                           "CH4(L)            Methane. McBride,1996 pp85,93.\n"
                           " 0 g 6/96 C   1.00H   4.00    0.00    0.00    0.00 1   16.0424600     -89233.000\n"
                           "    111.643      0.0000  0.0  0.0  0.0  0.0  0.0  0.0  0.0  0.0            0.000\n"
                           "END REACTANTS\n";
  const SpeciesLibrary library = SpeciesLibrary::parse_nasa9(text, "small.inp");
  REQUIRE(library.species().size() == 1);
  const NasaSpecies& n2 = library.species().front();
  const NasaSpecies& built_in = *SpeciesLibrary::built_in().find("N2");
  CHECK(n2.name == "N2");
  CHECK(n2.molar_mass == built_in.molar_mass);
  REQUIRE(n2.intervals.size() == 3);
  CHECK(same_interval(n2.intervals[0], built_in.intervals[0]));
  CHECK(same_interval(n2.intervals[1], built_in.intervals[1]));
  CHECK(n2.intervals[2].t_low == 6000.0);
  CHECK(n2.intervals[2].t_high == 20000.0);
  CHECK(n2.intervals[2].b2 == -1.672099740e+03);
  CHECK(n2.source == "small.inp line 4 (NASA 9-coefficient record, code tpis78): Ref-Elm. Gurvich,1978 pt1 p280 pt2 p207.");

  // The same figures give the same states (up to 6000 K, where the built-in data stop).
  const NasaPolynomialGas from_file({{&n2, 1.0}}, CompositionBasis::mole);
  const NasaPolynomialGas from_built_in({{&built_in, 1.0}}, CompositionBasis::mole);
  CHECK(from_file.temperature_range().high == 20000.0);
  for (double T : {250.0, 999.0, 1000.0, 4000.0}) {
    CHECK(from_file.from_pt(2e5, T).enthalpy == from_built_in.from_pt(2e5, T).enthalpy);
    CHECK(from_file.from_pt(2e5, T).cp == from_built_in.from_pt(2e5, T).cp);
  }
}

TEST_CASE("parse_nasa9 errors name the origin, the line and what is wrong") {
  SECTION("a malformed number") {
    const std::string text = replaced(kN2TwoIntervals, "1.384646189D-05", "1.3846x6189D-05");
    CHECK(parse_error([&] { SpeciesLibrary::parse_nasa9(text, "bad.inp"); }) ==
          "bad.inp:4: N2: columns 65-80 should hold coefficient a4 of interval 1, found "
          "'1.3846x6189D-05'");
  }
  SECTION("a record that ends early") {
    const std::string text = kN2TwoIntervals.substr(0, kN2TwoIntervals.find("   1000.000   6000"));
    CHECK(parse_error([&] { SpeciesLibrary::parse_nasa9(text, "short.inp"); }) ==
          "short.inp:5: N2: the record that begins on line 1 ends early: the temperature line of "
          "interval 2 of 2 is missing");
  }
  SECTION("a missing coefficient line, with more lines after it") {
    // The temperature line of interval 2 is read where the second coefficient line of
    // interval 1 should be.
    const std::string second_line_of_first_interval =
        "-9.625793620D-09 2.519705809D-12                 7.108460860D+02-1.076003744D+01\n";
    const std::string text =
        replaced(kN2TwoIntervals, second_line_of_first_interval, "") + kN2TwoIntervals;
    CHECK(parse_error([&] { SpeciesLibrary::parse_nasa9(text, "gap.inp"); }) ==
          "gap.inp:5: N2: columns 1-16 should hold coefficient a5 of interval 1, found '1000.000   60'");
  }
  SECTION("intervals that are not contiguous") {
    const std::string text = replaced(kN2TwoIntervals, "   1000.000   6000.000", "   1100.000   6000.000");
    CHECK(parse_error([&] { SpeciesLibrary::parse_nasa9(text, "gap.inp"); }) ==
          "gap.inp:6: N2: interval 2 starts at 1100 K but interval 1 ends at 1000 K; the intervals "
          "must be ascending and contiguous");
  }
  SECTION("intervals that do not meet in H") {
    const std::string text = replaced(kN2TwoIntervals, "1.283210415D+04", "1.293210415D+04");
    CHECK(parse_error([&] { SpeciesLibrary::parse_nasa9(text, "jump.inp"); }) ==
          "jump.inp:6: N2: H° jumps by 0.037 (relative) at the joint 1000 K of intervals 1 and 2: "
          "21.462152 kJ/mol below, 22.293599 kJ/mol above; the intervals must meet within 1e-4");
  }
  SECTION("a temperature exponent other than the standard set") {
    const std::string text = replaced(kN2TwoIntervals, "7 -2.0 -1.0  0.0", "7 -3.0 -1.0  0.0");
    CHECK(parse_error([&] { SpeciesLibrary::parse_nasa9(text, "exp.inp"); }) ==
          "exp.inp:3: N2: the temperature exponents in columns 24-63 must be -2 -1 0 1 2 3 4 0, "
          "found '-3.0 -1.0  0.0  1.0  2.0  3.0  4.0  0.0'");
  }
  SECTION("a name defined twice") {
    const std::string text = kN2TwoIntervals + kN2TwoIntervals;
    CHECK(parse_error([&] { SpeciesLibrary::parse_nasa9(text, "twice.inp"); }) ==
          "twice.inp:9: N2 is defined twice (first on line 1)");
  }
}

TEST_CASE("parse_nasa7 reads a published 7-coefficient record") {
  const std::string text = "THERMO\n   300.000  1000.000  5000.000\n" + kGriN2 + "END\n";
  const SpeciesLibrary library = SpeciesLibrary::parse_nasa7(text, "thermo30.dat");
  REQUIRE(library.species().size() == 1);
  const NasaSpecies& n2 = library.species().front();
  CHECK(n2.name == "N2");
  // 2 x 14.0067 g/mol, the atomic weight of N in data/elements.txt (from the NASA database).
  CHECK(n2.molar_mass == Approx(28.0134e-3).epsilon(1e-12));
  REQUIRE(n2.intervals.size() == 2);
  CHECK(n2.intervals[0].t_low == 300.0);
  CHECK(n2.intervals[0].t_high == 1000.0);
  CHECK(n2.intervals[1].t_high == 5000.0);
  CHECK(n2.intervals[0].a[0] == 0.0);
  CHECK(n2.intervals[0].a[1] == 0.0);
  CHECK(n2.intervals[0].a[2] == 0.03298677E+02);
  CHECK(n2.intervals[1].b2 == 0.05980528E+02);
  CHECK(n2.source == "thermo30.dat line 3 (NASA 7-coefficient record, date/code 121286)");

  const NasaPolynomialGas gas({{&n2, 1.0}}, CompositionBasis::mole);
  const double R = 8.31446261815324 / 28.0134e-3;  // J/(kg K)
  // cp/R = a1 + a2 T + a3 T^2 + a4 T^3 + a5 T^4 evaluated by hand from the record's figures:
  // lower interval at 300 K: 3.4969767276; upper interval at 1500 K: 4.1861203930625.
  CHECK(gas.from_pt(1e5, 300.0).cp == Approx(3.4969767276 * R).epsilon(1e-12));
  CHECK(gas.from_pt(1e5, 1500.0).cp == Approx(4.1861203930625 * R).epsilon(1e-12));
  // NIST-JANAF (Chase 1998) N2: cp = 29.125 J/(mol K) at 300 K and 34.843 at 1500 K (the
  // values also used in test_nasa_polynomial.cpp); the GRI fit is within 0.2 %.
  CHECK(gas.from_pt(1e5, 300.0).cp * 28.0134e-3 == Approx(29.125).epsilon(0.002));
  CHECK(gas.from_pt(1e5, 1500.0).cp * 28.0134e-3 == Approx(34.843).epsilon(0.002));
  CHECK(gas.temperature_range().low == 300.0);
  CHECK(gas.temperature_range().high == 5000.0);
}

TEST_CASE("parse_nasa7 takes the common temperature from THERMO when a record leaves it blank") {
  const std::string record = replaced(kGriN2, "  1000.000    1", "              1");
  const SpeciesLibrary library =
      SpeciesLibrary::parse_nasa7("THERMO ALL\n   300.000  1000.000  5000.000\n" + record, "t.dat");
  CHECK(library.species().front().intervals[0].t_high == 1000.0);
  CHECK(library.species().front().intervals[1].t_low == 1000.0);
  CHECK(parse_error([&] { SpeciesLibrary::parse_nasa7(record, "t.dat"); }) ==
        "t.dat:1: N2: columns 66-73 (the common temperature) are blank and no THERMO line gives a "
        "default");
}

TEST_CASE("parse_nasa7 skips condensed phases and stops at END") {
  const std::string liquid = replaced(replaced(kGriN2, "N2      ", "N2(L)   "), "G   300.000", "L   300.000");
  const std::string text = liquid + kGriN2 + "END\nthis line is not read\n";
  const SpeciesLibrary library = SpeciesLibrary::parse_nasa7(text, "t.dat");
  REQUIRE(library.species().size() == 1);
  CHECK(library.species().front().name == "N2");
}

TEST_CASE("parse_nasa7 errors name the origin, the line and what is wrong") {
  SECTION("a malformed number") {
    const std::string text = replaced(kGriN2, "0.14082404E-02", "0.14082x04E-02");
    CHECK(parse_error([&] { SpeciesLibrary::parse_nasa7(text, "bad.dat"); }) ==
          "bad.dat:3: N2: columns 46-60 should hold coefficient a2 of the lower interval, found "
          "'0.14082x04E-02'");
  }
  SECTION("a missing line") {
    const std::string third =
        "-0.09227977E+04 0.05980528E+02 0.03298677E+02 0.14082404E-02-0.03963222E-04    3\n";
    const std::string text = "! comment\n" + replaced(kGriN2, third, "") + kGriN2;
    CHECK(parse_error([&] { SpeciesLibrary::parse_nasa7(text, "short.dat"); }) ==
          "short.dat:4: N2: this should be line 3 of the record (column 80 '3'), found '4'; is a "
          "line missing?");
  }
  SECTION("a record cut short by the end of the text") {
    const std::string text = kGriN2.substr(0, kGriN2.rfind(" 0.05641515E-07"));
    CHECK(parse_error([&] { SpeciesLibrary::parse_nasa7(text, "cut.dat"); }) ==
          "cut.dat:3: N2: the record that begins on line 1 ends early: line 4 of 4 is missing");
  }
  SECTION("a common temperature above the upper one") {
    const std::string text = replaced(kGriN2, "  5000.000  1000.000", "  5000.000  6000.000");
    CHECK(parse_error([&] { SpeciesLibrary::parse_nasa7(text, "order.dat"); }) ==
          "order.dat:1: N2: interval 2 runs from 6000 K to 5000 K; it needs 0 < T_low < T_high");
  }
  SECTION("an unknown element") {
    const std::string text = replaced(kGriN2, "121286N   2", "121286XQ  2");
    CHECK(parse_error([&] { SpeciesLibrary::parse_nasa7(text, "el.dat"); }) ==
          "el.dat:1: N2: element 'XQ' of the formula (columns 25-26) is not known");
  }
}

namespace {

const std::string kOwnBlock =
    "# a species in the project's own format\n"  // line 1
    "species Test\n"                               // 2
    "alias T1\n"                                   // 3
    "molar_mass 28 g/mol\n"                        // 4
    "source invented for this test\n"              // 5
    "interval 200 1000 0 0 3.5 0 0 0 0 -1000 3\n"  // 6
    "interval 1000 6000 0 0 3.5 0 0 0 0 -1000 3\n" // 7
    "end\n";                                       // 8

}  // namespace

TEST_CASE("parse_own_format reads a block") {
  const SpeciesLibrary library = SpeciesLibrary::parse_own_format(kOwnBlock, "own.txt");
  REQUIRE(library.species().size() == 1);
  const NasaSpecies& sp = library.species().front();
  CHECK(sp.name == "Test");
  CHECK(sp.molar_mass == 0.028);
  CHECK(sp.source == "invented for this test");
  CHECK(library.find("T1") == &sp);
  REQUIRE(sp.intervals.size() == 2);
  CHECK(sp.intervals[1].a[2] == 3.5);
  CHECK(sp.intervals[1].b1 == -1000.0);

  const SpeciesLibrary in_kg = SpeciesLibrary::parse_own_format(
      replaced(kOwnBlock, "molar_mass 28 g/mol", "molar_mass 0.028 kg/mol"), "own.txt");
  CHECK(in_kg.species().front().molar_mass == 0.028);
}

TEST_CASE("parse_own_format errors name the origin, the line and what is wrong") {
  auto error_for = [](const std::string& text) {
    return parse_error([&] { SpeciesLibrary::parse_own_format(text, "own.txt"); });
  };
  CHECK(error_for(replaced(kOwnBlock, "0 0 3.5 0 0 0 0 -1000 3\ninterval 1000", "0 0 3.5x 0 0 0 0 -1000 3\ninterval 1000")) ==
        "own.txt:6: Test: a2 '3.5x' is not a number");
  CHECK(error_for(replaced(kOwnBlock, "interval 200 1000 0 0 3.5 0 0 0 0 -1000 3", "interval 200 1000 0 3.5 0 0 0 0 -1000 3")) ==
        "own.txt:6: Test: an interval needs 11 numbers (T_low T_high a0 a1 a2 a3 a4 a5 a6 b1 b2), found 10");
  CHECK(error_for(replaced(kOwnBlock, "interval 1000 6000", "interval 1100 6000")) ==
        "own.txt:7: Test: interval 2 starts at 1100 K but interval 1 ends at 1000 K; the intervals must "
        "be ascending and contiguous");
  CHECK(error_for(replaced(kOwnBlock, "end\n", "")) ==
        "own.txt:7: Test: the text ends inside the block that begins on line 2 (no 'end')");
  CHECK(error_for(replaced(kOwnBlock, "molar_mass 28 g/mol\n", "")) ==
        "own.txt:7: Test: the block has no molar_mass line");
  CHECK(error_for(replaced(kOwnBlock, "molar_mass 28 g/mol", "molar_mass 28")) ==
        "own.txt:4: Test: 'molar_mass' needs a number and a unit, g/mol or kg/mol; found '28'");
  CHECK(error_for(replaced(kOwnBlock, "source invented for this test\n", "")) ==
        "own.txt:7: Test: the block has no source line (say where the figures come from)");
  CHECK(error_for(replaced(kOwnBlock, "alias T1", "formula N2")) ==
        "own.txt:3: unknown keyword 'formula' (expected species, alias, molar_mass, source, interval or end)");
  CHECK(error_for("interval 200 1000 0 0 3.5 0 0 0 0 -1000 3\n") ==
        "own.txt:1: 'interval' outside a species block (a block begins with 'species NAME')");
  CHECK(error_for(replaced(kOwnBlock, "end\n", "species Other\n")) ==
        "own.txt:8: 'species Other' begins before the block of Test (line 2) is closed with 'end'");
  CHECK(error_for(kOwnBlock + kOwnBlock) == "own.txt:10: Test is defined twice (first on line 2)");
  CHECK(error_for(kOwnBlock + replaced(replaced(kOwnBlock, "species Test", "species Other"), "alias T1", "alias Test")) ==
        "own.txt:11: alias Test of Other is already a name or alias on line 2");
  // cp/R of the upper interval 10 % above the lower one at the joint.
  CHECK(error_for(replaced(kOwnBlock, "interval 1000 6000 0 0 3.5", "interval 1000 6000 0 0 3.85")) ==
        "own.txt:7: Test: cp° jumps by 0.091 (relative) at the joint 1000 K of intervals 1 and 2: "
        "29.100619 J/(mol K) below, 32.010681 J/(mol K) above; the intervals must meet within 1e-3");
}

TEST_CASE("merge adds species and replaces those of the same name") {
  SpeciesLibrary library = SpeciesLibrary::built_in();
  const std::size_t before = library.species().size();
  const SpeciesLibrary mine = SpeciesLibrary::parse_own_format(kOwnBlock, "own.txt");
  library.merge(mine);
  CHECK(library.species().size() == before + 1);
  CHECK(library.find("T1")->name == "Test");

  const SpeciesLibrary gri = SpeciesLibrary::parse_nasa7(kGriN2, "thermo30.dat");
  library.merge(gri);
  CHECK(library.species().size() == before + 1);
  CHECK(library.find("N2")->intervals.front().t_low == 300.0);  // the GRI record replaced NASA's
  CHECK(library.find("n-C4H10")->name == "C4H10,n-butane");     // aliases of the rest stay
  CHECK(SpeciesLibrary::built_in().find("N2")->intervals.front().t_low == 200.0);
}

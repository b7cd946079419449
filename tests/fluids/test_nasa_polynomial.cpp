// NasaPolynomialGas: published tables, thermodynamic identities, mixing, messages.
#include <algorithm>
#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include <catch2/catch.hpp>

#include "error_of.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

using shaftwork::Error;
using shaftwork::ErrorKind;
using shaftwork::fluids::Component;
using shaftwork::fluids::CompositionBasis;
using shaftwork::fluids::NasaInterval;
using shaftwork::fluids::NasaPolynomialGas;
using shaftwork::fluids::NasaSpecies;
using shaftwork::fluids::SpeciesLibrary;
using shaftwork::fluids::State;
using shaftwork::test::error_of;

namespace {

constexpr double kR = 8.31446261815324;  // J/(mol K), CODATA 2018

const NasaSpecies& species(const std::string& name) {
  const NasaSpecies* sp = SpeciesLibrary::built_in().find(name);
  REQUIRE(sp != nullptr);
  return *sp;
}

NasaPolynomialGas mixture(const std::vector<std::pair<std::string, double>>& fractions,
                          CompositionBasis basis = CompositionBasis::mole) {
  std::vector<Component> components;
  for (const auto& [name, fraction] : fractions) components.push_back({&species(name), fraction});
  return NasaPolynomialGas(components, basis);
}

NasaPolynomialGas pure(const std::string& name) { return mixture({{name, 1.0}}); }

// Dry air as the NASA Glenn database's "Air" record states it: mole % N2 78.084, O2 20.9476,
// Ar 0.9365, CO2 0.0319 (Gordon 1982).
NasaPolynomialGas air() {
  return mixture({{"N2", 0.78084}, {"O2", 0.209476}, {"Ar", 0.009365}, {"CO2", 0.000319}});
}

NasaPolynomialGas natural_gas() {
  return mixture({{"CH4", 0.90}, {"C2H6", 0.05}, {"C3H8", 0.02}, {"n-C4H10", 0.005}, {"N2", 0.015},
                  {"CO2", 0.01}});
}

// A species with joints at 700 K and 1500 K (constant cp, so its joints meet exactly),
// to give a mixture with N2 the joints 700, 1000 and 1500 K.
const NasaSpecies& odd_joints() {
  static const SpeciesLibrary library = SpeciesLibrary::parse_own_format(
      "species Odd\n"
      "molar_mass 30 g/mol\n"
      "source invented for the test of joint unions\n"
      "interval 200 700 0 0 3.9 0 0 0 0 -1200 4\n"
      "interval 700 1500 0 0 3.9 0 0 0 0 -1200 4\n"
      "interval 1500 6000 0 0 3.9 0 0 0 0 -1200 4\n"
      "end\n",
      "odd.txt");
  return library.species().front();
}

// The NASA polynomial evaluated by hand from the header's equations (no shortcuts), for
// the checks of the mixing rules.
struct ByHand {
  double cp_over_r, h_over_r, s_over_r;
};
ByHand by_hand(const NasaSpecies& sp, double T) {
  const NasaInterval& in = *std::find_if(sp.intervals.begin(), sp.intervals.end(),
                                         [&](const NasaInterval& x) { return T < x.t_high; });
  const auto& a = in.a;
  const double cp = a[0] * std::pow(T, -2) + a[1] / T + a[2] + a[3] * T + a[4] * std::pow(T, 2) +
                    a[5] * std::pow(T, 3) + a[6] * std::pow(T, 4);
  const double h_rt = -a[0] * std::pow(T, -2) + a[1] * std::log(T) / T + a[2] + a[3] * T / 2 +
                      a[4] * std::pow(T, 2) / 3 + a[5] * std::pow(T, 3) / 4 + a[6] * std::pow(T, 4) / 5 +
                      in.b1 / T;
  const double s = -a[0] * std::pow(T, -2) / 2 - a[1] / T + a[2] * std::log(T) + a[3] * T +
                   a[4] * std::pow(T, 2) / 2 + a[5] * std::pow(T, 3) / 3 + a[6] * std::pow(T, 4) / 4 + in.b2;
  return {cp, h_rt * T, s};
}

// One row of NIST-JANAF Thermochemical Tables, 4th ed. (M. W. Chase, J. Phys. Chem. Ref.
// Data Monograph 9, 1998): cp° in J/(mol K), H° - H°(298.15 K) in kJ/mol.
struct JanafRow {
  const char* species;
  double T, cp, dh;
};

}  // namespace

TEST_CASE("NASA polynomials agree with NIST-JANAF for N2, O2, Ar, CO2 and H2O") {
  // Where a figure comes from: "JANAF" = the NIST-JANAF table of that species, 4th ed.
  // Confirmed figures were checked against a public copy of the table (or a textbook table
  // derived from it, named); "from memory" ones were not, but agree with the NASA data
  // within 0.1 % all the same.
  const JanafRow rows[] = {
      // N2, JANAF table N-023. cp from a public tabulation of N-023; H - H298 confirmed by
      // Borgnakke & Sonntag, Fundamentals of Thermodynamics, Table A.9 (from JANAF).
      {"N2", 300, 29.125, 0.054},
      {"N2", 500, 29.580, 5.911},
      {"N2", 1000, 32.697, 21.463},
      {"N2", 1500, 34.843, 38.405},
      // O2, JANAF table O-029: cp from memory; H - H298 from memory, within 0.002 kJ/mol of
      // Borgnakke & Sonntag Table A.9 (6.086, 22.703, 40.600).
      {"O2", 300, 29.385, 0.054},
      {"O2", 500, 31.091, 6.084},
      {"O2", 1000, 34.870, 22.707},
      {"O2", 1500, 36.544, 40.600},
      // Ar, JANAF table Ar-001, from memory: cp = 20.786 = (5/2) R at all T, and
      // H - H298 = (5/2) R (T - 298.15), which the figures satisfy.
      {"Ar", 300, 20.786, 0.038},
      {"Ar", 500, 20.786, 4.196},
      {"Ar", 1000, 20.786, 14.589},
      {"Ar", 1500, 20.786, 24.982},
      // CO2, JANAF table C-095: cp at 300 K confirmed (py-janaf's printout of C-095), the
      // others from memory; H - H298 confirmed by Borgnakke & Sonntag Table A.9.
      {"CO2", 300, 37.221, 0.069},
      {"CO2", 500, 44.627, 8.305},
      {"CO2", 1000, 54.308, 33.397},
      {"CO2", 1500, 58.379, 61.705},
      // H2O (ideal gas), JANAF table H-064: cp from memory; H - H298 at 500 and 1000 K
      // confirmed by Borgnakke & Sonntag Table A.9, at 300 and 1500 K from memory.
      {"H2O", 300, 33.596, 0.062},
      {"H2O", 500, 35.226, 6.922},
      {"H2O", 1000, 41.268, 26.000},
  };
  for (const JanafRow& row : rows) {
    INFO(row.species << " at " << row.T << " K");
    const NasaPolynomialGas gas = pure(row.species);
    const double M = species(row.species).molar_mass;
    const State st = gas.from_pt(1e5, row.T);
    const double h298 = gas.from_pt(1e5, 298.15).enthalpy;
    CHECK(st.cp * M == Approx(row.cp).epsilon(0.001));
    // H - H298 within 0.1 %, or within the table's last digit (0.001 kJ/mol) near 298 K.
    CHECK((st.enthalpy - h298) * M / 1000 == Approx(row.dh).epsilon(0.001).margin(0.001));
  }
}

TEST_CASE("NASA H2O departs from JANAF above about 1000 K (documented in docs/properties.md)") {
  // NIST-JANAF H-064 (Chase 1998) at 1500 K, from memory: cp 47.073 J/(mol K),
  // H - H298 48.151 kJ/mol. The NASA record (Woolley 1987, code g 8/89) gives cp 0.5 %
  // higher and H - H298 0.12 % higher; the gap grows from about 0.05 % at 1000 K. The
  // test pins the size of the disagreement so that a change of data shows up here.
  const NasaPolynomialGas gas = pure("H2O");
  const double M = species("H2O").molar_mass;
  const double h298 = gas.from_pt(1e5, 298.15).enthalpy;
  const State st = gas.from_pt(1e5, 1500.0);
  CHECK(st.cp * M / 47.073 == Approx(1.0052).margin(0.001));
  CHECK((st.enthalpy - h298) * M / 1000 / 48.151 == Approx(1.0012).margin(0.0005));
}

TEST_CASE("NASA CH4 agrees with JANAF at 300 K and departs from it at 1000 K (documented)") {
  const NasaPolynomialGas gas = pure("CH4");
  const double M = species("CH4").molar_mass;
  // NIST-JANAF C-067 (Chase 1998), from memory: cp 35.708 J/(mol K), H - H298 0.066 kJ/mol at 300 K.
  CHECK(gas.from_pt(1e5, 300.0).cp * M == Approx(35.708).epsilon(0.003));
  CHECK((gas.from_pt(1e5, 300.0).enthalpy - gas.from_pt(1e5, 298.15).enthalpy) * M / 1000 ==
        Approx(0.066).margin(0.001));
  // At 1000 K JANAF C-067 gives cp 71.795 J/(mol K) (from memory); the NASA record
  // (Gurvich 1991, code g 8/99) is 2.6 % higher: the two evaluations differ, and the
  // model uses NASA's unchanged. Pinned here, not hidden; docs/properties.md says so.
  CHECK(gas.from_pt(1e5, 1000.0).cp * M / 71.795 == Approx(1.026).margin(0.004));
}

TEST_CASE("air cp and k at 300 K agree with the handbook") {
  // Cengel & Boles, Thermodynamics: An Engineering Approach, Table A-2(b), ideal-gas
  // specific heats of air at 300 K: cp = 1.005 kJ/(kg K), cv = 0.718, k = 1.400 (the table
  // goes back to NBS Circular 564, 1955).
  const State st = air().from_pt(101325.0, 300.0);
  CHECK(st.cp == Approx(1005.0).epsilon(0.001));
  CHECK(st.cv == Approx(718.0).epsilon(0.001));
  CHECK(st.k() == Approx(1.400).epsilon(0.0005));
  // The NASA Glenn database's own "Air" record gives M = 28.9651159 g/mol for this composition.
  CHECK(st.molar_mass == Approx(28.9651159e-3).epsilon(1e-7));
}

TEST_CASE("thermodynamic identities and round trips hold on every species and mixture") {
  std::vector<std::pair<std::string, NasaPolynomialGas>> models;
  for (const NasaSpecies& sp : SpeciesLibrary::built_in().species()) {
    models.emplace_back(sp.name, NasaPolynomialGas({{&sp, 1.0}}, CompositionBasis::mole));
  }
  models.emplace_back("air", air());
  models.emplace_back("natural gas", natural_gas());
  models.emplace_back("N2/CO2 by mass", mixture({{"N2", 0.3}, {"CO2", 0.7}}, CompositionBasis::mass));
  models.emplace_back("N2 with joints at 700 and 1500 K",
                      NasaPolynomialGas({{&species("N2"), 0.5}, {&odd_joints(), 0.5}}, CompositionBasis::mole));
  std::vector<Component> everything;
  for (const NasaSpecies& sp : SpeciesLibrary::built_in().species()) everything.push_back({&sp, 1.0});
  for (Component& c : everything) c.fraction /= static_cast<double>(everything.size());
  models.emplace_back("every built-in species", NasaPolynomialGas(everything, CompositionBasis::mole));

  for (const auto& [name, gas] : models) {
    INFO(name);
    const double low = gas.temperature_range().low;
    const double high = gas.temperature_range().high;
    const double R = *gas.ideal_gas_constant();
    std::vector<double> joints = {700.0, 1000.0, 1500.0};  // every joint any model has

    // Temperatures over the whole range, at and next to the ends and the joints.
    std::vector<double> temperatures;
    for (int i = 0; i <= 120; ++i) temperatures.push_back(low * std::pow(high / low, i / 120.0));
    for (double offset : {1e-12, 1e-9, 1e-6, 1e-3}) {
      temperatures.push_back(low * (1 + offset));
      temperatures.push_back(high * (1 - offset));
      for (double joint : joints) {
        temperatures.push_back(joint * (1 - offset));
        temperatures.push_back(joint * (1 + offset));
      }
    }
    temperatures.push_back(low);
    temperatures.push_back(high);
    for (double joint : joints) temperatures.push_back(joint);

    for (double T : temperatures) {
      for (double p : {1e3, 1e5, 5e6}) {
        INFO("T = " << T << " K, p = " << p << " Pa");
        const State st = gas.from_pt(p, T);
        CHECK(std::fabs(gas.from_ps(p, st.entropy).temperature / T - 1) <= 1e-10);
        CHECK(std::fabs(gas.from_ph(p, st.enthalpy).temperature / T - 1) <= 1e-10);
        CHECK(st.density == Approx(p / (R * T)).epsilon(1e-14));
        CHECK(st.cv == Approx(st.cp - R).epsilon(1e-14));
        CHECK(st.compressibility == 1.0);
        CHECK(st.molar_mass == Approx(8.31446261815324 / R).epsilon(1e-14));
        CHECK(st.pressure == p);
        CHECK(st.temperature == T);
      }
      // cp = dh/dT and (ds/dT)_p = cp/T by central differences, away from joints and ends.
      const double dT = 1e-4 * T;
      const bool clear = T - 2 * dT > low && T + 2 * dT < high &&
                         std::none_of(joints.begin(), joints.end(),
                                      [&](double j) { return std::fabs(T - j) < 2 * dT; });
      if (clear) {
        const State st = gas.from_pt(2e5, T);
        const State below = gas.from_pt(2e5, T - dT);
        const State above = gas.from_pt(2e5, T + dT);
        CHECK((above.enthalpy - below.enthalpy) / (2 * dT) == Approx(st.cp).epsilon(1e-6));
        CHECK((above.entropy - below.entropy) / (2 * dT) == Approx(st.cp / T).epsilon(1e-6));
      }
    }
    // Entropy falls with pressure by R ln(p2/p1) at constant T; enthalpy does not change.
    const State at_1_bar = gas.from_pt(1e5, 400.0);
    const State at_10_bar = gas.from_pt(1e6, 400.0);
    CHECK(at_1_bar.entropy - at_10_bar.entropy == Approx(R * std::log(10.0)).epsilon(1e-12));
    CHECK(at_1_bar.enthalpy == at_10_bar.enthalpy);
  }
}

TEST_CASE("an ideal mixture equals the mixing rules computed by hand") {
  // Smith, Van Ness & Abbott, 7th ed., sec. 11.8: h = sum y_i H_i / M,
  // s = [sum y_i S°_i - R ln(p/p°) - R sum y_i ln y_i] / M, cp = sum y_i cp_i / M.
  const NasaSpecies& n2 = species("N2");
  const NasaSpecies& co2 = species("CO2");
  const double y1 = 0.6;
  const double y2 = 0.4;
  const NasaPolynomialGas gas = mixture({{"N2", y1}, {"CO2", y2}});
  const double M = y1 * n2.molar_mass + y2 * co2.molar_mass;
  const double p = 3e5;
  // Below the 1000 K joint the model holds the database's figures unchanged: 1e-12. Above
  // it, b1 and b2 are shifted to close the database's joint gaps (nasa_polynomial.cpp),
  // which moves h and s by far less than 1e-8.
  for (const auto& [T, tolerance] : {std::pair{500.0, 1e-12}, std::pair{2500.0, 1e-8}}) {
    INFO(T << " K");
    const ByHand a = by_hand(n2, T);
    const ByHand b = by_hand(co2, T);
    const double h = kR * (y1 * a.h_over_r + y2 * b.h_over_r) / M;
    const double s = kR * (y1 * a.s_over_r + y2 * b.s_over_r - std::log(p / 1e5) -
                           (y1 * std::log(y1) + y2 * std::log(y2))) / M;
    const double cp = kR * (y1 * a.cp_over_r + y2 * b.cp_over_r) / M;
    const State st = gas.from_pt(p, T);
    CHECK(st.enthalpy == Approx(h).epsilon(tolerance));
    CHECK(st.entropy == Approx(s).epsilon(tolerance));
    CHECK(st.cp == Approx(cp).epsilon(1e-12));
    CHECK(st.molar_mass == Approx(M).epsilon(1e-15));
  }
}

TEST_CASE("a composition by mass gives the same gas as the same composition by mole") {
  const double y[] = {0.9, 0.06, 0.04};
  const char* names[] = {"CH4", "C2H6", "CO2"};
  double M = 0;
  for (int i = 0; i < 3; ++i) M += y[i] * species(names[i]).molar_mass;
  std::vector<std::pair<std::string, double>> by_mole, by_mass;
  for (int i = 0; i < 3; ++i) {
    by_mole.emplace_back(names[i], y[i]);
    by_mass.emplace_back(names[i], y[i] * species(names[i]).molar_mass / M);  // w_i = y_i M_i / M
  }
  const NasaPolynomialGas a = mixture(by_mole, CompositionBasis::mole);
  const NasaPolynomialGas b = mixture(by_mass, CompositionBasis::mass);
  CHECK_FALSE(b.renormalised());
  for (int i = 0; i < 3; ++i) CHECK(b.mole_fractions()[i].second == Approx(y[i]).epsilon(1e-14));
  for (double T : {250.0, 800.0, 2000.0}) {
    const State sa = a.from_pt(5e5, T);
    const State sb = b.from_pt(5e5, T);
    CHECK(sb.enthalpy == Approx(sa.enthalpy).epsilon(1e-13));
    CHECK(sb.entropy == Approx(sa.entropy).epsilon(1e-13));
    CHECK(sb.cp == Approx(sa.cp).epsilon(1e-13));
  }
}

TEST_CASE("fractions are renormalised within 1 % and refused beyond") {
  const NasaPolynomialGas close = mixture({{"N2", 0.78}, {"O2", 0.21}, {"Ar", 0.0093}});
  CHECK(close.renormalised());
  CHECK(close.given_sum() == Approx(0.9993).epsilon(1e-14));
  CHECK(close.mole_fractions()[0].first == "N2");
  CHECK(close.mole_fractions()[0].second == Approx(0.78 / 0.9993).epsilon(1e-14));

  const NasaPolynomialGas exact = air();
  CHECK_FALSE(exact.renormalised());
  CHECK(exact.description() == "N2 0.78084, O2 0.209476, Ar 0.009365, CO2 0.000319 (mole fractions)");

  Error far = error_of([] { mixture({{"N2", 0.7}, {"O2", 0.2}}); });
  CHECK(far.kind() == ErrorKind::bad_input);
  CHECK(std::string(far.what()) ==
        "nasa-polynomial mixture: the mole fractions sum to 0.9; they must sum to 1 within 1 %");
  Error far_mass = error_of([] { mixture({{"N2", 0.75}, {"O2", 0.3}}, CompositionBasis::mass); });
  CHECK(std::string(far_mass.what()) ==
        "nasa-polynomial mixture: the mass fractions sum to 1.05; they must sum to 1 within 1 %");
}

TEST_CASE("compositions that make no gas are refused with a message") {
  CHECK(std::string(error_of([] { mixture({{"N2", 1.1}, {"CO2", -0.1}}); }).what()) ==
        "nasa-polynomial mixture: the mole fraction of CO2 must be a number of 0 or more, got -0.1");
  CHECK(std::string(error_of([] { mixture({{"N2", 0.5}, {"N2", 0.5}}); }).what()) ==
        "nasa-polynomial mixture: N2 appears twice");
  CHECK(std::string(error_of([] { mixture({{"N2", 0.0}}); }).what()) ==
        "nasa-polynomial mixture: every fraction is zero");
  CHECK(std::string(error_of([] { NasaPolynomialGas({}, CompositionBasis::mole); }).what()) ==
        "nasa-polynomial: a fluid needs at least one species");
  CHECK(std::string(error_of([] { NasaPolynomialGas({{nullptr, 1.0}}, CompositionBasis::mole); }).what()) ==
        "nasa-polynomial mixture: component 1 names no species");

  const NasaPolynomialGas dropped = mixture({{"N2", 1.0}, {"O2", 0.0}});
  CHECK(dropped.mole_fractions().size() == 1);
  CHECK(dropped.description() == "N2");
}

TEST_CASE("out-of-range states are refused with the message users see") {
  const NasaPolynomialGas n2 = pure("N2");
  Error cold = error_of([&] { n2.from_pt(1e5, 150.0); });
  CHECK(cold.kind() == ErrorKind::out_of_range);
  CHECK(std::string(cold.what()) ==
        "nasa-polynomial N2: temperature 150 K is outside the model's range 200 to 6000 K");

  Error hot = error_of([&] { air().from_pt(1e5, 7000.0); });
  CHECK(hot.kind() == ErrorKind::out_of_range);
  CHECK(std::string(hot.what()) ==
        "nasa-polynomial mixture of N2, O2, Ar, CO2: temperature 7000 K is outside the model's "
        "range 200 to 6000 K");

  Error entropy = error_of([&] { n2.from_ps(1e5, 0.0); });
  CHECK(entropy.kind() == ErrorKind::out_of_range);
  CHECK(std::string(entropy.what()) ==
        "nasa-polynomial N2: entropy 0 J/(kg K) at 100000 Pa needs a temperature below the model's "
        "range 200 to 6000 K");

  Error enthalpy = error_of([&] { n2.from_ph(1e5, 1e8); });
  CHECK(enthalpy.kind() == ErrorKind::out_of_range);
  CHECK(std::string(enthalpy.what()) ==
        "nasa-polynomial N2: enthalpy 1e+08 J/kg needs a temperature above the model's range 200 to "
        "6000 K");

  Error pressure = error_of([&] { n2.from_pt(-1.0, 300.0); });
  CHECK(pressure.kind() == ErrorKind::bad_input);
  CHECK(std::string(pressure.what()) ==
        "nasa-polynomial N2: pressure must be finite and above 0 Pa, got -1 Pa");
  CHECK(std::string(error_of([&] { n2.from_ph(1e5, NAN); }).what()) ==
        "nasa-polynomial N2: enthalpy must be a finite number");
  Error not_a_number = error_of([&] { n2.from_pt(1e5, NAN); });
  CHECK(not_a_number.kind() == ErrorKind::bad_input);
  CHECK(std::string(not_a_number.what()) == "nasa-polynomial N2: temperature must be a finite number");
}

TEST_CASE("a mixture's range is the intersection of its species' ranges") {
  // The GRI-Mech 3.0 N2 record (thermo30.dat) covers 300-5000 K.
  const SpeciesLibrary gri = SpeciesLibrary::parse_nasa7(
      "N2                121286N   2               G   300.000  5000.000  1000.000    1\n"
      " 0.02926640E+02 0.14879768E-02-0.05684760E-05 0.10097038E-09-0.06753351E-13    2\n"
      "-0.09227977E+04 0.05980528E+02 0.03298677E+02 0.14082404E-02-0.03963222E-04    3\n"
      " 0.05641515E-07-0.02444854E-10-0.10208999E+04 0.03950372E+02                   4\n",
      "thermo30.dat");
  const NasaPolynomialGas gas({{&gri.species().front(), 0.79}, {&species("O2"), 0.21}},
                              CompositionBasis::mole);
  CHECK(gas.temperature_range().low == 300.0);
  CHECK(gas.temperature_range().high == 5000.0);
  CHECK(std::string(error_of([&] { gas.from_pt(1e5, 250.0); }).what()) ==
        "nasa-polynomial mixture of N2, O2: temperature 250 K is outside the model's range 300 to "
        "5000 K");
  const double s_at_end = gas.from_pt(1e5, 5000.0).entropy;
  CHECK(gas.from_ps(1e5, s_at_end).temperature == Approx(5000.0).epsilon(1e-12));
}

TEST_CASE("the model reports itself as an ideal gas") {
  const NasaPolynomialGas gas = air();
  CHECK(gas.model_name() == "nasa-polynomial");
  CHECK(*gas.ideal_gas_constant() == Approx(8.31446261815324 / 28.9651159e-3).epsilon(1e-7));
  CHECK(gas.pressure_range().low == 1e-3);
  CHECK(gas.pressure_range().high == 1e9);
  CHECK_FALSE(gas.is_incompressible());
  CHECK(pure("CH4").description() == "CH4");
}

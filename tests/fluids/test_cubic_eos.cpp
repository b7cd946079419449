// CubicGas (Peng-Robinson, Soave-Redlich-Kwong): published values, reference equations of
// state, thermodynamic identities, phase refusals and messages.
#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include <catch2/catch.hpp>
#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/compressibility_estimate.hpp"
#include "shaftwork/fluids/cubic_eos.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

using shaftwork::Error;
using shaftwork::ErrorKind;
using namespace shaftwork::fluids;

namespace {

constexpr double kR = 8.31446261815324;  // J/(mol K), CODATA 2018
constexpr auto PR = CubicKind::peng_robinson;
constexpr auto SRK = CubicKind::soave_redlich_kwong;

std::vector<Component> components(const std::vector<std::pair<std::string, double>>& fractions) {
  std::vector<Component> out;
  for (const auto& [name, x] : fractions) {
    const NasaSpecies* sp = SpeciesLibrary::built_in().find(name);
    REQUIRE(sp != nullptr);
    out.push_back({sp, x});
  }
  return out;
}

CubicGas pure(CubicKind kind, const std::string& name, const CubicOverrides& o = {}) {
  return CubicGas(kind, components({{name, 1.0}}), CompositionBasis::mole, o);
}

// The invented example composition of data/fluids.txt's natural-gas-example (11 species with N2, CO2).
const std::vector<std::pair<std::string, double>> kNaturalGas = {
    {"CH4", 0.9120},     {"C2H6", 0.0450},    {"C3H8", 0.0120},    {"n-C4H10", 0.0030},
    {"i-C4H10", 0.0025}, {"n-C5H12", 0.0008}, {"i-C5H12", 0.0007}, {"n-C6H14", 0.0005},
    {"N2", 0.0150},      {"CO2", 0.0085}};

const CubicGas& natural_gas() {
  static const CubicGas gas(PR, components(kNaturalGas), CompositionBasis::mole);
  return gas;
}

double molar_volume_cm3(double Z, double p, double T) { return Z * kR * T / p * 1e6; }

}  // namespace

TEST_CASE("n-butane at 350 K and its vapour pressure 9.4573 bar: the textbook's PR and SRK volumes") {
  // Smith, Van Ness & Abbott, Introduction to Chemical Engineering Thermodynamics, 7th ed.,
  // Example 3.9 and the table after it (from memory; the RK row of the same example, 2555 and
  // 133.3 cm3/mol, was confirmed in a published worked solution): with Tc = 425.1 K,
  // pc = 37.96 bar, omega = 0.200 (their Appendix B), saturated vapour and liquid volumes
  //   SRK 2520 and 127.8 cm3/mol, PR 2486 and 112.6 cm3/mol; measured 2482 and 115.0.
  // The table prints four figures: 0.05 % tolerance.
  CubicOverrides o;
  o.critical.push_back({"C4H10,n-butane", {425.1, 37.96e5, 0.200, "SVNA 7th ed., App. B"}});
  const double p = 9.4573e5;
  const double T = 350;
  struct Row {
    CubicKind kind;
    double vapour, liquid;
  };
  for (const Row& row : {Row{SRK, 2520, 127.8}, Row{PR, 2486, 112.6}}) {
    const CubicGas gas = pure(row.kind, "n-C4H10", o);
    const std::vector<double> z = gas.compressibility_roots(p, T);
    REQUIRE(z.size() == 3);
    CHECK(molar_volume_cm3(z.back(), p, T) == Approx(row.vapour).epsilon(5e-4));
    CHECK(molar_volume_cm3(z.front(), p, T) == Approx(row.liquid).epsilon(5e-4));
    // The model's own vapour state at that point is the vapour root.
    const State st = gas.from_pt(p, T);
    CHECK(st.molar_mass / st.density * 1e6 == Approx(row.vapour).epsilon(5e-4));
    // Against the measured values: the book's point is that PR's vapour is within 0.2 % and
    // its liquid within 2.2 %, SRK's within 1.6 % and 11.2 %.
    CHECK(std::fabs(molar_volume_cm3(z.back(), p, T) / 2482 - 1) < (row.kind == PR ? 0.002 : 0.016));
    CHECK(std::fabs(molar_volume_cm3(z.front(), p, T) / 115.0 - 1) < (row.kind == PR ? 0.022 : 0.112));
  }
}

TEST_CASE("compressibility of methane, nitrogen and CO2 against their reference equations") {
  // Reference densities (mol/L, or kg/m3 for CO2) from the published tables of the reference
  // equations, as transcribed in a public test suite:
  //   methane: Younglove & Ely, J. Phys. Chem. Ref. Data 16 (1987) 577, methane tables;
  //   nitrogen: Span, Lemmon, Jacobsen, Wagner & Yokozeki, J. Phys. Chem. Ref. Data 29 (2000)
  //             1361, table p. 1410;
  //   CO2: Span & Wagner, J. Phys. Chem. Ref. Data 25 (1996) 1509, Table 35, p. 1562.
  // Z = p/(rho R T). Tolerance: cubic equations with the classical alpha miss gas-phase Z by up
  // to about 3 % at these densities (the known deviation, e.g. Poling, Prausnitz & O'Connell,
  // The Properties of Gases and Liquids, 5th ed., ch. 4; common practice to expect it): 3.5 %.
  struct Point {
    const char* species;
    double p, T, molar_density;  // Pa, K, mol/m3
  };
  const Point points[] = {
      {"CH4", 1e7, 410, 3008},   {"CH4", 3e7, 540, 6157},    {"CH4", 5e6, 600, 993.0},
      {"N2", 2e7, 350, 6355.2},  {"N2", 5e7, 1000, 5105.1},  {"N2", 2e6, 1000, 238.89},
      {"CO2", 5e5, 280, 9.7568 / 0.0440095}, {"CO2", 5e6, 290, 148.41 / 0.0440095},
      {"CO2", 1e7, 480, 119.65 / 0.0440095}};
  for (const CubicKind kind : {PR, SRK}) {
    for (const Point& q : points) {
      const double z_reference = q.p / (q.molar_density * kR * q.T);
      const State st = pure(kind, q.species).from_pt(q.p, q.T);
      INFO(cubic_model_name(kind) << " " << q.species << " " << q.p << " Pa " << q.T << " K");
      CHECK(st.compressibility == Approx(z_reference).epsilon(0.035));
      CHECK(st.compressibility == Approx(q.p * st.molar_mass / (st.density * kR * q.T)).epsilon(1e-12));
    }
  }
}

TEST_CASE("the vapour pressure from equal fugacities against measured CO2") {
  // Span & Wagner 1996, Table 34 (p. 1560): 4.1607 MPa at 280 K. A cubic with Soave's alpha
  // meets vapour pressures within about 1 % (omega is fitted to Tr = 0.7): tolerance 1 %.
  CHECK(*pure(PR, "CO2").vapour_pressure(280) == Approx(4.1607e6).epsilon(0.01));
  CHECK(*pure(SRK, "CO2").vapour_pressure(280) == Approx(4.1607e6).epsilon(0.01));
  // At the vapour pressure the two roots have equal fugacities, by construction of the solve.
  const CubicGas co2 = pure(PR, "CO2");
  const double ps = *co2.vapour_pressure(280);
  const std::vector<double> z = co2.compressibility_roots(ps, 280);
  REQUIRE(z.size() == 3);
  CHECK_FALSE(co2.vapour_pressure(305).has_value());  // above Tc = 304.2 K
}

TEST_CASE("departures vanish as p -> 0: the NASA ideal gas is the limit") {
  const CubicGas gas = natural_gas();
  NasaPolynomialGas ideal(components(kNaturalGas), CompositionBasis::mole);
  for (double T : {250.0, 400.0, 900.0}) {
    const State real = gas.from_pt(1.0, T);
    const State id = ideal.from_pt(1.0, T);
    CHECK(real.enthalpy == Approx(id.enthalpy).margin(1e-3));  // J/kg, |h| ~ 4e6
    CHECK(real.entropy == Approx(id.entropy).margin(1e-6));
    CHECK(real.cp == Approx(id.cp).epsilon(1e-7));
    CHECK(real.compressibility == Approx(1).margin(1e-7));
  }
}

TEST_CASE("identities: cp = dh/dT, v = dg/dp, w^2 = (dp/drho)_s, round trips") {
  const CubicGas& gas = natural_gas();
  for (const auto& point : {std::pair{41e5, 303.15}, std::pair{80e5, 350.0}, std::pair{5e5, 260.0}}) {
    const double p = point.first;  // not a structured binding: clang 14 cannot capture one in a lambda
    const double T = point.second;
    INFO(p << " Pa, " << T << " K");
    const State st = gas.from_pt(p, T);
    const double dT = 1e-3;
    const double dh_dt = (gas.from_pt(p, T + dT).enthalpy - gas.from_pt(p, T - dT).enthalpy) / (2 * dT);
    CHECK(st.cp == Approx(dh_dt).epsilon(1e-7));
    const double dp = p * 1e-5;
    const auto g = [&](double pp) {
      const State s = gas.from_pt(pp, T);
      return s.enthalpy - T * s.entropy;
    };
    CHECK(1 / st.density == Approx((g(p + dp) - g(p - dp)) / (2 * dp)).epsilon(1e-7));
    // Speed of sound from the model's own formula against the isentropic derivative.
    const double w2 = (2 * dp) / (gas.from_ps(p + dp, st.entropy).density - gas.from_ps(p - dp, st.entropy).density);
    const CompressibilityFunctions xy = gas.compressibility_functions(p, T);
    const double kappa_t = xy.y / p;                   // -(1/v)(dv/dp)_T
    const double w2_formula = st.cp / st.cv / (st.density * kappa_t);
    CHECK(w2_formula == Approx(w2).epsilon(1e-6));
    CHECK(gas.from_ph(p, st.enthalpy).temperature == Approx(T).epsilon(1e-9));
    CHECK(gas.from_ps(p, st.entropy).temperature == Approx(T).epsilon(1e-9));
    // X = (T/v)(dv/dT)_p - 1 against the model's volumes.
    const double dv_dt = (1 / gas.from_pt(p, T + dT).density - 1 / gas.from_pt(p, T - dT).density) / (2 * dT);
    CHECK(xy.x == Approx(T * st.density * dv_dt - 1).margin(1e-6));
    // The isobaric expansivity the polytropic path uses, against the same volumes.
    CHECK(st.expansivity == Approx(st.density * dv_dt).epsilon(1e-6));
    CHECK(st.expansivity * T == Approx(1 + xy.x).epsilon(1e-9));
  }
}

TEST_CASE("fugacities: Gibbs-Duhem along composition and the phase's own ln phi") {
  const CubicGas& gas = natural_gas();
  const double p = 50e5;
  const double T = 320;
  std::vector<double> x;
  for (const auto& f : gas.mole_fractions()) x.push_back(f.second);
  // Move along a direction that keeps sum x = 1: sum x_i d ln phi_i = 0 at fixed T, p.
  std::vector<double> direction(x.size(), 0.0);
  direction[0] = -1;
  direction[1] = 0.6;
  direction[8] = 0.4;
  const double h = 1e-6;
  std::vector<double> up = x, down = x;
  for (std::size_t i = 0; i < x.size(); ++i) {
    up[i] += h * direction[i];
    down[i] -= h * direction[i];
  }
  const std::vector<double> phi_up = gas.ln_fugacity_coefficients(p, T, up);
  const std::vector<double> phi_down = gas.ln_fugacity_coefficients(p, T, down);
  const std::vector<double> phi = gas.ln_fugacity_coefficients(p, T, x);
  double gibbs_duhem = 0;
  double scale = 0;
  for (std::size_t i = 0; i < x.size(); ++i) {
    const double d = (phi_up[i] - phi_down[i]) / (2 * h);
    gibbs_duhem += x[i] * d;
    scale += std::fabs(x[i] * d);
  }
  CHECK(std::fabs(gibbs_duhem) < 1e-7 * scale);
  // sum x_i ln phi_i is the phase's G_r/RT = ln phi of the mixture: ln phi = g_r/(R T).
  double sum = 0;
  for (std::size_t i = 0; i < x.size(); ++i) sum += x[i] * phi[i];
  const State st = gas.from_pt(p, T);
  NasaPolynomialGas ideal(components(kNaturalGas), CompositionBasis::mole);
  const State id = ideal.from_pt(p, T);
  const double g_residual = ((st.enthalpy - id.enthalpy) - T * (st.entropy - id.entropy)) * st.molar_mass;
  CHECK(sum == Approx(g_residual / (kR * T)).epsilon(1e-9));
  SECTION("a wrong number of fractions is refused") {
    try {
      gas.ln_fugacity_coefficients(p, T, {0.5, 0.5});
      FAIL("accepted");
    } catch (const Error& e) {
      CHECK(std::string(e.what()) ==
            "peng-robinson mixture of CH4, C2H6, C3H8, C4H10,n-butane, C4H10,isobutane, C5H12,n-pentane, "
            "C5H12,i-pentane, C6H14,n-hexane, N2, CO2: 2 mole fractions given for 10 components");
    }
  }
}

TEST_CASE("states in the two-phase region or the liquid are refused, naming the boundary") {
  const CubicGas propane = pure(PR, "C3H8");
  const auto message = [](auto&& call) {
    try {
      call();
    } catch (const Error& e) {
      CHECK(e.kind() == ErrorKind::out_of_range);
      return std::string(e.what());
    }
    return std::string("accepted");
  };
  CHECK(message([&] { propane.from_pt(9.8e5, 290); }) ==
        "C3H8 on peng-robinson at 9.8 bar, 290 K lies below its dew point (about 299.4 K at 9.8 bar): it would "
        "condense; the model describes the gas only");
  CHECK(message([&] { propane.from_pt(60e5, 300); }) ==
        "C3H8 on peng-robinson at 60 bar, 300 K is a liquid (above the critical pressure 42.4552 bar and below the "
        "critical temperature 369.95 K): the model describes the gas only");
  // An isentropic outlet that would condense: from (2.5 bar, 260 K) expanded to 1.2 bar (the
  // vapour at the dew point, 235.0 K, has a higher entropy; below it the target is wet).
  const State inlet = propane.from_pt(2.5e5, 260);
  for (const double ds : {-30.0, -100.0, -300.0}) {
    CHECK(message([&] { propane.from_ps(1.2e5, inlet.entropy + ds); }) ==
          fmt::format("C3H8 on peng-robinson: entropy {:.6g} J/(kg K) at 1.2 bar lies below its dew point (about "
                      "235.0 K at 1.2 bar): it would condense; the model describes the gas only",
                      inlet.entropy + ds));
  }
  const double h_wet = propane.from_pt(9.8e5, 310).enthalpy - 40e3;
  CHECK(message([&] { propane.from_ph(9.8e5, h_wet); }) ==
        fmt::format("C3H8 on peng-robinson: enthalpy {:.6g} J/kg at 9.8 bar lies below its dew point (about 299.4 K "
                    "at 9.8 bar): it would condense; the model describes the gas only",
                    h_wet));
  // Just above the dew point the gas is accepted; the dew point is where the roots' fugacities meet.
  const double dew = *propane.dew_temperature(9.8e5);
  CHECK(*propane.vapour_pressure(dew) == Approx(9.8e5).epsilon(1e-9));
  CHECK_NOTHROW(propane.from_pt(9.8e5, dew + 0.01));
  CHECK(message([&] { propane.from_pt(9.8e5, dew - 0.01); }) != "accepted");
  SECTION("a mixture, by the stability test") {
    const CubicGas& gas = natural_gas();
    CHECK(message([&] { gas.from_pt(61e5, 230); }) ==
          "mixture of CH4, C2H6, C3H8, C4H10,n-butane, C4H10,isobutane, C5H12,n-pentane, C5H12,i-pentane, "
          "C6H14,n-hexane, N2, CO2 on peng-robinson at 61 bar, 230 K lies inside its two-phase region (below its "
          "dew point, about 242.8 K at 61 bar): part of it would condense; the model describes one gas phase "
          "only");
    const double mixture_dew = *gas.dew_temperature(61e5);
    CHECK_NOTHROW(gas.from_pt(61e5, mixture_dew + 0.05));
    CHECK(message([&] { gas.from_pt(61e5, mixture_dew - 0.05); }) != "accepted");
  }
}

TEST_CASE("critical constants: built-in, overridden, missing") {
  const CubicGas methane = pure(PR, "CH4");
  CHECK(methane.critical_constants()[0].critical_temperature == 190.6);  // data/critical.txt
  CHECK(methane.critical_constants()[0].source.find("Horstmann") != std::string::npos);
  const CubicGas ng = natural_gas();
  CHECK(ng.interaction(0, 9) == Approx(0.0978));  // CH4-CO2, Knapp et al. 1982, p. 399
  CHECK(ng.interaction(9, 0) == Approx(0.0978));
  CHECK(ng.interaction(0, 3) == Approx(0.0185));  // CH4-n-C4H10, p. 425
  CubicOverrides o;
  o.interaction.push_back({"CH4", "CO2", 0.12, true, true, "case"});
  CHECK(CubicGas(PR, components(kNaturalGas), CompositionBasis::mole, o).interaction(9, 0) == Approx(0.12));
  // A species with no critical constants in the tables given.
  const CriticalData empty = CriticalData::parse("", "c.txt", "", "i.txt", SpeciesLibrary::built_in());
  try {
    CubicGas(SRK, components({{"N2", 1.0}}), CompositionBasis::mole, {}, empty);
    FAIL("accepted");
  } catch (const Error& e) {
    CHECK(std::string(e.what()) ==
          "soave-redlich-kwong N2: no critical constants for N2 (none built in); give them under \"critical\"");
  }
}

TEST_CASE("the critical tables are checked when loaded") {
  const SpeciesLibrary& lib = SpeciesLibrary::built_in();
  const auto message = [&](const std::string& critical, const std::string& interaction) {
    try {
      CriticalData::parse(critical, "c.txt", interaction, "i.txt", lib);
    } catch (const Error& e) {
      return std::string(e.what());
    }
    return std::string("accepted");
  };
  CHECK(message("N2 126.2 3394388 0.04 | src\n", "") == "accepted");
  CHECK(message("N2 -126.2 3394388 0.04 | src\n", "") ==
        "c.txt:1: N2: the critical temperature must lie between 1 and 5000 K, got -126.2");
  CHECK(message("N2 126.2 339 0.04 | src\n", "") ==
        "c.txt:1: N2: the critical pressure must lie between 1 kPa and 1 GPa, got 339");
  CHECK(message("N2 126.2 3394388 2.5 | src\n", "") ==
        "c.txt:1: N2: the acentric factor must lie between -1 and 2, got 2.5");
  CHECK(message("Nx 126.2 3394388 0.04 | src\n", "") == "c.txt:1: unknown species \"Nx\"");
  CHECK(message("N2 126.2 3394388 0.04\n", "") == "c.txt:1: expected '| source' at the end of the line");
  CHECK(message("# c\nN2 126.2 3394388 0.04 | a\nN2 126.2 3394388 0.04 | b\n", "") == "c.txt:3: N2 is listed twice");
  CHECK(message("", "CH4 CO2 0.1 pr | a\nCO2 CH4 0.09 pr,srk | b\n") ==
        "i.txt:2: the pair CO2-CH4 is listed twice for one equation");
  CHECK(message("", "CH4 CO2 0.1 pr | a\nCO2 CH4 0.09 srk | b\n") == "accepted");
  CHECK(message("", "CH4 CO2 1.5 pr | a\n") == "i.txt:1: k_ij of CH4-CO2 must lie between -1 and 1, got 1.5");
  CHECK(message("", "CH4 CH4 0.1 pr | a\n") == "i.txt:1: CH4 paired with itself");
  CHECK(message("", "CH4 CO2 0.1 prr | a\n") == "i.txt:1: the equations should be pr, srk or pr,srk, found 'prr'");
  // The built-in tables pass, with every built-in species covered and the sources named.
  const CriticalData& built = CriticalData::built_in();
  for (const NasaSpecies& sp : lib.species()) {
    INFO(sp.name);
    REQUIRE(built.find(sp.name) != nullptr);
    CHECK_FALSE(built.find(sp.name)->source.empty());
  }
  CHECK(built.interactions().size() > 80);
}

TEST_CASE("the compressibility estimate is Peng-Robinson on the built-in data") {
  const double z = *estimate_compressibility(kNaturalGas, 41e5, 303.15);
  CHECK(z == Approx(natural_gas().from_pt(41e5, 303.15).compressibility).epsilon(1e-12));
  CHECK(z == Approx(0.905).margin(0.005));  // the booster: Z = 0.90 at 40 barg, 30 degC
  CHECK(*estimate_compressibility({{"N2", 0.78084}, {"O2", 0.209476}, {"Ar", 0.009365}, {"CO2", 0.000319}}, 10e5,
                                  300) == Approx(1).margin(0.01));  // air at 10 bar: no warning
  CHECK_FALSE(estimate_compressibility({{"Unobtainium", 1.0}}, 1e5, 300).has_value());
  CHECK_FALSE(CompressibilityEstimator::for_mixture({{"CH4", 0.5}, {"Unobtainium", 0.5}}).has_value());
  // Prepared once: the same Z at every state, and fractions that do not sum to 1 are scaled.
  const auto estimator = CompressibilityEstimator::for_mixture(kNaturalGas);
  REQUIRE(estimator.has_value());
  for (const auto& [p, T] : {std::pair{20e5, 290.0}, std::pair{100e5, 400.0}}) {
    CHECK(estimator->z(p, T) == Approx(natural_gas().from_pt(p, T).compressibility).epsilon(1e-12));
  }
  CHECK(CompressibilityEstimator::for_mixture({{"CH4", 2.0}})->z(50e5, 300) ==
        Approx(pure(PR, "CH4").from_pt(50e5, 300).compressibility).epsilon(1e-12));
  CHECK_FALSE(estimate_compressibility({{"CH4", 1.0}}, -1, 300).has_value());
}

TEST_CASE("the Peng-Robinson 1978 alpha above omega 0.491, and the SRK alpha") {
  // NO has omega 0.588 in data/critical.txt: m = 0.379642 + 1.48503 w - 0.164423 w^2 + 0.016666 w^3
  // (Robinson & Peng 1978). Check through a(T): at Tr = 1 the alpha is 1 whatever m, and
  // the slope d sqrt(alpha)/d sqrt(Tr) = -m is seen in Z's change with T at low density.
  const CubicGas no = pure(PR, "NO");
  const double w = 0.588;
  const double m = 0.379642 + 1.48503 * w - 0.164423 * w * w + 0.016666 * w * w * w;
  // Second virial coefficient of a cubic: B2 = b - a/(R T); Z - 1 ~ B2 p/(R T) at low p.
  const double Tc = 180;
  const double pc = 6479997;
  const double b = 0.07779607390388842 * kR * Tc / pc;
  const double ac = 0.45723552892138203 * kR * kR * Tc * Tc / pc;
  const double T = 300;
  const double alpha = std::pow(1 + m * (1 - std::sqrt(T / Tc)), 2);
  const double p = 10;  // Pa
  const double z_expected = 1 + (b - ac * alpha / (kR * T)) * p / (kR * T);
  CHECK(no.from_pt(p, T).compressibility - 1 == Approx(z_expected - 1).epsilon(1e-5));
}

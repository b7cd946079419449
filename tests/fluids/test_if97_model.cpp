// fluids::IapwsIf97 as a FluidModel: region selection, the refinement of the backward
// equations, wet states, round trips, identities and the exact messages of its errors.
#include <algorithm>
#include <cmath>
#include <string>

#include <catch2/catch.hpp>

#include "fluids/if97_printed_digits.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/iapws_if97.hpp"
#include "shaftwork/fluids/iapws_if97_equations.hpp"

using shaftwork::Error;
using shaftwork::ErrorKind;
using shaftwork::fluids::IapwsIf97;
using shaftwork::fluids::State;
using shaftwork::test::PrintedDigits;
namespace if97 = shaftwork::fluids::if97;

namespace {

const IapwsIf97 water;

// Calls f, expecting a shaftwork::Error of `kind` with exactly `message`.
template <class F>
void check_error(F&& f, ErrorKind kind, const std::string& message) {
  try {
    f();
    FAIL("no error thrown; expected: " << message);
  } catch (const Error& e) {
    CHECK(e.kind() == kind);
    CHECK(std::string(e.what()) == message);
  }
}

const std::string kRange = "273.15–1073.15 K up to 100 MPa, 1073.15–2273.15 K up to 50 MPa";

}  // namespace

TEST_CASE("from_pt picks the region of the verification tables", "[if97][model]") {
  // IF97 Table 5 (region 1), Table 15 (region 2), Table 42 (region 5): h in kJ/kg, v in m3/kg.
  const State r1 = water.from_pt(3e6, 300);
  CHECK_THAT(r1.enthalpy / 1e3, PrintedDigits(0.115331273e3, 9));
  CHECK_THAT(1.0 / r1.density, PrintedDigits(0.100215168e-2, 9));
  const State r2 = water.from_pt(30e6, 700);
  CHECK_THAT(r2.enthalpy / 1e3, PrintedDigits(0.263149474e4, 9));
  CHECK_THAT(r2.cp / 1e3, PrintedDigits(0.103505092e2, 9));
  const State r5 = water.from_pt(30e6, 2000);
  CHECK_THAT(r5.entropy / 1e3, PrintedDigits(0.853640523e1, 9));
  CHECK_FALSE(r1.is_wet());
  CHECK(r1.molar_mass == 0.018015268);
  CHECK(r2.compressibility == Approx(30e6 / (r2.density * 461.526 * 700)).epsilon(1e-15));
}

TEST_CASE("from_pt in region 3 inverts IF97 Table 33 (density from p and T)", "[if97][model][region3]") {
  // Table 33: rho = 500 kg/m3 at 650 K gives p = 25.5837018 MPa; 200 kg/m3 at 650 K gives
  // 22.2930643 MPa; 500 kg/m3 at 750 K gives 78.3095639 MPa. The printed p carries nine
  // digits, so the density comes back to about 1e-8 (further near the critical point,
  // where p hardly changes with rho).
  CHECK(water.from_pt(25.5837018e6, 650).density == Approx(500).epsilon(1e-7));
  CHECK(water.from_pt(22.2930643e6, 650).density == Approx(200).epsilon(1e-6));
  CHECK(water.from_pt(78.3095639e6, 750).density == Approx(500).epsilon(1e-7));
  CHECK_THAT(water.from_pt(25.5837018e6, 650).enthalpy / 1e3, PrintedDigits(0.186343019e4, 8));
}

TEST_CASE("SR5-05 starting densities lie within 1 % of the refined ones", "[if97][model][vpt]") {
  // One point in each of a spread of SR5-05 subregions (SR5-05 Table 5 and 13 states).
  const double points[][2] = {{50, 630},   {80, 750},   {20, 630},     {26, 656},  {26, 671},
                              {23.6, 649}, {23.6, 653}, {22.6, 649.1}, {21.1, 644}, {17, 626},
                              {21.5, 644.6}, {22.3, 648.1}};
  for (const auto& pt : points) {
    const double p = pt[0] * 1e6;
    INFO("p = " << pt[0] << " MPa, T = " << pt[1] << " K");
    const double refined = water.from_pt(p, pt[1]).density;
    const double start = 1.0 / if97::region3_v_pt(p, pt[1]);
    CHECK(start == Approx(refined).epsilon(0.01));
    CHECK(if97::region3(refined, pt[1]).p == Approx(p).epsilon(1e-9));
  }
}

TEST_CASE("the backward equation alone misses a pump's isentropic outlet by mK; refined it does not",
          "[if97][model][backward]") {
  // Pump: water at 0.1 MPa and 300 K compressed isentropically to 20 MPa.
  const State inlet = water.from_pt(0.1e6, 300);
  const double p2 = 20e6;
  const double T_backward = if97::region1_T_ps(p2, inlet.entropy);  // IF97 Eq. 13 alone
  const State outlet = water.from_ps(p2, inlet.entropy);              // refined on Eq. 7
  // The backward equation is within its tolerance (IF97 Eq. 14: |dT| <= 25 mK) but not
  // on the isentrope: 3.8 mK off, so s is off by 0.05 J/(kg K) and h by 16 J/kg (0.08 %
  // of this pump's isentropic head of 19.88 kJ/kg).
  CHECK(std::fabs(T_backward - outlet.temperature) > 3e-3);
  CHECK(std::fabs(T_backward - outlet.temperature) < 25e-3);
  CHECK(std::fabs(if97::region1(p2, T_backward).s - inlet.entropy) > 0.04);
  CHECK(std::fabs(if97::region1(p2, T_backward).h - outlet.enthalpy) > 10);
  // The refined outlet lies on the isentrope of the basic equation.
  CHECK(if97::region1(p2, outlet.temperature).s == Approx(inlet.entropy).epsilon(1e-10));
  CHECK(outlet.entropy == Approx(inlet.entropy).epsilon(1e-10));
  CHECK(outlet.enthalpy - inlet.enthalpy == Approx(19.882e3).epsilon(1e-4));  // python3-iapws: 19.8823 kJ/kg
}

TEST_CASE("refined states reproduce the given h or s to the solver's tolerance", "[if97][model]") {
  // (p in Pa, T in K) across regions 1, 2, 3 and 5.
  const double points[][2] = {{0.1e6, 300},  {3e6, 500},   {80e6, 600},  {0.0035e6, 300}, {1e6, 500},
                              {10e6, 800},   {90e6, 1000}, {25e6, 650},  {40e6, 700},     {18e6, 640},
                              {0.5e6, 1500}, {30e6, 2000}, {50e6, 1100}, {1e3, 280}};
  for (const auto& pt : points) {
    INFO("p = " << pt[0] << " Pa, T = " << pt[1] << " K");
    const State st = water.from_pt(pt[0], pt[1]);
    const State by_h = water.from_ph(pt[0], st.enthalpy);
    const State by_s = water.from_ps(pt[0], st.entropy);
    // The last Newton step is at most 1e-10 T, so h is within cp * 1e-10 T of the target.
    CHECK(std::fabs(by_h.enthalpy - st.enthalpy) <= st.cp * 1e-10 * pt[1]);
    CHECK(std::fabs(by_s.entropy - st.entropy) <= st.cp * 1e-10);
  }
}

TEST_CASE("round trips pT -> ph -> pT and pT -> ps -> pT in every region", "[if97][model]") {
  // A grid over the whole range, skipping states within 0.2 K of a region boundary (623.15 K,
  // B23 and 1073.15 K), where two basic equations meet and agree only within IF97's
  // consistency tolerances, and within 0.05 K of the saturation line.
  int checked = 0;
  for (double lg = 2.8; lg <= 8.0; lg += 0.13) {
    const double p = std::pow(10.0, lg);
    for (double T = 273.2; T <= 2273.15; T += 13.7) {
      if (T > 1073.15 && p > 50e6) continue;
      if (std::fabs(T - 623.15) < 0.2 || std::fabs(T - 1073.15) < 0.2) continue;
      if (T > 623.15 && T < 863.15 && std::fabs(T - if97::b23_temperature(std::max(p, 16.53e6))) < 0.2) continue;
      if (p > 611.213 && p < 22.064e6 && std::fabs(T - if97::saturation_temperature(p)) < 0.05) continue;
      const State st = water.from_pt(p, T);
      const State by_h = water.from_ph(p, st.enthalpy);
      const State by_s = water.from_ps(p, st.entropy);
      INFO("p = " << p << " Pa, T = " << T << " K");
      CHECK_FALSE(by_h.is_wet());
      CHECK_FALSE(by_s.is_wet());
      CHECK(by_h.temperature == Approx(T).epsilon(1e-9));
      CHECK(by_s.temperature == Approx(T).epsilon(1e-9));
      CHECK(by_h.density == Approx(st.density).epsilon(1e-8));
      CHECK(by_s.density == Approx(st.density).epsilon(1e-8));
      ++checked;
    }
  }
  CHECK(checked > 5000);
}

TEST_CASE("round trips near the critical point (region 3)", "[if97][model][region3]") {
  const double points[][2] = {{22.1e6, 647.2}, {22.5e6, 648.6}, {23e6, 650},  {22.07e6, 647.1},
                              {21e6, 642},     {21e6, 644},     {22e6, 646.8}, {22e6, 646.9}};
  for (const auto& pt : points) {
    INFO("p = " << pt[0] << " Pa, T = " << pt[1] << " K");
    const State st = water.from_pt(pt[0], pt[1]);
    CHECK(water.from_ph(pt[0], st.enthalpy).temperature == Approx(pt[1]).epsilon(1e-9));
    CHECK(water.from_ps(pt[0], st.entropy).temperature == Approx(pt[1]).epsilon(1e-9));
  }
}

TEST_CASE("at the critical point (p, h) and (p, s) give back h and s to 1e-9", "[if97][model][region3]") {
  // The critical point of IF97 (Sec. 3: 22.064 MPa, 647.096 K, 322 kg/m3); h there is
  // 2087.546845 kJ/kg to seven digits (computed from region 3's equation, as below). There
  // (dp/drho)_T is zero, and once a rounding below zero sent the solve to a fallback that
  // returned a state 555 J/kg off.
  const State critical = water.from_ph(22.064e6, 2087.546845e3);
  CHECK(std::fabs(critical.enthalpy - 2087.546845e3) <= 1e-9 * 2087.546845e3);
  CHECK(critical.temperature == Approx(647.096).epsilon(1e-7));
  CHECK(critical.density == Approx(322.0).epsilon(1e-5));
  CHECK(std::fabs(water.from_ps(22.064e6, critical.entropy).entropy - critical.entropy) <= 1e-9 * critical.entropy);
  // A grid over 21.5-23 MPa and the enthalpies and entropies around the critical ones.
  double worst = 0;
  for (int i = 0; i <= 60; ++i) {
    for (int j = 0; j <= 60; ++j) {
      const double p = 21.5e6 + i * 1.5e6 / 60;
      const double h = 1.7e6 + j * 0.8e6 / 60;
      const double s = 3.8e3 + j * 1.2e3 / 60;
      worst = std::max(worst, std::fabs(water.from_ph(p, h).enthalpy - h) / h);
      worst = std::max(worst, std::fabs(water.from_ps(p, s).entropy - s) / s);
    }
  }
  CHECK(worst <= 1e-9);
}

TEST_CASE("wet states from (p, s) and (p, h) carry a quality consistent with the lever rule",
          "[if97][model][wet]") {
  // 10 kPa (condenser, regions 1 and 2 at saturation) and 20 MPa (region 3 at saturation).
  for (const double p : {10e3, 1e6, 20e6}) {
    INFO("p = " << p << " Pa");
    const State f = water.from_p_quality(p, 0.0);
    const State g = water.from_p_quality(p, 1.0);
    const double s = f.entropy + 0.37 * (g.entropy - f.entropy);
    const State wet = water.from_ps(p, s);
    REQUIRE(wet.is_wet());
    CHECK(*wet.quality > 0.0);
    CHECK(*wet.quality < 1.0);
    CHECK(*wet.quality == Approx(0.37).epsilon(1e-12));
    CHECK(wet.enthalpy == Approx(f.enthalpy + *wet.quality * (g.enthalpy - f.enthalpy)).epsilon(1e-14));
    CHECK(1.0 / wet.density == Approx(1.0 / f.density + 0.37 * (1.0 / g.density - 1.0 / f.density)).epsilon(1e-12));
    CHECK(wet.temperature == if97::saturation_temperature(p));
    CHECK(wet.cp == 0);
    CHECK(wet.cv == 0);
    const State by_h = water.from_ph(p, wet.enthalpy);
    CHECK(*by_h.quality == Approx(0.37).epsilon(1e-12));
    CHECK(by_h.entropy == Approx(s).epsilon(1e-14));
  }
}

TEST_CASE("an isentropic steam-turbine expansion ends wet", "[if97][model][wet]") {
  // 10 MPa, 800 K expanded to 10 kPa. Reference: python3-iapws 1.5.3, an independent
  // implementation of IF97 (IAPWS97(P=10, T=800), then IAPWS97(P=0.01, s=...)):
  // x = 0.805018734, T = 318.957548 K, h = 2117.47719 kJ/kg.
  const State inlet = water.from_pt(10e6, 800);
  const State outlet = water.from_ps(10e3, inlet.entropy);
  REQUIRE(outlet.is_wet());
  CHECK(*outlet.quality == Approx(0.805018734).epsilon(1e-8));
  CHECK(outlet.temperature == Approx(318.957548).epsilon(1e-8));
  CHECK(outlet.enthalpy == Approx(2117.47719e3).epsilon(1e-8));
}

TEST_CASE("saturated states meet the single-phase states at the saturation line", "[if97][model][wet]") {
  // In regions 1/2 the saturated states are the basic equations at Ts(p); in region 3 the
  // densities are refined at Ts(p), so p(rho, Ts) is p.
  const State f = water.from_p_quality(1e6, 0.0);
  CHECK(f.enthalpy == if97::region1(1e6, if97::saturation_temperature(1e6)).h);
  const State g3 = water.from_p_quality(20e6, 1.0);
  CHECK(if97::region3(g3.density, g3.temperature).p == Approx(20e6).epsilon(1e-9));
  const State f3 = water.from_p_quality(20e6, 0.0);
  CHECK(if97::region3(f3.density, f3.temperature).p == Approx(20e6).epsilon(1e-9));
  CHECK(f3.density > 322.0);
  CHECK(g3.density < 322.0);
  // Single-phase states just off the line bracket the saturated ones.
  const double Ts = if97::saturation_temperature(20e6);
  CHECK(water.from_pt(20e6, Ts - 1e-4).enthalpy < f3.enthalpy);
  CHECK(water.from_pt(20e6, Ts + 1e-4).enthalpy > g3.enthalpy);
}

TEST_CASE("cp = (dh/dT)_p in every region", "[if97][model][identity]") {
  const double points[][2] = {{1e6, 350}, {0.1e6, 500}, {30e6, 700}, {25e6, 660}, {10e6, 1500}};
  for (const auto& pt : points) {
    INFO("p = " << pt[0] << " Pa, T = " << pt[1] << " K");
    const double dT = 1e-3;
    const double dh = water.from_pt(pt[0], pt[1] + dT).enthalpy - water.from_pt(pt[0], pt[1] - dT).enthalpy;
    CHECK(water.from_pt(pt[0], pt[1]).cp == Approx(dh / (2 * dT)).epsilon(1e-6));
    const double ds = water.from_pt(pt[0], pt[1] + dT).entropy - water.from_pt(pt[0], pt[1] - dT).entropy;
    CHECK(water.from_pt(pt[0], pt[1]).cp / pt[1] == Approx(ds / (2 * dT)).epsilon(1e-6));
  }
}

TEST_CASE("the reference state: u = 0 and s = 0 for the liquid at the triple point", "[if97][model]") {
  // IF97 Sec. 5.1: the saturated liquid at 273.16 K and 611.657 Pa.
  const State triple = water.from_pt(611.657, 273.16 - 1e-6);
  CHECK(std::fabs(triple.enthalpy - triple.pressure / triple.density) < 0.01);  // u in J/kg
  CHECK(std::fabs(triple.entropy) < 1e-4);                                     // J/(kg K)
}

TEST_CASE("exactly saturated (p, T) is refused with the exact message", "[if97][model][errors]") {
  const double Ts = if97::saturation_temperature(1e6);  // 453.035632 K (IF97 Table 36)
  check_error([&] { water.from_pt(1e6, Ts); }, ErrorKind::bad_input,
              "iapws-if97: 453.036 K is the saturation temperature at 1 MPa, where (p, Tsat) does "
              "not fix a wet state; give enthalpy, quality, or power with flow instead");
  // Region 3's part of the line too.
  const double Ts3 = if97::saturation_temperature(20e6);
  check_error([&] { water.from_pt(20e6, Ts3); }, ErrorKind::bad_input,
              "iapws-if97: 638.896 K is the saturation temperature at 20 MPa, where (p, Tsat) does "
              "not fix a wet state; give enthalpy, quality, or power with flow instead");
  // Within the band of 1e-9 T: refused; just outside it: liquid below, vapour above.
  CHECK_THROWS_AS(water.from_pt(1e6, Ts * (1 + 0.9e-9)), Error);
  CHECK_THROWS_AS(water.from_pt(1e6, Ts * (1 - 0.9e-9)), Error);
  CHECK(water.from_pt(1e6, Ts * (1 - 2e-9)).density > 800);
  CHECK(water.from_pt(1e6, Ts * (1 + 2e-9)).density < 10);
  // The saturation pressure of a temperature given in degC (100 degC) is not refused at 1 atm.
  CHECK_NOTHROW(water.from_pt(101325, 373.15));
}

TEST_CASE("states outside IF97's range are refused naming the range", "[if97][model][errors]") {
  check_error([] { water.from_pt(60e6, 1200); }, ErrorKind::out_of_range,
              "iapws-if97: 1200 K at 60 MPa is outside IF97's range: " + kRange);
  check_error([] { water.from_pt(1e6, 270); }, ErrorKind::out_of_range,
              "iapws-if97: 270 K at 1 MPa is outside IF97's range: " + kRange);
  check_error([] { water.from_pt(101e6, 500); }, ErrorKind::out_of_range,
              "iapws-if97: 500 K at 101 MPa is outside IF97's range: " + kRange);
  check_error([] { water.from_ph(60e6, 7000e3); }, ErrorKind::out_of_range,
              "iapws-if97: enthalpy 7000 kJ/kg at 60 MPa is outside IF97's range: " + kRange);
  check_error([] { water.from_ph(1e6, 9000e3); }, ErrorKind::out_of_range,
              "iapws-if97: enthalpy 9000 kJ/kg at 1 MPa is outside IF97's range: " + kRange);
  check_error([] { water.from_ph(1e6, -10e3); }, ErrorKind::out_of_range,
              "iapws-if97: enthalpy -10 kJ/kg at 1 MPa is outside IF97's range: " + kRange);
  check_error([] { water.from_ps(1e6, -1e3); }, ErrorKind::out_of_range,
              "iapws-if97: entropy -1 kJ/(kg K) at 1 MPa is outside IF97's range: " + kRange);
  check_error([] { water.from_ps(100, 5e3); }, ErrorKind::out_of_range,
              "iapws-if97: entropy 5 kJ/(kg K) at 0.0001 MPa is outside IF97's range: " + kRange);
  check_error([] { water.from_pt(0, 300); }, ErrorKind::bad_input,
              "iapws-if97: pressure must be finite and above 0 Pa, got 0 Pa");
  check_error([] { water.from_ph(1e6, std::nan("")); }, ErrorKind::bad_input,
              "iapws-if97: enthalpy must be a finite number");
}

TEST_CASE("wet states from (p, quality) and the saturation line", "[if97][model][wet]") {
  CHECK(*water.saturation_temperature(1e6) == if97::saturation_temperature(1e6));
  CHECK_FALSE(water.saturation_temperature(25e6).has_value());
  CHECK_FALSE(water.saturation_temperature(100).has_value());
  CHECK_THAT(IapwsIf97::saturation_pressure(500) / 1e6, PrintedDigits(0.263889776e1, 9));
  const State w = water.from_p_quality(0.1e6, 0.9);
  CHECK(*w.quality == 0.9);
  CHECK_THAT(w.temperature, PrintedDigits(0.372755919e3, 9));
  check_error([] { water.from_p_quality(1e6, 1.2); }, ErrorKind::bad_input,
              "iapws-if97: quality must be between 0 and 1, got 1.2");
  check_error([] { water.from_p_quality(23e6, 0.5); }, ErrorKind::out_of_range,
              "iapws-if97: a wet state needs a pressure from 611.213 Pa up to the critical pressure "
              "22.064 MPa, got 23 MPa");
  check_error([] { IapwsIf97::saturation_pressure(700); }, ErrorKind::out_of_range,
              "iapws-if97: saturation pressure is defined from 273.15 K to the critical temperature "
              "647.096 K, got 700 K");
}

TEST_CASE("the model describes itself", "[if97][model]") {
  CHECK(water.model_name() == "iapws-if97");
  CHECK(water.temperature_range().low == 273.15);
  CHECK(water.temperature_range().high == 2273.15);
  CHECK(water.pressure_range().high == 100e6);
  CHECK_FALSE(water.ideal_gas_constant().has_value());
  CHECK_FALSE(water.is_incompressible());
}

// The polytropic path of real fluids (src/machines/path_solver.cpp) against an independent
// integration (machines/polytropic_reference.hpp), and its edge cases. The reference's own
// error (|h_2N - h_N| / 15) is required below 1e-10 of the enthalpy change before it is used.
#include <algorithm>
#include <cmath>
#include <cstdio>
#include <memory>
#include <optional>
#include <string>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/constant_cp.hpp"
#include "shaftwork/fluids/cubic_eos.hpp"
#include "shaftwork/fluids/iapws_if97.hpp"
#include "shaftwork/fluids/incompressible.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"
#include "shaftwork/machines/polytropic.hpp"
#include "machines/polytropic_reference.hpp"

using namespace shaftwork;
using fluids::FluidModel;
using fluids::State;
using test::ReferencePath;

namespace {

const fluids::IapwsIf97 kWater;

struct PathCase {
  const char* label;
  State inlet;
  double p2;
  double eta;
};

double factor(const PathCase& c) { return c.p2 > c.inlet.pressure ? 1.0 / c.eta : c.eta; }

// Steam and water paths over every part of IF97 a machine meets.
std::vector<PathCase> if97_cases() {
  const auto& w = kWater;
  return {
      {"MVR compressor, 1 bar, 5 K superheat, ratio 3", w.from_pt(1e5, 378.15), 3e5, 0.75},
      {"steam compressor, superheated, ratio 4", w.from_pt(2e6, 600), 8e6, 0.8},
      {"compressor from saturated vapour (x = 1)", w.from_p_quality(1e5, 1.0), 4e5, 0.7},
      {"wet compression, x = 0.9, into superheat", w.from_p_quality(1e5, 0.9), 4e5, 0.7},
      {"condensing turbine 10 MPa 500 degC to 10 kPa", w.from_pt(10e6, 773.15), 10e3, 0.85},
      {"back-pressure turbine, wet isentropic end, dry actual end", w.from_pt(4.2e6, 693.15), 0.35e6, 0.78},
      {"turbine 480 bar 741 K to 120 bar (region 3, then wet above 16.5 MPa)", w.from_pt(48e6, 741), 12e6,
       0.85},
      {"turbine 22.0 MPa 373.7 degC to 4.4 MPa (next to the critical point)", w.from_pt(22e6, 646.85), 4.4e6,
       0.85},
      {"turbine 47.6 MPa 644 K to 14.3 MPa (region 3, 623.15 K, wet; sweep case 1)",
       w.from_pt(47635001.517137915, 644.46724051677324), 14268506.139843475, 0.62212546767095633},
      {"supercritical turbine, region 3 into region 2 across B23", w.from_pt(30e6, 720), 8e6, 0.88},
      {"turbine 50 bar 1200 K to 10 bar (region 5 into region 2)", w.from_pt(5e6, 1200), 1e6, 0.85},
      {"region 5 compressor at the top of the range", w.from_pt(1e6, 1500), 3e6, 0.9},
      {"boiler feed pump to exactly 100 MPa", w.from_pt(1e5, 298.15), 100e6, 0.8},
      {"hot-water pump across 623.15 K (region 1 into region 3)", w.from_pt(17e6, 620), 60e6, 0.3},
      {"hydraulic turbine on hot water that flashes", w.from_pt(5e6, 450), 0.5e6, 0.8},
      {"low-pressure expansion to 1 kPa", w.from_pt(1e6, 500), 1e3, 0.8},
      {"compressor at 1 % efficiency, small ratio", w.from_pt(1e5, 378.15), 1.01e5, 0.01},
      {"turbine at 2 % efficiency (nearly a throttle)", w.from_pt(5e6, 700), 1e6, 0.02},
      {"fan, pressure ratio 1.0001", w.from_pt(1e5, 400), 1.0001e5, 0.7},
      // The first path's cut (ln p halfway) lies in the wet region: the segment beyond the
      // saturation crossing must take the enthalpy form (it kept the entropy form: off by
      // 3.6e-7 of the enthalpy change; IF97 sweep, seed 13).
      {"turbine 128 bar 678 K to 4 kPa, wet over more than half the path",
       w.from_pt(12820510.872953774, 677.82355147221597), 4084.4625055001247, 0.80116933450113947},
  };
}

}  // namespace

TEST_CASE("IF97 polytropic path: outlet and efficiency within 1e-8 of an independent RK4 integration",
          "[polytropic][if97]") {
  for (const PathCase& c : if97_cases()) {
    INFO(c.label);
    const double f = factor(c);
    const auto [h_ref, ref_error] = ReferencePath(kWater, c.inlet, c.p2, f).outlet_enthalpy(400);
    const double rise = std::fabs(h_ref - c.inlet.enthalpy);
    REQUIRE(ref_error <= 1e-10 * rise);  // the reference has converged
    const double h2 = machines::polytropic_outlet_enthalpy(kWater, c.inlet, c.p2, c.eta);
    const double eta_back = machines::polytropic_efficiency(kWater, c.inlet, kWater.from_ph(c.p2, h_ref));
    std::printf("  %-72s h2 off %.1e of dh, eta off %.1e\n", c.label, std::fabs(h2 - h_ref) / rise,
                std::fabs(eta_back - c.eta) / c.eta);
    CHECK(std::fabs(h2 - h_ref) <= 1e-9 * rise);
    CHECK(std::fabs(eta_back - c.eta) <= 1e-8 * c.eta);
  }
}

TEST_CASE("IF97 polytropic path: the efficiency solved from an outlet gives that outlet back",
          "[polytropic][if97]") {
  for (const PathCase& c : if97_cases()) {
    INFO(c.label);
    const State outlet = kWater.from_ph(c.p2, machines::polytropic_outlet_enthalpy(kWater, c.inlet, c.p2, c.eta));
    CHECK(machines::polytropic_efficiency(kWater, c.inlet, outlet) == Approx(c.eta).epsilon(1e-9));
  }
}

TEST_CASE("cubic gases: the path and the efficiency from an outlet against the RK4 integration",
          "[polytropic][cubic]") {
  // A pipeline gas (invented composition, mole fractions) and CO2, on Peng-Robinson and
  // Soave-Redlich-Kwong. The cubic model's states carry the isobaric expansivity the path
  // uses for its slopes; with it missing, the solve for the efficiency and the forward path
  // disagreed by up to 7e-8 of the enthalpy rise, and a 5 -> 40 bar path was refused.
  const fluids::SpeciesLibrary& library = fluids::SpeciesLibrary::built_in();
  const auto species = [&](const char* name) { return library.find(name); };
  const std::vector<fluids::Component> gas = {{species("CH4"), 0.912}, {species("C2H6"), 0.045},
                                              {species("C3H8"), 0.012}, {species("n-C4H10"), 0.003},
                                              {species("i-C4H10"), 0.0025}, {species("n-C5H12"), 0.0008},
                                              {species("i-C5H12"), 0.0007}, {species("n-C6H14"), 0.0005},
                                              {species("N2"), 0.015}, {species("CO2"), 0.0085}};
  const std::vector<fluids::Component> co2 = {{species("CO2"), 1.0}};
  struct CubicCase {
    const char* label;
    const std::vector<fluids::Component>* components;
    double p1, T1, p2, eta;
  };
  const CubicCase cases[] = {
      {"natural-gas booster 42.6 -> 64.2 bar", &gas, 42.6e5, 291.0, 64.2e5, 0.8},
      {"natural gas 5 -> 40 bar in one stage", &gas, 5e5, 300.0, 40e5, 0.78},
      {"natural gas 20 -> 80 bar", &gas, 20e5, 300.0, 80e5, 0.85},
      {"natural-gas expander 60 -> 20 bar", &gas, 60e5, 330.0, 20e5, 0.82},
      {"CO2 stage 18 -> 38 bar", &co2, 18e5, 313.15, 38e5, 0.8},
      {"CO2 60 -> 100 bar above the critical temperature", &co2, 60e5, 320.0, 100e5, 0.75},
  };
  for (const fluids::CubicKind kind : {fluids::CubicKind::peng_robinson, fluids::CubicKind::soave_redlich_kwong}) {
    for (const CubicCase& c : cases) {
      INFO(c.label << (kind == fluids::CubicKind::peng_robinson ? " (PR)" : " (SRK)"));
      const fluids::CubicGas model(kind, *c.components, fluids::CompositionBasis::mole);
      const State inlet = model.from_pt(c.p1, c.T1);
      const double f = c.p2 > c.p1 ? 1.0 / c.eta : c.eta;
      const auto [h_ref, ref_error] = ReferencePath(model, inlet, c.p2, f).outlet_enthalpy(200);
      const double rise = std::fabs(h_ref - inlet.enthalpy);
      REQUIRE(ref_error <= 1e-10 * rise);
      const double h2 = machines::polytropic_outlet_enthalpy(model, inlet, c.p2, c.eta);
      CHECK(std::fabs(h2 - h_ref) <= 1e-9 * rise);
      const double eta_back = machines::polytropic_efficiency(model, inlet, model.from_ph(c.p2, h_ref));
      CHECK(std::fabs(eta_back - c.eta) <= 1e-8 * c.eta);
    }
  }
}

namespace {

// A model's states with its special cases hidden, so that the general path solves them:
// an ideal gas that does not say so, an incompressible liquid that does not say so.
class Disguised final : public FluidModel {
 public:
  explicit Disguised(std::shared_ptr<const FluidModel> model) : model_(std::move(model)) {}
  State from_pt(double p, double T) const override { return model_->from_pt(p, T); }
  State from_ph(double p, double h) const override { return model_->from_ph(p, h); }
  State from_ps(double p, double s) const override { return model_->from_ps(p, s); }
  fluids::FluidKind fluid_kind() const override { return fluids::FluidKind::real_gas; }  // the general path
  std::string model_name() const override { return model_->model_name(); }
  std::string description() const override { return model_->description(); }
  fluids::Range temperature_range() const override { return model_->temperature_range(); }
  fluids::Range pressure_range() const override { return model_->pressure_range(); }

 private:
  std::shared_ptr<const FluidModel> model_;
};

}  // namespace

TEST_CASE("the general path meets the closed forms of an ideal gas and of a liquid", "[polytropic]") {
  SECTION("NASA-polynomial air: s2 - s1 = R (1/eta_p - 1) ln(p2/p1) in compression") {
    const auto& lib = fluids::SpeciesLibrary::built_in();
    const auto air = std::make_shared<fluids::NasaPolynomialGas>(
        std::vector<fluids::Component>{{lib.find("N2"), 0.78084}, {lib.find("O2"), 0.209476},
                                       {lib.find("Ar"), 0.009365}, {lib.find("CO2"), 0.000319}},
        fluids::CompositionBasis::mole);
    const Disguised hidden(air);
    for (const auto& [p1, T1, p2, eta] : {std::array<double, 4>{1e5, 293.15, 8e5, 0.82},
                                          std::array<double, 4>{20e5, 1400, 1.1e5, 0.88}}) {
      const State in = air->from_pt(p1, T1);
      const double closed = machines::polytropic_outlet_enthalpy(*air, in, p2, eta);  // the exact relation
      const double general = machines::polytropic_outlet_enthalpy(hidden, in, p2, eta);
      CHECK(std::fabs(general - closed) <= 1e-10 * std::fabs(closed - in.enthalpy));
      const double back = machines::polytropic_efficiency(hidden, in, air->from_ph(p2, closed));
      CHECK(back == Approx(eta).epsilon(1e-10));
    }
  }
  SECTION("incompressible water: h2 = h1 + v dp / eta_p, as for the isentropic efficiency") {
    const auto liquid = std::make_shared<fluids::IncompressibleLiquid>(998.0, 4180.0);
    const Disguised hidden(liquid);
    const State in = liquid->from_pt(2e5, 300);
    const double expected = in.enthalpy + (80e5 - 2e5) / 998.0 / 0.7;
    const double general = machines::polytropic_outlet_enthalpy(hidden, in, 80e5, 0.7);
    CHECK(std::fabs(general - expected) <= 1e-10 * (expected - in.enthalpy));
  }
}

TEST_CASE("efficiency 1 is the isentrope, on every model", "[polytropic][edges]") {
  const State in = kWater.from_pt(10e6, 773.15);
  CHECK(machines::polytropic_outlet_enthalpy(kWater, in, 10e3, 1.0) == kWater.from_ps(10e3, in.entropy).enthalpy);
  const State isentropic = kWater.from_ps(10e3, in.entropy);
  CHECK(machines::polytropic_efficiency(kWater, in, isentropic) == 1.0);
  // An outlet a rounding below the isentrope (as a solve at efficiency 1 may return) is 1, not more.
  State below = isentropic;
  below.entropy = std::nextafter(in.entropy, 0.0);
  CHECK(machines::polytropic_efficiency(kWater, in, below) == 1.0);
  fluids::ConstantCpInputs gas;
  gas.cp = 1005;
  gas.k = 1.4;
  const fluids::ConstantCpGas air(gas);
  const State a = air.from_pt(1e5, 300);
  CHECK(machines::polytropic_efficiency(air, a, air.from_ps(5e5, a.entropy)) == 1.0);
}

TEST_CASE("no polytropic efficiency above 1, and none from a pressure change lost in rounding",
          "[polytropic][edges]") {
  fluids::ConstantCpInputs gas;
  gas.cp = 1005;
  gas.k = 1.4;
  const fluids::ConstantCpGas air(gas);
  const State in = air.from_pt(1e5, 300);
  // p2 = p1 (1 + 1e-15) with the outlet 0.1 mK warmer: the entropy rise R ln(p2/p1) ~ 3e-13 J/(kg K)
  // is far below the rounding of the entropies (~1e-12 J/(kg K)).
  const State out = air.from_pt(1e5 * (1 + 1e-15), 300.0001);
  CHECK_THROWS_WITH(machines::polytropic_efficiency(air, in, out),
                    "outlet and inlet pressures differ by 1.16e-15 of the inlet pressure, too little for a "
                    "polytropic efficiency: the entropy change they allow is within the rounding of the "
                    "entropies; give pressures that differ by more");
  // An outlet clearly below the isentrope is refused, not reported as an efficiency above 1.
  const State cold = air.from_pt(5e5, air.from_ps(5e5, in.entropy).temperature - 1.0);
  CHECK_THROWS_WITH(machines::polytropic_efficiency(air, in, cold),
                    Catch::Matchers::StartsWith("the outlet entropy lies") &&
                        Catch::Matchers::EndsWith("J/(kg K) below the inlet's: no polytropic efficiency at most 1 "
                                                  "reaches this outlet"));
  const State steam_in = kWater.from_pt(1e5, 400);
  const State steam_cold = kWater.from_pt(3e5, kWater.from_ps(3e5, steam_in.entropy).temperature - 1.0);
  CHECK_THROWS_AS(machines::polytropic_efficiency(kWater, steam_in, steam_cold), Error);
}

TEST_CASE("small efficiencies: the path holds down to 0.001", "[polytropic][edges]") {
  const State in = kWater.from_pt(1e5, 378.15);
  for (double eta : {0.02, 0.01, 0.001}) {
    INFO("eta_p " << eta);
    const double h2 = machines::polytropic_outlet_enthalpy(kWater, in, 1.001e5, eta);
    CHECK(machines::polytropic_efficiency(kWater, in, kWater.from_ph(1.001e5, h2)) == Approx(eta).epsilon(1e-9));
  }
  const State hot = kWater.from_pt(5e6, 700);
  const double h2 = machines::polytropic_outlet_enthalpy(kWater, hot, 1e6, 0.001);  // nearly isenthalpic
  CHECK(std::fabs(h2 - hot.enthalpy) < 0.01 * std::fabs(kWater.from_ps(1e6, hot.entropy).enthalpy - hot.enthalpy));
  CHECK(machines::polytropic_efficiency(kWater, hot, kWater.from_ph(1e6, h2)) == Approx(0.001).epsilon(1e-8));
}

TEST_CASE("an efficiency outside (0, 1] is refused with the value", "[polytropic][edges]") {
  const State in = kWater.from_pt(1e5, 400);
  CHECK_THROWS_WITH(machines::polytropic_outlet_enthalpy(kWater, in, 3e5, 0.0),
                    "polytropic efficiency must be above 0 and at most 1, got 0");
  CHECK_THROWS_WITH(machines::polytropic_outlet_enthalpy(kWater, in, 3e5, 1.0000001),
                    "polytropic efficiency must be above 0 and at most 1, got 1.0000001");
}

TEST_CASE("a path that leaves the model's range is refused by the model's message", "[polytropic][edges]") {
  const State in = kWater.from_pt(1e5, 1500);
  // Compressed 100-fold at 50 %, steam would pass 2273.15 K.
  CHECK_THROWS_WITH(machines::polytropic_outlet_enthalpy(kWater, in, 1e7, 0.5),
                    Catch::Matchers::Contains("is outside IF97's range"));
}

// The edges of issue 9 on IAPWS-IF97 and constant cp: efficiency exactly 1, efficiencies
// below 0.02, 100 MPa (IF97's upper pressure, inclusive), and no polytropic efficiency above 1
// from a pressure ratio a hair above 1; the last refusals of the seed-7 2000-point sweep.
#include <cmath>
#include <memory>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/constant_cp.hpp"
#include "shaftwork/fluids/iapws_if97.hpp"
#include "shaftwork/machines/rating.hpp"

using namespace shaftwork;
using machines::EfficiencyBasis;
using machines::MachineKind;
using machines::RatingInput;

namespace {

RatingInput steam_turbine(EfficiencyBasis basis, double eta) {
  RatingInput in;
  in.machine = MachineKind::turbine;
  in.fluid = std::make_shared<const fluids::IapwsIf97>();
  in.inlet_pressure = 4e6;
  in.inlet_temperature = 673.15;
  in.outlet_pressure = 4e5;
  in.mass_flow = 1.0;
  machines::set_efficiency(in, basis, eta);
  return in;
}

RatingInput water_pump(double p2) {
  RatingInput in;
  in.machine = MachineKind::pump;
  in.fluid = std::make_shared<const fluids::IapwsIf97>();
  in.inlet_pressure = 1e5;
  in.inlet_temperature = 293.15;
  in.outlet_pressure = p2;
  in.mass_flow = 1.0;
  return in;
}

}  // namespace

TEST_CASE("steam turbine at efficiency exactly 1, isentropic and polytropic, reaches the isentrope", "[if97][edges]") {
  // python3-iapws 1.5.3: IAPWS97(P=4, T=673.15).h = 3214.3735088712324 kJ/kg; at (P=0.4, s1)
  // h = 2686.2839691278377 kJ/kg, x = 0.9757315664301676.
  for (const auto basis : {EfficiencyBasis::isentropic, EfficiencyBasis::polytropic}) {
    const auto r = machines::rate(steam_turbine(basis, 1.0));
    CHECK(r.outlet.enthalpy == Approx(2686283.9691278377).epsilon(1e-9));
    CHECK(*r.outlet.quality == Approx(0.9757315664301676).epsilon(1e-8));
    CHECK(r.efficiency_isentropic == Approx(1.0).epsilon(1e-9));
    CHECK(r.efficiency_polytropic == Approx(1.0).epsilon(1e-9));
    CHECK(r.efficiency_polytropic <= 1.0);
  }
}

TEST_CASE("efficiencies below 0.02 rate on steam and water", "[if97][edges]") {
  for (const auto basis : {EfficiencyBasis::isentropic, EfficiencyBasis::polytropic}) {
    const auto r = machines::rate(steam_turbine(basis, 0.015));
    const double eta = basis == EfficiencyBasis::isentropic ? r.efficiency_isentropic : r.efficiency_polytropic;
    CHECK(eta == Approx(0.015).epsilon(1e-9));
    CHECK(r.outlet.enthalpy < 3214373.5088712324);  // a turbine still gives work
  }
  RatingInput pump = water_pump(1e6);
  machines::set_efficiency(pump, EfficiencyBasis::polytropic, 0.01);
  const auto r = machines::rate(pump);
  CHECK(r.efficiency_polytropic == Approx(0.01).epsilon(1e-9));
  CHECK(r.outlet.temperature > 313.0);  // 99 % of the work heats the water: about 21 K
}

TEST_CASE("exactly 100 MPa, IF97's upper pressure, is accepted as an outlet", "[if97][edges]") {
  RatingInput pump = water_pump(100e6);
  for (const auto basis : {EfficiencyBasis::isentropic, EfficiencyBasis::polytropic}) {
    machines::set_efficiency(pump, basis, 0.8);
    const auto r = machines::rate(pump);
    CHECK(r.outlet.pressure == 100e6);
    CHECK(std::isfinite(r.outlet.enthalpy));
  }
}

TEST_CASE("a constant-cp compressor with p2 = p1 (1 + 1e-15) prints no polytropic efficiency above 1",
          "[edges]") {
  fluids::ConstantCpInputs gas;
  gas.cp = 1005.0;
  gas.k = 1.4;
  RatingInput in;
  in.machine = MachineKind::compressor;
  in.fluid = std::make_shared<const fluids::ConstantCpGas>(gas);
  in.inlet_pressure = 1e5;
  in.inlet_temperature = 300.0;
  in.outlet_pressure = 1e5 * (1 + 1e-15);
  in.outlet_temperature = 300.0 + 1e-9;
  in.mass_flow = 1.0;
  try {
    const auto r = machines::rate(in);
    CHECK(r.efficiency_polytropic <= 1.0);
    CHECK(r.efficiency_isentropic <= 1.0);
  } catch (const Error& e) {
    SUCCEED(std::string("refused: ") + e.what());  // a refusal with a message is also right
  }
}

// The last refusals of the seed-7 2000-point IF97 sweep (tests/machines/test_rating_if97_sweep.cpp,
// SHAFTWORK_IF97_SWEEP=2000 SHAFTWORK_RANDOM_SEED=7). Check values: the sweep's points, drawn and
// rated forward from inlet, outlet pressure, efficiency and flow; the sweep checks that rating's
// polytropic path against an independent integration (tests/machines/polytropic_reference.hpp).
TEST_CASE("sweep case 1: a turbine from region 3 at 47.6 MPa flashing to x = 0.08 solves its inlet pressure",
          "[if97][edges]") {
  // The path's crossing from region 3, first cut as the saturation line and then followed by the
  // regions with the entropy form before it, went to and fro between the (p, s) and (p, h)
  // places of IF97's 623.15 K boundary and never settled ("no convergence in 60 sweeps").
  RatingInput in;
  in.machine = MachineKind::turbine;
  in.fluid = std::make_shared<const fluids::IapwsIf97>();
  in.inlet_temperature = 644.46724051677324;
  in.outlet_pressure = 14268506.139843475;
  in.outlet_enthalpy = 1665175.3136656282;
  in.power = 188074.48254889925;
  machines::set_efficiency(in, EfficiencyBasis::polytropic, 0.62212546767095633);
  const auto r = machines::rate(in);
  CHECK(r.inlet.pressure == Approx(47635001.517137915).epsilon(1e-8));
  CHECK(*r.mass_flow == Approx(5.464891991624711).epsilon(1e-8));
  CHECK(r.outlet.is_wet());
}

namespace {

RatingInput superheated_exhaust(double p1, double T2, double m, double P, double eta, double eta_m) {
  RatingInput in;
  in.machine = MachineKind::turbine;
  in.fluid = std::make_shared<const fluids::IapwsIf97>();
  in.inlet_pressure = p1;
  in.outlet_temperature = T2;
  in.mass_flow = m;
  in.power = P;
  in.mechanical_efficiency = eta_m;
  machines::set_efficiency(in, EfficiencyBasis::polytropic, eta);
  return in;
}

}  // namespace

TEST_CASE("sweep case 2: an outlet temperature a few K superheated solves the outlet pressure and inlet "
          "temperature, though it is wet at trial pressures above its own",
          "[if97][edges]") {
  // Trial outlet pressures above psat(T2) make the given temperature wet (refused there), and
  // above 22.064 MPa it is liquid again: a change of sign across the refused ones was taken for
  // a bracket and closing on it met the refusal.
  struct Case {
    double p1, T1, p2, T2, m, P, eta, eta_m;
  };
  const Case cases[] = {
      {24033032.557883885, 729.66280066562047, 6342492.6160290726, 555.90412440105683, 6.8048995107613663,
       1303769.6505733307, 0.70967516687968324, 0.92954695448369695},
      {38879839.12931478, 799.38386134382097, 7891018.866332368, 571.19807756032014, 314.19565154162234,
       86013430.263531014, 0.79188975813234597, 0.97536481412386489},
  };
  for (const Case& c : cases) {
    const auto r = machines::rate(superheated_exhaust(c.p1, c.T2, c.m, c.P, c.eta, c.eta_m));
    CHECK(r.outlet.pressure == Approx(c.p2).epsilon(1e-8));
    CHECK(r.inlet.temperature == Approx(c.T1).epsilon(1e-9));
    CHECK_FALSE(r.outlet.is_wet());
  }
}

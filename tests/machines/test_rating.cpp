// Rating solver: closed-form ideal-gas relations, every solve direction, refusals.
#include <cmath>
#include <memory>
#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/constant_cp.hpp"
#include "shaftwork/fluids/incompressible.hpp"
#include "shaftwork/machines/rating.hpp"

using namespace shaftwork;
using machines::EfficiencyBasis;
using machines::MachineKind;
using machines::Quantity;
using machines::RatingInput;

namespace {

std::shared_ptr<const fluids::FluidModel> air_constant_cp() {
  fluids::ConstantCpInputs in;
  in.cp = 1005.0;
  in.k = 1.4;
  return std::make_shared<fluids::ConstantCpGas>(in);
}

// The message of the error rate() throws, or "" when it does not throw.
std::string refusal(const RatingInput& in) {
  try {
    machines::rate(in);
  } catch (const Error& e) {
    return e.what();
  }
  return "";
}

RatingInput compressor_point() {
  RatingInput in;
  in.machine = MachineKind::compressor;
  in.fluid = air_constant_cp();
  in.inlet_pressure = 100e3;
  in.inlet_temperature = 293.15;
  in.outlet_pressure = 600e3;
  in.efficiency_isentropic = 0.82;
  in.mass_flow = 3.5;
  return in;
}

}  // namespace

TEST_CASE("compressor on a constant-cp gas follows the closed-form ideal-gas relations") {
  // T2s = T1 (p2/p1)^((k-1)/k); T2 = T1 + (T2s - T1)/eta_s; P = m cp (T2 - T1)
  // (any thermodynamics text, e.g. Saravanamuttoo et al., Gas Turbine Theory, ch. 2).
  const double k = 1.4, cp = 1005.0, T1 = 293.15, r = 6.0, eta = 0.82, m = 3.5;
  const double T2s = T1 * std::pow(r, (k - 1) / k);
  const double T2 = T1 + (T2s - T1) / eta;
  const auto rating = machines::rate(compressor_point());
  CHECK(rating.outlet_isentropic.temperature == Approx(T2s).epsilon(1e-12));
  CHECK(rating.outlet.temperature == Approx(T2).epsilon(1e-12));
  CHECK(*rating.power == Approx(m * cp * (T2 - T1)).epsilon(1e-12));
  CHECK(rating.pressure_ratio == Approx(6.0).epsilon(1e-15));
  CHECK(rating.head_isentropic == Approx(cp * (T2s - T1)).epsilon(1e-12));
  // Polytropic efficiency of a perfect gas: eta_p = ((k-1)/k) ln(p2/p1) / ln(T2/T1).
  const double eta_p = (k - 1) / k * std::log(r) / std::log(T2 / T1);
  CHECK(rating.efficiency_polytropic == Approx(eta_p).epsilon(1e-12));
  CHECK(rating.efficiency_polytropic > rating.efficiency_isentropic);  // compression
  CHECK(rating.head_polytropic == Approx(eta_p * cp * (T2 - T1)).epsilon(1e-12));
  CHECK(rating.solved_for == std::vector<std::string>{"outlet.temperature", "power"});
}

TEST_CASE("RatingOptions without the polytropic path: the same other results, no polytropic ones") {
  const auto full = machines::rate(compressor_point());
  machines::RatingOptions options;
  options.polytropic = false;
  const auto narrow = machines::rate(compressor_point(), options);
  CHECK(full.polytropic);
  CHECK_FALSE(narrow.polytropic);
  CHECK(narrow.efficiency_isentropic == full.efficiency_isentropic);
  CHECK(narrow.outlet.temperature == full.outlet.temperature);
  CHECK(*narrow.power == *full.power);
  CHECK(narrow.head_isentropic == full.head_isentropic);
  CHECK(narrow.specific_work == full.specific_work);
  // A given polytropic efficiency is used whatever the options, and reported.
  RatingInput in = compressor_point();
  machines::set_efficiency(in, EfficiencyBasis::polytropic, 0.85);
  const auto given = machines::rate(in, options);
  CHECK(given.polytropic);
  CHECK(given.efficiency_polytropic == 0.85);
  CHECK(given.head_polytropic == Approx(0.85 * given.specific_work).epsilon(1e-15));
}

TEST_CASE("turbine on a constant-cp gas follows the closed-form relations, polytropic below isentropic") {
  const double k = 1.4, cp = 1005.0, T1 = 900.0, eta_p = 0.88;
  RatingInput in;
  in.machine = MachineKind::turbine;
  in.fluid = air_constant_cp();
  in.inlet_pressure = 1.2e6;
  in.inlet_temperature = T1;
  in.outlet_pressure = 150e3;
  in.efficiency_polytropic = eta_p;
  in.power = 2.0e6;
  const auto rating = machines::rate(in);
  // Polytropic expansion of a perfect gas: T2 = T1 (p2/p1)^(eta_p (k-1)/k).
  const double T2 = T1 * std::pow(150e3 / 1.2e6, eta_p * (k - 1) / k);
  CHECK(rating.outlet.temperature == Approx(T2).epsilon(1e-11));
  CHECK(*rating.mass_flow == Approx(2.0e6 / (cp * (T1 - T2))).epsilon(1e-11));
  CHECK(rating.efficiency_polytropic == Approx(eta_p).epsilon(1e-11));
  CHECK(rating.efficiency_polytropic < rating.efficiency_isentropic);  // expansion
  CHECK(rating.head_polytropic == Approx(cp * (T1 - T2) / eta_p).epsilon(1e-11));
  CHECK(rating.pressure_ratio == Approx(8.0).epsilon(1e-15));
}

TEST_CASE("pump on an incompressible liquid: work is v dp / eta") {
  RatingInput in;
  in.machine = MachineKind::pump;
  in.fluid = std::make_shared<fluids::IncompressibleLiquid>(998.0, 4180.0);
  in.inlet_pressure = 150e3;
  in.inlet_temperature = 298.15;
  in.outlet_pressure = 950e3;
  in.efficiency_isentropic = 0.74;
  in.volume_flow = 0.05;  // 180 m3/h
  in.mechanical_efficiency = 0.97;
  const auto r = machines::rate(in);
  const double m = 0.05 * 998.0;
  const double w = (950e3 - 150e3) / 998.0 / 0.74;  // v dp / eta, J/kg
  CHECK(*r.mass_flow == Approx(m).epsilon(1e-14));
  CHECK(*r.fluid_power == Approx(m * w).epsilon(1e-12));
  CHECK(*r.power == Approx(m * w / 0.97).epsilon(1e-12));
  CHECK(r.efficiency_polytropic == Approx(0.74).epsilon(1e-12));  // equal for a liquid
  CHECK(*r.head_height == Approx(800e3 / (998.0 * 9.80665)).epsilon(1e-14));
  // Outlet warmer by the lost work: dT = w (1 - eta) / c.
  CHECK(r.outlet.temperature - 298.15 == Approx(w * (1 - 0.74) / 4180.0).epsilon(1e-9));
}

namespace {

// A full, consistent point: every one of the seven quantities known.
struct FullPoint {
  double p1, T1, p2, T2, m, P, eta;
};

FullPoint full_point(MachineKind machine, EfficiencyBasis basis) {
  RatingInput in;
  in.machine = machine;
  in.fluid = air_constant_cp();
  const bool comp = machine != MachineKind::turbine;
  in.inlet_pressure = comp ? 101e3 : 900e3;
  in.inlet_temperature = comp ? 288.0 : 850.0;
  in.outlet_pressure = comp ? 520e3 : 130e3;
  machines::set_efficiency(in, basis, 0.84);
  in.mass_flow = 2.2;
  in.mechanical_efficiency = 0.985;
  const auto r = machines::rate(in);
  return {*in.inlet_pressure, *in.inlet_temperature, *in.outlet_pressure, r.outlet.temperature, 2.2, *r.power, 0.84};
}

}  // namespace

TEST_CASE("every solvable pair of unknowns round-trips to 1e-9") {
  const Quantity all[] = {Quantity::inlet_pressure, Quantity::inlet_temperature, Quantity::outlet_pressure,
                          Quantity::outlet_temperature, Quantity::flow, Quantity::power, Quantity::efficiency};
  int solved_cases = 0, refused_cases = 0;
  for (MachineKind machine : {MachineKind::compressor, MachineKind::turbine}) {
    for (EfficiencyBasis basis : {EfficiencyBasis::isentropic, EfficiencyBasis::polytropic}) {
      const FullPoint f = full_point(machine, basis);
      for (int i = 0; i < 7; ++i) {
        for (int j = i + 1; j < 7; ++j) {
          RatingInput in;
          in.machine = machine;
          in.fluid = air_constant_cp();
          in.mechanical_efficiency = 0.985;
          auto drop = [&](Quantity q) { return all[i] == q || all[j] == q; };
          if (!drop(Quantity::inlet_pressure)) in.inlet_pressure = f.p1;
          if (!drop(Quantity::inlet_temperature)) in.inlet_temperature = f.T1;
          if (!drop(Quantity::outlet_pressure)) in.outlet_pressure = f.p2;
          if (!drop(Quantity::outlet_temperature)) in.outlet_temperature = f.T2;
          if (!drop(Quantity::flow)) in.mass_flow = f.m;
          if (!drop(Quantity::power)) in.power = f.P;
          if (!drop(Quantity::efficiency)) machines::set_efficiency(in, basis, f.eta);
          const bool unsized = drop(Quantity::flow) && drop(Quantity::power);
          const bool unsolvable = (drop(Quantity::inlet_pressure) && drop(Quantity::outlet_pressure)) ||
                                  (drop(Quantity::inlet_pressure) && drop(Quantity::efficiency)) ||
                                  (drop(Quantity::outlet_pressure) && drop(Quantity::efficiency));
          INFO(machines::machine_name(machine) << " without " << machines::quantity_key(all[i]) << " and "
                                               << machines::quantity_key(all[j]));
          if (unsolvable) {
            CHECK_THROWS_AS(machines::rate(in), Error);
            ++refused_cases;
            continue;
          }
          const auto r = machines::rate(in);
          CHECK(r.inlet.pressure == Approx(f.p1).epsilon(1e-9));
          CHECK(r.inlet.temperature == Approx(f.T1).epsilon(1e-9));
          CHECK(r.outlet.pressure == Approx(f.p2).epsilon(1e-9));
          CHECK(r.outlet.temperature == Approx(f.T2).epsilon(1e-9));
          const double eta = basis == EfficiencyBasis::isentropic ? r.efficiency_isentropic : r.efficiency_polytropic;
          CHECK(eta == Approx(f.eta).epsilon(1e-9));
          if (unsized) {  // the specific results only: no flow, no power, nothing solved
            CHECK_FALSE(r.mass_flow);
            CHECK_FALSE(r.power);
            CHECK(r.solved_for.empty());
          } else {
            CHECK(*r.mass_flow == Approx(f.m).epsilon(1e-9));
            CHECK(*r.power == Approx(f.P).epsilon(1e-9));
            CHECK(r.solved_for.size() == 2);
          }
          ++solved_cases;
        }
      }
    }
  }
  CHECK(solved_cases == 4 * 18);
  CHECK(refused_cases == 4 * 3);
}

TEST_CASE("four knowns: any four of p1, T1, p2, T2 and the efficiency give the specific results") {
  const Quantity specific[] = {Quantity::inlet_pressure, Quantity::inlet_temperature, Quantity::outlet_pressure,
                               Quantity::outlet_temperature, Quantity::efficiency};
  for (MachineKind machine : {MachineKind::compressor, MachineKind::turbine}) {
    for (EfficiencyBasis basis : {EfficiencyBasis::isentropic, EfficiencyBasis::polytropic}) {
      const FullPoint f = full_point(machine, basis);
      const auto full = machines::rate([&] {
        RatingInput in;
        in.machine = machine;
        in.fluid = air_constant_cp();
        in.inlet_pressure = f.p1;
        in.inlet_temperature = f.T1;
        in.outlet_pressure = f.p2;
        machines::set_efficiency(in, basis, f.eta);
        return in;
      }());
      for (Quantity unknown : specific) {
        RatingInput in;
        in.machine = machine;
        in.fluid = air_constant_cp();
        if (unknown != Quantity::inlet_pressure) in.inlet_pressure = f.p1;
        if (unknown != Quantity::inlet_temperature) in.inlet_temperature = f.T1;
        if (unknown != Quantity::outlet_pressure) in.outlet_pressure = f.p2;
        if (unknown != Quantity::outlet_temperature) in.outlet_temperature = f.T2;
        if (unknown != Quantity::efficiency) machines::set_efficiency(in, basis, f.eta);
        INFO(machines::machine_name(machine) << " without " << machines::quantity_key(unknown));
        const auto r = machines::rate(in);
        CHECK(r.solved_for == machines::SolvedFor{unknown});
        CHECK_FALSE(r.mass_flow);
        CHECK_FALSE(r.power);
        CHECK_FALSE(r.fluid_power);
        CHECK(r.inlet.pressure == Approx(f.p1).epsilon(1e-9));
        CHECK(r.inlet.temperature == Approx(f.T1).epsilon(1e-9));
        CHECK(r.outlet.pressure == Approx(f.p2).epsilon(1e-9));
        CHECK(r.outlet.temperature == Approx(f.T2).epsilon(1e-9));
        CHECK(r.efficiency_isentropic == Approx(full.efficiency_isentropic).epsilon(1e-9));
        CHECK(r.efficiency_polytropic == Approx(full.efficiency_polytropic).epsilon(1e-9));
        CHECK(r.head_polytropic == Approx(full.head_polytropic).epsilon(1e-9));
        // specific_work is |h2 - h1|: cp (T2 - T1) for a constant-cp gas.
        CHECK(r.specific_work == Approx(1005.0 * std::fabs(f.T2 - f.T1)).epsilon(1e-9));
      }
    }
  }
}

TEST_CASE("a full test point reports efficiency from the fluid side and the power balance") {
  const FullPoint f = full_point(MachineKind::compressor, EfficiencyBasis::isentropic);
  RatingInput in;
  in.machine = MachineKind::compressor;
  in.fluid = air_constant_cp();
  in.mechanical_efficiency = 0.985;
  in.inlet_pressure = f.p1;
  in.inlet_temperature = f.T1;
  in.outlet_pressure = f.p2;
  in.outlet_temperature = f.T2;
  in.mass_flow = f.m;
  in.power = f.P * 1.02;  // the measured power reads 2 % high
  const auto r = machines::rate(in);
  CHECK(r.solved_for == std::vector<std::string>{"efficiency"});
  CHECK(r.efficiency_isentropic == Approx(0.84).epsilon(1e-12));
  REQUIRE(r.power_balance);
  CHECK(r.power_balance->given_power == Approx(f.P * 1.02));
  CHECK(r.power_balance->shaft_power == Approx(f.P).epsilon(1e-12));
  CHECK(r.power_balance->fluid_power == Approx(f.P * 0.985).epsilon(1e-12));
  CHECK(r.power_balance->difference_percent == Approx(100 * (1 / 1.02 - 1)).epsilon(1e-10));
  CHECK(*r.power == Approx(f.P * 1.02));  // the shaft power reported is the one given
}

TEST_CASE("a redundant efficiency is reported against the one from the temperatures") {
  const FullPoint f = full_point(MachineKind::turbine, EfficiencyBasis::isentropic);
  RatingInput in;
  in.machine = MachineKind::turbine;
  in.fluid = air_constant_cp();
  in.inlet_pressure = f.p1;
  in.inlet_temperature = f.T1;
  in.outlet_pressure = f.p2;
  in.outlet_temperature = f.T2;
  in.mass_flow = f.m;
  in.efficiency_isentropic = 0.86;
  const auto r = machines::rate(in);
  CHECK(r.solved_for == std::vector<std::string>{"power"});
  REQUIRE(r.efficiency_check);
  CHECK(r.efficiency_check->input == machines::Input::efficiency_isentropic);
  CHECK(r.efficiency_check->given == 0.86);
  CHECK(r.efficiency_check->computed == Approx(0.84).epsilon(1e-12));
  // Two points apart: more than the threshold of a warning.
  REQUIRE(r.warnings.size() == 1);
  CHECK(r.warnings[0] ==
        "the given efficiency.isentropic 0.8600 and the 0.8400 from the temperatures differ by 2.0 points: check "
        "the temperatures and the given value");
}

TEST_CASE("impossible and incomplete sets are refused with the reason") {
  SECTION("turbine outlet above its inlet") {
    RatingInput in = compressor_point();
    in.machine = MachineKind::turbine;
    CHECK(refusal(in) ==
          "a turbine's outlet pressure (600000 Pa) must be below its inlet pressure (100000 Pa)");
  }
  SECTION("compressor outlet below its inlet") {
    RatingInput in = compressor_point();
    in.outlet_pressure = 90e3;
    CHECK(refusal(in) ==
          "a compressor's outlet pressure (90000 Pa) must be above its inlet pressure (100000 Pa)");
  }
  SECTION("efficiency above 1 or at 0") {
    RatingInput in = compressor_point();
    in.efficiency_isentropic = 1.07;
    CHECK(refusal(in) == "efficiency.isentropic: must be above 0 and at most 1 (or 100 %), got 1.07");
    in.efficiency_isentropic = 0;
    CHECK(refusal(in) == "efficiency.isentropic: must be above 0 and at most 1 (or 100 %), got 0");
    in.efficiency_isentropic = 1.0000001;  // not "got 1"
    CHECK(refusal(in) == "efficiency.isentropic: must be above 0 and at most 1 (or 100 %), got 1.0000001");
  }
  SECTION("power below the isentropic minimum") {
    RatingInput in = compressor_point();
    in.efficiency_isentropic.reset();
    // Isentropic power for this flow: m cp (T2s - T1) = 3.5 * 1005 * 195.99... = 689.4 kW.
    in.power = 650e3;
    const std::string message = refusal(in);
    CHECK(message.rfind("efficiency would be 1.06", 0) == 0);
    CHECK(message.find("the power 650000 W is below the isentropic minimum 689") != std::string::npos);
  }
  SECTION("outlet temperature below the isentropic one") {
    RatingInput in = compressor_point();
    in.efficiency_isentropic.reset();
    in.outlet_temperature = 450.0;  // T2s = 489.1 K
    const std::string message = refusal(in);
    CHECK(message.rfind("efficiency would be 1.2", 0) == 0);
    CHECK(message.find("the outlet temperature 450 K is on the wrong side of the isentropic outlet "
                       "temperature 489.1") != std::string::npos);
  }
  SECTION("outlet colder than the inlet") {
    RatingInput in = compressor_point();
    in.efficiency_isentropic.reset();
    in.outlet_temperature = 280.0;
    CHECK(refusal(in).find("a compressor must raise the enthalpy, and the given outlet lowers it by 13.2") !=
          std::string::npos);
  }
  SECTION("three unknowns") {
    RatingInput in = compressor_point();
    in.efficiency_isentropic.reset();
    in.outlet_pressure.reset();
    CHECK(refusal(in) ==
          "too few knowns: outlet.pressure, outlet.temperature, power and efficiency are all unknown; give 2 more "
          "of them (five of the seven quantities fix a machine)");
  }
  SECTION("two specific unknowns without flow and power") {
    RatingInput in = compressor_point();
    in.mass_flow.reset();
    in.efficiency_isentropic.reset();
    CHECK(refusal(in) ==
          "too few knowns: outlet.temperature and efficiency are unknown, and neither the flow nor the power is "
          "given; give 1 more of p1, T1, p2, T2 and the efficiency (four of the five fix the efficiencies, heads "
          "and outlet state), or give the flow and the power as well");
  }
  SECTION("outlet pressure with efficiency") {
    RatingInput in = compressor_point();
    in.outlet_pressure.reset();
    in.efficiency_isentropic.reset();
    in.outlet_temperature = 500.0;
    in.power = 800e3;
    CHECK(refusal(in) ==
          "outlet.pressure and efficiency cannot both be solved: the temperatures, flow and power only check one "
          "another; give one of them and drop power or the flow");
  }
  SECTION("an outlet pressure no efficiency reaches") {
    RatingInput in = compressor_point();
    in.outlet_pressure.reset();
    in.outlet_temperature = 200.0;  // colder than the inlet: no pressure gives it
    in.power.reset();
    const std::string message = refusal(in);
    CHECK(message.rfind("no outlet.pressure between", 0) == 0);
    CHECK(message.find("satisfies the other knowns") != std::string::npos);
  }
}

TEST_CASE("messages echo values the way the user wrote them") {
  RatingInput in = compressor_point();
  in.machine = MachineKind::turbine;
  in.echo = [](Quantity q, double si) {
    return q == Quantity::outlet_pressure || q == Quantity::inlet_pressure ? std::to_string(si / 1e5) + " bar"
                                                                            : std::to_string(si);
  };
  CHECK(refusal(in) == "a turbine's outlet pressure (6.000000 bar) must be below its inlet pressure (1.000000 bar)");
}

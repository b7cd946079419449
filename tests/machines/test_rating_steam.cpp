// Steam turbines and water pumps on IAPWS-IF97: wet outlets, the refusals that a
// wet state needs, the thermodynamic pump method and its sensitivity.
#include <cmath>
#include <memory>
#include <string>

#include <catch2/catch.hpp>
#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/iapws_if97.hpp"
#include "shaftwork/machines/rating.hpp"

using namespace shaftwork;
using machines::MachineKind;
using machines::RatingInput;

namespace {

const auto kWater = std::make_shared<const fluids::IapwsIf97>();

RatingInput condensing_turbine() {
  RatingInput in;
  in.machine = MachineKind::turbine;
  in.fluid = kWater;
  in.inlet_pressure = 8.8e6;
  in.inlet_temperature = 788.15;
  in.outlet_pressure = 8500.0;
  in.mass_flow = 39.4;
  return in;
}

std::string refusal(const RatingInput& in) {
  try {
    machines::rate(in);
  } catch (const Error& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("a wet exhaust given by temperature is refused: temperature does not fix it") {
  RatingInput in = condensing_turbine();
  const double Tsat = *kWater->saturation_temperature(8500.0);
  in.outlet_temperature = Tsat + 0.2;
  CHECK(refusal(in) == fmt::format("outlet.temperature {:.6g} K is within 0.5 K of the saturation temperature "
                                   "{:.6g} K at the outlet pressure: a temperature does not fix a wet state; give "
                                   "outlet.enthalpy or outlet.quality, or power with the flow, instead",
                                   Tsat + 0.2, Tsat));
  in.outlet_temperature = Tsat;  // exactly saturated
  CHECK(refusal(in).find("is within 0.5 K of the saturation temperature") != std::string::npos);
  in.outlet_temperature = Tsat - 3;  // a turbine exhaust below saturation is wet, not liquid
  CHECK(refusal(in).find("is below the saturation temperature") != std::string::npos);
}

TEST_CASE("a wet exhaust fixed by power and flow, or by quality, rates with its quality") {
  RatingInput by_power = condensing_turbine();
  by_power.power = 40e6;
  const auto a = machines::rate(by_power);
  REQUIRE(a.outlet.quality);
  CHECK(*a.outlet.quality > 0.85);
  CHECK(*a.outlet.quality < 1.0);
  CHECK(a.outlet.enthalpy == Approx(a.inlet.enthalpy - 40e6 / 39.4).epsilon(1e-12));
  REQUIRE(a.outlet_isentropic.quality);
  CHECK(*a.outlet_isentropic.quality < *a.outlet.quality);

  // The same outlet given by its quality gives the same power back.
  RatingInput by_quality = condensing_turbine();
  by_quality.outlet_quality = *a.outlet.quality;
  const auto b = machines::rate(by_quality);
  CHECK(*b.power == Approx(40e6).epsilon(1e-9));
  CHECK(b.efficiency_isentropic == Approx(a.efficiency_isentropic).epsilon(1e-9));
  // Reheat: polytropic below isentropic in expansion, also across the saturation line.
  CHECK(b.efficiency_polytropic < b.efficiency_isentropic);
}

TEST_CASE("isentropic end wet, real outlet superheated: h2s from the two-phase region") {
  RatingInput in;
  in.machine = MachineKind::turbine;
  in.fluid = kWater;
  in.inlet_pressure = 4.2e6;
  in.inlet_temperature = 693.15;
  in.outlet_pressure = 0.35e6;
  in.efficiency_isentropic = 0.78;
  in.power = 6e6;
  const auto r = machines::rate(in);
  REQUIRE(r.outlet_isentropic.quality);
  CHECK_FALSE(r.outlet.quality);
  const double Tsat = *kWater->saturation_temperature(0.35e6);
  CHECK(r.outlet.temperature > Tsat);
  // h2s from the mixture rule: h = hf + x (hg - hf).
  const auto f = kWater->from_p_quality(0.35e6, 0.0);
  const auto g = kWater->from_p_quality(0.35e6, 1.0);
  CHECK(r.outlet_isentropic.enthalpy ==
        Approx(f.enthalpy + *r.outlet_isentropic.quality * (g.enthalpy - f.enthalpy)).epsilon(1e-10));
}

TEST_CASE("every solve direction round-trips on steam to 1e-9") {
  RatingInput full = condensing_turbine();
  full.inlet_pressure = 4.2e6;
  full.inlet_temperature = 693.15;
  full.outlet_pressure = 0.35e6;
  full.efficiency_isentropic = 0.8;
  full.mass_flow = 12.0;
  const auto ref = machines::rate(full);
  REQUIRE_FALSE(ref.outlet.quality);

  SECTION("efficiency from the outlet temperature") {
    RatingInput in = full;
    in.efficiency_isentropic.reset();
    in.outlet_temperature = ref.outlet.temperature;
    CHECK(machines::rate(in).efficiency_isentropic == Approx(0.8).epsilon(1e-9));
  }
  SECTION("outlet pressure from outlet temperature and efficiency") {
    RatingInput in = full;
    in.outlet_pressure.reset();
    in.outlet_temperature = ref.outlet.temperature;
    CHECK(machines::rate(in).outlet.pressure == Approx(0.35e6).epsilon(1e-9));
  }
  SECTION("inlet temperature from the outlet temperature, power and flow") {
    RatingInput in = full;
    in.inlet_temperature.reset();
    in.outlet_temperature = ref.outlet.temperature;
    in.power = *ref.power;
    in.efficiency_isentropic.reset();
    CHECK(machines::rate(in).inlet.temperature == Approx(693.15).epsilon(1e-9));
  }
  SECTION("polytropic efficiency given gives back the outlet") {
    RatingInput in = full;
    machines::set_efficiency(in, machines::EfficiencyBasis::polytropic, ref.efficiency_polytropic);
    CHECK(machines::rate(in).outlet.enthalpy == Approx(ref.outlet.enthalpy).epsilon(1e-9));
  }
}

TEST_CASE("feed pump, thermodynamic method: efficiency from the temperature rise and its sensitivity") {
  RatingInput in;
  in.machine = MachineKind::pump;
  in.fluid = kWater;
  in.inlet_pressure = 0.75e6;
  in.inlet_temperature = 438.15;
  in.outlet_pressure = 14.2e6;
  in.outlet_temperature = 440.77;
  in.mass_flow = 41.7;
  const auto r = machines::rate(in);
  CHECK(r.efficiency_isentropic > 0.7);
  CHECK(r.efficiency_isentropic < 0.85);
  // The efficiency uses IF97 enthalpies, not v dp alone: the isentropic work differs
  // from v1 (p2 - p1) by the liquid's compressibility and expansion (about 1 % here).
  const double v_dp = (14.2e6 - 0.75e6) / r.inlet.density;
  CHECK(std::fabs(r.head_isentropic / v_dp - 1) < 0.02);
  CHECK(std::fabs(r.head_isentropic / v_dp - 1) > 1e-4);

  // The warning states how far 0.01 K of rise moves the efficiency; check it against a
  // second rating 0.01 K warmer.
  RatingInput warmer = in;
  warmer.outlet_temperature = 440.78;
  const double moved = 100 * (r.efficiency_isentropic - machines::rate(warmer).efficiency_isentropic);
  REQUIRE(r.warnings.size() == 1);
  CHECK(r.warnings[0] == fmt::format("efficiency from the measured temperature rise: 0.01 K of rise changes it "
                                     "by {:.2g} percentage points",
                                     moved));
}

TEST_CASE("a state outside IF97's range names the range and the place") {
  RatingInput in = condensing_turbine();
  in.inlet_temperature = 2673.15;
  in.efficiency_isentropic = 0.8;
  CHECK(refusal(in) ==
        "inlet: iapws-if97: 2673.15 K at 8.8 MPa is outside IF97's range: 273.15–1073.15 K up to 100 MPa, "
        "1073.15–2273.15 K up to 50 MPa");
}

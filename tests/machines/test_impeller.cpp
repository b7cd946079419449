// Speed and impeller (machines/impeller.hpp): tip speed, flow coefficient and machine Mach
// number against the contract's definitions evaluated here, and the refusals.
#include <cmath>
#include <memory>
#include <numbers>
#include <string>

#include <catch2/catch.hpp>

#include "error_of.hpp"
#include "shaftwork/fluids/constant_cp.hpp"
#include "shaftwork/fluids/incompressible.hpp"
#include "shaftwork/machines/rating.hpp"

using namespace shaftwork;
using machines::MachineKind;
using machines::RatingInput;

namespace {

RatingInput compressor() {
  fluids::ConstantCpInputs air;
  air.cp = 1005.0;
  air.k = 1.4;
  RatingInput in;
  in.machine = MachineKind::compressor;
  in.fluid = std::make_shared<fluids::ConstantCpGas>(air);
  in.inlet_pressure = 100e3;
  in.inlet_temperature = 293.15;
  in.outlet_pressure = 300e3;
  in.efficiency_polytropic = 0.8;
  in.mass_flow = 2.0;
  in.speed = 12000.0 / 60;  // rev/s
  in.impeller_tip_diameter = 0.35;
  in.impeller_exit_width = 0.02;
  return in;
}

}  // namespace

TEST_CASE("tip speed, flow coefficient and machine Mach number follow their definitions") {
  const machines::Rating r = machines::rate(compressor());
  const double D = 0.35, N = 200.0, R = 1005.0 * 0.4 / 1.4;
  const double U = std::numbers::pi * D * N;  // 219.91 m/s
  CHECK(*r.speed == 200.0);
  CHECK(*r.tip_speed == Approx(U).epsilon(1e-15));
  const double Q = 2.0 / (100e3 / (R * 293.15));  // m / rho, rho = p / (R T)
  CHECK(*r.flow_coefficient == Approx(Q / (std::numbers::pi / 4 * D * D * U)).epsilon(1e-13));
  CHECK(*r.machine_mach_number == Approx(U / std::sqrt(1.4 * R * 293.15)).epsilon(1e-8));
  // Without flow or power the machine is unsized: tip speed and Mach number, no flow coefficient.
  RatingInput unsized = compressor();
  unsized.mass_flow.reset();
  const machines::Rating u = machines::rate(unsized);
  CHECK(u.tip_speed);
  CHECK(u.machine_mach_number);
  CHECK_FALSE(u.flow_coefficient);
  // Speed alone: echoed, nothing derived.
  RatingInput speed_only = compressor();
  speed_only.impeller_tip_diameter.reset();
  speed_only.impeller_exit_width.reset();
  const machines::Rating s = machines::rate(speed_only);
  CHECK(*s.speed == 200.0);
  CHECK_FALSE(s.tip_speed);
}

TEST_CASE("an impeller is refused on pumps and turbines, an exit width without its diameter") {
  RatingInput pump = compressor();
  pump.machine = MachineKind::pump;
  pump.fluid = std::make_shared<fluids::IncompressibleLiquid>(998.2, 4182.0);
  CHECK(std::string(test::error_of([&] { machines::rate(pump); }).what()) ==
        "impeller: given for compressors (and fans) only, and this machine is a pump");
  RatingInput width = compressor();
  width.impeller_tip_diameter.reset();
  CHECK(std::string(test::error_of([&] { machines::rate(width); }).what()) ==
        "impeller.exit_width: given without impeller.tip_diameter; the tip diameter sizes the impeller");
}

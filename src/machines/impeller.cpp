#include "shaftwork/machines/impeller.hpp"

#include <numbers>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/speed_of_sound.hpp"

namespace shaftwork::machines {

double tip_speed(double tip_diameter, double speed) { return std::numbers::pi * tip_diameter * speed; }

double flow_coefficient(double volume_flow, double tip_diameter, double tip_speed) {
  return volume_flow / (std::numbers::pi / 4 * tip_diameter * tip_diameter * tip_speed);
}

void rate_impeller(const RatingInput& in, const fluids::FluidModel& fluid, Rating& r) {
  r.speed = in.speed;
  if (!in.speed || !in.impeller_tip_diameter) return;
  const double D = *in.impeller_tip_diameter;
  const double U = tip_speed(D, *in.speed);
  r.tip_speed = U;
  if (r.volume_flow) r.flow_coefficient = flow_coefficient(*r.volume_flow, D, U);
  try {
    r.machine_mach_number = U / fluids::speed_of_sound(fluid, r.inlet);
  } catch (const Error& e) {
    if (e.kind() != ErrorKind::not_available) throw;
    r.warnings.push_back(fmt::format("no machine Mach number: {}", e.what()));
  }
}

}  // namespace shaftwork::machines

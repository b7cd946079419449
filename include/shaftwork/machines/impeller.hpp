// shaftwork/machines/impeller.hpp — the impeller's figures of similarity.
//
// With the shaft speed N [rev/s] and the first impeller's tip diameter D [m]
// (the contract, "Speed and impeller"; ISO 5389:2005 and ASME PTC 10-1997 sec. 5 use the
// same groups):
//   tip speed              U   = pi D N                         [m/s]
//   flow coefficient       phi = Q_in / (pi/4 D^2 U)            [-], Q_in the inlet volume flow
//   machine Mach number    M   = U / a_in                       [-], a_in the inlet speed of sound
// a_in comes from the property model (fluids/speed_of_sound.hpp).
#pragma once

#include "shaftwork/fluids/fluid_model.hpp"
#include "shaftwork/machines/rating.hpp"

namespace shaftwork::machines {

// U = pi D N [m/s] from D [m] and N [rev/s].
double tip_speed(double tip_diameter, double speed);
// phi = Q / (pi/4 D^2 U) from Q [m3/s], D [m] and U [m/s].
double flow_coefficient(double volume_flow, double tip_diameter, double tip_speed);

// Sets r.tip_speed (speed and tip diameter given), r.flow_coefficient (and a flow) and
// r.machine_mach_number (and an inlet speed of sound: a wet inlet has none, and gets a
// warning instead).
void rate_impeller(const RatingInput& in, const fluids::FluidModel& fluid, Rating& r);

}  // namespace shaftwork::machines

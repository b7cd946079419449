#include "shaftwork/fluids/speed_of_sound.hpp"

#include <cmath>

#include <fmt/format.h>

namespace shaftwork::fluids {

namespace {
constexpr double kRelativeStep = 1e-4;  // delta of the header's central difference
}  // namespace

double speed_of_sound(const FluidModel& fluid, const State& state) {
  if (state.is_wet()) {
    throw Error(ErrorKind::not_available,
                "the speed of sound of a wet (two-phase) state is not defined by the property model");
  }
  if (fluid.is_incompressible()) {
    throw Error(ErrorKind::not_available,
                fmt::format("the {} model has no finite speed of sound: its density does not change with pressure",
                            fluid.model_name()));
  }
  const double dp = kRelativeStep * state.pressure;
  const State above = fluid.from_ps(state.pressure + dp, state.entropy);
  const State below = fluid.from_ps(state.pressure - dp, state.entropy);
  const double drho = above.density - below.density;
  if (above.is_wet() || below.is_wet() || !(drho > 0)) {
    throw Error(ErrorKind::not_available,
                fmt::format("the speed of sound at {:.6g} kPa, {:.2f} K is not available: the state lies on a phase "
                            "boundary of the {} model",
                            state.pressure / 1e3, state.temperature, fluid.model_name()));
  }
  return std::sqrt(2 * dp / drho);
}

}  // namespace shaftwork::fluids

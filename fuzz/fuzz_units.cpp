// Fuzz target: unit strings. The first byte picks the dimension and whether the case has a
// site barometer and site standard conditions; the rest is the text units::parse reads. Properties checked beyond "no
// crash": a parsed value is finite and every unit round-trips through to_si/from_si.
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <string>
#include <string_view>

#include "fuzz_check.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/units/quantity.hpp"

namespace {

using shaftwork::units::Dimension;

constexpr Dimension kDimensions[] = {
    Dimension::pressure,     Dimension::temperature,     Dimension::mass_flow,     Dimension::volume_flow,
    Dimension::standard_volume_flow, Dimension::power,   Dimension::specific_energy, Dimension::length,
    Dimension::specific_heat, Dimension::density,        Dimension::molar_mass,    Dimension::fraction,
    Dimension::rotational_speed, Dimension::velocity,
};
constexpr std::size_t kDimensionCount = sizeof(kDimensions) / sizeof(kDimensions[0]);

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size == 0) return 0;
  const Dimension d = kDimensions[data[0] % kDimensionCount];
  shaftwork::units::ParseContext context;
  if (data[0] & 0x80) context.barometric_pressure = 98000.0;
  if (data[0] & 0x40) context.standard_conditions = shaftwork::units::StandardConditions{100000.0, 293.15};
  const std::string_view text(reinterpret_cast<const char*>(data + 1), size - 1);

  shaftwork::units::ParseNotes notes;
  double si = 0;
  try {
    si = shaftwork::units::parse(text, d, context, notes);
  } catch (const shaftwork::Error&) {
    return 0;  // refused with a message: fine
  }
  FUZZ_REQUIRE(std::isfinite(si));

  // The unit as written is whatever follows the last space ("84.5%" has none).
  const std::size_t space = text.find_last_of(" \t");
  if (space == std::string_view::npos) return 0;
  std::string unit(text.substr(space + 1));
  const auto* info = shaftwork::units::find_unit(unit);
  if (info == nullptr || info->dimension != d) return 0;
  const double barometer = context.barometric_pressure.value_or(shaftwork::units::kStandardAtmosphere);
  const double back = shaftwork::units::from_si(si, unit, d, context);
  FUZZ_REQUIRE(std::isfinite(back));
  // Back to SI within the rounding of the affine map; gauge units and temperature scales lose
  // the digits of small values against the barometer or the offset.
  const double shift = std::fabs(info->offset) + (info->gauge ? barometer : 0.0);
  const double tolerance = 1e-12 * (std::fabs(si) + shift) + 1e-300;
  try {
    const double again = shaftwork::units::to_si(back, unit, d, context, notes);
    FUZZ_REQUIRE(std::fabs(again - si) <= tolerance);
  } catch (const shaftwork::Error&) {
    // Only a value at the very edge of its range (an absolute pressure a rounding above
    // zero) may be refused on the way back.
    FUZZ_REQUIRE(std::fabs(si) <= tolerance);
  }
  return 0;
}

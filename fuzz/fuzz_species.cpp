// Fuzz target: species files in the three formats SpeciesLibrary reads. The first byte picks
// the format (own, NASA 9-coefficient, NASA 7-coefficient); the rest is the file. Every
// species that loads is then used: states from (p, T), and (p, h), (p, s) back to T.
// A refusal (shaftwork::Error) is fine; a crash, a sanitizer report, or a loaded species
// that gives a non-finite state or a wrong round trip is a finding.
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <cstdlib>
#include <limits>
#include <string>
#include <string_view>

#include "fuzz_check.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

namespace {

using shaftwork::fluids::CompositionBasis;
using shaftwork::fluids::NasaPolynomialGas;
using shaftwork::fluids::SpeciesLibrary;

void exercise(const NasaPolynomialGas& gas) {
  const auto range = gas.temperature_range();
  FUZZ_REQUIRE(std::isfinite(range.low) && std::isfinite(range.high) && range.low < range.high);
  for (double t : {0.0, 0.37, 1.0}) {
    const double T = range.low + t * (range.high - range.low);
    try {
      const auto state = gas.from_pt(1e5, T);
      FUZZ_REQUIRE(std::isfinite(state.enthalpy) && std::isfinite(state.entropy) && std::isfinite(state.cp));
      FUZZ_REQUIRE(state.density > 0 && std::isfinite(state.density));
      FUZZ_REQUIRE(state.cv > 0);  // the loader refuses cp° <= R
      // Back to T as closely as the arithmetic allows: a file may carry integration constants
      // so large that h and s keep few digits of their change with T (dh = cp dT,
      // ds = cp dT / T), so the tolerance grows with the rounding of h and s.
      constexpr double eps = std::numeric_limits<double>::epsilon();
      const auto by_h = gas.from_ph(1e5, state.enthalpy);
      FUZZ_REQUIRE(std::fabs(by_h.temperature - T) <= 1e-6 * T + 16 * eps * std::fabs(state.enthalpy) / state.cp);
      const auto by_s = gas.from_ps(1e5, state.entropy);
      FUZZ_REQUIRE(std::fabs(by_s.temperature - T) <= 1e-6 * T + 16 * eps * std::fabs(state.entropy) * T / state.cp);
    } catch (const shaftwork::Error&) {
      // A fit whose cp turns negative inside its range is refused as a state: fine.
    }
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size == 0) return 0;
  const std::string_view text(reinterpret_cast<const char*>(data + 1), size - 1);
  SpeciesLibrary library;
  try {
    switch (data[0] % 3) {
      case 0: library = SpeciesLibrary::parse_own_format(text, "fuzz.txt"); break;
      case 1: library = SpeciesLibrary::parse_nasa9(text, "fuzz.inp"); break;
      default: library = SpeciesLibrary::parse_nasa7(text, "fuzz.dat"); break;
    }
  } catch (const shaftwork::Error& e) {
    FUZZ_REQUIRE(std::string_view(e.what()).rfind("fuzz.", 0) == 0);  // messages name the file
    return 0;
  }
  for (const auto& species : library.species()) {
    FUZZ_REQUIRE(species.molar_mass > 0 && std::isfinite(species.molar_mass));
    FUZZ_REQUIRE(library.find(species.name) != nullptr);
    try {
      exercise(NasaPolynomialGas({{&species, 1.0}}, CompositionBasis::mole));
    } catch (const shaftwork::Error&) {
    }
  }
  return 0;
}

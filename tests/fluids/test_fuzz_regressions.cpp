// Inputs found by fuzz/fuzz_species, kept as tests: each once got past the species loader
// and gave a state no ideal gas can have.
#include <string>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

using shaftwork::Error;
using shaftwork::ErrorKind;
using shaftwork::fluids::CompositionBasis;
using shaftwork::fluids::NasaPolynomialGas;
using shaftwork::fluids::NasaSpecies;
using shaftwork::fluids::SpeciesLibrary;

namespace {

std::string construction_error(const NasaSpecies& species) {
  try {
    NasaPolynomialGas gas({{&species, 1.0}}, CompositionBasis::mole);
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_input);
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("a species whose cp° falls to R or below is refused, not turned into states with cv <= 0") {
  // fuzz_species: an O2 record with a doctored upper interval had cp° = -35 J/(kg K) at
  // 6000 K while H° and S° still rose between the grid points; from_pt gave k < 0.
  const std::string text =
      "species X\n"
      "molar_mass 28 g/mol\n"
      "source invented for this test\n"
      // cp°/R = 3.5 - 0.001 T: 3.3 at 200 K, falls to 1 at 2500 K and to 0.5 at 3000 K.
      "interval 200 3000 0 0 3.5 -1e-3 0 0 0 0 0\n"
      "end\n";
  const SpeciesLibrary library = SpeciesLibrary::parse_own_format(text, "x.txt");
  REQUIRE(library.find("X") != nullptr);
  // The first grid point past 2500 K (grid cells are set by the model's kGridRatio).
  CHECK(construction_error(*library.find("X")) ==
        "nasa-polynomial X: cp° is 0.930101 R at 2569.9 K, not above R (cv° would not be positive); "
        "check the species data");
}

TEST_CASE("a species with cp° above R everywhere still loads") {
  const std::string text =
      "species Y\n"
      "molar_mass 28 g/mol\n"
      "source invented for this test\n"
      "interval 200 3000 0 0 3.5 0 0 0 0 0 0\n"
      "end\n";
  const SpeciesLibrary library = SpeciesLibrary::parse_own_format(text, "y.txt");
  const NasaPolynomialGas gas({{library.find("Y"), 1.0}}, CompositionBasis::mole);
  const auto state = gas.from_pt(1e5, 2900.0);
  CHECK(state.cp / (state.cp - state.cv) == Approx(3.5).epsilon(1e-12));  // cp/R
}

TEST_CASE("a species whose coefficients overflow h or s is refused, not turned into infinite states") {
  // fuzz_species: an a1 of 2.393e305 kept cp°/R finite but made h = R (H°/R) infinite, and
  // from_pt returned that infinite enthalpy.
  const std::string text =
      "species Z\n"
      "molar_mass 28 g/mol\n"
      "source invented for this test\n"
      "interval 1000 1100 0 2.393e305 3.5 0 0 0 0 0 0\n"
      "end\n";
  const SpeciesLibrary library = SpeciesLibrary::parse_own_format(text, "z.txt");
  REQUIRE(library.find("Z") != nullptr);
  CHECK(construction_error(*library.find("Z")) ==
        "nasa-polynomial Z: cp°, H° or S° is not a finite number at 1000 K; check the species data");
}

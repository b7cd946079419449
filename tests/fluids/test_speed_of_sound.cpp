// The speed of sound from the models' own states (fluids/speed_of_sound.hpp), against
// a^2 = k R T for ideal gases. Steam against IAPWS-IF97's w is checked through a rated
// steam compressor in tests/python/test_guarantee_steam.py (python3-iapws).
#include <cmath>
#include <memory>
#include <string>

#include <catch2/catch.hpp>

#include "error_of.hpp"
#include "shaftwork/fluids/constant_cp.hpp"
#include "shaftwork/fluids/iapws_if97.hpp"
#include "shaftwork/fluids/incompressible.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"
#include "shaftwork/fluids/speed_of_sound.hpp"

using namespace shaftwork;
using namespace shaftwork::fluids;

TEST_CASE("speed of sound of a constant-cp gas is sqrt(k R T) to 1e-8") {
  // a = sqrt(k R T) for a perfect gas (Cengel & Boles, Thermodynamics, eq. 17-11).
  ConstantCpInputs in;
  in.cp = 1005.0;
  in.k = 1.4;
  const ConstantCpGas air(in);
  const double R = *air.ideal_gas_constant();
  for (double T : {220.0, 293.15, 600.0, 1500.0}) {
    for (double p : {2e3, 101325.0, 5e6}) {
      const double a = speed_of_sound(air, air.from_pt(p, T));
      CHECK(a == Approx(std::sqrt(1.4 * R * T)).epsilon(1e-8));
    }
  }
  // 20 degC: 343.2 m/s, the handbook value for dry air (e.g. Cengel & Boles, Table A-? gives
  // 343 m/s); here only as a sanity check of the unit of R.
  CHECK(speed_of_sound(air, air.from_pt(101325.0, 293.15)) == Approx(343.2).margin(0.3));
}

TEST_CASE("speed of sound of NASA-polynomial air is sqrt(cp/cv R T) at the state's own k, to 1e-8") {
  const SpeciesLibrary& lib = SpeciesLibrary::built_in();
  const NasaPolynomialGas air({{lib.find("N2"), 0.78084}, {lib.find("O2"), 0.209476}, {lib.find("Ar"), 0.009365},
                               {lib.find("CO2"), 0.000319}},
                              CompositionBasis::mole);
  const double R = *air.ideal_gas_constant();
  for (double T : {250.0, 300.0, 500.0, 900.0, 1800.0}) {
    const State st = air.from_pt(3e5, T);
    // Ideal gas with cp(T): a^2 = (cp/cv) R T exactly (the isentrope p v^k with the local k).
    CHECK(speed_of_sound(air, st) == Approx(std::sqrt(st.k() * R * T)).epsilon(1e-8));
  }
}

TEST_CASE("speed of sound is refused where the model has none") {
  const IncompressibleLiquid water(998.2, 4182.0);
  CHECK(std::string(test::error_of([&] { speed_of_sound(water, water.from_pt(2e5, 293.15)); }).what()) ==
        "the incompressible model has no finite speed of sound: its density does not change with pressure");
  const IapwsIf97 steam;
  const State wet = steam.from_p_quality(1e5, 0.9);
  const Error e = test::error_of([&] { speed_of_sound(steam, wet); });
  CHECK(e.kind() == ErrorKind::not_available);
  CHECK(std::string(e.what()) == "the speed of sound of a wet (two-phase) state is not defined by the property model");
}

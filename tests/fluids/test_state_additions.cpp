// The parts of fluids::State that the polytropic path leans on, on every model: the isobaric
// expansivity alpha_v = (1/v)(dv/dT)_p against central differences of the model's own
// densities, the region number, and the saturated states of FluidModel::saturated().
#include <cmath>
#include <memory>
#include <vector>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/constant_cp.hpp"
#include "shaftwork/fluids/iapws_if97.hpp"
#include "shaftwork/fluids/incompressible.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

using namespace shaftwork;
using fluids::FluidModel;
using fluids::State;

namespace {

// (1/v)(dv/dT)_p by a central difference of relative step 1e-5 (truncation about 1e-10 of alpha).
double expansivity_by_difference(const FluidModel& fluid, double p, double T) {
  const double dT = 1e-5 * T;
  const double v_up = 1.0 / fluid.from_pt(p, T + dT).density;
  const double v_down = 1.0 / fluid.from_pt(p, T - dT).density;
  return (v_up - v_down) / (2 * dT) * fluid.from_pt(p, T).density;
}

}  // namespace

TEST_CASE("alpha_v is (1/v)(dv/dT)_p in every IF97 region", "[state][if97]") {
  const fluids::IapwsIf97 water;
  // (p, T, region): regions 1, 2, 3 (liquid-like, vapour-like, supercritical) and 5.
  const double points[][3] = {{5e6, 350, 1},   {50e6, 280, 1},  {1e5, 378.15, 2}, {10e6, 773.15, 2},
                              {25e6, 650, 3},  {20e6, 630, 3},  {21e6, 645, 3},   {30e6, 1500, 5},
                              {1e6, 2000, 5}};
  for (const auto& pt : points) {
    INFO("p = " << pt[0] << " Pa, T = " << pt[1] << " K");
    const State st = water.from_pt(pt[0], pt[1]);
    CHECK(st.region == static_cast<int>(pt[2]));
    CHECK(st.expansivity == Approx(expansivity_by_difference(water, pt[0], pt[1])).epsilon(1e-6));
  }
  // Liquid water is densest near 277 K (about 4 degC): alpha_v changes sign there.
  CHECK(water.from_pt(1e5, 275).expansivity < 0);
  CHECK(water.from_pt(1e5, 280).expansivity > 0);
}

TEST_CASE("wet IF97 states: regions 4 and 43, alpha_v 0, and saturated() = from_p_quality at 0 and 1",
          "[state][if97]") {
  const fluids::IapwsIf97 water;
  for (const double p : {1e3, 1e5, 10e6, 16.5e6, 16.6e6, 22e6}) {
    INFO("p = " << p << " Pa");
    const auto [liquid, vapour] = water.saturated(p);
    const State x0 = water.from_p_quality(p, 0.0);
    const State x1 = water.from_p_quality(p, 1.0);
    CHECK(liquid.enthalpy == x0.enthalpy);
    CHECK(vapour.enthalpy == x1.enthalpy);
    CHECK(liquid.density == x0.density);
    CHECK(vapour.entropy == x1.entropy);
    CHECK(x0.expansivity == 0);
    // Saturated states from regions 1 and 2 up to psat(623.15 K) = 16.529 MPa, region 3 above.
    CHECK(x0.region == (p <= 16.5291642526e6 ? 4 : 43));
  }
  CHECK_THROWS_AS(water.saturated(23e6), Error);
}

TEST_CASE("ideal gases: alpha_v = 1/T; the incompressible liquid: 0; all region 0", "[state]") {
  fluids::ConstantCpInputs in;
  in.cp = 1005;
  in.k = 1.4;
  const fluids::ConstantCpGas constant_cp(in);
  const auto& lib = fluids::SpeciesLibrary::built_in();
  const fluids::NasaPolynomialGas methane({{lib.find("CH4"), 1.0}}, fluids::CompositionBasis::mole);
  const fluids::IncompressibleLiquid oil(870, 1900);
  for (const FluidModel* fluid : std::vector<const FluidModel*>{&constant_cp, &methane}) {
    const State st = fluid->from_pt(3e5, 420);
    CHECK(st.expansivity == Approx(1.0 / 420).epsilon(1e-15));
    CHECK(st.expansivity == Approx(expansivity_by_difference(*fluid, 3e5, 420)).epsilon(1e-8));
    CHECK(st.region == 0);
  }
  CHECK(oil.from_pt(3e5, 320).expansivity == 0);
  CHECK(oil.from_pt(3e5, 320).region == 0);
  // Single-phase models have no saturated states.
  CHECK_THROWS_AS(methane.saturated(1e5), Error);
}

// The Schultz method: exact for an ideal gas, and beside the path integral on a real gas.
#include <cmath>
#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/constant_cp.hpp"
#include "shaftwork/fluids/cubic_eos.hpp"
#include "shaftwork/machines/polytropic.hpp"
#include "shaftwork/machines/schultz.hpp"

using shaftwork::Error;
using namespace shaftwork::fluids;
using shaftwork::machines::polytropic_efficiency;
using shaftwork::machines::schultz_method;
using shaftwork::machines::SchultzResult;

TEST_CASE("ideal gas with constant k: X = 0, Y = 1, f = 1 and the path-integral efficiency") {
  // Air-like: cp 1004.5 J/(kg K), k 1.4 (numbers invented for the test).
  ConstantCpInputs in;
  in.cp = 1004.5;
  in.k = 1.4;
  const ConstantCpGas gas(in);
  const State inlet = gas.from_pt(1e5, 293.15);
  for (const double p2 : {3e5, 0.4e5}) {  // a compression, then an expansion
    const State isentropic = gas.from_ps(p2, inlet.entropy);
    const double dh_s = isentropic.enthalpy - inlet.enthalpy;
    const double eta_s = 0.8;
    const State outlet = gas.from_ph(p2, inlet.enthalpy + (p2 > 1e5 ? dh_s / eta_s : dh_s * eta_s));
    const SchultzResult r = schultz_method(gas, inlet, outlet, isentropic);
    CHECK(r.x_inlet == Approx(0).margin(1e-8));
    CHECK(r.y_inlet == Approx(1).epsilon(1e-8));
    CHECK(r.x_outlet == Approx(0).margin(1e-8));
    CHECK(r.y_outlet == Approx(1).epsilon(1e-8));
    CHECK(r.isentropic_exponent == Approx(1.4).epsilon(1e-12));  // p v^k constant on the isentrope
    CHECK(r.schultz_factor == Approx(1).epsilon(1e-12));
    // polytropic.hpp's exact ideal-gas relation: eta_p from s2 - s1 = R (1/eta_p - 1) ln(p2/p1).
    const double eta_path = polytropic_efficiency(gas, inlet, outlet, eta_s);
    CHECK(r.polytropic_efficiency == Approx(eta_path).epsilon(1e-6));
    CHECK(r.polytropic_head == Approx(std::fabs(p2 > 1e5 ? eta_path * (outlet.enthalpy - inlet.enthalpy)
                                                         : (outlet.enthalpy - inlet.enthalpy) / eta_path))
                                   .epsilon(1e-6));
  }
}

TEST_CASE("real gas: X and Y from the model's volumes match the equation's exact derivatives") {
  const NasaSpecies* ch4 = SpeciesLibrary::built_in().find("CH4");
  const CubicGas gas(CubicKind::peng_robinson, {{ch4, 1.0}}, CompositionBasis::mole);
  const State inlet = gas.from_pt(40e5, 300);
  const State isentropic = gas.from_ps(60e5, inlet.entropy);
  const State outlet = gas.from_ph(60e5, inlet.enthalpy + (isentropic.enthalpy - inlet.enthalpy) / 0.8);
  const SchultzResult r = schultz_method(gas, inlet, outlet, isentropic);
  const CompressibilityFunctions in_exact = gas.compressibility_functions(inlet.pressure, inlet.temperature);
  const CompressibilityFunctions out_exact = gas.compressibility_functions(outlet.pressure, outlet.temperature);
  CHECK(r.x_inlet == Approx(in_exact.x).margin(1e-7));
  CHECK(r.y_inlet == Approx(in_exact.y).epsilon(1e-7));
  CHECK(r.x_outlet == Approx(out_exact.x).margin(1e-7));
  CHECK(r.y_outlet == Approx(out_exact.y).epsilon(1e-7));
  CHECK(r.x_inlet > 0.05);  // methane at 40 bar, 300 K is far from ideal (X = 0 for an ideal gas)
  // Far from the critical point the Schultz and path-integral efficiencies agree within
  // a few tenths of a percent (PTC 10's reason for using f); f stays near 1.
  const double eta_path = polytropic_efficiency(gas, inlet, outlet, 0.8);
  CHECK(r.polytropic_efficiency == Approx(eta_path).epsilon(3e-3));
  CHECK(r.schultz_factor == Approx(1).margin(0.01));
}

TEST_CASE("equal pressures are refused") {
  ConstantCpInputs in;
  in.cp = 1004.5;
  in.k = 1.4;
  const ConstantCpGas gas(in);
  const State st = gas.from_pt(1e5, 300);
  try {
    schultz_method(gas, st, st, st);
    FAIL("accepted");
  } catch (const Error& e) {
    CHECK(std::string(e.what()) == "Schultz method: the inlet and outlet pressures must differ");
  }
}

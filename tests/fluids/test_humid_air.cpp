// Tests of shaftwork/fluids/humid_air.hpp.
//
// Published check values: ASHRAE Handbook—Fundamentals (2017, SI), chapter 1
// "Psychrometrics", Table 2 (moist air at 101.325 kPa) and Table 3 (water at saturation),
// as quoted to the printed digits in the test suite of PsychroLib
// (github.com/psychrometrics/psychrolib, tests/test_psychrolib_si.py), which compares against
// those tables; IAPWS R14-08(2011) for the sublimation line. The table values could not be
// read in the handbook itself here.
#include <catch2/catch.hpp>

#include <functional>
#include <string>
#include <vector>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/humid_air.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

using shaftwork::Error;
using shaftwork::ErrorKind;
using namespace shaftwork::fluids;

namespace {

// Dry air: the NASA Glenn database's "Air" record (NASA/TP-2002-211556; data/fluids.txt),
// mole fractions N2 0.78084, O2 0.209476, Ar 0.009365, CO2 0.000319.
std::vector<Component> dry_air() {
  const SpeciesLibrary& lib = SpeciesLibrary::built_in();
  return {{lib.find("N2"), 0.78084}, {lib.find("O2"), 0.209476}, {lib.find("Ar"), 0.009365},
          {lib.find("CO2"), 0.000319}};
}

// Molar masses of the NASA records (g/mol): N2 28.0134, O2 31.9988, Ar 39.948, CO2 44.0095, H2O 18.01528.
constexpr double kDryAirMolarMass =
    (0.78084 * 28.0134 + 0.209476 * 31.9988 + 0.009365 * 39.948 + 0.000319 * 44.0095) * 1e-3;  // kg/mol
constexpr double kWaterMolarMass = 18.01528e-3;                                                  // kg/mol

std::string error_of(const std::function<void()>& f, ErrorKind kind) {
  try {
    f();
  } catch (const Error& e) {
    CHECK(e.kind() == kind);
    return e.what();
  }
  return "<no error thrown>";
}

}  // namespace

TEST_CASE("saturation pressure over water and ice against the ASHRAE table", "[humid_air]") {
  // ASHRAE Handbook—Fundamentals (2017), ch. 1, Table 3 (over ice below 0 degC), to the
  // printed digits: IF97 and R14-08 reproduce them within half a unit of the last digit.
  struct Row {
    double t_celsius;
    double p_ws;    // Pa
    double margin;  // Pa: half a unit of the last printed digit
  };
  const Row rows[] = {{-20, 103.24, 0.005},  {-5, 401.74, 0.005},       {5, 872.6, 0.05},
                      {25, 3169.7, 0.05},    {50, 12351.3, 0.05},       {100, 101418.0, 0.05},
                      {150, 476101.4, 0.05}};
  for (const Row& r : rows) {
    INFO(r.t_celsius << " degC");
    CHECK(water_saturation_pressure(r.t_celsius + 273.15) == Approx(r.p_ws).margin(r.margin));
  }
}

TEST_CASE("the sublimation line of IAPWS R14-08 and its joint with IF97", "[humid_air]") {
  // IAPWS R14-08(2011), the check value for the sublimation pressure: 230 K ->
  // 8.947 352 740 189e-6 MPa (from memory; python3-iapws 1.5 prints the same in its
  // _Sublimation_Pressure example).
  CHECK(water_saturation_pressure(230.0) == Approx(8.947352740189e-6 * 1e6).epsilon(1e-11));
  // The triple point: 273.16 K, 611.657 Pa (IAPWS R14-08 and IF97 both).
  CHECK(water_saturation_pressure(273.16) == Approx(611.657).epsilon(1e-6));
  CHECK(water_saturation_pressure(273.16 - 1e-9) == Approx(611.657).epsilon(1e-9));
  // Rising through the joint.
  CHECK(water_saturation_pressure(273.16 - 1e-6) < water_saturation_pressure(273.16 + 1e-6));
  CHECK(water_saturation_pressure(50.0) > 0);
  CHECK(water_saturation_pressure(647.096) == Approx(22.064e6).epsilon(1e-6));  // IF97's critical point
}

TEST_CASE("saturation humidity ratio at 101.325 kPa: the ASHRAE table less the enhancement factor",
          "[humid_air]") {
  // ASHRAE Handbook—Fundamentals (2017), ch. 1, Table 2, W_s at 101.325 kPa. The handbook's
  // values hold the enhancement factor f (Hyland & Wexler 1983; about 1.004-1.006 here),
  // which shaftwork leaves out: ours must come out below the table by f (p - p_ws) /
  // (p - f p_ws) - 1, 0.3-0.7 % up to 50 degC and about 1 % at 85 degC, where p_ws is 57 %
  // of p and f enters twice.
  const HumidAir air(dry_air());
  struct Row {
    double t_celsius;
    double w_s;             // kg/kg, ASHRAE Table 2
    double low, high;       // bounds on w_s / ours - 1
  };
  const Row rows[] = {{-20, 0.0006373, 0.003, 0.007}, {5, 0.005425, 0.003, 0.007}, {25, 0.020173, 0.003, 0.007},
                      {50, 0.086863, 0.003, 0.007},   {85, 0.838105, 0.009, 0.014}};
  for (const Row& r : rows) {
    INFO(r.t_celsius << " degC");
    const MoistAirState s = air.at_relative_humidity(101325.0, r.t_celsius + 273.15, 1.0);
    const double shortfall = r.w_s / s.humidity_ratio - 1;
    CHECK(shortfall > r.low);
    CHECK(shortfall < r.high);
  }
}

TEST_CASE("one moist-air state from either side", "[humid_air]") {
  const HumidAir air(dry_air());
  // The dry air's molar mass against ASHRAE 2017's 28.966 g/mol (ch. 1, eq. 1; its
  // composition adds Ne, He and a 2036 CO2 level): 3 parts in 1e5.
  CHECK(air.dry_gas_molar_mass() == Approx(kDryAirMolarMass).epsilon(1e-12));
  CHECK(air.dry_gas_molar_mass() == Approx(28.966e-3).epsilon(5e-5));
  CHECK(air.water_molar_mass() == Approx(kWaterMolarMass).epsilon(1e-12));

  // 60 % at 20 degC and 101.325 kPa.
  const MoistAirState s = air.at_relative_humidity(101325.0, 293.15, 0.60);
  const double p_ws = water_saturation_pressure(293.15);
  CHECK(p_ws == Approx(2339.2).margin(0.05));  // IAPWS-IF97 ps(293.15 K) = 2339.21 Pa (python3-iapws)
  CHECK(s.saturation_pressure == p_ws);
  CHECK(s.vapour_pressure == Approx(0.6 * p_ws).epsilon(1e-15));
  CHECK(s.water_mole_fraction == Approx(0.6 * p_ws / 101325.0).epsilon(1e-15));
  CHECK(s.relative_humidity == Approx(0.6).epsilon(1e-15));
  // W = (M_w/M_da) y/(1 - y), and the mass fraction of water W/(1+W) = y M_w / M_mix.
  const double y = s.water_mole_fraction;
  CHECK(s.humidity_ratio == Approx(kWaterMolarMass / kDryAirMolarMass * y / (1 - y)).epsilon(1e-12));
  CHECK(s.humidity_ratio / (1 + s.humidity_ratio) ==
        Approx(y * kWaterMolarMass / (y * kWaterMolarMass + (1 - y) * kDryAirMolarMass)).epsilon(1e-12));

  // And back from the humidity ratio.
  const MoistAirState back = air.at_humidity_ratio(101325.0, 293.15, s.humidity_ratio);
  CHECK(back.relative_humidity == Approx(0.6).epsilon(1e-12));
  CHECK(back.water_mole_fraction == Approx(y).epsilon(1e-12));
  REQUIRE(back.dew_point.has_value());
  CHECK(*back.dew_point == Approx(*s.dew_point).epsilon(1e-12));

  // Dry air: no water, no dew point.
  const MoistAirState dry = air.at_relative_humidity(101325.0, 293.15, 0.0);
  CHECK(dry.humidity_ratio == 0.0);
  CHECK_FALSE(dry.dew_point.has_value());
  CHECK(air.at_humidity_ratio(101325.0, 293.15, 0.0).relative_humidity == 0.0);
  // Saturated air given by its humidity ratio is accepted.
  const double w_s = air.at_relative_humidity(101325.0, 303.15, 1.0).humidity_ratio;
  CHECK(air.at_humidity_ratio(101325.0, 303.15, w_s).relative_humidity == Approx(1.0).epsilon(1e-12));
  // Above the boiling point at p, any relative humidity that leaves p_w below p.
  CHECK(air.at_relative_humidity(101325.0, 383.15, 0.5).water_mole_fraction ==
        Approx(0.5 * water_saturation_pressure(383.15) / 101325.0).epsilon(1e-15));
}

TEST_CASE("dew and frost points", "[humid_air]") {
  const HumidAir air(dry_air());
  // PsychroLib's documented example (ASHRAE 2017 equations): 25 degC, 80 % -> dew point 21.3094 degC.
  // Its saturation formula and IF97 agree within 300 ppm in pressure, 0.005 K here.
  const MoistAirState s = air.at_relative_humidity(101325.0, 298.15, 0.80);
  REQUIRE(s.dew_point.has_value());
  CHECK(*s.dew_point - 273.15 == Approx(21.3094).margin(0.005));
  // The definition, both sides of the triple point: p_ws(T_d) = p_w.
  for (double p_w : {1e-3, 1.0, 103.24, 611.0, 611.657, 612.0, 2535.8, 101325.0, 2e7}) {
    INFO(p_w << " Pa");
    const auto t_d = water_dew_point(p_w);
    REQUIRE(t_d.has_value());
    CHECK(water_saturation_pressure(*t_d) == Approx(p_w).epsilon(1e-9));
  }
  // ASHRAE Table 3: 103.24 Pa over ice at -20 degC, so that is its frost point.
  CHECK(*water_dew_point(103.24) - 273.15 == Approx(-20.0).margin(0.001));
  // IAPWS R7-97(2012), Table 35 (verification of the saturation-temperature equation):
  // Ts(0.1 MPa) = 372.755919 K.
  CHECK(*water_dew_point(1e5) == Approx(372.755919).margin(5e-7));  // to the printed digits
  CHECK_FALSE(water_dew_point(0.0).has_value());
  CHECK_FALSE(water_dew_point(22.064e6).has_value());  // no saturation at the critical pressure
}

TEST_CASE("the humid mixture: fractions and gas constant", "[humid_air]") {
  const HumidAir air(dry_air());
  // Saturated at 30 degC, 101.325 kPa: y_w = 4246.69 / 101325 (IF97 ps(303.15 K), python3-iapws).
  const MoistAirState s = air.at_relative_humidity(101325.0, 303.15, 1.0);
  CHECK(s.water_mole_fraction == Approx(4246.688 / 101325.0).epsilon(1e-6));
  const std::vector<Component> c = air.components(s.water_mole_fraction);
  REQUIRE(c.size() == 5);
  double sum = 0;
  for (const Component& x : c) sum += x.fraction;
  CHECK(sum == Approx(1.0).epsilon(1e-15));
  CHECK(c.back().species->name == "H2O");
  CHECK(c.back().fraction == s.water_mole_fraction);
  CHECK(c[0].fraction / c[1].fraction == Approx(0.78084 / 0.209476).epsilon(1e-14));  // N2/O2 kept

  // The mixture's gas constant R_u / ((1 - y) M_da + y M_w): 291.672 J/(kg K) against dry air's
  // 287.051, 1.6 % more, which moves the mass flow of a volume-metered compressor as much.
  const NasaPolynomialGas gas(c, CompositionBasis::mole);
  const double y = s.water_mole_fraction;
  const double R = 8.31446261815324 / ((1 - y) * kDryAirMolarMass + y * kWaterMolarMass);
  CHECK(*gas.ideal_gas_constant() == Approx(R).epsilon(1e-12));
  CHECK(*gas.ideal_gas_constant() == Approx(291.672).epsilon(2e-6));
  const NasaPolynomialGas dry(air.components(0.0), CompositionBasis::mole);
  CHECK(*dry.ideal_gas_constant() == Approx(287.051).epsilon(2e-6));
  CHECK(dry.mole_fractions().size() == 4);  // the zero H2O fraction is dropped
}

TEST_CASE("refusals name the problem", "[humid_air][errors]") {
  const HumidAir air(dry_air());
  const ErrorKind bad = ErrorKind::bad_input;
  const ErrorKind range = ErrorKind::out_of_range;
  CHECK(error_of([&] { air.at_relative_humidity(101325.0, 293.15, 1.05); }, bad) ==
        "humid-air: relative humidity must be between 0 and 100 %, got 105 %");
  CHECK(error_of([&] { air.at_relative_humidity(101325.0, 293.15, -0.1); }, bad) ==
        "humid-air: relative humidity must be between 0 and 100 %, got -10 %");
  // IF97: ps(383.15 K) = 143.376 kPa (python3-iapws); 80 % of it is 114.701 kPa.
  CHECK(error_of([&] { air.at_relative_humidity(101325.0, 383.15, 0.8); }, bad) ==
        "humid-air: at 383.15 K, 80 % relative humidity is a water vapour pressure of 114.701 kPa, not below "
        "the total pressure 101.325 kPa");
  // W = 0.05 at 30 degC: p_w = p W / (M_w/M_da + W) = 7539 Pa, 177.5 % of 4246.69 Pa; W_s = 0.0272078.
  CHECK(error_of([&] { air.at_humidity_ratio(101325.0, 303.15, 0.05); }, bad) ==
        "humid-air: humidity ratio 0.05 kg/kg at 303.15 K and 101.325 kPa is supersaturated: saturation is "
        "0.0272078 kg/kg (relative humidity 177.5 %)");
  CHECK(error_of([&] { air.at_humidity_ratio(101325.0, 303.15, -0.01); }, bad) ==
        "humid-air: humidity ratio must be a finite number of 0 or more kg water per kg dry gas, got -0.01");
  CHECK(error_of([&] { air.at_relative_humidity(101325.0, 700.0, 0.5); }, range) ==
        "humid-air: humidity is defined from 50 K to water's critical temperature 647.096 K, got 700 K");
  CHECK(error_of([&] { air.at_humidity_ratio(0.0, 293.15, 0.01); }, bad) ==
        "humid-air: pressure must be finite and above 0 Pa, got 0 Pa");
  CHECK(error_of([] { water_saturation_pressure(40.0); }, range) ==
        "humid-air: the saturation pressure of water is defined from 50 K (over ice) to the critical "
        "temperature 647.096 K, got 40 K");
  CHECK(error_of([] { water_dew_point(-1.0); }, bad) ==
        "humid-air: water vapour pressure must be finite and 0 or more, got -1 Pa");
  CHECK(error_of([] { water_dew_point(1e-45); }, range) ==
        "humid-air: water vapour pressure 1e-45 Pa is below the sublimation pressure at 50 K, the lower end of "
        "IAPWS R14-08");
  CHECK(error_of([&] { air.components(1.0); }, bad) ==
        "humid-air: water mole fraction must be at least 0 and below 1, got 1");

  const SpeciesLibrary& lib = SpeciesLibrary::built_in();
  CHECK(error_of([&] { HumidAir({{lib.find("N2"), 0.97}, {lib.find("H2O"), 0.03}}); }, bad) ==
        "humid-air: the dry gas already holds H2O; give the water as a humidity instead");
  CHECK(error_of([&] { HumidAir({{lib.find("N2"), 0.78}, {lib.find("O2"), 0.21}}); }, bad) ==
        "humid-air: the dry gas's mole fractions sum to 0.99, not 1");
  CHECK(error_of([&] { HumidAir({{lib.find("N2"), 1.5}, {lib.find("O2"), -0.5}}); }, bad) ==
        "humid-air: mole fraction of O2 must be finite and 0 or more, got -0.5");
  CHECK(error_of([&] { HumidAir(std::vector<Component>{}); }, bad) == "humid-air: the dry gas has no species");
}

// Case files into rating inputs: units to SI, the forms of flow, efficiency and
// head, warnings for unknown keys, and the messages users see.
#include <cmath>
#include <string>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/case_runner.hpp"

using namespace shaftwork;
using nlohmann::json;

namespace {

io::CaseInput read(const std::string& text) {
  io::FluidFactory fluids;
  return io::read_case(json::parse(text), 0, fluids);
}

// The SI value of a given input, or NaN when the case does not give it.
double si(const io::CaseInput& c, machines::Input input) {
  const io::GivenValue* g = c.find(input);
  return g ? g->si : std::nan("");
}

using machines::Input;

std::string refusal(const std::string& text) {
  try {
    read(text);
  } catch (const Error& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("values with units arrive in SI, and the unit written is kept") {
  const auto c = read(R"({"id": "A", "machine": "compressor", "fluid": "air",
      "site": {"barometric_pressure": "0.98 bar"},
      "inlet": {"pressure": "0.2 barg", "temperature": "21 degC"},
      "outlet": {"pressure": 410000, "temperature": "392 degF"},
      "mass_flow": "18.72 t/h", "power": "1200 hp", "efficiency": {"polytropic": "84.5 %"}})");
  CHECK(c.id == "A");
  CHECK(si(c, Input::inlet_pressure) == Approx(118000.0).epsilon(1e-14));  // 0.2 bar + 0.98 bar barometer
  CHECK(si(c, Input::inlet_temperature) == Approx(294.15).epsilon(1e-14));
  CHECK(si(c, Input::outlet_pressure) == 410000.0);
  CHECK(si(c, Input::outlet_temperature) == Approx(473.15).epsilon(1e-14));  // 392 degF = 200 degC
  CHECK(si(c, Input::mass_flow) == Approx(18720.0 / 3600).epsilon(1e-14));
  CHECK(si(c, Input::power) == Approx(1200 * 745.7).epsilon(1e-14));  // hp = 745.7 W (the contract)
  CHECK(si(c, Input::efficiency_polytropic) == Approx(0.845).epsilon(1e-14));
  CHECK_FALSE(c.find(Input::efficiency_isentropic));
  // What the user wrote is kept, and whether it is read against the barometer.
  CHECK(c.find(Input::inlet_pressure)->written == "0.2 barg");
  CHECK(c.find(Input::inlet_pressure)->unit == "barg");
  CHECK(c.find(Input::inlet_pressure)->on_barometer);
  CHECK(c.find(Input::outlet_pressure)->written == "410000 Pa");  // a plain number is SI
  CHECK(c.find(Input::outlet_pressure)->unit.empty());
  CHECK_FALSE(c.find(Input::outlet_pressure)->on_barometer);
  CHECK(c.warnings.empty());
  // Messages echo values in the unit the user wrote for that dimension.
  const machines::RatingInput r = io::to_rating_input(c);
  CHECK(r.echo(machines::Quantity::inlet_pressure, 118000.0) == "0.2 barg");
  CHECK(r.echo(machines::Quantity::outlet_pressure, 410000.0) == "3.12 barg");
  CHECK(r.echo(machines::Quantity::outlet_temperature, 473.15) == "392 degF");
  CHECK(*r.efficiency_polytropic == Approx(0.845).epsilon(1e-14));
}

TEST_CASE("a gauge pressure without a barometer gets the standard atmosphere and a warning") {
  const auto c = read(R"({"machine": "pump", "fluid": "water", "inlet": {"pressure": "1 barg", "temperature": "20 degC"},
      "outlet": {"pressure": "5 barg"}, "mass_flow": 10, "efficiency": 0.7})");
  CHECK(si(c, Input::inlet_pressure) == Approx(201325.0).epsilon(1e-14));
  REQUIRE(c.warnings.size() == 1);
  CHECK(c.warnings[0] == "a gauge pressure was given without site.barometric_pressure: 101.325 kPa assumed");
  CHECK(c.id == "case 1");
}

TEST_CASE("flows, heads and bare efficiencies take their forms") {
  SECTION("standard volume flow becomes a molar flow") {
    const auto c = read(R"({"machine": "compressor", "fluid": "air", "standard_volume_flow": "3600 Nm3/h"})");
    // 1 Nm3 = 101325 / (8.31446261815324 * 273.15) mol = 44.615 mol (DIN 1343 normal state).
    CHECK(si(c, Input::standard_volume_flow) == Approx(101325.0 / (8.31446261815324 * 273.15)).epsilon(1e-9));
  }
  SECTION("actual volume flow") {
    const auto c = read(R"({"machine": "pump", "fluid": "water", "volume_flow": "100 gpm"})");
    CHECK(si(c, Input::volume_flow) == Approx(100 * 3.785411784e-3 / 60).epsilon(1e-14));  // US gallon, exact
  }
  SECTION("head as a height is g H") {
    const auto c = read(R"({"machine": "pump", "fluid": "water", "head": "100 ft"})");
    CHECK(si(c, Input::head) == Approx(30.48 * 9.80665).epsilon(1e-14));
  }
  SECTION("head as energy per mass") {
    const auto c = read(R"({"machine": "pump", "fluid": "water", "head": "1.2 kJ/kg"})");
    CHECK(si(c, Input::head) == Approx(1200.0).epsilon(1e-14));
  }
  SECTION("a bare efficiency is isentropic") {
    const auto c = read(R"({"machine": "turbine", "fluid": "steam", "efficiency": 0.8})");
    CHECK(si(c, Input::efficiency_isentropic) == 0.8);
    CHECK_FALSE(c.find(Input::efficiency_polytropic));
  }
}

TEST_CASE("unknown keys are warned about, never silently dropped") {
  const auto c = read(R"({"machine": "compressor", "fluid": "air", "outlett": {}, "inlet": {"presure": "1 bar"},
      "efficiency": {"isentropic": 0.8, "mechanical": 0.9}})");
  // In the order of the keys (JSON objects are read in alphabetical order).
  REQUIRE(c.warnings.size() == 3);
  CHECK(c.warnings[0] == "unknown key \"efficiency.mechanical\" ignored");
  CHECK(c.warnings[1] == "unknown key \"inlet.presure\" ignored");
  CHECK(c.warnings[2] == "unknown key \"outlett\" ignored");
}

TEST_CASE("bad values are refused naming the key") {
  CHECK(refusal(R"({"machine": "compressor", "fluid": "air", "inlet": {"pressure": "3 degC"}})") ==
        "inlet.pressure: \"3 degC\": a temperature unit where a pressure belongs");
  CHECK(refusal(R"({"machine": "compressor", "fluid": "air", "inlet": {"pressure": true}})") ==
        "inlet.pressure: expected a number or a string such as \"<number> <unit>\", got boolean");
  CHECK(refusal(R"({"machine": "mixer", "fluid": "air"})") ==
        "machine: unknown machine \"mixer\"; give \"compressor\" (or \"fan\", \"blower\"), \"turbine\" (or "
        "\"expander\") or \"pump\"");
  CHECK(refusal(R"({"machine": "compressor", "fluid": "air", "efficiency": "105 %"})") ==
        "efficiency: must be above 0 and at most 1 (or 100 %), got 1.05");
  CHECK(refusal(R"({"machine": "compressor", "fluid": "air", "efficiency": {"isentropic": 0.8, "polytropic": 0.82}})") ==
        "efficiency.isentropic and efficiency.polytropic are both given: they give the same quantity; keep one");
  CHECK(refusal(R"({"machine": "compressor", "fluid": "air", "mass_flow": 1, "volume_flow": 1})") ==
        "mass_flow and volume_flow are both given: they give the same quantity; keep one");
  CHECK(refusal(R"({"machine": "compressor", "fluid": "air", "standard_volume_flow": 12})") ==
        "standard_volume_flow: a standard volume flow needs its unit, which fixes the reference conditions: "
        "Nm3/h, Sm3/h, scfm or MMSCFD");
  CHECK(refusal(R"({"machine": "compressor", "fluid": "air", "inlet": {"temperature": "-300 degC"}})") ==
        "inlet.temperature: \"-300 degC\" is below absolute zero");
  CHECK(refusal(R"({"machine": "compressor", "fluid": "air", "mechanical_efficiency": 1.2})") ==
        "mechanical_efficiency: must be above 0 and at most 1 (or 100 %), got 1.2");
  CHECK(refusal(R"({"machine": "compressor", "fluid": "air", "efficiency": "0.8 %"})") ==
        "efficiency: 0.8 % is implausible for an efficiency: write 80 % (or the fraction 0.8 without a unit)");
  CHECK(refusal(R"({"machine": "compressor", "fluid": "air", "site": {"barometric_pressure": "1 barg"}})") ==
        "site.barometric_pressure: the barometer is an absolute pressure: give it in kPa, mbar, bar or inHg, not "
        "barg");
  CHECK(refusal(R"({"id": {"tag": 3}, "machine": "compressor", "fluid": "air"})") ==
        "id: must be a string or a number, got object");
  CHECK(refusal(R"({"machine": "pump", "fluid": "water", "head": "-100 m"})") ==
        "head: \"-100 m\": a length cannot be negative");
  CHECK(refusal(R"({"machine": "compressor"})") ==
        "fluid: missing; give a fluid name (shaftwork fluids lists them) or object");
  CHECK(refusal(R"({"machine": "compressor", "fluid": "unobtainium"})").rfind(
            "fluid: unknown fluid \"unobtainium\"; named fluids are: air, nitrogen,", 0) == 0);
  CHECK(refusal(R"({"machine": "compressor", "fluid": {"model": "nasa-polynomial", "species": "Xx9"}})") ==
        "fluid.species: unknown species \"Xx9\" (shaftwork fluids lists the species; a NASA 9-coefficient "
        "file may add more with --species-file)");
  CHECK(refusal(R"({"machine": "compressor", "fluid": {"model": "constant-cp", "cp": 1005}})") ==
        "fluid: constant-cp fluid: give exactly two of cp, cv, k, R, molar_mass (got 1)");
  CHECK(refusal(R"({"machine": "compressor", "fluid": {"model": "redlich-kwong"}})") ==
        "fluid.model: unknown model \"redlich-kwong\"; models are constant-cp, nasa-polynomial, peng-robinson, "
        "soave-redlich-kwong, iapws-if97, incompressible, humid-air");
}

TEST_CASE("mixture fractions off by less than 1 % are scaled with a warning") {
  const auto c = read(R"({"machine": "compressor", "fluid": {"model": "nasa-polynomial",
      "mixture": {"CH4": 0.95, "C2H6": 0.045}}})");
  REQUIRE(c.warnings.size() == 1);
  CHECK(c.warnings[0] == "fluid.mixture: the fractions add up to 0.995; scaled to sum to 1");
}

TEST_CASE("case documents: one case, a list, or not a case file") {
  const json one = json::parse(R"({"machine": "pump"})");
  CHECK(io::case_objects(one, "f.json").size() == 1);
  const json list = json::parse(R"({"cases": [{"machine": "pump"}, {"machine": "turbine"}]})");
  CHECK(io::case_objects(list, "f.json").size() == 2);
  auto message = [](const std::string& text) {
    try {
      io::case_objects(json::parse(text), "f.json");
    } catch (const Error& e) {
      return std::string(e.what());
    }
    return std::string();
  };
  CHECK(message("[1, 2]") == "f.json: not a case file: expected a JSON object, got array");
  CHECK(message(R"({"cases": {}})") == "f.json: \"cases\" must be an array");
  CHECK(message(R"({"cases": []})") == "f.json: \"cases\" is empty");
  CHECK(message(R"({"id": "x"})") == "f.json: not a case file: expected \"cases\" or a case with \"machine\"");
}

TEST_CASE("strict JSON parsing names the place and refuses duplicate keys") {
  auto message = [](const std::string& text) {
    try {
      io::parse_json_strict(text, "c.json");
    } catch (const Error& e) {
      return std::string(e.what());
    }
    return std::string();
  };
  CHECK(message("{\"a\": 1,\n \"b\": }").rfind("c.json: not valid JSON: parse error at line 2, column 7: syntax error while parsing value", 0) == 0);
  CHECK(message(R"({"inlet": {"pressure": 1, "pressure": 2}})") ==
        "c.json: the key \"pressure\" appears twice in one object; keep one");
  CHECK(message(R"({"a": {"x": 1}, "b": {"x": 2}})").empty());  // the same key in two objects is fine
}

TEST_CASE("a case that fails leaves the others rated") {
  io::FluidFactory fluids;
  const json doc = json::parse(R"({"cases": [
      {"id": "ok", "machine": "compressor", "fluid": "air", "inlet": {"pressure": "1 bar", "temperature": "300 K"},
       "outlet": {"pressure": "2 bar"}, "efficiency": 0.8, "mass_flow": 1},
      {"id": "bad", "machine": "compressor", "fluid": "air", "inlet": {"pressure": "1 bar", "temperature": "300 K"},
       "outlet": {"pressure": "0.5 bar"}, "efficiency": 0.8, "mass_flow": 1},
      {"id": "ok too", "machine": "compressor", "fluid": "air", "inlet": {"pressure": "1 bar", "temperature": "300 K"},
       "outlet": {"pressure": "3 bar"}, "efficiency": 0.8, "mass_flow": 1}]})");
  const auto outcomes = io::rate_document(doc, "doc", fluids);
  REQUIRE(outcomes.size() == 3);
  CHECK(outcomes[0].ok());
  CHECK_FALSE(outcomes[1].ok());
  CHECK(outcomes[1].error == "a compressor's outlet pressure (0.5 bar) must be above its inlet pressure (1 bar)");
  CHECK(outcomes[2].ok());
  const auto j = io::result_json(outcomes[1]);
  CHECK(j["status"] == "error");
  CHECK(j["id"] == "bad");
}

TEST_CASE("standard volume flows use the gas's own molar mass at the unit's reference state") {
  io::FluidFactory fluids;
  const json doc = json::parse(R"({"cases": [
      {"machine": "compressor", "fluid": "methane", "inlet": {"pressure": "40 bar", "temperature": "15 degC"},
       "outlet": {"pressure": "55 bar"}, "efficiency": 0.8, "standard_volume_flow": "24 MMSCFD"},
      {"machine": "compressor", "fluid": "methane", "inlet": {"pressure": "40 bar", "temperature": "15 degC"},
       "outlet": {"pressure": "55 bar"}, "efficiency": 0.8, "standard_volume_flow": "1000 scfm"},
      {"machine": "compressor", "fluid": "methane", "inlet": {"pressure": "40 bar", "temperature": "15 degC"},
       "outlet": {"pressure": "55 bar"}, "efficiency": 0.8, "standard_volume_flow": "3600 Sm3/h"}]})");
  const auto outcomes = io::rate_document(doc, "doc", fluids);
  REQUIRE(outcomes.size() == 3);
  for (const auto& o : outcomes) REQUIRE(o.ok());
  const double R = 8.31446261815324;     // J/(mol K), CODATA 2018
  const double M = 16.04246e-3;          // kg/mol, CH4 (NASA Glenn database record)
  const double ft3 = 0.3048 * 0.3048 * 0.3048;  // m3, exact (NIST SP 811)
  const double psi = 0.45359237 * 9.80665 / (0.0254 * 0.0254);  // Pa, exact lbf/in2
  // scf: 60 degF and 14.696 psia (common US gas practice), not 14.73 psia.
  const double T_scf = (60.0 - 32.0) / 1.8 + 273.15;  // K
  const double mol_per_scf = 14.696 * psi * ft3 / (R * T_scf);
  CHECK(*outcomes[0].rating->mass_flow == Approx(24e6 * mol_per_scf * M / 86400).epsilon(1e-9));
  CHECK(*outcomes[1].rating->mass_flow == Approx(1000 * mol_per_scf * M / 60).epsilon(1e-9));
  // Sm3: 15 degC, 101.325 kPa (ISO 13443).
  CHECK(*outcomes[2].rating->mass_flow == Approx(101325.0 / (R * 288.15) * M).epsilon(1e-9));
}

TEST_CASE("humid air takes its water content at the inlet state and warns below the dew point") {
  io::FluidFactory fluids;
  const json doc = json::parse(R"({"cases": [
      {"id": "wet", "machine": "compressor", "fluid": {"model": "humid-air", "relative_humidity": "70 %"},
       "site": {"barometric_pressure": "1002 mbar"},
       "inlet": {"pressure": "-25 mbarg", "temperature": "30 degC"}, "outlet": {"pressure": "2.2 barg"},
       "efficiency": 0.8},
      {"id": "cold exhaust", "machine": "turbine", "fluid": {"model": "humid-air", "humidity_ratio": 0.012},
       "inlet": {"pressure": "3 bar", "temperature": "40 degC"}, "outlet": {"pressure": "1 bar"}, "efficiency": 0.8},
      {"id": "no inlet", "machine": "compressor", "fluid": {"model": "humid-air", "relative_humidity": "50 %"},
       "outlet": {"pressure": "2 bar"}}]})");
  const auto outcomes = io::rate_document(doc, "doc", fluids);
  REQUIRE(outcomes[0].ok());
  // W = (M_w / M_da) p_w / (p - p_w), p_w = phi p_ws(30 degC): p_ws = 4246.69 Pa (python3-iapws,
  // IAPWS97(T=303.15, x=0).P), p = 100.2 - 2.5 kPa, M_da = 28.96512 g/mol (the NASA air record's
  // composition), M_w = 18.01528 g/mol: W = 0.019518 kg/kg. No enhancement factor (docs/units.md).
  CHECK(*outcomes[0].rating->humidity_ratio == Approx(0.019518).epsilon(2e-4));
  // Expanded from 3 bar, 40 degC to 1 bar at 0.8, the exhaust is near -40 degC, below the dew
  // point of 0.012 kg/kg at 1 bar (about 16 degC): the model keeps the water as vapour, and says so.
  REQUIRE(outcomes[1].ok());
  bool warned = false;
  for (const auto& w : outcomes[1].warnings) warned = warned || w.find("lies below the dew point") != std::string::npos;
  CHECK(warned);
  CHECK_FALSE(outcomes[2].ok());
  CHECK(outcomes[2].error ==
        "fluid: a relative humidity is taken at the inlet state: give inlet.pressure and inlet.temperature, or a "
        "\"humidity_ratio\" instead");
}

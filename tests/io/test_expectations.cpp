// A case's `expect` block: values and tolerances in units, to SI, and the messages of a
// wrong entry. Unit definitions: NIST SP 811 (2008), Appendix B (degF difference = 5/9 K,
// bar = 1e5 Pa), as in tests/units/test_quantity.cpp.
#include <string>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/io/expectations.hpp"

using namespace shaftwork;
using nlohmann::json;

namespace {

constexpr double kBarometer = 99000.0;  // Pa, the case's site barometer

std::vector<io::Expectation> read(const std::string& expect_block) {
  return io::read_expectations(json::parse(R"({"id": "E", "expect": )" + expect_block + "}"), kBarometer);
}

const io::Expectation& only(const std::vector<io::Expectation>& e) {
  REQUIRE(e.size() == 1);
  return e.front();
}

// "W, kW, ...": the units a message lists for a dimension (the table grows; the form stays).
std::string units_listed(units::Dimension d) {
  std::string out;
  for (const units::UnitInfo* u : units::units_of(d)) out += (out.empty() ? "" : ", ") + std::string(u->symbol);
  return out;
}

std::string refusal(const std::string& expect_block) {
  try {
    read(expect_block);
  } catch (const Error& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("expected values arrive in SI from any unit of the key's dimension") {
  CHECK(only(read(R"({"outlet.temperature": "165.8 degC"})")).value == Approx(438.95).epsilon(1e-15));
  CHECK(only(read(R"({"outlet.temperature": 438.95})")).value == 438.95);  // a plain number is SI
  CHECK(only(read(R"({"efficiency.isentropic": "81.2 %"})")).value == Approx(0.812).epsilon(1e-15));
  CHECK(only(read(R"({"efficiency.isentropic": 0.812})")).value == 0.812);
  CHECK(only(read(R"({"power": "3.72 MW"})")).value == 3.72e6);
  CHECK(only(read(R"({"head_height": "310 ft"})")).value == Approx(94.488).epsilon(1e-15));  // ft = 0.3048 m
  // A gauge pressure is read against the case's barometer: 2 bar + 99 kPa.
  CHECK(only(read(R"({"outlet.pressure": "2 barg"})")).value == 299000.0);
  // Rounded to 15 significant digits, as results are written: 150.06 degC is 423.21 K.
  CHECK(only(read(R"({"outlet.temperature": "150.06 degC"})")).value == 423.21);
  // The key's row of result_keys() and, without a tolerance, none of its own.
  const io::Expectation e = only(read(R"({"mass_flow": "36 t/h"})"));
  CHECK(e.key->key == "mass_flow");
  CHECK(e.value == 10.0);
  CHECK_FALSE(e.tolerance);
}

TEST_CASE("a case without an expect block expects nothing") {
  CHECK(io::read_expectations(json::parse(R"({"id": "E", "machine": "pump"})"), kBarometer).empty());
  CHECK(read("{}").empty());
}

TEST_CASE("tolerances: a percentage is relative, a unit absolute, as a difference") {
  using Kind = io::Tolerance::Kind;
  const auto tolerance = [](const std::string& key, const std::string& t) {
    return *only(read(R"({")" + key + R"(": {"value": 1, "tolerance": )" + t + "}}")).tolerance;
  };
  const io::Tolerance relative = tolerance("power", R"("0.1 %")");
  CHECK(relative.kind == Kind::relative);
  CHECK(relative.amount == Approx(0.001).epsilon(1e-15));
  CHECK(relative.written == "0.1 %");
  CHECK(tolerance("power", R"("0.1%")").amount == Approx(0.001).epsilon(1e-15));

  const io::Tolerance kelvin = tolerance("outlet.temperature", R"("0.05 K")");
  CHECK(kelvin.kind == Kind::absolute);
  CHECK(kelvin.amount == 0.05);
  // A temperature tolerance is a difference: 0.09 degF is 0.05 K, not 0.09 degF above 0 degF.
  CHECK(tolerance("outlet.temperature", R"("0.09 degF")").amount == Approx(0.05).epsilon(1e-14));
  CHECK(tolerance("outlet.temperature", R"("0.05 degC")").amount == Approx(0.05).epsilon(1e-14));
  // A gauge unit's tolerance does not add the barometer.
  CHECK(tolerance("outlet.pressure", R"("0.1 barg")").amount == Approx(1e4).epsilon(1e-15));
  CHECK(tolerance("power", R"("5 kW")").amount == 5000.0);
  // A JSON number is SI; a fraction's absolute tolerance is a bare number.
  CHECK(tolerance("power", "250").amount == 250.0);
  CHECK(tolerance("power", "250").written == "250 W");
  const io::Tolerance points = tolerance("efficiency.isentropic", R"("0.002")");
  CHECK(points.kind == Kind::absolute);
  CHECK(points.amount == 0.002);
  CHECK(tolerance("outlet.temperature", R"("0 K")").amount == 0.0);  // exact
}

TEST_CASE("a tolerance allows what lies within it, and equal values always") {
  const io::Tolerance relative = io::relative_tolerance(1e-3);
  CHECK(relative.allows(1000.9, 1000.0));
  CHECK_FALSE(relative.allows(1001.1, 1000.0));
  CHECK(relative.allows(-1000.9, -1000.0));  // of the magnitude
  CHECK(relative.allows(0.0, 0.0));
  CHECK_FALSE(relative.allows(1e-300, 0.0));  // nothing is within a fraction of zero
  CHECK(relative.describe() == "0.001 relative");
  const io::Tolerance absolute{io::Tolerance::Kind::absolute, 0.05, "0.05 K"};
  CHECK(absolute.allows(423.19, 423.15));
  CHECK_FALSE(absolute.allows(423.21, 423.15));
  CHECK(absolute.describe() == "0.05 K");
  const io::Tolerance exact = io::relative_tolerance(0);
  CHECK(exact.allows(0.8, 0.8));
  CHECK_FALSE(exact.allows(0.8000000000000002, 0.8));
}

TEST_CASE("a wrong expect entry is refused, naming the key and the problem") {
  CHECK(refusal(R"({"efficiency.isentropc": 0.8})") ==
        "expect: \"efficiency.isentropc\" is no result key; did you mean efficiency.isentropic?");
  // A case key that is no result key (the shaft speed is one since it is echoed in results).
  CHECK(refusal(R"({"impeller.tip_diameter": "0.4 m"})") ==
        "expect: \"impeller.tip_diameter\" is no result key; the keys are: " + io::result_key_list());
  CHECK(refusal(R"({"outlet.temperature": "4.1 bar"})") ==
        "expect.outlet.temperature: \"4.1 bar\": a pressure unit where a temperature belongs");
  CHECK(refusal(R"({"outlet.temperature": {"value": "150 degC", "tolerance": "0.1 bar"}})") ==
        "expect.outlet.temperature: tolerance: \"0.1 bar\": a pressure unit where a temperature belongs");
  CHECK(refusal(R"({"outlet.temperature": {"value": "150 degC", "tolerance": "-0.05 K"}})") ==
        "expect.outlet.temperature: tolerance: \"-0.05 K\": a tolerance cannot be negative");
  CHECK(refusal(R"({"power": {"value": "1 MW", "tolerance": "-1 %"}})") ==
        "expect.power: tolerance: \"-1 %\": a tolerance cannot be negative");
  CHECK(refusal(R"({"power": {"value": "1 MW", "tolerance": -5}})") ==
        "expect.power: tolerance: \"-5 W\": a tolerance cannot be negative");
  const std::string power_units = units_listed(units::Dimension::power);
  CHECK(power_units.starts_with("W, kW, MW"));
  CHECK(power_units.find("hp") != std::string::npos);
  CHECK(refusal(R"({"power": {"value": "1 MW", "tolerance": "5"}})") ==
        "expect.power: tolerance: \"5\": give a unit of power (" + power_units + ") or a percentage");
  CHECK(refusal(R"({"power": {"value": "1 MW", "tolerance": "5 kWh"}})") ==
        "expect.power: tolerance: \"5 kWh\": unknown unit \"kWh\"; give a percentage or a power unit (" +
            power_units + ")");
  CHECK(refusal(R"({"power": {"value": "1 MW", "tolerance": true}})") ==
        "expect.power: tolerance: expected a string such as \"0.1 %\" or \"0.05 K\", got boolean");
  CHECK(refusal(R"({"power": {"tolerance": "1 %"}})") == "expect.power: \"value\" is missing");
  CHECK(refusal(R"({"power": {"value": "1 MW", "tol": "1 %"}})") ==
        "expect.power: unknown key \"tol\"; give \"value\" and, if you like, \"tolerance\"");
  CHECK(refusal(R"([0.8])") == "expect: expected an object of result keys and values, got array");
  CHECK(refusal(R"({"power_balance.difference_percent": "0.5 %"})") ==
        "expect.power_balance.difference_percent: \"0.5 %\": this result is in percent already; write the plain "
        "number");
}

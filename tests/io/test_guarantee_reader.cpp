// Guarantees in case files (io/guarantee_reader.hpp): reading to SI, the messages users
// see, a case's own guarantee and a file's, and their JSON, table and CSV.
#include <algorithm>
#include <sstream>
#include <string>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/guarantee_reader.hpp"

using namespace shaftwork;
using nlohmann::json;

namespace {

std::string refusal(const std::string& guarantee, machines::MachineKind machine = machines::MachineKind::compressor) {
  io::FluidFactory fluids;
  std::vector<std::string> warnings;
  try {
    io::read_guarantee(json::parse(guarantee), machine, fluids, 101325.0, warnings);
  } catch (const Error& e) {
    return e.what();
  }
  return "(accepted)";
}

// A compressor test point of air at 150 rev/s, as a case object.
json air_case(const std::string& id, double outlet_bar, double mass_flow) {
  return json{{"id", id},
              {"machine", "compressor"},
              {"fluid", {{"model", "constant-cp"}, {"cp", 1005.0}, {"k", 1.4}}},
              {"inlet", {{"pressure", "1 bar"}, {"temperature", "20 degC"}}},
              {"outlet", {{"pressure", std::to_string(outlet_bar) + " bar"}}},
              {"efficiency", {{"polytropic", 0.8}}},
              {"mass_flow", std::to_string(mass_flow) + " kg/s"},
              {"speed", "9000 rpm"}};
}

}  // namespace

TEST_CASE("a guarantee is read to SI") {
  io::FluidFactory fluids;
  std::vector<std::string> warnings;
  const machines::Guarantee g = io::read_guarantee(
      json::parse(R"({"speed": "11950 rpm", "inlet": {"pressure": "-1.8 kPag", "temperature": "24 degC"},
                      "site": {"barometric_pressure": "99.1 kPa"}, "standard_volume_flow": "4200 Nm3/h",
                      "outlet": {"pressure": "2.10 barg"}, "head": {"polytropic": "120 kJ/kg"},
                      "efficiency": {"polytropic": "80 %"}, "power": "232 kW",
                      "tolerances": {"outlet.pressure": {"min": "-1 %"}, "power": {"max": "+4 %"}}})"),
      machines::MachineKind::compressor, fluids, 101325.0, warnings);
  CHECK(*g.speed == Approx(11950.0 / 60).epsilon(1e-15));
  CHECK(*g.inlet_pressure == Approx(99100.0 - 1800.0).epsilon(1e-15));  // against the guarantee's own barometer
  CHECK(*g.inlet_temperature == Approx(297.15).epsilon(1e-15));
  CHECK(*g.value(machines::Checked::outlet_pressure) == Approx(99100.0 + 210000.0).epsilon(1e-15));
  CHECK(*g.value(machines::Checked::head_polytropic) == 120e3);
  CHECK(*g.value(machines::Checked::efficiency_polytropic) == Approx(0.8).epsilon(1e-15));
  CHECK(*g.value(machines::Checked::power) == 232e3);
  CHECK(g.tolerance[0] == machines::Tolerance{-1.0, std::nullopt});
  CHECK(g.tolerance[static_cast<std::size_t>(machines::Checked::power)] == machines::Tolerance{std::nullopt, 4.0});
  CHECK(warnings.empty());
  // A pump's head is a height and its efficiency a bare number; tolerances by grade.
  const machines::Guarantee p = io::read_guarantee(
      json::parse(R"({"volume_flow": "420 m3/h", "head": "41 m", "efficiency": "80 %", "tolerances": {"grade": "2B"}})"),
      machines::MachineKind::pump, fluids, 101325.0, warnings);
  CHECK(*p.value(machines::Checked::head_height) == 41.0);
  CHECK(*p.value(machines::Checked::pump_efficiency) == Approx(0.8).epsilon(1e-15));
  CHECK(*p.grade == "2B");
}

TEST_CASE("guarantee refusals name the key and the problem") {
  CHECK(refusal(R"({"speeed": "3000 rpm"})") ==
        "guarantee.speeed: not a key of a guarantee; the keys are speed, inlet, fluid, mass_flow, volume_flow, "
        "standard_volume_flow, outlet, head, efficiency, power, tolerances, site, note");
  CHECK(refusal(R"({"tolerances": {"grade": "2C"}})", machines::MachineKind::pump) ==
        "guarantee.tolerances.grade: \"2C\" is no acceptance grade of ISO 9906:2012; the grades are 1U, 1E, 1B, 2B, "
        "2U, 3B");
  CHECK(refusal(R"({"tolerances": {"power": {"max": 4}}})") ==
        "guarantee.tolerances.power.max: write the tolerance in percent of the guaranteed value, as \"-2 %\" or \"+4 %\"");
  CHECK(refusal(R"({"tolerances": {"grade": "1B", "power": {"max": "+3 %"}}})", machines::MachineKind::pump) ==
        "guarantee.tolerances: give a grade or percentages, not both: the grade fixes every tolerance of a pump");
  CHECK(refusal(R"({"tolerances": {"outlet.temperature": {"max": "+3 %"}}})") ==
        "guarantee.tolerances.outlet.temperature: not a checked quantity; the keys are outlet.pressure, "
        "head.polytropic, head_height, efficiency.isentropic, efficiency.polytropic, pump_efficiency, power, "
        "mass_flow, volume_flow (and grade)");
  CHECK(refusal(R"({"head": "120 kJ/kg"})") == "guarantee.head: a compressor's head is { \"polytropic\": ... }, in kJ/kg");
  CHECK(refusal(R"({"efficiency": {"isentropic": "80 %"}})", machines::MachineKind::pump) ==
        "guarantee.efficiency: a pump's efficiency is a bare number (hydraulic over shaft power)");
  CHECK(refusal(R"({"power": "-5 kW"})") == "guarantee.power: \"-5 kW\": a power cannot be negative");
  CHECK(refusal(R"({"mass_flow": "2 kg/s", "volume_flow": "1 m3/s"})") ==
        "guarantee: mass_flow, volume_flow and standard_volume_flow give the same flow; keep one");
  CHECK(refusal(R"({"efficiency": {"polytropic": "108 %"}})") ==
        "guarantee.efficiency.polytropic: must be above 0 and at most 1 (or 100 %), got 1.08");
}

TEST_CASE("a case's own guarantee is judged with it, or says why it cannot be") {
  io::FluidFactory fluids;
  json c = air_case("T1", 2.5, 3.0);
  c["guarantee"] = json{{"speed", "9000 rpm"}, {"mass_flow", "3 kg/s"}, {"outlet", {{"pressure", "2.4 bar"}}}};
  const io::CaseOutcome ok = io::rate_case(c, 0, fluids);
  REQUIRE(ok.guarantee);
  CHECK(ok.guarantee->verdict == machines::Verdict::pass);
  CHECK(ok.guarantee->checks.at(0).converted == Approx(2.5e5).epsilon(1e-12));
  const json j = io::result_json(ok);
  CHECK(j["guarantee"]["verdict"] == "pass");
  CHECK(j["guarantee"]["checks"][0]["quantity"] == "outlet.pressure");
  CHECK(j["guarantee"]["checks"][0]["tolerance_from"] == "none given: zero tolerance");
  CHECK(j["guarantee"]["checks"][0]["tolerance_percent"] == json::parse("[0.0, null]"));

  c["guarantee"].erase("mass_flow");
  const io::CaseOutcome no_flow = io::rate_case(c, 0, fluids);
  CHECK(no_flow.ok());
  CHECK_FALSE(no_flow.guarantee);
  CHECK(no_flow.guarantee_error ==
        "guarantee: no flow: a compressor guarantee is read at its guaranteed flow; give mass_flow, volume_flow or "
        "standard_volume_flow");
  CHECK(io::result_json(no_flow)["guarantee"]["status"] == "error");
}

TEST_CASE("a file's guarantee is judged on all its cases, and reported beside the results") {
  io::FluidFactory fluids;
  json doc = {{"cases", {air_case("a", 2.7, 2.6), air_case("b", 2.5, 3.0), air_case("c", 2.2, 3.4)}},
              {"guarantee", {{"speed", "9000 rpm"}, {"mass_flow", "3.2 kg/s"}, {"outlet", {{"pressure", "2.4 bar"}}},
                             {"tolerances", {{"outlet.pressure", {{"min", "-2 %"}}}}}}}};
  const io::RatedFile rated = io::rate_file(doc, "test.json", fluids);
  REQUIRE(rated.test);
  REQUIRE(rated.test->result);
  CHECK(rated.test->points == std::vector<std::string>{"a", "b", "c"});
  const machines::Check& p2 = rated.test->result->checks.at(0);
  CHECK(*p2.converted > 2.2e5);
  CHECK(*p2.converted < 2.5e5);
  std::ostringstream out;
  io::write_results(out, io::ResultFormat::json, rated.cases, {}, {*rated.test});
  const json written = json::parse(out.str());
  CHECK(written["test"]["file"] == "test.json");
  CHECK(written["test"]["guarantee"]["checks"][0]["tolerance_percent"] == json::parse("[-2.0, null]"));
  CHECK(written["results"].size() == 3);
  std::ostringstream table;
  io::write_results(table, io::ResultFormat::table, rated.cases, {}, {*rated.test});
  CHECK(table.str().find("test of test.json (3 test points)\n  guarantee: ") != std::string::npos);

  // A point that cannot be rated leaves the test unjudged, by name.
  doc["cases"][1]["outlet"]["pressure"] = "0.5 bar";
  const io::RatedFile broken = io::rate_file(doc, "test.json", fluids);
  CHECK_FALSE(broken.test->result);
  CHECK(broken.test->error ==
        "guarantee: not judged: the test point \"b\" could not be rated; the verdict rests on every test point of the "
        "file");
  // A pump grade on compressors.
  doc["cases"][1]["outlet"]["pressure"] = "2.5 bar";
  doc["guarantee"]["tolerances"] = json{{"grade", "1B"}};
  CHECK(io::rate_file(doc, "test.json", fluids).test->error ==
        "guarantee: tolerances.grade: the ISO 9906 acceptance grades (1B) are for pumps, and this is a compressor; "
        "give percentages instead, such as \"tolerances\": { \"power\": { \"max\": \"+4 %\" } }");
}

TEST_CASE("csv: the guarantee's columns after the results") {
  io::FluidFactory fluids;
  json c = air_case("T1", 2.5, 3.0);
  c["guarantee"] = json{{"speed", "9000 rpm"}, {"mass_flow", "3 kg/s"}, {"outlet", {{"pressure", "2.6 bar"}}}};
  std::ostringstream out;
  io::write_results(out, io::ResultFormat::csv, {io::rate_case(c, 0, fluids)});
  const std::string text = out.str();
  CHECK(text.find(",guarantee.verdict,guarantee.outlet.pressure.converted [kPa],guarantee.outlet.pressure."
                  "deviation_percent,guarantee.outlet.pressure.verdict,guarantee.error,warnings\r\n") != std::string::npos);
  CHECK(text.find(",fail,250,-3.846153846,fail,,") != std::string::npos);
}

TEST_CASE("a case's stated uncertainties reach its guarantee's checks: inconclusive within U") {
  io::FluidFactory fluids;
  json c = air_case("T1", 2.5, 3.0);
  c["mass_flow"] = json{{"value", "3 kg/s"}, {"uncertainty", "1 %"}};
  const io::CaseOutcome plain = io::rate_case(c, 0, fluids);
  REQUIRE(plain.ok());
  REQUIRE(plain.uncertainty);
  // P = m w with w fixed by the pressures and the efficiency: 1 % of the flow is 1 % of the
  // power (a closed form, not the code's number).
  const double power = *plain.rating->power;
  CHECK(*plain.uncertainty->of("power") == Approx(0.01 * power).epsilon(1e-6));
  const auto judged = [&](double guaranteed_power) {
    json g = c;
    g["guarantee"] = json{{"speed", "9000 rpm"},
                          {"mass_flow", "3 kg/s"},
                          {"power", std::to_string(guaranteed_power) + " W"},
                          {"tolerances", {{"power", {{"max", "0 %"}}}}}};
    return io::rate_case(g, 0, fluids);
  };
  // 0.5 % above a zero tolerance, with U = 1 % of the measured power: inconclusive.
  const io::CaseOutcome near = judged(power / 1.005);
  REQUIRE(near.guarantee);
  const machines::Check& check = near.guarantee->checks.at(0);
  CHECK(check.quantity == machines::Checked::power);
  CHECK(*check.deviation_percent == Approx(0.5).epsilon(1e-6));
  CHECK(*check.uncertainty_percent == Approx(1.005).epsilon(1e-6));  // 1 % of the converted, in % of guaranteed
  CHECK(check.verdict == machines::Verdict::inconclusive);
  CHECK_FALSE(near.guarantee_failed());
  // 1.5 % above: beyond the tolerance by more than U, a fail.
  const io::CaseOutcome far = judged(power / 1.015);
  REQUIRE(far.guarantee);
  CHECK(far.guarantee->checks.at(0).verdict == machines::Verdict::fail);
  CHECK(far.guarantee_failed());
}

TEST_CASE("csv: a pump's guaranteed head brings the flow's columns (the tolerance cross checks both)") {
  // ISO 9906:2012, 4.4.2: the guarantee is met when the H(Q) curve passes through the cross
  // of the flow and head tolerances about (Q_G, H_G), so the judge checks volume_flow beside
  // head_height; a batch's columns are planned from the guarantee before any row is judged.
  io::FluidFactory fluids;
  std::vector<std::string> warnings;
  const machines::Guarantee g = io::read_guarantee(
      json::parse(R"({"speed": "1480 rpm", "volume_flow": "420 m3/h", "head": "41.0 m", "efficiency": "80 %",
                      "power": "56 kW", "tolerances": {"grade": "1B"}})"),
      machines::MachineKind::pump, fluids, 101325.0, warnings);
  const io::GuaranteeColumns columns = io::guarantee_columns(g, machines::MachineKind::pump);
  const auto has = [&](machines::Checked q) {
    return std::find(columns.checks.begin(), columns.checks.end(), q) != columns.checks.end();
  };
  CHECK(has(machines::Checked::volume_flow));
  CHECK(has(machines::Checked::head_height));
  CHECK(has(machines::Checked::pump_efficiency));
  CHECK(has(machines::Checked::power));
  CHECK(columns.checks.size() == 4);
}

TEST_CASE("table: a guarantee's gauge pressures read on its own site barometer, the test's on the test's") {
  // The test reads 2.5 bar(g) on a 100.3 kPa barometer; the guarantee states 2.4 barg on its
  // site's 99.1 kPa: 339.1 kPa absolute, shown as the 240 kPag it was written as, whatever
  // barometer the test had (the deviation is taken on absolute pressures either way).
  io::FluidFactory fluids;
  json a = air_case("a", 2.5, 3.0);
  a["site"] = {{"barometric_pressure", "100.3 kPa"}};
  a["inlet"]["pressure"] = "0 kPag";  // the table's pressures in kPag
  a["outlet"]["pressure"] = "2.5 barg";
  json doc = {{"cases", {a}},
              {"guarantee", {{"speed", "9000 rpm"}, {"mass_flow", "3 kg/s"}, {"outlet", {{"pressure", "2.4 barg"}}},
                             {"site", {{"barometric_pressure", "99.1 kPa"}}}}}};
  const io::RatedFile rated = io::rate_file(doc, "site.json", fluids);
  REQUIRE(rated.test);
  REQUIRE(rated.test->result);
  const machines::Check& p2 = rated.test->result->checks.at(0);
  CHECK(p2.guaranteed == Approx(339100).epsilon(1e-12));
  CHECK(rated.test->result->barometer == 99100);
  std::ostringstream table;
  io::write_results(table, io::ResultFormat::table, rated.cases, {}, {*rated.test});
  // measured 2.5 barg = 250 kPag on the test's barometer; converted (the same point, at equal
  // speed and inlet) 350.3 kPa absolute = 251.2 kPag on the guarantee's.
  CHECK(table.str().find("discharge pressure      250 kPag        251.2 kPag      240 kPag") != std::string::npos);
}

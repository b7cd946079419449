// What `shaftwork check` compares: a result against its expectations and against a
// recorded result, the matching of recorded results to cases, the verdict of a case and
// the lines the report prints. The results here are small hand-made objects, so every
// difference is known exactly; one case is rated through the library end to end.
#include <sstream>
#include <string>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/io/baseline.hpp"
#include "shaftwork/io/case_check.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/result_compare.hpp"

using namespace shaftwork;
using nlohmann::json;

namespace {

// The numbers of a result: these keys set, every other row empty.
io::ResultNumbers numbers(const std::vector<std::pair<std::string, double>>& set) {
  io::ResultNumbers out(io::result_keys().size());
  for (const auto& [key, value] : set) out[io::row_of(*io::find_result_key(key))] = value;
  return out;
}

// A result cut down to a few keys.
io::ResultNumbers result_now() {
  return numbers({{"outlet.temperature", 423.15}, {"outlet.pressure", 300000.0}, {"power", 135000.0},
                  {"efficiency.isentropic", 0.8}, {"efficiency.polytropic", 0.83}});
}

io::RecordedResult recorded_as(const io::ResultNumbers& n) {
  // Built whole: g++ 12 warns falsely (-Wrestrict, GCC bug 105329) on a short literal
  // assigned to a std::string member after inlining.
  return io::RecordedResult{std::string("cases/t.json"), std::string("R"), std::string("ok"), std::string(), n, {}};
}

std::vector<io::Expectation> expect(const std::string& block) {
  return io::read_expectations(json::parse(R"({"expect": )" + block + "}"), 101325.0);
}

std::vector<std::string> lines(const std::vector<io::MovedKey>& moved) {
  std::vector<std::string> out;
  for (const auto& m : moved) out.push_back(io::describe(m));
  return out;
}

std::string report(const io::CaseCheck& c) {
  std::ostringstream out;
  io::write_check_lines(out, c);
  return out.str();
}

std::string refusal(const std::string& text) {
  try {
    io::Baseline(text, "base.json");
  } catch (const Error& e) {
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("the numbers of a rating are those rate --format json writes") {
  const json c = json::parse(R"({"id": "N", "machine": "compressor", "fluid": "air",
      "inlet": {"pressure": "1 bar", "temperature": "20 degC"}, "outlet": {"pressure": "3 bar"},
      "efficiency": 0.8, "mass_flow": "1 kg/s"})");
  io::FluidFactory fluids;
  const io::CaseOutcome o = io::rate_document(c, "n.json", fluids).front();
  REQUIRE(o.ok());
  const io::ResultNumbers n = io::result_numbers(*o.rating);
  // Through the JSON text and back, as a baseline is read.
  const io::Baseline b(R"({"results": [)" + io::result_json(o).dump() + "]}", "b.json");
  const io::RecordedResult* r = b.untaken().at(0);
  std::size_t present = 0;
  for (const io::ResultKey& k : io::result_keys()) {
    CHECK(n[io::row_of(k)] == r->numbers[io::row_of(k)]);
    present += n[io::row_of(k)].has_value();
  }
  CHECK(present > 20);  // the states, flow, power, efficiencies, heads...
  CHECK(n[io::row_of(*io::find_result_key("mass_flow"))] == 1.0);
  CHECK_FALSE(n[io::row_of(*io::find_result_key("head_height"))]);  // pumps only
  CHECK(r->unknown.empty());
}

TEST_CASE("expectations: a value outside its tolerance moves, with now, expected and the difference") {
  const io::ResultNumbers r = result_now();
  // 423.15 K = 150 degC; 150.04 degC is 0.04 K away, within 0.09 degF (0.05 K).
  CHECK(io::compare_expectations(r, expect(R"({"outlet.temperature": {"value": "150.04 degC", "tolerance": "0.09 degF"}})"), 1e-6)
            .empty());
  CHECK(lines(io::compare_expectations(
            r, expect(R"({"outlet.temperature": {"value": "150.06 degC", "tolerance": "0.09 degF"}})"), 1e-6)) ==
        std::vector<std::string>{"outlet.temperature: now 423.15 K, expected 423.21 K (expect), difference -0.06 K "
                                 "(-0.0142 %), allowed 0.09 degF"});
  // Relative: 135 kW against 134.9 kW is 0.074 % off.
  CHECK(io::compare_expectations(r, expect(R"({"power": {"value": "134.9 kW", "tolerance": "0.1 %"}})"), 1e-6).empty());
  CHECK(lines(io::compare_expectations(r, expect(R"({"power": {"value": "134.8 kW", "tolerance": "0.1 %"}})"), 1e-6)) ==
        std::vector<std::string>{
            "power: now 135000 W, expected 134800 W (expect), difference +200 W (+0.148 %), allowed 0.1 %"});
  // Without a tolerance, the run's relative tolerance.
  CHECK(io::compare_expectations(r, expect(R"({"efficiency.isentropic": "80 %"})"), 0).empty());
  CHECK(lines(io::compare_expectations(r, expect(R"({"efficiency.isentropic": 0.7999})"), 1e-6)) ==
        std::vector<std::string>{"efficiency.isentropic: now 0.8, expected 0.7999 (expect), difference +0.0001 "
                                 "(+0.0125 %), allowed 1e-06 relative"});
  CHECK(io::compare_expectations(r, expect(R"({"efficiency.isentropic": 0.7999})"), 2e-4).empty());
}

TEST_CASE("expectations: a key the result lacks is an error naming it") {
  const auto lacking = [] {
    io::compare_expectations(result_now(), expect(R"({"mass_flow": "3 kg/s"})"), 1e-6);
  };
  CHECK_THROWS_WITH(lacking(), "expect.mass_flow: the result of this case has no mass_flow");
}

TEST_CASE("baseline: every numeric key at --rtol, an expectation's tolerance winning for its key") {
  const io::ResultNumbers now = result_now();
  io::CompareOptions options;
  CHECK(io::compare_with_baseline(now, recorded_as(now), {}, options).empty());

  io::ResultNumbers was = now;
  was[io::row_of(*io::find_result_key("outlet.temperature"))] = 423.1;
  was[io::row_of(*io::find_result_key("power"))] = 135000.1;  // 7.4e-7 relative: within 1e-6
  const io::RecordedResult recorded = recorded_as(was);
  CHECK(lines(io::compare_with_baseline(now, recorded, {}, options)) ==
        std::vector<std::string>{"outlet.temperature: now 423.15 K, expected 423.1 K (baseline), difference "
                                 "+0.05 K (+0.0118 %), allowed 1e-06 relative"});
  // The case's own tolerance for the key wins over --rtol.
  const auto wide = expect(R"({"outlet.temperature": {"value": "150 degC", "tolerance": "0.1 K"}})");
  CHECK(io::compare_with_baseline(now, recorded, wide, options).empty());
  // An expectation without a tolerance leaves the key at --rtol.
  CHECK(io::compare_with_baseline(now, recorded, expect(R"({"outlet.temperature": "150 degC"})"), options).size() == 1);
  // --rtol and --ignore.
  options.rtol = 2e-4;
  CHECK(io::compare_with_baseline(now, recorded, {}, options).empty());
  options.rtol = 1e-6;
  options.ignored_keys = {"outlet.temperature"};
  CHECK(io::compare_with_baseline(now, recorded, {}, options).empty());
}

TEST_CASE("baseline: a key on one side only moves, and so does a number under no result key") {
  io::ResultNumbers was = result_now();
  was[io::row_of(*io::find_result_key("power"))].reset();
  was[io::row_of(*io::find_result_key("mass_flow"))] = 3.1;
  io::RecordedResult recorded = recorded_as(was);
  recorded.unknown = {{"head.isentropic_old", 120000.0}};  // a key of another version
  CHECK(lines(io::compare_with_baseline(result_now(), recorded, {}, {})) ==
        std::vector<std::string>{"mass_flow: absent now, expected 3.1 kg/s (baseline)",
                                 "power: now 135000 W, not in the baseline",
                                 "head.isentropic_old: absent now, expected 120000 (baseline)"});
}

TEST_CASE("file names are matched after resolving . and .. steps") {
  CHECK(io::normal_file_name("./examples//design-cases.json") == "examples/design-cases.json");
  CHECK(io::normal_file_name("cases/../examples/a.json") == "examples/a.json");
  CHECK(io::normal_file_name("standard input") == "standard input");
  CHECK(io::normal_file_name("/abs/a.json") == "/abs/a.json");
}

TEST_CASE("a baseline hands each recorded result to one case, by file and id") {
  io::Baseline b(R"({"results": [
      {"id": "A", "file": "./cases/a.json", "status": "ok", "power": 1},
      {"id": "A", "file": "cases/a.json", "status": "ok", "power": 2, "solved_for": ["power"], "warnings": []},
      {"id": "B", "file": "cases/a.json", "status": "error", "error": "outlet.pressure: missing"},
      {"id": "A", "file": "cases/b.json", "status": "ok", "outlet": {"temperature": 400, "colour": "red"},
       "head": {"isentropic_old": 5e4}, "checks": [{"speed": 3000}]}], "test": {"verdict": "pass"}})",
                 "base.json");
  const auto power = [](const io::RecordedResult* r) { return r->numbers[io::row_of(*io::find_result_key("power"))]; };
  const io::RecordedResult* first = b.take("cases/a.json", "A");
  REQUIRE(first);
  CHECK(power(first) == 1.0);
  const io::RecordedResult* second = b.take("cases/a.json", "A");  // a repeated id takes the next, in order
  REQUIRE(second);
  CHECK(power(second) == 2.0);
  CHECK(b.take("cases/a.json", "A") == nullptr);
  CHECK(b.take("cases/a.json", "C") == nullptr);
  const auto left = b.untaken();
  REQUIRE(left.size() == 2);
  CHECK(left[0]->id == "B");
  CHECK(left[0]->status == "error");
  CHECK(left[0]->error == "outlet.pressure: missing");
  // Numbers inside objects by their dotted keys; text and numbers inside arrays are not compared.
  CHECK(left[1]->file == "cases/b.json");
  CHECK(left[1]->numbers[io::row_of(*io::find_result_key("outlet.temperature"))] == 400.0);
  CHECK(left[1]->unknown == std::vector<std::pair<std::string, double>>{{"head.isentropic_old", 5e4}});
}

TEST_CASE("a baseline that is not a results file is refused") {
  const std::string tail = " (record one with shaftwork check --record)";
  const std::string layout = "base.json: not a results file: expected {\"results\": [...]} as shaftwork rate --format json writes it" + tail;
  CHECK(refusal(R"({"cases": []})") == layout);
  CHECK(refusal(R"([])") == layout);
  CHECK(refusal(R"({"results": {}})") == layout);
  CHECK(refusal(R"({"results": [{"id": "A"}, 5]})") ==
        "base.json: not a results file: results[1] is not a result object with a string \"id\"" + tail);
  CHECK(refusal(R"({"results": [{"id": "A"}, {"status": "ok"}]})") ==
        "base.json: not a results file: results[1] is not a result object with a string \"id\"" + tail);
  CHECK(refusal(R"({"results": [{"id": 7}]})") ==
        "base.json: not a results file: results[0] is not a result object with a string \"id\"" + tail);
  CHECK(refusal(R"({"results": [{"id": "A", "file": 3}]})") ==
        "base.json: not a results file: results[0]: \"file\" is not a string" + tail);
  CHECK(refusal(R"({"results": [{"id": "A", "power": 1, "power": 2}]})") ==
        "base.json: not a results file: results[0]: the key \"power\" appears twice" + tail);
  CHECK(refusal(R"({"results": [{"id": "A", "id": "B"}]})") ==
        "base.json: not a results file: results[0]: the key \"id\" appears twice" + tail);
  CHECK(refusal(R"({"results": [], "results": []})") ==
        "base.json: not a results file: the key \"results\" appears twice" + tail);
  // A syntax error is told as for every JSON input, with the line and column.
  CHECK(refusal("{\"results\": [\n  {\"id\": \"A\",}\n]}") ==
        "base.json: not valid JSON: parse error at line 2, column 14: syntax error while parsing object key - "
        "unexpected '}'; expected string literal");
}

TEST_CASE("the verdict of a rated case and its report lines") {
  // 1 bar, 20 degC to 3 bar and 150 degC: the outlet temperature is given, so it comes back exactly.
  const json c = json::parse(R"({"id": "T1", "machine": "compressor", "fluid": "air",
      "inlet": {"pressure": "1 bar", "temperature": "20 degC"},
      "outlet": {"pressure": "3 bar", "temperature": "150 degC"}, "mass_flow": "1 kg/s",
      "expect": {"outlet.temperature": {"value": "150.06 degC", "tolerance": "0.09 degF"}}})");
  io::FluidFactory fluids;
  const io::CaseOutcome outcome = io::rate_document(c, "cases/t.json", fluids).front();
  REQUIRE(outcome.ok());

  const io::CaseCheck failed = io::check_case(outcome, c, nullptr, {});
  CHECK(failed.verdict == io::Verdict::failed);
  CHECK(report(failed) ==
        "failed  cases/t.json: case \"T1\"\n"
        "  outlet.temperature: now 423.15 K, expected 423.21 K (expect), difference -0.06 K (-0.0142 %), allowed "
        "0.09 degF\n");

  // Against a baseline recorded from the same result, with the expectation met: passed.
  json passing = c;
  passing["expect"]["outlet.temperature"]["value"] = "150.04 degC";
  io::Baseline same(R"({"results": [)" + io::result_json(outcome).dump() + "]}", "base.json");
  const io::CaseCheck passed = io::check_case(outcome, passing, &same, {});
  CHECK(passed.verdict == io::Verdict::passed);
  CHECK(report(passed) == "passed  cases/t.json: case \"T1\"\n");
  CHECK(same.untaken().empty());

  // A baseline without the case; then the recorded case nobody took.
  io::Baseline other(R"({"results": [{"id": "T9", "file": "cases/t.json", "status": "ok"}]})", "b.json");
  const io::CaseCheck unknown = io::check_case(outcome, passing, &other, {});
  CHECK(report(unknown) ==
        "failed  cases/t.json: case \"T1\"\n"
        "  not in the baseline (record it with --record once the case is reviewed)\n");
  const io::CaseCheck missing = io::missing_case(*other.untaken().at(0));
  CHECK(missing.verdict == io::Verdict::missing);
  CHECK(report(missing) == "failed  cases/t.json: case \"T9\": in the baseline, not among the cases checked\n");

  CHECK(io::summary_line({passed, failed, unknown, missing}) == "1 passed, 3 failed");
}

TEST_CASE("a case that cannot be rated, or whose expect block is wrong, is an error") {
  const json bad = json::parse(R"({"id": "bad\u0007", "machine": "compressor", "fluid": "air",
      "inlet": {"pressure": "1 bar", "temperature": "20 degC"}, "outlet": {"pressure": "3 degC"},
      "efficiency": 0.8, "mass_flow": "1 kg/s"})");
  io::FluidFactory fluids;
  const io::CaseCheck not_rated = io::check_case(io::rate_document(bad, "t.json", fluids).front(), bad, nullptr, {});
  CHECK(not_rated.verdict == io::Verdict::error);
  // Control characters of the id are escaped on the terminal.
  CHECK(report(not_rated) ==
        "error   t.json: case \"bad\\x07\": outlet.pressure: \"3 degC\": a temperature unit where a pressure belongs\n");

  const json unsized = json::parse(R"({"id": "U", "machine": "compressor", "fluid": "air",
      "inlet": {"pressure": "1 bar", "temperature": "20 degC"}, "outlet": {"pressure": "3 bar"},
      "efficiency": 0.8, "expect": {"mass_flow": "1 kg/s"}})");
  const io::CaseCheck lacking = io::check_case(io::rate_document(unsized, "t.json", fluids).front(), unsized, nullptr, {});
  CHECK(lacking.verdict == io::Verdict::error);
  CHECK(report(lacking) == "error   t.json: case \"U\": expect.mass_flow: the result of this case has no mass_flow\n");
}

// The batch rater: a row rated in a batch gives the same result object as the same
// values rated as a JSON case; bad rows never disturb good ones; rows keep their order
// whatever the number of jobs; the header's mistakes are refused with their messages.
#include <algorithm>
#include <sstream>
#include <string>
#include <vector>

#include <catch2/catch.hpp>
#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/batch.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/csv_reader.hpp"
#include "io/string_source.hpp"

using namespace shaftwork;
using nlohmann::json;
using nlohmann::ordered_json;

namespace {

using test::StringSource;

class StringSink final : public io::ByteSink {
 public:
  void write(std::string_view bytes) override { text.append(bytes); }
  std::string text;
};

struct Run {
  std::string output;
  io::BatchSummary summary;
};

Run run_batch(const std::string& csv, const json& template_case, io::BatchFormat format, unsigned jobs = 1,
              std::size_t chunk_bytes = 256 * 1024) {
  io::FluidFactory fluids;
  const io::BatchTemplate templ = io::read_batch_template(template_case, "template.json", fluids);
  StringSource source(csv, 997);
  StringSink sink;
  io::BatchOptions options;
  options.format = format;
  options.jobs = jobs;
  options.chunk_bytes = chunk_bytes;
  Run run;
  run.summary = io::rate_batch(source, "points.csv", templ, sink, options);
  run.output = sink.text;
  return run;
}

std::vector<std::string> lines_of(const std::string& text) {
  std::vector<std::string> lines;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) lines.push_back(line);
  return lines;
}

// The keys that give the same quantity as `key` in another form: a row's value for one
// of them replaces the template's value for any of them.
std::vector<std::string> alternatives(const std::string& key) {
  const std::vector<std::vector<std::string>> groups = {
      {"inlet.temperature", "inlet.enthalpy"},
      {"outlet.temperature", "outlet.enthalpy", "outlet.quality"},
      {"outlet.pressure", "head"},
      {"mass_flow", "volume_flow", "standard_volume_flow"},
      {"efficiency", "efficiency.isentropic", "efficiency.polytropic"}};
  for (const auto& g : groups) {
    if (std::find(g.begin(), g.end(), key) != g.end()) return g;
  }
  return {key};
}

void erase_key(json& c, const std::string& key) {
  if (const auto dot = key.find('.'); dot != std::string::npos) {
    const std::string outer = key.substr(0, dot);
    if (c.contains(outer) && c[outer].is_object()) c[outer].erase(key.substr(dot + 1));
  } else {
    c.erase(key);
  }
}

// The JSON case a CSV row stands for: the template, with each cell set at its dotted
// key as "<cell> <unit>" (or the bare cell when the column has no unit), in place of
// the template's value for that quantity in any form.
json case_for_row(const json& template_case, const std::vector<std::string>& header,
                  const std::vector<std::string>& cells) {
  json c = template_case;
  for (std::size_t i = 0; i < header.size(); ++i) {
    std::string key = header[i];
    std::string unit;
    if (const auto open = key.find(" ["); open != std::string::npos) {
      unit = key.substr(open + 2, key.size() - open - 3);
      key = key.substr(0, open);
    }
    const std::string value = unit.empty() ? cells[i] : cells[i] + " " + unit;
    for (const std::string& other : alternatives(key)) erase_key(c, other);
    if (key.rfind("efficiency", 0) == 0) c.erase("efficiency");
    if (const auto dot = key.find('.'); dot != std::string::npos) {
      const std::string outer = key.substr(0, dot);
      const std::string inner = key.substr(dot + 1);
      if (!c.contains(outer) || !c[outer].is_object()) c[outer] = json::object();
      c[outer][inner] = value;
    } else {
      c[key] = value;
    }
  }
  return c;
}

// Rates `csv` as a batch (jsonl) and each of its rows as a JSON case, and checks that
// they agree: equal result objects for rated rows, the same message after "line N: "
// for rows the rating refused. Returns how many rows were rated.
int check_equivalence(const json& template_case, const std::string& csv, unsigned jobs) {
  const Run run = run_batch(csv, template_case, io::BatchFormat::jsonl, jobs, 512);
  const auto results = lines_of(run.output);
  const auto rows = io::parse_csv(csv);
  REQUIRE(results.size() + 1 == rows.size());
  const std::vector<std::string>& header = rows[0].fields;
  int rated = 0;
  for (std::size_t i = 1; i < rows.size(); ++i) {
    INFO("row at line " << rows[i].line);
    // In a JSON case the row's values replace the template's, as the batch does; an
    // outlet temperature column, for instance, stands instead of the template's enthalpy.
    json c = case_for_row(template_case, header, rows[i].fields);
    io::FluidFactory fluids;
    const ordered_json expected = io::result_json(io::rate_case(c, 0, fluids));
    const ordered_json got = ordered_json::parse(results[i - 1]);
    if (expected["status"] == "ok") {
      CHECK(got == expected);
      ++rated;
    } else {
      CHECK(got["status"] == "error");
      CHECK(got["error"].get<std::string>() ==
            "line " + std::to_string(rows[i].line) + ": " + expected["error"].get<std::string>());
      CHECK(got.value("warnings", json::array()) == expected.value("warnings", json::array()));
    }
  }
  return rated;
}

const json kAirTemplate = json::parse(R"({
  "id": "PAC-3 log template", "machine": "compressor", "fluid": "air",
  "site": { "barometric_pressure": "99.1 kPa" },
  "inlet": { "pressure": "-1.8 kPag", "temperature": "24 degC" },
  "outlet": { "pressure": "2.1 barg", "enthalpy": "150 kJ/kg" },
  "mass_flow": "1.5 kg/s", "mechanical_efficiency": 0.975 })");

}  // namespace

TEST_CASE("a full test point per row: the same results as the rows rated as JSON cases") {
  const std::string csv =
      "id,inlet.pressure [barg],inlet.temperature [degC],outlet.pressure [barg],outlet.temperature [degC],"
      "mass_flow [t/h],power [kW],mechanical_efficiency\r\n"
      "P-1,-0.018,24.0,2.10,172.5,5.43,232,0.975\r\n"
      "P-2,-0.020,25.1,2.12,174.9,5.40,233.5,0.975\r\n"
      "P-3,-0.017,23.4,2.08,170.2,5.46,229.9,0.98\r\n"
      "P-4,-0.018,24.0,2.10,20,5.43,232,0.975\r\n"  // outlet colder than the inlet: refused by the rating
      "P-5,-0.018,24.0,-0.5,172.5,5.43,232,0.975\r\n";  // outlet pressure below the inlet
  for (unsigned jobs : {1u, 3u}) CHECK(check_equivalence(kAirTemplate, csv, jobs) == 3);
}

TEST_CASE("efficiency given per row, outlet solved, US units, default barometer") {
  json templ = json::parse(R"({"machine": "compressor", "fluid": "air",
      "inlet": {"pressure": "14.2 psia", "temperature": "70 degF"}})");
  const std::string csv =
      "id,inlet.pressure [psig],inlet.temperature [degF],outlet.pressure [psig],efficiency.polytropic [%],"
      "standard_volume_flow [Nm3/h],note\n"
      "a,-0.3,70,45,82.5,4200,\"first, with a comma\"\n"
      "b,-0.2,71.5,46,83,4150,\n"
      "c,-0.3,69,44.5,80.9,4230,\"quote \"\"here\"\"\"\n";
  CHECK(check_equivalence(templ, csv, 2) == 3);
  // The batch carries the default-barometer warning on every row, as a JSON case does.
  const Run run = run_batch(csv, templ, io::BatchFormat::jsonl);
  CHECK(lines_of(run.output)[0].find("101.325 kPa assumed") != std::string::npos);
}

TEST_CASE("a barometer column, a pump on water with head as a height") {
  json pump = json::parse(R"({"machine": "pump", "fluid": "water",
      "inlet": {"pressure": "1.2 bar", "temperature": "25 degC"}})");
  const std::string csv =
      "id,site.barometric_pressure [mbar],inlet.pressure [barg],volume_flow [m3/h],head [m],efficiency\n"
      "w1,1002,0.3,180,85,0.78\n"
      "w2,998,0.25,175,86.5,0.77\n"
      "w3,1000,0.3,180,85,1.2\n";  // an efficiency above 1: the row's error
  const Run run = run_batch(csv, pump, io::BatchFormat::jsonl);
  const auto lines = lines_of(run.output);
  REQUIRE(lines.size() == 3);
  CHECK(run.summary.rows == 3);
  CHECK(run.summary.failed == 1);
  CHECK(ordered_json::parse(lines[2])["error"] ==
        "line 4, column \"efficiency\": must be above 0 and at most 1 (or 100 %), got 1.2");
  // The rated rows agree with JSON cases (w3 differs only in where its message points).
  CHECK(check_equivalence(pump, csv.substr(0, csv.rfind("w3")), 1) == 2);
}

TEST_CASE("cells that are not numbers are that row's error, with the line and column") {
  const std::string csv =
      "id,inlet.temperature [degC],outlet.temperature [degC]\n"
      "ok,24,172.5\n"
      "empty,24,\n"
      "text,24,abc\n"
      "nan,24,NaN\n"
      "infinite,inf,172.5\n"
      "unit,24,172.5 degC\n"
      "short,24\n"
      "long,24,172.5,9\n"
      "cold,-300,172.5\n"
      "bad quote,\"24\"x,172.5\n"
      "spaces, 24 , 172.5 \n";
  const Run run = run_batch(csv, kAirTemplate, io::BatchFormat::jsonl);
  const auto lines = lines_of(run.output);
  REQUIRE(lines.size() == 11);
  auto error_of = [&](std::size_t i) { return ordered_json::parse(lines[i]).value("error", std::string("(none)")); };
  CHECK(error_of(0) == "(none)");
  CHECK(error_of(1) == "line 3, column \"outlet.temperature [degC]\": the cell is empty");
  CHECK(error_of(2) == "line 4, column \"outlet.temperature [degC]\": \"abc\" is not a number");
  CHECK(error_of(3) == "line 5, column \"outlet.temperature [degC]\": \"NaN\" is not a finite number");
  CHECK(error_of(4) == "line 6, column \"inlet.temperature [degC]\": \"inf\" is not a finite number");
  CHECK(error_of(5) == "line 7, column \"outlet.temperature [degC]\": \"172.5 degC\" is not a number");
  CHECK(error_of(6) == "line 8: 2 fields where the header has 3");
  CHECK(error_of(7) == "line 9: 4 fields where the header has 3");
  CHECK(error_of(8) == "line 10, column \"inlet.temperature [degC]\": \"-300 degC\" is below absolute zero");
  CHECK(error_of(9) == "line 11: text after the closing quote of field 2");
  CHECK(error_of(10) == "(none)");  // spaces around a number are allowed
  CHECK(ordered_json::parse(lines[1])["id"] == "empty");
  CHECK(run.summary.failed == 9);
}

TEST_CASE("bad rows never disturb the good ones around them") {
  std::string good = "id,inlet.temperature [degC],outlet.temperature [degC],mass_flow [kg/s]\n";
  std::string mixed = good;
  const char* bad_rows[] = {"x1,24,,1.5\n", "x2,24,abc,1.5\n", "x3,24,10,1.5\n", "x4,24\n", "x5,\"2\n4\",170.5,1.5\n"};
  for (int i = 0; i < 60; ++i) {
    const std::string row = fmt::format("g{},{},{}.5,1.{}\n", i, 20 + i % 9, 160 + i % 23, i % 10);
    good += row;
    mixed += row;
    if (i % 12 == 5) mixed += bad_rows[(i / 12) % 5];
  }
  for (unsigned jobs : {1u, 4u}) {
    const Run clean = run_batch(good, kAirTemplate, io::BatchFormat::csv, jobs, 200);
    const Run dirty = run_batch(mixed, kAirTemplate, io::BatchFormat::csv, jobs, 200);
    CHECK(clean.summary.failed == 0);
    CHECK(dirty.summary.failed == 5);
    // Records, not lines: a bad row's quoted cell holds a line break.
    std::vector<std::vector<std::string>> dirty_ok;
    std::size_t errors = 0;
    for (const io::CsvRow& row : io::parse_csv(dirty.output)) {
      REQUIRE(row.fields.size() > 4);
      if (row.fields[4] == "error") {
        ++errors;
      } else {
        dirty_ok.push_back(row.fields);
      }
    }
    CHECK(errors == 5);
    std::vector<std::vector<std::string>> clean_rows;
    for (const io::CsvRow& row : io::parse_csv(clean.output)) clean_rows.push_back(row.fields);
    CHECK(dirty_ok == clean_rows);
  }
}

TEST_CASE("rows come out in input order under any number of jobs") {
  std::string csv = "id,inlet.temperature [degC],outlet.temperature [degC],mass_flow [kg/s]\n";
  for (int i = 0; i < 3000; ++i) {
    csv += fmt::format("{},{},{},1.5\n", i, 15 + i % 17, 150 + i % 41);
  }
  const Run one = run_batch(csv, kAirTemplate, io::BatchFormat::csv, 1, 1024);
  const auto lines = lines_of(one.output);
  REQUIRE(lines.size() == 3001);
  for (int i = 0; i < 3000; ++i) REQUIRE(lines[i + 1].rfind(std::to_string(i) + ",", 0) == 0);
  for (unsigned jobs : {2u, 3u, 8u}) {
    const Run many = run_batch(csv, kAirTemplate, io::BatchFormat::csv, jobs, 1024);
    CHECK(many.output == one.output);
    CHECK(many.summary.rows == 3000);
  }
}

TEST_CASE("csv output: input columns, then status, error, solved_for, results, warnings") {
  const std::string csv = "id,outlet.temperature [degC]\nP-1,172.5\nP-2,x\n";
  const Run run = run_batch(csv, kAirTemplate, io::BatchFormat::csv);
  const auto lines = lines_of(run.output);
  REQUIRE(lines.size() == 3);
  CHECK(lines[0] ==
        "id,outlet.temperature [degC],status,error,solved_for,inlet.pressure [kPa],inlet.temperature [degC],"
        "outlet.pressure [kPa],outlet_isentropic.temperature [degC],mass_flow [kg/s],volume_flow [m3/h],"
        "power [kW],fluid_power [kW],efficiency.isentropic,efficiency.polytropic,head.isentropic [kJ/kg],"
        "head.polytropic [kJ/kg],specific_work [kJ/kg],pressure_ratio,warnings\r");
  // Ten significant digits of the same numbers the JSON result holds.
  io::FluidFactory fluids;
  json c = kAirTemplate;
  c["outlet"] = {{"pressure", "2.1 barg"}, {"temperature", "172.5 degC"}};
  const ordered_json r = io::result_json(io::rate_case(c, 0, fluids));
  char expected_eta[32];
  std::snprintf(expected_eta, sizeof expected_eta, "%.10g", r["efficiency"]["isentropic"].get<double>());
  CHECK(lines[1].rfind("P-1,172.5,ok,,power efficiency,97.3,24,309.1,", 0) == 0);
  CHECK(lines[1].find(std::string(",") + expected_eta + ",") != std::string::npos);
  CHECK(lines[2] ==
        "P-2,x,error,\"line 3, column \"\"outlet.temperature [degC]\"\": \"\"x\"\" is not a number\",,,,,,,,,,,,,,,,\r");
}

TEST_CASE("the header's mistakes are whole-file errors with the column named") {
  auto refusal = [](const std::string& csv, const json& templ = kAirTemplate) {
    try {
      run_batch(csv, templ, io::BatchFormat::csv);
    } catch (const Error& e) {
      return std::string(e.what());
    }
    return std::string("(accepted)");
  };
  CHECK(refusal("id,inlet.pressure\n") ==
        "points.csv: line 1, column 2 \"inlet.pressure\": a pressure needs its unit in square brackets, as in "
        "\"inlet.pressure [kPa]\"");
  CHECK(refusal("outlet.temperature [degK]\n") ==
        "points.csv: line 1, column 1 \"outlet.temperature [degK]\": unknown unit \"degK\" for a temperature; "
        "known units: K, degC, C, \xC2\xB0" "C, degF, F, \xC2\xB0" "F, degR, R");
  CHECK(refusal("mass_flow [kPa]\n") ==
        "points.csv: line 1, column 1 \"mass_flow [kPa]\": a pressure unit where a mass flow belongs");
  CHECK(refusal("outlet.temperature [degC],outlet.enthalpy [kJ/kg]\n") ==
        "points.csv: line 1, column 2 \"outlet.enthalpy [kJ/kg]\": the outlet temperature, outlet enthalpy or "
        "outlet quality is given by column 1 \"outlet.temperature [degC]\" already; keep one");
  CHECK(refusal("id [text]\n") == "points.csv: line 1, column 1 \"id [text]\": id is text and takes no unit");
  CHECK(refusal("id,fluid\n") ==
        "points.csv: line 1, column 2 \"fluid\": machine and fluid come from the template (--case): they are the "
        "same for every row");
  CHECK(refusal("id,,power [kW]\n") ==
        "points.csv: line 1, column 2 has no name; name a case key such as inlet.pressure [kPa], or any other "
        "name to carry the column through");
  CHECK(refusal("inlet.pressure [barg\n") ==
        "points.csv: line 1, column 1 \"inlet.pressure [barg\": write the unit in square brackets after the key, "
        "as in \"inlet.pressure [barg]\"");
  CHECK(refusal("site.barometric_pressure [barg]\n") ==
        "points.csv: line 1, column 1 \"site.barometric_pressure [barg]\": the barometer is an absolute pressure: "
        "give it in kPa, mbar, bar or inHg, not barg");
  CHECK(refusal("") == "points.csv: the input is empty: expected a header row");
  CHECK(refusal("\"id,power [kW]\n") ==
        "points.csv: line 1: the quoted field 1 is not closed before the end of the input");
  // A header alone is a batch of no rows.
  CHECK(refusal("id,power [kW]\n") == "(accepted)");
}

TEST_CASE("a logger's other columns are carried through unchanged, each with one notice") {
  class Notices final : public io::BatchNotices {
   public:
    void notice(const std::string& text) override { seen.push_back(text); }
    std::vector<std::string> seen;
  } notices;
  const std::string csv =
      "timestamp,id,motor current [A],outlet.temprature [degC],outlet.temperature [degC]\n"
      "2026-11-20 08:00,P-1,2950,171.9,172.5\n";
  io::FluidFactory fluids;
  const io::BatchTemplate templ = io::read_batch_template(kAirTemplate, "template.json", fluids);
  StringSource source(csv, 997);
  StringSink sink;
  io::BatchOptions options;
  const auto summary = io::rate_batch(source, "points.csv", templ, sink, options, nullptr, &notices);
  CHECK(summary.failed == 0);
  REQUIRE(notices.seen.size() == 3);
  CHECK(notices.seen[0] == "points.csv: column 1 \"timestamp\" names no case key: carried through unchanged");
  CHECK(notices.seen[1] == "points.csv: column 3 \"motor current [A]\" names no case key: carried through unchanged");
  CHECK(notices.seen[2] ==
        "points.csv: column 4 \"outlet.temprature [degC]\" names no case key: carried through unchanged (did you "
        "mean outlet.temperature?)");
  const auto lines = lines_of(sink.text);
  REQUIRE(lines.size() == 2);
  CHECK(lines[0].rfind("timestamp,id,motor current [A],outlet.temprature [degC],outlet.temperature [degC],status,", 0) == 0);
  CHECK(lines[1].rfind("2026-11-20 08:00,P-1,2950,171.9,172.5,ok,,", 0) == 0);
}

TEST_CASE("--columns chooses the result columns, and refuses a key that is no result") {
  const std::string csv = "id,outlet.temperature [degC]\nP-1,172.5\n";
  io::FluidFactory fluids;
  const io::BatchTemplate templ = io::read_batch_template(kAirTemplate, "template.json", fluids);
  io::BatchOptions options;
  options.columns = {"efficiency.isentropic", "power"};
  StringSource source(csv, 997);
  StringSink sink;
  io::rate_batch(source, "points.csv", templ, sink, options);
  const auto lines = lines_of(sink.text);
  REQUIRE(lines.size() == 2);
  CHECK(lines[0] == "id,outlet.temperature [degC],status,error,efficiency.isentropic,power [kW],warnings\r");
  CHECK(lines[1].rfind("P-1,172.5,ok,,0.77", 0) == 0);
  options.columns = {"efficiency.isentropc"};
  StringSource again(csv, 997);
  CHECK_THROWS_WITH(io::rate_batch(again, "points.csv", templ, sink, options),
                    Catch::StartsWith("--columns: \"efficiency.isentropc\" is no result key; the keys are: "
                                      "inlet.pressure, inlet.temperature,"));
}

namespace {

// The cells of one csv line as written (a quoted cell keeps its quotes), without its CR.
std::vector<std::string> cells_of(std::string line) {
  if (!line.empty() && line.back() == '\r') line.pop_back();
  std::vector<std::string> cells(1);
  bool quoted = false;
  for (char c : line) {
    if (c == '"') quoted = !quoted;
    if (c == ',' && !quoted) {
      cells.emplace_back();
    } else {
      cells.back() += c;
    }
  }
  return cells;
}

// The cells of the column `header` in every line of a csv output, the header included.
std::vector<std::string> column_of(const std::string& output, const std::string& header) {
  const auto lines = lines_of(output);
  const auto names = cells_of(lines.at(0));
  const auto at = std::find(names.begin(), names.end(), header);
  REQUIRE(at != names.end());
  const auto i = static_cast<std::size_t>(at - names.begin());
  std::vector<std::string> column;
  for (const std::string& line : lines) column.push_back(cells_of(line).at(i));
  return column;
}

}  // namespace

TEST_CASE("--columns without a polytropic key skips the polytropic path and writes the same numbers") {
  // Rows from a plant-air log (invented), one of them refused by the rating.
  const std::string csv =
      "id,inlet.pressure [barg],inlet.temperature [degC],outlet.pressure [barg],outlet.temperature [degC],"
      "mass_flow [t/h]\n"
      "A-1,0.0145,17.53,6.789,310.83,5.628\n"
      "A-2,-0.0197,26.91,6.111,318.81,5.920\n"
      "A-3,0.0012,21.40,7.402,20.00,5.310\n"
      "A-4,-0.0050,29.95,7.998,335.07,5.004\n";
  const json templ = json::parse(R"({"machine": "compressor", "fluid": "air",
    "site": {"barometric_pressure": "99.1 kPa"}, "mechanical_efficiency": 0.975})");
  io::FluidFactory fluids;
  const io::BatchTemplate t = io::read_batch_template(templ, "template.json", fluids);
  const auto run = [&](std::vector<std::string> columns) {
    io::BatchOptions options;
    options.columns = std::move(columns);
    StringSource source(csv, 997);
    StringSink sink;
    io::rate_batch(source, "points.csv", t, sink, options);
    return sink.text;
  };
  const std::string full = run({});
  const std::string narrow = run({"efficiency.isentropic", "power"});
  CHECK(lines_of(narrow).size() == 5);
  for (const char* header : {"status", "error", "efficiency.isentropic", "power [kW]", "warnings"}) {
    CAPTURE(header);
    CHECK(column_of(narrow, header) == column_of(full, header));
  }
  CHECK(column_of(narrow, "status") == std::vector<std::string>{"status", "ok", "ok", "error", "ok"});
  // With a polytropic key among the columns, the polytropic results are computed and the same.
  const std::string with_polytropic = run({"efficiency.polytropic", "head.polytropic"});
  CHECK(column_of(with_polytropic, "efficiency.polytropic") == column_of(full, "efficiency.polytropic"));
  CHECK(column_of(with_polytropic, "head.polytropic [kJ/kg]") == column_of(full, "head.polytropic [kJ/kg]"));
  CHECK(column_of(full, "efficiency.polytropic")[1].rfind("0.82", 0) == 0);
}

TEST_CASE("a template holds one readable case") {
  io::FluidFactory fluids;
  const json two = json::parse(R"({"cases": [{"machine": "pump", "fluid": "water"},
                                             {"machine": "pump", "fluid": "water"}]})");
  CHECK_THROWS_WITH(io::read_batch_template(two, "t.json", fluids), "t.json: a template holds one case; this file holds 2");
  const json bad = json::parse(R"({"machine": "compressor", "fluid": "air", "mass_flow": "5 degC"})");
  CHECK_THROWS_WITH(io::read_batch_template(bad, "t.json", fluids),
                    "t.json: mass_flow: \"5 degC\": a temperature unit where a mass flow belongs");
}

namespace {

// A plant-air log with uncertainties: the template states them by key (the flow meter's 1 %,
// the barometer's own), the log has an uncertainty column for the outlet thermometer.
const json kUncertainTemplate = json::parse(R"({
  "id": "PAC-3 log template", "machine": "compressor", "fluid": "air",
  "site": { "barometric_pressure": { "value": "99.1 kPa", "uncertainty": "0.1 kPa" } },
  "mechanical_efficiency": 0.975,
  "uncertainty": { "inlet.temperature": "0.3 K", "outlet.pressure": "0.25 %", "mass_flow": "1 %",
                   "outlet.temperature": "0.8 K" } })");

const std::string kUncertainLog =
    "id,inlet.pressure [barg],inlet.temperature [degC],outlet.pressure [barg],outlet.temperature [degC],"
    "mass_flow [t/h],uncertainty.outlet.temperature [K],uncertainty.inlet.pressure [kPa]\n"
    "P-1,-0.018,24.0,2.10,172.5,5.43,0.5,0.05\n"
    "P-2,-0.020,25.1,2.12,174.9,5.40,,0.05\n";  // no outlet-thermometer cell: the template's 0.8 K

// The JSON case of a row of kUncertainLog, with the same uncertainties written on its values.
json uncertain_case(const std::string& p1, const std::string& t1, const std::string& p2, const std::string& t2,
                    const std::string& m, const std::string& u_t2) {
  json c = kUncertainTemplate;
  c.erase("uncertainty");
  c["inlet"] = {{"pressure", {{"value", p1 + " barg"}, {"uncertainty", "0.05 kPa"}}},
                {"temperature", {{"value", t1 + " degC"}, {"uncertainty", "0.3 K"}}}};
  c["outlet"] = {{"pressure", {{"value", p2 + " barg"}, {"uncertainty", "0.25 %"}}},
                 {"temperature", {{"value", t2 + " degC"}, {"uncertainty", u_t2}}}};
  c["mass_flow"] = {{"value", m + " t/h"}, {"uncertainty", "1 %"}};
  return c;
}

}  // namespace

TEST_CASE("uncertainty columns and template statements: the same U as the rows rated as JSON cases") {
  const Run run = run_batch(kUncertainLog, kUncertainTemplate, io::BatchFormat::jsonl);
  const auto lines = lines_of(run.output);
  REQUIRE(lines.size() == 2);
  const std::vector<json> cases = {uncertain_case("-0.018", "24.0", "2.10", "172.5", "5.43", "0.5 K"),
                                   uncertain_case("-0.020", "25.1", "2.12", "174.9", "5.40", "0.8 K")};
  for (std::size_t i = 0; i < cases.size(); ++i) {
    io::FluidFactory fluids;
    const ordered_json expected = io::result_json(io::rate_case(cases[i], 0, fluids));
    const ordered_json got = ordered_json::parse(lines[i]);
    REQUIRE(got["status"] == "ok");
    CHECK(got["uncertainty"] == expected["uncertainty"]);
    CHECK(got["uncertainty_contributions"] == expected["uncertainty_contributions"]);
    CHECK(got["uncertainty"]["efficiency.isentropic"].get<double>() > 0.002);
  }
  // The first row's thermometer is the better one: its efficiency is known more closely.
  CHECK(ordered_json::parse(lines[0])["uncertainty"]["efficiency.isentropic"].get<double>() <
        ordered_json::parse(lines[1])["uncertainty"]["efficiency.isentropic"].get<double>());
}

TEST_CASE("csv with uncertainties: a column uncertainty.<key> [unit] after the results for each of them") {
  const Run run = run_batch(kUncertainLog + "P-3,-0.018,24.0,2.10,172.5,5.43,-1,0.05\n", kUncertainTemplate,
                            io::BatchFormat::csv);
  const auto lines = lines_of(run.output);
  REQUIRE(lines.size() == 4);
  CHECK(lines[0].find(",pressure_ratio,uncertainty.outlet_isentropic.temperature [degC],uncertainty.volume_flow "
                      "[m3/h],uncertainty.power [kW],uncertainty.fluid_power [kW],uncertainty.efficiency.isentropic,"
                      "uncertainty.efficiency.polytropic,uncertainty.head.isentropic [kJ/kg],uncertainty.head."
                      "polytropic [kJ/kg],uncertainty.specific_work [kJ/kg],uncertainty.pressure_ratio,warnings\r") !=
        std::string::npos);
  // The efficiency's U in the csv is the JSON's, to ten digits.
  io::FluidFactory fluids;
  const ordered_json r =
      io::result_json(io::rate_case(uncertain_case("-0.018", "24.0", "2.10", "172.5", "5.43", "0.5 K"), 0, fluids));
  char u_eta[32];
  std::snprintf(u_eta, sizeof u_eta, "%.6g", r["uncertainty"]["efficiency.isentropic"].get<double>());
  const std::vector<std::string> cells = io::parse_csv(run.output)[1].fields;
  const std::vector<std::string> header = io::parse_csv(run.output)[0].fields;
  const auto column = std::find(header.begin(), header.end(), "uncertainty.efficiency.isentropic") - header.begin();
  char cell[32];
  std::snprintf(cell, sizeof cell, "%.6g", std::stod(cells[static_cast<std::size_t>(column)]));
  CHECK(std::string(cell) == u_eta);
  // A negative uncertainty is the row's error.
  CHECK(lines[3].rfind("P-3,-0.018,24.0,2.10,172.5,5.43,-1,0.05,error,\"line 4, column \"\"uncertainty.outlet."
                       "temperature [K]\"\": \"\"-1\"\": an uncertainty cannot be negative\",",
                       0) == 0);
  // Without any uncertainty the csv is as before: no uncertainty columns.
  CHECK(lines_of(run_batch("id,outlet.temperature [degC]\nP-1,172.5\n", kAirTemplate, io::BatchFormat::csv).output)[0]
            .find("uncertainty") == std::string::npos);
}

TEST_CASE("uncertainty columns and statements that no value of the rows has are refused") {
  auto refusal = [](const std::string& csv, const json& templ) {
    try {
      run_batch(csv, templ, io::BatchFormat::csv);
    } catch (const Error& e) {
      return std::string(e.what());
    }
    return std::string("(accepted)");
  };
  CHECK(refusal("outlet.temperature [degC],uncertainty.power [%]\n", kAirTemplate) ==
        "points.csv: line 1, column 2 \"uncertainty.power [%]\": neither a column nor the template gives power");
  CHECK(refusal("outlet.temperature [degC],uncertainty.outlet.temperature [kPa]\n", kAirTemplate) ==
        "points.csv: line 1, column 2 \"uncertainty.outlet.temperature [kPa]\": a pressure unit where a "
        "temperature belongs");
  CHECK(refusal("outlet.temperature [degC],uncertainty.outlet.temperature\n", kAirTemplate) ==
        "points.csv: line 1, column 2 \"uncertainty.outlet.temperature\": an uncertainty needs its unit in square "
        "brackets, as in \"uncertainty.outlet.temperature [degC]\", or \"[%]\" of the reading");
  CHECK(refusal("outlet.temperature [degC],uncertainty.outlet.temp [K]\n", kAirTemplate) ==
        "points.csv: line 1, column 2 \"uncertainty.outlet.temp [K]\": \"outlet.temp\" names no case value, such "
        "as outlet.temperature");
  CHECK(refusal("outlet.temperature [degC],uncertainty.outlet.temperature [K],uncertainty.outlet.temperature [%]\n",
                kAirTemplate) ==
        "points.csv: line 1, column 3 \"uncertainty.outlet.temperature [%]\": column 2 "
        "\"uncertainty.outlet.temperature [K]\" gives it already; keep one");
  json templ = kUncertainTemplate;
  templ["uncertainty"]["power"] = "1.5 %";
  CHECK(refusal(kUncertainLog, templ) ==
        "template.json: uncertainty.power: neither the template nor a column of points.csv gives power, so there "
        "is no reading to state an uncertainty for");
}

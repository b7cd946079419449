// The batch chart: its bounded summary keeps a million rows' extremes and failed rows in
// place; the points a batch hands it are the numbers its CSV writes; timestamps read as the
// calendar says; every format puts the marks where the axis mapping says.
#include <catch2/catch.hpp>

#include <cmath>
#include <sstream>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "charts/raster.hpp"
#include "io/string_source.hpp"
#include "shaftwork/charts/batch_chart.hpp"
#include "shaftwork/io/batch.hpp"
#include "shaftwork/io/timestamp.hpp"

using namespace shaftwork;
using namespace shaftwork::test;

namespace {

class Recorder final : public io::BatchPointSink {
 public:
  void time_column(const std::string& header) override { time_header = header; }
  void add(const io::BatchPoint& p) override { points.push_back(p); }
  std::string time_header;
  std::vector<io::BatchPoint> points;
};

class StringSink final : public io::ByteSink {
 public:
  void write(std::string_view bytes) override { text.append(bytes); }
  std::string text;
};

io::BatchPoint point(std::size_t row, double eta_s, double eta_p, double balance) {
  io::BatchPoint p;
  p.row = row;
  p.rated = true;
  p.efficiency_isentropic = eta_s;
  p.efficiency_polytropic = eta_p;
  p.balance_percent = balance;
  return p;
}

const nlohmann::json kTemplate = nlohmann::json::parse(R"({
  "id": "log template", "machine": "compressor", "fluid": "air",
  "inlet": { "pressure": "1 bar", "temperature": "20 degC" },
  "outlet": { "pressure": "3 bar", "temperature": "150 degC" },
  "mass_flow": "1 kg/s", "power": "150 kW",
  "uncertainty": { "outlet.temperature": "0.5 K" } })");

}  // namespace

TEST_CASE("timestamps count seconds as the calendar does") {
  // Check values from Python's datetime (datetime(2026, 3, 2, 0, 5, tzinfo=timezone.utc).timestamp()).
  CHECK(io::parse_timestamp("2026-03-02 00:05") == 1772409900.0);
  CHECK(io::parse_timestamp("2026-03-02T00:05:00Z") == 1772409900.0);
  CHECK(io::parse_timestamp("2024-02-29 23:59:30") == 1709251170.0);  // a leap day
  CHECK(io::parse_timestamp("2024-02-29 23:59:30.5") == 1709251170.5);
  for (const char* bad : {"2026-02-29", "2026-13-01", "2026-04-31", "2026-03-02 24:00", "2026-03-02 00:60",
                          "2026-03-02 00:05:", "26-03-02", "2026-03-02 00:05 x", "line 4", ""}) {
    INFO(bad);
    CHECK_FALSE(io::parse_timestamp(bad));
  }
  CHECK(io::timestamp_text(1772409900.0) == "2026-03-02 00:05");
  CHECK(io::timestamp_text(1709251170.5) == "2024-02-29 23:59");
}

TEST_CASE("a million rows keep at most 1024 buckets, their extremes and failed rows in place") {
  charts::BatchChartData data;
  data.time_column("");
  const std::size_t n = 1'000'000;
  for (std::size_t row = 1; row <= n; ++row) {
    io::BatchPoint p = point(row, 0.78 + 1e-3 * std::sin(static_cast<double>(row) / 5000), 0.81, 0.5);
    if (row == 777'777) p.efficiency_isentropic = 0.31;  // one bad row
    if (row == 123'456) p = io::BatchPoint{row};          // one failed row
    data.add(p);
  }
  CHECK(data.rows() == n);
  CHECK(data.failed() == 1);
  CHECK(data.rows_per_bucket() == 1024);  // 1e6 rows over 1024 buckets: 977 of 1024 rows
  CHECK(data.buckets().size() == 977);
  CHECK_FALSE(data.by_time());
  std::size_t rows = 0;
  double lowest = 1;
  double lowest_row = 0;
  for (const charts::BatchBucket& b : data.buckets()) {
    rows += b.rows;
    if (b.series[charts::kIsentropic].low.value < lowest) {
      lowest = b.series[charts::kIsentropic].low.value;
      lowest_row = b.series[charts::kIsentropic].low.row;
    }
    if (b.failed) CHECK(b.first_failed.row == 123'456);
  }
  CHECK(rows == n);
  CHECK(lowest == 0.31);
  CHECK(lowest_row == 777'777);
}

TEST_CASE("the batch hands the chart the numbers its CSV writes, with times and uncertainties") {
  const std::string csv =
      "timestamp,outlet.temperature [degC],power [kW]\n"
      "2026-03-02 00:00,150,150\n"
      "2026-03-02 00:01,151,150\n"
      "2026-03-02 00:02,15,150\n"  // colder than the isentropic outlet: no rating
      "2026-03-02 00:03,149,152\n";
  io::FluidFactory fluids;
  const io::BatchTemplate templ = io::read_batch_template(kTemplate, "template.json", fluids);
  for (const unsigned jobs : {1u, 3u}) {
    test::StringSource source(csv, 7);
    StringSink sink;
    Recorder recorder;
    io::BatchOptions options;
    options.jobs = jobs;
    options.chunk_bytes = 512;
    options.columns = {"efficiency.isentropic", "efficiency.polytropic", "power_balance.difference_percent"};
    options.points = &recorder;
    io::rate_batch(source, "points.csv", templ, sink, options);
    CHECK(recorder.time_header == "timestamp");
    REQUIRE(recorder.points.size() == 4);
    std::istringstream lines(sink.text);
    std::string line;
    std::getline(lines, line);  // the header
    for (std::size_t i = 0; i < 4; ++i) {
      const io::BatchPoint& p = recorder.points[i];
      std::getline(lines, line);
      INFO(line);
      CHECK(p.row == i + 1);
      CHECK(p.time == 1772409600.0 + 60.0 * static_cast<double>(i));  // Python's datetime, as above
      CHECK(p.rated == (i != 2));
      if (!p.rated) continue;
      // The csv: timestamp, two cells, status, error, eta_s, eta_p, balance, their U, warnings.
      std::vector<std::string> cells;
      std::istringstream row(line);
      for (std::string c; std::getline(row, c, ',');) cells.push_back(c);
      REQUIRE(cells.size() >= 11);
      CHECK(p.efficiency_isentropic == Approx(std::stod(cells[5])).epsilon(1e-9));
      CHECK(p.efficiency_polytropic == Approx(std::stod(cells[6])).epsilon(1e-9));
      CHECK(p.balance_percent == Approx(std::stod(cells[7])).epsilon(1e-9));
      CHECK(p.uncertainty_isentropic == Approx(std::stod(cells[8])).epsilon(1e-9));
      CHECK(p.uncertainty_polytropic == Approx(std::stod(cells[9])).epsilon(1e-9));
      CHECK(p.uncertainty_isentropic > 0);
    }
  }
}

TEST_CASE("every format puts the batch chart's marks where the axis mapping says") {
  charts::BatchChartData data;
  data.time_column("");
  const std::vector<io::BatchPoint> points = {point(1, 0.78, 0.81, 0.4), point(2, 0.77, 0.80, -0.6),
                                              io::BatchPoint{3}, point(4, 0.79, 0.82, 1.1),
                                              point(5, 0.70, 0.83, 2.5)};
  for (const io::BatchPoint& p : points) data.add(p);
  const charts::BatchAxes axes = charts::batch_axes(data, charts::kChartPage);
  const fs::path dir = scratch();
  for (const char* ext : {".png", ".svg", ".pdf"}) {
    const fs::path path = dir / (std::string("batch") + ext);
    {
      FileSink sink(path);
      charts::Document doc(charts::image_format_of(path.string()), sink, charts::kChartPage.width,
                           charts::kChartPage.height);
      charts::draw_batch_chart(doc.begin_page(), data, {"a log", "points.csv"}, charts::kChartPage);
      doc.end_page();
      doc.finish();
    }
    INFO(path);
    const Raster raster(rasterise(path));
    CHECK(raster.width() == 1080);
    CHECK(raster.height() == 720);
    for (const io::BatchPoint& p : points) {
      if (!p.rated) continue;
      const double row = static_cast<double>(p.row);
      check_mark(raster, axes.efficiency, {row, p.efficiency_isentropic}, charts::kInletColour);
      check_mark(raster, axes.efficiency, {row, p.efficiency_polytropic}, charts::kPathColour);
      check_mark(raster, axes.balance, {row, p.balance_percent}, charts::kIsentropicColour);
    }
    // The failed row: its triangle at the top of the efficiency panel, above row 3.
    const double x = axes.efficiency.page_x(3) * charts::kPngPixelsPerPoint;
    const double y = (axes.efficiency.area.y + 6) * charts::kPngPixelsPerPoint;
    CHECK(near(raster.at(x, y), charts::kOutletColour));
  }
  const std::string text = run("pdftotext -layout '" + (dir / "batch.pdf").string() + "' -");
  for (const char* words : {"a log", "points.csv", "efficiency [-]", "power balance diff. [%]", "failed row", "row"}) {
    INFO(words);
    CHECK(text.find(words) != std::string::npos);
  }
}

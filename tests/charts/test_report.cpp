// The test report: an A4 page per case, rasterised by pdftoppm at 108 dpi; its size, the
// process chart's marks where the chart's axis mapping (scaled onto the page) says, and the
// text (pdftotext): the case id, the rated table, the models and the caution.
#include <catch2/catch.hpp>

#include <string>

#include "charts/raster.hpp"
#include "shaftwork/charts/report.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/text_file.hpp"

using namespace shaftwork;
using namespace shaftwork::test;

TEST_CASE("a report page holds the case, its table, its chart at the scaled mapping, and the caution") {
  io::FluidFactory fluids;
  const std::string source = std::string(SHAFTWORK_SOURCE_DIR) + "/examples/plant-air-compressor.json";
  const auto outcomes =
      io::rate_document(io::parse_json_strict(io::read_text_file(source), source), source, fluids);
  REQUIRE(outcomes.size() >= 2);
  const fs::path path = scratch() / "report.pdf";
  {
    FileSink sink(path);
    charts::Document doc(charts::ImageFormat::pdf, sink, charts::kA4Width, charts::kA4Height);
    for (const io::CaseOutcome& o : outcomes) {
      charts::draw_report_page(doc.begin_page(), o, {});
      doc.end_page();
    }
    doc.finish();
  }
  const std::string info = run("pdfinfo '" + path.string() + "'");
  CHECK(info.find("Pages:           " + std::to_string(outcomes.size()) + "\n") != std::string::npos);
  CHECK(info.find("595.28 x 841.89 pts (A4)") != std::string::npos);

  const std::string first = path.string() + ".raster";
  REQUIRE(std::system(("pdftoppm -r 108 -png -f 1 -l 1 -singlefile '" + path.string() + "' '" + first + "'").c_str()) ==
          0);
  const Raster raster(first + ".png");
  CHECK(raster.width() == 893);  // 595.28 pt x 1.5 pixels a point
  CHECK(raster.height() == 1263);
  // The chart is drawn into kChartPage, then scaled and moved onto the page: so is its mapping.
  const charts::ProcessChart chart = charts::make_process_chart(outcomes[0], {});
  const charts::ReportChartPlace place = charts::report_chart_place();
  charts::Axes axes = charts::process_axes(chart, charts::kChartPage);
  axes.area = {place.x + place.scale * axes.area.x, place.y + place.scale * axes.area.y,
               place.scale * axes.area.width, place.scale * axes.area.height};
  check_mark(raster, axes, chart.inlet, charts::kInletColour);
  check_mark(raster, axes, chart.outlet, charts::kOutletColour);
  check_mark(raster, axes, chart.outlet_isentropic, charts::kIsentropicColour);
  // Every line of the page inside a US Letter sheet printed centred at actual size: Letter
  // (612 x 792 pt) cuts (841.89 - 792) / 2 = 24.9 pt off the top and the bottom of A4.
  for (int y = 0; y < static_cast<int>((24.9 + 10) * 1.5); ++y) {
    for (int x = 0; x < raster.width(); x += 3) {
      INFO("ink at pixel " << x << ", " << y);
      REQUIRE(near(raster.at(x + 0.5, y + 0.5), {255, 255, 255}));
      REQUIRE(near(raster.at(x + 0.5, raster.height() - y - 0.5), {255, 255, 255}));
    }
  }

  const std::string text = run("pdftotext -layout -f 1 -l 1 '" + path.string() + "' -");
  for (const std::string& words :
       {outcomes[0].id, std::string("Given values, as written"), std::string("outlet.temperature = 172.5 degC"),
        std::string("isentropic efficiency          0.7779"), std::string("Models and sources"),
        std::string("Property model: nasa-polynomial"), std::string("Caution"),
        std::string("never replace, the governing test codes"), std::string("specific entropy s [kJ/(kg K)]")}) {
    INFO(words);
    CHECK(text.find(words) != std::string::npos);
  }
}

TEST_CASE("a long file name and id keep inside the page: shrunk, then shortened in the middle") {
  io::FluidFactory fluids;
  const std::string source = std::string(SHAFTWORK_SOURCE_DIR) + "/examples/plant-air-compressor.json";
  auto outcomes = io::rate_document(io::parse_json_strict(io::read_text_file(source), source), source, fluids);
  REQUIRE(!outcomes.empty());
  io::CaseOutcome o = outcomes[0];
  o.origin = "/records/plant-tests/a-very-long-directory-name-for-the-test-records-of-the-year-2026/compressors/"
             "first-stage/plant-air-compressor.json";
  o.id = "PAC-3 first stage, acceptance test after the overhaul of March, point 1 of 5";
  const fs::path path = scratch() / "long-names.pdf";
  {
    FileSink sink(path);
    charts::Document doc(charts::ImageFormat::pdf, sink, charts::kA4Width, charts::kA4Height);
    charts::draw_report_page(doc.begin_page(), o, {});
    doc.end_page();
    doc.finish();
  }
  const std::string png = path.string() + ".raster";
  REQUIRE(std::system(("pdftoppm -r 108 -png -singlefile '" + path.string() + "' '" + png + "'").c_str()) == 0);
  const Raster raster(png + ".png");
  // No ink within 20 pt of the left or right edge (the header's lines ran past it).
  for (int y = 0; y < raster.height(); y += 2) {
    for (int x = 0; x < 30; ++x) {
      INFO("ink at pixel " << x << " or " << raster.width() - 1 - x << ", " << y);
      REQUIRE(near(raster.at(x + 0.5, y + 0.5), {255, 255, 255}));
      REQUIRE(near(raster.at(raster.width() - x - 0.5, y + 0.5), {255, 255, 255}));
    }
  }
  const std::string text = run("pdftotext -raw -f 1 -l 1 '" + path.string() + "' -");
  CHECK(text.find("compressor on air, from /records/plant-tests/") != std::string::npos);  // the start kept
  CHECK(text.find("\u2026") != std::string::npos);                                     // the middle cut
  CHECK(text.find("first-stage/plant-air-compressor.json") != std::string::npos);       // the file name kept
  CHECK(text.find(o.id) != std::string::npos);  // the id shrunk, whole
}

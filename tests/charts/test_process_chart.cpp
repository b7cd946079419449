// Process charts drawn to PNG, SVG and PDF: every format rasterised (SVG by rsvg-convert,
// PDF by pdftoppm, both at 108 dpi = kPngPixelsPerPoint pixels a point), its size checked,
// and the inlet, isentropic-outlet and outlet marks found at the pixels the chart's own
// axis mapping gives for the rated numbers; the text checked in the PDF with pdftotext.
#include <catch2/catch.hpp>

#include <cairo.h>

#include <cmath>
#include <cstdio>
#include <cstdlib>
#include <cstring>
#include <unistd.h>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

#include "shaftwork/charts/document.hpp"
#include "shaftwork/charts/palette.hpp"
#include "shaftwork/charts/process_chart.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/text_file.hpp"
#include "charts/raster.hpp"

using namespace shaftwork;
using charts::Colour;
namespace fs = std::filesystem;
using namespace shaftwork::test;

namespace {

std::vector<io::CaseOutcome> rate_example(const std::string& name) {
  static io::FluidFactory fluids;
  const std::string path = std::string(SHAFTWORK_SOURCE_DIR) + "/examples/" + name;
  return io::rate_document(io::parse_json_strict(io::read_text_file(path), path), path, fluids);
}

// Draws `chart` into `path` in the format of its extension.
void render(const charts::ProcessChart& chart, const fs::path& path) {
  FileSink sink(path);
  charts::Document doc(charts::image_format_of(path.string()), sink, charts::kChartPage.width,
                       charts::kChartPage.height);
  charts::draw_process_chart(doc.begin_page(), chart, charts::kChartPage);
  doc.end_page();
  doc.finish();
}

}  // namespace

TEST_CASE("the process chart's points are the rated states in the case's units") {
  const auto outcomes = rate_example("plant-air-compressor.json");
  const machines::Rating& r = *outcomes[0].rating;
  const charts::ProcessChart chart = charts::make_process_chart(outcomes[0], {});
  // SI kJ/(kg K) and kJ/kg: the SI numbers of the rating over 1000.
  CHECK(chart.inlet.x == Approx(r.inlet.entropy / 1000).epsilon(1e-12));
  CHECK(chart.inlet.y == Approx(r.inlet.enthalpy / 1000).epsilon(1e-12));
  CHECK(chart.outlet.y == Approx(r.outlet.enthalpy / 1000).epsilon(1e-12));
  CHECK(chart.outlet_isentropic.x == Approx(chart.inlet.x).margin(1e-9));
  REQUIRE(chart.path.points.size() == 33);
  // The sampled path ends where the rating put the outlet (the same integral).
  CHECK(chart.path.points[31].y < chart.outlet.y);
  CHECK(chart.path.points[31].x < chart.outlet.x);
  CHECK(chart.x_title == "specific entropy s [kJ/(kg K)]");
  CHECK(chart.y_title == "specific enthalpy h [kJ/kg]");
  CHECK(chart.isobars.size() == 2);
  // Each isobar as the case wrote its pressure (-1.8 kPag in, 2.10 barg out).
  CHECK(chart.isobars[0].label == "p1 = -1.8 kPag");
  CHECK(chart.isobars[1].label == "p2 = 2.10 barg");
  CHECK(chart.saturation.points.empty());
  CHECK(chart.numbers[0] == std::pair<std::string, std::string>{"isentropic efficiency", "0.7779"});
}

TEST_CASE("a T-s chart shows temperatures in the case's unit") {
  const auto outcomes = rate_example("plant-air-compressor.json");
  charts::ProcessChartOptions options;
  options.diagram = charts::Diagram::temperature_entropy;
  const charts::ProcessChart chart = charts::make_process_chart(outcomes[0], options);
  // The case gives 24.0 degC in and 172.5 degC out.
  CHECK(chart.inlet.y == Approx(24.0).margin(1e-9));
  CHECK(chart.outlet.y == Approx(172.5).margin(1e-9));
  CHECK(chart.y_title == "temperature T [degC]");
}

TEST_CASE("steam charts carry the saturation line and lines of constant quality") {
  const auto outcomes = rate_example("steam-turbines.json");
  charts::ProcessChartOptions options;
  options.diagram = charts::Diagram::temperature_entropy;
  const charts::ProcessChart chart = charts::make_process_chart(outcomes[1], options);
  REQUIRE(chart.qualities.size() == 9);
  double top = -1e9;
  for (const charts::Point& p : chart.saturation.points) top = std::max(top, p.y);
  // The line rises to just below the critical point, 373.946 degC (IAPWS R7-97(2012)).
  CHECK(top == Approx(373.946).margin(0.5));
  CHECK(top < 373.946);
  // Outlet quality 0.892438 in the expect block (python3-iapws): the legend shows it.
  bool quality_shown = false;
  for (const auto& [label, value] : chart.numbers) quality_shown |= label == "outlet quality" && value == "0.8924";
  CHECK(quality_shown);
}

TEST_CASE("a failed case has no chart") {
  io::CaseOutcome failed;
  failed.id = "X-1";
  failed.error = "something";
  try {
    charts::make_process_chart(failed, {});
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(std::string(e.what()) == "case \"X-1\": no chart: the case was not rated");
  }
}

TEST_CASE("every format puts the marks where the axis mapping says") {
  const fs::path dir = scratch();
  const auto air = rate_example("plant-air-compressor.json");
  const auto steam = rate_example("steam-turbines.json");
  for (const io::CaseOutcome* o : {&air[0], &steam[0]}) {
    for (const char* ext : {".png", ".svg", ".pdf"}) {
      const charts::ProcessChart chart = charts::make_process_chart(*o, {});
      const fs::path path = dir / (std::string("chart") + ext);
      render(chart, path);
      const Raster raster(rasterise(path));
      INFO(o->id << " as " << ext);
      REQUIRE(raster.width() == 1080);
      REQUIRE(raster.height() == 720);
      const charts::Axes axes = charts::process_axes(chart, charts::kChartPage);
      check_mark(raster, axes, chart.inlet, charts::kInletColour);
      check_mark(raster, axes, chart.outlet, charts::kOutletColour);
      check_mark(raster, axes, chart.outlet_isentropic, charts::kIsentropicColour);
    }
  }
  fs::remove_all(dir);
}

TEST_CASE("the PDF's text holds the case, the axes and the results") {
  const fs::path dir = scratch();
  const auto steam = rate_example("steam-turbines.json");
  const charts::ProcessChart chart = charts::make_process_chart(steam[1], {});
  render(chart, dir / "steam.pdf");
  const std::string text = run("pdftotext -layout '" + (dir / "steam.pdf").string() + "' -");
  for (const char* expected :
       {"TG-2 condensing turbine, guaranteed efficiency", "turbine on steam (iapws-if97)", "specific entropy s [kJ/(kg K)]",
        "specific enthalpy h [kJ/kg]", "saturation line", "isentropic efficiency", "0.8400", "outlet quality", "0.8924",
        "p2 = 0.085 bar", "x = 0.9"}) {
    INFO(expected);
    CHECK(text.find(expected) != std::string::npos);
  }
  fs::remove_all(dir);
}

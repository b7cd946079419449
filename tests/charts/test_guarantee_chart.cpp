// Guarantee charts: their numbers against the example files' test data carried by hand
// (ISO 9906:2012's translation, the ideal-gas inlet volume flow) and against the judge's
// own readings; each format rasterised (SVG by rsvg-convert, PDF by pdftoppm, both at 108
// dpi = kPngPixelsPerPoint pixels a point), its size checked, and a converted test point,
// the value read at the guarantee (in its verdict's colour) and the guarantee point's open
// diamond found at the pixels the chart's own axis mapping gives; the text read back from
// the PDF with pdftotext; the report's guarantee page likewise.
#include <catch2/catch.hpp>

#include <cmath>
#include <string>
#include <vector>

#include "charts/raster.hpp"
#include "shaftwork/charts/guarantee_chart.hpp"
#include "shaftwork/charts/report.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/guarantee_reader.hpp"
#include "shaftwork/io/text_file.hpp"

using namespace shaftwork;
using namespace shaftwork::test;
using machines::Verdict;

namespace {

struct Rated {
  std::vector<io::CaseOutcome> cases;
  io::TestOutcome test;
};

// The cases of examples/guarantees/NAME and the file's test, as `rate` judges them.
Rated rate_guarantee_example(const std::string& name) {
  static io::FluidFactory fluids;
  const std::string path = std::string(SHAFTWORK_SOURCE_DIR) + "/examples/guarantees/" + name;
  const auto document = io::parse_json_strict(io::read_text_file(path), path);
  Rated r;
  r.cases = io::rate_document(document, path, fluids);
  io::FileTest test(document, path);
  for (const io::CaseOutcome& o : r.cases) test.add(o);
  r.test = test.finish(fluids);
  return r;
}

const machines::Check& check_of(const io::TestOutcome& t, machines::Checked q) {
  const machines::Check* c = machines::find_check(*t.result, q);
  REQUIRE(c);
  return *c;
}

// A value of the guarantee point as the judge rated it (SI), by key.
double converted(const machines::GuaranteeResult& g, const std::string& key) {
  for (const machines::NamedValue& v : g.converted) {
    if (v.key == key) return v.value;
  }
  FAIL("no converted value " << key);
  return 0;
}

void render(const charts::GuaranteeChart& chart, const fs::path& path) {
  FileSink sink(path);
  charts::Document doc(charts::image_format_of(path.string()), sink, charts::kChartPage.width,
                       charts::kChartPage.height);
  charts::draw_guarantee_chart(doc.begin_page(), chart, charts::kChartPage);
  doc.end_page();
  doc.finish();
}

// The open diamond of the guarantee (15 pt across, its corners 9 pt from the centre) at the
// pixel the mapping gives: ink on the middle of its upper right edge, (4.5, -4.5) pt from the
// centre, and nothing of it 4 pt further out along the same diagonal.
void check_guarantee_diamond(const Raster& r, const charts::Axes& axes, charts::Point data) {
  const charts::Point page = axes.page(data);
  const double k = charts::kPngPixelsPerPoint;
  INFO("diamond expected around pixel " << page.x * k << ", " << page.y * k);
  CHECK(near(r.at((page.x + 4.5) * k, (page.y - 4.5) * k), charts::kInk));
  CHECK(near(r.at((page.x - 4.5) * k, (page.y + 4.5) * k), charts::kInk));
  CHECK_FALSE(near(r.at((page.x + 8.5) * k, (page.y - 8.5) * k), charts::kInk));
}

// The closed ends of the panel's tolerance bar clear of its marks (12 pt from the reading and
// the guarantee): each a cap, ink 3 pt beside the bar at the bound's height, and white 3 pt
// above and below that. Returns how many were checked.
int check_bar_caps(const Raster& r, const charts::Axes& axes, const charts::GuaranteePanel& p) {
  const double k = charts::kPngPixelsPerPoint;
  int checked = 0;
  for (const auto& bound : {p.low, p.high}) {
    if (!bound) continue;
    const double py = axes.page_y(*bound);
    if (std::abs(py - axes.page_y(p.read.y)) < 12 || std::abs(py - axes.page_y(p.guarantee->y)) < 12) continue;
    const double px = axes.page_x(p.read.x) + 3;
    INFO("bar cap expected at pixel " << px * k << ", " << py * k);
    CHECK(near(r.at(px * k, py * k), charts::kInk));
    CHECK(near(r.at(px * k, (py - 3) * k), {255, 255, 255}));
    CHECK(near(r.at(px * k, (py + 3) * k), {255, 255, 255}));
    ++checked;
  }
  return checked;
}

}  // namespace

TEST_CASE("the pump chart: translated points, the grade's cross around the guarantee, the judge's readings") {
  const Rated grade_1b = rate_guarantee_example("pump-test-stand-grade-1b.json");
  REQUIRE(grade_1b.test.result);
  const charts::GuaranteeChart chart = charts::make_guarantee_chart(grade_1b.test, {});
  CHECK(chart.title == "test of pump-test-stand-grade-1b.json");
  CHECK(chart.subtitle == "guarantee of the pump on water, 5 test points, ISO 9906 grade 1B");
  CHECK(chart.x_title == "volume flow Q [m3/h]");
  CHECK(chart.verdict == Verdict::fail);
  REQUIRE(chart.panels.size() == 2);
  const charts::GuaranteePanel& head = chart.panels[0];
  const charts::GuaranteePanel& eta = chart.panels[1];
  CHECK(head.y_title == "pump head [m]");
  CHECK(eta.y_title == "pump efficiency [-]");
  // Point 1 of the file, 333.1 m3/h at 42.38 m and 1450 rpm, translated to 1480 rpm by ISO
  // 9906:2012: Q (n_g/n), H (n_g/n)^2.
  const double r = 1480.0 / 1450.0;
  REQUIRE(head.points.size() == 5);
  CHECK(head.points[0].x == Approx(333.1 * r).epsilon(1e-12));
  CHECK(head.points[0].y == Approx(42.38 * r * r).epsilon(1e-12));
  CHECK(head.points[4].x == Approx(489.9 * r).epsilon(1e-12));
  // The guarantee of the file, 420 m3/h at 41.0 m, with grade 1B's +-5 % flow and +-3 % head
  // (ISO 9906:2012 Table 8, from memory; docs/guarantee.md).
  REQUIRE(head.guarantee);
  CHECK(head.guarantee->x == Approx(420).epsilon(1e-12));
  CHECK(head.guarantee->y == Approx(41.0).epsilon(1e-12));
  CHECK(chart.cross);
  CHECK(*chart.flow_low == Approx(399).epsilon(1e-12));
  CHECK(*chart.flow_high == Approx(441).epsilon(1e-12));
  CHECK(*head.low == Approx(39.77).epsilon(1e-12));
  CHECK(*head.high == Approx(42.23).epsilon(1e-12));
  // The readings are the judge's: H(Q_G) and the flow where H(Q) = H_G, in m3/h and m.
  CHECK(head.read.x == Approx(420).epsilon(1e-12));
  CHECK(head.read.y == Approx(*check_of(grade_1b.test, machines::Checked::head_height).converted).epsilon(1e-12));
  REQUIRE(chart.flow_read);
  CHECK(chart.flow_read->x ==
        Approx(3600 * *check_of(grade_1b.test, machines::Checked::volume_flow).converted).epsilon(1e-12));
  CHECK(head.verdict == Verdict::fail);
  // The efficiency, read where H(Q) meets the line through the origin and (Q_G, H_G): on that line.
  REQUIRE(chart.eta_read_flow);
  CHECK(eta.read.x == *chart.eta_read_flow);
  // The curve is drawn across the flows it may be read at: 5 % beyond the points each side.
  CHECK(head.curve.front().x == Approx(333.1 * r * 0.95).epsilon(1e-12));
  CHECK(head.curve.back().x == Approx(489.9 * r * 1.05).epsilon(1e-12));
  CHECK(eta.read.y == Approx(*check_of(grade_1b.test, machines::Checked::pump_efficiency).converted).epsilon(1e-12));
  CHECK(eta.verdict == Verdict::pass);
  CHECK(*eta.low == Approx(0.80 * 0.97).epsilon(1e-12));  // grade 1B: eta >= eta_G (1 - 3 %)
  CHECK_FALSE(eta.high);
  // The legend's checks, in the table's words and precision.
  REQUIRE(chart.checks.size() == 4);
  CHECK(chart.checks[1].label == "pump head");
  CHECK(chart.checks[1].values == "39.343 m against 41 m");
  CHECK(chart.checks[1].deviation == "-4.04 %, tolerance -3 to +3 %");
  CHECK(chart.checks[1].verdict == Verdict::fail);

  const Rated grade_2b = rate_guarantee_example("pump-test-stand-grade-2b.json");
  const charts::GuaranteeChart pass = charts::make_guarantee_chart(grade_2b.test, {});
  CHECK(pass.verdict == Verdict::pass);
  CHECK(pass.panels[0].verdict == Verdict::pass);
  CHECK(*pass.panels[0].low == Approx(41.0 * 0.95).epsilon(1e-12));  // grade 2B: +-5 % head
}

TEST_CASE("the compressor chart: head and efficiency against the inlet volume flow, the pressure as a head") {
  const Rated air = rate_guarantee_example("plant-air-97-percent-speed.json");
  REQUIRE(air.test.result);
  const charts::GuaranteeChart chart = charts::make_guarantee_chart(air.test, {});
  CHECK(chart.x_title == "inlet volume flow Q [m3/h]");
  // 4200 Nm3/h (DIN 1343: 0 degC, 101.325 kPa) at the guarantee inlet, -1.8 kPag on a 99.1 kPa
  // barometer and 24.0 degC: the ideal gas law's Q = Q_N (p_N / p1) (T1 / T_N).
  CHECK(chart.guaranteed_flow == Approx(4200 * (101.325 / 97.3) * (297.15 / 273.15)).epsilon(1e-12));
  REQUIRE(chart.panels.size() == 2);
  const charts::GuaranteePanel& head = chart.panels[0];
  CHECK(head.y_title == "polytropic head [kJ/kg]");
  // The guarantee's 2.10 barg on its own site barometer (99.1 kPa), not the test's (100.3 kPa).
  CHECK(head.guarantee_note == "210 kPag as a head");
  CHECK(head.points.size() == 3);
  CHECK(head.curve.size() == 5);  // straight lines: the three points and the two ends 5 % beyond
  CHECK(head.read.y == Approx(converted(*air.test.result, "head.polytropic") / 1000).epsilon(1e-12));  // J/kg to kJ/kg
  // The converted discharge pressure passes (+1.66 % against >= -1 %): so does the head.
  CHECK(head.verdict == Verdict::pass);
  CHECK(head.read.y > *head.low);
  CHECK(head.read.y > head.guarantee->y);
  const charts::GuaranteePanel& eta = chart.panels[1];
  CHECK(eta.y_title == "polytropic efficiency [-]");
  CHECK(eta.guarantee->y == 0.80);
  CHECK(*eta.low == Approx(0.80 * 0.98).epsilon(1e-12));  // the purchase order's -2 %
  CHECK_FALSE(chart.cross);
  CHECK_FALSE(chart.eta_read_flow);
}

TEST_CASE("turbines and cases without a guarantee have no guarantee chart") {
  const Rated turbines = rate_guarantee_example("back-pressure-turbine.json");
  REQUIRE(turbines.cases[0].guarantee);
  CHECK_FALSE(charts::has_guarantee_chart(*turbines.cases[0].guarantee));
  try {
    charts::make_guarantee_chart(turbines.cases[0], {});
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(std::string(e.what()) ==
          "case \"T-4 back-pressure turbine, acceptance run\": no guarantee chart: a turbine's guarantee is read at "
          "one flow");
  }
  const Rated pumps = rate_guarantee_example("pump-test-stand-grade-2b.json");
  try {
    charts::make_guarantee_chart(pumps.cases[0], {});
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(std::string(e.what()) == "case \"P-12 stand test, point 1\": no guarantee chart: no guarantee was judged");
  }
}

TEST_CASE("every format puts a test point, the reading and the guarantee where the axis mapping says") {
  const fs::path dir = scratch();
  const Rated fail = rate_guarantee_example("pump-test-stand-grade-1b.json");
  const Rated pass = rate_guarantee_example("pump-test-stand-grade-2b.json");
  const Rated air = rate_guarantee_example("plant-air-97-percent-speed.json");
  for (const io::TestOutcome* t : {&fail.test, &pass.test, &air.test}) {
    const charts::GuaranteeChart chart = charts::make_guarantee_chart(*t, {});
    const std::vector<charts::Axes> axes = charts::guarantee_axes(chart, charts::kChartPage);
    REQUIRE(axes.size() == 2);
    for (const char* ext : {".png", ".svg", ".pdf"}) {
      const fs::path path = dir / (std::string("guarantee") + ext);
      render(chart, path);
      const Raster raster(rasterise(path));
      INFO(t->origin << " as " << ext);
      REQUIRE(raster.width() == 1080);
      REQUIRE(raster.height() == 720);
      const charts::GuaranteePanel& head = chart.panels[0];
      check_mark(raster, axes[0], head.points[0], charts::kInletColour);
      check_mark(raster, axes[1], chart.panels[1].points.back(), charts::kInletColour);
      check_mark(raster, axes[0], head.read, charts::verdict_colour(*head.verdict));
      check_guarantee_diamond(raster, axes[0], *head.guarantee);
      CHECK(check_bar_caps(raster, axes[0], head) >= 1);
    }
  }
  // The two verdicts in their own colours: vermillion for grade 1B's head, green for 2B's.
  CHECK(charts::verdict_colour(*charts::make_guarantee_chart(fail.test, {}).panels[0].verdict).r == 0xd5);
  CHECK(charts::verdict_colour(*charts::make_guarantee_chart(pass.test, {}).panels[0].verdict).g == 0x9e);
  fs::remove_all(dir);
}

TEST_CASE("the PDF's text holds the verdict, the checks and the axes") {
  const fs::path dir = scratch();
  for (const auto& [name, words] : std::vector<std::pair<std::string, std::vector<std::string>>>{
           {"pump-test-stand-grade-1b.json",
            {"test of pump-test-stand-grade-1b.json", "ISO 9906 grade 1B", "FAIL \u2717", "guarantee not met",
             "volume flow Q [m3/h]", "pump head [m]", "pump efficiency [-]", "tolerance cross",
             "line through the origin", "read on the curve: fail", "read on the curve: pass",
             "39.343 m against 41 m", "-4.04 %, tolerance -3 to +3 %", "0.8120 against 0.8000"}},
           {"pump-test-stand-grade-2b.json", {"PASS \u2713", "guarantee met", "-4.04 %, tolerance -5 to +5 %"}},
           {"plant-air-97-percent-speed.json",
            {"inlet volume flow Q [m3/h]", "polytropic head [kJ/kg]", "210 kPag as a head", "discharge pressure",
             "215.12 kPag against 210 kPag"}}}) {
    const Rated rated = rate_guarantee_example(name);
    render(charts::make_guarantee_chart(rated.test, {}), dir / "g.pdf");
    const std::string text = run("pdftotext -layout '" + (dir / "g.pdf").string() + "' -");
    for (const std::string& w : words) {
      INFO(name << ": " << w);
      CHECK(text.find(w) != std::string::npos);
    }
  }
  fs::remove_all(dir);
}

TEST_CASE("a report's guarantee page: the table, the chart across the page at its scaled mapping, the caution") {
  const Rated fail = rate_guarantee_example("pump-test-stand-grade-1b.json");
  const fs::path path = scratch() / "report.pdf";
  {
    const auto stream = charts::make_report_stream(path.string(), {});
    for (const io::CaseOutcome& o : fail.cases) stream->add(o);
    stream->add_test(fail.test);
    stream->finish();
  }
  const std::string info = run("pdfinfo '" + path.string() + "'");
  CHECK(info.find("Pages:           6\n") != std::string::npos);  // five cases and the test
  const std::string raster_stem = path.string() + ".raster";
  REQUIRE(std::system(("pdftoppm -r 108 -png -f 6 -l 6 -singlefile '" + path.string() + "' '" + raster_stem + "'")
                          .c_str()) == 0);
  const Raster raster(raster_stem + ".png");
  CHECK(raster.width() == 893);
  CHECK(raster.height() == 1263);
  const charts::GuaranteeChart chart = charts::make_guarantee_chart(fail.test, {});
  const charts::ReportChartPlace place = charts::report_guarantee_chart_place();
  for (std::size_t i = 0; i < 2; ++i) {
    charts::Axes axes = charts::guarantee_axes(chart, charts::kChartPage)[i];
    axes.area = {place.x + place.scale * axes.area.x, place.y + place.scale * axes.area.y,
                 place.scale * axes.area.width, place.scale * axes.area.height};
    check_mark(raster, axes, chart.panels[i].points[0], charts::kInletColour);
    check_mark(raster, axes, chart.panels[i].points[4], charts::kInletColour);
  }
  const std::string text = run("pdftotext -layout -f 6 -l 6 '" + path.string() + "' -");
  for (const char* words : {"test of pump-test-stand-grade-1b.json", "Guarantee", "guarantee: fail",
                            "tolerance cross: the curve misses both bars", "FAIL \u2717", "Models and sources",
                            "Property model: iapws-if97", "docs/guarantee.md", "Caution"}) {
    INFO(words);
    CHECK(text.find(words) != std::string::npos);
  }
  fs::remove_all(path.parent_path());
}

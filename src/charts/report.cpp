// The test report: the layout of a case's A4 page, and the stream that writes the pages.
#include "shaftwork/charts/report.hpp"

#include <filesystem>
#include <sstream>
#include <vector>

#include <fmt/format.h>

#include "shaftwork/charts/document.hpp"
#include "shaftwork/charts/guarantee_chart.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/atomic_file.hpp"
#include "cairo_api.hpp"

namespace shaftwork::charts {
namespace {

const Rect& kBody = kReportBody;
constexpr double kFooterHeight = 112;  // models, sources and the caution
constexpr double kTopOfMiddle = 112;   // below the header
constexpr double kLargestText = 8, kSmallestText = 5, kNarrowestText = 6;
constexpr double kLeading = 1.22;      // line spacing over the text size

// What the middle of a page says: the given values, the table, the warnings (or the error).
struct Middle {
  std::vector<std::string> given;    // "inlet.pressure = -1.8 kPag"
  std::vector<std::string> table;    // the table's lines, warnings apart
  std::vector<std::string> notes;    // warnings, or the error of a case that was not rated
  std::string notes_title;
  std::string table_title = "Rated";
};

// The lines of a table writer, from the `skip`-th on, empty ones and warnings left out.
template <class Write>
std::vector<std::string> table_lines(Write write, std::size_t skip) {
  std::ostringstream table;
  write(table);
  std::istringstream lines(table.str());
  std::vector<std::string> out;
  std::string line;
  for (std::size_t n = 0; std::getline(lines, line); ++n) {
    if (n >= skip && line.rfind("  warning: ", 0) != 0 && !line.empty()) out.push_back(line);
  }
  return out;
}

Middle middle_of(const io::CaseOutcome& o, const ReportOptions& options) {
  Middle m;
  if (o.input) {
    for (const io::GivenValue& g : o.input->given) {
      std::string text = fmt::format("{} = {}", machines::key_of(g.input), g.written);
      if (g.uncertainty) text += fmt::format(" (U {})", g.uncertainty->written);
      m.given.push_back(std::move(text));
    }
  }
  if (o.ok()) {
    // From the second line: the first is the case's id, the page's title.
    m.table = table_lines([&](std::ostream& out) { io::write_case_table(out, o, options.table); }, 1);
    m.notes = o.warnings;
    m.notes_title = "Warnings";
  } else {
    m.notes = {o.error};
    m.notes_title = "Not rated";
  }
  return m;
}

// The lines of the middle at text size `size`, each with its face; their height.
struct Line {
  std::string text;
  enum class Face { heading, plain, mono } face = Face::plain;
};

// A mono line wider than the body broken at spaces, each rest indented under it.
std::vector<std::string> break_mono(cairo_t* cr, const std::string& text, double size) {
  constexpr std::size_t kIndent = 8;
  const auto fit = static_cast<std::size_t>(kBody.width / text_width(cr, "0", size, false, true));
  std::vector<std::string> out;
  std::string rest = text;
  while (rest.size() > fit && fit > kIndent) {
    std::size_t cut = rest.find_last_of(' ', fit);
    if (cut == std::string::npos || cut <= rest.find_first_not_of(' ')) cut = fit;  // no space: cut the word
    out.push_back(rest.substr(0, cut));
    const std::size_t next = rest.find_first_not_of(' ', cut);
    rest = std::string(kIndent, ' ') + (next == std::string::npos ? "" : rest.substr(next));
  }
  out.push_back(rest);
  return out;
}

// `wrap`: mono lines that do not fit are broken (at the smallest size, as the last resort).
std::vector<Line> lay_out(cairo_t* cr, const Middle& m, double size, bool wrap = false) {
  std::vector<Line> lines;
  const auto paragraph = [&](const std::string& text) {
    for (std::string& l : wrap_text(cr, text, size, kBody.width)) lines.push_back({std::move(l), Line::Face::plain});
  };
  if (!m.given.empty()) {
    lines.push_back({"Given values, as written", Line::Face::heading});
    std::string flow;
    for (const std::string& g : m.given) flow += (flow.empty() ? "" : ";  ") + g;
    paragraph(flow);
  }
  if (!m.table.empty()) {
    lines.push_back({m.table_title, Line::Face::heading});
    for (const std::string& t : m.table) {
      for (std::string& l : wrap ? break_mono(cr, t, size) : std::vector{t}) lines.push_back({std::move(l), Line::Face::mono});
    }
  }
  if (!m.notes.empty()) {
    lines.push_back({m.notes_title, Line::Face::heading});
    for (const std::string& n : m.notes) paragraph(n);
  }
  return lines;
}

double height_of(const std::vector<Line>& lines, double size) {
  double h = 0;
  for (const Line& l : lines) h += size * kLeading + (l.face == Line::Face::heading ? 5 : 0);
  return h;
}

// The widest mono line at `size` fits the body's width.
bool fits_across(cairo_t* cr, const std::vector<Line>& lines, double size) {
  for (const Line& l : lines) {
    if (l.face == Line::Face::mono && text_width(cr, l.text, size, false, true) > kBody.width) return false;
  }
  return true;
}

void draw_middle(cairo_t* cr, const Middle& m, double top, double bottom) {
  double size = kLargestText;
  std::vector<Line> lines = lay_out(cr, m, size);
  // Smaller for a long table down to kSmallestText; for a wide one down to kNarrowestText,
  // then its widest lines are broken.
  while (size > kSmallestText && (height_of(lines, size) > bottom - top ||
                                  (size > kNarrowestText && !fits_across(cr, lines, size)))) {
    size -= 0.25;
    lines = lay_out(cr, m, size);
  }
  if (!fits_across(cr, lines, size)) lines = lay_out(cr, m, size, true);
  double y = top;
  for (const Line& l : lines) {
    if (l.face == Line::Face::heading) y += 5;
    y += size * kLeading;
    if (y > bottom) break;  // the smallest text and still too long: the rest is in the results
    if (l.face == Line::Face::mono) {
      draw_mono_text(cr, {kBody.x, y}, l.text, size);
    } else {
      draw_text(cr, {kBody.x, y}, l.text, l.face == Line::Face::heading ? size + 1.5 : size, Align::left,
                l.face == Line::Face::heading);
    }
  }
}

void draw_header(cairo_t* cr, const std::string& title, const std::string& what) {
  draw_text(cr, {kBody.x, kBody.y}, "Test report", 8, Align::left, false, kFaint);
  draw_text(cr, {kBody.x + kBody.width, kBody.y}, "shaftwork 0.1.0", 8, Align::right, false, kFaint);
  const FittedText big = fit_text(cr, title, 14, 10, kBody.width, true);
  draw_text(cr, {kBody.x, kBody.y + 20}, big.text, big.size, Align::left, true);
  const FittedText small = fit_text(cr, what, 9, 7, kBody.width);
  draw_text(cr, {kBody.x, kBody.y + 36}, small.text, small.size);
  stroke_line(cr, {{kBody.x, kBody.y + 44}, {kBody.x + kBody.width, kBody.y + 44}}, kFaint, 0.6);
}

// What a case is: "compressor on air, from FILE".
std::string what_of(const io::CaseOutcome& o) {
  if (!o.input) return o.origin;
  return fmt::format("{} on {}{}", o.input->machine_written, o.input->fluid_label,
                     o.origin.empty() ? "" : fmt::format(", from {}", o.origin));
}

std::string model_text(const std::optional<io::CaseInput>& input) {
  if (!input || !input->fluid) return "";
  return fmt::format("Property model: {}: {}.", input->fluid->model_name(), input->fluid->description());
}

// The models and sources (`text`, one paragraph each), then the caution.
void draw_footer(cairo_t* cr, const std::vector<std::string>& text) {
  double y = kBody.y + kBody.height - kFooterHeight;
  stroke_line(cr, {{kBody.x, y}, {kBody.x + kBody.width, y}}, kFaint, 0.6);
  y += 14;
  draw_text(cr, {kBody.x, y}, "Models and sources", 9.5, Align::left, true);
  for (const std::string& t : text) {
    if (t.empty()) continue;
    for (const std::string& l : wrap_text(cr, t, 7.5, kBody.width)) draw_text(cr, {kBody.x, y += 9.5}, l, 7.5);
  }
  y += 15;
  draw_text(cr, {kBody.x, y}, "Caution", 9.5, Align::left, true);
  for (const std::string& l : wrap_text(cr, kCautionText, 7.5, kBody.width)) draw_text(cr, {kBody.x, y += 9.5}, l, 7.5);
}

constexpr const char* kRatingMethod =
    "Method: the steady-flow energy balance; the isentropic outlet h(p2, s1); the polytropic efficiency by the path "
    "integral of v dp (shaftwork's docs/method.md).";

// The guarantee's method and where its figures come from.
std::string guarantee_method(const machines::GuaranteeResult& g) {
  return fmt::format("Guarantee: {} (shaftwork's docs/guarantee.md, which names the test codes and the figures "
                     "carried from memory{}).",
                     g.method, g.grade ? ", ISO 9906:2012's grades among them" : "");
}

void draw_chart(cairo_t* cr, const io::CaseOutcome& o, const ReportOptions& options) {
  const ReportChartPlace place = report_chart_place();
  try {
    const ProcessChart chart = make_process_chart(o, options.chart);
    cairo_api().save(cr);
    cairo_api().translate(cr, place.x, place.y);
    cairo_api().scale(cr, place.scale, place.scale);
    draw_process_chart(cr, chart, kChartPage);
    cairo_api().restore(cr);
  } catch (const Error& e) {
    draw_text(cr, {kBody.x, place.y + 20}, fmt::format("No chart: {}", e.what()).substr(0, 120), 8, Align::left, false,
              kOutletColour);
  }
}

// A guarantee page: the guarantee's table (or why it was not judged), its chart when there
// is one, its method and the caution.
struct GuaranteePage {
  std::string title, what;
  Middle middle;
  std::optional<GuaranteeChart> chart;
  std::vector<std::string> sources;
};

void draw_guarantee_page(cairo_t* cr, const GuaranteePage& page) {
  draw_header(cr, page.title, page.what);
  const ReportChartPlace place = report_guarantee_chart_place();
  const double bottom = page.chart ? place.y : kBody.y + kBody.height - kFooterHeight - 8;
  draw_middle(cr, page.middle, kBody.y + kTopOfMiddle - 60, bottom);
  if (page.chart) {
    cairo_api().save(cr);
    cairo_api().translate(cr, place.x, place.y);
    cairo_api().scale(cr, place.scale, place.scale);
    draw_guarantee_chart(cr, *page.chart, kChartPage);
    cairo_api().restore(cr);
  }
  draw_footer(cr, page.sources);
}

GuaranteePage case_guarantee_page(const io::CaseOutcome& o, const ReportOptions& options) {
  GuaranteePage page{o.id, "", {}, make_guarantee_chart(o, options.chart), {}};
  page.what = page.chart->subtitle;
  page.middle.table_title = "Guarantee";
  page.middle.table = table_lines(
      [&](std::ostream& out) {
        io::write_guarantee_table(out, *o.guarantee,
                                  io::DisplayUnits(options.table.system, options.table.system_forced, &*o.input, *o.rating));
      },
      0);
  page.sources = {model_text(o.input), guarantee_method(*o.guarantee)};
  return page;
}

GuaranteePage test_page(const io::TestOutcome& t, const ReportOptions& options) {
  GuaranteePage page{fmt::format("test of {}", std::filesystem::path(t.origin).filename().string()),
                     fmt::format("{} test points, from {}", t.points.size(), t.origin), {}, {}, {}};
  page.middle.table_title = "Guarantee";
  if (t.result) {
    if (has_guarantee_chart(*t.result)) {
      page.chart = make_guarantee_chart(t, options.chart);
      page.what = fmt::format("{}, from {}", page.chart->subtitle, t.origin);
    }
    page.middle.table = table_lines([&](std::ostream& out) { io::write_test_table(out, t, options.table); }, 1);
    page.middle.notes = t.warnings;
    page.middle.notes_title = "Warnings";
    page.sources = {model_text(t.units_from), guarantee_method(*t.result)};
  } else {
    page.middle.notes = {t.error};
    page.middle.notes.insert(page.middle.notes.end(), t.warnings.begin(), t.warnings.end());
    page.middle.notes_title = "Not judged";
    page.sources = {model_text(t.units_from)};
  }
  return page;
}

class ReportStream final : public io::ResultStream {
 public:
  ReportStream(const std::string& path, const ReportOptions& options)
      : options_(options), file_(path), document_(ImageFormat::pdf, file_, kA4Width, kA4Height) {}
  void add(const io::CaseOutcome& o) override {
    draw_report_page(document_.begin_page(), o, options_);
    end_page();
    if (o.ok() && o.guarantee && has_guarantee_chart(*o.guarantee)) draw(case_guarantee_page(o, options_));
  }
  void add_test(const io::TestOutcome& t) override { draw(test_page(t, options_)); }
  void finish() override {
    document_.finish();
    if (pages_ > 0) file_.commit();  // no case at all: no file
  }

 private:
  void draw(const GuaranteePage& page) {
    draw_guarantee_page(document_.begin_page(), page);
    end_page();
  }
  void end_page() {
    document_.end_page();
    ++pages_;
  }

  ReportOptions options_;
  io::OutputFile file_;
  Document document_;
  int pages_ = 0;
};

}  // namespace

namespace {

// A chart drawn into kChartPage at `scale`, centred across the body, just above the footer.
ReportChartPlace chart_place(double scale) {
  const double width = kChartPage.width * scale, height = kChartPage.height * scale;
  return {kBody.x + (kBody.width - width) / 2, kBody.y + kBody.height - kFooterHeight - height - 4, scale};
}

}  // namespace

ReportChartPlace report_chart_place() { return chart_place(kReportChartScale); }
ReportChartPlace report_guarantee_chart_place() { return chart_place(kBody.width / kChartPage.width); }

void draw_report_page(cairo_t* cr, const io::CaseOutcome& o, const ReportOptions& options) {
  draw_header(cr, o.id, what_of(o));
  const bool chart = o.ok();
  const double bottom = chart ? report_chart_place().y : kBody.y + kBody.height - kFooterHeight - 8;
  draw_middle(cr, middle_of(o, options), kBody.y + kTopOfMiddle - 60, bottom);
  if (chart) draw_chart(cr, o, options);
  draw_footer(cr, {model_text(o.input), kRatingMethod});
}

std::unique_ptr<io::ResultStream> make_report_stream(const std::string& path, const ReportOptions& options) {
  if (image_format_of(path) != ImageFormat::pdf) {
    throw Error(ErrorKind::bad_input, fmt::format("{}: a report is written as .pdf", path));
  }
  return std::make_unique<ReportStream>(path, options);
}

}  // namespace shaftwork::charts

// The test report: the layout of a case's A4 page, and the stream that writes the pages.
#include "shaftwork/charts/report.hpp"

#include <sstream>
#include <vector>

#include <fmt/format.h>

#include "shaftwork/charts/document.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/atomic_file.hpp"

namespace shaftwork::charts {
namespace {

const Rect& kBody = kReportBody;
constexpr double kFooterHeight = 112;  // models, sources and the caution
constexpr double kTopOfMiddle = 112;   // below the header
constexpr double kLargestText = 8, kSmallestText = 5;
constexpr double kLeading = 1.22;      // line spacing over the text size

// What the middle of a page says: the given values, the table, the warnings (or the error).
struct Middle {
  std::vector<std::string> given;    // "inlet.pressure = -1.8 kPag"
  std::vector<std::string> table;    // the table's lines, warnings apart
  std::vector<std::string> notes;    // warnings, or the error of a case that was not rated
  std::string notes_title;
};

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
    std::ostringstream table;
    io::write_case_table(table, o, options.table);
    std::istringstream lines(table.str());
    std::string line;
    std::getline(lines, line);  // the case's id: the page's title
    while (std::getline(lines, line)) {
      if (line.rfind("  warning: ", 0) != 0 && !line.empty()) m.table.push_back(line);
    }
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

std::vector<Line> lay_out(cairo_t* cr, const Middle& m, double size) {
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
    lines.push_back({"Rated", Line::Face::heading});
    for (const std::string& t : m.table) lines.push_back({t, Line::Face::mono});
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
  while (size > kSmallestText && (height_of(lines, size) > bottom - top || !fits_across(cr, lines, size))) {
    size -= 0.25;
    lines = lay_out(cr, m, size);
  }
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

void draw_header(cairo_t* cr, const io::CaseOutcome& o) {
  draw_text(cr, {kBody.x, kBody.y}, "Test report", 8, Align::left, false, kFaint);
  draw_text(cr, {kBody.x + kBody.width, kBody.y}, "shaftwork 0.1.0", 8, Align::right, false, kFaint);
  draw_text(cr, {kBody.x, kBody.y + 20}, o.id, 14, Align::left, true);
  std::string what = o.origin;
  if (o.input) {
    what = fmt::format("{} on {}{}", o.input->machine_written, o.input->fluid_label,
                       o.origin.empty() ? "" : fmt::format(", from {}", o.origin));
  }
  draw_text(cr, {kBody.x, kBody.y + 36}, what, 9);
  stroke_line(cr, {{kBody.x, kBody.y + 44}, {kBody.x + kBody.width, kBody.y + 44}}, kFaint, 0.6);
}

void draw_footer(cairo_t* cr, const io::CaseOutcome& o) {
  double y = kBody.y + kBody.height - kFooterHeight;
  stroke_line(cr, {{kBody.x, y}, {kBody.x + kBody.width, y}}, kFaint, 0.6);
  y += 14;
  draw_text(cr, {kBody.x, y}, "Models and sources", 9.5, Align::left, true);
  std::vector<std::string> text;
  if (o.input && o.input->fluid) {
    text.push_back(fmt::format("Property model: {}: {}.", o.input->fluid->model_name(), o.input->fluid->description()));
  }
  text.push_back("Method: the steady-flow energy balance; the isentropic outlet h(p2, s1); the polytropic efficiency "
                 "by the path integral of v dp (shaftwork's docs/method.md).");
  for (const std::string& t : text) {
    for (const std::string& l : wrap_text(cr, t, 7.5, kBody.width)) draw_text(cr, {kBody.x, y += 9.5}, l, 7.5);
  }
  y += 15;
  draw_text(cr, {kBody.x, y}, "Caution", 9.5, Align::left, true);
  for (const std::string& l : wrap_text(cr, kCautionText, 7.5, kBody.width)) draw_text(cr, {kBody.x, y += 9.5}, l, 7.5);
}

void draw_chart(cairo_t* cr, const io::CaseOutcome& o, const ReportOptions& options) {
  const ReportChartPlace place = report_chart_place();
  try {
    const ProcessChart chart = make_process_chart(o, options.chart);
    cairo_save(cr);
    cairo_translate(cr, place.x, place.y);
    cairo_scale(cr, place.scale, place.scale);
    draw_process_chart(cr, chart, kChartPage);
    cairo_restore(cr);
  } catch (const Error& e) {
    draw_text(cr, {kBody.x, place.y + 20}, fmt::format("No chart: {}", e.what()).substr(0, 120), 8, Align::left, false,
              kOutletColour);
  }
}

class ReportStream final : public io::ResultStream {
 public:
  ReportStream(const std::string& path, const ReportOptions& options)
      : options_(options), file_(path), document_(ImageFormat::pdf, file_, kA4Width, kA4Height) {}
  void add(const io::CaseOutcome& o) override {
    draw_report_page(document_.begin_page(), o, options_);
    document_.end_page();
    ++pages_;
  }
  void finish() override {
    document_.finish();
    if (pages_ > 0) file_.commit();  // no case at all: no file
  }

 private:
  ReportOptions options_;
  io::OutputFile file_;
  Document document_;
  int pages_ = 0;
};

}  // namespace

ReportChartPlace report_chart_place() {
  const double width = kChartPage.width * kReportChartScale, height = kChartPage.height * kReportChartScale;
  return {kBody.x + (kBody.width - width) / 2, kBody.y + kBody.height - kFooterHeight - height - 4, kReportChartScale};
}

void draw_report_page(cairo_t* cr, const io::CaseOutcome& o, const ReportOptions& options) {
  draw_header(cr, o);
  const bool chart = o.ok();
  const double bottom = chart ? report_chart_place().y : kBody.y + kBody.height - kFooterHeight - 8;
  draw_middle(cr, middle_of(o, options), kBody.y + kTopOfMiddle - 60, bottom);
  if (chart) draw_chart(cr, o, options);
  draw_footer(cr, o);
}

std::unique_ptr<io::ResultStream> make_report_stream(const std::string& path, const ReportOptions& options) {
  if (image_format_of(path) != ImageFormat::pdf) {
    throw Error(ErrorKind::bad_input, fmt::format("{}: a report is written as .pdf", path));
  }
  return std::make_unique<ReportStream>(path, options);
}

}  // namespace shaftwork::charts

// shaftwork/charts/report.hpp — `--report FILE.pdf`: a test report, one A4 page per case.
//
// A page holds the case's id and what it is, its given values as written, the rated table
// (the lines `rate` prints for it, warnings apart), its warnings, its process chart, the
// property model and sources the numbers rest on, and the caution. A case that could not be
// rated gets its page too, with its error in place of the table and chart. A guarantee
// judged on a curve (charts/guarantee_chart.hpp) gets a page of its own after its case's:
// the guarantee's table, its chart across the page, its method and the caution; a file's
// test gets one after the file's cases (with its table, or why it was not judged, and its
// chart when it has one).
//
// The page is A4 (ISO 216: 210 x 297 mm, 595.28 x 841.89 pt) with margins that also fit US
// Letter (8.5 x 11 in, 612 x 792 pt) printed at actual size: Letter is 49.9 pt shorter, so
// centred it loses 25 pt at top and bottom, and 60 pt top and bottom margins keep every line
// 35 pt (12 mm) inside a Letter sheet, clear of a printer's unprintable edge; A4 is the
// narrower sheet, so 48 pt at the sides holds on both.
#pragma once

#include <memory>
#include <string>

#include <cairo.h>

#include "shaftwork/charts/process_chart.hpp"
#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::charts {

inline constexpr double kA4Width = 595.28, kA4Height = 841.89;
inline constexpr Rect kReportBody{48, 60, kA4Width - 96, kA4Height - 120};

// The caution every page ends with (README's "Caution").
inline constexpr const char* kCautionText =
    "shaftwork's numbers support, and never replace, the governing test codes (ASME PTC 10, PTC 6, PTC 8.2, "
    "ISO 5389, ISO 9906 and the like), the maker's guarantee terms, local codes and licensed engineering "
    "practice. Check instrument uncertainty and the machine's limits (pressure, speed, temperature, surge) "
    "before acting on a result.";

struct ReportOptions {
  io::TableOptions table;     // the table's units, as on standard output
  ProcessChartOptions chart;  // h-s or T-s, and units
};

// Where a page puts its process chart: the chart is drawn into kChartPage and scaled by
// `scale` to sit at (x, y) on the page.
struct ReportChartPlace {
  double x = 0, y = 0, scale = 1;
};
inline constexpr double kReportChartScale = 0.62;
ReportChartPlace report_chart_place();
// Where a guarantee page puts its guarantee chart: across the body's width.
ReportChartPlace report_guarantee_chart_place();

// One case's page, drawn on `cr` in points of an A4 page.
void draw_report_page(cairo_t* cr, const io::CaseOutcome& outcome, const ReportOptions& options);

// The report as a result stream: a page per case added, FILE written whole at finish (or
// not at all: io::OutputFile). Throws bad_input at once for a name that does not end in .pdf.
std::unique_ptr<io::ResultStream> make_report_stream(const std::string& path, const ReportOptions& options);

}  // namespace shaftwork::charts

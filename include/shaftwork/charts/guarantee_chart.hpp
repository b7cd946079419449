// shaftwork/charts/guarantee_chart.hpp — the picture of a guarantee judged on its test points.
//
// Drawn from what machines::judge() read (GuaranteeResult::readings), converted only to
// display units: per panel, a quantity of the converted test points against flow, the curve
// the judge read (least squares for pumps, straight lines between neighbours for
// compressors, across the flows it may be read at: kExtrapolationLimit beyond the points),
// the guarantee point with its tolerance, and the value read there, marked by colour, mark
// and word (pass: green square; inconclusive: orange triangle; fail: vermillion X).
//   pumps (ISO 9906:2012)  H(Q) above, with the tolerance cross around (Q_G, H_G) and the
//                          line through the origin and (Q_G, H_G); eta(Q) below, read where
//                          that line meets H(Q) (a dotted line through both panels);
//   compressors            polytropic head and efficiency (or the isentropic one, when only
//                          that is guaranteed) against inlet volume flow, read at Q_G; a
//                          guaranteed discharge pressure shows as the head it asks for.
// Turbines have no guarantee chart: their guarantee is read at one flow, not on a curve.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include <cairo.h>

#include "shaftwork/charts/axes.hpp"
#include "shaftwork/charts/process_chart.hpp"
#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::charts {

// One quantity against flow, in display units (x flow, y the quantity).
struct GuaranteePanel {
  std::string y_title;  // "pump head [m]"
  double y_low = 0, y_high = 1;
  std::vector<Point> points;        // the converted test points
  std::vector<Point> curve;         // the curve through them
  std::optional<Point> guarantee;   // (Q_G, the guaranteed value)
  std::string guarantee_note;       // how the guarantee came to this quantity, when not as itself
  Point read;                       // where the judge read the curve, and what it read
  // The tolerance, a bar at read.x from low to high (an open side reaches the frame).
  std::optional<double> low, high;
  bool tolerance = false;                    // the bar is drawn
  std::optional<machines::Verdict> verdict;  // of the check decided here
};

// A check as the legend lists it.
struct GuaranteeCheckLine {
  std::string label;   // "pump head"
  std::string values;  // "39.343 m against 41 m"
  std::string deviation;  // "-4.04 %, tolerance -3 to +3 %"
  machines::Verdict verdict = machines::Verdict::pass;
};

struct GuaranteeChart {
  std::string title;     // the case's id, or "test of FILE"
  std::string subtitle;  // machine, fluid, grade
  std::string x_title;
  double x_low = 0, x_high = 1;
  double guaranteed_flow = 0;
  machines::Verdict verdict = machines::Verdict::pass;
  std::vector<GuaranteePanel> panels;  // the head first, then the efficiency
  // Pumps with a guaranteed head: the tolerance cross's flow bar at H_G on the first panel
  // (an open side reaches the frame), and the line through the origin and (Q_G, H_G).
  bool cross = false;
  std::optional<double> flow_low, flow_high;
  std::optional<Point> flow_read;  // where H(Q) meets H_G: the flow the cross's flow bar judged
  std::optional<double> eta_read_flow;  // pumps: where the efficiency was read (the dotted line)
  std::vector<GuaranteeCheckLine> checks;
  std::string method;
};

// A result the chart can be drawn of: pumps and compressors (readings from judge()).
bool has_guarantee_chart(const machines::GuaranteeResult& g);

// The chart of a case's own guarantee, or of a file's test. Throws bad_input
// "case \"ID\": no guarantee chart: ..." (or "test of FILE: ...") when there is none to
// draw: no guarantee judged, or a turbine's. Units as the process chart's (options.system).
GuaranteeChart make_guarantee_chart(const io::CaseOutcome& outcome, const ProcessChartOptions& options);
GuaranteeChart make_guarantee_chart(const io::TestOutcome& test, const ProcessChartOptions& options);

// Where each panel lies on a page region `frame` (points), with its data window: the
// mapping its marks are drawn with.
std::vector<Axes> guarantee_axes(const GuaranteeChart& chart, const Rect& frame);

// The verdict's mark and colour, and its word: "pass", "inconclusive", "fail".
Mark verdict_mark(machines::Verdict v);
Colour verdict_colour(machines::Verdict v);

// Draws the chart into `frame` (kChartPage is its own page size).
void draw_guarantee_chart(cairo_t* cr, const GuaranteeChart& chart, const Rect& frame);

}  // namespace shaftwork::charts

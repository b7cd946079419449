// shaftwork/charts/process_chart.hpp — the picture of one rated case's process.
//
// An h-s diagram (or T-s): the inlet, the isentropic outlet h(p2, s1) and the actual
// outlet as marks; the polytropic path as a curve sampled at intermediate pressures
// p_k = p1 (p2/p1)^(k/n) with machines::polytropic_outlet_enthalpy (the same integral the
// rating used, so the curve ends on the outlet); the isobars p1 and p2; for IAPWS-IF97 the
// saturation line and lines of constant quality. Axes in the case's display units
// (io::DisplayUnits); enthalpy and entropy on the model's own reference state. A legend
// names the marks and gives the main results.
#pragma once

#include <string>
#include <utility>
#include <vector>

#include <cairo.h>

#include "shaftwork/charts/axes.hpp"
#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::charts {

enum class Diagram { enthalpy_entropy, temperature_entropy };

struct ProcessChartOptions {
  Diagram diagram = Diagram::enthalpy_entropy;
  io::UnitSystem system = io::UnitSystem::si;
  bool system_forced = false;  // --units given: it wins over the case's own units
};

// A labelled line in data coordinates (display units).
struct Curve {
  std::vector<Point> points;
  std::string label;
};

// What the chart shows, in display units: x is entropy, y enthalpy or temperature.
struct ProcessChart {
  std::string title;     // the case id
  std::string subtitle;  // machine, fluid, model
  std::string x_title, y_title;
  double x_low = 0, x_high = 1, y_low = 0, y_high = 1;  // the plotted window
  Point inlet, outlet, outlet_isentropic;
  Curve path;                  // the polytropic path, inlet to outlet (empty when it could not be traced)
  std::vector<Curve> isobars;  // p1, p2
  Curve saturation;            // the saturation line, liquid side to vapour side (steam only)
  std::vector<Curve> qualities;  // lines of constant quality (steam only)
  std::vector<std::pair<std::string, std::string>> numbers;  // legend: label, value with unit
  std::vector<std::string> notes;  // what could not be drawn, and why
};

// The chart of a rated case. Throws bad_input "case \"ID\": no chart: the case was not rated"
// for a failed case, or one read without its input.
ProcessChart make_process_chart(const io::CaseOutcome& outcome, const ProcessChartOptions& options);

// Where a process chart's plot area lies on a page region `frame` (points), with its
// data window: the mapping its marks are drawn with.
Axes process_axes(const ProcessChart& chart, const Rect& frame);

// Draws the chart into `frame` (its title, plot and legend; 720 x 480 points is its own
// page size, kChartPage).
void draw_process_chart(cairo_t* cr, const ProcessChart& chart, const Rect& frame);

}  // namespace shaftwork::charts

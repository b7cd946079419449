// Drawing a process chart: plot area on the left, legend and results on the right.
#include <algorithm>

#include "shaftwork/charts/process_chart.hpp"
#include "cairo_api.hpp"

namespace shaftwork::charts {
namespace {

constexpr double kLegendWidth = 205;

bool inside(const ProcessChart& c, Point p) {
  return p.x >= c.x_low && p.x <= c.x_high && p.y >= c.y_low && p.y <= c.y_high;
}

// The points of a curve inside the window, for placing its label.
std::vector<Point> visible(const ProcessChart& chart, const std::vector<Point>& points) {
  std::vector<Point> in;
  std::copy_if(points.begin(), points.end(), std::back_inserter(in), [&](Point p) { return inside(chart, p); });
  return in;
}

void draw_steam_lines(cairo_t* cr, const ProcessChart& chart, const Axes& axes) {
  for (const Curve& q : chart.qualities) {
    stroke_line(cr, axes.page(q.points), kFaint, 1.0, Dash::dotted);
    const std::vector<Point> in = visible(chart, q.points);
    if (in.size() < 2) continue;
    const Point at = axes.page(in[in.size() / 2]);
    draw_text(cr, {at.x + 3, at.y - 3}, q.label, 7.5, Align::left, false, kFaint);
  }
  stroke_line(cr, axes.page(chart.saturation.points), kInk, 1.6);
}

void draw_isobars(cairo_t* cr, const ProcessChart& chart, const Axes& axes) {
  for (const Curve& c : chart.isobars) {
    stroke_line(cr, axes.page(c.points), kFaint, 1.0, Dash::dashed);
    const std::vector<Point> in = visible(chart, c.points);
    if (in.empty()) continue;
    // At the isobar's last point in the window, kept inside the plot area.
    const Point at = axes.page(in.back());
    const double y = std::clamp(at.y - 5, axes.area.y + 12, axes.area.y + axes.area.height - 4);
    draw_text(cr, {std::min(at.x, axes.area.x + axes.area.width - 4) - 6, y}, c.label, 8, Align::right, false, kInk);
  }
}

void draw_plot(cairo_t* cr, const ProcessChart& chart, const Axes& axes) {
  draw_axes(cr, axes, chart.x_title, chart.y_title);
  clip_to(cr, axes.area);
  if (!chart.saturation.points.empty()) draw_steam_lines(cr, chart, axes);
  draw_isobars(cr, chart, axes);
  stroke_line(cr, {axes.page(chart.inlet), axes.page(chart.outlet_isentropic)}, kIsentropicColour, 1.2, Dash::dashed);
  stroke_line(cr, axes.page(chart.path.points), kPathColour, 2.4);
  cairo_api().restore(cr);
  // Marks last, on top of every line: the isentropic outlet, the outlet, then the inlet.
  draw_mark(cr, axes.page(chart.outlet_isentropic), Mark::diamond, kIsentropicColour, 10);
  draw_mark(cr, axes.page(chart.outlet), Mark::square, kOutletColour, 10);
  draw_mark(cr, axes.page(chart.inlet), Mark::circle, kInletColour, 10);
}

void draw_legend(cairo_t* cr, const ProcessChart& chart, double x, double y) {
  const Mark circle = Mark::circle, square = Mark::square, diamond = Mark::diamond;
  y = legend_row(cr, x, y, "inlet", kInletColour, Dash::solid, 0, &circle);
  y = legend_row(cr, x, y, "outlet", kOutletColour, Dash::solid, 0, &square);
  y = legend_row(cr, x, y, "isentropic outlet", kIsentropicColour, Dash::solid, 0, &diamond);
  if (!chart.path.points.empty()) y = legend_row(cr, x, y, "polytropic path", kPathColour, Dash::solid, 2.4, nullptr);
  y = legend_row(cr, x, y, "isentropic change", kIsentropicColour, Dash::dashed, 1.2, nullptr);
  y = legend_row(cr, x, y, "isobars p1, p2", kFaint, Dash::dashed, 1.0, nullptr);
  if (!chart.saturation.points.empty()) {
    y = legend_row(cr, x, y, "saturation line", kInk, Dash::solid, 1.6, nullptr);
    y = legend_row(cr, x, y, "constant quality x", kFaint, Dash::dotted, 0.8, nullptr);
  }
  y += 10;
  draw_text(cr, {x, y}, "results", 9, Align::left, true);
  y += 15;
  for (const auto& [label, value] : chart.numbers) {
    draw_text(cr, {x, y}, label, 8.5);
    draw_text(cr, {x + kLegendWidth - 8, y}, value, 8.5, Align::right, true);
    y += 15;
  }
  for (const std::string& note : chart.notes) {
    draw_text(cr, {x, y}, note.substr(0, 60), 7, Align::left, false, kOutletColour);
    y += 11;
  }
}

}  // namespace

Axes process_axes(const ProcessChart& chart, const Rect& frame) {
  Axes axes;
  axes.area = {frame.x + 80, frame.y + 58, frame.width - 80 - kLegendWidth - 24, frame.height - 58 - 50};
  axes.x_low = chart.x_low;
  axes.x_high = chart.x_high;
  axes.y_low = chart.y_low;
  axes.y_high = chart.y_high;
  return axes;
}

void draw_process_chart(cairo_t* cr, const ProcessChart& chart, const Rect& frame) {
  const Axes axes = process_axes(chart, frame);
  draw_text(cr, {frame.x + 20, frame.y + 24}, chart.title, 13, Align::left, true);
  draw_text(cr, {frame.x + 20, frame.y + 41}, chart.subtitle, 9);
  draw_plot(cr, chart, axes);
  draw_legend(cr, chart, axes.area.x + axes.area.width + 18, axes.area.y + 8);
}

}  // namespace shaftwork::charts

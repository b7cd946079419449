// shaftwork/charts/axes.hpp — a plot area and the mapping of data onto it.
//
// The mapping is linear on both axes: a value x in [x_low, x_high] lands at
//   page_x = area.x + (x - x_low) / (x_high - x_low) * area.width
// and y upward from the bottom of the area. Tests use the same mapping to find where a
// mark must be in the picture.
#pragma once

#include <string>
#include <vector>

#include <cairo.h>

#include "shaftwork/charts/document.hpp"
#include "shaftwork/charts/pen.hpp"

namespace shaftwork::charts {

struct Axes {
  Rect area;  // on the page, points
  double x_low = 0, x_high = 1, y_low = 0, y_high = 1;

  double page_x(double x) const { return area.x + (x - x_low) / (x_high - x_low) * area.width; }
  double page_y(double y) const { return area.y + area.height - (y - y_low) / (y_high - y_low) * area.height; }
  Point page(Point data) const { return {page_x(data.x), page_y(data.y)}; }
  std::vector<Point> page(const std::vector<Point>& data) const;
};

// Round values (1, 2 or 5 times a power of ten) spaced so that about `target` of them
// fall in [low, high]; those inside, in order.
std::vector<double> nice_ticks(double low, double high, int target);
// [low, high] widened by `margin` of its span on each side (a span of 0 gets one of its own).
void pad_range(double& low, double& high, double margin);

// A tick of an axis: where, and its label.
struct Tick {
  double at = 0;
  std::string text;
};
// nice_ticks, each labelled with as few decimals as the step needs.
std::vector<Tick> value_ticks(double low, double high, int target);
// Ticks at whole steps of a clock (1, 5, 10, 15, 30 min; 1, 2, 3, 6, 12 h; 1, 2, 7 days),
// the fewest that give at most `target`, on seconds as io::parse_timestamp counts them;
// labelled "03-02 06:00" (month, day, time), or "03-02" for steps of a day and more.
std::vector<Tick> time_ticks(double low, double high, int target);

// The grid, the frame, the tick labels and the two axis titles; the x ticks are
// value_ticks(x_low, x_high, 6) unless given.
void draw_axes(cairo_t* cr, const Axes& axes, const std::string& x_title, const std::string& y_title,
               const std::vector<Tick>* x_ticks = nullptr);
// Restricts drawing to the plot area until cairo_restore.
void clip_to(cairo_t* cr, const Rect& area);

}  // namespace shaftwork::charts

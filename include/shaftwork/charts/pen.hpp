// shaftwork/charts/pen.hpp — the few drawing acts every chart is made of: lines, marks
// and text, on a cairo_t in points. Text is set in DejaVu Sans (Debian's fonts-dejavu-core).
#pragma once

#include <string>
#include <vector>

#include <cairo.h>

#include "shaftwork/charts/palette.hpp"

namespace shaftwork::charts {

struct Point {
  double x = 0, y = 0;
};

enum class Dash { solid, dashed, dotted };
enum class Align { left, centre, right };

void set_colour(cairo_t* cr, Colour c);
// A line through `points` (page coordinates), `width` points wide.
void stroke_line(cairo_t* cr, const std::vector<Point>& points, Colour c, double width, Dash dash = Dash::solid);
// A mark centred on `at`, `size` points across.
void draw_mark(cairo_t* cr, Point at, Mark mark, Colour c, double size = 9);
// The outline of a mark alone, `width` points wide, nothing filled (what lies under it shows).
void draw_open_mark(cairo_t* cr, Point at, Mark mark, Colour c, double size, double width);
// Text with its baseline at `at.y`; returns its width in points.
double draw_text(cairo_t* cr, Point at, const std::string& text, double size, Align align = Align::left,
                 bool bold = false, Colour c = kInk);
// Text in DejaVu Sans Mono (a table's columns), baseline at `at.y`.
void draw_mono_text(cairo_t* cr, Point at, const std::string& text, double size);
// The width `text` takes, in points.
double text_width(cairo_t* cr, const std::string& text, double size, bool bold = false, bool mono = false);
// `text` broken at spaces into lines no wider than `width` (a word wider than that stands alone).
std::vector<std::string> wrap_text(cairo_t* cr, const std::string& text, double size, double width);
// `text` made to fit `width`: its size lowered in half points down to `smallest`, then, if
// still too wide, its middle replaced by an ellipsis (a line keeps its start and a path its
// file name).
struct FittedText {
  std::string text;
  double size;
};
FittedText fit_text(cairo_t* cr, const std::string& text, double size, double smallest, double width,
                    bool bold = false);
// The same turned a quarter to the left (an axis title), centred on `at`.
void draw_vertical_text(cairo_t* cr, Point at, const std::string& text, double size);

// One row of a legend at (x, y): a sample of the mark (when `mark` is given) or of the line,
// then its text. Returns the next row's y.
double legend_row(cairo_t* cr, double x, double y, const std::string& text, Colour c, Dash dash, double width,
                  const Mark* mark);

}  // namespace shaftwork::charts

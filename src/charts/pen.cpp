#include "shaftwork/charts/pen.hpp"

#include <cmath>

#include "cairo_api.hpp"

namespace shaftwork::charts {

void set_colour(cairo_t* cr, Colour c) { cairo_api().set_source_rgb(cr, c.r / 255.0, c.g / 255.0, c.b / 255.0); }

void stroke_line(cairo_t* cr, const std::vector<Point>& points, Colour c, double width, Dash dash) {
  if (points.size() < 2) return;
  cairo_api().save(cr);
  set_colour(cr, c);
  cairo_api().set_line_width(cr, width);
  cairo_api().set_line_join(cr, CAIRO_LINE_JOIN_ROUND);
  const double dashed[] = {6 * width / 1.5 + 2, 3 * width / 1.5 + 1.5};
  const double dotted[] = {0.1, 2.2 * width + 1};
  if (dash == Dash::dashed) cairo_api().set_dash(cr, dashed, 2, 0);
  if (dash == Dash::dotted) {
    cairo_api().set_line_cap(cr, CAIRO_LINE_CAP_ROUND);
    cairo_api().set_dash(cr, dotted, 2, 0);
  }
  cairo_api().move_to(cr, points[0].x, points[0].y);
  for (std::size_t i = 1; i < points.size(); ++i) cairo_api().line_to(cr, points[i].x, points[i].y);
  cairo_api().stroke(cr);
  cairo_api().restore(cr);
}

namespace {

// An X of two bars, each 0.7 r wide, reaching 1.45 r from the centre along the diagonals.
void cross_path(cairo_t* cr, Point at, double r) {
  const double a = 1.45 * r / std::sqrt(2.0), w = 0.35 * r * std::sqrt(2.0);  // arm end, half-width along an axis
  const double xs[] = {0, a - w, a, w, a, a - w, 0, -(a - w), -a, -w, -a, -(a - w)};
  const double ys[] = {-w, -a, -(a - w), 0, a - w, a, w, a, a - w, 0, -(a - w), -a};
  cairo_api().move_to(cr, at.x + xs[0], at.y + ys[0]);
  for (int i = 1; i < 12; ++i) cairo_api().line_to(cr, at.x + xs[i], at.y + ys[i]);
  cairo_api().close_path(cr);
}

void mark_path(cairo_t* cr, Point at, Mark mark, double r) {
  cairo_api().new_path(cr);
  switch (mark) {
    case Mark::circle: cairo_api().arc(cr, at.x, at.y, r, 0, 2 * M_PI); break;
    case Mark::square: cairo_api().rectangle(cr, at.x - 0.85 * r, at.y - 0.85 * r, 1.7 * r, 1.7 * r); break;
    case Mark::diamond:
      cairo_api().move_to(cr, at.x, at.y - 1.2 * r);
      cairo_api().line_to(cr, at.x + 1.2 * r, at.y);
      cairo_api().line_to(cr, at.x, at.y + 1.2 * r);
      cairo_api().line_to(cr, at.x - 1.2 * r, at.y);
      cairo_api().close_path(cr);
      break;
    case Mark::triangle:
      cairo_api().move_to(cr, at.x, at.y - 1.15 * r);
      cairo_api().line_to(cr, at.x + r, at.y + 0.7 * r);
      cairo_api().line_to(cr, at.x - r, at.y + 0.7 * r);
      cairo_api().close_path(cr);
      break;
    case Mark::cross: cross_path(cr, at, r); break;
  }
}

}  // namespace

void draw_mark(cairo_t* cr, Point at, Mark mark, Colour c, double size) {
  cairo_api().save(cr);
  mark_path(cr, at, mark, size / 2);
  set_colour(cr, c);
  cairo_api().fill_preserve(cr);
  cairo_api().set_source_rgb(cr, 1, 1, 1);
  cairo_api().set_line_width(cr, 1.2);
  cairo_api().stroke(cr);
  cairo_api().restore(cr);
}

void draw_open_mark(cairo_t* cr, Point at, Mark mark, Colour c, double size, double width) {
  cairo_api().save(cr);
  mark_path(cr, at, mark, size / 2);
  set_colour(cr, c);
  cairo_api().set_line_width(cr, width);
  cairo_api().set_line_join(cr, CAIRO_LINE_JOIN_MITER);
  cairo_api().stroke(cr);
  cairo_api().restore(cr);
}

namespace {

void select_font(cairo_t* cr, double size, bool bold, bool mono) {
  cairo_api().select_font_face(cr, mono ? "DejaVu Sans Mono" : "DejaVu Sans", CAIRO_FONT_SLANT_NORMAL,
                         bold ? CAIRO_FONT_WEIGHT_BOLD : CAIRO_FONT_WEIGHT_NORMAL);
  cairo_api().set_font_size(cr, size);
}

}  // namespace

double text_width(cairo_t* cr, const std::string& text, double size, bool bold, bool mono) {
  cairo_api().save(cr);
  select_font(cr, size, bold, mono);
  cairo_text_extents_t extents;
  cairo_api().text_extents(cr, text.c_str(), &extents);
  cairo_api().restore(cr);
  return extents.x_advance;
}

std::vector<std::string> wrap_text(cairo_t* cr, const std::string& text, double size, double width) {
  std::vector<std::string> lines;
  std::string line;
  std::size_t start = 0;
  while (start < text.size()) {
    std::size_t end = text.find(' ', start);
    if (end == std::string::npos) end = text.size();
    const std::string word = text.substr(start, end - start);
    start = end + 1;
    if (word.empty()) continue;
    const std::string longer = line.empty() ? word : line + ' ' + word;
    if (!line.empty() && text_width(cr, longer, size) > width) {
      lines.push_back(line);
      line = word;
    } else {
      line = longer;
    }
  }
  if (!line.empty()) lines.push_back(line);
  return lines;
}

FittedText fit_text(cairo_t* cr, const std::string& text, double size, double smallest, double width, bool bold) {
  FittedText fitted{text, size};
  while (fitted.size > smallest && text_width(cr, text, fitted.size, bold) > width) fitted.size -= 0.5;
  if (text_width(cr, text, fitted.size, bold) <= width) return fitted;
  // Whole UTF-8 characters taken out of the middle, a side at a time, until the two ends fit
  // around an ellipsis.
  const auto starts_character = [&](std::size_t i) {
    return i == 0 || i >= text.size() || (static_cast<unsigned char>(text[i]) & 0xC0) != 0x80;
  };
  std::size_t head = text.size() / 2, tail = head;  // text[0, head) ... text[tail, end)
  while (!starts_character(head)) --head;
  tail = head;
  for (bool from_head = true; head > 0 || tail < text.size(); from_head = !from_head) {
    if ((from_head && head > 0) || tail >= text.size()) {
      do --head;
      while (!starts_character(head));
    } else {
      do ++tail;
      while (!starts_character(tail));
    }
    fitted.text = text.substr(0, head) + "\u2026" + text.substr(tail);
    if (text_width(cr, fitted.text, fitted.size, bold) <= width) break;
  }
  return fitted;
}

void draw_mono_text(cairo_t* cr, Point at, const std::string& text, double size) {
  cairo_api().save(cr);
  select_font(cr, size, false, true);
  set_colour(cr, kInk);
  cairo_api().move_to(cr, at.x, at.y);
  cairo_api().show_text(cr, text.c_str());
  cairo_api().restore(cr);
}

double draw_text(cairo_t* cr, Point at, const std::string& text, double size, Align align, bool bold, Colour c) {
  cairo_api().save(cr);
  select_font(cr, size, bold, false);
  cairo_text_extents_t extents;
  cairo_api().text_extents(cr, text.c_str(), &extents);
  double x = at.x;
  if (align == Align::centre) x -= extents.x_advance / 2;
  if (align == Align::right) x -= extents.x_advance;
  set_colour(cr, c);
  cairo_api().move_to(cr, x, at.y);
  cairo_api().show_text(cr, text.c_str());
  cairo_api().restore(cr);
  return extents.x_advance;
}

void draw_vertical_text(cairo_t* cr, Point at, const std::string& text, double size) {
  cairo_api().save(cr);
  cairo_api().translate(cr, at.x, at.y);
  cairo_api().rotate(cr, -M_PI / 2);
  draw_text(cr, {0, 0}, text, size, Align::centre);
  cairo_api().restore(cr);
}

double legend_row(cairo_t* cr, double x, double y, const std::string& text, Colour c, Dash dash, double width,
                  const Mark* mark) {
  if (mark) {
    draw_mark(cr, {x + 11, y - 3.5}, *mark, c, 9);
  } else {
    stroke_line(cr, {{x, y - 3.5}, {x + 22, y - 3.5}}, c, width, dash);
  }
  draw_text(cr, {x + 30, y}, text, 8.5);
  return y + 14;
}

}  // namespace shaftwork::charts

// Drawing a guarantee chart: the panels on the left (the head above the efficiency, sharing
// the flow axis), the verdict, legend and checks on the right.
#include <algorithm>

#include "shaftwork/charts/guarantee_chart.hpp"
#include "cairo_api.hpp"

namespace shaftwork::charts {
namespace {

constexpr double kLegendWidth = 205;
constexpr double kPanelGap = 26;
constexpr double kBarCap = 4;  // half the width of a bar's end, points

const char* verdict_word(machines::Verdict v) { return machines::verdict_name(v); }

// A tolerance bar from `low` to `high` along one axis at `at` on the other (page points);
// an open side reaches `edge_low` or `edge_high`, a closed one ends in a cap.
void tolerance_bar(cairo_t* cr, bool vertical, double at, std::optional<double> low, std::optional<double> high,
                   double edge_low, double edge_high) {
  const double from = low.value_or(edge_low), to = high.value_or(edge_high);
  const auto point = [&](double along, double across) { return vertical ? Point{across, along} : Point{along, across}; };
  stroke_line(cr, {point(from, at), point(to, at)}, kInk, 1.6);
  for (const auto& end : {low, high}) {
    if (end) stroke_line(cr, {point(*end, at - kBarCap), point(*end, at + kBarCap)}, kInk, 1.6);
  }
}

void draw_bars(cairo_t* cr, const GuaranteeChart& chart, const GuaranteePanel& p, const Axes& axes, bool first) {
  const Rect& a = axes.area;
  if (p.tolerance) {
    const auto y = [&](const std::optional<double>& v) { return v ? std::optional(axes.page_y(*v)) : std::nullopt; };
    // Page y grows downward: the low bound is the lower end on the page.
    tolerance_bar(cr, true, axes.page_x(p.read.x), y(p.high), y(p.low), a.y, a.y + a.height);
  }
  if (first && chart.cross && p.guarantee) {
    const auto x = [&](const std::optional<double>& v) { return v ? std::optional(axes.page_x(*v)) : std::nullopt; };
    tolerance_bar(cr, false, axes.page_y(p.guarantee->y), x(chart.flow_low), x(chart.flow_high), a.x, a.x + a.width);
  }
}

// The lines under the marks: the line through the origin, where the efficiency was read,
// the curve and the bars.
void draw_lines(cairo_t* cr, const GuaranteeChart& chart, const GuaranteePanel& p, const Axes& axes, bool first) {
  clip_to(cr, axes.area);
  if (first && chart.cross && p.guarantee && p.guarantee->x != 0) {
    const double slope = p.guarantee->y / p.guarantee->x;
    stroke_line(cr, {axes.page({chart.x_low, slope * chart.x_low}), axes.page({chart.x_high, slope * chart.x_high})},
                kFaint, 1.0, Dash::dashed);
  }
  if (chart.eta_read_flow) {
    const double x = axes.page_x(*chart.eta_read_flow);
    stroke_line(cr, {{x, axes.area.y}, {x, axes.area.y + axes.area.height}}, kFaint, 1.0, Dash::dotted);
  }
  stroke_line(cr, axes.page(p.curve), kInletColour, 1.8);
  draw_bars(cr, chart, p, axes, first);
  cairo_api().restore(cr);
}

// A value read on the curve: the verdict's mark and its word below it, to the right (to the
// left with `left`, or when the frame is near), or an open ring without a check.
void draw_reading(cairo_t* cr, Point read, const std::optional<machines::Verdict>& verdict, const Axes& axes,
                  bool left = false) {
  const Point at = axes.page(read);
  if (!verdict) {
    draw_open_mark(cr, at, Mark::circle, kInk, 9, 1.4);
    return;
  }
  draw_mark(cr, at, verdict_mark(*verdict), verdict_colour(*verdict), 12);
  const std::string word = verdict_word(*verdict);
  const double width = text_width(cr, word, 9, true);
  left = left || at.x + 12 + width > axes.area.x + axes.area.width - 2;
  draw_text(cr, {left ? at.x - 12 : at.x + 12, at.y + 13}, word, 9, left ? Align::right : Align::left, true,
            verdict_colour(*verdict));
}

void draw_guarantee(cairo_t* cr, const GuaranteePanel& p, const Axes& axes) {
  const Point at = axes.page(*p.guarantee);
  draw_open_mark(cr, at, Mark::diamond, kInk, 15, 1.6);
  if (!p.guarantee_note.empty()) draw_text(cr, {at.x - 12, at.y + 4}, p.guarantee_note, 8, Align::right);
}

void draw_panel(cairo_t* cr, const GuaranteeChart& chart, const GuaranteePanel& p, const Axes& axes, bool first,
                bool last) {
  const std::vector<Tick> x_ticks = value_ticks(chart.x_low, chart.x_high, 8);
  draw_axes(cr, axes, last ? chart.x_title : "", p.y_title, &x_ticks);
  draw_lines(cr, chart, p, axes, first);
  for (const Point& q : p.points) draw_mark(cr, axes.page(q), Mark::circle, kInletColour, 8);
  if (p.guarantee) draw_guarantee(cr, p, axes);
  draw_reading(cr, p.read, p.verdict, axes);
  if (first && chart.flow_read) draw_reading(cr, *chart.flow_read, p.verdict, axes, true);
}

// The overall verdict in a box of its colour.
double draw_banner(cairo_t* cr, const GuaranteeChart& chart, double x, double y) {
  static const char* const kText[] = {"PASS \u2713  guarantee met", "INCONCLUSIVE ?  within U",
                                      "FAIL \u2717  guarantee not met"};
  cairo_api().save(cr);
  set_colour(cr, verdict_colour(chart.verdict));
  cairo_api().rectangle(cr, x, y, kLegendWidth - 8, 24);
  cairo_api().fill(cr);
  cairo_api().restore(cr);
  const Colour text = chart.verdict == machines::Verdict::inconclusive ? kInk : Colour{0xff, 0xff, 0xff};
  draw_text(cr, {x + 8, y + 16.5}, kText[static_cast<int>(chart.verdict)], 11, Align::left, true, text);
  return y + 40;
}

double draw_key(cairo_t* cr, const GuaranteeChart& chart, double x, double y) {
  const Mark circle = Mark::circle;
  y = legend_row(cr, x, y, "converted test points", kInletColour, Dash::solid, 0, &circle);
  y = legend_row(cr, x, y, "curve through them", kInletColour, Dash::solid, 1.8, nullptr);
  draw_open_mark(cr, {x + 11, y - 3.5}, Mark::diamond, kInk, 12, 1.4);
  draw_text(cr, {x + 30, y}, "guarantee point", 8.5);
  y += 14;
  y = legend_row(cr, x, y, chart.cross ? "tolerance cross" : "tolerance", kInk, Dash::solid, 1.6, nullptr);
  if (chart.cross) y = legend_row(cr, x, y, "line through the origin", kFaint, Dash::dashed, 1.0, nullptr);
  if (chart.eta_read_flow) y = legend_row(cr, x, y, "efficiency read here", kFaint, Dash::dotted, 1.0, nullptr);
  for (const machines::Verdict v : {machines::Verdict::pass, machines::Verdict::inconclusive, machines::Verdict::fail}) {
    const bool shown = std::any_of(chart.panels.begin(), chart.panels.end(),
                                   [&](const GuaranteePanel& p) { return p.verdict == v; });
    const Mark mark = verdict_mark(v);
    if (shown) y = legend_row(cr, x, y, std::string("read on the curve: ") + verdict_word(v), verdict_colour(v),
                              Dash::solid, 0, &mark);
  }
  return y;
}

void draw_checks(cairo_t* cr, const GuaranteeChart& chart, double x, double y) {
  draw_text(cr, {x, y}, "checks", 9, Align::left, true);
  y += 15;
  for (const GuaranteeCheckLine& c : chart.checks) {
    draw_mark(cr, {x + 4, y - 3}, verdict_mark(c.verdict), verdict_colour(c.verdict), 7);
    draw_text(cr, {x + 12, y}, c.label, 8.5);
    draw_text(cr, {x + kLegendWidth - 8, y}, verdict_word(c.verdict), 8.5, Align::right, true,
              verdict_colour(c.verdict));
    draw_text(cr, {x + 12, y += 10.5}, c.values, 7.5);
    draw_text(cr, {x + 12, y += 10}, c.deviation, 7.5);
    y += 14;
  }
  for (const std::string& l : wrap_text(cr, chart.method, 7, kLegendWidth - 8)) {
    draw_text(cr, {x, y}, l, 7, Align::left, false, kFaint);
    y += 9;
  }
}

}  // namespace

std::vector<Axes> guarantee_axes(const GuaranteeChart& chart, const Rect& frame) {
  const double x = frame.x + 80, width = frame.width - 80 - kLegendWidth - 24;
  const double top = frame.y + 58, bottom = frame.y + frame.height - 50;
  const double n = static_cast<double>(chart.panels.size());
  const double height = (bottom - top - (n - 1) * kPanelGap) / n;
  std::vector<Axes> out;
  for (std::size_t i = 0; i < chart.panels.size(); ++i) {
    Axes a;
    a.area = {x, top + static_cast<double>(i) * (height + kPanelGap), width, height};
    a.x_low = chart.x_low;
    a.x_high = chart.x_high;
    a.y_low = chart.panels[i].y_low;
    a.y_high = chart.panels[i].y_high;
    out.push_back(a);
  }
  return out;
}

void draw_guarantee_chart(cairo_t* cr, const GuaranteeChart& chart, const Rect& frame) {
  const std::vector<Axes> axes = guarantee_axes(chart, frame);
  draw_text(cr, {frame.x + 20, frame.y + 24}, chart.title, 13, Align::left, true);
  draw_text(cr, {frame.x + 20, frame.y + 41}, chart.subtitle, 9);
  for (std::size_t i = 0; i < axes.size(); ++i) {
    draw_panel(cr, chart, chart.panels[i], axes[i], i == 0, i + 1 == axes.size());
  }
  const double x = axes.front().area.x + axes.front().area.width + 18;
  double y = draw_banner(cr, chart, x, axes.front().area.y);
  y = draw_key(cr, chart, x, y);
  draw_checks(cr, chart, x, y + 10);
}

}  // namespace shaftwork::charts

// Drawing the batch chart: efficiencies above, power balance below, a shared x of rows or
// time, the legend and counts on the right.
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "shaftwork/charts/batch_chart.hpp"
#include "cairo_api.hpp"

namespace shaftwork::charts {
namespace {

constexpr double kLegendWidth = 180;
constexpr double kPanelGap = 36;

struct SeriesStyle {
  BatchSeries series;
  Colour colour;
  Mark mark;
  const char* label;
};
constexpr SeriesStyle kIsentropicStyle{kIsentropic, kInletColour, Mark::circle, "isentropic efficiency"};
constexpr SeriesStyle kPolytropicStyle{kPolytropic, kPathColour, Mark::square, "polytropic efficiency"};
constexpr SeriesStyle kBalanceStyle{kBalance, kIsentropicColour, Mark::diamond, "power balance difference"};

bool finite(double v) { return std::isfinite(v); }

// The lowest and highest of the series' values (and band edges); false when there are none.
bool value_range(const BatchChartData& data, std::initializer_list<BatchSeries> series, double& low, double& high) {
  bool any = false;
  const auto take = [&](double v) {
    if (!finite(v)) return;
    low = any ? std::min(low, v) : v;
    high = any ? std::max(high, v) : v;
    any = true;
  };
  for (const BatchBucket& b : data.buckets()) {
    for (const BatchSeries s : series) {
      for (const double v : {b.series[s].low.value, b.series[s].high.value, b.series[s].band_low, b.series[s].band_high}) {
        take(v);
      }
    }
  }
  return any;
}

bool has_band(const BatchChartData& data) {
  return std::any_of(data.buckets().begin(), data.buckets().end(), [](const BatchBucket& b) {
    return finite(b.series[kIsentropic].band_low) || finite(b.series[kPolytropic].band_low);
  });
}

bool marked(const BatchChartData& data) { return data.rows() <= kMarkedRows; }

// The series' values in row order: each bucket's low and high; a bucket without a value
// ends a run (the line breaks there).
std::vector<std::vector<Point>> runs_of(const BatchChartData& data, BatchSeries s) {
  std::vector<std::vector<Point>> runs(1);
  for (const BatchBucket& b : data.buckets()) {
    const SeriesSpan& span = b.series[s];
    if (!finite(span.low.value)) {
      if (!runs.back().empty()) runs.emplace_back();
      continue;
    }
    KeptValue first = span.low, second = span.high;
    if (second.row < first.row) std::swap(first, second);
    runs.back().push_back({data.x_of(first), first.value});
    if (second.row != first.row) runs.back().push_back({data.x_of(second), second.value});
  }
  return runs;
}

void fill_band(cairo_t* cr, const BatchChartData& data, const Axes& axes, const SeriesStyle& style) {
  std::vector<Point> upper, lower;
  const auto fill = [&] {
    if (!upper.empty()) {
      const CairoApi& cairo = cairo_api();
      cairo.new_path(cr);
      for (const Point& p : upper) cairo.line_to(cr, axes.page_x(p.x), axes.page_y(p.y));
      for (auto p = lower.rbegin(); p != lower.rend(); ++p) cairo.line_to(cr, axes.page_x(p->x), axes.page_y(p->y));
      cairo.close_path(cr);
      cairo.set_source_rgba(cr, style.colour.r / 255.0, style.colour.g / 255.0, style.colour.b / 255.0, 0.2);
      cairo.fill(cr);
    }
    upper.clear();
    lower.clear();
  };
  for (const BatchBucket& b : data.buckets()) {
    const SeriesSpan& span = b.series[style.series];
    if (!finite(span.band_low)) {
      fill();
      continue;
    }
    const double x = data.x_of(span.low);
    upper.push_back({x, span.band_high});
    lower.push_back({x, span.band_low});
  }
  fill();
}

void draw_series(cairo_t* cr, const BatchChartData& data, const Axes& axes, const SeriesStyle& style) {
  clip_to(cr, axes.area);
  fill_band(cr, data, axes, style);
  for (const std::vector<Point>& run : runs_of(data, style.series)) {
    stroke_line(cr, axes.page(run), style.colour, marked(data) ? 1.2 : 0.9);
  }
  cairo_api().restore(cr);
  if (!marked(data)) return;
  for (const std::vector<Point>& run : runs_of(data, style.series)) {
    for (const Point& p : run) draw_mark(cr, axes.page(p), style.mark, style.colour, 8);
  }
}

// A dotted line through both panels at each bucket's first failed row, a triangle at the top.
void draw_failed(cairo_t* cr, const BatchChartData& data, const BatchAxes& axes) {
  for (const BatchBucket& b : data.buckets()) {
    if (b.failed == 0) continue;
    const double x = axes.efficiency.page_x(data.x_of(b.first_failed));
    const Rect& top = axes.efficiency.area;
    const Rect& bottom = axes.balance.area;
    stroke_line(cr, {{x, top.y}, {x, bottom.y + bottom.height}}, kOutletColour, 0.8, Dash::dotted);
    draw_mark(cr, {x, top.y + 6}, Mark::triangle, kOutletColour, 9);
  }
}

std::string x_title(const BatchChartData& data) {
  if (data.by_time()) return fmt::format("time (column \"{}\")", data.time_header());
  return "row";
}

std::vector<Tick> x_ticks(const BatchChartData& data, const Axes& axes) {
  if (data.by_time()) return time_ticks(axes.x_low, axes.x_high, 6);
  std::vector<Tick> ticks;
  for (Tick& t : value_ticks(axes.x_low, axes.x_high, 6)) {
    if (t.at == std::floor(t.at)) ticks.push_back(std::move(t));  // rows are whole
  }
  return ticks;
}

void draw_legend(cairo_t* cr, const BatchChartData& data, double x, double y) {
  for (const SeriesStyle& s : {kIsentropicStyle, kPolytropicStyle, kBalanceStyle}) {
    y = legend_row(cr, x, y, s.label, s.colour, Dash::solid, 0, &s.mark);
  }
  if (has_band(data)) y = legend_row(cr, x, y, "uncertainty band (k = 2)", kBandColour, Dash::solid, 7, nullptr);
  const Mark triangle = Mark::triangle;
  y = legend_row(cr, x, y, "failed row", kOutletColour, Dash::solid, 0, &triangle);
  y += 10;
  draw_text(cr, {x, y}, "rows", 9, Align::left, true);
  y += 15;
  const std::pair<const char*, std::size_t> counts[] = {
      {"rows", data.rows()}, {"rated", data.rows() - data.failed()}, {"failed", data.failed()}};
  for (const auto& [label, n] : counts) {
    draw_text(cr, {x, y}, label, 8.5);
    draw_text(cr, {x + kLegendWidth - 10, y}, fmt::format("{}", n), 8.5, Align::right, true);
    y += 15;
  }
  if (data.rows_per_bucket() > 1) {
    draw_text(cr, {x, y + 4}, fmt::format("lines join the lowest and highest"), 7.5);
    draw_text(cr, {x, y + 15}, fmt::format("value of each {} rows", data.rows_per_bucket()), 7.5);
  }
}

}  // namespace

BatchAxes batch_axes(const BatchChartData& data, const Rect& frame) {
  BatchAxes axes;
  const double left = frame.x + 80, width = frame.width - 80 - kLegendWidth - 24;
  const double room = frame.height - 58 - 50 - kPanelGap;
  axes.efficiency.area = {left, frame.y + 58, width, room * 0.55};
  axes.balance.area = {left, frame.y + 58 + room * 0.55 + kPanelGap, width, room * 0.45};
  double x_low = data.first_x(), x_high = data.last_x();
  pad_range(x_low, x_high, 0.02);
  for (Axes* a : {&axes.efficiency, &axes.balance}) {
    a->x_low = x_low;
    a->x_high = x_high;
  }
  Axes& e = axes.efficiency;
  if (!value_range(data, {kIsentropic, kPolytropic}, e.y_low, e.y_high)) e.y_low = 0, e.y_high = 1;
  pad_range(e.y_low, e.y_high, 0.08);
  Axes& b = axes.balance;
  if (!value_range(data, {kBalance}, b.y_low, b.y_high)) b.y_low = b.y_high = 0;
  b.y_low = std::min(b.y_low, 0.0);  // the zero line in view
  b.y_high = std::max(b.y_high, 0.0);
  pad_range(b.y_low, b.y_high, 0.08);
  return axes;
}

void draw_batch_chart(cairo_t* cr, const BatchChartData& data, const BatchChartText& text, const Rect& frame) {
  const BatchAxes axes = batch_axes(data, frame);
  draw_text(cr, {frame.x + 20, frame.y + 24}, text.title, 13, Align::left, true);
  draw_text(cr, {frame.x + 20, frame.y + 41}, text.subtitle, 9);
  const std::vector<Tick> ticks = x_ticks(data, axes.efficiency);
  draw_axes(cr, axes.efficiency, "", "efficiency [-]", &ticks);
  draw_axes(cr, axes.balance, x_title(data), "power balance diff. [%]", &ticks);
  const Axes& b = axes.balance;
  stroke_line(cr, {{b.area.x, b.page_y(0)}, {b.area.x + b.area.width, b.page_y(0)}}, kInk, 0.8);
  draw_failed(cr, data, axes);
  draw_series(cr, data, axes.efficiency, kPolytropicStyle);
  draw_series(cr, data, axes.efficiency, kIsentropicStyle);
  draw_series(cr, data, axes.balance, kBalanceStyle);
  double low = 0, high = 0;
  if (!value_range(data, {kBalance}, low, high)) {
    draw_text(cr, {b.area.x + b.area.width / 2, b.area.y + b.area.height / 2 - 8},
              "no power balance: a row has one when it gives the power", 8.5, Align::centre, false, kFaint);
    draw_text(cr, {b.area.x + b.area.width / 2, b.area.y + b.area.height / 2 + 6},
              "as well as both temperatures, flow and pressures", 8.5, Align::centre, false, kFaint);
  }
  draw_legend(cr, data, axes.efficiency.area.x + axes.efficiency.area.width + 18, axes.efficiency.area.y + 8);
}

}  // namespace shaftwork::charts

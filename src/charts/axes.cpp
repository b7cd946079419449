#include "shaftwork/charts/axes.hpp"

#include <cmath>
#include <iterator>

#include <fmt/format.h>

#include "shaftwork/io/timestamp.hpp"
#include "cairo_api.hpp"

namespace shaftwork::charts {

std::vector<Point> Axes::page(const std::vector<Point>& data) const {
  std::vector<Point> out;
  out.reserve(data.size());
  for (const Point& p : data) out.push_back(page(p));
  return out;
}

std::vector<double> nice_ticks(double low, double high, int target) {
  std::vector<double> ticks;
  const double span = high - low;
  if (!(span > 0) || !std::isfinite(span) || target < 1) return ticks;
  const double rough = span / target;
  const double power = std::pow(10.0, std::floor(std::log10(rough)));
  double step = power;
  for (const double f : {1.0, 2.0, 5.0, 10.0}) {
    step = f * power;
    if (step >= rough) break;
  }
  for (double k = std::ceil(low / step); k * step <= high + 1e-9 * span; k += 1) ticks.push_back(k * step + 0.0);
  return ticks;
}

void pad_range(double& low, double& high, double margin) {
  double span = high - low;
  if (!(span > 0)) span = std::max(std::abs(high), 1.0) * 0.02;
  low -= margin * span;
  high += margin * span;
}

namespace {

// A tick's text: as few digits as its neighbours need.
std::string tick_text(double value, const std::vector<double>& ticks) {
  const double step = ticks.size() > 1 ? ticks[1] - ticks[0] : std::abs(value);
  const int decimals = step > 0 ? std::max(0, static_cast<int>(-std::floor(std::log10(step) + 1e-9))) : 0;
  return fmt::format("{:.{}f}", value + 0.0, decimals);
}

constexpr double kDay = 86400;

}  // namespace

std::vector<Tick> value_ticks(double low, double high, int target) {
  const std::vector<double> at = nice_ticks(low, high, target);
  std::vector<Tick> ticks;
  for (const double v : at) ticks.push_back({v, tick_text(v, at)});
  return ticks;
}

std::vector<Tick> time_ticks(double low, double high, int target) {
  static constexpr double kSteps[] = {60,   300,   600,   900,   1800,    3600,   7200,
                                      10800, 21600, 43200, kDay, 2 * kDay, 7 * kDay};
  double step = kSteps[std::size(kSteps) - 1];
  for (const double s : kSteps) {
    if ((high - low) / s <= target) {
      step = s;
      break;
    }
  }
  std::vector<Tick> ticks;
  if (!(high > low)) return ticks;
  for (double t = std::ceil(low / step) * step; t <= high; t += step) {
    const std::string text = io::timestamp_text(t);  // "2026-03-02 06:00"
    ticks.push_back({t, step >= kDay ? text.substr(5, 5) : text.substr(5)});
  }
  return ticks;
}

void clip_to(cairo_t* cr, const Rect& area) {
  cairo_api().save(cr);
  cairo_api().rectangle(cr, area.x, area.y, area.width, area.height);
  cairo_api().clip(cr);
}

void draw_axes(cairo_t* cr, const Axes& axes, const std::string& x_title, const std::string& y_title,
               const std::vector<Tick>* x_ticks) {
  const Rect& a = axes.area;
  const std::vector<Tick> xs = x_ticks ? *x_ticks : value_ticks(axes.x_low, axes.x_high, 6);
  for (const Tick& x : xs) {
    stroke_line(cr, {{axes.page_x(x.at), a.y}, {axes.page_x(x.at), a.y + a.height}}, kGrid, 0.6);
    draw_text(cr, {axes.page_x(x.at), a.y + a.height + 13}, x.text, 8.5, Align::centre);
  }
  for (const Tick& y : value_ticks(axes.y_low, axes.y_high, 6)) {
    stroke_line(cr, {{a.x, axes.page_y(y.at)}, {a.x + a.width, axes.page_y(y.at)}}, kGrid, 0.6);
    draw_text(cr, {a.x - 5, axes.page_y(y.at) + 3}, y.text, 8.5, Align::right);
  }
  stroke_line(cr, {{a.x, a.y}, {a.x + a.width, a.y}, {a.x + a.width, a.y + a.height}, {a.x, a.y + a.height}, {a.x, a.y}},
              kInk, 0.8);
  draw_text(cr, {a.x + a.width / 2, a.y + a.height + 30}, x_title, 10, Align::centre);
  draw_vertical_text(cr, {a.x - 52, a.y + a.height / 2}, y_title, 10);
}

}  // namespace shaftwork::charts

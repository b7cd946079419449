// Pumps, by ISO 9906:2012: each test point translated to the rated speed (sec. 6.1.2)
//   Q = Q_t (n_g/n),  H = H_t (n_g/n)^2,  P = P_t (n_g/n)^3 (rho_g/rho_t),  eta = eta_t,
// the curves H(Q), P(Q) and eta(Q) drawn through the translated points by least squares
// (degree 2; degree 1 for two points), and the guarantee judged on them (sec. 4.4):
//   flow and head   met when H(Q) passes through the tolerance cross: the vertical bar
//                   H_G (1 + t_H) at Q_G, or the horizontal bar Q_G (1 + t_Q) at H_G;
//   efficiency      read on eta(Q) where H(Q) meets the line through the origin and
//                   (Q_G, H_G); met when eta >= eta_G (1 + t_eta,min);
//   power           P(Q_G); met when P <= P_G (1 + t_P,max).
// eta is the pump efficiency, hydraulic over shaft power (rho g Q H / P).
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "curve.hpp"
#include "guarantee_common.hpp"
#include "problem.hpp"

namespace shaftwork::machines {
namespace {

using D = units::Dimension;

struct Translated {
  const TestPoint* test = nullptr;
  double ratio = 1;  // n_g / n
  double flow = 0, head = 0;  // m3/s, m
  std::optional<double> power, efficiency;
};

Translated translate(const Guarantee& g, double rho_g, const TestPoint& p, bool needs_power) {
  const Rating& t = p.rating;
  if (!t.volume_flow || !t.head_height) {
    refuse(fmt::format("test point \"{}\" gives neither flow nor power: its flow is needed to translate it", p.id));
  }
  if (needs_power && !t.pump_efficiency) {
    refuse(fmt::format("test point \"{}\" has no shaft power, and the guarantee's power or efficiency needs it; give "
                       "the power of every test point",
                       p.id));
  }
  Translated c;
  c.test = &p;
  c.ratio = speed_ratio(g, p);
  c.flow = *t.volume_flow * c.ratio;
  c.head = *t.head_height * c.ratio * c.ratio;
  if (t.power) c.power = *t.power * std::pow(c.ratio, 3) * rho_g / t.inlet.density;
  c.efficiency = t.pump_efficiency;
  return c;
}

// A copy of the curve's values, one vector per quantity.
struct Curves {
  std::vector<double> q, h, p, eta;
  int degree = 2;
};

Curves curves_of(const std::vector<Translated>& points) {
  Curves c;
  for (const Translated& t : points) {
    c.q.push_back(t.flow);
    c.h.push_back(t.head);
    c.p.push_back(t.power.value_or(0));
    c.eta.push_back(t.efficiency.value_or(0));
  }
  c.degree = static_cast<int>(std::min<std::size_t>(2, points.size() - 1));
  return c;
}

// The root of H(Q) = k Q + h0 nearest q_near within the curve's reach, or empty.
std::optional<double> crossing(const Curves& c, const std::vector<double>& h_fit, double slope, double h0,
                               double q_near) {
  std::vector<double> diff = h_fit;
  diff[0] -= h0;
  if (diff.size() < 2) diff.push_back(0);
  diff[1] -= slope;
  const auto [low, high] = std::minmax_element(c.q.begin(), c.q.end());
  std::optional<double> best;
  for (double q : polynomial_roots(diff)) {
    if (q < *low * (1 - kExtrapolationLimit) || q > *high * (1 + kExtrapolationLimit)) continue;
    if (!best || std::fabs(q - q_near) < std::fabs(*best - q_near)) best = q;
  }
  return best;
}

bool within(double deviation_percent, const Tolerance& t) {
  return (!t.min_percent || deviation_percent >= *t.min_percent) && (!t.max_percent || deviation_percent <= *t.max_percent);
}

// The flow and head checks of the tolerance cross, one verdict for both.
void cross_checks(const Guarantee& g, const Curves& c, const std::vector<double>& h_fit, const TestPoint& nearest,
                  GuaranteeResult& r) {
  const double q_g = *g.value(Checked::volume_flow), h_g = *g.value(Checked::head_height);
  const std::optional<double> q_at_h = crossing(c, h_fit, 0, h_g, q_g);
  Check head = make_check(g, MachineKind::pump, Checked::head_height, nearest.rating.head_height,
                          polynomial(h_fit, q_g), nearest);
  Check flow = make_check(g, MachineKind::pump, Checked::volume_flow, nearest.rating.volume_flow, q_at_h, nearest);
  const bool vertical = within(*head.deviation_percent, head.tolerance);
  const bool horizontal = flow.deviation_percent && within(*flow.deviation_percent, flow.tolerance);
  const Verdict v = vertical || horizontal                                                        ? Verdict::pass
                    : head.verdict == Verdict::inconclusive || flow.verdict == Verdict::inconclusive ? Verdict::inconclusive
                                                                                                     : Verdict::fail;
  const std::string note = vertical && horizontal ? "tolerance cross: the curve crosses both bars"
                           : vertical             ? "tolerance cross: the curve crosses the head bar at Q_G"
                           : horizontal           ? "tolerance cross: the curve crosses the flow bar at H_G"
                                                  : "tolerance cross: the curve misses both bars";
  head.verdict = flow.verdict = v;
  head.note = flow.note = note;
  if (!q_at_h) flow.note += "; H(Q) does not reach H_G within the tested flows";
  r.checks.push_back(flow);
  r.checks.push_back(head);
}

// Efficiency where H(Q) meets the line through the origin and (Q_G, H_G); at Q_G when no
// head is guaranteed. Returns the flow it was read at.
double efficiency_check(const Guarantee& g, const Curves& c, const std::vector<double>& h_fit,
                        const TestPoint& nearest, GuaranteeResult& r) {
  const double q_g = *g.value(Checked::volume_flow);
  double q_read = q_g;
  std::string note = "at Q_G (no guaranteed head)";
  if (const auto h_g = g.value(Checked::head_height)) {
    const std::optional<double> q = crossing(c, h_fit, *h_g / q_g, 0, q_g);
    if (!q) {
      refuse(fmt::format("the translated H(Q) curve does not meet the line through the origin and (Q_G, H_G) = ({}, "
                         "{:.6g} m) within the tested flows: the efficiency cannot be read there",
                         show_volume_flow(q_g), *h_g));
    }
    q_read = *q;
    note = fmt::format("where H(Q) meets the line through the origin and (Q_G, H_G): Q = {}", show_volume_flow(q_read));
  }
  const std::vector<double> eta_fit = least_squares(c.q, c.eta, c.degree);
  if (g.value(Checked::pump_efficiency)) {
    r.checks.push_back(make_check(g, MachineKind::pump, Checked::pump_efficiency, nearest.rating.pump_efficiency,
                                  polynomial(eta_fit, q_read), nearest, note));
  }
  return q_read;
}

CurveReading reading(const char* key, D dimension, const std::vector<double>& q, const std::vector<double>& y,
                     std::vector<double> fit) {
  CurveReading r;
  r.key = key;
  r.dimension = dimension;
  r.flow = q;
  r.value = y;
  r.coefficients = std::move(fit);
  return r;
}

// The curves the checks were read on, for a chart: H(Q) with the tolerance cross around
// (Q_G, H_G), and eta(Q) read at q_eta (empty: no efficiency without the power).
CurveReadings pump_readings(const Curves& c, const std::vector<double>& h_fit, double q_g,
                            std::optional<double> q_eta, const GuaranteeResult& r) {
  CurveReadings out;
  out.guaranteed_flow = q_g;
  CurveReading head = reading("head_height", D::length, c.q, c.h, h_fit);
  head.read_flow = q_g;
  head.read_value = head.at(q_g);
  if (const Check* h = find_check(r, Checked::head_height)) {
    set_guarantee(head, *h);
    const Check& q = *find_check(r, Checked::volume_flow);
    out.cross = true;
    out.flow_low = tolerance_bound(q.guaranteed, q.tolerance.min_percent);
    out.flow_high = tolerance_bound(q.guaranteed, q.tolerance.max_percent);
  }
  out.quantities.push_back(std::move(head));
  if (!q_eta) return out;
  CurveReading eta = reading("pump_efficiency", D::fraction, c.q, c.eta, least_squares(c.q, c.eta, c.degree));
  eta.read_flow = *q_eta;
  eta.read_value = eta.at(*q_eta);
  if (const Check* e = find_check(r, Checked::pump_efficiency)) set_guarantee(eta, *e);
  out.quantities.push_back(std::move(eta));
  return out;
}

}  // namespace

GuaranteeResult judge_pump(const Guarantee& guarantee, std::span<const TestPoint> points) {
  require_flow(guarantee, MachineKind::pump);
  if (points.size() < 2) {
    refuse("a pump guarantee is judged on the H(Q) curve through the translated test points (ISO 9906:2012), and "
           "one point draws no curve: put the guarantee beside \"cases\" at the top of the file, so that every case "
           "is a test point (ISO 9906 asks for 3 to 5 points around the guarantee flow)");
  }
  const GuaranteeInlet gin = guarantee_inlet(guarantee, points.front());
  const auto t_sat = gin.fluid->saturation_temperature(gin.state.pressure);
  if (gin.state.is_wet() || (t_sat && gin.state.temperature >= *t_sat)) {
    refuse(fmt::format("inlet: the guarantee's inlet ({:.6g} kPa, {:.2f} K) is not a liquid; give the inlet pressure "
                       "of the guarantee point as well as its temperature",
                       gin.state.pressure / 1e3, gin.state.temperature));
  }
  const double rho_g = gin.state.density;
  Guarantee g = guarantee;  // with Q_G and H_G filled in
  g.value(Checked::volume_flow) = guaranteed_mass_flow(g, gin.state) / rho_g;
  const double q_g = *g.value(Checked::volume_flow);
  if (!g.value(Checked::head_height) && g.value(Checked::outlet_pressure)) {
    g.value(Checked::head_height) = (*g.value(Checked::outlet_pressure) - gin.state.pressure) / (rho_g * units::kStandardGravity);
  }
  const bool needs_power = g.value(Checked::power) || g.value(Checked::pump_efficiency);
  std::vector<Translated> tr;
  for (const TestPoint& p : points) tr.push_back(translate(g, rho_g, p, needs_power));
  std::sort(tr.begin(), tr.end(), [](const Translated& a, const Translated& b) { return a.flow < b.flow; });
  const Curves c = curves_of(tr);
  refuse_beyond_reach(c.q, q_g, "the guaranteed volume flow", show_volume_flow);
  const std::vector<double> h_fit = least_squares(c.q, c.h, c.degree);
  const TestPoint& nearest = *tr[nearest_index(c.q, q_g)].test;
  GuaranteeResult r;
  r.method = fmt::format("ISO 9906:2012 translation to the rated speed; H(Q), P(Q) and eta(Q) by least squares of "
                         "degree {} through {} translated points",
                         c.degree, tr.size());
  if (g.value(Checked::head_height)) cross_checks(g, c, h_fit, nearest, r);
  const double q_eta = needs_power ? efficiency_check(g, c, h_fit, nearest, r) : q_g;
  std::optional<double> p_at_q;
  if (needs_power) p_at_q = polynomial(least_squares(c.q, c.p, c.degree), q_g);
  if (g.value(Checked::power)) {
    r.checks.push_back(make_check(g, MachineKind::pump, Checked::power, nearest.rating.power, p_at_q, nearest, "at Q_G"));
  }
  for (const Translated& t : tr) {
    r.similarity.push_back(ratio_check("speed_ratio", t.test->id, std::nullopt, std::nullopt, 1 / t.ratio));
    ConvertedPoint cp{t.test->id, t.ratio, {{"volume_flow", D::volume_flow, t.flow}, {"head_height", D::length, t.head}}};
    if (t.power) cp.values.push_back({"power", D::power, *t.power});
    if (t.efficiency) cp.values.push_back({"pump_efficiency", D::fraction, *t.efficiency});
    r.points.push_back(std::move(cp));
  }
  r.converted = {{"volume_flow", D::volume_flow, q_g}, {"head_height", D::length, polynomial(h_fit, q_g)}};
  if (p_at_q) r.converted.push_back({"power", D::power, *p_at_q});
  if (needs_power) r.converted.push_back({"efficiency_read_at.volume_flow", D::volume_flow, q_eta});
  r.nearest_point = nearest.id;
  r.readings = pump_readings(c, h_fit, q_g, needs_power ? std::optional(q_eta) : std::nullopt, r);
  return r;
}

}  // namespace shaftwork::machines

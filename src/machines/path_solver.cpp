// The collocation solver of the polytropic path: set-up, nodes, Newton's method. See
// polytropic_path.hpp for the method and path_solver.hpp for the pieces.
#include "path_solver.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/numerics/dense_solve.hpp"

namespace shaftwork::machines::detail {

using fluids::FluidModel;
using fluids::State;

namespace {

// The enthalpy at the outlet is solved to kPathTolerance * f * max(p v) * |ln(p2/p1)|, about
// kPathTolerance of the enthalpy change.
constexpr double kPathTolerance = 1e-10;
// The ends of a segment at a crossing are evaluated this fraction of |ln(p2/p1)| inside it,
// so that each side sees its own region's equation.
constexpr double kInside = 1e-11;
// The first segments are at most this long in ln p.
constexpr double kInitialLength = 8.0;
constexpr int kMaxSweeps = 60;
// Rounding of an enthalpy, relative: a tolerance below it could never be met.
constexpr double kRounding = 16 * std::numeric_limits<double>::epsilon();

double value_of(const State& st, Form form) { return form == Form::entropy ? st.entropy : st.enthalpy; }

// (dV/dy)_p for a single-phase state: G (T alpha_v - 1) / cp for G = p v / T against s,
// H alpha_v / cp for H = p v against h.
double slope(const State& st, Form form, double V) {
  if (!(st.cp > 0)) return 0.0;
  return form == Form::entropy ? V * (st.temperature * st.expansivity - 1.0) / st.cp : V * st.expansivity / st.cp;
}

// The saturation line at p, or an unknown one (p = 0) where the model has none.
SaturationLine saturation_line(const FluidModel& fluid, double p) {
  try {
    const auto [liquid, vapour] = fluid.saturated(p);
    return {p,
            liquid.temperature,
            liquid.enthalpy,
            vapour.enthalpy,
            liquid.entropy,
            vapour.entropy,
            1.0 / liquid.density,
            1.0 / vapour.density,
            liquid.region};
  } catch (const Error&) {
    return {};
  }
}

// The state at (p, y), or near it. From `hint`, a single-phase state near by, T is predicted
// (entropy: s ~ s_h + cp ln(T/T_h) - v alpha_v p_h ln(p/p_h); enthalpy: h ~ h_h + cp (T - T_h)
// + v (1 - T alpha_v)(p - p_h)) and corrected by Newton's method on states from (p, T), which
// cost a fraction of the solve behind from_ps and from_ph. A state in the hint's region is
// taken once it misses y by at most 1 % of the distance from the hint (or by `tolerance`): the
// caller corrects its V to y to first order, and takes a state anew once y strays from it.
// Otherwise, or when the steps do not close in, the state comes from (p, y).
State state_near(const FluidModel& fluid, double p, double y, Form form, const State* hint, double tolerance) {
  const bool entropy = form == Form::entropy;
  if (hint != nullptr && !hint->is_wet() && hint->cp > 0) {
    const double v = 1.0 / hint->density;
    const double pressure_term = entropy ? hint->expansivity * v * hint->pressure * std::log(p / hint->pressure)
                                         : -v * (1.0 - hint->temperature * hint->expansivity) * (p - hint->pressure);
    const double distance = y - value_of(*hint, form) + pressure_term;
    const double accept = 0.01 * (std::fabs(y - value_of(*hint, form)) + std::fabs(pressure_term)) + tolerance;
    const fluids::Range range = fluid.temperature_range();
    double T = entropy ? hint->temperature * std::exp(distance / hint->cp) : hint->temperature + distance / hint->cp;
    double miss = std::numeric_limits<double>::infinity();
    try {
      // A temperature outside the range is left to (p, y): an exception costs more than a state.
      for (int step = 0; step < 3 && range.contains(T); ++step) {
        const State st = fluid.from_pt(p, T);
        const double next_miss = std::fabs(value_of(st, form) - y);
        if (st.region != hint->region || !(next_miss < 0.5 * miss)) break;
        if (next_miss <= accept) return st;
        miss = next_miss;
        T = entropy ? st.temperature * std::exp((y - st.entropy) / st.cp) : st.temperature + (y - st.enthalpy) / st.cp;
      }
    } catch (const Error&) {
      // at the saturation temperature, or outside the range: (p, y) decides
    }
  }
  return entropy ? fluid.from_ps(p, y) : fluid.from_ph(p, y);
}

}  // namespace

const Rule& rule() {
  static const Rule instance;
  return instance;
}

Polynomial Segment::path() const {
  Values y;
  for (std::size_t i = 0; i <= kLast; ++i) y[i] = nodes[i].y;
  return {x0, length(), rule().coefficients(y)};
}

PathView::PathView(const Segment& first, const Segment& second, bool rises)
    : a(first.path()), b(&first == &second ? a : second.path()), form_a(first.form), form_b(second.form),
      boundary(first.x1), rising(rises) {}

PathSolver::PathSolver(const FluidModel& fluid, const State& inlet, double p2, double factor, const State* outlet)
    : fluid_(fluid), inlet_(inlet), outlet_(outlet), x1_(std::log(inlet.pressure)), x2_(std::log(p2)),
      length_(std::log1p((p2 - inlet.pressure) / inlet.pressure)), p1_(inlet.pressure), p2_(p2), factor_(factor) {
  const double H1 = p1_ / inlet.density;
  if (outlet != nullptr) {
    factor_ = (outlet->enthalpy - inlet.enthalpy) / (0.5 * (H1 + p2_ / outlet->density) * length_);
  }
  const Form form = inlet.is_wet() ? Form::enthalpy : Form::entropy;
  const auto count = static_cast<std::size_t>(std::max(1.0, std::ceil(std::fabs(length_) / kInitialLength)));
  segments_.resize(count);
  corrections_.assign(count, 0.0);
  const auto first_guess = [this, form](double x) { return guess(x, form); };
  for (std::size_t k = 0; k < count; ++k) {
    const double n = static_cast<double>(count);
    segments_[k].form = form;
    const double a = k == 0 ? x1_ : x1_ + length_ * static_cast<double>(k) / n;
    const double b = k + 1 == count ? x2_ : x1_ + length_ * static_cast<double>(k + 1) / n;
    set_nodes(segments_[k], a, b, first_guess, nullptr);
  }
  Node& first = segments_.front().nodes[0];
  first.y = value_of(inlet, form);
  first.state = inlet;
  first.has_state = true;
  take_state(first, form, p1_);
}

// exp(x) at a node, with the ends exact: the outlet pressure is the caller's own, and a
// rounded exp(ln p2) could lie just outside the model's range.
double PathSolver::pressure_at(double x) const {
  if (x == x1_) return p1_;
  if (x == x2_) return p2_;
  return std::clamp(std::exp(x), std::min(p1_, p2_), std::max(p1_, p2_));
}

// The first path. Forward: V taken as constant (the entropy form, exact for an ideal gas), or
// H growing as exp(f J1 (x - x1)) (the enthalpy form, exact for an ideal gas of constant cp).
// With the outlet known: V linear in x between the inlet's and the outlet's.
double PathSolver::guess(double x, Form form) const {
  const bool entropy = form == Form::entropy;
  const double V1 = p1_ / inlet_.density / (entropy ? inlet_.temperature : 1.0);
  const double dx = x - x1_;
  if (outlet_ == nullptr) {
    if (entropy) return inlet_.entropy + (factor_ - 1.0) * V1 * dx;
    const double rate = factor_ * slope(inlet_, form, V1);
    const double growth = std::fabs(rate * dx) > 1e-8 ? std::expm1(rate * dx) / rate : dx;
    return inlet_.enthalpy + factor_ * V1 * growth;
  }
  const double V2 = p2_ / outlet_->density / (entropy ? outlet_->temperature : 1.0);
  const double t = dx / length_;
  const double shape = (V1 * t + 0.5 * (V2 - V1) * t * t) / (0.5 * (V1 + V2));
  return value_of(inlet_, form) + (value_of(*outlet_, form) - value_of(inlet_, form)) * shape;
}

// Places the nodes of `seg` on [x0, x1] with values from `path`; each node keeps what the
// nearest node of `previous` (the segment it was cut from) knew, as hints.
template <class Path>
void PathSolver::set_nodes(Segment& seg, double x0, double x1, const Path& path, const Segment* previous) const {
  std::array<Node, kDegree + 1> old;
  if (previous != nullptr) old = previous->nodes;
  seg.x0 = x0;
  seg.x1 = x1;
  const double direction = length_ > 0 ? 1.0 : -1.0;
  std::size_t nearest = 0;  // old nodes and new ones both run along the path: merge
  for (std::size_t i = 0; i <= kLast; ++i) {
    const double x = i == 0 ? x0 : i == kLast ? x1 : x0 + (x1 - x0) * rule().node(static_cast<int>(i));
    Node& node = seg.nodes[i];
    if (previous != nullptr) {
      while (nearest < kLast && (old[nearest + 1].x - x) * direction <= 0) ++nearest;
      const bool next_nearer = nearest < kLast && std::fabs(old[nearest + 1].x - x) < std::fabs(old[nearest].x - x);
      node = old[next_nearer ? nearest + 1 : nearest];
    } else {
      node = Node{};
    }
    node.x = x;
    node.p = pressure_at(x);
    node.y = path(x);
    node.evaluated = false;
  }
}

template void PathSolver::set_nodes<Polynomial>(Segment&, double, double, const Polynomial&, const Segment*) const;

// A segment's first node is the previous segment's last; where the fluid changes region, or
// the form changes, it is its own, with the same x and the same enthalpy (at a crossing its
// state taken a hair inside the segment).
void PathSolver::sync_start(std::size_t k) {
  Segment& seg = segments_[k];
  const Segment& before = segments_[k - 1];
  const Node& end = before.nodes[kLast];
  if (!seg.crossing_start && seg.form == before.form) {
    seg.nodes[0] = end;
    return;
  }
  Node& start = seg.nodes[0];
  if (start.x != end.x || !start.evaluated) {
    // At a crossing taken a hair inside the segment, on the path there: h moves by dh/dx = f p v.
    start.x = end.x;
    start.p = end.p;
    const double inside = seg.crossing_start ? kInside * length_ : 0.0;
    const double pv = scale(end, before.form) * end.V;
    evaluate_at(start, seg.form, Form::enthalpy, end.enthalpy + factor_ * pv * inside, end.x + inside,
                seg.form == Form::enthalpy);
  } else if (start.enthalpy != end.enthalpy) {
    shift(start, seg.form, (end.enthalpy - start.enthalpy) / scale(start, seg.form));
  }
}

void PathSolver::evaluate() {
  const double inside = kInside * length_;
  for (std::size_t k = 0; k < segments_.size(); ++k) {
    Segment& seg = segments_[k];
    if (k > 0) sync_start(k);
    Node& start = seg.nodes[0];
    if (!start.evaluated) evaluate_node(start, seg.form, nullptr, seg.crossing_start ? start.x + inside : start.x);
    for (std::size_t i = 1; i <= kLast; ++i) {
      Node& node = seg.nodes[i];
      if (node.evaluated) continue;
      // The end at a crossing sits a hair from the boundary, where (p, T) may be too close to
      // saturation to fix a state: it comes from (p, y).
      if (i == kLast && seg.crossing_end) {
        evaluate_node(node, seg.form, nullptr, node.x - inside);
      } else {
        evaluate_node(node, seg.form, &seg.nodes[i - 1].state, node.x);
      }
    }
  }
}

// Evaluates a node exactly from `value` given in the form `given` (its enthalpy, or its value
// in a segment of the other form it was cut from), at ln p = x, and puts it in `form`. `wet`
// says the node is likely wet: its saturation line is then tried first.
void PathSolver::evaluate_at(Node& node, Form form, Form given, double value, double x, bool wet) {
  const double p = x == node.x ? node.p : pressure_at(x);
  if ((wet || node.quality >= 0) && node.line.p != p) node.line = saturation_line(fluid_, p);
  if (node.line.holds(p, value, given)) {
    // Wet: the saturation line converts without a state.
    const SaturationLine& line = node.line;
    const double q = (value - line.low(given)) / (line.high(given) - line.low(given));
    node.y = line.low(form) + q * (line.high(form) - line.low(form));
    wet_node(node, form);
  } else {
    node.state = given == Form::entropy ? fluid_.from_ps(p, value) : fluid_.from_ph(p, value);
    node.has_state = true;
    node.y = value_of(node.state, form);
    ++evaluations_;
    take_state(node, form, p);
  }
  if (x != node.x) {  // back from x to the node's own place along the path
    const double back = coefficient(form) * node.V * (node.x - x);
    node.y += back;
    node.anchor += back;
    node.enthalpy += scale(node, form) * back;
  }
}

// Evaluates a node at its value and at ln p = x (its own x, or a hair inside its segment).
void PathSolver::evaluate_node(Node& node, Form form, const State* neighbour, double x) {
  const double p = x == node.x ? node.p : pressure_at(x);
  // A node taken a hair off its place is taken on the path there: y moves by dy/dx = c V.
  const double V_known = node.V != 0 ? node.V : p1_ / inlet_.density / (form == Form::entropy ? inlet_.temperature : 1.0);
  const double y = x == node.x ? node.y : node.y + coefficient(form) * V_known * (x - node.x);
  const State* hint = neighbour == nullptr ? nullptr : node.has_state ? &node.state : neighbour;
  if (hint != nullptr && hint->is_wet() && node.line.p != p) node.line = saturation_line(fluid_, p);
  if (node.line.holds(p, y, form)) return wet_node(node, form);
  try {
    const double tolerance = tolerance_ / (form == Form::entropy ? std::max(node.T, 1.0) : 1.0);
    node.state = state_near(fluid_, p, y, form, hint, tolerance);
  } catch (const Error& e) {
    // The first path is a guess and may overshoot the model's range where the path does not:
    // there the node falls back once on the value of the state it had, or its neighbour's.
    // Later, the error stands.
    const double fallback = value_of(node.has_state ? node.state : hint != nullptr ? *hint : inlet_, form);
    if (e.kind() != ErrorKind::out_of_range || sweeps_ > 1 || node.y == fallback) throw;
    node.y = fallback;
    node.state = form == Form::entropy ? fluid_.from_ps(p, node.y) : fluid_.from_ph(p, node.y);
  }
  ++evaluations_;
  node.has_state = true;
  take_state(node, form, p);
}

// V, J and the rest of a node from its state (at pressure p), corrected to the node's y to
// first order; a wet state from its saturation line instead.
void PathSolver::take_state(Node& node, Form form, double p) {
  const State& st = node.state;
  if (st.is_wet()) {
    if (node.line.p != p) node.line = saturation_line(fluid_, p);
    if (node.line.p > 0) return wet_node(node, form);
  }
  const double V = p / st.density / (form == Form::entropy ? st.temperature : 1.0);
  node.J = st.is_wet() ? 0.0 : slope(st, form, V);
  node.V = V + node.J * (node.y - value_of(st, form));
  node.anchor = value_of(st, form);
  node.T = st.temperature;
  node.enthalpy = form == Form::entropy ? st.enthalpy + st.temperature * (node.y - st.entropy) : node.y;
  node.region = st.region;
  node.quality = st.is_wet() ? *st.quality : -1.0;
  node.evaluated = true;
}

// A wet node from its saturation line: V and J exact, no state needed.
void PathSolver::wet_node(Node& node, Form form) const {
  const SaturationLine& line = node.line;
  const double span = line.high(form) - line.low(form);
  const double x = (node.y - line.low(form)) / span;
  const double v = line.v_liquid + x * (line.v_vapour - line.v_liquid);
  const double per = form == Form::entropy ? line.T : 1.0;
  node.V = line.p * v / per;
  node.J = line.p * (line.v_vapour - line.v_liquid) / (span * per);
  node.anchor = node.y;
  node.T = line.T;
  node.enthalpy = line.h_liquid + x * (line.h_vapour - line.h_liquid);
  node.region = line.region;
  node.quality = x;
  node.evaluated = true;
}

// Moves a node's value by `step`. Where V is known to be linear in y (a wet node on its
// saturation line), or y stays so near the state V was taken at that V changes by at most 1e-6
// of itself (the rest of its Taylor series then about 1e-12 of V), V follows without a new state.
void PathSolver::shift(Node& node, Form form, double step) const {
  node.y += step;
  node.enthalpy += scale(node, form) * step;
  if (!node.evaluated) return;
  if (node.quality >= 0 && node.line.holds(node.line.p, node.y, form) && node.region == node.line.region) {
    wet_node(node, form);
  } else if (std::fabs(node.J * (node.y - node.anchor)) <= 1e-6 * std::fabs(node.V)) {
    node.V += node.J * step;
  } else {
    node.evaluated = false;
  }
}

void PathSolver::update_tolerance() {
  double largest = 0, scale_h = std::fabs(inlet_.enthalpy);
  for (const Segment& seg : segments_) {
    for (const Node& node : seg.nodes) {
      largest = std::max(largest, std::fabs(node.V * scale(node, seg.form)));  // p v
      scale_h = std::max(scale_h, std::fabs(node.enthalpy));
    }
  }
  tolerance_ = std::max(kPathTolerance * std::max(factor_, 1e-3) * largest * std::fabs(length_), kRounding * scale_h);
}

// One Newton step on the collocation equations of all segments, y_j = y_0 + c L sum_i W(j, i)
// V_i (c = f - 1 or f), and on f when the outlet is given. Each segment's correction is
// a + b df, carried from its first node (at a crossing through dh = T ds); returns the
// largest correction, in J/kg.
double PathSolver::newton() {
  const Rule& r = rule();
  std::vector<std::array<std::array<double, 2>, kDegree>> steps(segments_.size());
  double carry_a = 0, carry_b = 0;  // correction of the segment's first node: carry_a + carry_b df
  for (std::size_t k = 0; k < segments_.size(); ++k) {
    const Segment& seg = segments_[k];
    if (k > 0 && (seg.crossing_start || seg.form != segments_[k - 1].form)) {
      const double ratio = scale(segments_[k - 1].nodes[kLast], segments_[k - 1].form) / scale(seg.nodes[0], seg.form);
      carry_a *= ratio;
      carry_b *= ratio;
    }
    const double L = seg.length();
    const double c = coefficient(seg.form) * L;
    std::array<std::array<double, kDegree>, kDegree> matrix{};
    auto& rhs = steps[k];
    for (int j = 1; j <= kDegree; ++j) {
      double integral = 0;
      for (int i = 0; i <= kDegree; ++i) integral += r.integral_weight(j, i) * seg.nodes[static_cast<std::size_t>(i)].V;
      const auto row = static_cast<std::size_t>(j - 1);
      const double residual = seg.nodes[row + 1].y - seg.nodes[0].y - c * integral;
      for (int i = 1; i <= kDegree; ++i) {
        matrix[row][static_cast<std::size_t>(i - 1)] =
            (i == j ? 1.0 : 0.0) - c * r.integral_weight(j, i) * seg.nodes[static_cast<std::size_t>(i)].J;
      }
      const double carried = 1.0 + c * r.integral_weight(j, 0) * seg.nodes[0].J;
      rhs[row] = {-residual + carry_a * carried, carry_b * carried + L * integral};
    }
    numerics::dense_solve(matrix, rhs, "polytropic path");
    carry_a = rhs[kDegree - 1][0];
    carry_b = rhs[kDegree - 1][1];
  }
  double df = 0;
  if (outlet_ != nullptr) {
    const Segment& last = segments_.back();
    df = (value_of(*outlet_, last.form) - last.nodes[kLast].y - carry_a) / carry_b;
    if (!(factor_ + df > 0)) df = -0.5 * factor_;  // f stays positive
  }
  factor_ += df;
  double largest = 0;
  for (std::size_t k = 0; k < segments_.size(); ++k) {
    Segment& seg = segments_[k];
    corrections_[k] = 0;
    for (std::size_t j = 1; j <= kLast; ++j) {
      const double step = steps[k][j - 1][0] + steps[k][j - 1][1] * df;
      if (step == 0) continue;
      shift(seg.nodes[j], seg.form, step);
      corrections_[k] = std::max(corrections_[k], std::fabs(step) * scale(seg.nodes[j], seg.form));
    }
    largest = std::max(largest, corrections_[k]);
    if (k + 1 < segments_.size()) sync_start(k + 1);
  }
  return largest;
}

// The error in h that a segment adds at its end, from the Chebyshev coefficients of V: the
// last pair, scaled by how fast the pairs fall (the next pair's share), at most by 1.
double PathSolver::truncation(const Segment& seg) const {
  Values V;
  double per = 1.0;  // J/kg per unit of y
  for (std::size_t i = 0; i <= kLast; ++i) {
    V[i] = seg.nodes[i].V;
    per = std::max(per, scale(seg.nodes[i], seg.form));
  }
  const Values a = rule().coefficients(V);
  const double last = std::fabs(a[kLast - 1]) + std::fabs(a[kLast]);
  const double before = std::fabs(a[kLast - 3]) + std::fabs(a[kLast - 2]);
  const double fall = before > 0 ? std::min(1.0, last / before) : 1.0;
  return std::fabs(coefficient(seg.form) * seg.length()) * last * fall * per;
}

// Cuts every segment whose truncation error is above the tolerance into as many equal pieces
// as should bring it below (the error falls as the length to the power kDegree). True when
// one was cut.
bool PathSolver::refine() {
  bool cut = false;
  for (std::size_t k = segments_.size(); k-- > 0;) {
    const double error = truncation(segments_[k]);
    if (!(error > tolerance_)) continue;
    const double pieces = std::clamp(std::ceil(std::pow(error / (0.5 * tolerance_), 1.0 / kDegree)), 2.0, 8.0);
    const double x0 = segments_[k].x0;
    const double step = segments_[k].length() / pieces;
    for (int piece = static_cast<int>(pieces) - 1; piece >= 1; --piece) split(k, x0 + piece * step, nullptr);
    cut = true;
  }
  return cut;
}

// The enthalpy at the outlet: the last value, or in the entropy form h(p2, s) exactly.
double PathSolver::outlet_enthalpy() {
  const Segment& last = segments_.back();
  const double y = last.nodes[kLast].y;
  return last.form == Form::enthalpy ? y : fluid_.from_ps(p2_, y).enthalpy;
}

PathResult PathSolver::run() {
  last_step_ = std::numeric_limits<double>::infinity();
  presplit();
  for (sweeps_ = 1; sweeps_ <= kMaxSweeps; ++sweeps_) {
    evaluate();
    update_tolerance();
    if (split_at_region_change()) continue;
    const double step = newton();
    last_step_ = step;
    const bool moved = relocate_crossings();
    // The segments' truncation errors mean something once the path stands nearly still.
    const bool cut = !moved && step <= 1e4 * tolerance_ && refine();
    if (step <= tolerance_ && !moved && !cut) {
      PathResult result;
      result.outlet_enthalpy = outlet_enthalpy();
      result.factor = factor_;
      result.segments = static_cast<int>(segments_.size());
      result.sweeps = sweeps_;
      result.evaluations = evaluations_;
      return result;
    }
  }
  throw Error(ErrorKind::no_convergence,
              fmt::format("polytropic path from {:.6g} Pa to {:.6g} Pa: no convergence in {} sweeps", p1_, p2_,
                          kMaxSweeps));
}

PathResult integrate_path(const FluidModel& fluid, const State& inlet, double p2, double factor) {
  return PathSolver(fluid, inlet, p2, factor, nullptr).run();
}

PathResult solve_path_factor(const FluidModel& fluid, const State& inlet, const State& outlet) {
  return PathSolver(fluid, inlet, outlet.pressure, 1.0, &outlet).run();
}

}  // namespace shaftwork::machines::detail

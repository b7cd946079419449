// The polytropic path of a real fluid by Chebyshev collocation; see polytropic_path.hpp.
#include "polytropic_path.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <cstddef>
#include <limits>
#include <optional>
#include <vector>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/numerics/chebyshev.hpp"
#include "shaftwork/numerics/dense_solve.hpp"

namespace shaftwork::machines::detail {
namespace {

using fluids::FluidModel;
using fluids::State;

constexpr int kDegree = 12;
using Rule = numerics::ChebyshevLobatto<kDegree>;
using Values = Rule::Values;
constexpr std::size_t kLast = kDegree;  // index of a segment's last node

const Rule& rule() {
  static const Rule instance;
  return instance;
}

// The enthalpy at the outlet is solved to kPathTolerance * f * max(p v) * |ln(p2/p1)|, about
// kPathTolerance of the enthalpy change.
constexpr double kPathTolerance = 1e-11;
// Crossings are located to this fraction of |ln(p2/p1)|, and the ends of a segment at a
// crossing are evaluated kInside of it inside the segment, so that each sees its own region.
constexpr double kLocateTolerance = 1e-13;
constexpr double kInside = 1e-11;
// No segment is shorter than this fraction of |ln(p2/p1)|.
constexpr double kShortest = 1e-12;
// The first segments are at most this long in ln p.
constexpr double kInitialLength = 8.0;
constexpr int kMaxSweeps = 60;
constexpr std::size_t kMaxSegments = 64;
// Rounding of an enthalpy, relative: a tolerance below it could never be met.
constexpr double kRounding = 16 * std::numeric_limits<double>::epsilon();

// The saturated liquid and vapour at one pressure. Between them v and h are both linear in
// the quality, so H = p v is linear in h: a wet node at that pressure needs no state.
struct SaturationLine {
  double p = 0;  // Pa; 0 when not known
  double h_liquid = 0, h_vapour = 0, v_liquid = 0, v_vapour = 0;
  int region = 0;  // of the wet states there
  bool holds(double pressure, double h) const { return p > 0 && pressure == p && h >= h_liquid && h <= h_vapour; }
};

struct Node {
  double x = 0;  // ln p
  double p = 0;  // Pa
  double h = 0;  // J/kg, the current iterate
  bool evaluated = false;  // H, J, region and quality are those at (p, h)
  double H = 0;            // p v, J/kg
  double J = 0;            // (dH/dh)_p
  int region = 0;
  double quality = -1;  // of a wet node; -1 for one phase
  State state;          // the last state computed here (or near by): the next hint
  bool has_state = false;
  SaturationLine line;  // at p, once the node was wet there
};

// Where the fluid changes region at the end of a segment, and how either side is told.
struct Crossing {
  int before = 0;  // regions before and after, in the direction of the path
  int after = 0;
  // At the saturation line (wet on one side only) the side is the sign of
  // sign * (h - h_sat(p)), h_sat the saturated liquid's (quality 0) or vapour's (1) enthalpy:
  // continuous, so the crossing is its root. Elsewhere (IF97's region boundaries) only the
  // region tells, by bisection.
  bool saturation = false;
  bool dry_before = true;  // the side before is single-phase
  double quality = 1;
  double sign = 1;  // makes the side value positive before the crossing
  // Where it was located: h_sat there and d(side)/dx, for predicting how far it moves.
  double enthalpy = 0;
  double slope = 0;
};

struct Segment {
  double x0 = 0;
  double x1 = 0;
  bool crossing_start = false;  // the segment starts (ends) where the fluid changes region
  bool crossing_end = false;
  Crossing crossing;  // the one at the end, when crossing_end
  std::array<Node, kDegree + 1> nodes;
  double length() const { return x1 - x0; }
  // The polynomial through the nodal enthalpies, as a function of x.
  double enthalpy_at(double x) const {
    Values h;
    for (std::size_t i = 0; i <= kLast; ++i) h[i] = nodes[i].h;
    return rule().interpolate(h, (x - x0) / length());
  }
  int region_near_end() const { return nodes[kLast - 1].region; }
  int region_near_start() const { return nodes[1].region; }
};

// The path near a boundary: segment `a`'s polynomials up to `boundary`, segment `b`'s beyond
// (the same segment twice inside one).
struct PathView {
  const Segment& a;
  const Segment& b;
  bool rising;  // ln p grows along the path
  const Segment& at(double x) const { return (rising ? x <= a.x1 : x >= a.x1) ? a : b; }
  double enthalpy(double x) const { return at(x).enthalpy_at(x); }
};

// (dH/dh)_p = p (dv/dT)_p / cp = H alpha_v / cp for a single-phase state.
double slope(const State& st, double H) { return st.cp > 0 ? H * st.expansivity / st.cp : 0.0; }

// The saturation line at p, or an unknown one (p = 0) where the model has none.
SaturationLine saturation_line(const FluidModel& fluid, double p) {
  try {
    const auto [liquid, vapour] = fluid.saturated(p);
    return {p, liquid.enthalpy, vapour.enthalpy, 1.0 / liquid.density, 1.0 / vapour.density, liquid.region};
  } catch (const Error&) {
    return {};
  }
}

// How to tell the sides of a change from region `before` to `after` (qualities -1 when
// single-phase).
Crossing crossing_between(int before, double before_quality, int after, double after_quality) {
  Crossing c;
  c.before = before;
  c.after = after;
  c.dry_before = before_quality < 0;
  c.saturation = c.dry_before != (after_quality < 0);
  if (c.saturation) {
    const double q = std::max(before_quality, after_quality);
    c.quality = q >= 0.5 ? 1.0 : 0.0;
    // Dry beyond the vapour line means h > h_g; dry beyond the liquid line, h < h_f.
    c.sign = (c.quality == 1.0) == c.dry_before ? 1.0 : -1.0;
  }
  return c;
}

Crossing crossing_between(const Node& before, const Node& after) {
  return crossing_between(before.region, before.quality, after.region, after.quality);
}

// The state at (p, h), or near it. From `hint`, a single-phase state near by, T is predicted
// with h(p, T) ~ h_h + cp (T - T_h) + v (1 - T alpha_v) (p - p_h) and corrected by Newton's
// method on states from (p, T), which cost a fraction of the solve behind from_ph. A state in
// the hint's region is taken once it misses h by at most 1 % of the distance from the hint (or
// by `tolerance`): the caller takes the state's own H and corrects it to h to first order.
// Otherwise, or when the steps do not close in, the state comes from (p, h).
State state_near(const FluidModel& fluid, double p, double h, const State* hint, double tolerance) {
  if (hint != nullptr && !hint->is_wet() && hint->cp > 0) {
    const double v = 1.0 / hint->density;
    const double pressure_term = v * (1.0 - hint->temperature * hint->expansivity) * (p - hint->pressure);
    const double distance = h - hint->enthalpy - pressure_term;
    const double accept = 0.01 * (std::fabs(h - hint->enthalpy) + std::fabs(pressure_term)) + tolerance;
    const fluids::Range range = fluid.temperature_range();
    double T = hint->temperature + distance / hint->cp;
    double miss = std::numeric_limits<double>::infinity();
    try {
      // A temperature outside the range is left to from_ph, which knows the range in h: an
      // exception costs more than a state.
      for (int step = 0; step < 3 && range.contains(T); ++step) {
        const State st = fluid.from_pt(p, T);
        const double next_miss = std::fabs(st.enthalpy - h);
        if (st.region != hint->region || !(next_miss < 0.5 * miss)) break;
        if (next_miss <= accept) return st;
        miss = next_miss;
        T = st.temperature + (h - st.enthalpy) / st.cp;
      }
    } catch (const Error&) {
      // at the saturation temperature, or outside the range: from (p, h) decides
    }
  }
  return fluid.from_ph(p, h);
}

class PathSolver {
 public:
  PathSolver(const FluidModel& fluid, const State& inlet, double p2, double factor, const State* outlet);
  PathResult run(const State* outlet);

 private:
  // set-up and node placement
  double pressure_at(double x) const;
  double guess(double x, const State* outlet) const;
  template <class Path>
  void set_nodes(Segment& seg, double x0, double x1, const Path& path, const Segment* previous) const;
  // evaluation
  void sync_start(std::size_t k);
  void evaluate();
  void evaluate_node(Node& node, const State* neighbour, double x);
  void wet_node(Node& node);
  void shift(Node& node, double step);
  void update_tolerance();
  // the collocation equations
  double newton();
  double truncation(const Segment& seg) const;
  bool refine();
  // crossings
  bool split_at_region_change();
  double side(const Crossing& c, const PathView& path, double x);
  double locate(Crossing& c, const PathView& path, double xa, double xb);
  bool relocate_crossings();
  bool relocate(std::size_t k);
  std::optional<double> secant_crossing(Crossing& c, const PathView& path, double old, double low, double high);
  std::optional<double> search_crossing(Crossing& c, const PathView& path, double old, const double (&reach)[2]);
  void presplit(const State* outlet);
  bool crossing_settled(std::size_t k) const;
  void split(std::size_t k, double x, const Crossing* crossing);
  void move_boundary(std::size_t k, double x);
  void carry_over(Segment& seg, const Segment& old, std::size_t first);
  PathView view(std::size_t k) const { return {segments_[k], segments_[k + 1], length_ > 0}; }

  const FluidModel& fluid_;
  State inlet_;
  double x1_, x2_, length_;  // ln p1, ln p2, ln(p2/p1)
  double p1_, p2_;
  double factor_;
  bool solve_factor_;
  double h2_ = 0;
  double tolerance_ = 0;
  std::vector<Segment> segments_;
  std::vector<double> corrections_;  // largest Newton correction per segment, last sweep
  int sweeps_ = 0;
  int evaluations_ = 0;
};

PathSolver::PathSolver(const FluidModel& fluid, const State& inlet, double p2, double factor, const State* outlet)
    : fluid_(fluid), inlet_(inlet), x1_(std::log(inlet.pressure)), x2_(std::log(p2)),
      length_(std::log1p((p2 - inlet.pressure) / inlet.pressure)), p1_(inlet.pressure), p2_(p2),
      factor_(factor), solve_factor_(outlet != nullptr) {
  const double H1 = p1_ / inlet.density;
  if (outlet != nullptr) {
    h2_ = outlet->enthalpy;
    const double H2 = p2_ / outlet->density;
    factor_ = (h2_ - inlet.enthalpy) / (0.5 * (H1 + H2) * length_);
  }
  const auto count = static_cast<std::size_t>(std::max(1.0, std::ceil(std::fabs(length_) / kInitialLength)));
  segments_.resize(count);
  corrections_.assign(count, 0.0);
  const auto first_guess = [&](double x) { return guess(x, outlet); };
  for (std::size_t k = 0; k < count; ++k) {
    const double n = static_cast<double>(count);
    const double a = k == 0 ? x1_ : x1_ + length_ * static_cast<double>(k) / n;
    const double b = k + 1 == count ? x2_ : x1_ + length_ * static_cast<double>(k + 1) / n;
    set_nodes(segments_[k], a, b, first_guess, nullptr);
  }
  Node& first = segments_.front().nodes[0];
  first.h = inlet.enthalpy;
  first.state = inlet;
  first.has_state = true;
  first.evaluated = true;
  if (inlet.is_wet()) first.line = saturation_line(fluid, p1_);
  if (first.line.holds(p1_, first.h)) {
    wet_node(first);
  } else {
    first.H = H1;
    first.J = inlet.is_wet() ? 0.0 : slope(inlet, H1);
    first.region = inlet.region;
    first.quality = inlet.is_wet() ? *inlet.quality : -1.0;
  }
}

// exp(x) at a node, with the ends exact: the outlet pressure is the caller's own, and a
// rounded exp(ln p2) could lie just outside the model's range.
double PathSolver::pressure_at(double x) const {
  if (x == x1_) return p1_;
  if (x == x2_) return p2_;
  return std::clamp(std::exp(x), std::min(p1_, p2_), std::max(p1_, p2_));
}

// The first path: forward, with H growing as exp(f J1 (x - x1)) (exact for an ideal gas of
// constant cp, where H = R T); when the outlet is known, with H linear in x between the
// inlet's and the outlet's.
double PathSolver::guess(double x, const State* outlet) const {
  const double H1 = p1_ / inlet_.density;
  const double t = (x - x1_) / length_;
  if (outlet == nullptr) {
    const double rate = factor_ * slope(inlet_, H1);
    const double dx = x - x1_;
    const double growth = std::fabs(rate * dx) > 1e-8 ? std::expm1(rate * dx) / rate : dx;
    return inlet_.enthalpy + factor_ * H1 * growth;
  }
  const double H2 = p2_ / outlet->density;
  const double shape = (H1 * t + 0.5 * (H2 - H1) * t * t) / (0.5 * (H1 + H2));
  return inlet_.enthalpy + (outlet->enthalpy - inlet_.enthalpy) * shape;
}

// Places the nodes of `seg` on [x0, x1] with entropies from `path`; each node keeps what the
// nearest node of `previous` (the segment it was cut from) knew, as hints.
template <class Path>
void PathSolver::set_nodes(Segment& seg, double x0, double x1, const Path& path, const Segment* previous) const {
  std::array<Node, kDegree + 1> old{};
  if (previous != nullptr) old = previous->nodes;
  seg.x0 = x0;
  seg.x1 = x1;
  for (std::size_t i = 0; i <= kLast; ++i) {
    const double x = i == 0 ? x0 : i == kLast ? x1 : x0 + (x1 - x0) * rule().node(static_cast<int>(i));
    Node node;
    if (previous != nullptr) {
      node = *std::min_element(old.begin(), old.end(), [x](const Node& a, const Node& b) {
        return std::fabs(a.x - x) < std::fabs(b.x - x);
      });
    }
    node.x = x;
    node.p = pressure_at(x);
    node.h = path(x);
    node.evaluated = false;
    seg.nodes[i] = node;
  }
}

// A segment's first node is the previous segment's last; at a crossing it is its own, with
// the same x and s, its state taken a hair inside the segment.
void PathSolver::sync_start(std::size_t k) {
  Segment& seg = segments_[k];
  const Node& end = segments_[k - 1].nodes[kLast];
  if (!seg.crossing_start) {
    seg.nodes[0] = end;
    return;
  }
  Node& start = seg.nodes[0];
  if (start.x != end.x) {
    start.x = end.x;
    start.p = end.p;
    start.h = end.h;
    start.evaluated = false;
  } else if (start.h != end.h) {
    shift(start, end.h - start.h);
  }
}

void PathSolver::evaluate() {
  const double inside = kInside * length_;
  for (std::size_t k = 0; k < segments_.size(); ++k) {
    Segment& seg = segments_[k];
    if (k > 0) sync_start(k);
    Node& start = seg.nodes[0];
    if (seg.crossing_start && !start.evaluated) evaluate_node(start, nullptr, start.x + inside);
    for (std::size_t i = 1; i <= kLast; ++i) {
      Node& node = seg.nodes[i];
      if (node.evaluated) continue;
      // The end at a crossing sits a hair from the boundary, where (p, T) may be too close
      // to saturation to fix a state: it comes from (p, s).
      if (i == kLast && seg.crossing_end) {
        evaluate_node(node, nullptr, node.x - inside);
      } else {
        evaluate_node(node, &seg.nodes[i - 1].state, node.x);
      }
    }
  }
}

// Evaluates a node at its enthalpy and at ln p = x (its own x, or a hair inside its segment).
// Without a neighbour the state comes from (p, s) exactly.
void PathSolver::evaluate_node(Node& node, const State* neighbour, double x) {
  const double p = x == node.x ? node.p : pressure_at(x);
  // A node taken a hair off its place is taken on the path there: h moved by dh/dx = f H.
  const double H_known = node.H != 0 ? node.H : p1_ / inlet_.density;
  const double h = x == node.x ? node.h : node.h + factor_ * H_known * (x - node.x);
  const State* hint = neighbour == nullptr ? nullptr : node.has_state ? &node.state : neighbour;
  if (hint != nullptr && hint->is_wet() && node.line.p != p) node.line = saturation_line(fluid_, p);
  if (node.line.holds(p, h)) return wet_node(node);
  try {
    node.state = state_near(fluid_, p, h, hint, tolerance_);
  } catch (const Error& e) {
    // The first path is a guess and may overshoot the model's range where the path does
    // not: there the node falls back once on the enthalpy of the state it had, or else of its
    // neighbour. Later, the error stands.
    const double fallback = node.has_state ? node.state.enthalpy : hint != nullptr ? hint->enthalpy : inlet_.enthalpy;
    if (e.kind() != ErrorKind::out_of_range || sweeps_ > 1 || node.h == fallback) throw;
    node.h = fallback;
    node.state = fluid_.from_ph(p, node.h);
  }
  ++evaluations_;
  node.has_state = true;
  if (node.state.is_wet()) {
    node.line = saturation_line(fluid_, p);
    if (node.line.holds(p, h)) return wet_node(node);
  }
  // A state a little off the node's enthalpy (see state_near) stands for the node through
  // H(h) = H(h') + J (h - h'): the error is of second order in the miss.
  const double H = p / node.state.density;
  node.J = node.state.is_wet() ? 0.0 : slope(node.state, H);
  node.H = H + node.J * (node.h - node.state.enthalpy);
  node.region = node.state.region;
  node.quality = node.state.is_wet() ? *node.state.quality : -1.0;
  node.evaluated = true;
}

// A wet node from its saturation line: H and J exact, no state needed.
void PathSolver::wet_node(Node& node) {
  const SaturationLine& line = node.line;
  const double x = (node.h - line.h_liquid) / (line.h_vapour - line.h_liquid);
  const double v = line.v_liquid + x * (line.v_vapour - line.v_liquid);
  node.H = line.p * v;
  node.J = line.p * (line.v_vapour - line.v_liquid) / (line.h_vapour - line.h_liquid);
  node.region = line.region;
  node.quality = x;
  node.evaluated = true;
}

// Moves a node's enthalpy by `step`. Where H is known to be linear in h (a wet node on its
// saturation line), or the step changes H by at most 1e-6 of itself (so that the rest of its
// Taylor series is about 1e-12 of H), H follows without a new state.
void PathSolver::shift(Node& node, double step) {
  node.h += step;
  if (!node.evaluated) return;
  if (node.quality >= 0 && node.line.holds(node.line.p, node.h) && node.region == node.line.region) {
    wet_node(node);
  } else if (std::fabs(node.J * step) <= 1e-6 * std::fabs(node.H)) {
    node.H += node.J * step;
  } else {
    node.evaluated = false;
  }
}

void PathSolver::update_tolerance() {
  double largest = 0;
  for (const Segment& seg : segments_) {
    for (const Node& node : seg.nodes) largest = std::max(largest, std::fabs(node.H));
  }
  const double scale = std::max(std::fabs(inlet_.enthalpy), std::fabs(segments_.back().nodes[kLast].h));
  tolerance_ = std::max(kPathTolerance * std::max(factor_, 1e-3) * largest * std::fabs(length_), kRounding * scale);
}

// One Newton step on the collocation equations of all segments, h_j = h_0 + f L sum_i
// W(j, i) H_i, and on f when the outlet enthalpy is given. Each segment's correction is
// a + b df, carried from its first node; returns the largest correction.
double PathSolver::newton() {
  const Rule& r = rule();
  std::vector<std::array<std::array<double, 2>, kDegree>> steps(segments_.size());
  double carry_a = 0, carry_b = 0;  // correction of the segment's first node: carry_a + carry_b df
  for (std::size_t k = 0; k < segments_.size(); ++k) {
    const Segment& seg = segments_[k];
    const double L = seg.length();
    const double c = factor_ * L;
    std::array<std::array<double, kDegree>, kDegree> matrix{};
    auto& rhs = steps[k];
    for (int j = 1; j <= kDegree; ++j) {
      double integral = 0;
      for (int i = 0; i <= kDegree; ++i) integral += r.integral_weight(j, i) * seg.nodes[static_cast<std::size_t>(i)].H;
      const auto row = static_cast<std::size_t>(j - 1);
      const double residual = seg.nodes[row + 1].h - seg.nodes[0].h - c * integral;
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
  if (solve_factor_) {
    df = (h2_ - segments_.back().nodes[kLast].h - carry_a) / carry_b;
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
      shift(seg.nodes[j], step);
      corrections_[k] = std::max(corrections_[k], std::fabs(step));
    }
    largest = std::max(largest, corrections_[k]);
    if (k + 1 < segments_.size()) sync_start(k + 1);
  }
  return largest;
}

// The error in h that a segment adds at its end, from the Chebyshev coefficients of H: the
// last pair, scaled by how fast the pairs fall (the next pair's share), at most by 1.
double PathSolver::truncation(const Segment& seg) const {
  Values H;
  for (std::size_t i = 0; i <= kLast; ++i) H[i] = seg.nodes[i].H;
  const Values a = rule().coefficients(H);
  const double last = std::fabs(a[kLast - 1]) + std::fabs(a[kLast]);
  const double before = std::fabs(a[kLast - 3]) + std::fabs(a[kLast - 2]);
  const double fall = before > 0 ? std::min(1.0, last / before) : 1.0;
  return std::fabs(factor_ * seg.length()) * last * fall;
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

// Finds where the region changes between two nodes of a segment and cuts the path there:
// a new boundary, or the crossing at the segment's start or end moved to it when the nodes
// before (after) the change lie in the neighbouring segment's region. True when the
// segments changed.
bool PathSolver::split_at_region_change() {
  for (std::size_t k = 0; k < segments_.size(); ++k) {
    const Segment& seg = segments_[k];
    std::size_t i = 1;
    while (i <= kLast && seg.nodes[i].region == seg.nodes[0].region) ++i;
    if (i > kLast) continue;
    Crossing c = crossing_between(seg.nodes[i - 1], seg.nodes[i]);
    const double x = locate(c, PathView{seg, seg, length_ > 0}, seg.nodes[i - 1].x, seg.nodes[i].x);
    bool rest_beyond = seg.crossing_end && k + 1 < segments_.size();
    for (std::size_t j = i; j <= kLast && rest_beyond; ++j) {
      rest_beyond = seg.nodes[j].region == segments_[k + 1].region_near_start();
    }
    if (seg.crossing_start && k > 0 && c.before == segments_[k - 1].region_near_end()) {
      segments_[k - 1].crossing = c;
      move_boundary(k - 1, x);  // the crossing at the start lies further on
    } else if (rest_beyond) {
      segments_[k].crossing = c;
      move_boundary(k, x);  // the crossing at the end lies earlier
    } else {
      split(k, x, &c);
    }
    return true;
  }
  return false;
}

// Positive on the `before` side of a crossing, negative beyond; see Crossing.
double PathSolver::side(const Crossing& c, const PathView& path, double x) {
  ++evaluations_;
  const double p = pressure_at(x);
  if (c.saturation) {
    try {
      const auto ends = fluid_.saturated(p);
      return c.sign * (path.enthalpy(x) - (c.quality == 1.0 ? ends.vapour : ends.liquid).enthalpy);
    } catch (const Error&) {
      return c.dry_before ? 1.0 : -1.0;  // no saturation line at p (critical or above): dry
    }
  }
  // Elsewhere the model's own (p, h) rule: where two regions' equations overlap (IF97's agree
  // on their boundaries only within its consistency limits) a rule in (p, T) would put the
  // boundary elsewhere.
  return fluid_.from_ph(p, path.enthalpy(x)).region == c.before ? 1.0 : -1.0;
}

// The crossing between xa (before it) and xb (beyond): the Illinois method (Dowell and
// Jarratt, BIT 11 (1971) 168) on the side value at the saturation line, bisection elsewhere.
// Records where the saturated enthalpy stood and the side value's slope there.
double PathSolver::locate(Crossing& c, const PathView& path, double xa, double xb) {
  const double tolerance = kLocateTolerance * std::fabs(length_);
  if (!c.saturation) {
    double a = xa, b = xb;
    while (std::fabs(b - a) > tolerance) {
      const double m = 0.5 * (a + b);
      (side(c, path, m) > 0 ? a : b) = m;
    }
    return 0.5 * (a + b);
  }
  double a = xa, b = xb, fa = side(c, path, a), fb = side(c, path, b);
  if (!(fa > 0 && fb <= 0)) {  // the saturated states are out of step with the regions: bisect
    c.saturation = false;
    return locate(c, path, xa, xb);
  }
  c.slope = (fb - fa) / (b - a);
  for (int i = 0; i < 100 && std::fabs(b - a) > tolerance && fb != 0; ++i) {
    const double x = b - fb * (b - a) / (fb - fa);
    const double fx = side(c, path, x);
    c.slope = (fx - fb) / (x - b);
    if (fx * fb < 0) {
      a = b;
      fa = fb;
    } else {
      fa *= 0.5;  // the end that stays is weighted down
    }
    b = x;
    fb = fx;
  }
  c.enthalpy = path.enthalpy(b) - c.sign * fb;
  return b;
}

bool PathSolver::relocate_crossings() {
  bool moved = false;
  for (std::size_t k = 0; k + 1 < segments_.size(); ++k) {
    if (!segments_[k].crossing_end || crossing_settled(k)) continue;
    moved = relocate(k) || moved;
  }
  return moved;
}

// Whether the crossing at the end of segment k may stay where it is: the path near it moved
// too little to shift it by anything that matters. At the saturation line the shift is
// predicted from the side value's slope, and a boundary off by dx costs about
// f |jump of dH/dx| dx (w + dx) in h, w the weight of a segment's end node. Elsewhere (IF97's
// region boundaries, where H jumps by about 1e-5 of itself) a correction below 1e3 times the
// tolerance moves the boundary too little to count.
bool PathSolver::crossing_settled(std::size_t k) const {
  const Segment& a = segments_[k];
  const Segment& b = segments_[k + 1];
  const double correction = std::max(corrections_[k], corrections_[k + 1]);
  if (correction <= tolerance_) return true;
  const Crossing& c = a.crossing;
  if (!c.saturation) return correction <= 1e3 * tolerance_;
  if (!(std::fabs(c.slope) > 0)) return false;
  const double moved = std::fabs(c.sign * (a.nodes[kLast].h - c.enthalpy) / c.slope);
  const auto gradient = [](const Node& n0, const Node& n1) { return (n1.H - n0.H) / (n1.x - n0.x); };
  const double kink = std::fabs(gradient(a.nodes[kLast - 1], a.nodes[kLast]) - gradient(b.nodes[0], b.nodes[1]));
  const double weight = std::max(std::fabs(a.length()), std::fabs(b.length())) / (kDegree * kDegree - 1);
  return std::fabs(factor_) * kink * moved * (weight + moved) <= 0.1 * tolerance_;
}

// Moves the crossing between segments k and k + 1 to where the updated path meets the
// boundary: at the saturation line by the secant method from where the cached slope puts it,
// else (or when that fails) by a search outward from the old place for the side change, then
// locate().
bool PathSolver::relocate(std::size_t k) {
  Segment& a = segments_[k];
  Segment& b = segments_[k + 1];
  if (a.region_near_end() == b.region_near_start()) {  // the path no longer crosses here
    a.crossing_end = b.crossing_start = false;
    return true;
  }
  Crossing c = a.crossing;
  const PathView path = view(k);
  const double old = a.x1;
  const double reach[2] = {a.nodes[1].x, b.nodes[kLast - 1].x};
  std::optional<double> found;
  if (c.saturation) found = secant_crossing(c, path, old, std::min(reach[0], reach[1]), std::max(reach[0], reach[1]));
  if (!found) {
    c = a.crossing;
    found = search_crossing(c, path, old, reach);
    if (!found) {  // no change of region within reach: cut anew next sweep
      a.crossing_end = b.crossing_start = false;
      return true;
    }
  }
  a.crossing = c;
  if (std::fabs(*found - old) <= 10 * kLocateTolerance * std::fabs(length_)) return false;
  move_boundary(k, *found);
  return true;
}

// The secant method on the side value of a saturation crossing, from its old place `old`
// (where the cached saturated enthalpy gives the value without a state) and the place the
// cached slope predicts; empty when it leaves [low, high] or does not close in.
std::optional<double> PathSolver::secant_crossing(Crossing& c, const PathView& path, double old, double low,
                                                  double high) {
  const double tolerance = kLocateTolerance * std::fabs(length_);
  if (!(std::fabs(c.slope) > 0)) return std::nullopt;
  double x0 = old;
  double f0 = c.sign * (path.enthalpy(old) - c.enthalpy);
  double slope = c.slope;
  for (int i = 0; i < 8; ++i) {
    const double x1 = x0 - f0 / slope;
    if (!(x1 >= low && x1 <= high)) return std::nullopt;
    const double f1 = side(c, path, x1);
    if (x1 != x0) slope = (f1 - f0) / (x1 - x0);
    if (std::fabs(x1 - x0) <= tolerance || f1 == 0) {
      c.slope = slope;
      c.enthalpy = path.enthalpy(x1) - c.sign * f1;
      return x1;
    }
    x0 = x1;
    f0 = f1;
  }
  return std::nullopt;
}

// Searches outward from `old` (toward whichever of reach[0] (before) and reach[1] (beyond) the
// side value there points) for a change of side, then locates the crossing in it.
std::optional<double> PathSolver::search_crossing(Crossing& c, const PathView& path, double old,
                                                  const double (&reach)[2]) {
  const double forward = length_ > 0 ? 1.0 : -1.0;
  const bool beyond = side(c, path, old) > 0;  // the crossing lies further on
  const double direction = beyond ? forward : -forward;
  const double limit = beyond ? reach[1] : reach[0];
  double near = old;
  for (double w = 1e-10 * std::fabs(length_);; w *= 16) {
    const double far = (old + direction * w - limit) * direction >= 0 ? limit : old + direction * w;
    const bool far_before = side(c, path, far) > 0;
    if (far_before != beyond) return beyond ? locate(c, path, near, far) : locate(c, path, far, near);
    if (far == limit) return std::nullopt;
    near = far;
  }
}

// Cuts segment k at x; `crossing` says what changes there, if anything.
void PathSolver::split(std::size_t k, double x, const Crossing* crossing) {
  const double shortest = kShortest * std::fabs(length_);
  Segment& seg = segments_[k];
  if (std::fabs(x - seg.x0) <= shortest || std::fabs(x - seg.x1) <= shortest) {
    // At one of the segment's ends: that boundary is the crossing (at the inlet or the
    // outlet, the end node is then taken a hair inside the path).
    if (crossing == nullptr) return;
    const bool at_start = std::fabs(x - seg.x0) <= std::fabs(x - seg.x1);
    if (at_start) {
      seg.crossing_start = true;
      seg.nodes[0].evaluated = false;
      if (k > 0) {
        segments_[k - 1].crossing_end = true;
        segments_[k - 1].crossing = *crossing;
      }
    } else {
      seg.crossing_end = true;
      seg.crossing = *crossing;
      seg.nodes[kLast].evaluated = false;
      if (k + 1 < segments_.size()) segments_[k + 1].crossing_start = true;
    }
    return;
  }
  if (segments_.size() >= kMaxSegments) {
    throw Error(ErrorKind::no_convergence,
                fmt::format("polytropic path from {:.6g} Pa to {:.6g} Pa: more than {} segments needed", p1_,
                            p2_, kMaxSegments));
  }
  const Segment whole = seg;
  const auto path = [&whole](double xx) { return whole.enthalpy_at(xx); };
  Segment first, second;
  set_nodes(first, whole.x0, x, path, &whole);
  set_nodes(second, x, whole.x1, path, &whole);
  first.crossing_start = whole.crossing_start;
  first.crossing_end = second.crossing_start = crossing != nullptr;
  if (crossing != nullptr) first.crossing = *crossing;
  second.crossing_end = whole.crossing_end;
  second.crossing = whole.crossing;
  first.nodes[0] = whole.nodes[0];
  segments_[k] = first;
  segments_.insert(segments_.begin() + static_cast<std::ptrdiff_t>(k) + 1, second);
  corrections_.insert(corrections_.begin() + static_cast<std::ptrdiff_t>(k) + 1, corrections_[k]);
}

// Moves the boundary between segments k and k + 1 to x, re-placing both segments' nodes. A
// move by at most 1e-4 of the segments carries H and J over by interpolation (their
// polynomials are as good there as at the nodes), so no state is needed.
void PathSolver::move_boundary(std::size_t k, double x) {
  const double shortest = kShortest * length_;  // signed, like the segments
  const double low = segments_[k].x0 + shortest;
  const double high = segments_[k + 1].x1 - shortest;
  x = length_ > 0 ? std::clamp(x, low, high) : std::clamp(x, high, low);
  const Segment a = segments_[k];
  const Segment b = segments_[k + 1];
  const PathView joined{a, b, length_ > 0};
  const auto path = [&joined](double xx) { return joined.enthalpy(xx); };
  set_nodes(segments_[k], a.x0, x, path, &a);
  segments_[k].nodes[0] = a.nodes[0];
  set_nodes(segments_[k + 1], x, b.x1, path, &b);
  sync_start(k + 1);
  const double move = std::fabs(x - a.x1);
  if (move > 1e-4 * std::min(std::fabs(a.length()), std::fabs(b.length()))) return;
  carry_over(segments_[k], a, 1);
  carry_over(segments_[k + 1], b, segments_[k + 1].crossing_start ? 0 : 1);
  // The nodes at the boundary itself are evaluated anew: which side they fall on may change.
  segments_[k].nodes[kLast].evaluated = false;
  segments_[k + 1].nodes[0].evaluated = false;
}

// Gives the nodes of `seg` (from index `first` on) the H and J of `old`'s polynomials, for a
// segment whose ends moved a little.
void PathSolver::carry_over(Segment& seg, const Segment& old, std::size_t first) {
  Values H, J;
  for (std::size_t i = 0; i <= kLast; ++i) {
    H[i] = old.nodes[i].H;
    J[i] = old.nodes[i].J;
  }
  const Values a = rule().coefficients(H);
  const Values b = rule().coefficients(J);
  for (std::size_t i = first; i <= kLast; ++i) {
    Node& node = seg.nodes[i];
    const double t = (node.x - old.x0) / old.length();
    node.H = Rule::evaluate(a, t);
    node.J = Rule::evaluate(b, t);
    node.line.p = 0;  // the saturation line was at the old pressure
    node.evaluated = true;
  }
}

// Before the first sweep: when the first path ends on the other side of the saturation line
// than it starts, the crossing is cut on it at once, which saves a sweep over an uncut path.
void PathSolver::presplit(const State* outlet) {
  const Node& first = segments_.front().nodes[0];
  const Node& last = segments_.back().nodes[kLast];
  State end;
  try {
    end = outlet != nullptr ? *outlet : fluid_.from_ph(p2_, last.h);
  } catch (const Error&) {
    return;  // the sweeps will tell
  }
  const double end_quality = end.is_wet() ? *end.quality : -1.0;
  if ((first.quality < 0) == (end_quality < 0)) return;
  Crossing c = crossing_between(first.region, first.quality, end.region, end_quality);
  for (std::size_t k = 0; k < segments_.size(); ++k) {
    const Segment& seg = segments_[k];
    const PathView path{seg, seg, length_ > 0};
    if (side(c, path, seg.x0) > 0 && side(c, path, seg.x1) <= 0) {
      split(k, locate(c, path, seg.x0, seg.x1), &c);
      return;
    }
  }
}

PathResult PathSolver::run(const State* outlet) {
  presplit(outlet);
  for (sweeps_ = 1; sweeps_ <= kMaxSweeps; ++sweeps_) {
    evaluate();
    update_tolerance();
    if (split_at_region_change()) continue;
    const double step = newton();
    const bool moved = relocate_crossings();
    // The segments' truncation errors mean something once the path stands nearly still.
    const bool cut = !moved && step <= 1e6 * tolerance_ && refine();
    if (step <= tolerance_ && !moved && !cut) {
      PathResult result;
      result.outlet_enthalpy = segments_.back().nodes[kLast].h;
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

}  // namespace

PathResult integrate_path(const FluidModel& fluid, const State& inlet, double p2, double factor) {
  return PathSolver(fluid, inlet, p2, factor, nullptr).run(nullptr);
}

PathResult solve_path_factor(const FluidModel& fluid, const State& inlet, const State& outlet) {
  return PathSolver(fluid, inlet, outlet.pressure, 1.0, &outlet).run(&outlet);
}

}  // namespace shaftwork::machines::detail

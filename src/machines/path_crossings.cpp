// The polytropic path's crossings: where the fluid changes region, found on the segments'
// polynomials and followed as the path converges; the segments cut there. See
// polytropic_path.hpp for the method and path_solver.hpp for the pieces.
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "path_solver.hpp"
#include "shaftwork/error.hpp"

namespace shaftwork::machines::detail {

using fluids::State;

namespace {

// Crossings are located to this fraction of |ln(p2/p1)|.
constexpr double kLocateTolerance = 1e-13;
constexpr double kSliver = 1e-4;  // of |ln(p2/p1)|: see split_at_region_change
// No segment is shorter than this fraction of |ln(p2/p1)|.
constexpr double kShortest = 1e-12;
constexpr std::size_t kMaxSegments = 64;

}  // namespace

Crossing crossing_between(int before, double before_quality, int after, double after_quality) {
  Crossing c;
  c.before = before;
  c.after = after;
  c.dry_before = before_quality < 0;
  c.saturation = c.dry_before != (after_quality < 0);
  if (c.saturation) {
    const double q = std::max(before_quality, after_quality);
    c.quality = q >= 0.5 ? 1.0 : 0.0;
    // Dry beyond the vapour line means h > h_g and s > s_g; beyond the liquid line, below.
    c.sign = (c.quality == 1.0) == c.dry_before ? 1.0 : -1.0;
  }
  return c;
}

// Before the first sweep: when the first path ends on the other side of the saturation line
// than it starts, the crossing is cut on it at once, which saves a sweep over an uncut path.
void PathSolver::presplit() {
  const Node& first = segments_.front().nodes[0];
  const Segment& last = segments_.back();
  State end;
  try {
    end = outlet_ != nullptr                 ? *outlet_
          : last.form == Form::entropy ? fluid_.from_ps(p2_, last.nodes[kLast].y)
                                       : fluid_.from_ph(p2_, last.nodes[kLast].y);
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
      // On a first path, found to 1e-6 of the path: the sweeps move it anyway.
      split(k, locate(c, path, seg.x0, seg.x1, 1e-6), &c);
      return;
    }
  }
}

// Finds where the region changes between two nodes of a segment and cuts the path there:
// a new boundary, or the crossing at the segment's start or end moved to it when the nodes
// before (after) the change lie in the neighbouring segment's region. True when the
// segments changed.
bool PathSolver::split_at_region_change() {
  for (std::size_t k = 0; k < segments_.size(); ++k) {
    const Segment& seg = segments_[k];
    // The ends of a segment at a crossing stand a hair from it, and a crossing the path has
    // not settled on yet may put one on the far side: relocation (after Newton's step) takes
    // care of those, so only the nodes inside count here.
    const std::size_t lo = seg.crossing_start ? 1 : 0;
    const std::size_t hi = seg.crossing_end ? kLast - 1 : kLast;
    std::size_t i = lo + 1;
    while (i <= hi && seg.nodes[i].region == seg.nodes[lo].region) ++i;
    if (i > hi) continue;
    const Node& before = seg.nodes[i - 1];
    const Node& after = seg.nodes[i];
    Crossing c = crossing_between(before.region, before.quality, after.region, after.quality);
    bool rest_beyond = seg.crossing_end && k + 1 < segments_.size();
    for (std::size_t j = i; j <= hi && rest_beyond; ++j) {
      rest_beyond = seg.nodes[j].region == segments_[k + 1].region_near_start();
    }
    const bool further = seg.crossing_start && k > 0 && c.before == segments_[k - 1].region_near_end();
    const double x = locate(c, PathView{seg, seg, length_ > 0}, before.x, after.x, kLocateTolerance);
    // Next to a crossing already made, within a sliver: IF97's regions agree on their
    // boundaries only within its consistency limits, and a node there may see either side.
    // A boundary off by the sliver costs less than the tolerance (p v jumps by about 1e-5 of
    // itself there); cutting again would not end.
    const double sliver = kSliver * std::fabs(length_);
    if (!c.saturation && ((seg.crossing_start && std::fabs(x - seg.x0) <= sliver) ||
                          (seg.crossing_end && std::fabs(x - seg.x1) <= sliver))) {
      continue;
    }
    if (further) {
      segments_[k - 1].crossing = c;
      take_crossing_form(k - 1);
      move_boundary(k - 1, x);  // the crossing at the start lies further on
    } else if (rest_beyond) {
      segments_[k].crossing = c;
      take_crossing_form(k);
      move_boundary(k, x);  // the crossing at the end lies earlier
    } else {
      split(k, x, &c);
    }
    return true;
  }
  return false;
}

// Positive on the `before` side of a crossing, negative beyond; see Crossing. At the
// saturation line in J/kg (an entropy difference times T_sat), elsewhere +-1.
double PathSolver::side(const Crossing& c, const PathView& path, double x) {
  ++evaluations_;
  const double p = pressure_at(x);
  const Form form = path.form(x);
  const double y = path.value(x);
  if (c.saturation) {
    try {
      const auto ends = fluid_.saturated(p);
      const State& saturated = c.quality == 1.0 ? ends.vapour : ends.liquid;
      if (form == Form::enthalpy) return c.sign * (y - saturated.enthalpy);
      return c.sign * (y - saturated.entropy) * saturated.temperature;
    } catch (const Error&) {
      return c.dry_before ? 1.0 : -1.0;  // no saturation line at p (critical or above): dry
    }
  }
  // Elsewhere the model's region of the state at (p, y), by the rule the nodes' states are
  // taken with ((p, s) in the entropy form). Where two regions' equations overlap (IF97's
  // agree on their boundaries only within its consistency limits) the (p, s) and (p, h) rules
  // put the boundary a sliver apart; a crossing found by the other rule would leave a node of
  // the wrong side in that sliver and be split again and again.
  const State st = form == Form::enthalpy ? fluid_.from_ph(p, y) : fluid_.from_ps(p, y);
  return st.region == c.before ? 1.0 : -1.0;
}

// The crossing between xa (before it) and xb (beyond), to `fraction` of |ln(p2/p1)|: the Illinois method (Dowell and
// Jarratt, BIT 11 (1971) 168) on the side value at the saturation line, bisection elsewhere.
// Records the saturated value there, in the form of the side before, and the slope.
double PathSolver::locate(Crossing& c, const PathView& path, double xa, double xb, double fraction) {
  const double tolerance = fraction * std::fabs(length_);
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
    return locate(c, path, xa, xb, fraction);
  }
  for (int i = 0; i < 100 && std::fabs(b - a) > tolerance && fb != 0; ++i) {
    const double x = b - fb * (b - a) / (fb - fa);
    const double fx = side(c, path, x);
    if (fx * fb < 0) {
      a = b;
      fa = fb;
    } else {
      fa *= 0.5;  // the end that stays is weighted down
    }
    b = x;
    fb = fx;
  }
  if (!fix_saturation_line(c, c.dry_before ? Form::entropy : Form::enthalpy, b)) c.saturation = false;
  return b;
}

// Records y_sat and dy_sat/dx at x in `form` (the saturated vapour's or liquid's entropy or
// enthalpy), the latter by a difference over 1e-6 of |ln(p2/p1)|. False where the model has
// no saturation line there.
bool PathSolver::fix_saturation_line(Crossing& c, Form form, double x) const {
  try {
    const double dx = 1e-6 * length_;
    auto value = [&](double at) {
      const auto ends = fluid_.saturated(pressure_at(at));
      const State& saturated = c.quality == 1.0 ? ends.vapour : ends.liquid;
      return form == Form::entropy ? saturated.entropy : saturated.enthalpy;
    };
    c.x = x;
    c.saturated = value(x);
    c.saturated_slope = (value(x - dx) - c.saturated) / -dx;
    return true;
  } catch (const Error&) {
    return false;
  }
}

bool PathSolver::relocate_crossings() {
  bool moved = false;
  for (std::size_t k = 0; k + 1 < segments_.size(); ++k) {
    if (!segments_[k].crossing_end) continue;
    if (segments_[k].crossing.saturation) {
      moved = follow_saturation(k) || moved;
    } else if (std::max(corrections_[k], corrections_[k + 1]) > 1e3 * tolerance_) {
      // At IF97's region boundaries, where p v jumps by about 1e-5 of itself, a correction
      // below 1e3 times the tolerance moves the boundary too little to count.
      moved = relocate(k) || moved;
    }
  }
  return moved;
}

// Newton's step on the place x_b of a saturation crossing, at the end of segment k: the path
// y(x_b) (the segment's last node) must meet y_sat(x_b), and both move with x_b as the path
// dy/dx = c V and the line dy_sat/dx do. The step is skipped when a boundary off by it costs
// less than a tenth of the tolerance (about f |jump of d(p v)/dx| dx (w + dx) in h, w the
// weight of a segment's end node), and held to a tenth of the segment.
bool PathSolver::follow_saturation(std::size_t k) {
  Segment& a = segments_[k];
  Segment& b = segments_[k + 1];
  Crossing& c = a.crossing;
  const Node& end = a.nodes[kLast];
  const double x_b = a.x1;
  const double predicted = c.saturated + c.saturated_slope * (x_b - c.x);
  const double path_slope = coefficient(a.form) * end.V;
  const double dx = -(end.y - predicted) / (path_slope - c.saturated_slope);
  const auto gradient = [this](const Node& n0, const Node& n1, Form form) {
    return (scale(n1, form) * n1.V - scale(n0, form) * n0.V) / (n1.x - n0.x);
  };
  const double kink = std::fabs(gradient(a.nodes[kLast - 1], end, a.form) - gradient(b.nodes[0], b.nodes[1], b.form));
  const double weight = std::max(std::fabs(a.length()), std::fabs(b.length())) / (kDegree * kDegree - 1);
  if (!std::isfinite(dx) || std::fabs(factor_) * kink * std::fabs(dx) * (weight + std::fabs(dx)) <= 0.1 * tolerance_) {
    return false;
  }
  const double limit = 0.5 * std::min(std::fabs(a.length()), std::fabs(b.length()));
  if (std::fabs(dx) > limit) {
    // The crossing lies far from here (beyond a neighbouring segment, perhaps), or the
    // saturated states are out of step with the regions (IF97's wet states next to region 3):
    // steps held to a part of a shrinking segment would close in geometrically, never
    // arriving, and a mark taken off would be put back where the nodes change region, again
    // and again. The crossing is followed by the regions from here on.
    c.saturation = false;
    return relocate(k);
  }
  const double x = x_b + dx;
  if (!fix_saturation_line(c, a.form, x)) return false;
  move_boundary(k, x);
  return true;
}

// Moves the crossing between segments k and k + 1 (one between single-phase regions) to where
// the updated path meets the boundary: a search outward from the old place for the side
// change, then locate().
bool PathSolver::relocate(std::size_t k) {
  Segment& a = segments_[k];
  Segment& b = segments_[k + 1];
  // The nodes next to the boundary may both lie on one side (the crossing moved past one of
  // them): the search tells whether the path still crosses near by.
  Crossing c = a.crossing;
  const double old = a.x1;
  const double reach[2] = {a.nodes[1].x, b.nodes[kLast - 1].x};
  const auto found = search_crossing(c, view(k), old, reach);
  if (!found) {  // no change of region within reach: cut anew next sweep
    a.crossing_end = b.crossing_start = false;
    return true;
  }
  a.crossing = c;
  // A saturation crossing followed by the regions from here on (follow_saturation, or
  // locate() finding the saturated states out of step) is one like IF97's other boundaries:
  // with the entropy form on one side, the sides would be told by (p, s) before the boundary
  // and by (p, h) beyond it, rules that put the boundary a sliver apart, and the crossing
  // would go to and fro between the two places, never settling.
  if (!c.saturation && (a.form != Form::enthalpy || b.form != Form::enthalpy)) {
    take_crossing_form(k);
    move_boundary(k, *found);
    return true;
  }
  if (std::fabs(*found - old) <= 10 * kLocateTolerance * std::fabs(length_)) return false;
  move_boundary(k, *found);
  return true;
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
    if (far_before != beyond) {
      return beyond ? locate(c, path, near, far, kLocateTolerance) : locate(c, path, far, near, kLocateTolerance);
    }
    if (far == limit) return std::nullopt;
    near = far;
  }
}

// Cuts segment k at x; `crossing` says what changes there, if anything. Each side of a
// crossing takes the form its phase needs; its nodes, cut from the other form's polynomial,
// are converted when evaluated.
void PathSolver::split(std::size_t k, double x, const Crossing* crossing) {
  const double shortest = kShortest * std::fabs(length_);
  Segment& seg = segments_[k];
  if (std::fabs(x - seg.x0) <= shortest || std::fabs(x - seg.x1) <= shortest) {
    // At one of the segment's ends: that boundary is the crossing (at the inlet or the
    // outlet, the end node is then taken a hair inside the path).
    if (crossing == nullptr) return;
    if (std::fabs(x - seg.x0) <= std::fabs(x - seg.x1)) {
      seg.crossing_start = true;
      seg.nodes[0].evaluated = false;
      if (k > 0) {
        segments_[k - 1].crossing_end = true;
        segments_[k - 1].crossing = *crossing;
        take_crossing_form(k - 1);
      }
    } else {
      seg.crossing_end = true;
      seg.crossing = *crossing;
      seg.nodes[kLast].evaluated = false;
      if (k + 1 < segments_.size()) {
        segments_[k + 1].crossing_start = true;
        take_crossing_form(k);
      }
    }
    return;
  }
  if (segments_.size() >= kMaxSegments) {
    throw Error(ErrorKind::no_convergence,
                fmt::format("polytropic path from {:.6g} Pa to {:.6g} Pa: more than {} segments needed", p1_,
                            p2_, kMaxSegments));
  }
  const Segment whole = seg;
  const Polynomial path = whole.path();
  Segment first, second;
  set_nodes(first, whole.x0, x, path, &whole);
  set_nodes(second, x, whole.x1, path, &whole);
  first.form = second.form = whole.form;
  if (crossing != nullptr && crossing->saturation) {
    first.form = crossing->dry_before ? Form::entropy : Form::enthalpy;
    second.form = crossing->dry_before ? Form::enthalpy : Form::entropy;
  } else if (crossing != nullptr) {
    // Across IF97's other boundaries the regions' (p, s) and (p, h) rules disagree in a thin
    // band, and which equation holds there must follow the path's enthalpy: both sides take
    // the enthalpy form (such crossings are rare).
    first.form = second.form = Form::enthalpy;
  }
  first.crossing_start = whole.crossing_start;
  first.crossing_end = second.crossing_start = crossing != nullptr;
  if (crossing != nullptr) first.crossing = *crossing;
  second.crossing_end = whole.crossing_end;
  second.crossing = whole.crossing;
  first.nodes[0] = whole.nodes[0];
  // A part that takes the other form is put in it at once, from exact states: a polynomial
  // must never mix the two.
  for (Segment* part : {&first, &second}) {
    if (part->form != whole.form) {
      put_in_form(*part, part->form, whole.form, part == &second ? 1 : 0, part->form == Form::enthalpy);
    }
  }
  refresh_saturation_line(second);
  segments_[k] = first;
  segments_.insert(segments_.begin() + static_cast<std::ptrdiff_t>(k) + 1, second);
  corrections_.insert(corrections_.begin() + static_cast<std::ptrdiff_t>(k) + 1, corrections_[k]);
  // The segments beyond, up to the next crossing, lie on the same side of the saturation line
  // as `second` and take its form too (the first path's cuts do not know where the fluid turns
  // wet: a wet segment left in the entropy form would carry IF97's 3e-5 inconsistency of
  // T ds = dh - v dp into the path).
  if (crossing == nullptr || !crossing->saturation) return;
  for (std::size_t j = k + 2; j < segments_.size() && !segments_[j].crossing_start; ++j) {
    Segment& later = segments_[j];
    if (later.form == second.form) continue;
    put_in_form(later, second.form, later.form, 0, second.form == Form::enthalpy);
    refresh_saturation_line(later);
  }
}

// Puts the nodes of `seg` from index `first` on, now in form `from`, in form `to` from exact
// states (`wet`: the nodes are likely wet, their saturation line is tried first).
void PathSolver::put_in_form(Segment& seg, Form to, Form from, std::size_t first, bool wet) {
  for (std::size_t i = first; i <= kLast; ++i) {
    Node& node = seg.nodes[i];
    evaluate_at(node, to, from, node.y, node.x, wet);
  }
  seg.form = to;
}

// A saturation crossing at the end of `seg` records the saturated value in the segment's form:
// after the segment changed form, it is taken anew.
void PathSolver::refresh_saturation_line(Segment& seg) const {
  if (seg.crossing_end && seg.crossing.saturation && !fix_saturation_line(seg.crossing, seg.form, seg.crossing.x)) {
    seg.crossing.saturation = false;
  }
}

// Across IF97's boundaries other than the saturation line the regions' (p, s) and (p, h)
// rules disagree in a thin band, and IF97's equations there agree only within its consistency
// limits (the entropies at one (p, h) by up to about 1e-3 J/(kg K)): which equation holds must
// follow the path's enthalpy, as it is what is continuous. Both segments at such a crossing
// (the one ending at k's end and the next) take the enthalpy form, their nodes converted from
// exact states; the nodes at the crossing are evaluated anew, a hair inside each side.
void PathSolver::take_crossing_form(std::size_t k) {
  if (segments_[k].crossing.saturation) return;
  for (std::size_t j : {k, k + 1}) {
    Segment& seg = segments_[j];
    if (seg.form == Form::enthalpy) continue;
    put_in_form(seg, Form::enthalpy, seg.form, 0, false);
    refresh_saturation_line(seg);
  }
  segments_[k].nodes[kLast].evaluated = false;
  segments_[k + 1].nodes[0].evaluated = false;
}

// Moves the boundary between segments k and k + 1 to x, re-placing both segments' nodes:
// each from its own polynomial where it lay before, from the other segment's beyond (put in
// its own form from exact states where the forms differ). A move by at most 1e-4 of the
// segments carries V and J over by interpolation (their polynomials are as good there as at
// the nodes), so no state is needed.
void PathSolver::move_boundary(std::size_t k, double x) {
  const double shortest = kShortest * length_;  // signed, like the segments
  const double low = segments_[k].x0 + shortest;
  const double high = segments_[k + 1].x1 - shortest;
  x = length_ > 0 ? std::clamp(x, low, high) : std::clamp(x, high, low);
  const Segment a = segments_[k];
  const Segment b = segments_[k + 1];
  const Polynomial from_a = a.path(), from_b = b.path();
  set_nodes(segments_[k], a.x0, x, from_a, &a);
  segments_[k].nodes[0] = a.nodes[0];
  set_nodes(segments_[k + 1], x, b.x1, from_b, &b);
  const double direction = length_ > 0 ? 1.0 : -1.0;
  const double move = std::fabs(x - a.x1);
  const bool small = move <= 1e-4 * std::min(std::fabs(a.length()), std::fabs(b.length()));
  if (!small) {
    auto take_over = [this](Node& node, Form form, Form other, double value) {
      if (form == other) {
        node.y = value;
      } else {
        evaluate_at(node, form, other, value, node.x, form == Form::enthalpy);
      }
    };
    for (Node& node : segments_[k].nodes) {
      if ((node.x - a.x1) * direction > 0) take_over(node, a.form, b.form, from_b(node.x));
    }
    for (Node& node : segments_[k + 1].nodes) {
      if ((b.x0 - node.x) * direction > 0) take_over(node, b.form, a.form, from_a(node.x));
    }
  }
  sync_start(k + 1);
  if (!small) return;
  const auto current = [](const Segment& s) {  // V known at y at every node (the last step was small)
    return std::all_of(s.nodes.begin(), s.nodes.end(), [](const Node& n) { return n.evaluated; });
  };
  if (!current(a) || !current(b)) return;
  carry_over(segments_[k], a, 1);
  carry_over(segments_[k + 1], b, segments_[k + 1].crossing_start ? 0 : 1);
  // The nodes at the boundary itself are evaluated anew: which side they fall on may change.
  segments_[k].nodes[kLast].evaluated = false;
  segments_[k + 1].nodes[0].evaluated = false;
}

// Gives the nodes of `seg` (from index `first` on) the V, J, T and enthalpy of `old`'s
// polynomials, for a segment whose ends moved a little.
void PathSolver::carry_over(Segment& seg, const Segment& old, std::size_t first) const {
  Values V, J, T, h;
  for (std::size_t i = 0; i <= kLast; ++i) {
    V[i] = old.nodes[i].V;
    J[i] = old.nodes[i].J;
    T[i] = old.nodes[i].T;
    h[i] = old.nodes[i].enthalpy;
  }
  const Values cV = rule().coefficients(V), cJ = rule().coefficients(J), cT = rule().coefficients(T),
               ch = rule().coefficients(h);
  for (std::size_t i = first; i <= kLast; ++i) {
    Node& node = seg.nodes[i];
    const double t = (node.x - old.x0) / old.length();
    node.V = Rule::evaluate(cV, t);
    node.J = Rule::evaluate(cJ, t);
    node.T = Rule::evaluate(cT, t);
    node.enthalpy = Rule::evaluate(ch, t);
    node.anchor = node.y;
    node.line.p = 0;  // the saturation line was at the old pressure
    node.evaluated = true;
  }
}

}  // namespace shaftwork::machines::detail

// The collocation solver behind polytropic_path.hpp (internal to the machines layer): its
// pieces and its state. path_solver.cpp holds the set-up, the evaluation of the nodes and
// Newton's method; path_crossings.cpp finds and follows the places where the fluid changes
// region and cuts the segments there.
#pragma once

#include <array>
#include <cstddef>
#include <optional>
#include <vector>

#include "polytropic_path.hpp"
#include "shaftwork/fluids/fluid_model.hpp"
#include "shaftwork/numerics/chebyshev.hpp"

namespace shaftwork::machines::detail {

inline constexpr int kDegree = 12;
using Rule = numerics::ChebyshevLobatto<kDegree>;
using Values = Rule::Values;
inline constexpr std::size_t kLast = kDegree;  // index of a segment's last node

const Rule& rule();

// What a segment solves for. In one phase the entropy: the model's h, s and v there come from
// one thermodynamic potential, so T ds = dh - v dp holds and the path is
//   ds/dx = (f - 1) G,  G = p v / T,
// where only the dissipation is integrated (the isentrope is the model's own), about (f-1)/f
// of the work the enthalpy form does. In the wet region the definition as it stands,
//   dh/dx = f H,  H = p v,
// because IF97's wet states meet T ds = dh - v dp only to about 3e-5. The path's enthalpy is
// continuous where two segments meet.
enum class Form { entropy, enthalpy };

// The saturated liquid and vapour at one pressure. Between them v, h and s are all linear in
// the quality, so a wet node at that pressure needs no state of its own.
struct SaturationLine {
  double p = 0;  // Pa; 0 when not known
  double T = 0;
  double h_liquid = 0, h_vapour = 0, s_liquid = 0, s_vapour = 0, v_liquid = 0, v_vapour = 0;
  int region = 0;  // of the wet states there
  double low(Form form) const { return form == Form::entropy ? s_liquid : h_liquid; }
  double high(Form form) const { return form == Form::entropy ? s_vapour : h_vapour; }
  bool holds(double pressure, double y, Form form) const {
    return p > 0 && pressure == p && y >= low(form) && y <= high(form);
  }
};

struct Node {
  double x = 0;  // ln p
  double p = 0;  // Pa
  double y = 0;  // the iterate: s [J/(kg K)] or h [J/kg], by the segment's form
  bool evaluated = false;  // V, J, region and quality belong to (p, y)
  double V = 0;            // dy/dx = c V: G or H
  double J = 0;            // (dV/dy)_p
  double anchor = 0;       // the y at which V and J are a state's own; V follows y linearly from there
  double T = 0;            // K; dh = T ds at constant p
  double enthalpy = 0;     // h at the node, J/kg (first order in y - anchor for the entropy form)
  int region = 0;
  double quality = -1;     // of a wet node; -1 for one phase
  fluids::State state;     // the last state computed here (or near by): the next hint
  bool has_state = false;
  SaturationLine line;     // at p, once the node was wet there
};

// Where the fluid changes region at the end of a segment, and how either side is told.
struct Crossing {
  int before = 0;  // regions before and after, in the direction of the path
  int after = 0;
  // At the saturation line (wet on one side only) the side is the sign of sign * (y - y_sat),
  // y_sat the saturated liquid's (quality 0) or vapour's (1) value in the form of the segment
  // the point lies in, scaled to J/kg: continuous, so the crossing is its root. Elsewhere
  // (IF97's region boundaries) only the region tells, by bisection.
  bool saturation = false;
  bool dry_before = true;  // the side before is single-phase
  double quality = 1;
  double sign = 1;  // makes the side value positive before the crossing
  // At the saturation line: y_sat and dy_sat/dx where the boundary stands (x), in the form
  // of the segment before, for Newton's step on the boundary as the path moves.
  double x = 0;
  double saturated = 0;
  double saturated_slope = 0;
};

// A segment's path y(x) as Chebyshev coefficients, computed once for many evaluations.
struct Polynomial {
  double x0 = 0;
  double length = 1;
  Values coefficients{};
  double operator()(double x) const { return Rule::evaluate(coefficients, (x - x0) / length); }
};

struct Segment {
  double x0 = 0;
  double x1 = 0;
  Form form = Form::entropy;
  bool crossing_start = false;  // the segment starts (ends) where the fluid changes region
  bool crossing_end = false;
  Crossing crossing;  // the one at the end, when crossing_end
  std::array<Node, kDegree + 1> nodes;
  double length() const { return x1 - x0; }
  Polynomial path() const;
  int region_near_end() const { return nodes[kLast - 1].region; }
  int region_near_start() const { return nodes[1].region; }
};

// The path near a boundary: segment a's polynomial up to it, segment b's beyond (the same
// segment twice inside one).
struct PathView {
  Polynomial a, b;
  Form form_a, form_b;
  double boundary;
  bool rising;  // ln p grows along the path
  PathView(const Segment& first, const Segment& second, bool rises);
  bool in_a(double x) const { return rising ? x <= boundary : x >= boundary; }
  Form form(double x) const { return in_a(x) ? form_a : form_b; }
  double value(double x) const { return in_a(x) ? a(x) : b(x); }
};

class PathSolver {
 public:
  PathSolver(const fluids::FluidModel& fluid, const fluids::State& inlet, double p2, double factor,
             const fluids::State* outlet);
  PathResult run();

 private:
  // set-up and node placement (path_solver.cpp)
  double pressure_at(double x) const;
  double guess(double x, Form form) const;
  template <class Path>
  void set_nodes(Segment& seg, double x0, double x1, const Path& path, const Segment* previous) const;
  // evaluation
  void sync_start(std::size_t k);
  void evaluate();
  void evaluate_node(Node& node, Form form, const fluids::State* neighbour, double x);
  void evaluate_at(Node& node, Form form, Form given, double value, double x, bool wet);
  void take_state(Node& node, Form form, double p);
  void wet_node(Node& node, Form form) const;
  void shift(Node& node, Form form, double step) const;
  double scale(const Node& node, Form form) const { return form == Form::entropy ? node.T : 1.0; }
  void update_tolerance();
  // the collocation equations
  double coefficient(Form form) const { return form == Form::entropy ? factor_ - 1.0 : factor_; }
  double newton();
  double truncation(const Segment& seg) const;
  bool refine();
  double outlet_enthalpy();
  // crossings (path_crossings.cpp)
  void presplit();
  bool split_at_region_change();
  double side(const Crossing& c, const PathView& path, double x);
  double locate(Crossing& c, const PathView& path, double xa, double xb, double fraction);
  bool fix_saturation_line(Crossing& c, Form form, double x) const;
  bool relocate_crossings();
  bool follow_saturation(std::size_t k);
  bool relocate(std::size_t k);
  std::optional<double> search_crossing(Crossing& c, const PathView& path, double old, const double (&reach)[2]);
  void split(std::size_t k, double x, const Crossing* crossing);
  void take_crossing_form(std::size_t k);
  void put_in_form(Segment& seg, Form to, Form from, std::size_t first, bool wet);
  void refresh_saturation_line(Segment& seg) const;
  void move_boundary(std::size_t k, double x);
  void carry_over(Segment& seg, const Segment& old, std::size_t first) const;
  PathView view(std::size_t k) const { return {segments_[k], segments_[k + 1], length_ > 0}; }

  const fluids::FluidModel& fluid_;
  fluids::State inlet_;
  const fluids::State* outlet_;  // given when the factor is solved for
  double x1_, x2_, length_;      // ln p1, ln p2, ln(p2/p1)
  double p1_, p2_;
  double factor_;
  double tolerance_ = 0;  // J/kg
  double last_step_ = 0;  // the largest correction of the last Newton step, J/kg (infinite before the first)
  std::vector<Segment> segments_;
  std::vector<double> corrections_;  // largest Newton correction per segment, last sweep, J/kg
  int sweeps_ = 0;
  int evaluations_ = 0;
};

// How to tell the sides of a change from region `before` to `after` (qualities -1 when
// single-phase).
Crossing crossing_between(int before, double before_quality, int after, double after_quality);
inline Form form_of(double quality) { return quality >= 0 ? Form::enthalpy : Form::entropy; }

}  // namespace shaftwork::machines::detail

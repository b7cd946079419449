// Compressors and fans: each test point carried to the guarantee by the fan laws at equal
// flow coefficient, head coefficient and polytropic efficiency (ASME PTC 10-1997 sec. 5.5,
// ideal-gas and real-gas alike; ISO 5389:2005 sec. 8):
//   Q_c = Q_t (N_g / N_t),   H_p,c = H_p,t (N_g / N_t)^2,   eta_p,c = eta_p,t,
// then rated at the guarantee inlet state and gas: the discharge pressure p2 is the one
// whose polytropic head from that inlet with eta_p,c is H_p,c, found by a root search on
// the polytropic path (h2 = h1 + H_p / eta_p, machines/polytropic.hpp), and rate() gives
// the outlet, power and isentropic efficiency at the guaranteed mass flow. Several points
// make a curve H_p(Q), eta_p(Q) read at the guaranteed inlet volume flow Q_G by straight
// lines between neighbours (5 % beyond the ends at most); the guarantee point is rated
// once from the heads and efficiencies read there.
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "curve.hpp"
#include "guarantee_common.hpp"
#include "problem.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/speed_of_sound.hpp"
#include "shaftwork/machines/impeller.hpp"
#include "shaftwork/machines/polytropic.hpp"
#include "shaftwork/numerics/root.hpp"

namespace shaftwork::machines {
namespace {

using D = units::Dimension;

// One test point at guarantee conditions.
struct Converted {
  const TestPoint* test = nullptr;
  double ratio = 1;  // N_g / N_t
  double flow = 0;   // inlet volume flow, m3/s
  double head = 0;   // polytropic head, J/kg
  double eta_p = 0;
  double eta_m = 1;
  Rating rating;  // at the guarantee inlet
};

// The discharge pressure [Pa] at which the polytropic path from `inlet` with eta_p reaches
// the polytropic head `head` [J/kg]: h(p2) on the path equals h1 + head / eta_p. The path's
// enthalpy rises with p2, so the root is bracketed by doubling ln(p2/p1).
double discharge_pressure_for_head(const fluids::FluidModel& fluid, const fluids::State& inlet, double head,
                                   double eta_p) {
  const double h2 = inlet.enthalpy + head / eta_p;
  const auto excess = [&](double ln_ratio) {
    return polytropic_outlet_enthalpy(fluid, inlet, inlet.pressure * std::exp(ln_ratio), eta_p) - h2;
  };
  double low = 0, high = 0.25;
  while (excess(high) < 0) {
    low = high;
    high *= 2;
    if (high > 16) {
      refuse(fmt::format("the converted polytropic head {:.6g} kJ/kg needs a pressure ratio above 1e6 at the "
                         "guarantee inlet: check the speeds and the guarantee's inlet state",
                         head / 1e3));
    }
  }
  numerics::RootOptions options;
  options.relative_tolerance = 1e-14;
  const double ln_ratio = numerics::find_root(excess, low, high, "discharge pressure at the converted head", options).x;
  return inlet.pressure * std::exp(ln_ratio);
}

Rating rate_at_guarantee(const GuaranteeInlet& gin, double head, double eta_p, double eta_m, double mass_flow) {
  RatingInput in;
  in.machine = MachineKind::compressor;
  in.fluid = gin.fluid;
  in.inlet_pressure = gin.state.pressure;
  in.inlet_temperature = gin.state.temperature;
  in.outlet_pressure = discharge_pressure_for_head(*gin.fluid, gin.state, head, eta_p);
  in.efficiency_polytropic = eta_p;
  in.mechanical_efficiency = eta_m;
  in.mass_flow = mass_flow;
  return rate(in);
}

Converted convert(const Guarantee& g, const GuaranteeInlet& gin, const TestPoint& p) {
  if (!p.rating.volume_flow) {
    refuse(fmt::format("test point \"{}\" gives neither flow nor power: its flow is needed to convert it", p.id));
  }
  Converted c;
  c.test = &p;
  c.ratio = speed_ratio(g, p);
  c.flow = *p.rating.volume_flow * c.ratio;
  c.head = p.rating.head_polytropic * c.ratio * c.ratio;
  c.eta_p = p.rating.efficiency_polytropic;
  c.eta_m = p.rating.mechanical_efficiency;
  c.rating = rate_at_guarantee(gin, c.head, c.eta_p, c.eta_m, c.flow * gin.state.density);
  return c;
}

std::vector<Converted> convert_all(const Guarantee& g, const GuaranteeInlet& gin, std::span<const TestPoint> points) {
  std::vector<Converted> out;
  for (const TestPoint& p : points) out.push_back(convert(g, gin, p));
  std::sort(out.begin(), out.end(), [](const Converted& a, const Converted& b) { return a.flow < b.flow; });
  std::vector<double> flows;
  std::vector<std::string> ids;
  for (const Converted& c : out) {
    flows.push_back(c.flow);
    ids.push_back(c.test->id);
  }
  refuse_coinciding(flows, ids, "inlet volume flow", show_volume_flow);
  return out;
}

// The similarity of each point with its conversion, and of the nearest point's flow
// coefficient with the guarantee's (ASME PTC 10-1997 Table 3.2, Fig. 3.3).
void add_similarity(const Guarantee& g, const GuaranteeInlet& gin, const std::vector<Converted>& conv,
                    std::size_t nearest, double q_g, GuaranteeResult& r) {
  for (const Converted& c : conv) {
    const Rating& t = c.test->rating;
    const double test = t.outlet.density / t.inlet.density, converted = c.rating.outlet.density / c.rating.inlet.density;
    r.similarity.push_back(ratio_check("specific_volume_ratio", c.test->id, test, converted, test / converted));
  }
  const Converted& near = conv[nearest];
  const auto diameter = near.test->input.impeller_tip_diameter;
  const std::optional<double> u_g = diameter && g.speed ? std::optional(tip_speed(*diameter, *g.speed)) : std::nullopt;
  const std::optional<double> phi_g = u_g ? std::optional(flow_coefficient(q_g, *diameter, *u_g)) : std::nullopt;
  const std::optional<double> phi_t = u_g ? near.test->rating.flow_coefficient : std::nullopt;
  r.similarity.push_back(ratio_check("flow_coefficient", near.test->id, phi_t, phi_g, near.flow / q_g));
  if (!u_g) return;
  const double m_g = *u_g / fluids::speed_of_sound(*gin.fluid, gin.state);
  for (const Converted& c : conv) {
    if (!c.test->rating.machine_mach_number) continue;
    const double m_t = *c.test->rating.machine_mach_number;
    const SimilarityLimits limits = mach_number_limits(m_g);
    SimilarityCheck s;
    s.parameter = "machine_mach_number";
    s.point = c.test->id;
    s.test = m_t;
    s.guarantee = m_g;
    s.difference = m_t - m_g;
    s.low = limits.low;
    s.high = limits.high;
    s.within = *s.difference >= limits.low && *s.difference <= limits.high;
    s.source = limits.source;
    r.similarity.push_back(s);
  }
}

std::vector<ConvertedPoint> point_values(const std::vector<Converted>& conv) {
  std::vector<ConvertedPoint> out;
  for (const Converted& c : conv) {
    out.push_back({c.test->id,
                   c.ratio,
                   {{"volume_flow", D::volume_flow, c.flow},
                    {"head.polytropic", D::specific_energy, c.head},
                    {"efficiency.polytropic", D::fraction, c.eta_p},
                    {"outlet.pressure", D::pressure, c.rating.outlet.pressure},
                    {"power", D::power, c.rating.power.value_or(0)}}});
  }
  return out;
}

// The polytropic head [J/kg] from the guarantee inlet to the discharge pressure p2 along
// the path of efficiency eta_p: H_p = eta_p (h_path(p2) - h1), the inverse of
// discharge_pressure_for_head (0 for p2 at or below the inlet pressure); empty when the
// path cannot be traced there.
std::optional<double> head_to(const GuaranteeInlet& gin, const std::optional<double>& p2, double eta_p) {
  if (!p2) return std::nullopt;
  if (*p2 <= gin.state.pressure) return 0.0;
  try {
    return eta_p * (polytropic_outlet_enthalpy(*gin.fluid, gin.state, *p2, eta_p) - gin.state.enthalpy);
  } catch (const Error&) {
    return std::nullopt;
  }
}

// The head curve with the guaranteed head, or the guaranteed discharge pressure as the
// head it asks for with the efficiency read at Q_G.
CurveReading head_reading(const GuaranteeInlet& gin, const std::vector<Converted>& conv, double q_g, double eta_read,
                          const GuaranteeResult& r) {
  CurveReading head;
  head.key = "head.polytropic";
  head.dimension = D::specific_energy;
  for (const Converted& c : conv) {
    head.flow.push_back(c.flow);
    head.value.push_back(c.head);
  }
  head.read_flow = q_g;
  head.read_value = head.at(q_g);
  if (const Check* h = find_check(r, Checked::head_polytropic)) {
    set_guarantee(head, *h);
  } else if (const Check* p = find_check(r, Checked::outlet_pressure)) {
    head.guaranteed = head_to(gin, p->guaranteed, eta_read);
    if (!head.guaranteed) return head;
    head.low = head_to(gin, tolerance_bound(p->guaranteed, p->tolerance.min_percent), eta_read);
    head.high = head_to(gin, tolerance_bound(p->guaranteed, p->tolerance.max_percent), eta_read);
    head.check = Checked::outlet_pressure;
  }
  return head;
}

// The efficiency curve: the polytropic one (the conversion keeps it), or the isentropic one
// of the points rated at the guarantee when only that is guaranteed.
CurveReading efficiency_reading(const std::vector<Converted>& conv, double q_g, const Rating& at,
                                const GuaranteeResult& r) {
  const Check* polytropic = find_check(r, Checked::efficiency_polytropic);
  const Check* isentropic = find_check(r, Checked::efficiency_isentropic);
  const bool by_isentropic = isentropic && !polytropic;
  CurveReading eta;
  eta.key = by_isentropic ? "efficiency.isentropic" : "efficiency.polytropic";
  for (const Converted& c : conv) {
    eta.flow.push_back(c.flow);
    eta.value.push_back(by_isentropic ? c.rating.efficiency_isentropic : c.eta_p);
  }
  eta.read_flow = q_g;
  eta.read_value = by_isentropic ? at.efficiency_isentropic : eta.at(q_g);
  if (polytropic || isentropic) set_guarantee(eta, by_isentropic ? *isentropic : *polytropic);
  return eta;
}

}  // namespace

GuaranteeResult judge_compressor(const Guarantee& g, std::span<const TestPoint> points) {
  require_flow(g, MachineKind::compressor);
  const GuaranteeInlet gin = guarantee_inlet(g, points.front());
  const double m_g = guaranteed_mass_flow(g, gin.state);
  const double q_g = m_g / gin.state.density;
  const std::vector<Converted> conv = convert_all(g, gin, points);
  std::vector<double> x, head, eta_p, eta_m;
  for (const Converted& c : conv) {
    x.push_back(c.flow);
    head.push_back(c.head);
    eta_p.push_back(c.eta_p);
    eta_m.push_back(c.eta_m);
  }
  refuse_beyond_reach(x, q_g, "the guaranteed inlet volume flow", show_volume_flow);
  const double eta_read = read_linear(x, eta_p, q_g);
  const Rating at = rate_at_guarantee(gin, read_linear(x, head, q_g), eta_read, read_linear(x, eta_m, q_g), m_g);
  const std::size_t nearest = nearest_index(x, q_g);
  GuaranteeResult r;
  r.method = fmt::format("fan laws at equal flow coefficient, head coefficient and polytropic efficiency; {} read at "
                         "the guaranteed inlet volume flow",
                         conv.size() == 1 ? "the converted point's head and efficiency"
                                          : fmt::format("the curve through {} converted points", conv.size()));
  for (Checked q : {Checked::outlet_pressure, Checked::head_polytropic, Checked::efficiency_polytropic,
                    Checked::efficiency_isentropic, Checked::power}) {
    if (!g.value(q)) continue;
    r.checks.push_back(make_check(g, MachineKind::compressor, q, rating_value(conv[nearest].test->rating, q),
                                  rating_value(at, q), *conv[nearest].test));
  }
  add_similarity(g, gin, conv, nearest, q_g, r);
  r.converted = rating_values(at);
  r.warnings = at.warnings;  // of the guarantee point's rating (an ideal gas at pressure, ...)
  r.points = point_values(conv);
  r.nearest_point = conv[nearest].test->id;
  r.readings.emplace().guaranteed_flow = q_g;
  r.readings->quantities = {head_reading(gin, conv, q_g, eta_read, r), efficiency_reading(conv, q_g, at, r)};
  return r;
}

}  // namespace shaftwork::machines

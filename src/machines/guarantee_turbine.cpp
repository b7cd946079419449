// Turbines: the test efficiency carried to the guarantee inlet state and exhaust pressure,
// and the flow carried by the choked-nozzle law. A nozzle group running choked passes
//   m = C A sqrt(p0 rho0),   C = sqrt(k (2/(k+1))^((k+1)/(k-1))) for a perfect gas
// (e.g. Saravanamuttoo et al., Gas Turbine Theory, sec. 7.3; Cotton, Evaluating and
// Improving Steam Turbine Performance, ch. 4, the "flow function" of steam turbines), so at
// the same nozzle area and gas  m_c = m_t sqrt(p_g rho_g / (p_t rho_t)).
// The guarantee's own flow, when given, replaces it. The carried efficiency is on the basis
// the guarantee names (isentropic unless it guarantees the polytropic one); the guarantee
// point is then rated by rate() (a wet exhaust included: IAPWS-IF97 gives its quality).
// Several points make a curve eta(m) read at the guaranteed flow.
#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "curve.hpp"
#include "guarantee_common.hpp"
#include "problem.hpp"

namespace shaftwork::machines {
namespace {

using D = units::Dimension;

struct Carried {
  const TestPoint* test = nullptr;
  double flow = 0;  // kg/s by the nozzle law
  double eta = 0;   // on the guarantee's basis
  double eta_m = 1;
};

Carried carry(const GuaranteeInlet& gin, const TestPoint& p, EfficiencyBasis basis) {
  const Rating& t = p.rating;
  if (!t.mass_flow) {
    refuse(fmt::format("test point \"{}\" gives neither flow nor power: its flow is needed to carry it", p.id));
  }
  Carried c;
  c.test = &p;
  c.flow = *t.mass_flow * std::sqrt(gin.state.pressure * gin.state.density / (t.inlet.pressure * t.inlet.density));
  c.eta = basis == EfficiencyBasis::isentropic ? t.efficiency_isentropic : t.efficiency_polytropic;
  c.eta_m = t.mechanical_efficiency;
  return c;
}

Rating rate_at_guarantee(const GuaranteeInlet& gin, double p_out, EfficiencyBasis basis, double eta, double eta_m,
                         double mass_flow) {
  RatingInput in;
  in.machine = MachineKind::turbine;
  in.fluid = gin.fluid;
  in.inlet_pressure = gin.state.pressure;
  in.inlet_temperature = gin.state.temperature;
  in.outlet_pressure = p_out;
  set_efficiency(in, basis, eta);
  in.mechanical_efficiency = eta_m;
  in.mass_flow = mass_flow;
  return rate(in);
}

void refuse_unfixed_flow(const Guarantee& g, const GuaranteeInlet& gin, std::size_t points) {
  if (g.flow_given()) return;
  if (points > 1) {
    refuse("no flow: several test points make a curve of efficiency against flow, read at the guaranteed flow; give "
           "mass_flow, volume_flow or standard_volume_flow");
  }
  if (gin.fluid_changed) {
    refuse("no flow: the choked-nozzle law carries a flow to other inlet conditions of the same gas only, and the "
           "guarantee names a fluid of its own; give the guaranteed mass_flow");
  }
}

}  // namespace

GuaranteeResult judge_turbine(const Guarantee& guarantee, std::span<const TestPoint> points) {
  const GuaranteeInlet gin = guarantee_inlet(guarantee, points.front());
  refuse_unfixed_flow(guarantee, gin, points.size());
  const EfficiencyBasis basis = guarantee.value(Checked::efficiency_polytropic) ? EfficiencyBasis::polytropic
                                                                                : EfficiencyBasis::isentropic;
  std::vector<Carried> carried;
  for (const TestPoint& p : points) carried.push_back(carry(gin, p, basis));
  std::sort(carried.begin(), carried.end(), [](const Carried& a, const Carried& b) { return a.flow < b.flow; });
  std::vector<double> x, eta, eta_m;
  std::vector<std::string> ids;
  for (const Carried& c : carried) {
    x.push_back(c.flow);
    eta.push_back(c.eta);
    eta_m.push_back(c.eta_m);
    ids.push_back(c.test->id);
  }
  refuse_coinciding(x, ids, "mass flow", show_mass_flow);
  Guarantee g = guarantee;  // with the guaranteed mass flow filled in
  const double m_read = g.flow_given() ? guaranteed_mass_flow(g, gin.state) : x.front();
  g.value(Checked::mass_flow) = m_read;
  refuse_beyond_reach(x, m_read, "the guaranteed mass flow", show_mass_flow);
  const double p_out = g.value(Checked::outlet_pressure).value_or(points.front().rating.outlet.pressure);
  const Rating at = rate_at_guarantee(gin, p_out, basis, read_linear(x, eta, m_read), read_linear(x, eta_m, m_read), m_read);
  const std::size_t nearest = nearest_index(x, m_read);
  const TestPoint& near = *carried[nearest].test;
  GuaranteeResult r;
  r.method = fmt::format("the test's {} efficiency carried to the guarantee inlet and exhaust; {}",
                         basis == EfficiencyBasis::isentropic ? "isentropic" : "polytropic",
                         guarantee.flow_given() ? "rated at the guarantee's flow"
                                                : "the test flow carried by the choked-nozzle law m ~ sqrt(p_in rho_in)");
  for (Checked q : {Checked::efficiency_isentropic, Checked::efficiency_polytropic, Checked::power}) {
    if (!guarantee.value(q)) continue;
    r.checks.push_back(make_check(g, MachineKind::turbine, q, rating_value(near.rating, q), rating_value(at, q), near));
  }
  if (g.tolerance[static_cast<std::size_t>(Checked::mass_flow)]) {
    r.checks.push_back(make_check(g, MachineKind::turbine, Checked::mass_flow, near.rating.mass_flow, carried[nearest].flow,
                                  near, "the test flow carried by the choked-nozzle law"));
  }
  for (const Carried& c : carried) {
    r.points.push_back({c.test->id, 1.0, {{"mass_flow", D::mass_flow, c.flow}, {"efficiency.carried", D::fraction, c.eta}}});
  }
  r.converted = rating_values(at);
  r.warnings = at.warnings;
  r.nearest_point = near.id;
  return r;
}

}  // namespace shaftwork::machines

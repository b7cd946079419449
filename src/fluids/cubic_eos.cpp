// CubicGas: construction (critical constants, k_ij, the attraction polynomial of the
// composition) and the state calls. The equations and their sources are in cubic_core.hpp;
// the phase tests in cubic_phase.cpp.
//
// T from (p, h) or (p, s): the ideal-gas inverse at the target less the departure at that
// temperature gives the start; then numerics::newton_bracketed on h(T) - h or s(T) - s at
// fixed p with the exact slopes cp and cp/T, over the model's temperature range. On the
// stable root h(T) and s(T) rise with T (they jump up where the root changes phase), so the
// bracketed iteration cannot miss; a result in the two-phase region is refused afterwards.
#include "shaftwork/fluids/cubic_eos.hpp"

#include <algorithm>
#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include <fmt/format.h>

#include "checks.hpp"
#include "cubic_impl.hpp"
#include "shaftwork/error.hpp"

namespace shaftwork::fluids {
namespace {

using detail::kR;

constexpr double kTolerance = 1e-10;  // relative, on T, of the inverse solves
constexpr int kMaxIterations = 60;

std::string phase_label_of(const IdealGasMixture& mixture, CubicKind kind) {
  const auto& fractions = mixture.mole_fractions();
  std::string names;
  for (std::size_t i = 0; i < fractions.size(); ++i) names += (i ? ", " : "") + fractions[i].first;
  return fmt::format("{}{} on {}", fractions.size() == 1 ? "" : "mixture of ", names, cubic_model_name(kind));
}

const CriticalConstants& constants_for(const std::string& name, const CubicOverrides& overrides,
                                       const CriticalData& data, const std::string& label) {
  for (const auto& [species, c] : overrides.critical) {
    if (species == name) return c;
  }
  if (const CriticalConstants* c = data.find(name)) return *c;
  throw Error(ErrorKind::bad_input,
              fmt::format("{}: no critical constants for {} (none built in); give them under \"critical\"", label,
                          name));
}

double interaction_for(const std::string& a, const std::string& b, CubicKind kind, const CubicOverrides& overrides,
                       const CriticalData& data) {
  for (const InteractionParameter& p : overrides.interaction) {
    if ((p.first == a && p.second == b) || (p.first == b && p.second == a)) return p.k;
  }
  const InteractionParameter* p = data.interaction(a, b, kind);
  return p ? p->k : 0.0;
}

// T on the model's range where residual(T) = 0. Plain Newton steps from `start` first (it
// is usually within 1e-3 relative, so three steps reach 1e-10); should a step leave the
// range or the steps not settle (a phase change on the way), numerics::newton_bracketed on
// the whole range takes over. `refuse(below)` throws when the target lies beyond an end of
// the range (no sign change there).
template <class Residual, class Refuse>
double solve_temperature(const CubicGas::Impl& m, Residual residual, double start, const std::string& label,
                         Refuse refuse) {
  double T = start;
  for (int i = 0; i < 6; ++i) {
    const numerics::ValueAndSlope here = residual(T);
    const double next = T - here.value / here.slope;
    if (!(next >= m.range.low && next <= m.range.high)) break;  // also NaN
    if (std::fabs(next - T) <= kTolerance * next) return T;     // T is within the tolerance already
    T = next;
  }
  try {
    return numerics::newton_bracketed(residual, start, m.range.low, m.range.high, kTolerance, kMaxIterations,
                                      label.c_str());
  } catch (const Error& e) {
    if (e.kind() != ErrorKind::out_of_range) throw;
    refuse(residual(m.range.low).value > 0);
    throw;
  }
}

// The solve met its target, not the jump of h(T) or s(T) at a phase boundary: the miss,
// as a temperature (residual over slope), is within 1e-7 relative.
bool on_target(double temperature_miss, double T) { return std::fabs(temperature_miss) <= 1e-7 * T; }

// The state at p whose enthalpy (by_entropy false) or entropy (true) is `target` [J/kg or
// J/(kg K)], as the file comment describes; refused when it is not a one-phase state.
State inverse(const CubicGas::Impl& m, double p, double target, bool by_entropy) {
  const double M = m.d.molar_mass;
  const char* name = by_entropy ? "entropy" : "enthalpy";
  const char* unit = by_entropy ? "J/(kg K)" : "J/kg";
  struct Evaluated {
    double T = -1;
    CubicPoint pt;
    State st;
  } last;
  const auto residual = [&](double T) {
    last.T = T;
    last.pt = m.point(p, T);
    last.st = m.state(last.pt);
    const State& st = last.st;
    return by_entropy ? numerics::ValueAndSlope{(st.entropy - target) * M, st.cp * M / T}
                      : numerics::ValueAndSlope{(st.enthalpy - target) * M, st.cp * M};
  };
  const auto refuse = [&](bool below) {
    throw Error(ErrorKind::out_of_range,
                fmt::format("{}: {} {:.6g} {} at {:.6g} Pa needs a temperature {} the model's range {:g} to {:g} K",
                            m.label, name, target, unit, p, below ? "below" : "above", m.range.low, m.range.high));
  };
  // Start: the ideal-gas temperature of the target less the departure there.
  const double ideal = target * M + (by_entropy ? kR * std::log(p / IdealGasMixture::kStandardPressure) : 0.0);
  const auto ideal_temperature = [&](double x) {
    return by_entropy ? m.mixture.temperature_from_entropy(x) : m.mixture.temperature_from_enthalpy(x);
  };
  const double guess =
      std::clamp(ideal_temperature(ideal).value_or(0.5 * (m.range.low + m.range.high)), m.range.low, m.range.high);
  const detail::Residual departure = m.point(p, guess).r;
  const double start = ideal_temperature(ideal - (by_entropy ? departure.s : departure.h)).value_or(guess);
  const double T = solve_temperature(m, residual, start, by_entropy ? m.d.solve_s_label : m.d.solve_h_label, refuse);
  if (last.T != T) residual(T);
  const State& st = last.st;
  const double miss = by_entropy ? (st.entropy - target) * T / st.cp : (st.enthalpy - target) / st.cp;
  // A target between the two phases' values at the boundary (where h(T) or s(T) jumps), or a
  // state that splits, is refused.
  if (!on_target(miss, T) || !m.one_phase(last.pt)) m.refuse_phase(last.pt, name, target, unit);
  return last.st;
}


}  // namespace

CubicGas::Impl::Impl(CubicKind kind_, IdealGasMixture mixture_)
    : kind(kind_), k(detail::cubic_constants(kind_)), mixture(std::move(mixture_)), d(mixture.data()) {}

CubicPoint CubicGas::Impl::point(double p, double T) const {
  CubicPoint pt;
  pt.p = p;
  pt.T = T;
  pt.at = attraction.at(T);
  const double RT = kR * T;
  const double A = pt.at.a * p / (RT * RT);
  const double B = b * p / RT;
  const detail::CubicRoots roots = detail::cubic_roots(A, B, k);
  pt.roots = roots.count;
  pt.Z = detail::stable_root(roots, A, B, k, &pt.largest);
  pt.r = detail::residual(pt.at, b, T, p, pt.Z, k);
  pt.ideal = d.at(T);
  return pt;
}

State CubicGas::Impl::state(const CubicPoint& pt) const {
  const double M = d.molar_mass;
  const double cp0 = kR * pt.ideal.cp_r;
  const double cv = cp0 - kR + pt.r.cv;
  const double cp = cv - pt.T * pt.r.dp_dt * pt.r.dp_dt / pt.r.dp_dv;
  State st;
  st.pressure = pt.p;
  st.temperature = pt.T;
  st.enthalpy = (kR * pt.ideal.h_r + pt.r.h) / M;
  st.entropy = (kR * (pt.ideal.s_r - std::log(pt.p / IdealGasMixture::kStandardPressure)) + pt.r.s) / M;
  st.cp = cp / M;
  st.cv = cv / M;
  st.density = M / pt.r.v;
  // alpha_v = (1/v)(dv/dT)_p = -(dp/dT)_v / (v (dp/dv)_T), from the same equation.
  st.expansivity = -pt.r.dp_dt / (pt.r.v * pt.r.dp_dv);
  st.molar_mass = M;
  st.compressibility = pt.Z;
  return st;
}

CubicGas::CubicGas(CubicKind kind, const std::vector<Component>& components, CompositionBasis basis,
                   const CubicOverrides& overrides, const CriticalData& data) {
  auto impl = std::make_shared<Impl>(kind, IdealGasMixture(components, basis, cubic_model_name(kind)));
  Impl& m = *impl;
  m.n = m.mixture.mole_fractions().size();
  m.label = m.d.label;
  m.phase_label = phase_label_of(m.mixture, kind);
  m.range = m.d.range;
  std::vector<double> c0(m.n), c1(m.n);
  for (std::size_t i = 0; i < m.n; ++i) {
    const std::string& name = m.mixture.mole_fractions()[i].first;
    const CriticalConstants& c = constants_for(name, overrides, data, m.label);
    check_critical_constants(c, m.label + ": " + name);
    m.y.push_back(m.mixture.mole_fractions()[i].second);
    m.critical.push_back(c);
    m.m.push_back(detail::alpha_slope(kind, c.acentric_factor));
    m.sqrt_ac.push_back(std::sqrt(m.k.omega_a) * kR * c.critical_temperature / std::sqrt(c.critical_pressure));
    m.b_i.push_back(m.k.omega_b * kR * c.critical_temperature / c.critical_pressure);
    m.b += m.y[i] * m.b_i[i];
    // sqrt(a_i) = c0 + c1 sqrt(T); the alpha function is meant for T below its zero.
    c0[i] = m.y[i] * m.sqrt_ac[i] * (1 + m.m[i]);
    c1[i] = -m.y[i] * m.sqrt_ac[i] * m.m[i] / std::sqrt(c.critical_temperature);
    if (m.m[i] > 0) {
      m.range.high = std::min(m.range.high, c.critical_temperature * std::pow(1 + 1 / m.m[i], 2));
    }
  }
  m.one_minus_k.assign(m.n * m.n, 1.0);
  for (std::size_t i = 0; i < m.n; ++i) {
    for (std::size_t j = 0; j < m.n; ++j) {
      if (i == j) continue;
      const double kij = interaction_for(m.mixture.mole_fractions()[i].first, m.mixture.mole_fractions()[j].first,
                                         kind, overrides, data);
      m.one_minus_k[i * m.n + j] = 1 - kij;
      m.attraction.A0 += (1 - kij) * c0[i] * c0[j];
      m.attraction.A1 += (1 - kij) * (c0[i] * c1[j] + c1[i] * c0[j]);
      m.attraction.A2 += (1 - kij) * c1[i] * c1[j];
    }
    m.attraction.A0 += c0[i] * c0[i];
    m.attraction.A1 += 2 * c0[i] * c1[i];
    m.attraction.A2 += c1[i] * c1[i];
  }
  if (!(m.range.low < m.range.high)) {
    throw Error(ErrorKind::bad_input, fmt::format("{}: no temperature range left below the alpha function's zero "
                                                  "at {:g} K",
                                                  m.label, m.range.high));
  }
  if (!m.pure()) m.build_screen();
  impl_ = std::move(impl);
}

State CubicGas::from_pt(double p, double T) const {
  const Impl& m = *impl_;
  detail::check_pressure(p, m.label.c_str());
  detail::check_finite(T, "temperature", m.label.c_str());
  detail::check_temperature(T, m.range, m.label.c_str());
  const CubicPoint pt = m.point(p, T);
  if (!m.one_phase(pt)) m.refuse_phase(pt);
  return m.state(pt);
}

State CubicGas::from_ph(double p, double h) const {
  detail::check_pressure(p, impl_->label.c_str());
  detail::check_finite(h, "enthalpy", impl_->label.c_str());
  return inverse(*impl_, p, h, false);
}

State CubicGas::from_ps(double p, double s) const {
  detail::check_pressure(p, impl_->label.c_str());
  detail::check_finite(s, "entropy", impl_->label.c_str());
  return inverse(*impl_, p, s, true);
}

std::string CubicGas::model_name() const { return cubic_model_name(impl_->kind); }
std::string CubicGas::description() const { return impl_->d.description; }
Range CubicGas::temperature_range() const { return impl_->range; }
Range CubicGas::pressure_range() const { return {1e-3, 1e9}; }
CubicKind CubicGas::kind() const { return impl_->kind; }
const IdealGasMixture& CubicGas::ideal_gas() const { return impl_->mixture; }
std::vector<std::pair<std::string, double>> CubicGas::mole_fractions() const { return impl_->d.mole_fractions; }
bool CubicGas::renormalised() const { return impl_->d.renormalised; }
double CubicGas::given_sum() const { return impl_->d.given_sum; }
const std::vector<CriticalConstants>& CubicGas::critical_constants() const { return impl_->critical; }
double CubicGas::interaction(std::size_t i, std::size_t j) const {
  return 1 - impl_->one_minus_k.at(i * impl_->n + j);
}

std::vector<double> CubicGas::compressibility_roots(double p, double T) const {
  const Impl& m = *impl_;
  const double RT = kR * T;
  const detail::CubicRoots roots = detail::cubic_roots(m.attraction.at(T).a * p / (RT * RT), m.b * p / RT, m.k);
  return {roots.z, roots.z + roots.count};
}

CompressibilityFunctions CubicGas::compressibility_functions(double p, double T) const {
  const CubicPoint pt = impl_->point(p, T);
  const double dv_dt = -pt.r.dp_dt / pt.r.dp_dv;  // (dv/dT)_p
  return {T / pt.r.v * dv_dt - 1, -p / (pt.r.v * pt.r.dp_dv)};
}

}  // namespace shaftwork::fluids

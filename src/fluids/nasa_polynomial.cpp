// NasaPolynomialGas: an ideal gas (pure or ideal mixture) on NASA polynomials, a thin
// FluidModel over IdealGasMixture (ideal_gas_mixture.cpp folds the species and builds the
// grid for the inverse solves). The state calls evaluate the folded polynomial inline;
// they allocate nothing and call nothing virtual.
#include "shaftwork/fluids/nasa_polynomial.hpp"

#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include <fmt/format.h>

#include "checks.hpp"
#include "ideal_gas_mixture_data.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/compressibility_estimate.hpp"
#include "shaftwork/fluids/ideal_gas_mixture.hpp"

namespace shaftwork::fluids {
namespace {

using detail::IdealGasMixtureData;
using detail::MixtureValues;

constexpr double kStandardPressure = IdealGasMixture::kStandardPressure;  // Pa
constexpr double kEndSlack = 1e-12;  // relative rounding allowance at the range ends

// ln(p/p°), remembered for the last pressure this thread asked about: a rating asks for
// the outlet's state from (p2, T2) and then for the isentropic outlet from (p2, s1), or
// the other way round. The same expression either way, so the same bits.
double log_pressure_ratio(double p) {
  thread_local double last_p = kStandardPressure;
  thread_local double last_log = 0.0;
  if (p != last_p) {
    last_p = p;
    last_log = std::log(p / kStandardPressure);
  }
  return last_log;
}

}  // namespace

struct NasaPolynomialGas::Impl {
  explicit Impl(IdealGasMixture m)
      : mixture(std::move(m)), d(mixture.data()), z_estimate(CompressibilityEstimator::for_mixture(d.mole_fractions)) {}
  IdealGasMixture mixture;
  const IdealGasMixtureData& d;
  std::optional<CompressibilityEstimator> z_estimate;  // for warnings where the ideal gas is off

  State state(double p, double T) const { return state(p, T, log_pressure_ratio(p), std::log(T)); }
  // log_p = ln(p/p°) and ln_t = ln T, when the caller has them already.
  State state(double p, double T, double log_p, double ln_t) const {
    const MixtureValues v = d.at(T, ln_t);
    const double R = d.gas_constant;
    State st;
    st.pressure = p;
    st.temperature = T;
    st.enthalpy = R * v.h_r;
    st.entropy = R * (v.s_r - log_p);
    st.cp = R * v.cp_r;
    st.cv = st.cp - R;
    st.density = p / (R * T);
    st.molar_mass = d.molar_mass;
    st.compressibility = 1.0;
    st.expansivity = 1.0 / T;
    return st;
  }
};

NasaPolynomialGas::NasaPolynomialGas(const std::vector<Component>& components, CompositionBasis basis)
    : impl_(std::make_shared<const Impl>(IdealGasMixture(components, basis))) {}

State NasaPolynomialGas::from_pt(double p, double T) const {
  const Impl& m = *impl_;
  detail::check_pressure(p, m.d.label.c_str());
  detail::check_finite(T, "temperature", m.d.label.c_str());
  detail::check_temperature(T, m.d.range, m.d.label.c_str());
  return m.state(p, T);
}

State NasaPolynomialGas::from_ph(double p, double h) const {
  const IdealGasMixtureData& d = impl_->d;
  detail::check_pressure(p, d.label.c_str());
  detail::check_finite(h, "enthalpy", d.label.c_str());
  const double target = h / d.gas_constant;  // H°/R, K
  const auto solved = d.solve_temperature(target, false, kEndSlack * (std::fabs(target) + d.range.high),
                                     [&](bool below) -> double {
                                       throw Error(ErrorKind::out_of_range,
                                                   fmt::format("{}: enthalpy {:.6g} J/kg needs a temperature {} "
                                                               "the model's range {:g} to {:g} K",
                                                               d.label, h, below ? "below" : "above",
                                                               d.range.low, d.range.high));
                                     });
  // The state takes ln T afresh (not solved.ln_t): from_ph is off the batch's hot path, and
  // its states stay bit for bit what they were (a message quotes a difference of two
  // enthalpies that rounding alone sets: tests/bad_input/huge-number.json).
  return impl_->state(p, solved.t);
}

State NasaPolynomialGas::from_ps(double p, double s) const {
  const IdealGasMixtureData& d = impl_->d;
  detail::check_pressure(p, d.label.c_str());
  detail::check_finite(s, "entropy", d.label.c_str());
  const double log_p = log_pressure_ratio(p);
  const double target = s / d.gas_constant + log_p;  // S°/R at p°
  const auto solved = d.solve_temperature(target, true, kEndSlack * (std::fabs(target) + std::fabs(log_p) + 1.0),
                                     [&](bool below) -> double {
                                       throw Error(ErrorKind::out_of_range,
                                                   fmt::format("{}: entropy {:.6g} J/(kg K) at {:.6g} Pa needs a "
                                                               "temperature {} the model's range {:g} to {:g} K",
                                                               d.label, s, p, below ? "below" : "above",
                                                               d.range.low, d.range.high));
                                     });
  return impl_->state(p, solved.t, log_p, solved.ln_t);
}

std::string NasaPolynomialGas::description() const { return impl_->d.description; }

Range NasaPolynomialGas::temperature_range() const { return impl_->d.range; }

// An ideal gas has no pressure limit of its own; these bounds only keep inputs sane for
// listings. States are computed for any finite p > 0.
Range NasaPolynomialGas::pressure_range() const { return {1e-3, 1e9}; }

std::optional<double> NasaPolynomialGas::ideal_gas_constant() const { return impl_->d.gas_constant; }

std::optional<double> NasaPolynomialGas::estimated_compressibility(double p, double T) const {
  if (!impl_->z_estimate) return std::nullopt;
  const double z = impl_->z_estimate->z(p, T);
  return std::isfinite(z) ? std::optional<double>(z) : std::nullopt;
}

bool NasaPolynomialGas::estimated_compressibility_within(double p, double T, double tolerance) const {
  return impl_->z_estimate && impl_->z_estimate->proven_within(p, T, tolerance);
}

std::vector<std::pair<std::string, double>> NasaPolynomialGas::mole_fractions() const {
  return impl_->d.mole_fractions;
}

bool NasaPolynomialGas::renormalised() const { return impl_->d.renormalised; }

double NasaPolynomialGas::given_sum() const { return impl_->d.given_sum; }

const IdealGasMixture& NasaPolynomialGas::ideal_gas() const { return impl_->mixture; }

}  // namespace shaftwork::fluids

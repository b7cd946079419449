// The compressibility estimate: Peng-Robinson Z from the built-in tables, without a model.
// a(T) of the composition is prepared as a quadratic in sqrt(T), as in CubicGas
// (src/fluids/cubic_core.hpp).
#include "shaftwork/fluids/compressibility_estimate.hpp"

#include <cmath>
#include <limits>

#include "cubic_core.hpp"
#include "shaftwork/fluids/critical_data.hpp"

namespace shaftwork::fluids {
namespace {
constexpr CubicKind kKind = CubicKind::peng_robinson;
}

std::optional<CompressibilityEstimator> CompressibilityEstimator::for_mixture(
    const std::vector<std::pair<std::string, double>>& mole_fractions) {
  const SpeciesLibrary& library = SpeciesLibrary::built_in();
  const CriticalData& data = CriticalData::built_in();
  const detail::CubicConstants k = detail::cubic_constants(kKind);
  const std::size_t n = mole_fractions.size();
  std::vector<std::string> names(n);
  std::vector<double> c0(n), c1(n);  // x_i sqrt(a_i) = c0 + c1 sqrt(T)
  double total = 0;
  CompressibilityEstimator e;
  for (std::size_t i = 0; i < n; ++i) {
    const NasaSpecies* sp = library.find(mole_fractions[i].first);
    const CriticalConstants* c = sp ? data.find(sp->name) : nullptr;
    const double x = mole_fractions[i].second;
    if (!c || !(x >= 0 && std::isfinite(x))) return std::nullopt;
    names[i] = sp->name;
    total += x;
    const double m = detail::alpha_slope(kKind, c->acentric_factor);
    const double tc = c->critical_temperature;
    const double sqrt_ac = std::sqrt(k.omega_a) * detail::kR * tc / std::sqrt(c->critical_pressure);
    c0[i] = x * sqrt_ac * (1 + m);
    c1[i] = -x * sqrt_ac * m / std::sqrt(tc);
    e.b_ += x * k.omega_b * detail::kR * tc / c->critical_pressure;
  }
  if (!(total > 0)) return std::nullopt;
  for (std::size_t i = 0; i < n; ++i) {
    for (std::size_t j = i; j < n; ++j) {  // each pair once, counted twice off the diagonal
      const InteractionParameter* kij = i < j ? data.interaction(names[i], names[j], kKind) : nullptr;
      const double w = (i == j ? 1.0 : 2.0) * (1 - (kij ? kij->k : 0.0));
      e.a0_ += w * c0[i] * c0[j];
      e.a1_ += w * (c0[i] * c1[j] + c1[i] * c0[j]);
      e.a2_ += w * c1[i] * c1[j];
    }
  }
  const double scale = 1 / (total * total);
  e.a0_ *= scale;
  e.a1_ *= scale;
  e.a2_ *= scale;
  e.b_ /= total;
  return e;
}

double CompressibilityEstimator::z(double p, double T) const {
  if (!(std::isfinite(p) && p > 0 && std::isfinite(T) && T > 0)) return std::numeric_limits<double>::quiet_NaN();
  const detail::CubicConstants k = detail::cubic_constants(kKind);
  const double RT = detail::kR * T;
  const double a = a0_ + a1_ * std::sqrt(T) + a2_ * T;
  const double A = a * p / (RT * RT);
  const double B = b_ * p / RT;
  const detail::CubicRoots roots = detail::cubic_roots(A, B, k);
  if (roots.count == 0) return std::numeric_limits<double>::quiet_NaN();
  return detail::stable_root(roots, A, B, k);
}

std::optional<double> estimate_compressibility(const std::vector<std::pair<std::string, double>>& mole_fractions,
                                               double p, double T) {
  if (!(std::isfinite(p) && p > 0 && std::isfinite(T) && T > 0)) return std::nullopt;
  const auto estimator = CompressibilityEstimator::for_mixture(mole_fractions);
  if (!estimator) return std::nullopt;
  const double z = estimator->z(p, T);
  return std::isfinite(z) ? std::optional<double>(z) : std::nullopt;
}

}  // namespace shaftwork::fluids

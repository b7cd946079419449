// The compressibility estimate: Peng-Robinson Z from the built-in tables, without a model.
// a(T) of the composition is prepared as a quadratic in sqrt(T), as in CubicGas
// (src/fluids/cubic_core.hpp).
#include "shaftwork/fluids/compressibility_estimate.hpp"

#include <cmath>
#include <limits>
#include <utility>

#include "cubic_core.hpp"
#include "shaftwork/fluids/critical_data.hpp"

namespace shaftwork::fluids {
namespace {
constexpr CubicKind kKind = CubicKind::peng_robinson;

// A = a p/(R T)^2 and B = b p/(R T) at (p, T).
std::pair<double, double> dimensionless(double a0, double a1, double a2, double b, double p, double T) {
  const double RT = detail::kR * T;
  const double a = a0 + a1 * std::sqrt(T) + a2 * T;
  return {a * p / (RT * RT), b * p / RT};
}

bool valid(double p, double T) { return std::isfinite(p) && p > 0 && std::isfinite(T) && T > 0; }
}  // namespace

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
  if (!valid(p, T)) return std::numeric_limits<double>::quiet_NaN();
  const detail::CubicConstants k = detail::cubic_constants(kKind);
  const auto [A, B] = dimensionless(a0_, a1_, a2_, b_, p, T);
  const detail::CubicRoots roots = detail::cubic_roots(A, B, k);
  if (roots.count == 0) return std::numeric_limits<double>::quiet_NaN();
  return detail::stable_root(roots, A, B, k);
}

bool CompressibilityEstimator::proven_within(double p, double T, double tolerance) const {
  if (!valid(p, T) || !(tolerance >= 0 && tolerance < 0.5)) return false;
  const auto [A, B] = dimensionless(a0_, a1_, a2_, b_, p, T);
  return detail::only_root_within(A, B, detail::cubic_constants(kKind), 1 - tolerance, 1 + tolerance);
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

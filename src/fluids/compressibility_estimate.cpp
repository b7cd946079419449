// The compressibility estimate: Peng-Robinson Z from the built-in tables, without a model.
#include "shaftwork/fluids/compressibility_estimate.hpp"

#include <cmath>

#include "cubic_core.hpp"
#include "shaftwork/fluids/critical_data.hpp"

namespace shaftwork::fluids {

std::optional<double> estimate_compressibility(const std::vector<std::pair<std::string, double>>& mole_fractions,
                                               double p, double T) {
  if (!(std::isfinite(p) && p > 0 && std::isfinite(T) && T > 0)) return std::nullopt;
  const SpeciesLibrary& library = SpeciesLibrary::built_in();
  const CriticalData& data = CriticalData::built_in();
  constexpr CubicKind kKind = CubicKind::peng_robinson;
  const detail::CubicConstants k = detail::cubic_constants(kKind);
  const std::size_t n = mole_fractions.size();
  std::vector<std::string> names(n);
  std::vector<double> x(n), s(n);
  double total = 0;
  double b = 0;
  for (std::size_t i = 0; i < n; ++i) {
    const NasaSpecies* sp = library.find(mole_fractions[i].first);
    const CriticalConstants* c = sp ? data.find(sp->name) : nullptr;
    if (!c || !(mole_fractions[i].second >= 0)) return std::nullopt;
    names[i] = sp->name;
    x[i] = mole_fractions[i].second;
    total += x[i];
    const double m = detail::alpha_slope(kKind, c->acentric_factor);
    const double tc = c->critical_temperature;
    s[i] = std::sqrt(k.omega_a) * detail::kR * tc / std::sqrt(c->critical_pressure) * (1 + m * (1 - std::sqrt(T / tc)));
    b += x[i] * k.omega_b * detail::kR * tc / c->critical_pressure;
  }
  if (!(total > 0)) return std::nullopt;
  double a = 0;
  for (std::size_t i = 0; i < n; ++i) {
    for (std::size_t j = 0; j < n; ++j) {
      const InteractionParameter* kij = i == j ? nullptr : data.interaction(names[i], names[j], kKind);
      a += x[i] * x[j] * (1 - (kij ? kij->k : 0.0)) * s[i] * s[j];
    }
  }
  a /= total * total;
  b /= total;
  const double RT = detail::kR * T;
  const double A = a * p / (RT * RT);
  const double B = b * p / RT;
  const detail::CubicRoots roots = detail::cubic_roots(A, B, k);
  if (roots.count == 0) return std::nullopt;
  return detail::stable_root(roots, A, B, k);
}

}  // namespace shaftwork::fluids

// CompressibilityEstimator::proven_within, the cheap test behind the ideal-gas warning of
// every batch row, against the full solve (z(), the closed-form cubic): over a sweep of
// pressure, temperature and composition, through the critical points of pure fluids and the
// two-phase region, a proof is never given where the full solve puts Z outside the
// tolerance, and it is given wherever the gas has one root and Z lies clearly inside.
#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include <catch2/catch.hpp>
#include <fmt/format.h>

#include "shaftwork/fluids/compressibility_estimate.hpp"
#include "shaftwork/fluids/critical_data.hpp"
#include "shaftwork/fluids/cubic_eos.hpp"

using namespace shaftwork::fluids;

namespace {

using Fractions = std::vector<std::pair<std::string, double>>;

CubicGas peng_robinson(const Fractions& fractions) {
  std::vector<Component> components;
  for (const auto& [name, x] : fractions) {
    const NasaSpecies* sp = SpeciesLibrary::built_in().find(name);
    REQUIRE(sp != nullptr);
    components.push_back({sp, x});
  }
  return CubicGas(CubicKind::peng_robinson, components, CompositionBasis::mole);
}

// What one sweep found, by kind of state.
struct Tally {
  int points = 0;
  int proven = 0;
  int three_roots = 0;    // two-phase region and metastable states (the cubic's three roots above B)
  int near_critical = 0;  // within 1 % of a pure fluid's critical temperature and pressure
};

// Every (p, T) of the grid, for every tolerance: a proof only where the full solve agrees,
// and a proof wherever the full solve finds one root clearly inside.
void sweep(const Fractions& fractions, const std::vector<double>& pressures, const std::vector<double>& temperatures,
           const CriticalConstants* critical, Tally& tally) {
  const auto estimator = CompressibilityEstimator::for_mixture(fractions);
  REQUIRE(estimator.has_value());
  const CubicGas gas = peng_robinson(fractions);
  for (const double p : pressures) {
    for (const double T : temperatures) {
      const double z = estimator->z(p, T);
      const std::size_t roots = gas.compressibility_roots(p, T).size();
      ++tally.points;
      tally.three_roots += roots == 3;
      tally.near_critical += critical && std::fabs(T / critical->critical_temperature - 1) < 0.01 &&
                             std::fabs(p / critical->critical_pressure - 1) < 0.01;
      for (const double tolerance : {0.001, 0.01, 0.05, 0.2}) {
        const bool proven = estimator->proven_within(p, T, tolerance);
        tally.proven += proven;
        INFO(fmt::format("{} at p = {} Pa, T = {} K: Z = {}, {} roots, tolerance {}", fractions.front().first, p, T,
                         z, roots, tolerance));
        if (proven) REQUIRE(std::fabs(1 - z) <= tolerance);
        if (roots == 1 && std::fabs(1 - z) < tolerance - 1e-6) REQUIRE(proven);
        if (roots == 3) REQUIRE_FALSE(proven);
      }
    }
  }
}

std::vector<double> geometric(double first, double last, int n) {
  std::vector<double> out;
  for (int i = 0; i < n; ++i) out.push_back(first * std::pow(last / first, static_cast<double>(i) / (n - 1)));
  return out;
}

}  // namespace

TEST_CASE("the proof of Z within a tolerance agrees with the full cubic solve") {
  Tally tally;
  // Pure fluids, each across its critical point: a grid from 0.3 to 4 times Tc and from 1e-4
  // to 5 times pc, and a fine one within 2 % of the critical point.
  for (const char* name : {"N2", "CH4", "CO2", "n-C4H10", "n-C6H14", "H2O", "H2", "NO"}) {
    const Fractions pure = {{name, 1.0}};
    const CriticalConstants* c = CriticalData::built_in().find(SpeciesLibrary::built_in().find(name)->name);
    REQUIRE(c != nullptr);
    const double Tc = c->critical_temperature;
    const double pc = c->critical_pressure;
    sweep(pure, geometric(1e-4 * pc, 5 * pc, 61), geometric(0.3 * Tc, 4 * Tc, 61), c, tally);
    sweep(pure, geometric(0.98 * pc, 1.02 * pc, 21), geometric(0.98 * Tc, 1.02 * Tc, 21), c, tally);
  }
  // Mixtures: air (the NASA database's "Air" record), an invented natural gas with heavy ends,
  // an invented flue gas with steam.
  const std::vector<Fractions> mixtures = {
      {{"N2", 0.78084}, {"O2", 0.209476}, {"Ar", 0.009365}, {"CO2", 0.000319}},
      {{"CH4", 0.86}, {"C2H6", 0.06}, {"C3H8", 0.03}, {"n-C4H10", 0.015}, {"n-C6H14", 0.015}, {"CO2", 0.02}},
      {{"N2", 0.72}, {"CO2", 0.12}, {"H2O", 0.14}, {"O2", 0.02}},
  };
  for (const Fractions& m : mixtures) sweep(m, geometric(1e3, 3e7, 81), geometric(90, 1500, 81), nullptr, tally);
  // The sweep reaches every kind of state it is meant to (53,000 points, 11,000 of them with
  // three roots, 800 near a critical point; 99,000 proofs over the four tolerances).
  CHECK(tally.points > 50000);
  CHECK(tally.proven > 90000);
  CHECK(tally.three_roots > 10000);
  CHECK(tally.near_critical > 700);
}

TEST_CASE("the proof is refused for states it cannot settle") {
  const auto air =
      CompressibilityEstimator::for_mixture({{"N2", 0.78084}, {"O2", 0.209476}, {"Ar", 0.009365}, {"CO2", 0.000319}});
  REQUIRE(air.has_value());
  // Air at 8 bar and 300 K: the full solve puts Z within 1 % of 1, not within 0.1 %.
  const double z = air->z(8e5, 300);
  REQUIRE(std::fabs(1 - z) < 0.01);
  REQUIRE(std::fabs(1 - z) > 0.001);
  CHECK(air->proven_within(8e5, 300, 0.01));
  CHECK_FALSE(air->proven_within(8e5, 300, 0.001));
  // Not a state, or not a tolerance the proof handles (the gas root must stay above 1/2).
  CHECK_FALSE(air->proven_within(-1, 300, 0.01));
  CHECK_FALSE(air->proven_within(8e5, std::nan(""), 0.01));
  CHECK_FALSE(air->proven_within(8e5, 300, -0.01));
  CHECK_FALSE(air->proven_within(8e5, 300, 0.5));
}

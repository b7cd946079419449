// Speed of the property models' state calls: from (p, T), (p, h), (p, s).
//
//   cmake -S . -B build-bench -DSHAFTWORK_BENCHMARKS=ON && cmake --build build-bench --target bench_properties
//   build-bench/bench/bench_properties
//
// Each benchmark cycles through a fixed set of states spread over a compressor's and a
// turbine's working range, so the branch predictor does not see one input over and over.
// docs/performance.md records the results.
#include <array>
#include <cstddef>
#include <string>
#include <utility>
#include <vector>

#include <benchmark/benchmark.h>

#include "shaftwork/fluids/compressibility_estimate.hpp"
#include "shaftwork/fluids/cubic_eos.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

namespace {

using shaftwork::fluids::Component;
using shaftwork::fluids::CompositionBasis;
using shaftwork::fluids::NasaPolynomialGas;
using shaftwork::fluids::SpeciesLibrary;

NasaPolynomialGas make_gas(const std::vector<std::pair<std::string, double>>& mole_fractions) {
  const SpeciesLibrary& library = SpeciesLibrary::built_in();
  std::vector<Component> components;
  for (const auto& [name, fraction] : mole_fractions) components.push_back({library.find(name), fraction});
  return NasaPolynomialGas(components, CompositionBasis::mole);
}

// Dry air as the NASA Glenn database's own "Air" record defines it (Gordon 1982), mole fractions.
const NasaPolynomialGas& air() {
  static const NasaPolynomialGas gas =
      make_gas({{"N2", 0.78084}, {"O2", 0.209476}, {"Ar", 0.009365}, {"CO2", 0.000319}});
  return gas;
}

// A pipeline natural gas with six species, mole fractions.
const NasaPolynomialGas& natural_gas() {
  static const NasaPolynomialGas gas = make_gas({{"CH4", 0.90},
                                                 {"C2H6", 0.05},
                                                 {"C3H8", 0.02},
                                                 {"n-C4H10", 0.005},
                                                 {"N2", 0.015},
                                                 {"CO2", 0.01}});
  return gas;
}

constexpr std::size_t kPoints = 64;

// Pressures 0.5 to 40 bar and temperatures 250 to 1400 K, interleaved.
std::array<std::pair<double, double>, kPoints> pressure_temperature_points() {
  std::array<std::pair<double, double>, kPoints> points{};
  for (std::size_t i = 0; i < kPoints; ++i) {
    const double p = 0.5e5 + 39.5e5 * static_cast<double>((i * 37) % kPoints) / kPoints;
    const double T = 250.0 + 1150.0 * static_cast<double>(i) / kPoints;
    points[i] = {p, T};
  }
  return points;
}

using Points = std::array<std::pair<double, double>, kPoints>;

// State calls of any model, cycling through `make_points()`.
template <class Gas>
void bm_from_pt(benchmark::State& state, const Gas& gas, Points (*make_points)()) {
  const Points points = make_points();
  std::size_t i = 0;
  for (auto _ : state) {
    const auto& [p, T] = points[i++ % kPoints];
    benchmark::DoNotOptimize(gas.from_pt(p, T));
  }
}

// The inverse calls: from (p, h) when `entropy` is false, from (p, s) when true, at the
// enthalpies or entropies of the same points.
template <class Gas>
void bm_inverse(benchmark::State& state, const Gas& gas, Points (*make_points)(), bool entropy) {
  Points inputs = make_points();
  for (auto& [p, x] : inputs) {
    const auto st = gas.from_pt(p, x);
    x = entropy ? st.entropy : st.enthalpy;
  }
  std::size_t i = 0;
  for (auto _ : state) {
    const auto& [p, x] = inputs[i++ % kPoints];
    benchmark::DoNotOptimize(entropy ? gas.from_ps(p, x) : gas.from_ph(p, x));
  }
}

template <class Gas>
void bm_from_ph(benchmark::State& state, const Gas& gas, Points (*make_points)()) {
  bm_inverse(state, gas, make_points, false);
}

template <class Gas>
void bm_from_ps(benchmark::State& state, const Gas& gas, Points (*make_points)()) {
  bm_inverse(state, gas, make_points, true);
}

void bm_construct(benchmark::State& state) {
  for (auto _ : state) {
    benchmark::DoNotOptimize(make_gas({{"CH4", 0.90},
                                       {"C2H6", 0.05},
                                       {"C3H8", 0.02},
                                       {"n-C4H10", 0.005},
                                       {"N2", 0.015},
                                       {"CO2", 0.01}}));
  }
}

// --- Cubic equations of state (issue 15): an 11-species sour natural gas (invented example
// composition, mole fractions) on Peng-Robinson and Soave-Redlich-Kwong, at compressor states
// from 20 to 100 bar and 290 to 450 K (all one gas phase: its dew point is below 250 K).
const std::vector<std::pair<std::string, double>> kSourGas = {
    {"CH4", 0.905},      {"C2H6", 0.045},     {"C3H8", 0.012},     {"n-C4H10", 0.003},
    {"i-C4H10", 0.0025}, {"n-C5H12", 0.0008}, {"i-C5H12", 0.0007}, {"n-C6H14", 0.0005},
    {"N2", 0.015},       {"CO2", 0.0085},     {"H2S", 0.007}};

shaftwork::fluids::CubicGas make_cubic(shaftwork::fluids::CubicKind kind) {
  const SpeciesLibrary& library = SpeciesLibrary::built_in();
  std::vector<Component> components;
  for (const auto& [name, fraction] : kSourGas) components.push_back({library.find(name), fraction});
  return shaftwork::fluids::CubicGas(kind, components, CompositionBasis::mole);
}

const shaftwork::fluids::CubicGas& peng_robinson() {
  static const auto gas = make_cubic(shaftwork::fluids::CubicKind::peng_robinson);
  return gas;
}

const shaftwork::fluids::CubicGas& soave() {
  static const auto gas = make_cubic(shaftwork::fluids::CubicKind::soave_redlich_kwong);
  return gas;
}

Points compressor_points() {
  Points points{};
  for (std::size_t i = 0; i < kPoints; ++i) {
    const double p = 20e5 + 80e5 * static_cast<double>((i * 37) % kPoints) / kPoints;
    const double T = 290.0 + 160.0 * static_cast<double>(i) / kPoints;
    points[i] = {p, T};
  }
  return points;
}

void bm_cubic_construct(benchmark::State& state) {
  for (auto _ : state) benchmark::DoNotOptimize(make_cubic(shaftwork::fluids::CubicKind::peng_robinson));
}

void bm_compressibility_estimator(benchmark::State& state) {
  const auto estimator = *shaftwork::fluids::CompressibilityEstimator::for_mixture(kSourGas);
  const auto points = compressor_points();
  std::size_t i = 0;
  for (auto _ : state) {
    const auto& [p, T] = points[i++ % kPoints];
    benchmark::DoNotOptimize(estimator.z(p, T));
  }
}

void bm_compressibility_estimate(benchmark::State& state) {
  const auto points = compressor_points();
  std::size_t i = 0;
  for (auto _ : state) {
    const auto& [p, T] = points[i++ % kPoints];
    benchmark::DoNotOptimize(shaftwork::fluids::estimate_compressibility(kSourGas, p, T));
  }
}

// The ideal-gas warning's question at a plant-air compressor's states (1-9 bar, 290-600 K):
// the full estimate, and the proof that Z is within 1 % which a batch row asks first.
Points plant_air_points() {
  Points points{};
  for (std::size_t i = 0; i < kPoints; ++i) {
    const double p = 1e5 + 8e5 * static_cast<double>((i * 37) % kPoints) / kPoints;
    const double T = 290.0 + 310.0 * static_cast<double>(i) / kPoints;
    points[i] = {p, T};
  }
  return points;
}

void bm_air_estimate(benchmark::State& state) {
  const auto estimator = *shaftwork::fluids::CompressibilityEstimator::for_mixture(air().mole_fractions());
  const auto points = plant_air_points();
  std::size_t i = 0;
  for (auto _ : state) {
    const auto& [p, T] = points[i++ % kPoints];
    benchmark::DoNotOptimize(estimator.z(p, T));
  }
}

void bm_air_estimate_proof(benchmark::State& state) {
  const auto estimator = *shaftwork::fluids::CompressibilityEstimator::for_mixture(air().mole_fractions());
  const auto points = plant_air_points();
  std::size_t i = 0;
  for (auto _ : state) {
    const auto& [p, T] = points[i++ % kPoints];
    benchmark::DoNotOptimize(estimator.proven_within(p, T, 0.01));
  }
}

}  // namespace

BENCHMARK_CAPTURE(bm_from_pt, nasa_air, air(), pressure_temperature_points);
BENCHMARK_CAPTURE(bm_from_pt, nasa_natural_gas, natural_gas(), pressure_temperature_points);
BENCHMARK_CAPTURE(bm_from_ph, nasa_air, air(), pressure_temperature_points);
BENCHMARK_CAPTURE(bm_from_ph, nasa_natural_gas, natural_gas(), pressure_temperature_points);
BENCHMARK_CAPTURE(bm_from_ps, nasa_air, air(), pressure_temperature_points);
BENCHMARK_CAPTURE(bm_from_ps, nasa_natural_gas, natural_gas(), pressure_temperature_points);
BENCHMARK(bm_construct);
BENCHMARK_CAPTURE(bm_from_pt, peng_robinson_11, peng_robinson(), compressor_points);
BENCHMARK_CAPTURE(bm_from_ph, peng_robinson_11, peng_robinson(), compressor_points);
BENCHMARK_CAPTURE(bm_from_ps, peng_robinson_11, peng_robinson(), compressor_points);
BENCHMARK_CAPTURE(bm_from_pt, soave_redlich_kwong_11, soave(), compressor_points);
BENCHMARK_CAPTURE(bm_from_ps, soave_redlich_kwong_11, soave(), compressor_points);
BENCHMARK(bm_cubic_construct)->Unit(benchmark::kMillisecond);
BENCHMARK(bm_compressibility_estimate);
BENCHMARK(bm_compressibility_estimator);
BENCHMARK(bm_air_estimate);
BENCHMARK(bm_air_estimate_proof);

BENCHMARK_MAIN();

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

void bm_from_pt(benchmark::State& state, const NasaPolynomialGas& gas) {
  const auto points = pressure_temperature_points();
  std::size_t i = 0;
  for (auto _ : state) {
    const auto& [p, T] = points[i++ % kPoints];
    benchmark::DoNotOptimize(gas.from_pt(p, T));
  }
}

void bm_from_ph(benchmark::State& state, const NasaPolynomialGas& gas) {
  std::array<std::pair<double, double>, kPoints> inputs{};
  const auto points = pressure_temperature_points();
  for (std::size_t i = 0; i < kPoints; ++i) {
    inputs[i] = {points[i].first, gas.from_pt(points[i].first, points[i].second).enthalpy};
  }
  std::size_t i = 0;
  for (auto _ : state) {
    const auto& [p, h] = inputs[i++ % kPoints];
    benchmark::DoNotOptimize(gas.from_ph(p, h));
  }
}

void bm_from_ps(benchmark::State& state, const NasaPolynomialGas& gas) {
  std::array<std::pair<double, double>, kPoints> inputs{};
  const auto points = pressure_temperature_points();
  for (std::size_t i = 0; i < kPoints; ++i) {
    inputs[i] = {points[i].first, gas.from_pt(points[i].first, points[i].second).entropy};
  }
  std::size_t i = 0;
  for (auto _ : state) {
    const auto& [p, s] = inputs[i++ % kPoints];
    benchmark::DoNotOptimize(gas.from_ps(p, s));
  }
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

}  // namespace

BENCHMARK_CAPTURE(bm_from_pt, nasa_air, air());
BENCHMARK_CAPTURE(bm_from_pt, nasa_natural_gas, natural_gas());
BENCHMARK_CAPTURE(bm_from_ph, nasa_air, air());
BENCHMARK_CAPTURE(bm_from_ph, nasa_natural_gas, natural_gas());
BENCHMARK_CAPTURE(bm_from_ps, nasa_air, air());
BENCHMARK_CAPTURE(bm_from_ps, nasa_natural_gas, natural_gas());
BENCHMARK(bm_construct);

BENCHMARK_MAIN();

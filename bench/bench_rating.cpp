// Speed of machines::rate on in-memory cases (issue 3): a NASA-air compressor with
// p1, T1, p2, the isentropic efficiency and the mass flow given; the outlet
// temperature and the power solved.
//
//   cmake -S . -B build-bench -DSHAFTWORK_BENCHMARKS=ON && cmake --build build-bench --target bench_rating
//   build-bench/bench/bench_rating
//
// The cases are built once (1e6 of them, spread over inlet 0.9-1.1 bar, 270-320 K,
// pressure ratio 2-8, efficiency 0.70-0.88) and rated in turn; one iteration rates
// one case, so items_per_second is cases per second on one core. The fluid model is
// shared, as the batch runner shares it. docs/performance.md records the results.
#include <cstddef>
#include <memory>
#include <vector>

#include <benchmark/benchmark.h>

#include "shaftwork/io/fluid_factory.hpp"
#include "shaftwork/machines/rating.hpp"

namespace {

using shaftwork::machines::EfficiencyBasis;
using shaftwork::machines::RatingInput;

constexpr std::size_t kCases = 1'000'000;

std::shared_ptr<const shaftwork::fluids::FluidModel> nasa_air() {
  shaftwork::io::FluidFactory factory;
  std::vector<std::string> warnings;
  return factory.make("air", "fluid", warnings);
}

// A fixed, deterministic spread of cases (a linear congruential sequence, no <random>
// so the cases are the same on every standard library).
std::vector<RatingInput> make_cases(EfficiencyBasis basis) {
  const auto air = nasa_air();
  std::vector<RatingInput> cases(kCases);
  unsigned long long state = 12345;
  auto uniform = [&state] {
    state = state * 6364136223846793005ULL + 1442695040888963407ULL;
    return static_cast<double>(state >> 11) / 9007199254740992.0;  // [0, 1)
  };
  for (RatingInput& c : cases) {
    c.machine = shaftwork::machines::MachineKind::compressor;
    c.fluid = air;
    c.inlet_pressure = 0.9e5 + 0.2e5 * uniform();
    c.inlet_temperature = 270.0 + 50.0 * uniform();
    c.outlet_pressure = *c.inlet_pressure * (2.0 + 6.0 * uniform());
    shaftwork::machines::set_efficiency(c, basis, 0.70 + 0.18 * uniform());
    c.mass_flow = 1.0 + 9.0 * uniform();
  }
  return cases;
}

void rate_cases(benchmark::State& state, EfficiencyBasis basis) {
  const std::vector<RatingInput> cases = make_cases(basis);
  std::size_t i = 0;
  for (auto _ : state) {
    benchmark::DoNotOptimize(shaftwork::machines::rate(cases[i]));
    if (++i == cases.size()) i = 0;
  }
  state.SetItemsProcessed(state.iterations());
}

// A full pass over the million cases per iteration: the figure issue 3 asks for.
void rate_million(benchmark::State& state) {
  const std::vector<RatingInput> cases = make_cases(EfficiencyBasis::isentropic);
  for (auto _ : state) {
    double sum = 0;
    for (const RatingInput& c : cases) sum += *shaftwork::machines::rate(c).power;
    benchmark::DoNotOptimize(sum);
  }
  state.SetItemsProcessed(state.iterations() * static_cast<long long>(cases.size()));
}

}  // namespace

BENCHMARK_CAPTURE(rate_cases, nasa_air_isentropic, EfficiencyBasis::isentropic);
BENCHMARK_CAPTURE(rate_cases, nasa_air_polytropic, EfficiencyBasis::polytropic);
BENCHMARK(rate_million)->Unit(benchmark::kMillisecond)->MinTime(2.0);

BENCHMARK_MAIN();

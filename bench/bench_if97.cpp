// Speed of the IAPWS-IF97 model on the work a steam-turbine rating does per test point:
// the inlet from (p, T) and the isentropic outlet from (p, s), the outlet superheated or
// wet. The same points are timed on python3-iapws by bench/if97_python_timing.py;
// docs/performance.md records both.
//
//   cmake -S . -B build -DSHAFTWORK_BENCHMARKS=ON && cmake --build build --target bench_if97
//   build/bench/bench_if97
#include <benchmark/benchmark.h>

#include "shaftwork/fluids/iapws_if97.hpp"

namespace {

using shaftwork::fluids::IapwsIf97;

// (inlet pressure [Pa], inlet temperature [K], outlet pressure [Pa])
struct TurbinePoint {
  double p_in;
  double T_in;
  double p_out;
};

// Outlets in region 2 (superheated), all the same phase as in if97_python_timing.py.
constexpr TurbinePoint kSuperheated[] = {
    {10e6, 800, 2e6},   {16e6, 820, 4e6}, {6e6, 750, 1e6},   {12e6, 850, 3e6},
    {4e6, 720, 0.8e6},  {8e6, 780, 1.5e6}, {14e6, 830, 3.5e6}, {5e6, 760, 1.2e6},
};
// Outlets in the wet region (condensing turbines).
constexpr TurbinePoint kWet[] = {
    {10e6, 800, 10e3}, {16e6, 820, 5e3}, {6e6, 750, 20e3}, {12e6, 850, 50e3},
    {4e6, 720, 100e3}, {8e6, 780, 8e3},  {14e6, 830, 15e3}, {5e6, 760, 30e3},
};

template <const auto& Points>
void turbine_points(benchmark::State& state) {
  const IapwsIf97 water;
  for (auto _ : state) {
    for (const TurbinePoint& pt : Points) {
      const auto inlet = water.from_pt(pt.p_in, pt.T_in);
      const auto outlet = water.from_ps(pt.p_out, inlet.entropy);
      benchmark::DoNotOptimize(outlet.enthalpy - inlet.enthalpy);
    }
  }
  // Items are turbine points: items_per_second is points per second.
  state.SetItemsProcessed(state.iterations() * static_cast<std::int64_t>(std::size(Points)));
}

void BM_If97_TurbinePoint_Superheated(benchmark::State& state) { turbine_points<kSuperheated>(state); }
void BM_If97_TurbinePoint_Wet(benchmark::State& state) { turbine_points<kWet>(state); }
BENCHMARK(BM_If97_TurbinePoint_Superheated);
BENCHMARK(BM_If97_TurbinePoint_Wet);

// The single calls, for finding where time goes.
void BM_If97_FromPT_Region1(benchmark::State& state) {
  const IapwsIf97 water;
  for (auto _ : state) benchmark::DoNotOptimize(water.from_pt(5e6, 350.0));
}
void BM_If97_FromPT_Region2(benchmark::State& state) {
  const IapwsIf97 water;
  for (auto _ : state) benchmark::DoNotOptimize(water.from_pt(10e6, 800.0));
}
void BM_If97_FromPT_Region3(benchmark::State& state) {
  const IapwsIf97 water;
  for (auto _ : state) benchmark::DoNotOptimize(water.from_pt(25e6, 650.0));
}
void BM_If97_FromPS_Region1_Pump(benchmark::State& state) {
  const IapwsIf97 water;
  const double s = water.from_pt(0.1e6, 300.0).entropy;
  for (auto _ : state) benchmark::DoNotOptimize(water.from_ps(20e6, s));
}
void BM_If97_FromPS_Region2(benchmark::State& state) {
  const IapwsIf97 water;
  const double s = water.from_pt(10e6, 800.0).entropy;
  for (auto _ : state) benchmark::DoNotOptimize(water.from_ps(2e6, s));
}
void BM_If97_FromPS_Wet(benchmark::State& state) {
  const IapwsIf97 water;
  const double s = water.from_pt(10e6, 800.0).entropy;
  for (auto _ : state) benchmark::DoNotOptimize(water.from_ps(10e3, s));
}
void BM_If97_FromPH_Region2(benchmark::State& state) {
  const IapwsIf97 water;
  const double h = water.from_pt(10e6, 800.0).enthalpy;
  for (auto _ : state) benchmark::DoNotOptimize(water.from_ph(10e6, h));
}
void BM_If97_FromPH_Region3(benchmark::State& state) {
  const IapwsIf97 water;
  const double h = water.from_pt(25e6, 650.0).enthalpy;
  for (auto _ : state) benchmark::DoNotOptimize(water.from_ph(25e6, h));
}
BENCHMARK(BM_If97_FromPT_Region1);
BENCHMARK(BM_If97_FromPT_Region2);
BENCHMARK(BM_If97_FromPT_Region3);
BENCHMARK(BM_If97_FromPS_Region1_Pump);
BENCHMARK(BM_If97_FromPS_Region2);
BENCHMARK(BM_If97_FromPS_Wet);
BENCHMARK(BM_If97_FromPH_Region2);
BENCHMARK(BM_If97_FromPH_Region3);

}  // namespace

BENCHMARK_MAIN();

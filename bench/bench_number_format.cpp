// Speed of io::format_significant (issue 17), the batch output's number formatter.
//
//   cmake -S . -B build -DCMAKE_BUILD_TYPE=Release -DSHAFTWORK_BENCHMARKS=ON
//   cmake --build build --target bench_number_format
//   build/bench/bench_number_format
//
// 4096 values spread uniformly in log10 |v| over 1e-5..1e15, both signs, built once
// from a fixed seed and formatted in turn into one buffer, as a batch row writes its
// numbers; one iteration formats one number, so items_per_second is numbers per second.
// Cases: 10 significant digits (the result columns), 6 (uncertainties), 10 digits of
// values from 0.1 to 1000, and 10 digits of rows of eleven columns of fixed magnitudes,
// as a batch writes them (each column's layout the same from row to row).
// docs/performance.md records the results.
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <random>
#include <vector>

#include <benchmark/benchmark.h>

#include "shaftwork/io/number_format.hpp"

namespace {

std::vector<double> spread_values(double lowest_log10, double highest_log10) {
  std::mt19937_64 random(17);
  std::uniform_real_distribution<double> log_magnitude(lowest_log10, highest_log10);
  std::vector<double> values(4096);
  for (double& v : values) {
    v = std::pow(10.0, log_magnitude(random));
    if (random() & 1) v = -v;
  }
  return values;
}

// Rows as a batch writes them: eleven columns, each of its own magnitude (efficiencies,
// temperatures in K, pressures in Pa, powers in W, a small ratio...), the digits random.
std::vector<double> row_values() {
  const double columns[] = {0.8, 0.75, 2.5, 300.0, 450.0, 101325.0, 350000.0,
                            1.2e6, 15.0, 0.0035, 0.99};
  std::mt19937_64 random(18);
  std::uniform_real_distribution<double> factor(0.8, 1.25);
  std::vector<double> values(4096);
  for (std::size_t i = 0; i < values.size(); ++i) values[i] = columns[i % 11] * factor(random);
  return values;
}

void format_values(benchmark::State& state, const std::vector<double>& values, int digits) {
  char buffer[shaftwork::io::kMaxNumberChars];
  std::size_t i = 0;
  for (auto _ : state) {
    char* end = shaftwork::io::format_significant(buffer, values[i], digits);
    benchmark::DoNotOptimize(end);
    benchmark::ClobberMemory();
    i = (i + 1) & (values.size() - 1);
  }
  state.SetItemsProcessed(static_cast<std::int64_t>(state.iterations()));
}

void bm_format_10_digits(benchmark::State& state) {
  static const std::vector<double> values = spread_values(-5, 15);
  format_values(state, values, 10);
}

void bm_format_6_digits(benchmark::State& state) {
  static const std::vector<double> values = spread_values(-5, 15);
  format_values(state, values, 6);
}

void bm_format_10_digits_common(benchmark::State& state) {
  static const std::vector<double> values = spread_values(-1, 3);
  format_values(state, values, 10);
}

void bm_format_10_digits_rows(benchmark::State& state) {
  static const std::vector<double> values = row_values();
  format_values(state, values, 10);
}

}  // namespace

BENCHMARK(bm_format_10_digits);
BENCHMARK(bm_format_6_digits);
BENCHMARK(bm_format_10_digits_common);
BENCHMARK(bm_format_10_digits_rows);

BENCHMARK_MAIN();

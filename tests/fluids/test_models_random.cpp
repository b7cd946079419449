// Property-based state round trips of every property model over random states in its range.
//
// For each model: a random (p, T) in the model's range gives a state; from_ph(p, h) and
// from_ps(p, s) of that state must come back to T (the models promise 1e-10 relative; the
// test allows kTolerance), and every number of every state must be finite. A state the model
// refuses must be refused with a shaftwork::Error naming the reason, never a wrong number.
// IF97 also round-trips wet states: from_p_quality gives h and s, from_ph and from_ps give
// the quality back.
//
// Count: SHAFTWORK_RANDOM_STATES states per model (default 2000; 100000 once by hand, see
// DEVELOPERS.md). Seed: SHAFTWORK_RANDOM_SEED (default 20261201).
#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <iostream>
#include <memory>
#include <random>
#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/fluids/constant_cp.hpp"
#include "shaftwork/fluids/iapws_if97.hpp"
#include "shaftwork/fluids/incompressible.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

using namespace shaftwork;
using fluids::State;

namespace {

constexpr double kTolerance = 1e-9;  // relative, on T

long env_count(const char* name, long fallback) {
  const char* text = std::getenv(name);
  if (text == nullptr || *text == '\0') return fallback;
  return std::strtol(text, nullptr, 10);
}

long states_per_model() { return env_count("SHAFTWORK_RANDOM_STATES", 2000); }

std::mt19937_64& rng() {
  static std::mt19937_64 engine(static_cast<std::uint64_t>(env_count("SHAFTWORK_RANDOM_SEED", 20261201)));
  return engine;
}
double uniform(double low, double high) { return std::uniform_real_distribution<double>(low, high)(rng()); }
double log_uniform(double low, double high) { return std::exp(uniform(std::log(low), std::log(high))); }

bool finite(const State& s) {
  return std::isfinite(s.pressure) && std::isfinite(s.temperature) && std::isfinite(s.enthalpy) &&
         std::isfinite(s.entropy) && std::isfinite(s.density) && s.density > 0 && std::isfinite(s.cp) &&
         std::isfinite(s.cv) && (s.is_wet() || (s.cp > 0 && s.cv > 0));
}

struct Tally {
  long states = 0;
  double worst = 0;  // largest relative T difference of a round trip
};

// (p, T) -> state -> (p, h) and (p, s) -> T, for one model and one state.
void round_trip(const fluids::FluidModel& model, double p, double T, Tally& tally) {
  INFO(model.description() << " at p = " << p << " Pa, T = " << T << " K");
  const State s = model.from_pt(p, T);
  REQUIRE(finite(s));
  const State by_h = model.from_ph(p, s.enthalpy);
  const State by_s = model.from_ps(p, s.entropy);
  REQUIRE(finite(by_h));
  REQUIRE(finite(by_s));
  CHECK(!by_h.is_wet());
  CHECK(!by_s.is_wet());
  const double dh = std::fabs(by_h.temperature - T) / T;
  const double ds = std::fabs(by_s.temperature - T) / T;
  CHECK(dh <= kTolerance);
  CHECK(ds <= kTolerance);
  tally.worst = std::max({tally.worst, dh, ds});
  ++tally.states;
}

void report(const std::string& model, const Tally& t) {
  std::cout << "test_models_random: " << model << ": " << t.states << " states round-tripped, worst relative T "
            << "difference " << t.worst << "\n";
}

}  // namespace

TEST_CASE("constant-cp gases round-trip (p, T) through h and s over their whole range") {
  Tally tally;
  for (long i = 0; i < states_per_model(); ++i) {
    fluids::ConstantCpInputs in;
    in.cp = log_uniform(300, 20000);
    in.k = uniform(1.01, 1.67);
    const fluids::ConstantCpGas gas(in);
    round_trip(gas, log_uniform(1e-3, 1e9), log_uniform(1.0, 10000.0), tally);
  }
  report("constant-cp", tally);
}

TEST_CASE("incompressible liquids round-trip (p, T) through h and s over their whole range") {
  Tally tally;
  for (long i = 0; i < states_per_model(); ++i) {
    const fluids::IncompressibleLiquid liquid(log_uniform(100, 20000), log_uniform(500, 10000));
    round_trip(liquid, log_uniform(1e-3, 1e10), log_uniform(1.0, 10000.0), tally);
  }
  report("incompressible", tally);
}

TEST_CASE("NASA species and random mixtures round-trip (p, T) through h and s over their whole range") {
  const auto& library = fluids::SpeciesLibrary::built_in();
  const auto& all = library.species();
  Tally tally;
  for (long i = 0; i < states_per_model(); ++i) {
    // A pure species, or a mixture of two to five species with random mole fractions.
    const auto n = static_cast<size_t>(std::uniform_int_distribution<int>(1, 5)(rng()));
    std::vector<size_t> chosen;
    while (chosen.size() < n) {
      const auto k = static_cast<size_t>(std::uniform_int_distribution<int>(0, static_cast<int>(all.size()) - 1)(rng()));
      if (std::find(chosen.begin(), chosen.end(), k) == chosen.end()) chosen.push_back(k);
    }
    std::vector<double> x;
    double sum = 0;
    for (size_t k = 0; k < n; ++k) {
      x.push_back(uniform(0.01, 1.0));
      sum += x.back();
    }
    std::vector<fluids::Component> components;
    for (size_t k = 0; k < n; ++k) components.push_back({&all[chosen[k]], x[k] / sum});
    const auto basis = std::uniform_int_distribution<int>(0, 1)(rng()) == 0 ? fluids::CompositionBasis::mole
                                                                            : fluids::CompositionBasis::mass;
    const fluids::NasaPolynomialGas gas(components, basis);
    const auto range = gas.temperature_range();
    // Log-uniform in T over the whole range, the ends included now and then.
    const int end = std::uniform_int_distribution<int>(0, 19)(rng());
    const double T = end == 0 ? range.low : end == 1 ? range.high : log_uniform(range.low, range.high);
    round_trip(gas, log_uniform(1e-3, 1e9), T, tally);
  }
  report("nasa-polynomial", tally);
}

TEST_CASE("IAPWS-IF97 round-trips (p, T) through h and s in every region, and wet states through quality") {
  const fluids::IapwsIf97 water;
  Tally tally;
  long near_saturation = 0;
  for (long i = 0; i < states_per_model(); ++i) {
    // Regions 1-3 up to 1073.15 K and 100 MPa; region 5 above, up to 50 MPa.
    const bool region5 = std::uniform_int_distribution<int>(0, 9)(rng()) == 0;
    const double T = region5 ? uniform(1073.15, 2273.15) : uniform(273.15, 1073.15);
    const double p = region5 ? log_uniform(1e3, 50e6) : log_uniform(1e3, 100e6);
    // (p, Tsat) does not fix a state: keep 1 mK away from the saturation line.
    if (const auto Tsat = water.saturation_temperature(p); Tsat && std::fabs(T - *Tsat) < 1e-3) {
      ++near_saturation;
      continue;
    }
    round_trip(water, p, T, tally);
  }
  report("iapws-if97", tally);

  Tally wet;
  for (long i = 0; i < states_per_model() / 4; ++i) {
    const double p = log_uniform(700.0, 21.5e6);
    const double x = uniform(0.0, 1.0);
    INFO("wet steam at p = " << p << " Pa, quality " << x);
    const State s = water.from_p_quality(p, x);
    REQUIRE(finite(s));
    const State by_h = water.from_ph(p, s.enthalpy);
    const State by_s = water.from_ps(p, s.entropy);
    REQUIRE(by_h.is_wet());
    REQUIRE(by_s.is_wet());
    CHECK(*by_h.quality == Approx(x).margin(1e-9));
    CHECK(*by_s.quality == Approx(x).margin(1e-9));
    CHECK(by_h.temperature == Approx(s.temperature).epsilon(1e-12));
    ++wet.states;
  }
  report("iapws-if97 wet", wet);
  CHECK(tally.states + near_saturation == states_per_model());
}

TEST_CASE("states outside a model's range are refused with a message, never a number") {
  const fluids::IapwsIf97 water;
  const auto& library = fluids::SpeciesLibrary::built_in();
  const fluids::NasaPolynomialGas n2({{library.find("N2"), 1.0}}, fluids::CompositionBasis::mole);
  long refused = 0;
  for (long i = 0; i < states_per_model(); ++i) {
    // Beyond either end of the temperature range, or at a non-positive or non-finite pressure.
    const int what = std::uniform_int_distribution<int>(0, 3)(rng());
    const double p = what == 2 ? -log_uniform(1e-3, 1e9) : what == 3 ? std::nan("") : log_uniform(1e3, 1e7);
    const double T = what == 0 ? uniform(1.0, 199.9) : what == 1 ? uniform(6000.1, 1e5) : 300.0;
    const double T_water = what == 0 ? uniform(1.0, 273.14) : what == 1 ? uniform(2273.16, 1e5) : 300.0;
    INFO("p = " << p << " Pa, T = " << T << " K (N2), " << T_water << " K (water)");
    CHECK_THROWS_AS(n2.from_pt(p, T), Error);
    CHECK_THROWS_AS(water.from_pt(p, T_water), Error);
    ++refused;
  }
  CHECK(refused == states_per_model());
}

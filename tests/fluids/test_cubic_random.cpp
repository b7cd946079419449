// Property-based state round trips of the cubic models over random gases and states.
//
// Random pure gases and mixtures of two to four species (from those of natural gas, refinery
// and CO2 service, plus air's), on Peng-Robinson or Soave-Redlich-Kwong; random (p, T) with
// p from 1 kPa to 300 bar and T over the model's range up to 1500 K. A state from (p, T) is
// either a one-phase state with finite numbers, whose h and s give T back through from_ph and
// from_ps (the model promises 1e-10 relative; allowed 1e-9), or refused with out_of_range
// naming the phase boundary. Never a wrong number, never another error.
//
// Count: SHAFTWORK_RANDOM_STATES states (default 2000), a new gas every 50.
// Seed: SHAFTWORK_RANDOM_SEED (default 20261202).
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
#include "shaftwork/fluids/cubic_eos.hpp"

using namespace shaftwork;
using fluids::State;

namespace {

long env_count(const char* name, long fallback) {
  const char* text = std::getenv(name);
  if (text == nullptr || *text == '\0') return fallback;
  return std::strtol(text, nullptr, 10);
}

std::mt19937_64& rng() {
  static std::mt19937_64 engine(static_cast<std::uint64_t>(env_count("SHAFTWORK_RANDOM_SEED", 20261202)));
  return engine;
}
double uniform(double low, double high) { return std::uniform_real_distribution<double>(low, high)(rng()); }
double log_uniform(double low, double high) { return std::exp(uniform(std::log(low), std::log(high))); }

std::unique_ptr<fluids::CubicGas> random_gas() {
  static const char* names[] = {"CH4", "C2H6", "C3H8", "n-C4H10", "i-C4H10", "n-C5H12", "n-C6H14", "N2",
                                "CO2", "H2S", "H2",   "O2",   "Ar",      "CO"};
  const int count = static_cast<int>(sizeof names / sizeof names[0]);
  const auto n = static_cast<std::size_t>(std::uniform_int_distribution<int>(1, 4)(rng()));
  std::vector<fluids::Component> components;
  while (components.size() < n) {
    const auto* sp = fluids::SpeciesLibrary::built_in().find(names[std::uniform_int_distribution<int>(0, count - 1)(rng())]);
    const bool taken = std::any_of(components.begin(), components.end(), [&](const auto& c) { return c.species == sp; });
    if (!taken) components.push_back({sp, 0.0});
  }
  double sum = 0;
  for (auto& c : components) sum += (c.fraction = uniform(0.02, 1.0));
  for (auto& c : components) c.fraction /= sum;
  const auto kind = uniform(0, 1) < 0.5 ? fluids::CubicKind::peng_robinson : fluids::CubicKind::soave_redlich_kwong;
  return std::make_unique<fluids::CubicGas>(kind, components, fluids::CompositionBasis::mole);
}

bool finite(const State& s) {
  return std::isfinite(s.enthalpy) && std::isfinite(s.entropy) && std::isfinite(s.density) && s.density > 0 &&
         std::isfinite(s.cp) && s.cp > 0 && std::isfinite(s.cv) && s.cv > 0 && s.compressibility > 0;
}

bool names_a_boundary(const std::string& message) {
  return message.find("dew point") != std::string::npos || message.find("is a liquid") != std::string::npos;
}

}  // namespace

TEST_CASE("cubic gases round-trip (p, T) through h and s, or refuse naming the phase boundary") {
  const long states = env_count("SHAFTWORK_RANDOM_STATES", 2000);
  long round_trips = 0;
  long refusals = 0;
  double worst = 0;
  std::unique_ptr<fluids::CubicGas> gas;
  for (long i = 0; i < states; ++i) {
    if (i % 50 == 0) gas = random_gas();
    const auto range = gas->temperature_range();
    const double p = log_uniform(1e3, 3e7);
    const double T = log_uniform(range.low, std::min(range.high, 1500.0));
    INFO(gas->model_name() << " " << gas->description() << " at p = " << p << " Pa, T = " << T << " K");
    State st;
    try {
      st = gas->from_pt(p, T);
    } catch (const Error& e) {
      INFO(e.what());
      CHECK(e.kind() == ErrorKind::out_of_range);
      CHECK(names_a_boundary(e.what()));
      ++refusals;
      continue;
    }
    REQUIRE(finite(st));
    const State by_h = gas->from_ph(p, st.enthalpy);
    const State by_s = gas->from_ps(p, st.entropy);
    REQUIRE(finite(by_h));
    REQUIRE(finite(by_s));
    const double dh = std::fabs(by_h.temperature - T) / T;
    const double ds = std::fabs(by_s.temperature - T) / T;
    CHECK(dh <= 1e-9);
    CHECK(ds <= 1e-9);
    worst = std::max({worst, dh, ds});
    ++round_trips;
  }
  std::cout << "test_cubic_random: " << round_trips << " states round-tripped (worst relative T difference "
            << worst << "), " << refusals << " refused at a phase boundary\n";
  CHECK(round_trips > states / 2);
}

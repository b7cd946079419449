// The pair sweep shared by the seeded sweeps of machines::rate over a model's whole range
// (test_rating_if97_sweep.cpp, test_rating_cubic_sweep.cpp): a point rated forward from p1,
// T1, p2, the efficiency and the flow, then each of the 21 pairs of the seven quantities
// dropped in turn. The 18 solvable pairs must come back to the point (every quantity within
// kTolerance), or to another solution of the same knowns that the solver announces in a
// warning; the 3 others must be refused. A sweep's own rule may excuse a refusal (a sought
// value exactly on the edge of the model's range); any other refusal of a solvable pair
// fails. The rated polytropic efficiency is checked against the independent integration of
// its path (machines/polytropic_reference.hpp).
#pragma once

#include <algorithm>
#include <array>
#include <cmath>
#include <cstdint>
#include <cstdlib>
#include <functional>
#include <iostream>
#include <map>
#include <optional>
#include <random>
#include <memory>
#include <sstream>
#include <string>
#include <tuple>

#include <catch2/catch.hpp>

#include "machines/known_pairs.hpp"
#include "machines/polytropic_reference.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/machines/rating.hpp"

namespace shaftwork::test {

inline constexpr double kSweepTolerance = 1e-7;  // relative, on each of the seven quantities

inline long env_count(const char* name, long fallback) {
  const char* text = std::getenv(name);
  return text == nullptr || *text == '\0' ? fallback : std::strtol(text, nullptr, 10);
}

struct SweepPoint {
  std::string kind;  // what sort of machine, for the messages and the tally
  std::shared_ptr<const fluids::FluidModel> fluid;
  machines::MachineKind machine = machines::MachineKind::compressor;
  machines::EfficiencyBasis basis = machines::EfficiencyBasis::isentropic;
  double p1 = 0, T1 = 0, p2 = 0, eta = 0, m = 0, eta_m = 1;
  // from the forward rating
  double T2 = 0, h2 = 0, P = 0;
  bool by_enthalpy = false;  // the outlet is given by its enthalpy, not its temperature
  machines::Rating forward;

  machines::RatingInput base() const {
    machines::RatingInput in;
    in.machine = machine;
    in.fluid = fluid;
    in.mechanical_efficiency = eta_m;
    return in;
  }
  // Rated forward; false when the model refuses the draw (outside its range or its phase).
  bool rate_forward() {
    machines::RatingInput in = base();
    in.inlet_pressure = p1;
    in.inlet_temperature = T1;
    in.outlet_pressure = p2;
    machines::set_efficiency(in, basis, eta);
    in.mass_flow = m;
    try {
      forward = machines::rate(in);
    } catch (const Error&) {
      return false;
    }
    T2 = forward.outlet.temperature;
    h2 = forward.outlet.enthalpy;
    P = forward.power.value();
    return true;
  }
};

// The draws of a sweep's generator, from a seeded engine.
class SeededDraws {
 protected:
  explicit SeededDraws(std::uint64_t seed) : rng_(seed) {}
  double uniform(double low, double high) { return std::uniform_real_distribution<double>(low, high)(rng_); }
  double log_uniform(double low, double high) { return std::exp(uniform(std::log(low), std::log(high))); }
  int pick(int n) { return std::uniform_int_distribution<int>(0, n - 1)(rng_); }

 private:
  std::mt19937_64 rng_;
};

struct SweepTally {
  long points = 0, skipped = 0, round_trips = 0, other_solutions = 0, unsolvable_refused = 0, references = 0;
  long refused = 0, refused_at_edge = 0;
  double worst = 0, worst_reference = 0;
  std::map<std::string, long> by_kind;
};

// True when a refusal of the pair (a, b) at this point is excused (a sought value on the edge
// of the model's range).
using EdgeRule = std::function<bool(const SweepPoint&, machines::Quantity, machines::Quantity)>;

namespace sweep_detail {

inline const std::array<machines::Quantity, 7> kAll = {
    machines::Quantity::inlet_pressure,     machines::Quantity::inlet_temperature, machines::Quantity::outlet_pressure,
    machines::Quantity::outlet_temperature, machines::Quantity::flow,              machines::Quantity::power,
    machines::Quantity::efficiency};

inline double relative(double x, double reference) { return std::fabs(x - reference) / std::fabs(reference); }

// The largest relative difference between a rating and the point over the seven quantities
// (an outlet given by enthalpy relative to the enthalpy change).
inline double distance(const machines::Rating& r, const SweepPoint& pt) {
  const bool isentropic = pt.basis == machines::EfficiencyBasis::isentropic;
  const double eta = isentropic ? r.efficiency_isentropic : r.efficiency_polytropic;
  const double outlet = pt.by_enthalpy ? std::fabs(r.outlet.enthalpy - pt.h2) / std::fabs(pt.h2 - r.inlet.enthalpy)
                                      : relative(r.outlet.temperature, pt.T2);
  // Unsized (flow and power both sought): the four knowns fix the specific work only.
  const double flow = r.mass_flow ? relative(*r.mass_flow, pt.m) : 0.0;
  const double power = r.power ? relative(*r.power, pt.P) : 0.0;
  return std::max({relative(r.inlet.pressure, pt.p1), relative(r.inlet.temperature, pt.T1),
                   relative(r.outlet.pressure, pt.p2), outlet, flow, power, relative(eta, pt.eta)});
}

// Rated forward from its own inlet, pressures, efficiency and flow, a solved set must give its
// own outlet and power back: then it is a solution of the knowns, if not the point.
inline bool is_a_solution(const machines::Rating& r, const SweepPoint& pt) {
  machines::RatingInput forward = pt.base();
  forward.inlet_pressure = r.inlet.pressure;
  forward.inlet_temperature = r.inlet.temperature;
  forward.outlet_pressure = r.outlet.pressure;
  const bool isentropic = pt.basis == machines::EfficiencyBasis::isentropic;
  machines::set_efficiency(forward, pt.basis, isentropic ? r.efficiency_isentropic : r.efficiency_polytropic);
  forward.mass_flow = r.mass_flow;
  try {
    const auto again = machines::rate(forward);
    return std::fabs(again.outlet.enthalpy - r.outlet.enthalpy) <=
               1e-6 * std::fabs(r.outlet.enthalpy - r.inlet.enthalpy) &&
           relative(again.power.value(), r.power.value()) <= 1e-6;
  } catch (const Error&) {
    return false;
  }
}

}  // namespace sweep_detail

inline std::string describe(const SweepPoint& pt, const std::string& pattern) {
  std::ostringstream text;
  text.precision(17);
  text << pt.kind << " (" << (pt.basis == machines::EfficiencyBasis::isentropic ? "isentropic" : "polytropic")
       << "), solving for " << pattern << ": p1 " << pt.p1 << " Pa, T1 " << pt.T1 << " K, p2 " << pt.p2 << " Pa, T2 "
       << pt.T2 << " K, h2 " << pt.h2 << " J/kg, m " << pt.m << " kg/s, P " << pt.P << " W, eta " << pt.eta
       << ", eta_m " << pt.eta_m;
  return text.str();
}

// The 21 pairs of one point.
inline void sweep_pairs(const SweepPoint& pt, const EdgeRule& at_edge, SweepTally& tally) {
  using sweep_detail::kAll;
  const SevenValues v{pt.p1, pt.T1, pt.p2, pt.T2, pt.h2, pt.m, pt.P, pt.eta, pt.by_enthalpy, pt.basis};
  for (std::size_t i = 0; i < kAll.size(); ++i) {
    for (std::size_t j = i + 1; j < kAll.size(); ++j) {
      const std::string pattern =
          std::string(machines::quantity_key(kAll[i])) + " and " + std::string(machines::quantity_key(kAll[j]));
      INFO(describe(pt, pattern));
      const machines::RatingInput in = without_pair(pt.base(), v, kAll[i], kAll[j]);
      if (pressure_pair(kAll[i], kAll[j])) {
        CHECK_THROWS_AS(machines::rate(in), Error);
        ++tally.unsolvable_refused;
        continue;
      }
      machines::Rating r;
      try {
        r = machines::rate(in);
      } catch (const Error& e) {
        if (at_edge && at_edge(pt, kAll[i], kAll[j])) {
          ++tally.refused_at_edge;
        } else if (++tally.refused <= 200) {
          std::cout << "  REFUSED " << describe(pt, pattern) << ": " << e.what() << "\n";
        }
        continue;
      }
      if (!in.mass_flow && !in.power) {
        // Without flow and power the rating is unsized: neither may be made up.
        CHECK_FALSE(r.mass_flow.has_value());
        CHECK_FALSE(r.power.has_value());
      }
      const double d = sweep_detail::distance(r, pt);
      if (d <= kSweepTolerance) {
        tally.worst = std::max(tally.worst, d);
        ++tally.round_trips;
        continue;
      }
      // Another solution of the same knowns: it must be one, and must have been announced.
      REQUIRE(sweep_detail::is_a_solution(r, pt));
      bool announced = false;
      for (const auto& w : r.warnings) announced = announced || w.find("has a second solution near") != std::string::npos;
      CHECK(announced);
      ++tally.other_solutions;
    }
  }
}

// The rated polytropic efficiency against the reference integration of the rated path: the
// reference outlet at the rated eta_p must meet the rated outlet within 1e-8 of the enthalpy
// change.
inline void check_reference(const SweepPoint& pt, SweepTally& tally) {
  const machines::Rating& r = pt.forward;
  const bool compression = pt.machine != machines::MachineKind::turbine;
  const double f = compression ? 1.0 / r.efficiency_polytropic : r.efficiency_polytropic;
  const double rise = std::fabs(r.outlet.enthalpy - r.inlet.enthalpy);
  const ReferencePath reference(*pt.fluid, r.inlet, pt.p2, f);
  auto [h_ref, ref_error] = reference.outlet_enthalpy(300);
  if (ref_error > 1e-10 * rise) std::tie(h_ref, ref_error) = reference.outlet_enthalpy(2400);  // near region 3
  INFO(describe(pt, "nothing (reference integration)"));
  REQUIRE(ref_error <= 1e-10 * rise);
  const double off = std::fabs(h_ref - r.outlet.enthalpy) / rise;
  tally.worst_reference = std::max(tally.worst_reference, off);
  CHECK(off <= 1e-8);
  ++tally.references;
}

// The tally printed, then the sweep's verdict: no solvable pair refused but by the edge rule.
inline void report_sweep(const std::string& title, const SweepTally& tally, std::uint64_t seed) {
  std::cout << title << ": " << tally.points << " points (seed " << seed << "; " << tally.skipped
            << " draws the model refused redrawn), " << tally.round_trips
            << " solves back to the point (worst relative difference " << tally.worst << "), "
            << tally.other_solutions << " other solutions announced, " << tally.unsolvable_refused
            << " unsolvable pairs refused; polytropic efficiency against the reference on " << tally.references
            << " points, worst " << tally.worst_reference << " of the enthalpy change\n";
  for (const auto& [kind, n] : tally.by_kind) std::cout << "  " << kind << ": " << n << " points\n";
  std::cout << "  solvable pairs refused: " << tally.refused << " (and " << tally.refused_at_edge
            << " with a sought value exactly on the edge of the model's range)\n";
  CHECK(tally.refused == 0);
  CHECK(tally.round_trips + tally.other_solutions + tally.refused_at_edge == 18 * tally.points);
}

// The sweep: `count` points drawn in turn from `kinds` kinds (next(kind) gives a point rated
// forward, or none when the model refused the draw: redrawn up to 50 times), each checked
// against the reference and swept through its pairs, then the tally reported.
template <class Next>
void run_sweep(const std::string& title, long count, std::uint64_t seed, std::size_t kinds, Next next,
               const EdgeRule& at_edge) {
  SweepTally tally;
  for (long n = 0; n < count; ++n) {
    const std::size_t kind = static_cast<std::size_t>(n) % kinds;
    std::optional<SweepPoint> pt;
    for (int attempt = 0; attempt < 50 && !pt; ++attempt) {
      pt = next(kind);
      if (!pt) ++tally.skipped;
    }
    REQUIRE(pt.has_value());  // each kind's draws lie mostly inside the model's range
    ++tally.points;
    ++tally.by_kind[pt->kind];
    check_reference(*pt, tally);
    sweep_pairs(*pt, at_edge, tally);
  }
  report_sweep(title, tally, seed);
}

}  // namespace shaftwork::test

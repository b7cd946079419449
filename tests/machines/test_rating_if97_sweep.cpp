// A deterministic sweep of IAPWS-IF97 machines through every solve pattern of machines::rate.
//
// Points are drawn (fixed seed) in turn from eight kinds of machine, each over its part of
// IF97: steam compressors, mechanical vapour recompression (MVR), turbines with superheated
// and with wet exhausts, turbines near region 3, turbines in region 5, water pumps, and the
// range ends (273.15 K, 100 MPa, 2273.15 K at 50 MPa, 1073.15 K at 100 MPa). A point is rated
// forward from p1, T1, p2, the efficiency (isentropic or polytropic, alternating) and the
// flow, and swept through every pair of unknowns by machines/pair_sweep.hpp: the 18 solvable
// pairs come back to the point within 1e-7 (flow and power together leave an unsized rating:
// neither may be made up), or to another solution of the same knowns that the solver
// announces (the isentropic work of a steam turbine at fixed inlet temperature can pass
// through a maximum in inlet pressure); the 3 others are refused. No refusal of a solvable
// pair is accepted but with a sought value exactly on the edge of IF97's range. On every
// point eta_p is checked against an independent integration of its path (within 1e-8 of
// the enthalpy change).
//
// Counts: SHAFTWORK_IF97_SWEEP points (default 160, 20 of each kind: every pattern in every
// kind, in CI); SHAFTWORK_IF97_SWEEP=10000 once by hand (DEVELOPERS.md). Seed:
// SHAFTWORK_RANDOM_SEED (default 20261209). Last long run, by hand (2026-12-02):
// SHAFTWORK_IF97_SWEEP=2000 SHAFTWORK_RANDOM_SEED=7, 0 of 36,000 solvable pairs refused,
// worst round trip 2.2e-8, eta_p against the reference within 2.2e-9 of the enthalpy change
// (a 2,000-point run at seed 13, after the path fix of 5a1cb13, was stopped unfinished after
// 72 minutes of CPU, so a 10,000-point run takes many hours).
#include <array>
#include <cmath>
#include <cstdint>
#include <memory>
#include <optional>

#include <catch2/catch.hpp>

#include "machines/pair_sweep.hpp"
#include "shaftwork/fluids/iapws_if97.hpp"
#include "shaftwork/machines/rating.hpp"

using namespace shaftwork;
using machines::EfficiencyBasis;
using machines::MachineKind;
using machines::Quantity;
using test::SweepPoint;

namespace {

const auto kWater = std::make_shared<const fluids::IapwsIf97>();

enum class Kind { compressor, mvr, turbine_dry, turbine_wet, region3, region5, pump, range_end };
constexpr std::array<const char*, 8> kKindNames = {"steam compressor",      "MVR compressor",
                                                   "turbine, dry exhaust",  "turbine, wet exhaust",
                                                   "turbine near region 3", "turbine in region 5",
                                                   "water pump",            "range end"};

double tsat(double p) { return *kWater->saturation_temperature(std::min(p, 22e6)); }

class Generator : test::SeededDraws {
 public:
  explicit Generator(std::uint64_t seed) : SeededDraws(seed) {}

  // The next point of `kind`, rated forward; empty when IF97's range refuses the draw.
  std::optional<SweepPoint> next(Kind kind) {
    SweepPoint pt;
    pt.kind = kKindNames[static_cast<std::size_t>(kind)];
    pt.fluid = kWater;
    draw(pt, kind);
    pt.basis = pick(2) == 0 ? EfficiencyBasis::isentropic : EfficiencyBasis::polytropic;
    pt.m = log_uniform(0.1, 500);
    pt.eta_m = pick(3) == 0 ? 1.0 : uniform(0.9, 1.0);
    if (!pt.rate_forward()) return std::nullopt;
    // rate() refuses an outlet temperature within 0.5 K of saturation, and a turbine's below
    // it (docs/method.md, "Wet steam": a temperature does not fix a wet state); such an outlet,
    // like a wet one, is given by its enthalpy.
    const auto Ts = kWater->saturation_temperature(pt.p2);
    pt.by_enthalpy = pt.forward.outlet.is_wet() ||
                     (Ts && (std::fabs(pt.T2 - *Ts) <= 0.5 || (pt.machine == MachineKind::turbine && pt.T2 < *Ts)));
    return pt;
  }

 private:
  void draw(SweepPoint& pt, Kind kind) {
    switch (kind) {
      case Kind::compressor:
        pt.machine = MachineKind::compressor;
        pt.p1 = log_uniform(5e3, 2e6);
        pt.T1 = uniform(tsat(pt.p1) + 5, 800);
        pt.p2 = pt.p1 * log_uniform(1.01, 4);
        pt.eta = uniform(0.5, 0.95);
        return;
      case Kind::mvr:
        pt.machine = MachineKind::compressor;
        pt.p1 = uniform(1e5, 5e5);
        pt.T1 = tsat(pt.p1) + uniform(2, 15);
        pt.p2 = pt.p1 * uniform(2.5, 4);
        pt.eta = uniform(0.65, 0.85);
        return;
      case Kind::turbine_dry:
        pt.machine = MachineKind::turbine;
        pt.p1 = log_uniform(2e5, 2e7);
        pt.T1 = uniform(std::max(tsat(pt.p1) + 80, 700.0), 1070);
        pt.p2 = pt.p1 / log_uniform(1.01, 5);
        pt.eta = uniform(0.6, 0.95);
        return;
      case Kind::turbine_wet:
        pt.machine = MachineKind::turbine;
        pt.p1 = log_uniform(1e6, 1.6e7);
        pt.T1 = uniform(tsat(pt.p1) + 20, 850);
        pt.p2 = log_uniform(4e3, 5e4);
        pt.eta = uniform(0.7, 0.92);
        return;
      case Kind::region3:
        pt.machine = MachineKind::turbine;
        pt.p1 = uniform(17e6, 60e6);
        pt.T1 = uniform(std::max(pt.p1 < 22e6 ? tsat(pt.p1) + 1 : 0.0, 630.0), 870);
        pt.p2 = pt.p1 / uniform(1.2, 8);
        pt.eta = uniform(0.6, 0.95);
        return;
      case Kind::region5:
        pt.machine = MachineKind::turbine;
        pt.p1 = log_uniform(2e5, 5e7);
        pt.T1 = uniform(1100, 2200);
        pt.p2 = pt.p1 / log_uniform(1.05, 10);
        pt.eta = uniform(0.6, 0.95);
        return;
      case Kind::pump:
        pt.machine = MachineKind::pump;
        pt.T1 = uniform(275, 560);
        pt.p1 = fluids::IapwsIf97::saturation_pressure(pt.T1) * uniform(1.2, 5) + 2e4;
        pt.p2 = pick(5) == 0 ? 100e6 : pt.p1 * log_uniform(1.5, std::max(1.6, 1e8 / pt.p1));
        pt.eta = uniform(0.4, 0.9);
        return;
      case Kind::range_end:
        draw_range_end(pt);
        return;
    }
  }

  // The ends of IF97's range, inclusive (IF97 Sec. 2).
  void draw_range_end(SweepPoint& pt) {
    pt.eta = uniform(0.6, 0.9);
    switch (pick(4)) {
      case 0:  // a pump from 273.15 K to exactly 100 MPa
        pt.machine = MachineKind::pump;
        pt.p1 = uniform(1e5, 1e6);
        pt.T1 = 273.15 + uniform(0, 1) * uniform(0, 1);
        pt.p2 = 100e6;
        return;
      case 1:  // a compressor to exactly 100 MPa
        pt.machine = MachineKind::compressor;
        pt.p1 = uniform(40e6, 70e6);
        pt.T1 = uniform(640, 700);
        pt.p2 = 100e6;
        return;
      case 2:  // a turbine from 2273.15 K at 50 MPa
        pt.machine = MachineKind::turbine;
        pt.p1 = 50e6;
        pt.T1 = 2273.15;
        pt.p2 = pt.p1 / uniform(1.1, 10);
        return;
      default:  // a turbine from 1073.15 K at 100 MPa
        pt.machine = MachineKind::turbine;
        pt.p1 = 100e6;
        pt.T1 = 1073.15;
        pt.p2 = pt.p1 / uniform(1.1, 10);
        return;
    }
  }

};

// A solvable pair refused is excused only where a sought value lies exactly on the edge of
// IF97's range (T1 = 2273.15 K, or 1073.15 K above 50 MPa; p1 = 50 MPa at 2273.15 K, p1 or
// p2 = 100 MPa): the solver's scan (src/machines/search.cpp) looks for a change of sign
// inside the range and cannot see a root on its end.
bool on_if97_edge(const SweepPoint& pt, Quantity a, Quantity b) {
  auto sought = [&](Quantity q) { return a == q || b == q; };
  return (sought(Quantity::outlet_pressure) && pt.p2 == 100e6) ||
         (sought(Quantity::inlet_pressure) && (pt.p1 == 100e6 || (pt.p1 == 50e6 && pt.T1 > 1073.15))) ||
         (sought(Quantity::inlet_temperature) && (pt.T1 == 2273.15 || (pt.T1 == 1073.15 && pt.p1 > 50e6)));
}

}  // namespace

TEST_CASE("IF97 sweep: every solvable pattern on every kind of steam and water machine rates", "[if97][sweep]") {
  const long count = test::env_count("SHAFTWORK_IF97_SWEEP", 160);
  const auto seed = static_cast<std::uint64_t>(test::env_count("SHAFTWORK_RANDOM_SEED", 20261209));
  Generator random(seed);
  test::run_sweep("IF97 sweep", count, seed, kKindNames.size(),
                  [&](std::size_t kind) { return random.next(static_cast<Kind>(kind)); }, on_if97_edge);
}

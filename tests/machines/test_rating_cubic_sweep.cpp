// A deterministic sweep of real-gas machines on the cubic models through every solve pattern
// of machines::rate (machines/pair_sweep.hpp: the 18 solvable pairs of the seven quantities
// back to the point within 1e-7, or to an announced second solution; the 3 others refused;
// eta_p against an independent integration of its path within 1e-8 of the enthalpy change).
//
// Points are drawn (fixed seed) in turn from six kinds of machine, each over the gas-phase
// part of its model where such a machine runs: natural-gas boosters on Peng-Robinson and on
// Soave-Redlich-Kwong, CO2 compressor stages (Peng-Robinson, from 1.5 bar to above the
// critical pressure), a hydrogen-rich recycle compressor, a natural-gas expander, and a
// propane refrigerant compressor from a few kelvin above its dew point (SRK). The inlet is
// drawn above the model's own dew temperature; a draw whose outlet or isentropic outlet
// would condense is refused by the model and redrawn (tests/fluids/test_cubic_eos.cpp checks
// those refusals). The compositions are invented.
//
// Counts: SHAFTWORK_CUBIC_SWEEP points (default 60, 10 of each kind, in CI); seed
// SHAFTWORK_RANDOM_SEED (default 20261202). Last long run, by hand (2026-12-02):
// SHAFTWORK_CUBIC_SWEEP=600 SHAFTWORK_RANDOM_SEED=7, 0 of 10,800 solvable pairs refused,
// worst round trip 2.4e-9, eta_p against the reference within 2.5e-9 of the enthalpy change
// (10 draws refused by the model as two-phase and redrawn; about 75 s of CPU).
#include <array>
#include <cmath>
#include <cstdint>
#include <memory>
#include <optional>
#include <vector>

#include <catch2/catch.hpp>

#include "machines/pair_sweep.hpp"
#include "shaftwork/fluids/cubic_eos.hpp"
#include "shaftwork/machines/rating.hpp"

using namespace shaftwork;
using fluids::CubicGas;
using fluids::CubicKind;
using machines::EfficiencyBasis;
using machines::MachineKind;
using test::SweepPoint;

namespace {

std::shared_ptr<const CubicGas> gas(CubicKind kind, const std::vector<std::pair<const char*, double>>& mole_fractions) {
  std::vector<fluids::Component> components;
  for (const auto& [name, x] : mole_fractions) components.push_back({fluids::SpeciesLibrary::built_in().find(name), x});
  return std::make_shared<const CubicGas>(kind, components, fluids::CompositionBasis::mole);
}

const std::vector<std::pair<const char*, double>> kPipelineGas = {
    {"CH4", 0.912},     {"C2H6", 0.045},    {"C3H8", 0.012},    {"n-C4H10", 0.003}, {"i-C4H10", 0.0025},
    {"n-C5H12", 0.0008}, {"i-C5H12", 0.0007}, {"n-C6H14", 0.0005}, {"N2", 0.015},     {"CO2", 0.0085}};

enum class Kind { booster_pr, booster_srk, co2, recycle, expander, propane };
constexpr std::array<const char*, 6> kKindNames = {
    "natural-gas booster (PR)", "natural-gas booster (SRK)",  "CO2 stage (PR)",
    "hydrogen recycle (PR)",    "natural-gas expander (PR)", "propane refrigerant (SRK)"};

std::shared_ptr<const CubicGas> model_of(Kind kind) {
  static const auto booster_pr = gas(CubicKind::peng_robinson, kPipelineGas);
  static const auto booster_srk = gas(CubicKind::soave_redlich_kwong, kPipelineGas);
  static const auto co2 = gas(CubicKind::peng_robinson, {{"CO2", 1.0}});
  static const auto recycle =
      gas(CubicKind::peng_robinson, {{"H2", 0.80}, {"CH4", 0.12}, {"C2H6", 0.05}, {"C3H8", 0.03}});
  static const auto propane = gas(CubicKind::soave_redlich_kwong, {{"C3H8", 1.0}});
  switch (kind) {
    case Kind::booster_pr:
    case Kind::expander:
      return booster_pr;
    case Kind::booster_srk:
      return booster_srk;
    case Kind::co2:
      return co2;
    case Kind::recycle:
      return recycle;
    case Kind::propane:
      return propane;
  }
  return booster_pr;
}

class Generator : test::SeededDraws {
 public:
  explicit Generator(std::uint64_t seed) : SeededDraws(seed) {}

  // The next point of `kind`, rated forward; empty when the model refuses the draw.
  std::optional<SweepPoint> next(Kind kind) {
    SweepPoint pt;
    pt.kind = kKindNames[static_cast<std::size_t>(kind)];
    const auto model = model_of(kind);
    pt.fluid = model;
    draw(pt, kind);
    // Above the model's own dew temperature at the inlet (with a margin of the draw).
    if (const auto dew = model->dew_temperature(pt.p1); dew && pt.T1 <= *dew + 2) return std::nullopt;
    pt.basis = pick(2) == 0 ? EfficiencyBasis::isentropic : EfficiencyBasis::polytropic;
    pt.m = log_uniform(0.5, 200);
    pt.eta_m = pick(3) == 0 ? 1.0 : uniform(0.95, 1.0);
    if (!pt.rate_forward()) return std::nullopt;
    return pt;
  }

 private:
  // Where each kind runs: inlet pressure (drawn on a log scale), inlet temperature, pressure
  // ratio (p2/p1 of a compressor, p1/p2 of an expander), efficiency.
  struct Ranges {
    MachineKind machine;
    double p1[2], T1[2], ratio[2], eta[2];
  };
  static constexpr Ranges kRanges[] = {
      {MachineKind::compressor, {20e5, 70e5}, {275, 320}, {1.1, 2.5}, {0.6, 0.9}},    // booster (PR)
      {MachineKind::compressor, {20e5, 70e5}, {275, 320}, {1.1, 2.5}, {0.6, 0.9}},    // booster (SRK)
      {MachineKind::compressor, {1.5e5, 60e5}, {300, 330}, {1.3, 3.5}, {0.6, 0.9}},   // CO2 stage
      {MachineKind::compressor, {20e5, 150e5}, {300, 350}, {1.05, 1.5}, {0.6, 0.9}},  // hydrogen recycle
      {MachineKind::turbine, {50e5, 80e5}, {320, 400}, {1.5, 4}, {0.75, 0.9}},        // expander
      {MachineKind::compressor, {2e5, 5e5}, {265, 300}, {2, 4}, {0.6, 0.9}},          // propane
  };

  void draw(SweepPoint& pt, Kind kind) {
    const Ranges& r = kRanges[static_cast<std::size_t>(kind)];
    pt.machine = r.machine;
    pt.p1 = log_uniform(r.p1[0], r.p1[1]);
    pt.T1 = uniform(r.T1[0], r.T1[1]);
    const double ratio = uniform(r.ratio[0], r.ratio[1]);
    pt.p2 = r.machine == MachineKind::turbine ? pt.p1 / ratio : pt.p1 * ratio;
    pt.eta = uniform(r.eta[0], r.eta[1]);
  }
};

}  // namespace

TEST_CASE("cubic sweep: every solvable pattern on real-gas compressors and expanders rates", "[cubic][sweep]") {
  const long count = test::env_count("SHAFTWORK_CUBIC_SWEEP", 60);
  const auto seed = static_cast<std::uint64_t>(test::env_count("SHAFTWORK_RANDOM_SEED", 20261202));
  Generator random(seed);
  test::run_sweep("cubic sweep", count, seed, kKindNames.size(),
                  [&](std::size_t kind) { return random.next(static_cast<Kind>(kind)); }, nullptr);
}

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
// worst round trip 6.0e-9, eta_p against the reference within 3.0e-9 of the enthalpy change
// (17 draws refused by the model as two-phase and redrawn; about 75 s of CPU).
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
  void draw(SweepPoint& pt, Kind kind) {
    pt.machine = MachineKind::compressor;
    pt.eta = uniform(0.6, 0.9);
    switch (kind) {
      case Kind::booster_pr:
      case Kind::booster_srk:
        pt.p1 = uniform(20e5, 70e5);
        pt.T1 = uniform(275, 320);
        pt.p2 = pt.p1 * uniform(1.1, 2.5);
        return;
      case Kind::co2:
        pt.p1 = log_uniform(1.5e5, 60e5);
        pt.T1 = uniform(300, 330);
        pt.p2 = pt.p1 * uniform(1.3, 3.5);
        return;
      case Kind::recycle:
        pt.p1 = uniform(20e5, 150e5);
        pt.T1 = uniform(300, 350);
        pt.p2 = pt.p1 * uniform(1.05, 1.5);
        return;
      case Kind::expander:
        pt.machine = MachineKind::turbine;
        pt.p1 = uniform(50e5, 80e5);
        pt.T1 = uniform(320, 400);
        pt.p2 = pt.p1 / uniform(1.5, 4);
        pt.eta = uniform(0.75, 0.9);
        return;
      case Kind::propane:
        pt.p1 = uniform(2e5, 5e5);
        pt.T1 = uniform(265, 300);
        pt.p2 = pt.p1 * uniform(2, 4);
        return;
    }
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

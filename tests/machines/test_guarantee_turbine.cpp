// Turbine guarantees (machines/guarantee.hpp) on a perfect gas: the efficiency carried to
// the guarantee's inlet and exhaust, the flow by the choked-nozzle law, against closed
// forms written here; and the refusals. Steam: tests/python/test_guarantee_steam.py.
#include <cmath>
#include <memory>
#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "error_of.hpp"
#include "shaftwork/fluids/constant_cp.hpp"
#include "shaftwork/machines/guarantee.hpp"

using namespace shaftwork;
using machines::Checked;
using machines::Guarantee;
using machines::TestPoint;

namespace {

constexpr double kCp = 1100.0, kK = 1.33;
const double kR = kCp * (kK - 1) / kK;

std::shared_ptr<const fluids::FluidModel> gas(double cp, double k) {
  fluids::ConstantCpInputs in;
  in.cp = cp;
  in.k = k;
  return std::make_shared<fluids::ConstantCpGas>(in);
}
const std::shared_ptr<const fluids::FluidModel> kGas = gas(kCp, kK);

TestPoint expander(std::string id, double p1, double T1, double p2, double eta_s, double m) {
  TestPoint p;
  p.id = std::move(id);
  p.input.machine = machines::MachineKind::turbine;
  p.input.fluid = kGas;
  p.input.inlet_pressure = p1;
  p.input.inlet_temperature = T1;
  p.input.outlet_pressure = p2;
  p.input.efficiency_isentropic = eta_s;
  p.input.mass_flow = m;
  p.input.mechanical_efficiency = 0.98;
  p.rating = machines::rate(p.input);
  return p;
}

double value(const machines::GuaranteeResult& r, const std::string& key) {
  for (const machines::NamedValue& v : r.converted) {
    if (v.key == key) return v.value;
  }
  FAIL("no converted " << key);
  return 0;
}

}  // namespace

TEST_CASE("turbine: the efficiency carried to the guarantee, the flow by the choked-nozzle law") {
  const TestPoint t = expander("E1", 8e5, 820.0, 1.5e5, 0.86, 4.0);
  Guarantee g;
  g.inlet_pressure = 9e5;
  g.inlet_temperature = 850.0;
  g.value(Checked::outlet_pressure) = 1.4e5;
  g.value(Checked::power) = 1.3e6;
  const machines::GuaranteeResult r = machines::judge(g, std::span(&t, 1));
  // Same gas: sqrt(p rho) = p / sqrt(R T), so m_c = m_t (p_g / p_t) sqrt(T_t / T_g).
  const double m_c = 4.0 * (9e5 / 8e5) * std::sqrt(820.0 / 850.0);
  CHECK(value(r, "mass_flow") == Approx(m_c).epsilon(1e-14));
  // Perfect gas: T2s = T1 (p2/p1)^((k-1)/k), T2 = T1 - eta (T1 - T2s), P = eta_m m cp (T1 - T2).
  const double T2s = 850.0 * std::pow(1.4e5 / 9e5, (kK - 1) / kK);
  const double T2 = 850.0 - 0.86 * (850.0 - T2s);
  CHECK(value(r, "outlet.temperature") == Approx(T2).epsilon(1e-12));
  CHECK(value(r, "power") == Approx(0.98 * m_c * kCp * (850.0 - T2)).epsilon(1e-12));
  CHECK(r.checks.size() == 1);
  CHECK(*r.checks[0].deviation_percent == Approx(100 * (0.98 * m_c * kCp * (850.0 - T2) - 1.3e6) / 1.3e6).epsilon(1e-10));
  // No tolerance: a turbine's power no less than guaranteed.
  CHECK(r.checks[0].tolerance == machines::Tolerance{0.0, std::nullopt});
  (void)kR;
}

TEST_CASE("turbine refusals: several points need the flow; another gas needs the flow; a flow tolerance needs a flow") {
  const std::vector<TestPoint> two = {expander("E1", 8e5, 820.0, 1.5e5, 0.86, 4.0), expander("E2", 8e5, 820.0, 1.5e5, 0.85, 3.6)};
  Guarantee g;
  g.value(Checked::power) = 1.3e6;
  CHECK(std::string(test::error_of([&] { machines::judge(g, two); }).what()) ==
        "no flow: several test points make a curve of efficiency against flow, read at the guaranteed flow; give "
        "mass_flow, volume_flow or standard_volume_flow");
  Guarantee other = g;
  other.fluid = gas(1005.0, 1.4);
  CHECK(std::string(test::error_of([&] { machines::judge(other, std::span(two.data(), 1)); }).what()) ==
        "no flow: the choked-nozzle law carries a flow to other inlet conditions of the same gas only, and the "
        "guarantee names a fluid of its own; give the guaranteed mass_flow");
  Guarantee tolerance = g;
  tolerance.tolerance[static_cast<std::size_t>(Checked::mass_flow)] = machines::Tolerance{-2.0, 2.0};
  CHECK(std::string(test::error_of([&] { machines::judge(tolerance, std::span(two.data(), 1)); }).what()) ==
        "tolerances.mass_flow: the guarantee gives no flow to check the test's against; give its mass_flow");
  Guarantee exhaust = g;
  exhaust.value(Checked::outlet_pressure) = 1.4e5;
  exhaust.tolerance[static_cast<std::size_t>(Checked::outlet_pressure)] = machines::Tolerance{-1.0, std::nullopt};
  CHECK(std::string(test::error_of([&] { machines::judge(exhaust, std::span(two.data(), 1)); }).what()) ==
        "tolerances.outlet.pressure: a turbine's outlet pressure is the guarantee's exhaust, not a checked quantity");
  // With the flow: two points at the same flow draw no curve.
  g.mass_flow = 3.8;
  const std::vector<TestPoint> same = {expander("E1", 8e5, 820.0, 1.5e5, 0.86, 4.0),
                                       expander("E3", 8e5, 820.0, 1.5e5, 0.84, 4.0)};
  CHECK(std::string(test::error_of([&] { machines::judge(g, same); }).what()) ==
        "test points \"E1\" and \"E3\" convert to the same mass flow (4 kg/s): a curve needs distinct flows; average "
        "the two or keep one");
  // The curve of two points, read between them.
  const machines::GuaranteeResult r = machines::judge(g, two);
  CHECK(value(r, "efficiency.isentropic") == Approx(0.855).epsilon(1e-12));
}

// Compressor guarantees (machines/guarantee.hpp): the fan laws against closed-form perfect-gas
// relations written here, their round trip, the curve, similarity, and each refusal.
#include <cmath>
#include <memory>
#include <numbers>
#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "error_of.hpp"
#include "shaftwork/fluids/constant_cp.hpp"
#include "shaftwork/machines/guarantee.hpp"

using namespace shaftwork;
using machines::Checked;
using machines::Guarantee;
using machines::GuaranteeResult;
using machines::MachineKind;
using machines::RatingInput;
using machines::TestPoint;
using machines::Verdict;

namespace {

constexpr double kCp = 1005.0, kK = 1.4;

std::shared_ptr<const fluids::FluidModel> perfect_air() {
  fluids::ConstantCpInputs in;
  in.cp = kCp;
  in.k = kK;
  return std::make_shared<fluids::ConstantCpGas>(in);
}

const std::shared_ptr<const fluids::FluidModel> kAir = perfect_air();
const double kR = kCp * (kK - 1) / kK;

// A rated compressor test point: p1, T1, p2, eta_p and the mass flow at `speed` [rev/s].
TestPoint point(std::string id, double p1, double T1, double p2, double eta_p, double m, double speed,
                std::optional<double> tip_diameter = std::nullopt) {
  TestPoint p;
  p.id = std::move(id);
  RatingInput& in = p.input;
  in.machine = MachineKind::compressor;
  in.fluid = kAir;
  in.inlet_pressure = p1;
  in.inlet_temperature = T1;
  in.outlet_pressure = p2;
  in.efficiency_polytropic = eta_p;
  in.mass_flow = m;
  in.speed = speed;
  in.impeller_tip_diameter = tip_diameter;
  p.rating = machines::rate(in);
  return p;
}

double converted(const GuaranteeResult& r, const std::string& key) {
  for (const machines::NamedValue& v : r.converted) {
    if (v.key == key) return v.value;
  }
  FAIL("no converted value " << key);
  return 0;
}

const machines::Check& check(const GuaranteeResult& r, Checked q) {
  for (const machines::Check& c : r.checks) {
    if (c.quantity == q) return c;
  }
  FAIL("no check of " << machines::checked_spec(q).key);
  return r.checks.front();
}

// Perfect gas, polytropic path p v^n = const with (n-1)/n = (k-1)/(k eta_p) (ASME PTC 10-1997
// eq. 5.1.x; any text on polytropic compression):
//   H_p = (n/(n-1)) R T1 ((p2/p1)^((n-1)/n) - 1),   so   p2 = p1 (1 + H_p (n-1)/(n R T1))^(n/(n-1)).
double perfect_gas_head(double p1, double T1, double p2, double eta_p) {
  const double e = (kK - 1) / (kK * eta_p);
  return kR * T1 / e * (std::pow(p2 / p1, e) - 1);
}
double perfect_gas_discharge(double p1, double T1, double head, double eta_p) {
  const double e = (kK - 1) / (kK * eta_p);
  return p1 * std::pow(1 + head * e / (kR * T1), 1 / e);
}

Guarantee base_guarantee(double speed, double p1, double T1, double volume_flow) {
  Guarantee g;
  g.speed = speed;
  g.inlet_pressure = p1;
  g.inlet_temperature = T1;
  g.volume_flow = volume_flow;
  g.value(Checked::outlet_pressure) = 3e5;
  return g;
}

}  // namespace

TEST_CASE("fan laws on a constant-k gas: the converted head is the test head times (N_g/N_t)^2") {
  const double Nt = 150, Ng = 160, r = Ng / Nt;
  const TestPoint t = point("T", 100e3, 293.15, 250e3, 0.80, 3.0, Nt);
  const double Qt = *t.rating.volume_flow, Ht = t.rating.head_polytropic;
  CHECK(Ht == Approx(perfect_gas_head(100e3, 293.15, 250e3, 0.80)).epsilon(1e-12));
  // The guarantee inlet differs from the test's; read at the test's converted flow Q_t N_g/N_t.
  Guarantee g = base_guarantee(Ng, 101e3, 300.0, Qt * r);
  g.value(Checked::head_polytropic) = 1e5;
  const GuaranteeResult res = machines::judge(g, std::span(&t, 1));
  CHECK(converted(res, "head.polytropic") == Approx(Ht * r * r).epsilon(1e-12));
  CHECK(converted(res, "efficiency.polytropic") == Approx(0.80).epsilon(1e-15));
  CHECK(converted(res, "outlet.pressure") ==
        Approx(perfect_gas_discharge(101e3, 300.0, Ht * r * r, 0.80)).epsilon(1e-12));
  // Power at the guaranteed flow: m cp (T2 - T1), T2 from the polytropic path T2/T1 = (p2/p1)^((k-1)/(k eta_p)).
  const double p2 = perfect_gas_discharge(101e3, 300.0, Ht * r * r, 0.80);
  const double T2 = 300.0 * std::pow(p2 / 101e3, (kK - 1) / (kK * 0.80));
  const double m = Qt * r * 101e3 / (kR * 300.0);
  CHECK(converted(res, "power") == Approx(m * kCp * (T2 - 300.0)).epsilon(1e-11));
  CHECK(check(res, Checked::head_polytropic).converted == Approx(Ht * r * r).epsilon(1e-12));
}

TEST_CASE("fan-law round trip: test speed to rated and back returns the test point") {
  const double Nt = 145, Ng = 152;
  const TestPoint t = point("T", 98e3, 288.0, 260e3, 0.78, 2.5, Nt);
  const GuaranteeResult there =
      machines::judge(base_guarantee(Ng, 101.325e3, 303.15, *t.rating.volume_flow * Ng / Nt), std::span(&t, 1));
  // The converted point, rated as a test at the rated speed, carried back to the test's conditions.
  const TestPoint back_in = point("B", converted(there, "inlet.pressure"), converted(there, "inlet.temperature"),
                                  converted(there, "outlet.pressure"), converted(there, "efficiency.polytropic"),
                                  converted(there, "mass_flow"), Ng);
  const GuaranteeResult back = machines::judge(base_guarantee(Nt, 98e3, 288.0, *t.rating.volume_flow), std::span(&back_in, 1));
  // Exact up to the root search of the discharge pressure (1e-14 relative in ln(p2/p1)).
  CHECK(converted(back, "outlet.pressure") == Approx(260e3).epsilon(1e-12));
  CHECK(converted(back, "outlet.temperature") == Approx(t.rating.outlet.temperature).epsilon(1e-12));
  CHECK(converted(back, "mass_flow") == Approx(2.5).epsilon(1e-14));
  CHECK(converted(back, "power") == Approx(*t.rating.power).epsilon(1e-12));
  CHECK(converted(back, "head.polytropic") == Approx(t.rating.head_polytropic).epsilon(1e-12));
}

// Three points of a curve at 150 rev/s, and a guaranteed flow a quarter of the way from
// the second to the third.
struct ThreePoints {
  double N = 150;
  std::vector<TestPoint> pts;
  double q_g = 0;
};
ThreePoints three_points() {
  ThreePoints t;
  t.pts = {point("a", 100e3, 293.15, 270e3, 0.78, 2.6, t.N), point("b", 100e3, 293.15, 250e3, 0.80, 3.0, t.N),
           point("c", 100e3, 293.15, 220e3, 0.77, 3.4, t.N)};
  const double q_b = *t.pts[1].rating.volume_flow, q_c = *t.pts[2].rating.volume_flow;
  t.q_g = q_b + 0.25 * (q_c - q_b);
  return t;
}

TEST_CASE("several points make a curve read at the guaranteed flow by straight lines") {
  // Guarantee at the test's own speed and inlet: the converted points are the test points.
  const auto [N, pts, q_g] = three_points();
  Guarantee g = base_guarantee(N, 100e3, 293.15, q_g);
  g.value(Checked::efficiency_polytropic) = 0.78;
  const GuaranteeResult res = machines::judge(g, pts);
  const double head = pts[1].rating.head_polytropic + 0.25 * (pts[2].rating.head_polytropic - pts[1].rating.head_polytropic);
  const double eta = 0.80 + 0.25 * (0.77 - 0.80);
  CHECK(converted(res, "head.polytropic") == Approx(head).epsilon(1e-12));
  CHECK(converted(res, "efficiency.polytropic") == Approx(eta).epsilon(1e-14));
  CHECK(converted(res, "outlet.pressure") == Approx(perfect_gas_discharge(100e3, 293.15, head, eta)).epsilon(1e-12));
  CHECK(res.nearest_point == "b");
  // Deviation from the 3 bar guarantee, and the default zero tolerance: no less than guaranteed.
  const machines::Check& p2 = check(res, Checked::outlet_pressure);
  CHECK(*p2.deviation_percent == Approx(100 * (perfect_gas_discharge(100e3, 293.15, head, eta) - 3e5) / 3e5).epsilon(1e-10));
  CHECK(p2.tolerance_from == machines::ToleranceFrom::none_given);
  CHECK(p2.tolerance == machines::Tolerance{0.0, std::nullopt});
  CHECK(p2.verdict == Verdict::fail);  // about 2.4 bar against 3 bar
  CHECK(res.verdict == Verdict::fail);
}

TEST_CASE("the curves a chart draws: the converted points, the reading at Q_G, the discharge pressure as a head") {
  const auto [N, pts, q_g] = three_points();
  Guarantee g = base_guarantee(N, 100e3, 293.15, q_g);
  g.value(Checked::outlet_pressure) = 2.4e5;
  g.tolerance[static_cast<std::size_t>(Checked::outlet_pressure)] = machines::Tolerance{-2.0, 5.0};
  g.value(Checked::efficiency_polytropic) = 0.78;
  const GuaranteeResult res = machines::judge(g, pts);
  REQUIRE(res.readings);
  const machines::CurveReadings& rd = *res.readings;
  CHECK(rd.guaranteed_flow == Approx(q_g).epsilon(1e-15));
  CHECK_FALSE(rd.cross);
  REQUIRE(rd.quantities.size() == 2);
  const machines::CurveReading& head = rd.quantities[0];
  const machines::CurveReading& eta = rd.quantities[1];
  CHECK(head.key == "head.polytropic");
  CHECK(eta.key == "efficiency.polytropic");
  // The converted points at the test's own speed and inlet are the test points, ascending in flow.
  REQUIRE(head.flow.size() == 3);
  CHECK(head.flow[0] == Approx(*pts[0].rating.volume_flow).epsilon(1e-14));
  CHECK(head.value[2] == Approx(perfect_gas_head(100e3, 293.15, 220e3, 0.77)).epsilon(1e-12));
  CHECK(eta.value[1] == Approx(0.80).epsilon(1e-14));
  // Read at Q_G by straight lines: as the converted values of the result.
  const double eta_read = 0.80 + 0.25 * (0.77 - 0.80);
  CHECK(head.read_flow == q_g);
  CHECK(head.read_value == Approx(converted(res, "head.polytropic")).epsilon(1e-12));
  CHECK(head.at(q_g) == Approx(head.read_value).epsilon(1e-15));
  CHECK(eta.read_value == Approx(eta_read).epsilon(1e-14));
  CHECK(*eta.guaranteed == 0.78);
  CHECK(*eta.low == Approx(0.78).epsilon(1e-15));  // no tolerance given: zero below, open above
  CHECK_FALSE(eta.high);
  // The guaranteed 2.4 bar (-2 %, +5 %) as polytropic heads at the read efficiency, closed form above.
  CHECK(head.check == Checked::outlet_pressure);
  CHECK(*head.guaranteed == Approx(perfect_gas_head(100e3, 293.15, 2.4e5, eta_read)).epsilon(1e-12));
  CHECK(*head.low == Approx(perfect_gas_head(100e3, 293.15, 2.4e5 * 0.98, eta_read)).epsilon(1e-12));
  CHECK(*head.high == Approx(perfect_gas_head(100e3, 293.15, 2.4e5 * 1.05, eta_read)).epsilon(1e-12));
  // So the head read at Q_G lies within the head band exactly as the discharge pressure within its tolerance.
  const machines::Check& p2 = check(res, Checked::outlet_pressure);
  CHECK(p2.verdict == Verdict::pass);
  CHECK(head.read_value > *head.low);
  CHECK(head.read_value < *head.high);
}

TEST_CASE("similarity: volume ratio, flow coefficient and machine Mach number with their limits") {
  const double Nt = 150, Ng = 155, D = 0.4;
  const TestPoint t = point("T", 100e3, 293.15, 250e3, 0.80, 3.0, Nt, D);
  const double q_g = *t.rating.volume_flow * Ng / Nt * 1.02;  // 2 % above the converted flow
  const GuaranteeResult res = machines::judge(base_guarantee(Ng, 100e3, 293.15, q_g), std::span(&t, 1));
  REQUIRE(res.similarity.size() == 3);
  const machines::SimilarityCheck& v = res.similarity[0];
  CHECK(v.parameter == "specific_volume_ratio");
  CHECK(*v.ratio == Approx(t.rating.outlet.density / t.rating.inlet.density / *v.guarantee).epsilon(1e-15));
  CHECK(v.low == 0.95);
  CHECK(v.high == 1.05);
  const machines::SimilarityCheck& phi = res.similarity[1];
  CHECK(phi.parameter == "flow_coefficient");
  CHECK(*phi.ratio == Approx(1 / 1.02).epsilon(1e-14));
  CHECK(*phi.test == Approx(*t.rating.volume_flow / (std::numbers::pi / 4 * D * D * std::numbers::pi * D * Nt)).epsilon(1e-14));
  CHECK(*phi.guarantee == Approx(q_g / (std::numbers::pi / 4 * D * D * std::numbers::pi * D * Ng)).epsilon(1e-14));
  CHECK(phi.within);
  CHECK(phi.low == 0.96);
  const machines::SimilarityCheck& mach = res.similarity[2];
  CHECK(mach.parameter == "machine_mach_number");
  // Same inlet, a = sqrt(k R T): M_t - M_g = pi D (N_t - N_g) / a.
  CHECK(*mach.difference == Approx(std::numbers::pi * D * (Nt - Ng) / std::sqrt(kK * kR * 293.15)).epsilon(1e-7));
  CHECK(mach.within);
}

TEST_CASE("refusals: no flow, a pump grade on a compressor, extrapolation beyond 5 %, no rated speed") {
  TestPoint t = point("T1", 100e3, 293.15, 250e3, 0.80, 3.0, 150);
  t.input.mass_flow.reset();
  t.input.volume_flow = 1.0;  // 3600 m3/h
  t.rating = machines::rate(t.input);
  const double q = 1.0;
  Guarantee no_flow = base_guarantee(150, 100e3, 293.15, q);
  no_flow.volume_flow.reset();
  CHECK(std::string(test::error_of([&] { machines::judge(no_flow, std::span(&t, 1)); }).what()) ==
        "no flow: a compressor guarantee is read at its guaranteed flow; give mass_flow, volume_flow or "
        "standard_volume_flow");
  Guarantee graded = base_guarantee(150, 100e3, 293.15, q);
  graded.grade = "1B";
  CHECK(std::string(test::error_of([&] { machines::judge(graded, std::span(&t, 1)); }).what()) ==
        "tolerances.grade: the ISO 9906 acceptance grades (1B) are for pumps, and this is a compressor; give "
        "percentages instead, such as \"tolerances\": { \"power\": { \"max\": \"+4 %\" } }");
  const Guarantee far = base_guarantee(150, 100e3, 293.15, q * 1.08);
  CHECK(std::string(test::error_of([&] { machines::judge(far, std::span(&t, 1)); }).what()) ==
        "the guaranteed inlet volume flow 3888 m3/h lies 8.0 % beyond the converted test flow 3600 m3/h: a curve is "
        "read at most 5 % beyond its test points; test nearer the guaranteed flow");
  Guarantee no_speed = base_guarantee(150, 100e3, 293.15, q);
  no_speed.speed.reset();
  CHECK(std::string(test::error_of([&] { machines::judge(no_speed, std::span(&t, 1)); }).what()) ==
        "speed: missing; the test point \"T1\" gives its speed (9000 rpm), so the rated speed is needed to convert it");
  // Within 5 % is read (the flat curve of one point).
  CHECK_NOTHROW(machines::judge(base_guarantee(150, 100e3, 293.15, q * 1.049), std::span(&t, 1)));
}

TEST_CASE("verdicts: within the tolerance passes; beyond it by less than U is inconclusive") {
  const machines::Tolerance t{-2.0, 4.0};
  CHECK(machines::judge_deviation(-2.0, t, std::nullopt) == Verdict::pass);
  CHECK(machines::judge_deviation(4.0, t, std::nullopt) == Verdict::pass);
  CHECK(machines::judge_deviation(-2.5, t, std::nullopt) == Verdict::fail);
  CHECK(machines::judge_deviation(-2.5, t, 0.6) == Verdict::inconclusive);
  CHECK(machines::judge_deviation(-2.5, t, 0.4) == Verdict::fail);
  CHECK(machines::judge_deviation(4.3, t, 0.5) == Verdict::inconclusive);
  CHECK(machines::judge_deviation(100.0, machines::Tolerance{-2.0, std::nullopt}, std::nullopt) == Verdict::pass);

  // Through a guarantee: the test's U of the polytropic efficiency, carried relatively.
  TestPoint t1 = point("T1", 100e3, 293.15, 250e3, 0.80, 3.0, 150);
  Guarantee g = base_guarantee(150, 100e3, 293.15, *t1.rating.volume_flow);
  g.value(Checked::efficiency_polytropic) = 0.81;  // -1.23 % below
  g.tolerance[static_cast<std::size_t>(Checked::efficiency_polytropic)] = machines::Tolerance{-1.0, std::nullopt};
  CHECK(check(machines::judge(g, std::span(&t1, 1)), Checked::efficiency_polytropic).verdict == Verdict::fail);
  t1.uncertainty["efficiency.polytropic"] = 0.004;  // 0.5 % of 0.80, so 0.494 % of the guaranteed 0.81
  const machines::Check c = check(machines::judge(g, std::span(&t1, 1)), Checked::efficiency_polytropic);
  CHECK(*c.uncertainty_percent == Approx(100 * 0.004 / 0.81).epsilon(1e-12));
  CHECK(c.verdict == Verdict::inconclusive);
}

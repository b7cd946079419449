// Pump guarantees by ISO 9906:2012 (machines/guarantee.hpp): a pump whose head and
// efficiency curves are exact quadratics, tested at 1450 rpm for a 1480 rpm guarantee and
// judged in grades 1B and 2B; the tolerance cross, the efficiency at the intersection with
// the line through the origin and the power at Q_G, each computed again here.
#include <cmath>
#include <memory>
#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "error_of.hpp"
#include "shaftwork/fluids/incompressible.hpp"
#include "shaftwork/machines/guarantee.hpp"

using namespace shaftwork;
using machines::Checked;
using machines::Guarantee;
using machines::GuaranteeResult;
using machines::TestPoint;
using machines::Verdict;

namespace {

constexpr double kRho = 998.2, kG = 9.80665;                // kg/m3; standard gravity, m/s2
constexpr double kA = 58.0, kB = 20.0, kC = -900.0;         // H_t = A + B Q + C Q^2 (m, Q in m3/s)
constexpr double kNt = 1450.0 / 60, kNg = 1480.0 / 60;       // rev/s
constexpr double kR = kNg / kNt;

double test_head(double q) { return kA + kB * q + kC * q * q; }
double test_efficiency(double q) { return 0.80 - 40 * (q - 0.11) * (q - 0.11); }

std::vector<TestPoint> test_points() {
  const auto water = std::make_shared<fluids::IncompressibleLiquid>(kRho, 4182.0);
  std::vector<TestPoint> out;
  for (double q : {0.080, 0.095, 0.110, 0.125, 0.140}) {
    TestPoint p;
    p.id = "Q=" + std::to_string(q);
    p.input.machine = machines::MachineKind::pump;
    p.input.fluid = water;
    p.input.inlet_pressure = 1.5e5;
    p.input.inlet_temperature = 293.15;
    p.input.head = test_head(q) * kG;  // J/kg
    p.input.volume_flow = q;
    p.input.power = kRho * kG * q * test_head(q) / test_efficiency(q);
    p.input.speed = kNt;
    p.rating = machines::rate(p.input);
    out.push_back(std::move(p));
  }
  return out;
}

// Translated to 1480 rpm (ISO 9906:2012, 6.1.2): Q = r Q_t and H = r^2 H_t give
// H(Q) = A r^2 + B r Q + C Q^2, and eta(Q) = eta_t(Q / r).
double head(double q) { return kA * kR * kR + kB * kR * q + kC * q * q; }
double efficiency(double q) { return test_efficiency(q / kR); }

// The larger root of a x^2 + b x + c = 0 (quadratic formula).
double larger_root(double a, double b, double c) {
  const double d = std::sqrt(b * b - 4 * a * c);
  return std::max((-b + d) / (2 * a), (-b - d) / (2 * a));
}

// Least-squares quadratic through (x, y) at x0, by the normal equations solved with
// Cramer's rule on unscaled x: an independent route to what the code computes.
double least_squares_at(const std::vector<double>& x, const std::vector<double>& y, double x0) {
  double s[5] = {}, t[3] = {};
  for (std::size_t i = 0; i < x.size(); ++i) {
    for (int k = 0; k < 5; ++k) s[k] += std::pow(x[i], k);
    for (int k = 0; k < 3; ++k) t[k] += y[i] * std::pow(x[i], k);
  }
  const auto det = [](double a, double b, double c, double d, double e, double f, double g, double h, double i) {
    return a * (e * i - f * h) - b * (d * i - f * g) + c * (d * h - e * g);
  };
  const double m = det(s[0], s[1], s[2], s[1], s[2], s[3], s[2], s[3], s[4]);
  const double c0 = det(t[0], s[1], s[2], t[1], s[2], s[3], t[2], s[3], s[4]) / m;
  const double c1 = det(s[0], t[0], s[2], s[1], t[1], s[3], s[2], t[2], s[4]) / m;
  const double c2 = det(s[0], s[1], t[0], s[1], s[2], t[1], s[2], s[3], t[2]) / m;
  return c0 + c1 * x0 + c2 * x0 * x0;
}

constexpr double kQg = 0.115, kHg = 48.9, kEtaG = 0.80, kPg = 69.5e3;

Guarantee guarantee(const char* grade) {
  Guarantee g;
  g.speed = kNg;
  g.volume_flow = kQg;
  g.value(Checked::head_height) = kHg;
  g.value(Checked::pump_efficiency) = kEtaG;
  g.value(Checked::power) = kPg;
  g.grade = grade;
  return g;
}

const machines::Check& check(const GuaranteeResult& r, Checked q) {
  for (const machines::Check& c : r.checks) {
    if (c.quantity == q) return c;
  }
  FAIL("no check of " << machines::checked_spec(q).key);
  return r.checks.front();
}

}  // namespace

TEST_CASE("ISO 9906 grade table: the figures carried in data/acceptance.txt") {
  // ISO 9906:2012 Table 8 as remembered (from memory; grade 2B's flow, head and efficiency
  // agree with KSB's public pump lexicon). Flow and head [min, max], power max, efficiency min, %.
  struct Row {
    const char* name;
    double q_min, q_max, h_min, h_max, p_max, eta_min;
  };
  const Row rows[] = {{"1U", 0, 10, 0, 6, 10, 0}, {"1E", -5, 5, -3, 3, 4, 0}, {"1B", -5, 5, -3, 3, 4, -3},
                      {"2B", -8, 8, -5, 5, 8, -5}, {"2U", 0, 16, 0, 10, 16, -5}, {"3B", -9, 9, -7, 7, 9, -7}};
  REQUIRE(machines::pump_grades().size() == 6);
  for (const Row& r : rows) {
    const machines::PumpGrade* g = machines::find_pump_grade(r.name);
    REQUIRE(g);
    CHECK(g->flow == machines::Tolerance{r.q_min, r.q_max});
    CHECK(g->head == machines::Tolerance{r.h_min, r.h_max});
    CHECK(g->power == machines::Tolerance{std::nullopt, r.p_max});
    CHECK(g->efficiency == machines::Tolerance{r.eta_min, std::nullopt});
  }
  CHECK_FALSE(machines::find_pump_grade("2E"));
}

TEST_CASE("a pump curve from an exact quadratic, judged in grades 1B and 2B") {
  const std::vector<TestPoint> pts = test_points();
  const GuaranteeResult b1 = machines::judge(guarantee("1B"), pts);
  const GuaranteeResult b2 = machines::judge(guarantee("2B"), pts);
  // Head at Q_G on the translated curve: +4.03 % against H_G.
  const machines::Check& h = check(b1, Checked::head_height);
  CHECK(*h.converted == Approx(head(kQg)).epsilon(1e-10));
  CHECK(*h.deviation_percent == Approx(100 * (head(kQg) - kHg) / kHg).epsilon(1e-9));
  // Flow where H(Q) = H_G: C Q^2 + B r Q + A r^2 - H_G = 0, +8.8 % against Q_G.
  const double q_at_h = larger_root(kC, kB * kR, kA * kR * kR - kHg);
  const machines::Check& q = check(b1, Checked::volume_flow);
  CHECK(*q.converted == Approx(q_at_h).epsilon(1e-10));
  CHECK(*q.deviation_percent == Approx(100 * (q_at_h - kQg) / kQg).epsilon(1e-8));
  // 1B (+-5 % flow, +-3 % head): the curve misses both bars of the cross. 2B (+-8 %, +-5 %):
  // it crosses the head bar.
  CHECK(h.verdict == Verdict::fail);
  CHECK(q.verdict == Verdict::fail);
  CHECK(check(b2, Checked::head_height).verdict == Verdict::pass);
  CHECK(check(b2, Checked::volume_flow).verdict == Verdict::pass);
  CHECK(check(b2, Checked::head_height).note == "tolerance cross: the curve crosses the head bar at Q_G");
  // Efficiency where H(Q) meets H = (H_G/Q_G) Q.
  const double q_line = larger_root(kC, kB * kR - kHg / kQg, kA * kR * kR);
  const machines::Check& eta = check(b1, Checked::pump_efficiency);
  CHECK(*eta.converted == Approx(efficiency(q_line)).epsilon(1e-9));
  CHECK(eta.verdict == Verdict::pass);  // -0.17 % against >= -3 %
  // Power at Q_G: P = P_t r^3 (same liquid), the least-squares quadratic through the points.
  std::vector<double> qs, ps;
  for (const TestPoint& p : pts) {
    qs.push_back(*p.rating.volume_flow * kR);
    ps.push_back(*p.rating.power * kR * kR * kR);
  }
  const double p_ref = least_squares_at(qs, ps, kQg);
  const machines::Check& p = check(b1, Checked::power);
  CHECK(*p.converted == Approx(p_ref).epsilon(1e-9));
  CHECK(*p.converted == Approx(kRho * kG * kQg * head(kQg) / efficiency(kQg)).epsilon(2e-3));  // the fit's own error
  CHECK(p.tolerance == machines::Tolerance{std::nullopt, 4.0});
  CHECK(p.verdict == Verdict::pass);
  CHECK(b1.verdict == Verdict::fail);
  CHECK(b2.verdict == Verdict::pass);
}

TEST_CASE("the curves a chart draws: H(Q) with the tolerance cross, eta(Q) read on the line through the origin") {
  const GuaranteeResult b1 = machines::judge(guarantee("1B"), test_points());
  REQUIRE(b1.readings);
  const machines::CurveReadings& rd = *b1.readings;
  CHECK(rd.guaranteed_flow == kQg);
  // Grade 1B: +-5 % flow at H_G, +-3 % head at Q_G (ISO 9906:2012 Table 8, from memory).
  CHECK(rd.cross);
  CHECK(*rd.flow_low == Approx(0.95 * kQg).epsilon(1e-15));
  CHECK(*rd.flow_high == Approx(1.05 * kQg).epsilon(1e-15));
  REQUIRE(rd.quantities.size() == 2);
  const machines::CurveReading& h = rd.quantities[0];
  CHECK(h.key == "head_height");
  CHECK(*h.guaranteed == kHg);
  CHECK(*h.low == Approx(0.97 * kHg).epsilon(1e-15));
  CHECK(*h.high == Approx(1.03 * kHg).epsilon(1e-15));
  CHECK(h.check == Checked::head_height);
  // The translated points (Q_t r, H_t r^2) and the least-squares curve through them, which
  // is the translated quadratic itself.
  REQUIRE(h.flow.size() == 5);
  CHECK(h.flow[0] == Approx(0.080 * kR).epsilon(1e-12));
  CHECK(h.value[0] == Approx(test_head(0.080) * kR * kR).epsilon(1e-12));
  for (double q : {0.07, 0.1, 0.13, 0.15}) CHECK(h.at(q) == Approx(head(q)).epsilon(1e-10));
  CHECK(h.read_flow == kQg);
  CHECK(h.read_value == Approx(head(kQg)).epsilon(1e-10));
  // Efficiency read where H(Q) meets H = (H_G/Q_G) Q.
  const machines::CurveReading& eta = rd.quantities[1];
  const double q_line = larger_root(kC, kB * kR - kHg / kQg, kA * kR * kR);
  CHECK(eta.key == "pump_efficiency");
  CHECK(eta.read_flow == Approx(q_line).epsilon(1e-10));
  CHECK(eta.read_value == Approx(efficiency(q_line)).epsilon(1e-9));
  CHECK(eta.at(0.1) == Approx(efficiency(0.1)).epsilon(1e-9));
  CHECK(*eta.low == Approx(0.97 * kEtaG).epsilon(1e-15));  // grade 1B: eta >= eta_G (1 - 3 %)
  CHECK_FALSE(eta.high);
}

TEST_CASE("pump refusals: one point draws no curve; no flow") {
  const std::vector<TestPoint> pts = test_points();
  CHECK(std::string(test::error_of([&] { machines::judge(guarantee("2B"), std::span(pts.data(), 1)); }).what()) ==
        "a pump guarantee is judged on the H(Q) curve through the translated test points (ISO 9906:2012), and one "
        "point draws no curve: put the guarantee beside \"cases\" at the top of the file, so that every case is a "
        "test point (ISO 9906 asks for 3 to 5 points around the guarantee flow)");
  Guarantee g = guarantee("2B");
  g.volume_flow.reset();
  CHECK(std::string(test::error_of([&] { machines::judge(g, pts); }).what()) ==
        "no flow: a pump guarantee is read at its guaranteed flow; give mass_flow, volume_flow or standard_volume_flow");
}

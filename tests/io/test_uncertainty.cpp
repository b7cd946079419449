// Measurement uncertainty: stated uncertainties read to SI differences, propagated through
// the real solve (io::propagate_uncertainty) and checked against two methods from outside
// the code: the constant-cp gas's sensitivities derived by hand below, and a Monte Carlo
// propagation (JCGM 101:2008) with 10^5 draws through machines::rate.
#include <algorithm>
#include <cmath>
#include <random>
#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "error_of.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/uncertainty.hpp"
#include "shaftwork/io/uncertainty_input.hpp"

using namespace shaftwork;
using nlohmann::json;
using machines::Input;

namespace {

struct Rated {
  io::CaseInput input;
  machines::Rating rating;
  io::UncertaintyResult uncertainty;
};

Rated rate_with_uncertainty(const json& c) {
  io::FluidFactory fluids;
  Rated r{io::read_case(c, 0, fluids), {}, {}};
  r.rating = machines::rate(io::to_rating_input(r.input));
  r.uncertainty = io::propagate_uncertainty(r.input, r.rating);
  return r;
}

// The constant-cp gas of the checks: cp = 1005 J/(kg K), k = 1.4, so R/cp = (k - 1)/k = 2/7.
constexpr double kCp = 1005.0;
constexpr double kE = 0.4 / 1.4;

// The compressor of the checks, T1 = 293.15 K, p1 = 100 kPa, p2 = 400 kPa, T2 = 475 K.
json constant_cp_case() {
  return json::parse(R"({"id": "cp", "machine": "compressor",
      "fluid": {"model": "constant-cp", "cp": 1005, "k": 1.4},
      "inlet": {"pressure": {"value": "100 kPa", "uncertainty": "0.3 kPa"},
                "temperature": {"value": "293.15 K", "uncertainty": "0.3 K"}},
      "outlet": {"pressure": {"value": "400 kPa", "uncertainty": "0.25 %"},
                 "temperature": {"value": "475 K", "uncertainty": "0.5 K"}},
      "mass_flow": {"value": "2 kg/s", "uncertainty": "1 %"},
      "mechanical_efficiency": {"value": 0.98, "uncertainty": 0.005}})");
}

// The hand-derived sensitivities of the constant-cp compressor. With r = p2/p1,
// a = r^e - 1 (e = R/cp) and dT = T2 - T1, the definitions (docs/method.md) give
//   eta_s = (T2s - T1)/(T2 - T1) = T1 a / dT,        T2s = T1 r^e
//   eta_p = e ln r / ln(T2/T1)                        (dh = v dp / eta_p, ideal gas)
//   P = m cp dT / eta_m
// and by differentiation:
//   d eta_s/dT1 = a/dT + T1 a/dT^2 = a T2/dT^2        d eta_s/dT2 = -T1 a/dT^2
//   d eta_s/dp1 = -T1 e r^e/(p1 dT)                   d eta_s/dp2 = T1 e r^e/(p2 dT)
//   d eta_p/dT1 = e ln r/(T1 L^2)                     d eta_p/dT2 = -e ln r/(T2 L^2),  L = ln(T2/T1)
//   d eta_p/dp1 = -e/(p1 L)                           d eta_p/dp2 = e/(p2 L)
//   dP/dm = cp dT/eta_m   dP/dT1 = -m cp/eta_m   dP/dT2 = m cp/eta_m   dP/deta_m = -P/eta_m
//   dT2s/dT1 = r^e        dT2s/dp1 = -T1 e r^e/p1    dT2s/dp2 = T1 e r^e/p2
struct Sensitivities {
  double p1, T1, p2, T2, m, eta_m;
  double r() const { return p2 / p1; }
  double dT() const { return T2 - T1; }
  double L() const { return std::log(T2 / T1); }
  double power() const { return m * kCp * dT() / eta_m; }
  // d eta_s / d(p1, T1, p2, T2)
  std::vector<double> eta_s() const {
    const double re = std::pow(r(), kE), a = re - 1;
    return {-T1 * kE * re / (p1 * dT()), a * T2 / (dT() * dT()), T1 * kE * re / (p2 * dT()), -T1 * a / (dT() * dT())};
  }
  std::vector<double> eta_p() const {
    const double lr = std::log(r());
    return {-kE / (p1 * L()), kE * lr / (T1 * L() * L()), kE / (p2 * L()), -kE * lr / (T2 * L() * L())};
  }
};

double root_sum_square(const std::vector<double>& c, const std::vector<double>& u) {
  double sum = 0;
  for (std::size_t i = 0; i < c.size(); ++i) sum += c[i] * u[i] * c[i] * u[i];
  return std::sqrt(sum);
}

}  // namespace

TEST_CASE("stated uncertainties become SI differences: percent of the reading as written, or a difference") {
  io::FluidFactory fluids;
  const io::CaseInput c = io::read_case(json::parse(R"({"machine": "compressor", "fluid": "air",
      "site": {"barometric_pressure": {"value": "99.1 kPa", "uncertainty": "0.5 mbar"}},
      "inlet": {"pressure": {"value": "-1.8 kPag", "uncertainty": "2 %"},
                "temperature": {"value": "75 degF", "uncertainty": "0.5 degF"}},
      "outlet": {"pressure": {"value": "2.10 barg", "uncertainty": "0.25 %"},
                 "temperature": {"value": "172.5 degC", "uncertainty": "1 %"}},
      "standard_volume_flow": {"value": "4200 Nm3/h", "uncertainty": "1.5 %"},
      "efficiency": {"value": "78 %", "uncertainty": "1 %"},
      "mechanical_efficiency": {"value": 0.975, "uncertainty": 0.005}})"),
                                        0, fluids);
  const io::UncertaintySources s = io::uncertainty_sources(c);
  const auto u = [&](Input input) {
    for (std::size_t i = 0; i < s.count; ++i) {
      if (s.varied[i].input == input) return s.varied[i].expanded;
    }
    return -1.0;
  };
  // Unit factors from NIST SP 811 (2008), Appendix B: 1 mbar = 100 Pa, 1 bar = 1e5 Pa,
  // a difference of 1 degF = 5/9 K.
  CHECK(u(Input::barometric_pressure) == Approx(50.0).epsilon(1e-12));
  CHECK(u(Input::inlet_pressure) == Approx(36.0).epsilon(1e-12));       // 2 % of 1.8 kPa, not of the absolute 97.3
  CHECK(u(Input::inlet_temperature) == Approx(0.5 * 5 / 9).epsilon(1e-12));
  CHECK(u(Input::outlet_pressure) == Approx(525.0).epsilon(1e-12));     // 0.25 % of 2.10 bar
  CHECK(u(Input::outlet_temperature) == Approx(1.725).epsilon(1e-12));  // 1 % of 172.5 on the degC scale
  CHECK(u(Input::standard_volume_flow) == Approx(0.015 * c.find(Input::standard_volume_flow)->si).epsilon(1e-12));
  CHECK(u(Input::efficiency_isentropic) == Approx(0.0078).epsilon(1e-12));  // 1 % of 78 %
  CHECK(u(Input::mechanical_efficiency) == 0.005);                          // a plain number: the fraction itself
  // Gauge readings move with the barometer.
  CHECK(s.moves == 2);
  CHECK(s.barometer == Approx(99100.0));
}

TEST_CASE("uncertainties by key: the value's own first, then the case's, then the file's") {
  const json document = json::parse(R"({
      "uncertainty": {"outlet.temperature": "0.8 K", "inlet.temperature": "0.4 K", "power": "2 %"},
      "cases": [{"id": "a", "machine": "compressor", "fluid": "air",
                 "inlet": {"pressure": "100 kPa", "temperature": {"value": "20 degC", "uncertainty": "0.1 K"}},
                 "outlet": {"pressure": "300 kPa", "temperature": "160 degC"},
                 "uncertainty": {"outlet.temperature": "0.3 K"}},
                {"id": "b", "machine": "compressor", "fluid": "air",
                 "inlet": {"pressure": "100 kPa", "temperature": "20 degC"},
                 "outlet": {"pressure": "300 kPa"}, "efficiency": 0.8}]})");
  io::FluidFactory fluids;
  const auto outcomes = io::rate_document(document, "file.json", fluids);
  REQUIRE(outcomes.size() == 2);
  REQUIRE(outcomes[0].ok());
  const io::CaseInput& a = *outcomes[0].input;
  CHECK(a.find(Input::inlet_temperature)->uncertainty->written == "0.1 K");   // its own
  CHECK(a.find(Input::outlet_temperature)->uncertainty->written == "0.3 K");  // the case's
  // Case b gives no outlet temperature and no power: the file's statements pass it by;
  // its inlet temperature takes the file's.
  REQUIRE(outcomes[1].ok());
  CHECK(outcomes[1].input->find(Input::inlet_temperature)->uncertainty->written == "0.4 K");
  CHECK(outcomes[1].uncertainty->of("outlet.temperature") > 0);  // solved: it gets a propagated U
  // A given value without a statement moves nothing.
  CHECK(*outcomes[0].uncertainty->of("inlet.pressure") == 0);
}

TEST_CASE("U of the constant-cp compressor against the hand-derived sensitivities") {
  const Rated r = rate_with_uncertainty(constant_cp_case());
  const Sensitivities s{100e3, 293.15, 400e3, 475.0, 2.0, 0.98};
  // The stated uncertainties in SI: 0.3 kPa, 0.3 K, 0.25 % of 400 kPa, 0.5 K, 1 % of 2 kg/s, 0.005.
  const std::vector<double> u = {300.0, 0.3, 1000.0, 0.5};
  const double u_m = 0.02, u_eta_m = 0.005;
  CHECK(*r.uncertainty.of("efficiency.isentropic") == Approx(root_sum_square(s.eta_s(), u)).epsilon(0.01));
  CHECK(*r.uncertainty.of("efficiency.polytropic") == Approx(root_sum_square(s.eta_p(), u)).epsilon(0.01));
  const double dP_dT = s.m * kCp / s.eta_m;
  const double u_power = root_sum_square({dP_dT, -dP_dT, kCp * s.dT() / s.eta_m, -s.power() / s.eta_m},
                                         {0.5, 0.3, u_m, u_eta_m});
  CHECK(*r.uncertainty.of("power") == Approx(u_power).epsilon(0.01));
  const double re = std::pow(s.r(), kE);
  const double u_t2s = root_sum_square({-s.T1 * kE * re / s.p1, re, s.T1 * kE * re / s.p2}, {300.0, 0.3, 1000.0});
  CHECK(*r.uncertainty.of("outlet_isentropic.temperature") == Approx(u_t2s).epsilon(0.01));
  // Given values come back with their own U; the pressure ratio p2/p1 by its two relative ones.
  CHECK(*r.uncertainty.of("outlet.temperature") == Approx(0.5).epsilon(1e-6));
  CHECK(*r.uncertainty.of("pressure_ratio") == Approx(s.r() * std::hypot(0.003, 0.0025)).epsilon(0.01));
  // The efficiencies' sensitivities are even closer than the 1 % asked: the step is small.
  CHECK(*r.uncertainty.of("efficiency.isentropic") == Approx(root_sum_square(s.eta_s(), u)).epsilon(1e-5));
  // Six inputs with an uncertainty: two ratings each, the nominal one besides.
  CHECK(r.uncertainty.ratings == 12);
  CHECK(r.uncertainty.warnings.empty());
}

TEST_CASE("the barometer is an input of its own: gauge readings move with it one for one") {
  json c = constant_cp_case();
  c["site"] = json::parse(R"({"barometric_pressure": {"value": "100 kPa", "uncertainty": "0.2 kPa"}})");
  c["inlet"]["pressure"] = json::parse(R"({"value": "0 kPag", "uncertainty": "0.05 kPa"})");
  c["outlet"]["pressure"] = json::parse(R"({"value": "3 barg", "uncertainty": "0.25 %"})");
  const Rated r = rate_with_uncertainty(c);
  const Sensitivities s{100e3, 293.15, 400e3, 475.0, 2.0, 0.98};
  const std::vector<double> c_eta = s.eta_s();
  // The barometer's sensitivity is the sum of the two pressures' (both shift by dB).
  const std::vector<double> coefficients = {c_eta[0], c_eta[1], c_eta[2], c_eta[3], c_eta[0] + c_eta[2]};
  const std::vector<double> u = {50.0, 0.3, 750.0, 0.5, 200.0};  // 0.25 % of 3 bar = 750 Pa
  CHECK(*r.uncertainty.of("efficiency.isentropic") == Approx(root_sum_square(coefficients, u)).epsilon(0.01));
  CHECK(*r.uncertainty.of("inlet.pressure") == Approx(std::hypot(50.0, 200.0)).epsilon(1e-6));
  CHECK(*r.uncertainty.of("outlet.pressure") == Approx(std::hypot(750.0, 200.0)).epsilon(1e-6));
}

TEST_CASE("contributions: the outlet temperature dominates, shares largest first and summing to 100 %") {
  json c = constant_cp_case();
  c["outlet"]["temperature"]["uncertainty"] = "1.5 K";
  const Rated r = rate_with_uncertainty(c);
  const std::vector<io::Contribution>* shares = r.uncertainty.contributions_of("efficiency.isentropic");
  REQUIRE(shares);
  REQUIRE(shares->size() == 4);  // p1, T1, p2, T2: flow and eta_m do not move the efficiency
  CHECK((*shares)[0].input == Input::outlet_temperature);
  const Sensitivities s{100e3, 293.15, 400e3, 475.0, 2.0, 0.98};
  const std::vector<double> u = {300.0, 0.3, 1000.0, 1.5};
  const double total = root_sum_square(s.eta_s(), u);
  const double t2_share = 100 * std::pow(s.eta_s()[3] * 1.5 / total, 2);
  CHECK((*shares)[0].share_percent == Approx(t2_share).margin(0.1));
  double sum = 0;
  for (std::size_t i = 0; i < shares->size(); ++i) {
    sum += (*shares)[i].share_percent;
    if (i) CHECK((*shares)[i].share_percent <= (*shares)[i - 1].share_percent);
  }
  CHECK(sum == Approx(100.0).margin(1e-9));
  // The power's shares: the flow's 1 % moves it by cp dT/eta_m x 0.02 kg/s = 3730 W, the
  // outlet temperature's 1.5 K by m cp/eta_m x 1.5 K = 3077 W: the flow comes first.
  const std::vector<io::Contribution>* power = r.uncertainty.contributions_of("power");
  REQUIRE(power);
  REQUIRE(power->size() == 4);  // m, T1, T2, eta_m: the pressures do not move it
  CHECK((*power)[0].input == Input::mass_flow);
  CHECK((*power)[1].input == Input::outlet_temperature);
}

namespace {

// The isentropic efficiency of `draws` samples of a constant-cp compressor with normal
// inputs (the means, and standard uncertainties u = U/2), rated by machines::rate.
struct MonteCarlo {
  std::vector<double> values;  // sorted
  int refused = 0;             // draws the model cannot rate (an efficiency above 1)
  double quantile(double p) const { return values[static_cast<std::size_t>(p * static_cast<double>(values.size()))]; }
  double two_sigma() const {
    double mean = 0, sum = 0;
    for (double v : values) mean += v;
    mean /= static_cast<double>(values.size());
    for (double v : values) sum += (v - mean) * (v - mean);
    return 2 * std::sqrt(sum / static_cast<double>(values.size() - 1));
  }
};

MonteCarlo monte_carlo(const machines::RatingInput& base, const std::vector<double>& mean,
                       const std::vector<double>& expanded, int draws) {
  std::mt19937_64 engine(20260302);
  std::normal_distribution<double> normal(0.0, 1.0);
  MonteCarlo mc;
  machines::RatingInput in = base;
  for (int n = 0; n < draws; ++n) {
    in.inlet_pressure = mean[0] + expanded[0] / 2 * normal(engine);
    in.inlet_temperature = mean[1] + expanded[1] / 2 * normal(engine);
    in.outlet_pressure = mean[2] + expanded[2] / 2 * normal(engine);
    in.outlet_temperature = mean[3] + expanded[3] / 2 * normal(engine);
    try {
      mc.values.push_back(machines::rate(in).efficiency_isentropic);
    } catch (const Error&) {
      ++mc.refused;
    }
  }
  std::sort(mc.values.begin(), mc.values.end());
  return mc;
}

json four_knowns(double p2, double t2, double u_t) {
  json c = json::parse(R"({"machine": "compressor", "fluid": {"model": "constant-cp", "cp": 1005, "k": 1.4},
      "inlet": {"pressure": {"value": 100000, "uncertainty": "0.1 %"}},
      "outlet": {"pressure": {"uncertainty": "0.1 %"}}})");
  c["inlet"]["temperature"] = {{"value", 293.15}, {"uncertainty", u_t}};
  c["outlet"]["pressure"]["value"] = p2;
  c["outlet"]["temperature"] = {{"value", t2}, {"uncertainty", u_t}};
  return c;
}

}  // namespace

TEST_CASE("first order against Monte Carlo (JCGM 101:2008): agreement where the model is near linear") {
  // Pressure ratio 4, eta_s = 0.8: T2 = T1 (1 + (4^(2/7) - 1)/0.8).
  const double t2 = 293.15 * (1 + (std::pow(4.0, kE) - 1) / 0.8);
  const Rated r = rate_with_uncertainty(four_knowns(400000, t2, 0.5));
  const double u = *r.uncertainty.of("efficiency.isentropic");
  const MonteCarlo mc = monte_carlo(io::to_rating_input(r.input), {1e5, 293.15, 4e5, t2}, {100, 0.5, 400, 0.5}, 100000);
  CHECK(mc.refused == 0);
  // 2 sigma of 10^5 draws is known to about 0.3 % (its relative standard error is 1/sqrt(2N)).
  CHECK(mc.two_sigma() == Approx(u).epsilon(0.02));
  // The central 95 % of the draws spans +-1.96 sigma = +-0.98 U about the value (k = 2 is
  // 95.45 % of a normal distribution), within 2 % on either side: the quantiles of 10^5
  // draws are known to about 0.5 %.
  CHECK(mc.quantile(0.975) - 0.8 == Approx(0.98 * u).epsilon(0.02));
  CHECK(0.8 - mc.quantile(0.025) == Approx(0.98 * u).epsilon(0.02));
}

TEST_CASE("first order against Monte Carlo: a pressure ratio of 1.05, where it does not hold") {
  // A 5 % pressure rise heats the gas by 5.1 K: the efficiency is a ratio of small
  // differences, 1/(T2 - T1) is curved over +-0.5 K, and the draws' distribution is skewed.
  // The first-order U still matches their standard deviation, but the 95 % interval is not
  // +-U: it reaches further up than U and less far down, and some draws imply an
  // efficiency above 1, which the model refuses (docs/uncertainty.md shows the figures).
  const double t2 = 293.15 * (1 + (std::pow(1.05, kE) - 1) / 0.8);
  const Rated r = rate_with_uncertainty(four_knowns(105000, t2, 0.5));
  const double u = *r.uncertainty.of("efficiency.isentropic");
  CHECK(u == Approx(0.113).epsilon(0.01));  // a tenth of the efficiency, from 0.5 K thermometers
  const MonteCarlo mc =
      monte_carlo(io::to_rating_input(r.input), {1e5, 293.15, 1.05e5, t2}, {100, 0.5, 105, 0.5}, 100000);
  CHECK(mc.two_sigma() == Approx(u).epsilon(0.03));
  // Where a normal distribution would put 0.98 U on either side, the draws reach 1.11 U
  // up and 0.86 U down (this generator and seed).
  CHECK((mc.quantile(0.975) - 0.8) / u > 1.08);
  CHECK((0.8 - mc.quantile(0.025)) / u < 0.90);
  CHECK(mc.refused > 50);  // 230 of 10^5 with this generator and seed
}

TEST_CASE("a step the model refuses leaves a one-sided difference, with a warning") {
  // A saturated-vapour exhaust (quality 1): the quality cannot be raised.
  const Rated r = rate_with_uncertainty(json::parse(R"({"machine": "turbine", "fluid": "water",
      "inlet": {"pressure": "10 bar", "temperature": "250 degC"},
      "outlet": {"pressure": "1 bar", "quality": {"value": 1, "uncertainty": 0.01}},
      "mass_flow": "2 kg/s"})"));
  REQUIRE(r.uncertainty.warnings.size() == 1);
  CHECK(r.uncertainty.warnings[0].rfind("uncertainty: the case cannot be rated with outlet.quality raised by 0.001 (",
                                        0) == 0);
  CHECK(r.uncertainty.warnings[0].find("): a one-sided difference was used") != std::string::npos);
  const std::optional<double> u = r.uncertainty.of("efficiency.isentropic");
  REQUIRE(u);
  CHECK(std::isfinite(*u));
  CHECK(*u > 0);
}

TEST_CASE("bad uncertainties are refused with the key and the problem") {
  const auto error_of_case = [](const std::string& text) {
    io::FluidFactory fluids;
    return io::rate_case(json::parse(text), 0, fluids).error;
  };
  const std::string head = R"({"machine": "compressor", "fluid": "air",
      "inlet": {"pressure": "1 bar", "temperature": "20 degC"}, "outlet": {"pressure": "3 bar", )";
  CHECK(error_of_case(head + R"("temperature": {"value": "150 degC", "uncertainty": "0.3 kPa"}}})") ==
        "outlet.temperature.uncertainty: \"0.3 kPa\": a pressure unit where a temperature belongs");
  CHECK(error_of_case(head + R"("temperature": {"value": "150 degC", "uncertainty": "-0.3 K"}}})") ==
        "outlet.temperature.uncertainty: \"-0.3 K\": an uncertainty cannot be negative");
  CHECK(error_of_case(head + R"("temperature": {"value": "150 degC", "uncertainty": -0.3}}})") ==
        "outlet.temperature.uncertainty: -0.3: an uncertainty cannot be negative");
  CHECK(error_of_case(head + R"("temperature": {"value": "150 degC", "uncertainty": "0.3"}}})") ==
        "outlet.temperature.uncertainty: \"0.3\": a temperature uncertainty needs its unit, as in \"0.3 K\", or "
        "\"%\" of the reading");
  CHECK(error_of_case(head + R"("temperature": {"value": "150 degC", "uncertainty": "about 1 K"}}})") ==
        "outlet.temperature.uncertainty: \"about 1 K\" is not an uncertainty: write \"<number> %\" (of the reading) "
        "or \"<number> <unit>\"");
  CHECK(error_of_case(head + R"("temperature": {"value": "150 degC", "uncertanty": "1 K"}}})") ==
        "outlet.temperature: unknown key \"uncertanty\" in a measured value; give \"value\" and \"uncertainty\"");
  CHECK(error_of_case(head + R"("temperature": {"uncertainty": "1 K"}}})") ==
        "outlet.temperature: a measured value needs \"value\", as in { \"value\": \"2.10 barg\", \"uncertainty\": "
        "\"0.25 %\" }");
  // A solved quantity has no reading to state an uncertainty for.
  CHECK(error_of_case(head + R"("temperature": "150 degC"}, "uncertainty": {"power": "1.5 %"}})") ==
        "uncertainty.power: the case does not give power, so there is no reading to state an uncertainty for; a "
        "solved value's uncertainty follows from those of the given values");
  CHECK(error_of_case(head + R"("temperature": "150 degC"}, "uncertainty": {"outlet.temp": "1 K"}})")
            .rfind("uncertainty.outlet.temp: \"outlet.temp\" is no case value; the keys are inlet.pressure, ", 0) == 0);
  CHECK(error_of_case(head + R"("temperature": "150 degC"}, "uncertainty": ["1 K"]})") ==
        "uncertainty: expected an object of dotted keys, such as { \"outlet.temperature\": \"0.3 K\" }, got array");
  // A file's bad statement makes the whole file unusable: every case would carry it.
  io::FluidFactory fluids;
  const Error e = test::error_of([&] {
    io::rate_document(json::parse(R"({"uncertainty": {"power": "1.5 kW/s"}, "cases": [{}]})"), "f.json", fluids);
  });
  CHECK(std::string(e.what()) ==
        "f.json: uncertainty.power: \"1.5 kW/s\": unknown unit \"kW/s\" for a power; known units: W, kW, MW, hp, "
        "Btu/h");
}

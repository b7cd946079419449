// NasaPolynomialGas to the last bits: the state calls against the same folded polynomial
// evaluated in long double (64-bit significand on x86-64), and the logarithms the inverse
// solves build from a nearby one (MixtureCell::log_of, log_near) against logl.
#include <cmath>
#include <string>
#include <utility>
#include <vector>

#include <catch2/catch.hpp>

#include "fluids/ideal_gas_mixture_data.hpp"  // internal: the folded pieces and the grid
#include "shaftwork/fluids/ideal_gas_mixture.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

using shaftwork::fluids::Component;
using shaftwork::fluids::CompositionBasis;
using shaftwork::fluids::NasaPolynomialGas;
using shaftwork::fluids::SpeciesLibrary;
using shaftwork::fluids::State;
using shaftwork::fluids::detail::IdealGasMixtureData;
using shaftwork::fluids::detail::LogAnchor;
using shaftwork::fluids::detail::MixturePiece;

namespace {

NasaPolynomialGas gas_of(const std::vector<std::pair<std::string, double>>& fractions) {
  std::vector<Component> components;
  for (const auto& [name, fraction] : fractions) {
    const auto* sp = SpeciesLibrary::built_in().find(name);
    REQUIRE(sp != nullptr);
    components.push_back({sp, fraction});
  }
  return NasaPolynomialGas(components, CompositionBasis::mole);
}

// The gases of the sweep (mole fractions): NASA air (the database's "Air" record), the
// natural gas of bench/bench_properties.cpp, and invented lean combustion products.
std::vector<std::pair<std::string, NasaPolynomialGas>> gases() {
  std::vector<std::pair<std::string, NasaPolynomialGas>> g;
  g.emplace_back("air", gas_of({{"N2", 0.78084}, {"O2", 0.209476}, {"Ar", 0.009365}, {"CO2", 0.000319}}));
  g.emplace_back("natural gas", gas_of({{"CH4", 0.90},
                                        {"C2H6", 0.05},
                                        {"C3H8", 0.02},
                                        {"n-C4H10", 0.005},
                                        {"N2", 0.015},
                                        {"CO2", 0.01}}));
  g.emplace_back("combustion products",
                 gas_of({{"N2", 0.7450}, {"O2", 0.1200}, {"CO2", 0.0450}, {"H2O", 0.0810}, {"Ar", 0.0090}}));
  return g;
}

// cp°/R, H°/R and S°/R of one folded piece in long double, in the plain form of
// NASA/TP-2002-211556, eqs. 2-4 (the model evaluates a pre-scaled Horner form).
struct Reference {
  long double cp_r, h_r, s_r;
};

Reference reference(const MixturePiece& q, long double T) {
  long double c[7];
  for (int k = 0; k < 7; ++k) c[k] = q.c[static_cast<std::size_t>(k)];
  const long double ln_t = std::log(T);
  const long double T2 = T * T, T3 = T2 * T, T4 = T3 * T, T5 = T4 * T;
  Reference r;
  r.cp_r = c[0] / T2 + c[1] / T + c[2] + c[3] * T + c[4] * T2 + c[5] * T3 + c[6] * T4;
  r.h_r = -c[0] / T + c[1] * ln_t + c[2] * T + c[3] * T2 / 2 + c[4] * T3 / 3 + c[5] * T4 / 4 + c[6] * T5 / 5 +
          static_cast<long double>(q.b1);
  r.s_r = -c[0] / (2 * T2) - c[1] / T + c[2] * ln_t + c[3] * T + c[4] * T2 / 2 + c[5] * T3 / 3 + c[6] * T4 / 4 +
          static_cast<long double>(q.b2);
  return r;
}

// An error in units of the last bit of `value` (the spacing of doubles there).
double last_bits(long double error, long double value) {
  const double v = std::fabs(static_cast<double>(value));
  return static_cast<double>(std::fabs(error)) / (std::nextafter(v, INFINITY) - v);
}

}  // namespace

TEST_CASE("NASA states from (p, T) and (p, s) agree with the long-double polynomial to 1e-13") {
  // Pressures from 1 kPa to 1000 bar (an ideal gas has no limit of its own), 3000
  // temperatures spread evenly in ln T over each gas's whole range.
  const std::vector<double> pressures{1e3, 5e4, 1e5, 1.0991e5, 7.3e5, 3e6, 1e8};
  for (const auto& [name, gas] : gases()) {
    const IdealGasMixtureData& d = gas.ideal_gas().data();
    const long double R = d.gas_constant;
    const double t_low = d.range.low;
    const double t_high = d.range.high;
    double worst_state = 0;
    double worst_t = 0;
    double worst_round_trip = 0;
    for (double p : pressures) {
      const long double log_p = std::log(static_cast<long double>(p) / 1e5L);
      for (int i = 0; i <= 3000; ++i) {
        const double T = std::min(t_high, t_low * std::pow(t_high / t_low, i / 3000.0));
        // A state and the reference at the same T; scales are the magnitudes the state
        // is summed from (h crosses zero near 298 K, s at some pressure).
        const auto check_state = [&](const State& st, long double t) {
          const Reference r = reference(d.piece_at(static_cast<double>(t)), t);
          const long double h = R * r.h_r;
          const long double s = R * (r.s_r - log_p);
          const long double cp = R * r.cp_r;
          const double eh = static_cast<double>(std::fabs(st.enthalpy - h) / (std::fabs(h) + cp * t));
          const long double s_scale = R * (std::fabs(r.s_r) + std::fabs(log_p));
          const double es = static_cast<double>(std::fabs(st.entropy - s) / s_scale);
          const double ecp = static_cast<double>(std::fabs(st.cp - cp) / cp);
          worst_state = std::max({worst_state, eh, es, ecp});
        };
        const State at_t = gas.from_pt(p, T);
        check_state(at_t, T);
        // The root of s(T) = s given, by one Newton step in long double from T (where the
        // reference's s is within 1e-15 of it), and the state from_ps finds.
        const State back = gas.from_ps(p, at_t.entropy);
        const Reference r = reference(d.piece_at(T), T);
        const long double t_root = T + (at_t.entropy / R + log_p - r.s_r) * T / r.cp_r;
        worst_t = std::max(worst_t, static_cast<double>(std::fabs(back.temperature - t_root) / t_root));
        check_state(back, back.temperature);
        worst_round_trip = std::max(worst_round_trip, std::fabs(back.temperature - T) / T);
      }
    }
    INFO(name << ": worst state " << worst_state << ", T(p, s) " << worst_t << ", round trip " << worst_round_trip);
    CHECK(worst_state <= 1e-13);
    CHECK(worst_t <= 1e-13);
    CHECK(worst_round_trip <= 1e-12);
  }
}

TEST_CASE("the inverse solves' logarithms are as close to logl as std::log's, or one rounding more") {
  for (const auto& [name, gas] : gases()) {
    const IdealGasMixtureData& d = gas.ideal_gas().data();
    double worst_cell = 0;
    double worst_near = 0;
    for (const auto& cell : d.cells) {
      for (int i = 0; i <= 200; ++i) {
        // Across the cell and 0.5 % beyond each end (a Hermite guess may stray that far).
        const double T = (cell.t0 * 0.995) + (cell.t1 * 1.005 - cell.t0 * 0.995) * i / 200.0;
        const long double exact = std::log(static_cast<long double>(T));
        const double from_cell = cell.log_of(T);
        worst_cell = std::max(worst_cell, last_bits(from_cell - exact, exact));
        // Newton's steps from it: up to 1e-5 relative away, where the series still serves.
        LogAnchor anchor{T, 1.0 / T, from_cell};
        for (double u : {1e-16, -3e-12, 1e-8, -2e-7, 9.9e-6, -9.9e-6}) {
          const double next = T * (1 + u);
          const long double exact_next = std::log(static_cast<long double>(next));
          const double near = shaftwork::fluids::detail::log_near(next, anchor);
          worst_near = std::max(worst_near, last_bits(near - exact_next, exact_next));
          REQUIRE(anchor.t == T);  // the series served: no new anchor
        }
      }
    }
    INFO(name << ": worst cell series " << worst_cell << " of a last bit, from an anchor " << worst_near);
    CHECK(worst_cell <= 0.51);  // one rounding and 1 % of a bit (glibc promises log within 0.52)
    CHECK(worst_near <= 1.01);   // the anchor's rounding and one more
  }
  SECTION("beyond the series' limits, std::log and a new anchor") {
    const auto all = gases();
    const IdealGasMixtureData& d = all.front().second.ideal_gas().data();
    const auto& cell = d.cells.front();
    CHECK(cell.log_of(cell.t1 * 1.03) == std::log(cell.t1 * 1.03));
    LogAnchor anchor{300.0, 1.0 / 300.0, std::log(300.0)};
    CHECK(shaftwork::fluids::detail::log_near(300.01, anchor) == std::log(300.01));
    CHECK(anchor.t == 300.01);
  }
}

TEST_CASE("the inverse solves' curvature bounds hold over the whole range") {
  // Newton's iteration ends one evaluation early on these bounds (numerics::RootOptions::
  // curvature): they must hold between the points they were sampled at too. Checked here at
  // 200 points a cell, f''/(2 f') from a long-double difference of cp°/R.
  for (const auto& [name, gas] : gases()) {
    INFO(name);
    const IdealGasMixtureData& d = gas.ideal_gas().data();
    double worst_s = 0, worst_h = 0;
    for (const auto& cell : d.cells) {
      const MixturePiece& q = d.piece_at(0.5 * (cell.t0 + cell.t1));
      for (int i = 0; i <= 200; ++i) {
        const long double T = cell.t0 + (cell.t1 - cell.t0) * i / 200.0L;
        const long double dt = T * 1e-7L;
        const long double cp = reference(q, T).cp_r;
        const long double slope = (reference(q, T + dt).cp_r - reference(q, T - dt).cp_r) / (2 * dt);
        worst_s = std::max(worst_s, static_cast<double>(0.5L * std::fabs(slope / cp - 1 / T)));
        worst_h = std::max(worst_h, static_cast<double>(0.5L * std::fabs(slope / cp)));
      }
    }
    CHECK(worst_s > 0);
    CHECK(d.curvature_s >= worst_s);
    CHECK(d.curvature_h >= worst_h);
    CHECK(d.curvature_s <= 4 * worst_s);  // a bound, not a number too large to help
  }
}

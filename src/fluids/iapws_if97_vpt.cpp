// SR5-05: specific volume v(p,T) in region 3 from 26 subregion equations, the starting
// value for the density that fluids::IapwsIf97 then refines on IF97's Eq. 28.
#include <cmath>
#include <cstddef>

#include <fmt/format.h>

#include "iapws_if97_coefficients.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/iapws_if97_equations.hpp"

namespace shaftwork::fluids::if97 {
namespace {

namespace coef = coefficients;
using coef::Term;

struct TermSpan {
  const Term* terms;
  std::size_t count;
};

template <std::size_t N>
constexpr TermSpan span_of(const Term (&t)[N]) {
  return {t, N};
}

constexpr TermSpan kVptTerms[26] = {
    span_of(coef::kVpt3a), span_of(coef::kVpt3b), span_of(coef::kVpt3c), span_of(coef::kVpt3d),
    span_of(coef::kVpt3e), span_of(coef::kVpt3f), span_of(coef::kVpt3g), span_of(coef::kVpt3h),
    span_of(coef::kVpt3i), span_of(coef::kVpt3j), span_of(coef::kVpt3k), span_of(coef::kVpt3l),
    span_of(coef::kVpt3m), span_of(coef::kVpt3n), span_of(coef::kVpt3o), span_of(coef::kVpt3p),
    span_of(coef::kVpt3q), span_of(coef::kVpt3r), span_of(coef::kVpt3s), span_of(coef::kVpt3t),
    span_of(coef::kVpt3u), span_of(coef::kVpt3v), span_of(coef::kVpt3w), span_of(coef::kVpt3x),
    span_of(coef::kVpt3y), span_of(coef::kVpt3z)};

// Every exponent of the 26 tables lies in [-12, 36].
constexpr int kLow = -12;
constexpr int kHigh = 36;

class RuntimePowers {
 public:
  explicit RuntimePowers(double x) {
    v_[-kLow] = 1.0;
    for (int k = 1; k <= kHigh; ++k) v_[k - kLow] = v_[k - 1 - kLow] * x;
    const double inverse = 1.0 / x;
    for (int k = -1; k >= kLow; --k) v_[k - kLow] = v_[k + 1 - kLow] * inverse;
  }
  double operator[](int k) const { return v_[k - kLow]; }

 private:
  double v_[kHigh - kLow + 1];
};

// sum n_i pi^I_i, I_i = 0, 1, 2, ...
template <std::size_t N>
double polynomial(const double (&n)[N], double pi) {
  double sum = 0;
  for (std::size_t i = N; i-- > 0;) sum = sum * pi + n[i];
  return sum;
}

// n1 + n2 ln(pi) + n3 ln(pi)^2 + n4/ln(pi) + n5/ln(pi)^2 (I = 0, 1, 2, -1, -2).
double log_form(const double (&n)[5], double pi) {
  const double L = std::log(pi);
  return n[0] + L * (n[1] + L * n[2]) + (n[3] + n[4] / L) / L;
}

// Pressures that split SR5-05 Table 2 (MPa).
constexpr double kP3cd = 19.00881189173929;  // where T3cd meets the saturation line
constexpr double kP3uSat = 21.93161551;      // SR5-05 Table 10: saturated liquid leaves 3u
constexpr double kP3xSat = 21.90096265;      // SR5-05 Table 10: saturated vapour leaves 3x

double t3(Boundary3 b, double pi) { return region3_boundary_temperature(b, pi * 1e6); }

// SR5-05 Table 10: the auxiliary subregions 3u-3z near the critical point, for
// psat(643.15 K) < p <= 22.5 MPa and T3qu(p) < T <= T3rx(p).
char auxiliary_subregion(double pi, double T, Side side) {
  if (pi > 22.11) {
    if (T <= t3(Boundary3::uv, pi)) return 'u';
    if (T <= t3(Boundary3::ef, pi)) return 'v';
    if (T <= t3(Boundary3::wx, pi)) return 'w';
    return 'x';
  }
  if (pi > 22.064) {
    if (T <= t3(Boundary3::uv, pi)) return 'u';
    if (T <= t3(Boundary3::ef, pi)) return 'y';
    if (T <= t3(Boundary3::wx, pi)) return 'z';
    return 'x';
  }
  bool liquid = side == Side::liquid;
  if (side == Side::by_temperature) liquid = T <= saturation_temperature(pi * 1e6);
  if (liquid) {
    if (pi <= kP3uSat) return 'u';
    return T <= t3(Boundary3::uv, pi) ? 'u' : 'y';
  }
  if (pi <= kP3xSat) return 'x';
  return T <= t3(Boundary3::wx, pi) ? 'z' : 'x';
}

}  // namespace

double region3_boundary_temperature(Boundary3 boundary, double p) {
  const double pi = p / 1e6;
  switch (boundary) {
    case Boundary3::ab: return log_form(coef::kT3ab, pi);
    case Boundary3::cd: return polynomial(coef::kT3cd, pi);
    case Boundary3::ef: return 3.727888004 * (pi - 22.064) + 647.096;  // SR5-05 Eq. 3
    case Boundary3::gh: return polynomial(coef::kT3gh, pi);
    case Boundary3::ij: return polynomial(coef::kT3ij, pi);
    case Boundary3::jk: return polynomial(coef::kT3jk, pi);
    case Boundary3::mn: return polynomial(coef::kT3mn, pi);
    case Boundary3::op: return log_form(coef::kT3op, pi);
    case Boundary3::qu: return polynomial(coef::kT3qu, pi);
    case Boundary3::rx: return polynomial(coef::kT3rx, pi);
    case Boundary3::uv: return polynomial(coef::kT3uv, pi);
    case Boundary3::wx: return log_form(coef::kT3wx, pi);
  }
  return 0;  // not reached: every enumerator is handled above
}

// SR5-05 Table 2 (and Table 10 through auxiliary_subregion).
char region3_subregion_pt(double p, double T, Side side) {
  const double pi = p / 1e6;
  auto below = [&](Boundary3 b) { return T <= t3(b, pi); };
  auto liquid_side = [&] {
    if (side == Side::by_temperature) return T <= saturation_temperature(p);
    return side == Side::liquid;
  };
  if (pi > 40.0) return below(Boundary3::ab) ? 'a' : 'b';
  if (pi > 25.0) {
    if (below(Boundary3::cd)) return 'c';
    if (below(Boundary3::ab)) return 'd';
    if (below(Boundary3::ef)) return 'e';
    return 'f';
  }
  if (pi > 23.5) {
    if (below(Boundary3::cd)) return 'c';
    if (below(Boundary3::gh)) return 'g';
    if (below(Boundary3::ef)) return 'h';
    if (below(Boundary3::ij)) return 'i';
    if (below(Boundary3::jk)) return 'j';
    return 'k';
  }
  if (pi > 23.0) {
    if (below(Boundary3::cd)) return 'c';
    if (below(Boundary3::gh)) return 'l';
    if (below(Boundary3::ef)) return 'h';
    if (below(Boundary3::ij)) return 'i';
    if (below(Boundary3::jk)) return 'j';
    return 'k';
  }
  if (pi > 22.5) {
    if (below(Boundary3::cd)) return 'c';
    if (below(Boundary3::gh)) return 'l';
    if (below(Boundary3::mn)) return 'm';
    if (below(Boundary3::ef)) return 'n';
    if (below(Boundary3::op)) return 'o';
    if (below(Boundary3::ij)) return 'p';
    if (below(Boundary3::jk)) return 'j';
    return 'k';
  }
  static const double psat643 = saturation_pressure(643.15) / 1e6;
  if (pi > psat643) {
    if (below(Boundary3::cd)) return 'c';
    if (below(Boundary3::qu)) return 'q';
    if (below(Boundary3::rx)) return auxiliary_subregion(pi, T, side);
    if (below(Boundary3::jk)) return 'r';
    return 'k';
  }
  if (pi > 20.5) {
    if (below(Boundary3::cd)) return 'c';
    if (liquid_side()) return 's';
    if (below(Boundary3::jk)) return 'r';
    return 'k';
  }
  if (pi > kP3cd) {
    if (below(Boundary3::cd)) return 'c';
    return liquid_side() ? 's' : 't';
  }
  return liquid_side() ? 'c' : 't';
}

// SR5-05 Eq. 4: v/v* = [sum n_i ((pi - a)^c)^I_i ((theta - b)^d)^J_i]^e, and Eq. 5 for 3n:
// v/v* = exp[sum n_i (pi - a)^I_i (theta - b)^J_i], pi = p/p*, theta = T/T* (Table 4).
double region3_v_pt_in(char subregion, double p, double T) {
  if (subregion < 'a' || subregion > 'z') {
    throw Error(ErrorKind::bad_input,
                fmt::format("iapws-if97: SR5-05 has subregions 3a to 3z, not 3{}", subregion));
  }
  const auto k = static_cast<std::size_t>(subregion - 'a');
  const coef::VptReducing& r = coef::kVptReducing[k];
  double x = p / 1e6 / r.p_star - r.a;
  double y = T / r.T_star - r.b;
  if (r.c == 0.5) x = std::sqrt(x);
  if (r.d == 0.25) y = std::sqrt(std::sqrt(y));
  const RuntimePowers px(x);
  const RuntimePowers py(y);
  double sum = 0;
  const TermSpan span = kVptTerms[k];
  for (std::size_t i = 0; i < span.count; ++i) {
    const Term& t = span.terms[i];
    sum += t.n * px[t.i] * py[t.j];
  }
  if (r.e == 0) return r.v_star * std::exp(sum);
  if (r.e == 4) {
    const double squared = sum * sum;
    return r.v_star * squared * squared;
  }
  return r.v_star * sum;
}

double region3_v_pt(double p, double T, Side side) {
  return region3_v_pt_in(region3_subregion_pt(p, T, side), p, T);
}

}  // namespace shaftwork::fluids::if97

// Sums of the form sum n_i x^I_i y^J_i over an IF97 coefficient table (internal).
//
// The hot loops of the IF97 model evaluate such sums with up to 46 terms and exponents up
// to 58. Rather than calling std::pow per term, every integer power of x and y in the
// table's exponent range is built once by multiplication (negative powers from 1/x), and
// each term is then two table look-ups and three multiplications. The exponent ranges are
// taken from the constexpr tables at compile time, so the power tables live on the stack.
#pragma once

#include <algorithm>
#include <cstddef>

#include "iapws_if97_coefficients.hpp"

namespace shaftwork::fluids::if97::detail {

using coefficients::Term;

struct ExponentRange {
  int i_low;
  int i_high;
  int j_low;
  int j_high;
};

template <std::size_t N>
constexpr ExponentRange exponent_range(const Term (&terms)[N]) {
  ExponentRange r{terms[0].i, terms[0].i, terms[0].j, terms[0].j};
  for (const Term& t : terms) {
    r.i_low = std::min(r.i_low, t.i);
    r.i_high = std::max(r.i_high, t.i);
    r.j_low = std::min(r.j_low, t.j);
    r.j_high = std::max(r.j_high, t.j);
  }
  return r;
}

// x^k for every integer k in [Low, High] (Low <= 0 <= High). x must be non-zero when Low < 0.
template <int Low, int High>
class Powers {
  static_assert(Low <= 0 && High >= 0, "the range must hold the exponent 0");

 public:
  // x^k = x^(k/2) * x^(k - k/2): every power is two earlier ones multiplied, so the chain
  // of dependent multiplications is log2(High) long rather than High, and the processor
  // overlaps the rest.
  explicit Powers(double x) {
    v_[-Low] = 1.0;
    if constexpr (High >= 1) v_[1 - Low] = x;
    for (int k = 2; k <= High; ++k) v_[k - Low] = v_[k / 2 - Low] * v_[k - k / 2 - Low];
    if constexpr (Low < 0) {
      v_[-1 - Low] = 1.0 / x;
      for (int k = -2; k >= Low; --k) v_[k - Low] = v_[k / 2 - Low] * v_[k - k / 2 - Low];
    }
  }
  double operator[](int k) const { return v_[k - Low]; }

 private:
  double v_[High - Low + 1];
};

// Powers of x over exactly the range of I (or J) in a table, widened to hold 0.
template <int Low, int High>
using PowersFor = Powers<(Low < 0 ? Low : 0), (High > 0 ? High : 0)>;

// sum n_i x^I_i y^J_i.
template <std::size_t N, class PX, class PY>
double sum_terms(const Term (&terms)[N], const PX& px, const PY& py) {
  double sum = 0;
  for (const Term& t : terms) sum += t.n * px[t.i] * py[t.j];
  return sum;
}

// The sum and the sums weighted by I, I(I-1), J, J(J-1) and I*J, from which a caller forms
// the first and second derivatives of a fundamental equation without another pass.
struct WeightedSums {
  double s = 0;    // sum t_i            with t_i = n_i x^I_i y^J_i
  double si = 0;   // sum I_i t_i
  double sii = 0;  // sum I_i (I_i - 1) t_i
  double sj = 0;   // sum J_i t_i
  double sjj = 0;  // sum J_i (J_i - 1) t_i
  double sij = 0;  // sum I_i J_i t_i
};

namespace weighted {

inline void add(WeightedSums& w, const Term& t, double term) {
  const auto i = static_cast<double>(t.i);
  const auto j = static_cast<double>(t.j);
  w.s += term;
  w.si += i * term;
  w.sii += i * (i - 1.0) * term;
  w.sj += j * term;
  w.sjj += j * (j - 1.0) * term;
  w.sij += i * j * term;
}

}  // namespace weighted

// Even and odd terms go to separate accumulators, which halves the chains of dependent
// additions (the loop is bound by their latency, not by arithmetic).
template <std::size_t N, class PX, class PY>
WeightedSums weighted_sums(const Term (&terms)[N], const PX& px, const PY& py) {
  WeightedSums even;
  WeightedSums odd;
  std::size_t k = 0;
  for (; k + 1 < N; k += 2) {
    weighted::add(even, terms[k], terms[k].n * px[terms[k].i] * py[terms[k].j]);
    weighted::add(odd, terms[k + 1], terms[k + 1].n * px[terms[k + 1].i] * py[terms[k + 1].j]);
  }
  if (k < N) weighted::add(even, terms[k], terms[k].n * px[terms[k].i] * py[terms[k].j]);
  return {even.s + odd.s,   even.si + odd.si,   even.sii + odd.sii,
          even.sj + odd.sj, even.sjj + odd.sjj, even.sij + odd.sij};
}

// The powers of x over the I range (or y over the J range) of `Table`, e.g.
//   const auto pi_powers = powers_i<coefficients::kRegion1>(7.1 - pi);
template <const auto& Table>
auto powers_i(double x) {
  constexpr ExponentRange r = exponent_range(Table);
  return PowersFor<r.i_low, r.i_high>(x);
}
template <const auto& Table>
auto powers_j(double y) {
  constexpr ExponentRange r = exponent_range(Table);
  return PowersFor<r.j_low, r.j_high>(y);
}

}  // namespace shaftwork::fluids::if97::detail

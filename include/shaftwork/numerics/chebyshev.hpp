// shaftwork/numerics/chebyshev.hpp — polynomial interpolation and integration on the
// Chebyshev–Lobatto points of an interval.
//
// On t in [0, 1] the N + 1 points are t_k = (1 - cos(k pi / N)) / 2, k = 0..N, so that
// t_0 = 0 and t_N = 1. Through values f_k there passes one polynomial of degree N,
//   p(t) = sum_m a_m T_m(2t - 1),
//   a_m = (2 / N) sum''_k f_k T_m(u_k)    (u_k = 2 t_k - 1; '' halves the k = 0 and k = N
//                                          terms, and a_0 and a_N are halved as well),
// and its integral from 0 follows from the Chebyshev antiderivative
//   int T_m = T_{m+1} / (2 (m + 1)) - T_{m-1} / (2 (m - 1))   (m >= 2),
//   int T_0 = T_1,  int T_1 = T_2 / 4
// (Trefethen, Approximation Theory and Approximation Practice, SIAM 2013, chapters 2, 3
// and 19; Clenshaw and Curtis, Numer. Math. 2 (1960) 197). For a function analytic near
// the interval the error falls geometrically with N, and the last coefficients a_{N-1},
// a_N tell how far it has fallen.
//
// The tables are built once, in the constructor; the calls allocate nothing.
#pragma once

#include <array>
#include <cmath>
#include <numbers>

namespace shaftwork::numerics {

template <int N>
class ChebyshevLobatto {
  static_assert(N >= 2, "a Chebyshev–Lobatto rule needs at least three points");

 public:
  static constexpr int kPoints = N + 1;
  using Values = std::array<double, kPoints>;

  ChebyshevLobatto();

  // t_k on [0, 1].
  double node(int k) const { return node_[static_cast<std::size_t>(k)]; }
  // W(k, j): the integral from 0 to t_k of the interpolant through values f is
  // sum_j W(k, j) f_j.
  double integral_weight(int k, int j) const {
    return integral_[static_cast<std::size_t>(k)][static_cast<std::size_t>(j)];
  }
  // Chebyshev coefficients a_0..a_N of the interpolant through `values`.
  Values coefficients(const Values& values) const;
  // The interpolant at any t (outside [0, 1] it extrapolates), by Clenshaw's recurrence.
  double interpolate(const Values& values, double t) const { return evaluate(coefficients(values), t); }
  static double evaluate(const Values& coefficients, double t);

 private:
  Values node_{};
  std::array<Values, kPoints> transform_{};  // coefficients = transform_ * values
  std::array<Values, kPoints> integral_{};
};

template <int N>
ChebyshevLobatto<N>::ChebyshevLobatto() {
  const double pi = std::numbers::pi;
  for (int k = 0; k <= N; ++k) node_[static_cast<std::size_t>(k)] = 0.5 * (1.0 - std::cos(k * pi / N));
  // u_k = 2 t_k - 1 = cos(pi - k pi / N), so T_m(u_k) = cos(m (pi - k pi / N)).
  for (int m = 0; m <= N; ++m) {
    for (int k = 0; k <= N; ++k) {
      double w = 2.0 / N * std::cos(m * (pi - k * pi / N));
      if (k == 0 || k == N) w *= 0.5;
      if (m == 0 || m == N) w *= 0.5;
      transform_[static_cast<std::size_t>(m)][static_cast<std::size_t>(k)] = w;
    }
  }
  // The integral of each Lagrange basis polynomial from 0 to every node.
  for (int j = 0; j <= N; ++j) {
    Values unit{};
    unit[static_cast<std::size_t>(j)] = 1.0;
    const Values a = coefficients(unit);
    std::array<double, N + 2> b{};  // antiderivative in u, coefficients of T_0..T_{N+1}
    auto at = [&](int m) { return m <= N ? a[static_cast<std::size_t>(m)] : 0.0; };
    b[1] = at(0) - 0.5 * at(2);
    for (int m = 2; m <= N + 1; ++m) b[static_cast<std::size_t>(m)] = (at(m - 1) - at(m + 1)) / (2.0 * m);
    double at_minus_one = 0;  // sum_m b_m T_m(-1) = sum_m b_m (-1)^m, so that F(-1) = 0
    for (int m = 1; m <= N + 1; ++m) at_minus_one += (m % 2 ? -1.0 : 1.0) * b[static_cast<std::size_t>(m)];
    b[0] = -at_minus_one;
    for (int k = 0; k <= N; ++k) {
      const double u = 2.0 * node_[static_cast<std::size_t>(k)] - 1.0;
      // Clenshaw over b; dt = du / 2.
      double b1 = 0, b2 = 0;
      for (int m = N + 1; m >= 1; --m) {
        const double next = 2.0 * u * b1 - b2 + b[static_cast<std::size_t>(m)];
        b2 = b1;
        b1 = next;
      }
      integral_[static_cast<std::size_t>(k)][static_cast<std::size_t>(j)] = 0.5 * (u * b1 - b2 + b[0]);
    }
  }
}

template <int N>
typename ChebyshevLobatto<N>::Values ChebyshevLobatto<N>::coefficients(const Values& values) const {
  Values a{};
  for (std::size_t m = 0; m < kPoints; ++m) {
    double sum = 0;
    for (std::size_t k = 0; k < kPoints; ++k) sum += transform_[m][k] * values[k];
    a[m] = sum;
  }
  return a;
}

template <int N>
double ChebyshevLobatto<N>::evaluate(const Values& coefficients, double t) {
  const double u = 2.0 * t - 1.0;
  double b1 = 0, b2 = 0;
  for (int m = N; m >= 1; --m) {
    const double next = 2.0 * u * b1 - b2 + coefficients[static_cast<std::size_t>(m)];
    b2 = b1;
    b1 = next;
  }
  return u * b1 - b2 + coefficients[0];
}

}  // namespace shaftwork::numerics

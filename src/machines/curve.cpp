#include "curve.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <utility>

#include <fmt/format.h>

#include "problem.hpp"
#include "shaftwork/machines/guarantee.hpp"

namespace shaftwork::machines {

void refuse_beyond_reach(std::span<const double> x, double at, const std::string& what, std::string (*show)(double)) {
  const auto [low, high] = std::minmax_element(x.begin(), x.end());
  const double beyond = at < *low ? (*low - at) / *low : at > *high ? (at - *high) / *high : 0.0;
  if (beyond <= kExtrapolationLimit * (1 + 1e-12)) return;
  const std::string range = x.size() == 1 ? fmt::format("the converted test flow {}", show(*low))
                                          : fmt::format("the converted test flows ({} to {})", show(*low), show(*high));
  refuse(fmt::format("{} {} lies {:.1f} % beyond {}: a curve is read at most {:g} % beyond its test points; test "
                     "nearer the guaranteed flow",
                     what, show(at), 100 * beyond, range, 100 * kExtrapolationLimit));
}

void refuse_coinciding(std::span<const double> x, std::span<const std::string> ids, const std::string& what,
                       std::string (*show)(double)) {
  for (std::size_t i = 1; i < x.size(); ++i) {
    if (x[i] <= x[i - 1] * (1 + 1e-9)) {
      refuse(fmt::format("test points \"{}\" and \"{}\" convert to the same {} ({}): a curve needs distinct flows; "
                         "average the two or keep one",
                         ids[i - 1], ids[i], what, show(x[i])));
    }
  }
}

double read_linear(std::span<const double> x, std::span<const double> y, double at) {
  if (x.size() == 1) return y[0];
  std::size_t i = 1;
  while (i + 1 < x.size() && at > x[i]) ++i;
  const double t = (at - x[i - 1]) / (x[i] - x[i - 1]);
  return y[i - 1] + t * (y[i] - y[i - 1]);
}

std::vector<double> least_squares(std::span<const double> x, std::span<const double> y, int degree) {
  const std::size_t n = static_cast<std::size_t>(degree) + 1;
  double scale = 0;
  for (double xi : x) scale = std::max(scale, std::fabs(xi));
  if (scale == 0) scale = 1;
  // Normal equations A c = b in the scaled variable u = x / scale.
  std::array<std::array<double, 4>, 3> a{};
  for (std::size_t k = 0; k < x.size(); ++k) {
    const double u = x[k] / scale;
    std::array<double, 3> powers = {1.0, u, u * u};
    for (std::size_t r = 0; r < n; ++r) {
      for (std::size_t c = 0; c < n; ++c) a[r][c] += powers[r] * powers[c];
      a[r][3] += powers[r] * y[k];
    }
  }
  for (std::size_t col = 0; col < n; ++col) {
    std::size_t pivot = col;
    for (std::size_t r = col + 1; r < n; ++r) {
      if (std::fabs(a[r][col]) > std::fabs(a[pivot][col])) pivot = r;
    }
    std::swap(a[col], a[pivot]);
    if (a[col][col] == 0) refuse("the test points do not fix a curve: their flows coincide");
    for (std::size_t r = col + 1; r < n; ++r) {
      const double f = a[r][col] / a[col][col];
      for (std::size_t c = col; c < 4; ++c) a[r][c] -= f * a[col][c];
    }
  }
  std::vector<double> c(n);
  for (std::size_t r = n; r-- > 0;) {
    double sum = a[r][3];
    for (std::size_t k = r + 1; k < n; ++k) sum -= a[r][k] * c[k];
    c[r] = sum / a[r][r];
  }
  for (std::size_t r = 1; r < n; ++r) c[r] /= std::pow(scale, static_cast<double>(r));
  return c;
}

double polynomial(std::span<const double> c, double x) {
  double value = 0;
  for (std::size_t r = c.size(); r-- > 0;) value = value * x + c[r];
  return value;
}

std::vector<double> polynomial_roots(std::span<const double> c) {
  const double c0 = c[0], c1 = c.size() > 1 ? c[1] : 0, c2 = c.size() > 2 ? c[2] : 0;
  if (c2 == 0) {
    if (c1 == 0) return {};
    return {-c0 / c1};
  }
  const double disc = c1 * c1 - 4 * c2 * c0;
  if (disc < 0) return {};
  // The form that avoids cancellation (Numerical Recipes, 3rd ed., sec. 5.6).
  const double q = -0.5 * (c1 + std::copysign(std::sqrt(disc), c1));
  std::vector<double> roots = {q / c2};
  if (q != 0) roots.push_back(c0 / q);
  std::sort(roots.begin(), roots.end());
  return roots;
}

std::size_t nearest_index(std::span<const double> x, double at) {
  std::size_t best = 0;
  for (std::size_t i = 1; i < x.size(); ++i) {
    if (std::fabs(x[i] - at) < std::fabs(x[best] - at)) best = i;
  }
  return best;
}

}  // namespace shaftwork::machines

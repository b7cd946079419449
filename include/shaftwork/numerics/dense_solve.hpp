// shaftwork/numerics/dense_solve.hpp — a small dense linear system, fixed size, several
// right-hand sides at once.
//
// Gaussian elimination with partial pivoting (Golub and Van Loan, Matrix Computations,
// 4th ed., algorithm 3.4.1). Meant for the few-by-few systems of a collocation step: no
// allocation, O(n^3) arithmetic.
#pragma once

#include <array>
#include <cmath>
#include <cstddef>
#include <utility>

#include "shaftwork/error.hpp"

namespace shaftwork::numerics {

// Solves A X = B in place: on return `rhs` holds X. `matrix` is destroyed. Throws
// no_convergence (naming `what`) when A is singular to working precision.
template <std::size_t n, std::size_t columns>
void dense_solve(std::array<std::array<double, n>, n>& matrix,
                 std::array<std::array<double, columns>, n>& rhs, const char* what) {
  for (std::size_t k = 0; k < n; ++k) {
    std::size_t pivot = k;
    for (std::size_t i = k + 1; i < n; ++i) {
      if (std::fabs(matrix[i][k]) > std::fabs(matrix[pivot][k])) pivot = i;
    }
    if (!(std::fabs(matrix[pivot][k]) > 0) || !std::isfinite(matrix[pivot][k])) {
      throw Error(ErrorKind::no_convergence, std::string(what) + ": singular linear system");
    }
    if (pivot != k) {
      std::swap(matrix[k], matrix[pivot]);
      std::swap(rhs[k], rhs[pivot]);
    }
    const double inverse = 1.0 / matrix[k][k];
    const double* row_k = matrix[k].data();
    for (std::size_t i = k + 1; i < n; ++i) {
      double* row_i = matrix[i].data();
      const double factor = row_i[k] * inverse;
      if (factor == 0) continue;
      for (std::size_t j = k + 1; j < n; ++j) row_i[j] -= factor * row_k[j];
      for (std::size_t c = 0; c < columns; ++c) rhs[i][c] -= factor * rhs[k][c];
    }
  }
  for (std::size_t k = n; k-- > 0;) {
    const double inverse = 1.0 / matrix[k][k];
    for (std::size_t c = 0; c < columns; ++c) {
      double sum = rhs[k][c];
      for (std::size_t j = k + 1; j < n; ++j) sum -= matrix[k][j] * rhs[j][c];
      rhs[k][c] = sum * inverse;
    }
  }
}

}  // namespace shaftwork::numerics

// Curves through converted test points: read at a flow by straight lines between
// neighbouring points, or by a least-squares polynomial; and the rule that a curve is
// read at most kExtrapolationLimit beyond its points. Internal to the machines layer
// (guarantee_*.cpp).
#pragma once

#include <span>
#include <string>
#include <vector>

namespace shaftwork::machines {

// Refuses `at` beyond [low (1 - limit), high (1 + limit)] of the points' flows `x`:
// "<what> <at> lies 7.3 % beyond the converted test flows (<low> to <high>): ...".
// `show` writes a flow for the message.
void refuse_beyond_reach(std::span<const double> x, double at, const std::string& what,
                         std::string (*show)(double));

// Refuses two neighbours of the ascending flows `x` that coincide (within 1e-9 relative):
// a curve read by straight lines needs distinct flows. `ids` names the points, `what` the
// flow ("inlet volume flow").
void refuse_coinciding(std::span<const double> x, std::span<const std::string> ids, const std::string& what,
                       std::string (*show)(double));

// y at `at` on the straight lines through (x_i, y_i), x ascending and distinct; beyond
// the ends, the end line extended; a single point: its y.
double read_linear(std::span<const double> x, std::span<const double> y, double at);

// Least-squares polynomial of `degree` (0, 1 or 2) through (x_i, y_i): coefficients
// c0, c1, c2 of y = c0 + c1 x + c2 x^2. Solved on x scaled by its largest magnitude
// (normal equations, Gaussian elimination with partial pivoting). Needs more points than
// the degree.
std::vector<double> least_squares(std::span<const double> x, std::span<const double> y, int degree);
double polynomial(std::span<const double> c, double x);

// The real roots of c0 + c1 x + c2 x^2 = 0 (degree 1 or 2), ascending.
std::vector<double> polynomial_roots(std::span<const double> c);

// The index of the x nearest `at`.
std::size_t nearest_index(std::span<const double> x, double at);

}  // namespace shaftwork::machines

#include "search.hpp"

#include <cmath>

#include "problem.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/numerics/root.hpp"

namespace shaftwork::machines {
namespace {

// f(x), or nothing where the state cannot be evaluated.
std::optional<double> evaluate(const std::function<double(double)>& f, double x) {
  try {
    const double v = f(x);
    if (std::isfinite(v)) return v;
  } catch (const Error& e) {
    if (e.kind() != ErrorKind::bad_input && e.kind() != ErrorKind::out_of_range) throw;
  }
  return std::nullopt;
}

// One scan over `points` log-spaced intervals: the first root and the start of a second.
std::optional<ScanRoot> scan(const std::function<double(double)>& f, double low, double high, int points,
                             const std::string& what) {
  std::optional<ScanRoot> found;
  std::optional<double> previous;
  double previous_x = low;
  for (int i = 0; i <= points; ++i) {
    const double x = low * std::pow(high / low, static_cast<double>(i) / points);
    const auto v = evaluate(f, x);
    if (!v) continue;
    const bool crossed = *v == 0 || (previous && *previous != 0 && ((*previous > 0) != (*v > 0)));
    if (crossed && found) {
      found->another = x;
      return found;
    }
    if (crossed) {
      numerics::RootOptions options;
      options.relative_tolerance = 1e-13;
      found = ScanRoot{*v == 0 ? x : numerics::find_root(f, previous_x, x, what, options).x, std::nullopt};
    }
    previous = v;
    previous_x = x;
  }
  return found;
}

}  // namespace

ScanRoot scan_for_root(const std::function<double(double)>& f, double low, double high, const std::string& what,
                       const std::string& no_solution) {
  for (const int points : {48, 384}) {
    if (auto root = scan(f, low, high, points, what)) return *root;
  }
  refuse(no_solution);
}

}  // namespace shaftwork::machines

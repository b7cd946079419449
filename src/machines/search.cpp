#include "search.hpp"

#include <cmath>
#include <optional>
#include <tuple>
#include <utility>
#include <vector>

#include "problem.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/numerics/root.hpp"

namespace shaftwork::machines {
namespace {

// The function a scan samples, the first failure to converge among its samples, and whether
// the last sample was refused (the state there is not one the knowns allow).
struct Probe {
  const std::function<double(double)>& f;
  std::optional<Error> failure = std::nullopt;
  bool refused = false;
};

// f(x), or nothing where the state cannot be evaluated. A sample whose evaluation does not
// converge (a polytropic path far from the solution) counts as not evaluable and is kept, so
// that a scan that finds no root can say why; the root itself is closed on f, which throws.
std::optional<double> evaluate(Probe& probe, double x) {
  probe.refused = false;
  try {
    const double v = probe.f(x);
    if (std::isfinite(v)) return v;
  } catch (const Error& e) {
    if (e.kind() == ErrorKind::no_convergence) {
      if (!probe.failure) probe.failure = e;
    } else if (e.kind() != ErrorKind::bad_input && e.kind() != ErrorKind::out_of_range) {
      throw;
    } else {
      probe.refused = true;
    }
  }
  return std::nullopt;
}

double close_on(const std::function<double(double)>& f, double a, double b, const std::string& what) {
  numerics::RootOptions options;
  options.relative_tolerance = 1e-13;
  return numerics::find_root(f, a, b, what, options).x;
}

// Where f becomes evaluable between `outside` (not evaluable) and `inside`: bisection to 1e-15
// of x. The value there, with its place.
std::pair<double, double> valid_edge(Probe& f, double outside, double inside,
                                     double inside_value) {
  while (std::fabs(inside - outside) > 1e-15 * std::fabs(inside)) {
    const double mid = 0.5 * (outside + inside);
    if (mid == outside || mid == inside) break;
    if (const auto v = evaluate(f, mid)) {
      inside = mid;
      inside_value = *v;
    } else {
      outside = mid;
    }
  }
  return {inside, inside_value};
}

// Two roots closer together than the scan's points (f touching zero near an extremum, as a
// pump's work does near water's density maximum at 277 K): where |f| dips between two scan
// points of the same sign, golden-section search (Kiefer, Proc. AMS 4 (1953) 502) for the
// extremum of f; if it reaches across zero, the roots either side of it.
struct Sample {
  double x;
  std::optional<double> v;
};

std::vector<Sample> sample(Probe& f, double low, double high, int points) {
  std::vector<Sample> samples;
  for (int i = 0; i <= points; ++i) {
    const double x = low * std::pow(high / low, static_cast<double>(i) / points);
    samples.push_back({x, evaluate(f, x)});
  }
  return samples;
}

std::optional<ScanRoot> dip_root(Probe& probe, const std::vector<Sample>& s,
                                 std::size_t from, const std::string& what) {
  const double g = 0.5 * (std::sqrt(5.0) - 1.0);
  for (std::size_t i = from + 1; i + 1 < s.size(); ++i) {
    if (!s[i - 1].v || !s[i].v || !s[i + 1].v) continue;
    const double sign = *s[i].v > 0 ? 1.0 : -1.0;
    if (!(sign * *s[i].v < sign * *s[i - 1].v && sign * *s[i].v < sign * *s[i + 1].v)) continue;
    double a = s[i - 1].x, b = s[i + 1].x;
    for (int k = 0; k < 60 && b - a > 1e-13 * b; ++k) {
      const double c = b - g * (b - a), d = a + g * (b - a);
      const auto fc = evaluate(probe, c), fd = evaluate(probe, d);
      if (!fc || !fd) break;
      if (sign * *fc <= 0 || sign * *fd <= 0) {
        const double m = sign * *fc <= 0 ? c : d;
        return ScanRoot{close_on(probe.f, s[i - 1].x, m, what), close_on(probe.f, m, s[i + 1].x, what)};
      }
      if (sign * *fc < sign * *fd) {
        b = d;
      } else {
        a = c;
      }
    }
  }
  return std::nullopt;
}

// One scan over `points` log-spaced intervals: the first root and the start of a second. With
// `edges`, an interval where f becomes evaluable (or stops being so) is searched for where, and
// f there counts as a scan point: a root between the edge of the valid range and the first
// point inside it (an inlet a hair above 273.15 K whose isentropic outlet would be below it)
// is found too.
std::optional<ScanRoot> scan(Probe& probe, double low, double high, int points, const std::string& what,
                             bool edges = false) {
  const std::function<double(double)>& f = probe.f;
  std::optional<ScanRoot> found;
  std::vector<Sample> samples;
  std::size_t found_at = 0;
  std::optional<double> previous;
  double previous_x = low;
  bool previous_valid = true;
  for (int i = 0; i <= points; ++i) {
    const double x = low * std::pow(high / low, static_cast<double>(i) / points);
    auto v = evaluate(probe, x);
    if (edges && i > 0 && v.has_value() != previous_valid) {
      const double before = low * std::pow(high / low, static_cast<double>(i - 1) / points);
      if (v && !found) {  // becomes valid: the edge stands in for the point before
        std::tie(previous_x, previous) = valid_edge(probe, before, x, *v);
      } else if (!v && previous && !found) {  // stops being valid: the edge is one more point
        const auto [xe, ve] = valid_edge(probe, x, before, *previous);
        if (ve == 0 || (*previous != 0 && (*previous > 0) != (ve > 0))) {
          return ScanRoot{ve == 0 ? xe : close_on(f, previous_x, xe, what), std::nullopt};
        }
      }
    }
    previous_valid = v.has_value();
    samples.push_back({x, v});
    // A change of sign across a sample the knowns refuse (an outlet temperature that is wet
    // at that outlet pressure, say) brackets no root: f is not defined all the way between,
    // and closing on it would meet the refusal. One across samples that did not converge
    // still counts.
    if (!v && probe.refused) previous.reset();
    if (!v) continue;
    const bool crossed = *v == 0 || (previous && *previous != 0 && ((*previous > 0) != (*v > 0)));
    if (crossed && found) {
      found->another = x;
      return found;
    }
    if (crossed) {
      found = ScanRoot{*v == 0 ? x : close_on(f, previous_x, x, what), std::nullopt};
      found_at = samples.size() - 1;
    }
    previous = v;
    previous_x = x;
  }
  // No second change of sign: a second solution may still touch zero between two points.
  if (found) {
    if (const auto dip = dip_root(probe, samples, found_at, what)) found->another = dip->x;
  }
  return found;
}

}  // namespace

ScanRoot scan_for_root(const std::function<double(double)>& f, double low, double high, const std::string& what,
                       const std::string& no_solution) {
  Probe probe{f};
  for (const int points : {48, 384}) {
    if (auto root = scan(probe, low, high, points, what)) return *root;
  }
  if (auto root = scan(probe, low, high, 48, what, true)) return *root;
  if (auto root = dip_root(probe, sample(probe, low, high, 384), 0, what)) return *root;
  if (probe.failure) throw *probe.failure;  // the answer may lie where the model did not converge
  refuse(no_solution);
}

}  // namespace shaftwork::machines

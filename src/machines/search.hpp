// A scanning root search for the solver's one-unknown problems, where the residual may
// have more than one root, or none, and may not be evaluable everywhere (a state outside
// the model's range). Internal to the machines layer.
#pragma once

#include <functional>
#include <optional>
#include <string>

namespace shaftwork::machines {

// A root of a scanning search, and where the residual changes sign again if it does:
// a second solution the user should hear of.
struct ScanRoot {
  double x = 0;
  std::optional<double> another;
};

// Scans [low, high] (0 < low < high; log-spaced points) for the first sign change of f,
// closes on it with numerics::find_root to 1e-13, and scans on for a second one. A scan
// that meets no sign change is repeated eight times finer before giving up, since two
// roots close together (or a narrow valid interval at a range's edge) can hide between
// coarse points, and then once more with the edges of where f can be evaluated searched
// for and taken as scan points (a root can lie between such an edge and the first point
// inside), and last by looking into each dip of |f| between scan points for two roots close
// together. Points where f throws bad_input or out_of_range (a state outside the
// model's range, a search inside f that found nothing) are skipped; no_convergence and
// not_available propagate. Throws bad_input with `no_solution` when f changes sign
// nowhere. `what` names the unknown for the root finder's messages.
ScanRoot scan_for_root(const std::function<double(double)>& f, double low, double high, const std::string& what,
                       const std::string& no_solution);

}  // namespace shaftwork::machines

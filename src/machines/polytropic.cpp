#include "shaftwork/machines/polytropic.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include <fmt/format.h>

#include "polytropic_path.hpp"
#include "shaftwork/error.hpp"

namespace shaftwork::machines {
namespace {

// An entropy difference is known to about this many units in the last place of the larger
// entropy (each state rounds its own).
constexpr double kEntropyRounding = 16 * std::numeric_limits<double>::epsilon();
// The polytropic efficiency must be resolved to this (relative) or the case is refused.
constexpr double kResolution = 1e-6;
// An efficiency this far above 1 is 1: IF97's wet states meet T ds = dh - v dp only to about
// 3e-5 (its saturation line is an equation of its own), so an outlet on the isentrope can
// need a path of efficiency a little above 1.
constexpr double kInconsistency = 1e-4;

void check_efficiency(double eta_p) {
  if (!(eta_p > 0 && eta_p <= 1)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("polytropic efficiency must be above 0 and at most 1, got {}", eta_p));
  }
}

// ln(p2/p1) without the rounding of the ratio: p2 - p1 is exact for p2 near p1.
double log_ratio(double p1, double p2) { return std::log1p((p2 - p1) / p1); }

// The efficiency from the entropy rise `ds` [J/(kg K)] and the path integral `I` = int p v / T
// d(ln p), which is positive (compression) or negative (expansion) with ln(p2/p1):
// ds = (f - 1) I, f = 1/eta_p in compression and eta_p in expansion. Refuses an outlet
// below the isentrope and a pressure change too small for its entropy rise to stand above
// the rounding of the entropies; an entropy rise within that rounding is eta_p = 1.
double efficiency_from_entropy_rise(double ds, double I, double entropy_scale, double p1, double p2) {
  const double noise = kEntropyRounding * entropy_scale;
  if (noise > kResolution * std::fabs(I)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("outlet and inlet pressures differ by {:.3g} of the inlet pressure, too little for a "
                            "polytropic efficiency: the entropy change they allow is within the rounding of the "
                            "entropies; give pressures that differ by more",
                            std::fabs(p2 - p1) / p1));
  }
  if (ds < -noise) {
    throw Error(ErrorKind::bad_input,
                fmt::format("the outlet entropy lies {:.6g} J/(kg K) below the inlet's: no polytropic "
                            "efficiency at most 1 reaches this outlet",
                            -ds));
  }
  if (ds <= noise) return 1.0;
  const bool compression = p2 > p1;
  return compression ? 1.0 / (1.0 + ds / I) : 1.0 - ds / -I;
}

double path_factor(bool compression, double eta_p) { return compression ? 1.0 / eta_p : eta_p; }

}  // namespace

double polytropic_outlet_enthalpy(const fluids::FluidModel& fluid, const fluids::State& inlet,
                                  double p2, double eta_p) {
  check_efficiency(eta_p);
  const double p1 = inlet.pressure;
  if (p2 == p1) return inlet.enthalpy;
  const bool compression = p2 > p1;
  if (fluid.is_incompressible()) {
    // eta_p = eta_s: h2 = h1 + v dp / eta (compression) or h1 + eta v dp (expansion).
    const double vdp = (p2 - p1) / inlet.density;
    return inlet.enthalpy + (compression ? vdp / eta_p : vdp * eta_p);
  }
  if (const auto R = fluid.ideal_gas_constant()) {
    const double ds = (path_factor(compression, eta_p) - 1.0) * *R * log_ratio(p1, p2);
    return fluid.from_ps(p2, inlet.entropy + ds).enthalpy;
  }
  if (eta_p == 1.0) return fluid.from_ps(p2, inlet.entropy).enthalpy;  // the isentrope itself
  return detail::integrate_path(fluid, inlet, p2, path_factor(compression, eta_p)).outlet_enthalpy;
}

double polytropic_efficiency(const fluids::FluidModel& fluid, const fluids::State& inlet,
                             const fluids::State& outlet, double /*isentropic_efficiency*/) {
  const double p1 = inlet.pressure;
  const double p2 = outlet.pressure;
  if (p2 == p1) {
    throw Error(ErrorKind::bad_input, "a polytropic efficiency needs a pressure change; inlet and outlet "
                                      "pressures are equal");
  }
  const bool compression = p2 > p1;
  if (fluid.is_incompressible()) {
    const double vdp = (p2 - p1) / inlet.density;
    const double dh = outlet.enthalpy - inlet.enthalpy;
    return std::min(1.0, compression ? vdp / dh : dh / vdp);
  }
  const double ds = outlet.entropy - inlet.entropy;
  const double scale = std::max({std::fabs(inlet.entropy), std::fabs(outlet.entropy), 1.0});
  if (const auto R = fluid.ideal_gas_constant()) {
    return efficiency_from_entropy_rise(ds, *R * log_ratio(p1, p2), scale, p1, p2);
  }
  // A real fluid: the integral I depends on the path, so the factor is solved along it. The
  // same refusals as above, with I from the end states.
  const double G1 = p1 / (inlet.density * inlet.temperature);
  const double G2 = p2 / (outlet.density * outlet.temperature);
  const double estimate = efficiency_from_entropy_rise(ds, 0.5 * (G1 + G2) * log_ratio(p1, p2), scale, p1, p2);
  if (estimate == 1.0) return 1.0;
  const double factor = detail::solve_path_factor(fluid, inlet, outlet).factor;
  const double eta = compression ? 1.0 / factor : factor;
  if (eta > 1.0 + kInconsistency) {
    throw Error(ErrorKind::bad_input,
                fmt::format("the outlet lies below the polytropic path of efficiency 1 (it would take {:.9g}): "
                            "no polytropic efficiency at most 1 reaches it",
                            eta));
  }
  return std::min(1.0, eta);
}

}  // namespace shaftwork::machines

#include "shaftwork/machines/polytropic.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/numerics/root.hpp"

namespace shaftwork::machines {
namespace {

// dh/d(ln p) = p v(p, h) * factor along the path, where factor is 1/eta_p in
// compression and eta_p in expansion; `wet` tells on which side of the saturation
// line the point lies, since v(p, h) has a kink there.
struct Slope {
  double value;
  bool wet;
};

Slope path_slope(const fluids::FluidModel& fluid, double x, double h, double factor) {
  const double p = std::exp(x);
  const fluids::State st = fluid.from_ph(p, h);
  return {p / st.density * factor, st.is_wet()};
}

// One classical RK4 step from (x, h) over dx. A step across the saturation line
// is halved, recursively, so that the kink sits in a step too short to matter
// and the other steps keep fourth-order accuracy.
double path_step(const fluids::FluidModel& fluid, double x, double h, double dx, double factor, int depth) {
  const Slope k1 = path_slope(fluid, x, h, factor);
  const Slope k2 = path_slope(fluid, x + 0.5 * dx, h + 0.5 * dx * k1.value, factor);
  const Slope k3 = path_slope(fluid, x + 0.5 * dx, h + 0.5 * dx * k2.value, factor);
  const Slope k4 = path_slope(fluid, x + dx, h + dx * k3.value, factor);
  if (k1.wet != k4.wet && depth < 40) {
    const double mid = path_step(fluid, x, h, 0.5 * dx, factor, depth + 1);
    return path_step(fluid, x + 0.5 * dx, mid, 0.5 * dx, factor, depth + 1);
  }
  return h + dx / 6.0 * (k1.value + 2 * k2.value + 2 * k3.value + k4.value);
}

// Integrates the path from (p1, h1) to p2 in `steps` equal steps of ln p.
double integrate_path(const fluids::FluidModel& fluid, double p1, double h1, double p2, double factor,
                      int steps) {
  const double x1 = std::log(p1);
  const double dx = (std::log(p2) - x1) / steps;
  double h = h1;
  for (int i = 0; i < steps; ++i) h = path_step(fluid, x1 + i * dx, h, dx, factor, 0);
  return h;
}

double stepwise_outlet_enthalpy(const fluids::FluidModel& fluid, const fluids::State& inlet,
                                double p2, double eta_p) {
  const bool compression = p2 > inlet.pressure;
  const double factor = compression ? 1.0 / eta_p : eta_p;
  double previous = integrate_path(fluid, inlet.pressure, inlet.enthalpy, p2, factor, 8);
  for (int steps = 16; steps <= 4096; steps *= 2) {
    const double h = integrate_path(fluid, inlet.pressure, inlet.enthalpy, p2, factor, steps);
    const double rise = std::fabs(h - inlet.enthalpy);
    if (std::fabs(h - previous) <= 1e-10 * rise) return h;
    previous = h;
  }
  throw Error(ErrorKind::no_convergence,
              "polytropic path: the stepwise integration did not converge to 1e-10 within 4096 steps");
}

}  // namespace

double polytropic_outlet_enthalpy(const fluids::FluidModel& fluid, const fluids::State& inlet,
                                  double p2, double eta_p) {
  const double p1 = inlet.pressure;
  if (fluid.is_incompressible()) {
    // eta_p = eta_s: h2 = h1 + v dp / eta (compression) or h1 + eta v dp (expansion).
    const double vdp = (p2 - p1) / inlet.density;
    return inlet.enthalpy + (p2 > p1 ? vdp / eta_p : vdp * eta_p);
  }
  if (const auto R = fluid.ideal_gas_constant()) {
    const double lnr = std::log(p2 / p1);
    const double ds = p2 > p1 ? *R * (1.0 / eta_p - 1.0) * lnr : *R * (1.0 - eta_p) * -lnr;
    return fluid.from_ps(p2, inlet.entropy + ds).enthalpy;
  }
  return stepwise_outlet_enthalpy(fluid, inlet, p2, eta_p);
}

double polytropic_efficiency(const fluids::FluidModel& fluid, const fluids::State& inlet,
                             const fluids::State& outlet, double isentropic_efficiency) {
  const double p1 = inlet.pressure;
  const double p2 = outlet.pressure;
  const bool compression = p2 > p1;
  if (fluid.is_incompressible()) {
    const double vdp = (p2 - p1) / inlet.density;
    const double dh = outlet.enthalpy - inlet.enthalpy;
    return compression ? vdp / dh : dh / vdp;
  }
  if (const auto R = fluid.ideal_gas_constant()) {
    const double ds = outlet.entropy - inlet.entropy;
    const double lnr = std::log(p2 / p1);
    return compression ? 1.0 / (1.0 + ds / (*R * lnr)) : 1.0 - ds / (*R * -lnr);
  }
  // General model: find eta_p whose path ends at the outlet enthalpy.
  auto miss = [&](double eta) {
    return stepwise_outlet_enthalpy(fluid, inlet, p2, eta) - outlet.enthalpy;
  };
  numerics::RootOptions options;
  options.relative_tolerance = 1e-11;
  // eta_p lies near eta_s (the reheat effect moves it by a few points); a bracket
  // from half of eta_s keeps the trial paths in the neighbourhood of the real one.
  const double low = isentropic_efficiency > 0 ? std::max(0.02, 0.5 * isentropic_efficiency) : 0.02;
  return numerics::find_root(miss, low, 1.0, "polytropic efficiency", options).x;
}

}  // namespace shaftwork::machines

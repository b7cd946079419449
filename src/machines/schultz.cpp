// The Schultz method (schultz.hpp gives the equations and their sources).
#include "shaftwork/machines/schultz.hpp"

#include <cmath>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::machines {
namespace {

constexpr double kStep = 1e-5;  // relative step of the central differences

[[noreturn]] void refuse(const std::string& what) {
  throw Error(ErrorKind::bad_input, "Schultz method: " + what);
}

// X and Y at (p, T) from central differences of v = 1/rho.
void compressibility_functions(const fluids::FluidModel& fluid, const fluids::State& st, double& x, double& y) {
  const double p = st.pressure;
  const double T = st.temperature;
  const double v = 1 / st.density;
  const double dT = kStep * T;
  const double dp = kStep * p;
  const double dv_dt = (1 / fluid.from_pt(p, T + dT).density - 1 / fluid.from_pt(p, T - dT).density) / (2 * dT);
  const double dv_dp = (1 / fluid.from_pt(p + dp, T).density - 1 / fluid.from_pt(p - dp, T).density) / (2 * dp);
  x = T / v * dv_dt - 1;
  y = -p / v * dv_dp;
}

// ln(p2/p1) / ln(v1/v2).
double volume_exponent(double p1, double p2, double v1, double v2, const char* which) {
  const double ratio = std::log(v1 / v2);
  if (!(std::isfinite(ratio) && ratio != 0)) {
    refuse(fmt::format("the {} volume ratio v1/v2 = {:.6g} gives no exponent", which, v1 / v2));
  }
  return std::log(p2 / p1) / ratio;
}

}  // namespace

SchultzResult schultz_method(const fluids::FluidModel& fluid, const fluids::State& inlet,
                             const fluids::State& outlet, const fluids::State& outlet_isentropic) {
  const double p1 = inlet.pressure;
  const double p2 = outlet.pressure;
  if (!(p1 > 0 && p2 > 0) || p1 == p2) refuse("the inlet and outlet pressures must differ");
  const double v1 = 1 / inlet.density;
  const double v2 = 1 / outlet.density;
  const double v2s = 1 / outlet_isentropic.density;
  SchultzResult r;
  compressibility_functions(fluid, inlet, r.x_inlet, r.y_inlet);
  compressibility_functions(fluid, outlet, r.x_outlet, r.y_outlet);
  r.isentropic_exponent = volume_exponent(p1, p2, v1, v2s, "isentropic");
  r.polytropic_exponent = volume_exponent(p1, p2, v1, v2, "actual");
  const double ns = r.isentropic_exponent;
  const double n = r.polytropic_exponent;
  const double isentropic_work = ns / (ns - 1) * (p2 * v2s - p1 * v1);
  if (!(std::isfinite(isentropic_work) && isentropic_work != 0)) refuse("the isentropic volume work is zero");
  r.schultz_factor = (outlet_isentropic.enthalpy - inlet.enthalpy) / isentropic_work;
  const double head = r.schultz_factor * n / (n - 1) * (p2 * v2 - p1 * v1);
  const double dh = outlet.enthalpy - inlet.enthalpy;
  if (!(std::isfinite(head) && head != 0 && dh != 0)) refuse("the polytropic head or the enthalpy change is zero");
  r.polytropic_head = std::fabs(head);
  r.polytropic_efficiency = p2 > p1 ? head / dh : dh / head;
  return r;
}

}  // namespace shaftwork::machines

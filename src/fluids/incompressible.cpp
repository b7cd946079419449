#include "shaftwork/fluids/incompressible.hpp"

#include <cmath>

#include <fmt/format.h>

#include "checks.hpp"
#include "shaftwork/error.hpp"

namespace shaftwork::fluids {
namespace {

constexpr double kT0 = 298.15;    // K, reference temperature
constexpr double kP0 = 100000.0;  // Pa, reference pressure
constexpr const char* kName = "incompressible";

}  // namespace

IncompressibleLiquid::IncompressibleLiquid(double density, double specific_heat)
    : density_(density), c_(specific_heat) {
  if (!(std::isfinite(density) && density > 0)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("incompressible fluid: density must be above 0, got {:.6g} kg/m3", density));
  }
  if (!(std::isfinite(specific_heat) && specific_heat > 0)) {
    throw Error(ErrorKind::bad_input,
                fmt::format("incompressible fluid: cp must be above 0, got {:.6g} J/(kg K)", specific_heat));
  }
}

State IncompressibleLiquid::from_pt(double p, double T) const {
  detail::check_pressure(p, kName);
  detail::check_temperature(T, temperature_range(), kName);
  State st;
  st.pressure = p;
  st.temperature = T;
  st.enthalpy = c_ * (T - kT0) + (p - kP0) / density_;
  st.entropy = c_ * std::log(T / kT0);
  st.density = density_;
  st.cp = c_;
  st.cv = c_;
  st.molar_mass = 0;       // not known to this model
  st.compressibility = 0;  // not known to this model
  st.expansivity = 0;      // the density does not change with T
  return st;
}

State IncompressibleLiquid::from_ph(double p, double h) const {
  detail::check_pressure(p, kName);
  detail::check_finite(h, "enthalpy", kName);
  return from_pt(p, kT0 + (h - (p - kP0) / density_) / c_);
}

State IncompressibleLiquid::from_ps(double p, double s) const {
  detail::check_finite(s, "entropy", kName);
  return from_pt(p, kT0 * std::exp(s / c_));
}

std::string IncompressibleLiquid::description() const {
  return fmt::format("incompressible liquid, density {:.6g} kg/m3, cp {:.6g} J/(kg K)", density_, c_);
}

}  // namespace shaftwork::fluids

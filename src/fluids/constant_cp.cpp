#include "shaftwork/fluids/constant_cp.hpp"

#include <cmath>

#include <fmt/format.h>

#include "checks.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::fluids {
namespace {

constexpr double kT0 = 298.15;    // K, reference temperature
constexpr double kP0 = 100000.0;  // Pa, reference pressure
constexpr const char* kName = "constant-cp";

[[noreturn]] void refuse(const std::string& why) {
  throw Error(ErrorKind::bad_input, fmt::format("constant-cp fluid: {}", why));
}

}  // namespace

ConstantCpGas::ConstantCpGas(const ConstantCpInputs& in) {
  const int given = in.cp.has_value() + in.cv.has_value() + in.k.has_value() + in.R.has_value() +
                    in.molar_mass.has_value();
  if (given != 2) {
    refuse(fmt::format("give exactly two of cp, cv, k, R, molar_mass (got {})", given));
  }
  if (in.R && in.molar_mass) refuse("R and molar_mass say the same thing; give one of them with cp, cv or k");
  for (auto [value, name] : {std::pair{in.cp, "cp"}, {in.cv, "cv"}, {in.k, "k"}, {in.R, "R"},
                             {in.molar_mass, "molar_mass"}}) {
    if (value && !(std::isfinite(*value) && *value > 0)) {
      refuse(fmt::format("{} must be a finite number above 0, got {:.6g}", name, *value));
    }
  }
  if (in.k && !(*in.k > 1.0)) refuse(fmt::format("k must be above 1, got {:.6g}", *in.k));

  std::optional<double> R = in.R;
  if (in.molar_mass) R = units::kGasConstant / *in.molar_mass;
  double cp = 0;
  if (in.cp && in.cv) {
    cp = *in.cp;
    R = *in.cp - *in.cv;
  } else if (in.cp && in.k) {
    cp = *in.cp;
    R = cp - cp / *in.k;
  } else if (in.cp && R) {
    cp = *in.cp;
  } else if (in.cv && in.k) {
    cp = *in.k * *in.cv;
    R = cp - *in.cv;
  } else if (in.cv && R) {
    cp = *in.cv + *R;
  } else {  // k with R or molar_mass
    cp = *in.k * *R / (*in.k - 1.0);
  }
  if (!(*R > 0 && cp > *R)) {
    refuse(fmt::format("the inputs give cp = {:.6g} and R = {:.6g} J/(kg K); need cp > R > 0", cp, *R));
  }
  cp_ = cp;
  R_ = *R;
}

State ConstantCpGas::from_pt(double p, double T) const {
  detail::check_pressure(p, kName);
  detail::check_temperature(T, temperature_range(), kName);
  State st;
  st.pressure = p;
  st.temperature = T;
  st.enthalpy = cp_ * (T - kT0);
  st.entropy = cp_ * std::log(T / kT0) - R_ * std::log(p / kP0);
  st.density = p / (R_ * T);
  st.cp = cp_;
  st.cv = cp_ - R_;
  st.molar_mass = units::kGasConstant / R_;
  st.compressibility = 1.0;
  st.expansivity = 1.0 / T;
  return st;
}

State ConstantCpGas::from_ph(double p, double h) const {
  detail::check_finite(h, "enthalpy", kName);
  return from_pt(p, kT0 + h / cp_);
}

State ConstantCpGas::from_ps(double p, double s) const {
  detail::check_pressure(p, kName);
  detail::check_finite(s, "entropy", kName);
  return from_pt(p, kT0 * std::exp((s + R_ * std::log(p / kP0)) / cp_));
}

std::string ConstantCpGas::description() const {
  return fmt::format("ideal gas, cp = {:.6g} J/(kg K), k = {:.6g}, R = {:.6g} J/(kg K)", cp_, k(), R_);
}

}  // namespace shaftwork::fluids

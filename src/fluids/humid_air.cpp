// Moist air: saturation over water and ice, humidity ratio, dew point, the humid mixture.
// Equations and sources: include/shaftwork/fluids/humid_air.hpp.
#include "shaftwork/fluids/humid_air.hpp"

#include <array>
#include <cmath>

#include <fmt/format.h>

#include "checks.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/iapws_if97.hpp"
#include "shaftwork/numerics/root.hpp"

namespace shaftwork::fluids {
namespace {

constexpr const char* kName = "humid-air";

// IAPWS R14-08(2011), sublimation pressure of ice (eq. 6 and Table 3): the triple point
// and the three terms a_i theta^b_i.
constexpr double kTriplePointTemperature = 273.16;  // K
constexpr double kTriplePointPressure = 611.657;    // Pa
constexpr std::array<double, 3> kSublimationA = {-0.212144006e2, 0.273203819e2, -0.610598130e1};
constexpr std::array<double, 3> kSublimationB = {0.333333333e-2, 0.120666667e1, 0.170333333e1};
constexpr double kSublimationLowest = 50.0;  // K, the release's lower end
// IF97's critical point (IAPWS R7-97(2012) eqs. 2, 3), the upper end of saturation.
constexpr double kCriticalTemperature = 647.096;  // K
constexpr double kCriticalPressure = 22.064e6;    // Pa

[[noreturn]] void refuse(ErrorKind kind, const std::string& message) {
  throw Error(kind, fmt::format("{}: {}", kName, message));
}

// ln(p_subl / p_t) at T (50 K to 273.16 K).
double log_sublimation_ratio(double T) {
  const double theta = T / kTriplePointTemperature;
  double sum = 0;
  for (std::size_t i = 0; i < kSublimationA.size(); ++i) sum += kSublimationA[i] * std::pow(theta, kSublimationB[i]);
  return sum / theta;
}

// The frost point: T in [50 K, 273.16 K] with p_subl(T) = p_w, for p_w below p_t.
double frost_point(double p_w) {
  const double target = std::log(p_w / kTriplePointPressure);
  if (target < log_sublimation_ratio(kSublimationLowest)) {
    refuse(ErrorKind::out_of_range,
           fmt::format("water vapour pressure {:.6g} Pa is below the sublimation pressure at {:g} K, the lower "
                       "end of IAPWS R14-08",
                       p_w, kSublimationLowest));
  }
  const auto f = [target](double T) { return log_sublimation_ratio(T) - target; };
  return numerics::find_root(f, kSublimationLowest, kTriplePointTemperature, "frost point").x;
}

void check_state(double p, double T) {
  detail::check_pressure(p, kName);
  if (!(T >= kSublimationLowest && T <= kCriticalTemperature)) {
    refuse(ErrorKind::out_of_range,
           fmt::format("humidity is defined from {:g} K to water's critical temperature {:g} K, got {:.6g} K",
                       kSublimationLowest, kCriticalTemperature, T));
  }
}

}  // namespace

double water_saturation_pressure(double T) {
  if (!(T >= kSublimationLowest && T <= kCriticalTemperature)) {
    refuse(ErrorKind::out_of_range,
           fmt::format("the saturation pressure of water is defined from {:g} K (over ice) to the critical "
                       "temperature {:g} K, got {:.6g} K",
                       kSublimationLowest, kCriticalTemperature, T));
  }
  if (T < kTriplePointTemperature) return kTriplePointPressure * std::exp(log_sublimation_ratio(T));
  return IapwsIf97::saturation_pressure(T);
}

std::optional<double> water_dew_point(double p_w) {
  if (!(std::isfinite(p_w) && p_w >= 0)) {
    refuse(ErrorKind::bad_input, fmt::format("water vapour pressure must be finite and 0 or more, got {:.6g} Pa", p_w));
  }
  if (p_w == 0 || p_w >= kCriticalPressure) return std::nullopt;
  if (p_w < kTriplePointPressure) return frost_point(p_w);
  return IapwsIf97{}.saturation_temperature(p_w);
}

HumidAir::HumidAir(const std::vector<Component>& dry_gas, const SpeciesLibrary& library)
    : water_(library.find("H2O")) {
  if (water_ == nullptr) refuse(ErrorKind::bad_input, "the species library holds no H2O");
  if (dry_gas.empty()) refuse(ErrorKind::bad_input, "the dry gas has no species");
  double sum = 0;
  for (const Component& c : dry_gas) {
    if (c.species == water_ || c.species->name == water_->name) {
      refuse(ErrorKind::bad_input, "the dry gas already holds H2O; give the water as a humidity instead");
    }
    if (!(std::isfinite(c.fraction) && c.fraction >= 0)) {
      refuse(ErrorKind::bad_input,
             fmt::format("mole fraction of {} must be finite and 0 or more, got {:g}", c.species->name, c.fraction));
    }
    sum += c.fraction;
  }
  if (!(std::fabs(sum - 1) <= 1e-6)) {
    refuse(ErrorKind::bad_input, fmt::format("the dry gas's mole fractions sum to {:.9g}, not 1", sum));
  }
  for (const Component& c : dry_gas) {
    dry_.push_back({c.species, c.fraction / sum});
    dry_molar_mass_ += c.fraction / sum * c.species->molar_mass;
  }
}

double HumidAir::water_molar_mass() const { return water_->molar_mass; }

MoistAirState HumidAir::state(double p, double T, double p_ws, double p_w) const {
  MoistAirState s;
  s.pressure = p;
  s.temperature = T;
  s.saturation_pressure = p_ws;
  s.vapour_pressure = p_w;
  s.water_mole_fraction = p_w / p;
  s.humidity_ratio = water_->molar_mass / dry_molar_mass_ * p_w / (p - p_w);
  s.relative_humidity = p_w / p_ws;
  s.dew_point = water_dew_point(p_w);
  return s;
}

MoistAirState HumidAir::at_relative_humidity(double p, double T, double relative_humidity) const {
  check_state(p, T);
  if (!(relative_humidity >= 0 && relative_humidity <= 1)) {
    refuse(ErrorKind::bad_input,
           fmt::format("relative humidity must be between 0 and 100 %, got {:.6g} %", relative_humidity * 100));
  }
  const double p_ws = water_saturation_pressure(T);
  const double p_w = relative_humidity * p_ws;
  if (!(p_w < p)) {
    refuse(ErrorKind::bad_input,
           fmt::format("at {:.6g} K, {:.6g} % relative humidity is a water vapour pressure of {:.6g} kPa, not below "
                       "the total pressure {:.6g} kPa",
                       T, relative_humidity * 100, p_w / 1e3, p / 1e3));
  }
  return state(p, T, p_ws, p_w);
}

MoistAirState HumidAir::at_humidity_ratio(double p, double T, double humidity_ratio) const {
  check_state(p, T);
  if (!(std::isfinite(humidity_ratio) && humidity_ratio >= 0)) {
    refuse(ErrorKind::bad_input,
           fmt::format("humidity ratio must be a finite number of 0 or more kg water per kg dry gas, got {:.6g}",
                       humidity_ratio));
  }
  const double epsilon = water_->molar_mass / dry_molar_mass_;
  const double p_w = p * humidity_ratio / (epsilon + humidity_ratio);
  const double p_ws = water_saturation_pressure(T);
  if (p_w > p_ws * (1 + 1e-9)) {
    // p_ws < p_w < p here, so the saturation humidity ratio is finite.
    refuse(ErrorKind::bad_input,
           fmt::format("humidity ratio {:.6g} kg/kg at {:.6g} K and {:.6g} kPa is supersaturated: saturation is "
                       "{:.6g} kg/kg (relative humidity {:.4g} %)",
                       humidity_ratio, T, p / 1e3, epsilon * p_ws / (p - p_ws), p_w / p_ws * 100));
  }
  return state(p, T, p_ws, p_w);
}

std::vector<Component> HumidAir::components(double water_mole_fraction) const {
  if (!(water_mole_fraction >= 0 && water_mole_fraction < 1)) {
    refuse(ErrorKind::bad_input,
           fmt::format("water mole fraction must be at least 0 and below 1, got {:.6g}", water_mole_fraction));
  }
  std::vector<Component> out;
  out.reserve(dry_.size() + 1);
  for (const Component& c : dry_) out.push_back({c.species, c.fraction * (1 - water_mole_fraction)});
  out.push_back({water_, water_mole_fraction});
  return out;
}

}  // namespace shaftwork::fluids

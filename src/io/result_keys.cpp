#include "shaftwork/io/result_keys.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include <fmt/format.h>

#include "shaftwork/io/number_format.hpp"
#include "shaftwork/text.hpp"

namespace shaftwork::io {

using machines::Input;
using machines::key_of;
using machines::Rating;
using units::Dimension;

namespace {

using R = const Rating&;
using O = std::optional<double>;
using Q = machines::Quantity;
using S = Section;

constexpr Precision sig(int digits) { return {Precision::Kind::significant, digits}; }
constexpr Precision dec(int digits) { return {Precision::Kind::decimals, digits}; }
// A value of real-gas models only (the compressibility of an ideal gas is 1 by definition).
O real_gas(R r, double value) { return r.fluid_kind == fluids::FluidKind::real_gas ? O(value) : std::nullopt; }

constexpr bool batch = true;
constexpr bool not_in_batch = false;

std::vector<ResultKey> make_rows() {
  // The batch leaves out the states' enthalpies, entropies and densities: each model has
  // its own reference state, so only differences mean anything, and the heads, powers and
  // efficiencies carry those (docs/batch.md).
  return {
      {key_of(Input::inlet_pressure), Dimension::pressure, [](R r) -> O { return r.inlet.pressure; },
       Q::inlet_pressure, "inlet pressure", sig(5), S::state, batch},
      {key_of(Input::inlet_temperature), Dimension::temperature, [](R r) -> O { return r.inlet.temperature; },
       Q::inlet_temperature, "inlet temperature", dec(2), S::state, batch},
      {key_of(Input::inlet_enthalpy), Dimension::specific_energy, [](R r) -> O { return r.inlet.enthalpy; },
       std::nullopt, "inlet enthalpy", sig(6), S::hidden, not_in_batch},
      {"inlet.entropy", Dimension::specific_entropy, [](R r) -> O { return r.inlet.entropy; }, std::nullopt,
       "inlet entropy", sig(6), S::hidden, not_in_batch},
      {"inlet.density", Dimension::density, [](R r) -> O { return r.inlet.density; }, std::nullopt,
       "inlet density", sig(5), S::derived, not_in_batch},
      {key_of(Input::inlet_quality), Dimension::fraction, [](R r) -> O { return r.inlet.quality; }, std::nullopt,
       "inlet quality", dec(4), S::state, batch, Applies::two_phase},
      {"inlet.compressibility", Dimension::fraction,
       [](R r) -> O { return real_gas(r, r.inlet.compressibility); }, std::nullopt,
       "inlet compressibility Z", sig(5), S::derived, batch, Applies::real_gas},
      {key_of(Input::outlet_pressure), Dimension::pressure, [](R r) -> O { return r.outlet.pressure; },
       Q::outlet_pressure, "outlet pressure", sig(5), S::state, batch},
      {key_of(Input::outlet_temperature), Dimension::temperature, [](R r) -> O { return r.outlet.temperature; },
       Q::outlet_temperature, "outlet temperature", dec(2), S::state, batch},
      {key_of(Input::outlet_enthalpy), Dimension::specific_energy, [](R r) -> O { return r.outlet.enthalpy; },
       std::nullopt, "outlet enthalpy", sig(6), S::hidden, not_in_batch},
      {"outlet.entropy", Dimension::specific_entropy, [](R r) -> O { return r.outlet.entropy; }, std::nullopt,
       "outlet entropy", sig(6), S::hidden, not_in_batch},
      {"outlet.density", Dimension::density, [](R r) -> O { return r.outlet.density; }, std::nullopt,
       "outlet density", sig(5), S::derived, not_in_batch},
      {key_of(Input::outlet_quality), Dimension::fraction, [](R r) -> O { return r.outlet.quality; },
       std::nullopt, "outlet quality", dec(4), S::state, batch, Applies::two_phase},
      {"outlet.compressibility", Dimension::fraction,
       [](R r) -> O { return real_gas(r, r.outlet.compressibility); }, std::nullopt,
       "outlet compressibility Z", sig(5), S::derived, batch, Applies::real_gas},
      {"outlet_isentropic.pressure", Dimension::pressure, [](R r) -> O { return r.outlet_isentropic.pressure; },
       std::nullopt, "isentropic outlet pressure", sig(5), S::hidden, not_in_batch},
      {"outlet_isentropic.temperature", Dimension::temperature,
       [](R r) -> O { return r.outlet_isentropic.temperature; }, std::nullopt, "isentropic outlet temperature",
       dec(2), S::derived, batch, Applies::always, false},
      {"outlet_isentropic.enthalpy", Dimension::specific_energy,
       [](R r) -> O { return r.outlet_isentropic.enthalpy; }, std::nullopt, "isentropic outlet enthalpy", sig(6),
       S::hidden, not_in_batch},
      {"outlet_isentropic.quality", Dimension::fraction, [](R r) -> O { return r.outlet_isentropic.quality; },
       std::nullopt, "isentropic outlet quality", dec(4), S::derived, batch, Applies::two_phase, false},
      {"outlet_isentropic.compressibility", Dimension::fraction,
       [](R r) -> O { return real_gas(r, r.outlet_isentropic.compressibility); }, std::nullopt,
       "isentropic outlet compressibility Z", sig(5), S::hidden, not_in_batch},
      {key_of(Input::mass_flow), Dimension::mass_flow, [](R r) -> O { return r.mass_flow; }, Q::flow,
       "mass flow", sig(5), S::size, batch},
      {key_of(Input::volume_flow), Dimension::volume_flow, [](R r) -> O { return r.volume_flow; }, std::nullopt,
       "inlet volume flow", sig(5), S::derived, batch},
      {key_of(Input::power), Dimension::power, [](R r) -> O { return r.power; }, Q::power, "shaft power", sig(5),
       S::size, batch},
      {"fluid_power", Dimension::power, [](R r) -> O { return r.fluid_power; }, std::nullopt, "fluid power",
       sig(5), S::derived, batch, Applies::always, false},
      {key_of(Input::mechanical_efficiency), Dimension::fraction,
       [](R r) -> O { return r.mechanical_efficiency; }, std::nullopt, "mechanical efficiency", dec(4),
       S::hidden, not_in_batch},
      {key_of(Input::efficiency_isentropic), Dimension::fraction,
       [](R r) -> O { return r.efficiency_isentropic; }, Q::efficiency, "isentropic efficiency", dec(4),
       S::efficiency, batch},
      {key_of(Input::efficiency_polytropic), Dimension::fraction,
       [](R r) -> O { return r.polytropic ? O(r.efficiency_polytropic) : std::nullopt; }, Q::efficiency,
       "polytropic efficiency", dec(4), S::efficiency, batch, Applies::always, false, Needs::polytropic},
      {"efficiency.polytropic_schultz", Dimension::fraction,
       [](R r) -> O { return r.schultz ? O(r.schultz->polytropic_efficiency) : std::nullopt; }, std::nullopt,
       "Schultz polytropic efficiency", dec(4), S::derived, batch, Applies::real_gas, true, Needs::polytropic},
      {"head.isentropic", Dimension::specific_energy, [](R r) -> O { return r.head_isentropic; }, std::nullopt,
       "isentropic head", sig(5), S::derived, batch, Applies::always, false},
      {"head.polytropic", Dimension::specific_energy,
       [](R r) -> O { return r.polytropic ? O(r.head_polytropic) : std::nullopt; }, std::nullopt, "polytropic head",
       sig(5), S::derived, batch, Applies::always, false, Needs::polytropic},
      {"head.polytropic_schultz", Dimension::specific_energy,
       [](R r) -> O { return r.schultz ? O(r.schultz->polytropic_head) : std::nullopt; }, std::nullopt,
       "Schultz polytropic head", sig(5), S::derived, batch, Applies::real_gas, true, Needs::polytropic},
      {"schultz_factor", Dimension::fraction,
       [](R r) -> O { return r.schultz ? O(r.schultz->schultz_factor) : std::nullopt; }, std::nullopt,
       "Schultz factor f", sig(5), S::derived, batch, Applies::real_gas, true, Needs::polytropic},
      {"specific_work", Dimension::specific_energy, [](R r) -> O { return r.specific_work; }, std::nullopt,
       "specific work", sig(5), S::derived, batch, Applies::always, false},
      {"pressure_ratio", Dimension::fraction, [](R r) -> O { return r.pressure_ratio; }, std::nullopt,
       "pressure ratio", sig(5), S::derived, batch, Applies::always, false},
      {"head_height", Dimension::length, [](R r) -> O { return r.head_height; }, std::nullopt, "pump head",
       sig(5), S::derived, batch, Applies::pump},
      {"hydraulic_power", Dimension::power, [](R r) -> O { return r.hydraulic_power; }, std::nullopt,
       "hydraulic power", sig(5), S::derived, batch, Applies::pump},
      {"pump_efficiency", Dimension::fraction, [](R r) -> O { return r.pump_efficiency; }, std::nullopt,
       "pump efficiency", dec(4), S::derived, batch, Applies::pump},
      {key_of(Input::speed), Dimension::rotational_speed, [](R r) -> O { return r.speed; }, std::nullopt,
       "shaft speed", sig(5), S::derived, batch, Applies::speed},
      {"tip_speed", Dimension::velocity, [](R r) -> O { return r.tip_speed; }, std::nullopt, "impeller tip speed",
       sig(5), S::derived, batch, Applies::impeller},
      {"flow_coefficient", Dimension::fraction, [](R r) -> O { return r.flow_coefficient; }, std::nullopt,
       "flow coefficient", sig(4), S::derived, batch, Applies::impeller},
      {"machine_mach_number", Dimension::fraction, [](R r) -> O { return r.machine_mach_number; }, std::nullopt,
       "machine Mach number", sig(4), S::derived, batch, Applies::impeller},
      {"humidity_ratio", Dimension::fraction, [](R r) -> O { return r.humidity_ratio; }, std::nullopt,
       "humidity ratio, kg/kg", dec(5), S::derived, not_in_batch},
      {"power_balance.fluid_power", Dimension::power,
       [](R r) -> O { return r.power_balance ? O(r.power_balance->fluid_power) : std::nullopt; }, std::nullopt,
       "fluid power", sig(5), S::hidden, not_in_batch},
      {"power_balance.shaft_power", Dimension::power,
       [](R r) -> O { return r.power_balance ? O(r.power_balance->shaft_power) : std::nullopt; }, std::nullopt,
       "shaft power from the fluid side", sig(5), S::hidden, not_in_batch},
      {"power_balance.given_power", Dimension::power,
       [](R r) -> O { return r.power_balance ? O(r.power_balance->given_power) : std::nullopt; }, std::nullopt,
       "given shaft power", sig(5), S::hidden, not_in_batch},
      {"power_balance.difference_percent", Dimension::fraction,
       [](R r) -> O { return r.power_balance ? O(r.power_balance->difference_percent) : std::nullopt; },
       std::nullopt, "power balance, difference %", dec(2), S::hidden, batch},
      {"efficiency_check.given", Dimension::fraction,
       [](R r) -> O { return r.efficiency_check ? O(r.efficiency_check->given) : std::nullopt; }, std::nullopt,
       "given efficiency", dec(4), S::hidden, batch},
      {"efficiency_check.computed", Dimension::fraction,
       [](R r) -> O { return r.efficiency_check ? O(r.efficiency_check->computed) : std::nullopt; }, std::nullopt,
       "efficiency from the states", dec(4), S::hidden, batch},
  };
}

}  // namespace

const std::vector<ResultKey>& result_keys() {
  static const std::vector<ResultKey> rows = make_rows();
  return rows;
}

std::size_t row_of(const ResultKey& k) { return static_cast<std::size_t>(&k - result_keys().data()); }

ResultNumbers result_numbers(const Rating& rating) {
  ResultNumbers numbers;
  numbers.reserve(result_keys().size());
  for (const ResultKey& k : result_keys()) {
    const std::optional<double> v = k.value(rating);
    numbers.push_back(v && std::isfinite(*v) ? rounded_for_output(*v) : v);
  }
  return numbers;
}

machines::RatingOptions rating_options_for(const std::vector<const ResultKey*>& keys) {
  machines::RatingOptions options;
  options.polytropic =
      std::any_of(keys.begin(), keys.end(), [](const ResultKey* k) { return k->needs == Needs::polytropic; });
  return options;
}

const ResultKey* find_result_key(std::string_view key) {
  for (const ResultKey& k : result_keys()) {
    if (k.key == key) return &k;
  }
  return nullptr;
}

std::string result_key_list() {
  std::string out;
  for (const ResultKey& k : result_keys()) {
    if (!out.empty()) out += ", ";
    out += k.key;
  }
  return out;
}

std::string no_result_key(std::string_view key) {
  std::vector<std::string_view> keys;
  for (const ResultKey& k : result_keys()) keys.push_back(k.key);
  const std::string_view near = nearest_of(key, keys);
  if (!near.empty()) return fmt::format("\"{}\" is no result key; did you mean {}?", key, near);
  return fmt::format("\"{}\" is no result key; the keys are: {}", key, result_key_list());
}

}  // namespace shaftwork::io

// shaftwork/machines/inputs.hpp — the one table of what a case may give.
//
// Seven quantities tie an adiabatic steady-flow machine together (the contract, "What may
// be known, what is solved"): inlet pressure, inlet temperature, outlet pressure, outlet
// temperature, flow, power and efficiency. A case gives each of them in one of a few forms
// (an outlet temperature, enthalpy or quality; a mass, volume or standard volume flow;
// an isentropic or polytropic efficiency), and a few more values that qualify them (the
// mechanical efficiency, the site barometer). Each form is one row of kInputs below: its
// dotted key as users write it in case files and CSV headers, its dimension, which of the
// seven it gives, where it lives in a RatingInput and which values it accepts. The case
// reader, the batch plan, the result writers, the solver's messages and the given/solved
// tags all take the keys from here; adding a case quantity is one row (and the code that
// uses it).
//
// All values SI: Pa, K, J/kg, kg/s, m3/s, mol/s (a standard volume flow is an amount of
// substance per second), W; efficiencies and qualities as fractions.
#pragma once

#include <array>
#include <cmath>
#include <cstddef>
#include <cstdint>
#include <functional>
#include <memory>
#include <optional>
#include <string>
#include <string_view>

#include "shaftwork/fluids/fluid_model.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::machines {

enum class MachineKind : std::uint8_t { compressor, turbine, pump };
const char* machine_name(MachineKind kind);
// Compressors and pumps raise the pressure; turbines lower it.
constexpr bool compresses(MachineKind kind) { return kind != MachineKind::turbine; }

// The seven quantities, in the contract's order.
enum class Quantity : std::uint8_t {
  inlet_pressure,
  inlet_temperature,
  outlet_pressure,
  outlet_temperature,
  flow,
  power,
  efficiency,
};
inline constexpr std::size_t kQuantityCount = 7;
inline constexpr std::array<Quantity, kQuantityCount> kAllQuantities = {
    Quantity::inlet_pressure,     Quantity::inlet_temperature, Quantity::outlet_pressure,
    Quantity::outlet_temperature, Quantity::flow,              Quantity::power,
    Quantity::efficiency};

// Every value a case may give, one per row of kInputs (same order).
enum class Input : std::uint8_t {
  inlet_pressure,
  inlet_temperature,
  inlet_enthalpy,
  inlet_quality,
  outlet_pressure,
  head,
  outlet_temperature,
  outlet_enthalpy,
  outlet_quality,
  mass_flow,
  volume_flow,
  standard_volume_flow,
  power,
  efficiency_isentropic,
  efficiency_polytropic,
  mechanical_efficiency,
  speed,
  impeller_tip_diameter,
  impeller_exit_width,
  barometric_pressure,
  standard_pressure,
  standard_temperature,
};
inline constexpr std::size_t kInputCount = 22;

// What one rating is given. Each case value is an optional field; kInputs maps the
// dotted keys onto them, so code that handles every input (reading, echoing, perturbing)
// goes through the table instead of naming fields.
struct RatingInput {
  MachineKind machine = MachineKind::compressor;
  std::shared_ptr<const fluids::FluidModel> fluid;

  std::optional<double> inlet_pressure;        // Pa, absolute
  std::optional<double> inlet_temperature;     // K
  std::optional<double> inlet_enthalpy;        // J/kg, instead of the temperature
  std::optional<double> inlet_quality;         // vapour fraction of a wet inlet
  std::optional<double> outlet_pressure;       // Pa, absolute
  std::optional<double> head;                  // J/kg, pumps: p2 = p1 + rho1 * head
  std::optional<double> outlet_temperature;    // K
  std::optional<double> outlet_enthalpy;       // J/kg
  std::optional<double> outlet_quality;        // vapour fraction of a wet outlet
  std::optional<double> mass_flow;             // kg/s
  std::optional<double> volume_flow;           // m3/s at the inlet state
  std::optional<double> standard_volume_flow;  // mol/s
  std::optional<double> power;                 // W, shaft power at the coupling, > 0
  std::optional<double> efficiency_isentropic;
  std::optional<double> efficiency_polytropic;
  std::optional<double> mechanical_efficiency;  // in (0, 1]; absent means 1
  // Qualifiers that the rating does not solve with: they give results of their own
  // (tip speed, flow coefficient, machine Mach number) and the guarantee's fan laws.
  std::optional<double> speed;                  // rev/s, the shaft's rotational speed
  std::optional<double> impeller_tip_diameter;  // m, first impeller (compressors)
  std::optional<double> impeller_exit_width;    // m, first impeller at its tip (compressors)

  // Writes an SI value the way the user wrote that quantity, for messages; SI text
  // when empty.
  std::function<std::string(Quantity, double si_value)> echo;

  double eta_m() const { return mechanical_efficiency.value_or(1.0); }
};

enum class EfficiencyBasis : std::uint8_t { isentropic, polytropic };

// Gives the efficiency on `basis` (and clears the other basis).
inline void set_efficiency(RatingInput& in, EfficiencyBasis basis, double value) {
  in.efficiency_isentropic.reset();
  in.efficiency_polytropic.reset();
  (basis == EfficiencyBasis::isentropic ? in.efficiency_isentropic : in.efficiency_polytropic) = value;
}

// Which values an input accepts (beyond its dimension's own checks in units::parse).
enum class Accepts : std::uint8_t {
  positive,     // > 0
  fraction,     // in (0, 1]: efficiencies
  unit_closed,  // in [0, 1]: vapour qualities
  any,          // any finite value: enthalpies on a model's own reference state
};

struct InputSpec {
  Input input;
  std::string_view key;  // dotted, as written in case files and CSV headers
  units::Dimension dimension;
  std::optional<Quantity> gives;  // which of the seven it fixes; none for qualifiers
  std::optional<double> RatingInput::*field;  // nullptr: folded in before rating (barometer)
  Accepts accepts;
  std::string_view label;  // for tables: "outlet temperature"
};

namespace detail {
using D = units::Dimension;
using Q = Quantity;
using A = Accepts;
using R = RatingInput;
}  // namespace detail

inline constexpr std::array<InputSpec, kInputCount> kInputs = {{
    {Input::inlet_pressure, "inlet.pressure", detail::D::pressure, detail::Q::inlet_pressure, &detail::R::inlet_pressure,
     detail::A::positive, "inlet pressure"},
    {Input::inlet_temperature, "inlet.temperature", detail::D::temperature, detail::Q::inlet_temperature,
     &detail::R::inlet_temperature, detail::A::positive, "inlet temperature"},
    {Input::inlet_enthalpy, "inlet.enthalpy", detail::D::specific_energy, detail::Q::inlet_temperature,
     &detail::R::inlet_enthalpy, detail::A::any, "inlet enthalpy"},
    {Input::inlet_quality, "inlet.quality", detail::D::fraction, detail::Q::inlet_temperature, &detail::R::inlet_quality,
     detail::A::unit_closed, "inlet quality"},
    {Input::outlet_pressure, "outlet.pressure", detail::D::pressure, detail::Q::outlet_pressure, &detail::R::outlet_pressure,
     detail::A::positive, "outlet pressure"},
    {Input::head, "head", detail::D::specific_energy, detail::Q::outlet_pressure, &detail::R::head, detail::A::positive,
     "pump head"},
    {Input::outlet_temperature, "outlet.temperature", detail::D::temperature, detail::Q::outlet_temperature,
     &detail::R::outlet_temperature, detail::A::positive, "outlet temperature"},
    {Input::outlet_enthalpy, "outlet.enthalpy", detail::D::specific_energy, detail::Q::outlet_temperature,
     &detail::R::outlet_enthalpy, detail::A::any, "outlet enthalpy"},
    {Input::outlet_quality, "outlet.quality", detail::D::fraction, detail::Q::outlet_temperature, &detail::R::outlet_quality,
     detail::A::unit_closed, "outlet quality"},
    {Input::mass_flow, "mass_flow", detail::D::mass_flow, detail::Q::flow, &detail::R::mass_flow, detail::A::positive,
     "mass flow"},
    {Input::volume_flow, "volume_flow", detail::D::volume_flow, detail::Q::flow, &detail::R::volume_flow, detail::A::positive,
     "inlet volume flow"},
    {Input::standard_volume_flow, "standard_volume_flow", detail::D::standard_volume_flow, detail::Q::flow,
     &detail::R::standard_volume_flow, detail::A::positive, "standard volume flow"},
    {Input::power, "power", detail::D::power, detail::Q::power, &detail::R::power, detail::A::positive, "shaft power"},
    {Input::efficiency_isentropic, "efficiency.isentropic", detail::D::fraction, detail::Q::efficiency,
     &detail::R::efficiency_isentropic, detail::A::fraction, "isentropic efficiency"},
    {Input::efficiency_polytropic, "efficiency.polytropic", detail::D::fraction, detail::Q::efficiency,
     &detail::R::efficiency_polytropic, detail::A::fraction, "polytropic efficiency"},
    {Input::mechanical_efficiency, "mechanical_efficiency", detail::D::fraction, std::nullopt,
     &detail::R::mechanical_efficiency, detail::A::fraction, "mechanical efficiency"},
    {Input::speed, "speed", detail::D::rotational_speed, std::nullopt, &detail::R::speed, detail::A::positive,
     "shaft speed"},
    {Input::impeller_tip_diameter, "impeller.tip_diameter", detail::D::length, std::nullopt,
     &detail::R::impeller_tip_diameter, detail::A::positive, "impeller tip diameter"},
    {Input::impeller_exit_width, "impeller.exit_width", detail::D::length, std::nullopt,
     &detail::R::impeller_exit_width, detail::A::positive, "impeller exit width"},
    // Read before the others (no RatingInput field): gauge readings need the barometer,
    // standard volume flows the site's standard conditions when it gives them.
    {Input::barometric_pressure, "site.barometric_pressure", detail::D::pressure, std::nullopt, nullptr,
     detail::A::positive, "site barometer"},
    {Input::standard_pressure, "site.standard_conditions.pressure", detail::D::pressure, std::nullopt, nullptr,
     detail::A::positive, "standard pressure"},
    {Input::standard_temperature, "site.standard_conditions.temperature", detail::D::temperature, std::nullopt,
     nullptr, detail::A::positive, "standard temperature"},
}};

constexpr const InputSpec& spec(Input input) { return kInputs[static_cast<std::size_t>(input)]; }
constexpr std::string_view key_of(Input input) { return spec(input).key; }
// The row whose key is `key`, or nullptr.
const InputSpec* find_input(std::string_view key);

// The first form of each of the seven: its dimension is the quantity's.
Input primary_input(Quantity q);
// The dotted key of one of the seven as solved_for and messages name it: the key of its
// first form ("outlet.temperature", "mass_flow"), "efficiency" for the efficiency.
std::string_view quantity_key(Quantity q);

// True when `value` [SI] lies in the range `input` accepts: the one test of every input's
// range, which value_problem() puts into words.
inline bool value_acceptable(Input input, double value) {
  if (!std::isfinite(value)) return false;
  switch (spec(input).accepts) {
    case Accepts::positive: return value > 0;
    case Accepts::fraction: return value > 0 && value <= 1;
    case Accepts::unit_closed: return value >= 0 && value <= 1;
    case Accepts::any: return true;
  }
  return true;
}

// The problem with `value` [SI] for `input` ("must be above 0 and at most 1, got 1.0000001"),
// or "" when value_acceptable(). The case reader, the batch rows and the solver all use it.
std::string value_problem(Input input, double value);

// The first problem with a rating input, or "": a quantity given in two forms ("mass_flow
// and volume_flow are both given: ..."), a value out of its range ("efficiency.isentropic:
// must be ..."), a head on a machine that is not a pump, an impeller on a machine that is
// not a compressor, an exit width without the tip diameter. The solver refuses such an input;
// readers check with it first, so that a file's problems show before any rating.
std::string input_problem(const RatingInput& in);
// True when input_problem(in) is "", found without building a message (the solver asks it of
// every rating); `quantities` then holds a bit, 1 << Quantity, for each of the seven given.
bool input_acceptable(const RatingInput& in, unsigned& quantities);

// The value of `input` in `in`, empty when not given (always empty for the barometer).
inline std::optional<double> given(const RatingInput& in, Input input) {
  const auto field = spec(input).field;
  return field ? in.*field : std::nullopt;
}

}  // namespace shaftwork::machines

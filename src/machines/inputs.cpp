#include "shaftwork/machines/inputs.hpp"

#include <cmath>

#include <fmt/format.h>

namespace shaftwork::machines {

const char* machine_name(MachineKind kind) {
  switch (kind) {
    case MachineKind::compressor: return "compressor";
    case MachineKind::turbine: return "turbine";
    case MachineKind::pump: return "pump";
  }
  return "?";
}

const InputSpec* find_input(std::string_view key) {
  for (const InputSpec& s : kInputs) {
    if (s.key == key) return &s;
  }
  return nullptr;
}

Input primary_input(Quantity q) {
  switch (q) {
    case Quantity::inlet_pressure: return Input::inlet_pressure;
    case Quantity::inlet_temperature: return Input::inlet_temperature;
    case Quantity::outlet_pressure: return Input::outlet_pressure;
    case Quantity::outlet_temperature: return Input::outlet_temperature;
    case Quantity::flow: return Input::mass_flow;
    case Quantity::power: return Input::power;
    case Quantity::efficiency: return Input::efficiency_isentropic;
  }
  return Input::inlet_pressure;
}

std::string_view quantity_key(Quantity q) {
  // The efficiency's forms share a prefix ("efficiency."); solved, it is both forms.
  const std::string_view key = key_of(primary_input(q));
  return q == Quantity::efficiency ? key.substr(0, key.find('.')) : key;
}

std::string value_problem(Input input, double value) {
  // "{}" writes the shortest text that reads back as the same double, so 1.0000001 is
  // not shown as 1 next to "at most 1".
  if (!std::isfinite(value)) return "must be a finite number";
  switch (spec(input).accepts) {
    case Accepts::positive:
      if (!(value > 0)) return fmt::format("must be above 0, got {}", value);
      break;
    case Accepts::fraction:
      if (!(value > 0 && value <= 1)) {
        return fmt::format("must be above 0 and at most 1 (or 100 %), got {}", value);
      }
      break;
    case Accepts::unit_closed:
      if (!(value >= 0 && value <= 1)) return fmt::format("must be between 0 and 1, got {}", value);
      break;
    case Accepts::any: break;
  }
  return {};
}

std::string input_problem(const RatingInput& in) {
  const InputSpec* first_form[kQuantityCount] = {};
  for (const InputSpec& s : kInputs) {
    if (!s.field || !(in.*s.field)) continue;
    if (s.gives) {
      const InputSpec*& first = first_form[static_cast<std::size_t>(*s.gives)];
      if (first) return fmt::format("{} and {} are both given: they give the same quantity; keep one", first->key, s.key);
      first = &s;
    }
    const std::string problem = value_problem(s.input, *(in.*s.field));
    if (!problem.empty()) return fmt::format("{}: {}", s.key, problem);
  }
  if (in.head && in.machine != MachineKind::pump) return "head stands for the outlet pressure of pumps only";
  const bool impeller = in.impeller_tip_diameter || in.impeller_exit_width;
  if (impeller && in.machine != MachineKind::compressor) {
    return fmt::format("impeller: given for compressors (and fans) only, and this machine is a {}",
                       machine_name(in.machine));
  }
  if (in.impeller_exit_width && !in.impeller_tip_diameter) {
    return "impeller.exit_width: given without impeller.tip_diameter; the tip diameter sizes the impeller";
  }
  return {};
}

}  // namespace shaftwork::machines

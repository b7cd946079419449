#include "shaftwork/machines/inputs.hpp"

#include <cmath>
#include <utility>

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
  if (value_acceptable(input, value)) return {};
  // "{}" writes the shortest text that reads back as the same double, so 1.0000001 is
  // not shown as 1 next to "at most 1".
  if (!std::isfinite(value)) return "must be a finite number";
  switch (spec(input).accepts) {
    case Accepts::positive: return fmt::format("must be above 0, got {}", value);
    case Accepts::fraction: return fmt::format("must be above 0 and at most 1 (or 100 %), got {}", value);
    case Accepts::unit_closed: return fmt::format("must be between 0 and 1, got {}", value);
    case Accepts::any: break;
  }
  return {};
}

namespace {

// One row of kInputs for input_acceptable(), its field known at compile time: an absent
// value costs a test of its flag.
template <std::size_t I>
bool field_acceptable(const RatingInput& in, unsigned& quantities) {
  constexpr InputSpec s = kInputs[I];
  if constexpr (s.field == nullptr) {
    return true;
  } else {
    const std::optional<double>& value = in.*s.field;
    if (!value) return true;
    if constexpr (s.gives.has_value()) {
      const unsigned bit = 1u << static_cast<unsigned>(*s.gives);
      if (quantities & bit) return false;  // a second form of the same quantity
      quantities |= bit;
    }
    return value_acceptable(s.input, *value);
  }
}

template <std::size_t... I>
bool fields_acceptable(const RatingInput& in, unsigned& quantities, std::index_sequence<I...>) {
  return (field_acceptable<I>(in, quantities) && ...);
}

}  // namespace

bool input_acceptable(const RatingInput& in, unsigned& quantities) {
  quantities = 0;
  if (!fields_acceptable(in, quantities, std::make_index_sequence<kInputCount>{})) return false;
  if (in.head && in.machine != MachineKind::pump) return false;
  if ((in.impeller_tip_diameter || in.impeller_exit_width) && in.machine != MachineKind::compressor) return false;
  return !(in.impeller_exit_width && !in.impeller_tip_diameter);
}

std::string input_problem(const RatingInput& in) {
  if (unsigned quantities = 0; input_acceptable(in, quantities)) return {};
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

// shaftwork/io/json_quantity.hpp — a case file's numbers and "<number> <unit>" strings, to SI.
#pragma once

#include <string>
#include <string_view>

#include <nlohmann/json.hpp>

#include "shaftwork/units/quantity.hpp"

namespace shaftwork::io {

// A quantity read from JSON: its SI value and the unit the user wrote ("" for a
// plain number, which is SI by definition).
struct ReadQuantity {
  double si = 0;
  std::string unit;
};

// Reads `value` (a JSON number in SI units or a string "<number> <unit>") as a
// quantity of dimension `d`. Throws bad_input with `path` before the message:
// 'outlet.pressure: "4.1 degC": a temperature unit where a pressure belongs'.
// The symbol of a dimension's SI unit, in which a plain JSON number is read ("" for a fraction).
std::string_view si_symbol(units::Dimension d);

// The unit symbol of a "<number> <unit>" text: what follows the number and the spaces
// after it ("barg" of "2.10 barg", "%" of "84.5%"); "" when there is none.
std::string_view unit_written(std::string_view text);

ReadQuantity read_quantity(const nlohmann::json& value, units::Dimension d, const std::string& path,
                           const units::ParseContext& context, units::ParseNotes& notes);

}  // namespace shaftwork::io

// A CSV cell as a number: fast for the plain decimals a logger writes, exact always.
// Internal to the io layer (the batch rater).
#pragma once

#include <string_view>

namespace shaftwork::io {

// Parses the whole cell as a number (locale-independent, a leading '+' allowed). Returns
// the problem ("the cell is empty", "out of range", "not finite", "not a number"), or
// an empty view when `x` holds the number.
std::string_view parse_cell_number(std::string_view cell, double& x);

}  // namespace shaftwork::io

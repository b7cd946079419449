#include "cell_number.hpp"

#include <charconv>
#include <cmath>
#include <system_error>

namespace shaftwork::io {

std::string_view parse_cell_number(std::string_view cell, double& x) {
  if (cell.empty()) return "the cell is empty";
  if (parse_plain_decimal(cell, x)) return {};
  const char* first = cell.data();
  const char* const last = cell.data() + cell.size();
  if (*first == '+' && cell.size() > 1 && cell[1] != '+' && cell[1] != '-') ++first;
  const auto [end, ec] = std::from_chars(first, last, x, std::chars_format::general);
  if (ec == std::errc::result_out_of_range && end == last) return "out of range";
  if (ec != std::errc() || end != last) return "not a number";
  if (!std::isfinite(x)) return "not finite";
  return {};
}

}  // namespace shaftwork::io

// A CSV cell as a number: fast for the plain decimals a logger writes, exact always.
// Internal to the io layer (the batch rater).
#pragma once

#include <cstdint>
#include <string_view>

namespace shaftwork::io {

namespace detail {
// 10^k for k = 0..15, exact in a double.
inline constexpr double kExactPowersOfTen[] = {1e0, 1e1, 1e2,  1e3,  1e4,  1e5,  1e6,  1e7,
                                               1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15};
}  // namespace detail

// The common cell of a log, a plain decimal of at most 15 digits ("-0.0139", "172.5", no
// white space), by Clinger's fast path: the digits as an integer below 2^53 and a division
// by an exact power of ten, which IEEE arithmetic rounds correctly, so the result is the one
// std::from_chars gives. False for anything else (exponents, long digit strings, text,
// spaces), which parse_cell_number() reads. Inline: the batch reads every cell through it.
inline bool parse_plain_decimal(std::string_view cell, double& x) {
  const char* p = cell.data();
  const char* const end = p + cell.size();
  bool negative = false;
  if (p < end && (*p == '-' || *p == '+')) negative = *p++ == '-';
  std::uint64_t digits = 0;
  int count = 0;
  int decimals = 0;
  bool point = false;
  for (; p < end; ++p) {
    const char c = *p;
    if (c >= '0' && c <= '9') {
      if (++count > 15) return false;
      digits = digits * 10 + static_cast<std::uint64_t>(c - '0');
      decimals += point;
    } else if (c == '.' && !point) {
      point = true;
    } else {
      return false;
    }
  }
  if (count == 0) return false;
  x = static_cast<double>(digits) / detail::kExactPowersOfTen[decimals];
  if (negative) x = -x;
  return true;
}

// Parses the whole cell as a number (locale-independent, a leading '+' allowed). Returns
// the problem ("the cell is empty", "out of range", "not finite", "not a number"), or
// an empty view when `x` holds the number. The cell comes trimmed of white space.
std::string_view parse_cell_number(std::string_view cell, double& x);

}  // namespace shaftwork::io

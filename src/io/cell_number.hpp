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
  const bool negative = p < end && *p == '-';
  if (p < end && (*p == '-' || *p == '+')) ++p;
  // The digits before the point, then those after it: two tight loops, no per-digit flags.
  // More than 15 digits wrap `digits` around, and are refused below.
  const auto digit = [](char c) { return static_cast<unsigned>(c - '0'); };
  std::uint64_t digits = 0;
  const char* const first = p;
  while (p < end && digit(*p) < 10) digits = digits * 10 + digit(*p++);
  std::ptrdiff_t count = p - first;
  std::ptrdiff_t decimals = 0;
  if (p < end && *p == '.') {
    const char* const fraction = ++p;
    while (p < end && digit(*p) < 10) digits = digits * 10 + digit(*p++);
    decimals = p - fraction;
    count += decimals;
  }
  if (p != end || count == 0 || count > 15) return false;
  x = static_cast<double>(digits) / detail::kExactPowersOfTen[decimals];
  if (negative) x = -x;
  return true;
}

// Parses the whole cell as a number (locale-independent, a leading '+' allowed). Returns
// the problem ("the cell is empty", "out of range", "not finite", "not a number"), or
// an empty view when `x` holds the number. The cell comes trimmed of white space.
std::string_view parse_cell_number(std::string_view cell, double& x);

}  // namespace shaftwork::io

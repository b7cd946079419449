// shaftwork/text.hpp — the small text helpers every layer uses, defined once.
#pragma once

#include <string>
#include <string_view>

namespace shaftwork {

// The ASCII white space that surrounds numbers, units and CSV cells: space, tab, CR, LF,
// vertical tab and form feed (the set of std::isspace in the C locale).
constexpr bool is_space(char c) {
  return c == ' ' || c == '\t' || c == '\r' || c == '\n' || c == '\v' || c == '\f';
}

// `s` without leading and trailing white space.
constexpr std::string_view trim(std::string_view s) {
  while (!s.empty() && is_space(s.front())) s.remove_prefix(1);
  while (!s.empty() && is_space(s.back())) s.remove_suffix(1);
  return s;
}

// `s` with each control character (below U+0020, and DEL) written as \n, \t, \r or \xHH,
// so that text from a file cannot move the cursor or ring the bell of a terminal.
inline std::string escape_control(std::string_view s) {
  std::string out;
  out.reserve(s.size());
  for (const char c : s) {
    const auto u = static_cast<unsigned char>(c);
    if (u >= 0x20 && u != 0x7f) {
      out += c;
    } else if (c == '\n') {
      out += "\\n";
    } else if (c == '\t') {
      out += "\\t";
    } else if (c == '\r') {
      out += "\\r";
    } else {
      constexpr char kHex[] = "0123456789abcdef";
      out += "\\x";
      out += kHex[u >> 4];
      out += kHex[u & 15];
    }
  }
  return out;
}

}  // namespace shaftwork

// shaftwork/text.hpp — the small text helpers every layer uses, defined once.
#pragma once

#include <algorithm>
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

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

// The candidate nearest to `key` by Levenshtein distance (insertions, deletions and
// substitutions), if it is at most `max_edits` away: for "did you mean ...?" hints.
// "" when none is that near; the first of equally near candidates.
inline std::string_view nearest_of(std::string_view key, const std::vector<std::string_view>& candidates,
                                   std::size_t max_edits = 2) {
  std::string_view best;
  std::size_t best_distance = max_edits + 1;
  std::vector<std::size_t> row;
  for (const std::string_view c : candidates) {
    // One row of the distance table at a time.
    row.resize(c.size() + 1);
    for (std::size_t j = 0; j < row.size(); ++j) row[j] = j;
    for (std::size_t i = 1; i <= key.size(); ++i) {
      std::size_t diagonal = row[0];
      row[0] = i;
      for (std::size_t j = 1; j <= c.size(); ++j) {
        const std::size_t up = row[j];
        row[j] = std::min({row[j] + 1, row[j - 1] + 1, diagonal + (key[i - 1] == c[j - 1] ? 0 : 1)});
        diagonal = up;
      }
    }
    if (row.back() < best_distance) {
      best_distance = row.back();
      best = c;
    }
  }
  return best;
}

}  // namespace shaftwork

// Line-oriented text helpers for the data files of the fluids layer (internal): the
// species library and the critical-constant and interaction tables read their files
// with these, so every data file is split, trimmed and parsed the same way.
#pragma once

#include <cctype>
#include <charconv>
#include <cmath>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::fluids::detail {

struct Line {
  std::string_view text;
  int number;  // 1-based
};

// The lines of `text`, without their '\n' or "\r\n" ends.
inline std::vector<Line> split_lines(std::string_view text) {
  std::vector<Line> lines;
  int number = 0;
  while (!text.empty()) {
    const std::size_t end = text.find('\n');
    std::string_view line = text.substr(0, end);
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    lines.push_back({line, ++number});
    if (end == std::string_view::npos) break;
    text.remove_prefix(end + 1);
  }
  return lines;
}

inline std::string_view trim(std::string_view s) {
  const std::size_t first = s.find_first_not_of(" \t");
  if (first == std::string_view::npos) return {};
  const std::size_t last = s.find_last_not_of(" \t");
  return s.substr(first, last - first + 1);
}

// A blank line or a comment ('!' in NASA's files, '#' in ours) between records.
inline bool is_comment_line(std::string_view s) {
  s = trim(s);
  return s.empty() || s.front() == '!' || s.front() == '#';
}

// The words of a line, split at blanks and tabs.
inline std::vector<std::string_view> split_words(std::string_view s) {
  std::vector<std::string_view> words;
  while (true) {
    s = trim(s);
    if (s.empty()) return words;
    const std::size_t end = s.find_first_of(" \t");
    words.push_back(s.substr(0, end));
    if (end == std::string_view::npos) return words;
    s.remove_prefix(end);
  }
}

inline std::string first_word_upper(std::string_view s) {
  const auto words = split_words(s);
  std::string word = words.empty() ? std::string() : std::string(words.front());
  for (char& c : word) c = static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
  return word;
}

// A whole field as a finite number; Fortran's D exponent and a leading '+' are accepted.
inline std::optional<double> parse_number(std::string_view field) {
  field = trim(field);
  char buffer[64] = {};
  if (field.empty() || field.size() >= sizeof buffer) return std::nullopt;
  std::size_t n = 0;
  for (char c : field) buffer[n++] = (c == 'D' || c == 'd') ? 'e' : c;
  const char* begin = buffer;
  const char* end = buffer + n;
  if (*begin == '+') {
    ++begin;  // std::from_chars refuses a leading '+'
    if (begin == end || *begin == '-' || *begin == '+') return std::nullopt;
  }
  double value = 0;
  const auto [stop, error] = std::from_chars(begin, end, value);
  if (error != std::errc() || stop != end || !std::isfinite(value)) return std::nullopt;
  return value;
}

// Throws bad_input "ORIGIN:LINE: what", the form of every data-file message.
[[noreturn]] inline void fail(const std::string& origin, int line, const std::string& what) {
  throw Error(ErrorKind::bad_input, fmt::format("{}:{}: {}", origin, line, what));
}

}  // namespace shaftwork::fluids::detail

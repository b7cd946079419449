#include "shaftwork/io/timestamp.hpp"

#include <cmath>
#include <ctime>

#include <fmt/format.h>

namespace shaftwork::io {
namespace {

bool leap(long y) { return (y % 4 == 0 && y % 100 != 0) || y % 400 == 0; }

int days_in_month(long y, int m) {
  static constexpr int kDays[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  return m == 2 && leap(y) ? 29 : kDays[m - 1];
}

// Reads exactly `n` digits at `pos`; false when they are not there.
bool digits(std::string_view s, std::size_t& pos, std::size_t n, long& out) {
  if (pos + n > s.size()) return false;
  out = 0;
  for (std::size_t i = 0; i < n; ++i) {
    const char c = s[pos + i];
    if (c < '0' || c > '9') return false;
    out = out * 10 + (c - '0');
  }
  pos += n;
  return true;
}

bool literal(std::string_view s, std::size_t& pos, char c) {
  if (pos >= s.size() || s[pos] != c) return false;
  ++pos;
  return true;
}

// ":SS" or ":SS.fff" at `pos`, when there; false for a malformed one.
bool seconds_part(std::string_view s, std::size_t& pos, double& seconds) {
  long whole = 0;
  if (!literal(s, pos, ':')) return true;
  if (!digits(s, pos, 2, whole) || whole > 59) return false;
  seconds = static_cast<double>(whole);
  if (!literal(s, pos, '.')) return true;
  double scale = 0.1;
  const std::size_t start = pos;
  for (; pos < s.size() && s[pos] >= '0' && s[pos] <= '9'; ++pos, scale /= 10) seconds += (s[pos] - '0') * scale;
  return pos > start;
}

}  // namespace

std::optional<double> parse_timestamp(std::string_view s) {
  std::size_t pos = 0;
  long y = 0, m = 0, d = 0, hour = 0, minute = 0;
  double seconds = 0;
  if (!digits(s, pos, 4, y) || !literal(s, pos, '-') || !digits(s, pos, 2, m) || !literal(s, pos, '-') ||
      !digits(s, pos, 2, d)) {
    return std::nullopt;
  }
  if (m < 1 || m > 12 || d < 1 || d > days_in_month(y, static_cast<int>(m))) return std::nullopt;
  if (pos < s.size() && (s[pos] == ' ' || s[pos] == 'T')) {
    ++pos;
    if (!digits(s, pos, 2, hour) || !literal(s, pos, ':') || !digits(s, pos, 2, minute) || hour > 23 ||
        minute > 59 || !seconds_part(s, pos, seconds)) {
      return std::nullopt;
    }
  }
  if (pos < s.size() && s[pos] == 'Z') ++pos;
  if (pos != s.size()) return std::nullopt;
  std::tm t{};
  t.tm_year = static_cast<int>(y - 1900);
  t.tm_mon = static_cast<int>(m - 1);
  t.tm_mday = static_cast<int>(d);
  t.tm_hour = static_cast<int>(hour);
  t.tm_min = static_cast<int>(minute);
  return static_cast<double>(::timegm(&t)) + seconds;
}

std::string timestamp_text(double seconds) {
  const auto whole = static_cast<std::time_t>(std::floor(seconds));
  std::tm t{};
  ::gmtime_r(&whole, &t);
  return fmt::format("{:04}-{:02}-{:02} {:02}:{:02}", t.tm_year + 1900, t.tm_mon + 1, t.tm_mday, t.tm_hour, t.tm_min);
}

}  // namespace shaftwork::io

#include "progress_line.hpp"

#include <unistd.h>

#include <cstdio>

#include <fmt/format.h>

namespace shaftwork::cli {
namespace {

double seconds_since(std::chrono::steady_clock::time_point t) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - t).count();
}

// 1234567 -> "1,234,567"
std::string grouped(std::size_t n) {
  std::string digits = std::to_string(n);
  for (std::size_t i = digits.size(); i > 3; i -= 3) digits.insert(i - 3, 1, ',');
  return digits;
}

}  // namespace

ProgressLine::ProgressLine(std::chrono::milliseconds delay)
    : start_(std::chrono::steady_clock::now()), last_draw_(start_), delay_(delay) {}

bool ProgressLine::wanted() { return ::isatty(STDERR_FILENO) == 1; }

void ProgressLine::update(std::size_t rows, std::size_t bytes_read, std::size_t bytes_total) {
  const auto now = std::chrono::steady_clock::now();
  if (now - start_ < delay_ || now - last_draw_ < std::chrono::milliseconds(250)) return;
  last_draw_ = now;
  const double elapsed = seconds_since(start_);
  double left = -1;
  if (bytes_total > 0 && bytes_read > 0 && bytes_read <= bytes_total) {
    left = elapsed * static_cast<double>(bytes_total - bytes_read) / static_cast<double>(bytes_read);
  }
  draw(rows, left);
}

void ProgressLine::draw(std::size_t rows, double seconds_left) {
  const double elapsed = seconds_since(start_);
  const double rate = elapsed > 0 ? static_cast<double>(rows) / elapsed : 0;
  std::string line = fmt::format("\r{} rows, {:.2f} M rows/s", grouped(rows), rate / 1e6);
  if (seconds_left >= 0) line += fmt::format(", {:.0f} s left", seconds_left);
  line += "\x1b[K";  // erase the rest of the previous line
  std::fputs(line.c_str(), stderr);
  std::fflush(stderr);
  shown_ = true;
}

void ProgressLine::finish(std::size_t rows) {
  if (!shown_) return;
  draw(rows, 0);
  std::fputs("\n", stderr);
}

}  // namespace shaftwork::cli

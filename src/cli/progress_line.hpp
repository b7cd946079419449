// A progress line on standard error for long batches: rows done, rows per second and
// the time left, redrawn in place a few times a second.
#pragma once

#include <chrono>
#include <cstddef>

#include "shaftwork/io/batch.hpp"

namespace shaftwork::cli {

class ProgressLine final : public io::BatchProgress {
 public:
  // Shows nothing until `delay` has passed, so short runs stay quiet.
  explicit ProgressLine(std::chrono::milliseconds delay = std::chrono::milliseconds(1000));

  void update(std::size_t rows, std::size_t bytes_read, std::size_t bytes_total) override;
  void finish(std::size_t rows) override;

  // True when standard error is a terminal: the only place a progress line belongs.
  static bool wanted();

 private:
  void draw(std::size_t rows, double seconds_left);

  std::chrono::steady_clock::time_point start_;
  std::chrono::steady_clock::time_point last_draw_;
  std::chrono::milliseconds delay_;
  bool shown_ = false;
};

}  // namespace shaftwork::cli

// A ByteSource over a string, for the io tests (not a test program itself).
#pragma once

#include <algorithm>
#include <cstddef>
#include <string>
#include <utility>

#include "shaftwork/io/byte_stream.hpp"

namespace shaftwork::test {

// Hands out a string in pieces of at most `step` bytes, as a pipe might.
class StringSource final : public io::ByteSource {
 public:
  StringSource(std::string text, std::size_t step) : text_(std::move(text)), step_(step) {}
  std::size_t read(char* buffer, std::size_t capacity) override {
    const std::size_t n = std::min({capacity, step_, text_.size() - pos_});
    std::copy_n(text_.data() + pos_, n, buffer);
    pos_ += n;
    return n;
  }

 private:
  std::string text_;
  std::size_t step_;
  std::size_t pos_ = 0;
};

}  // namespace shaftwork::test

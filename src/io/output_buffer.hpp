// Output text of a batch chunk. Internal to the io layer.
#pragma once

#include <algorithm>
#include <cstddef>
#include <cstring>
#include <memory>
#include <string_view>

namespace shaftwork::io {

// Grows without filling, and is written through a pointer, so that a row of twenty
// numbers costs no more than the numbers themselves.
class OutputBuffer {
 public:
  // Room for n more bytes; write there, then commit(end).
  char* room(std::size_t n) {
    if (size_ + n > capacity_) [[unlikely]] grow(size_ + n);
    return data_.get() + size_;
  }
  void commit(const char* end) { size_ = static_cast<std::size_t>(end - data_.get()); }
  void append(std::string_view text) {
    if (text.empty()) return;  // memcpy into a buffer not yet allocated (null) is undefined
    char* p = room(text.size());
    std::memcpy(p, text.data(), text.size());
    size_ += text.size();
  }
  void push_back(char c) {
    char* p = room(1);
    *p = c;
    ++size_;
  }
  // Appends `text` as one CSV field, quoted when it holds a comma, quote or line break.
  void append_csv_field(std::string_view text) {
    if (text.find_first_of(",\"\r\n") == std::string_view::npos) {
      append(text);
      return;
    }
    push_back('"');
    for (char ch : text) {
      if (ch == '"') push_back('"');
      push_back(ch);
    }
    push_back('"');
  }
  std::string_view view() const { return {data_.get(), size_}; }
  void clear() { size_ = 0; }

 private:
  // Out of line, so that room() and the appends inline where rows are written.
  [[gnu::noinline, gnu::cold]] void grow(std::size_t needed) {
    const std::size_t capacity = std::max(needed, 2 * capacity_ + 4096);
    std::unique_ptr<char[]> data(new char[capacity]);  // not zero-filled: written before read
    if (size_) std::memcpy(data.get(), data_.get(), size_);
    data_ = std::move(data);
    capacity_ = capacity;
  }

  std::unique_ptr<char[]> data_;
  std::size_t size_ = 0;
  std::size_t capacity_ = 0;
};

}  // namespace shaftwork::io

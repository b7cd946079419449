#include "shaftwork/io/byte_stream.hpp"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <utility>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::io {

FdSource::FdSource(int fd, std::string name) : fd_(fd), name_(std::move(name)) {
  struct stat info {};
  if (::fstat(fd_, &info) == 0 && S_ISREG(info.st_mode)) size_ = static_cast<std::size_t>(info.st_size);
}

FdSource FdSource::open(const std::string& path) {
  const int fd = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
  if (fd < 0) {
    throw Error(ErrorKind::bad_input, fmt::format("{}: cannot read the file: {}", path, std::strerror(errno)));
  }
  FdSource source(fd, path);
  source.owned_ = true;
  return source;
}

FdSource::FdSource(FdSource&& other) noexcept
    : fd_(other.fd_), owned_(other.owned_), size_(other.size_), name_(std::move(other.name_)) {
  other.owned_ = false;
}

FdSource::~FdSource() {
  if (owned_) ::close(fd_);
}

std::size_t FdSource::read(char* buffer, std::size_t capacity) {
  for (;;) {
    const ssize_t n = ::read(fd_, buffer, capacity);
    if (n >= 0) return static_cast<std::size_t>(n);
    if (errno == EINTR) continue;
    throw Error(ErrorKind::bad_input, fmt::format("{}: cannot read: {}", name_, std::strerror(errno)));
  }
}

namespace {

// Writes all bytes to fd; returns false with errno set on failure.
bool write_all(int fd, std::string_view bytes) {
  while (!bytes.empty()) {
    const ssize_t n = ::write(fd, bytes.data(), bytes.size());
    if (n < 0) {
      if (errno == EINTR) continue;
      return false;
    }
    bytes.remove_prefix(static_cast<std::size_t>(n));
  }
  return true;
}

}  // namespace

void FdSink::write(std::string_view bytes) {
  if (!write_all(fd_, bytes)) {
    throw Error(ErrorKind::bad_input, fmt::format("{}: cannot write: {}", name_, std::strerror(errno)));
  }
}

ByteSink& standard_output() {
  static FdSink out(STDOUT_FILENO, "standard output");
  return out;
}

SinkStream::Buffer::Buffer(ByteSink& sink) : sink_(sink), data_(64 * 1024, '\0') {
  setp(data_.data(), data_.data() + data_.size());
}

void SinkStream::Buffer::drain() {
  const std::size_t n = static_cast<std::size_t>(pptr() - pbase());
  setp(data_.data(), data_.data() + data_.size());  // emptied even when the sink throws
  if (n) sink_.write(std::string_view(data_.data(), n));
}

int SinkStream::Buffer::sync() {
  drain();
  return 0;
}

SinkStream::Buffer::int_type SinkStream::Buffer::overflow(int_type c) {
  drain();
  if (!traits_type::eq_int_type(c, traits_type::eof())) {
    *pptr() = traits_type::to_char_type(c);
    pbump(1);
  }
  return traits_type::not_eof(c);
}

SinkStream::SinkStream(ByteSink& sink) : std::ostream(nullptr), buffer_(sink) {
  rdbuf(&buffer_);
  exceptions(std::ios::badbit);  // the sink's Error comes out of the operation that met it
}

SinkStream::~SinkStream() {
  try {
    buffer_.pubsync();
  } catch (...) {
    // A destructor must not throw; callers that care flush() first.
  }
}

}  // namespace shaftwork::io

// shaftwork/io/byte_stream.hpp — where a streaming command reads its bytes and writes them.
//
// Small interfaces so that the batch rater reads files, pipes and test strings alike
// and writes to standard output or to a file that appears whole or not at all
// (io::OutputFile, atomic_file.hpp).
#pragma once

#include <cstddef>
#include <ostream>
#include <streambuf>
#include <string>
#include <string_view>
#include <utility>

namespace shaftwork::io {

// A stream of input bytes.
class ByteSource {
 public:
  virtual ~ByteSource() = default;
  // Reads up to `capacity` bytes into `buffer`; returns how many, 0 only at the end.
  // Throws bad_input naming the input when the system cannot read it.
  virtual std::size_t read(char* buffer, std::size_t capacity) = 0;
  // The total size in bytes when it is known in advance (a regular file), else 0.
  virtual std::size_t size_hint() const { return 0; }
};

// A stream of output bytes.
class ByteSink {
 public:
  virtual ~ByteSink() = default;
  // Writes all of `bytes`. Throws bad_input naming the output when the system cannot.
  virtual void write(std::string_view bytes) = 0;
};

// Reads a file descriptor (a file, a pipe, standard input). `name` is for messages.
class FdSource final : public ByteSource {
 public:
  FdSource(int fd, std::string name);
  // Opens `path` for reading; throws bad_input "<path>: cannot read the file: <reason>".
  static FdSource open(const std::string& path);
  FdSource(FdSource&& other) noexcept;
  FdSource(const FdSource&) = delete;
  FdSource& operator=(const FdSource&) = delete;
  FdSource& operator=(FdSource&&) = delete;
  ~FdSource() override;

  std::size_t read(char* buffer, std::size_t capacity) override;
  std::size_t size_hint() const override { return size_; }

 private:
  int fd_;
  bool owned_ = false;
  std::size_t size_ = 0;
  std::string name_;
};

// Writes to a file descriptor it does not own (standard output).
class FdSink final : public ByteSink {
 public:
  FdSink(int fd, std::string name) : fd_(fd), name_(std::move(name)) {}
  void write(std::string_view bytes) override;

 private:
  int fd_;
  std::string name_;
};

// The sink that writes an output file whole or not at all is io::OutputFile
// (atomic_file.hpp).

// Standard output as a sink (not owned, never closed).
ByteSink& standard_output();

// A std::ostream that writes into a ByteSink through a 64 kB buffer, for writers that
// speak streams. A failure of the sink comes out of the stream operation that met it as
// the sink's own shaftwork::Error.
class SinkStream final : public std::ostream {
 public:
  explicit SinkStream(ByteSink& sink);
  SinkStream(const SinkStream&) = delete;
  SinkStream& operator=(const SinkStream&) = delete;
  ~SinkStream() override;

 private:
  class Buffer final : public std::streambuf {
   public:
    explicit Buffer(ByteSink& sink);
    int sync() override;
    int_type overflow(int_type c) override;

   private:
    void drain();
    ByteSink& sink_;
    std::string data_;
  };
  Buffer buffer_;
};

}  // namespace shaftwork::io

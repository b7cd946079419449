#include "shaftwork/io/atomic_file.hpp"

#include <fcntl.h>
#include <sys/stat.h>
#include <unistd.h>

#include <cerrno>
#include <cstdio>
#include <cstring>
#include <vector>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::io {

void write_file_atomically(const std::string& path, const std::string& content) {
  std::string temp = path + ".XXXXXX";
  std::vector<char> name(temp.begin(), temp.end());
  name.push_back('\0');
  const int fd = ::mkstemp(name.data());
  if (fd < 0) {
    throw Error(ErrorKind::bad_input, fmt::format("{}: cannot write: {}", path, std::strerror(errno)));
  }
  temp.assign(name.data());
  auto fail = [&](const char* step) {
    const std::string reason = std::strerror(errno);
    ::close(fd);
    ::unlink(temp.c_str());
    throw Error(ErrorKind::bad_input, fmt::format("{}: cannot write ({}): {}", path, step, reason));
  };
  size_t written = 0;
  while (written < content.size()) {
    const ssize_t n = ::write(fd, content.data() + written, content.size() - written);
    if (n < 0) {
      if (errno == EINTR) continue;
      fail("write");
    }
    written += static_cast<size_t>(n);
  }
  if (::fchmod(fd, 0644) != 0) fail("permissions");
  if (::fsync(fd) != 0) fail("sync");
  if (::close(fd) != 0) {
    const std::string reason = std::strerror(errno);
    ::unlink(temp.c_str());
    throw Error(ErrorKind::bad_input, fmt::format("{}: cannot write (close): {}", path, reason));
  }
  if (std::rename(temp.c_str(), path.c_str()) != 0) {
    const std::string reason = std::strerror(errno);
    ::unlink(temp.c_str());
    throw Error(ErrorKind::bad_input, fmt::format("{}: cannot write (rename): {}", path, reason));
  }
}

}  // namespace shaftwork::io

#include "shaftwork/io/text_file.hpp"

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <iterator>
#include <sstream>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::io {

std::string read_text_file(const std::string& path) {
  if (path == "-") {
    return std::string(std::istreambuf_iterator<char>(std::cin), std::istreambuf_iterator<char>());
  }
  std::error_code ec;
  if (std::filesystem::is_directory(path, ec)) {
    throw Error(ErrorKind::bad_input, fmt::format("{}: is a directory, not a file", path));
  }
  std::ifstream file(path, std::ios::binary);
  if (!file) {
    throw Error(ErrorKind::bad_input, fmt::format("{}: cannot read the file: {}", path, std::strerror(errno)));
  }
  std::ostringstream text;
  text << file.rdbuf();
  if (file.bad()) throw Error(ErrorKind::bad_input, fmt::format("{}: cannot read the file", path));
  return text.str();
}

}  // namespace shaftwork::io

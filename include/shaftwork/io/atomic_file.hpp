// shaftwork/io/atomic_file.hpp — write a file whole or not at all.
#pragma once

#include <string>

namespace shaftwork::io {

// Writes `content` to a temporary file beside `path`, flushes it to disk and
// renames it over `path` (rename is atomic on POSIX file systems). On any failure
// the temporary file is removed, `path` is left as it was, and bad_input is thrown
// naming the path and the system's reason.
void write_file_atomically(const std::string& path, const std::string& content);

}  // namespace shaftwork::io

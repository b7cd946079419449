// shaftwork/io/text_file.hpp — read a whole input file.
#pragma once

#include <string>

namespace shaftwork::io {

// The whole content of the file at `path`, or of standard input for "-". Throws
// bad_input "PATH: cannot read the file: REASON" when it cannot be opened or read,
// and "PATH: is a directory, not a file" for a directory.
std::string read_text_file(const std::string& path);

}  // namespace shaftwork::io

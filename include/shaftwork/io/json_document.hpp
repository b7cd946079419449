// shaftwork/io/json_document.hpp — read JSON text strictly, as every input file is read.
#pragma once

#include <string>
#include <string_view>

#include <nlohmann/json.hpp>

namespace shaftwork::io {

// The deepest nesting of arrays and objects a JSON input may have. A case file needs
// five or six levels (cases, a case, its fluid, a mixture, ...); the limit keeps every
// recursive walk over a document (our readers, nlohmann's dump) far from the end of
// the stack, which a file of 100,000 nested arrays reached.
inline constexpr int kMaxJsonDepth = 64;

// Parses JSON text strictly: a duplicate key in any object is an error, since the file
// would otherwise mean two things, and so is nesting deeper than kMaxJsonDepth. Throws
// bad_input naming `origin` (and, for a syntax error, the line and column).
nlohmann::json parse_json_strict(std::string_view text, const std::string& origin);

}  // namespace shaftwork::io

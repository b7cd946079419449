// shaftwork/io/case_runner.hpp — read a case document and rate every case in it.
//
// A case that cannot be read or rated becomes an error outcome in its place; the
// other cases are rated all the same.
#pragma once

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/io/fluid_factory.hpp"
#include "shaftwork/io/json_document.hpp"  // parse_json_strict, for the callers that rate what they parse
#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::io {

// Rates one case object of the file `origin`; never throws for a problem of the case itself.
CaseOutcome rate_case(const nlohmann::json& case_object, size_t index, FluidFactory& fluids,
                      const std::string& origin = "");

// Rates every case of a document (each case's own guarantee judged with it). Throws
// bad_input when it is not a case file.
std::vector<CaseOutcome> rate_document(const nlohmann::json& document, const std::string& origin,
                                       FluidFactory& fluids);

// A file's cases and, when the file holds a guarantee beside "cases", the test judged on
// all of them.
struct RatedFile {
  std::vector<CaseOutcome> cases;
  std::optional<TestOutcome> test;
};
// rate_document, and the file's guarantee. Throws bad_input when it is not a case file.
RatedFile rate_file(const nlohmann::json& document, const std::string& origin, FluidFactory& fluids);

}  // namespace shaftwork::io

// shaftwork/io/case_runner.hpp — read a case document and rate every case in it.
//
// A case that cannot be read or rated becomes an error outcome in its place; the
// other cases are rated all the same.
#pragma once

#include <map>
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
// `file_uncertainty`: the file's uncertainties by key, for the given values that state none
// (the case's own statements first). With uncertainties, the outcome carries their
// propagation to every result. The case's own guarantee (io/guarantee_reader.hpp) is
// judged with it, on those uncertainties.
CaseOutcome rate_case(const nlohmann::json& case_object, size_t index, FluidFactory& fluids,
                      const std::string& origin = "", const std::vector<StatedUncertainty>& file_uncertainty = {});

// The uncertainties by key of a file of cases (its "uncertainty" beside "cases"). Throws
// bad_input "<origin>: uncertainty...: ..." for a bad one: every case would carry it.
std::vector<StatedUncertainty> file_uncertainty(const nlohmann::json& document, const std::string& origin);

// Rates every case of a document (each case's own guarantee judged with it). Throws
// bad_input when it is not a case file.
std::vector<CaseOutcome> rate_document(const nlohmann::json& document, const std::string& origin,
                                       FluidFactory& fluids);

// A file's cases and, when the file holds a guarantee beside "cases", the test judged on
// all of them (rate_document and a FileTest; the rate command streams instead).
struct RatedFile {
  std::vector<CaseOutcome> cases;
  std::optional<TestOutcome> test;
};
// rate_document, and the file's guarantee. Throws bad_input when it is not a case file.
RatedFile rate_file(const nlohmann::json& document, const std::string& origin, FluidFactory& fluids);

// Ids seen so far in one run, with where: a second case of one id gets a warning. Shared by
// rate and check, so that a record check writes is what rate writes.
class CaseIdRegister {
 public:
  void check(CaseOutcome& outcome, size_t index);

 private:
  std::map<std::string, std::string> seen_;
};

}  // namespace shaftwork::io

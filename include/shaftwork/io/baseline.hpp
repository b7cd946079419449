// shaftwork/io/baseline.hpp — recorded results (`rate --format json`, `check --record`),
// matched to the cases of a check run by file and id.
//
// A baseline of 10,000 cases is some 15 MB of JSON; it is read in one pass (nlohmann's SAX
// interface) straight into what a check compares, a number per result key, without
// building the document: a tenth of the memory, and a few times faster.
#pragma once

#include <cstddef>
#include <string>
#include <string_view>
#include <unordered_map>
#include <utility>
#include <vector>

#include "shaftwork/io/result_keys.hpp"

namespace shaftwork::io {

// The name a case file goes by in results and baselines: the path with "." and ".."
// steps resolved and '/' separators ("./examples//a.json" is "examples/a.json"), so that
// a baseline recorded from a directory matches a run over the file and back.
std::string normal_file_name(const std::string& path);

// One recorded result, as much of it as a check compares.
struct RecordedResult {
  std::string file;  // normal_file_name of its "file" ("" when it has none)
  std::string id;
  std::string status;  // "ok" or "error"
  std::string error;   // of a failed case
  ResultNumbers numbers;  // by row of result_keys()
  // Numbers under dotted keys that are no result keys (a baseline of another version).
  std::vector<std::pair<std::string, double>> unknown;
};

class Baseline {
 public:
  // Reads a results document: {"results": [...]}, each result an object with a string "id"
  // and, from a file, a string "file"; numbers inside objects (not arrays) are taken by
  // their dotted keys. Throws bad_input "ORIGIN: not a results file: ..." naming what is
  // wrong, or "ORIGIN: not valid JSON: ..." with the line and column.
  Baseline(std::string_view text, const std::string& origin);

  // The recorded result of case `id` of `file` (a normal_file_name), or nullptr. Each
  // result is handed out once: cases with the same file and id take their results in the
  // recorded order.
  const RecordedResult* take(const std::string& file, const std::string& id);
  // The results no case took, in the recorded order.
  std::vector<const RecordedResult*> untaken() const;

 private:
  struct Matches {
    std::vector<std::size_t> at;  // indexes into results_, in order
    std::size_t next = 0;         // the first not yet taken
  };
  std::vector<RecordedResult> results_;
  std::unordered_map<std::string, Matches> index_;  // by file + '\n' + id
  std::vector<bool> taken_;
};

}  // namespace shaftwork::io

// shaftwork/io/baseline.hpp — recorded results (`rate --format json`, `check --record`),
// matched to the cases of a check run by file and id.
#pragma once

#include <cstddef>
#include <string>
#include <unordered_map>
#include <vector>

#include <nlohmann/json.hpp>

namespace shaftwork::io {

// The name a case file goes by in results and baselines: the path with "." and ".."
// steps resolved and '/' separators ("./examples//a.json" is "examples/a.json"), so that
// a baseline recorded from a directory matches a run over the file and back.
std::string normal_file_name(const std::string& path);

class Baseline {
 public:
  // Takes a results document: {"results": [...]}, each result an object with a string "id"
  // and, from a file, a string "file". Throws bad_input "ORIGIN: not a results file: ..."
  // naming what is wrong.
  Baseline(nlohmann::json document, const std::string& origin);

  // The recorded result of case `id` of `file`, or nullptr. Each result is handed out
  // once: cases with the same file and id take their results in the recorded order.
  const nlohmann::json* take(const std::string& file, const std::string& id);
  // The results no case took, in the recorded order.
  std::vector<const nlohmann::json*> untaken() const;

 private:
  struct Matches {
    std::vector<std::size_t> at;  // indexes into results, in order
    std::size_t next = 0;         // the first not yet taken
  };
  nlohmann::json document_;
  std::unordered_map<std::string, Matches> index_;  // by file + '\n' + id
  std::vector<bool> taken_;
};

}  // namespace shaftwork::io

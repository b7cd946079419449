#include "shaftwork/io/baseline.hpp"

#include <filesystem>
#include <optional>
#include <utility>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/io/case_runner.hpp"

namespace shaftwork::io {
namespace {

using nlohmann::json;

std::string match_key(const std::string& file, const std::string& id) { return file + '\n' + id; }

// The row of a dotted result key, or nothing.
std::optional<std::size_t> row_of_key(const std::string& key) {
  static const std::unordered_map<std::string_view, std::size_t> rows = [] {
    std::unordered_map<std::string_view, std::size_t> m;
    for (const ResultKey& k : result_keys()) m.emplace(k.key, row_of(k));
    return m;
  }();
  const auto found = rows.find(key);
  return found == rows.end() ? std::nullopt : std::optional<std::size_t>(found->second);
}

// Reads {"results": [...]} event by event into RecordedResults. Where a value stands decides
// what it is: the frames are the open objects and arrays, innermost last.
class ResultsReader final : public nlohmann::json_sax<json> {
 public:
  explicit ResultsReader(const std::string& origin) : origin_(origin) {}

  std::vector<RecordedResult> results;
  bool saw_results = false;

  bool null() override { return scalar(); }
  bool boolean(bool) override { return scalar(); }
  bool number_integer(number_integer_t v) override { return number(static_cast<double>(v)); }
  bool number_unsigned(number_unsigned_t v) override { return number(static_cast<double>(v)); }
  bool number_float(number_float_t v, const string_t&) override { return number(v); }
  bool binary(binary_t&) override { return scalar(); }
  bool key(string_t& k) override {
    key_ = k;
    return true;
  }
  bool string(string_t& text) override;
  bool start_object(std::size_t) override;
  bool start_array(std::size_t) override;
  bool end_object() override { return close(); }
  bool end_array() override { return close(); }
  bool parse_error(std::size_t, const std::string&, const nlohmann::detail::exception&) override { return false; }

  [[noreturn]] void refuse(const std::string& what) const {
    throw Error(ErrorKind::bad_input, fmt::format("{}: not a results file: {} (record one with shaftwork check "
                                                  "--record)",
                                                  origin_, what));
  }
  [[noreturn]] void refuse_layout() const {
    refuse("expected {\"results\": [...]} as shaftwork rate --format json writes it");
  }

 private:
  enum class Kind { root, results, result, inner, skipped };
  struct Frame {
    Kind kind;
    std::string prefix;  // of a result's objects: the dotted key so far, "outlet."
  };

  // Where a value that is not a result's own key stands: refused where a result or the
  // results array belongs.
  Kind place_of_value() const {
    if (frames_.empty()) refuse_layout();
    const Kind k = frames_.back().kind;
    if (k == Kind::root && key_ == "results") refuse_layout();
    if (k == Kind::results) refuse(fmt::format("results[{}] is not a result object with a string \"id\"", results.size()));
    return k;
  }
  // Where a value other than a string stands; a result's "file" must be a string.
  Kind place_of_nonstring() const {
    const Kind k = place_of_value();
    if (k == Kind::result && key_ == "file") refuse(fmt::format("results[{}]: \"file\" is not a string", at()));
    return k;
  }
  bool scalar() {
    place_of_nonstring();
    return true;
  }
  bool number(double v);
  bool close();
  std::size_t at() const { return results.size() - 1; }
  void once(unsigned bit) {
    if (seen_ & bit) refuse(fmt::format("results[{}]: the key \"{}\" appears twice", at(), key_));
    seen_ |= bit;
  }

  const std::string& origin_;
  std::vector<Frame> frames_;
  std::string key_;     // the key of the value to come
  std::string dotted_;  // a buffer for dotted keys
  unsigned seen_ = 0;   // id, file, status, error of the current result: read once each
};

bool ResultsReader::number(double v) {
  const Kind k = place_of_nonstring();
  if (k != Kind::result && k != Kind::inner) return true;
  dotted_ = frames_.back().prefix;
  dotted_ += key_;
  RecordedResult& r = results.back();
  if (const auto row = row_of_key(dotted_)) {
    if (r.numbers[*row]) refuse(fmt::format("results[{}]: the key \"{}\" appears twice", at(), dotted_));
    r.numbers[*row] = v;
  } else {
    r.unknown.emplace_back(dotted_, v);
  }
  return true;
}

bool ResultsReader::string(string_t& text) {
  if (place_of_value() != Kind::result) return true;
  RecordedResult& r = results.back();
  constexpr std::pair<const char*, std::string RecordedResult::*> kTexts[] = {
      {"id", &RecordedResult::id}, {"file", &RecordedResult::file},
      {"status", &RecordedResult::status}, {"error", &RecordedResult::error}};
  for (unsigned i = 0; i < std::size(kTexts); ++i) {
    if (key_ != kTexts[i].first) continue;
    once(1u << i);
    r.*(kTexts[i].second) = std::move(text);
  }
  return true;
}

bool ResultsReader::start_object(std::size_t) {
  if (frames_.empty()) {
    frames_.push_back({Kind::root, {}});
    return true;
  }
  const Frame& top = frames_.back();
  if (top.kind == Kind::results) {
    results.emplace_back().numbers.assign(result_keys().size(), std::nullopt);
    seen_ = 0;
    frames_.push_back({Kind::result, {}});
  } else if (top.kind == Kind::result || top.kind == Kind::inner) {
    frames_.push_back({Kind::inner, top.prefix + key_ + "."});
  } else {
    place_of_nonstring();
    frames_.push_back({Kind::skipped, {}});
  }
  return true;
}

bool ResultsReader::start_array(std::size_t) {
  if (!frames_.empty() && frames_.back().kind == Kind::root && key_ == "results") {
    if (saw_results) refuse("the key \"results\" appears twice");
    saw_results = true;
    frames_.push_back({Kind::results, {}});
    return true;
  }
  place_of_nonstring();
  frames_.push_back({Kind::skipped, {}});
  return true;
}

bool ResultsReader::close() {
  if (frames_.back().kind == Kind::result) {
    RecordedResult& r = results.back();
    if (!(seen_ & 1u)) refuse(fmt::format("results[{}] is not a result object with a string \"id\"", at()));
    r.file = normal_file_name(r.file);
  }
  frames_.pop_back();
  return true;
}

}  // namespace

std::string normal_file_name(const std::string& path) {
  const std::string normal = std::filesystem::path(path).lexically_normal().generic_string();
  return normal.empty() ? path : normal;
}

Baseline::Baseline(std::string_view text, const std::string& origin) {
  ResultsReader reader(origin);
  if (!json::sax_parse(text.begin(), text.end(), &reader)) {
    parse_json_strict(text, origin);  // throws the syntax error, with the line and column
    throw Error(ErrorKind::bad_input, fmt::format("{}: not valid JSON", origin));
  }
  if (!reader.saw_results) reader.refuse_layout();
  results_ = std::move(reader.results);
  taken_.assign(results_.size(), false);
  for (std::size_t i = 0; i < results_.size(); ++i) index_[match_key(results_[i].file, results_[i].id)].at.push_back(i);
}

const RecordedResult* Baseline::take(const std::string& file, const std::string& id) {
  const auto found = index_.find(match_key(file, id));
  if (found == index_.end() || found->second.next == found->second.at.size()) return nullptr;
  const std::size_t i = found->second.at[found->second.next++];
  taken_[i] = true;
  return &results_[i];
}

std::vector<const RecordedResult*> Baseline::untaken() const {
  std::vector<const RecordedResult*> out;
  for (std::size_t i = 0; i < results_.size(); ++i) {
    if (!taken_[i]) out.push_back(&results_[i]);
  }
  return out;
}

}  // namespace shaftwork::io

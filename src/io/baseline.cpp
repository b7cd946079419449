#include "shaftwork/io/baseline.hpp"

#include <filesystem>
#include <utility>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::io {
namespace {

using nlohmann::json;

std::string match_key(const std::string& file, const std::string& id) { return file + '\n' + id; }

std::string string_at(const json& result, const char* key) {
  const auto found = result.find(key);
  return found != result.end() && found->is_string() ? found->get<std::string>() : std::string();
}

}  // namespace

std::string normal_file_name(const std::string& path) {
  const std::string normal = std::filesystem::path(path).lexically_normal().generic_string();
  return normal.empty() ? path : normal;
}

Baseline::Baseline(json document, const std::string& origin) : document_(std::move(document)) {
  const auto refuse = [&origin](const std::string& what) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: not a results file: {} (record one with shaftwork check --record)", origin, what));
  };
  if (!document_.is_object() || !document_.contains("results") || !document_["results"].is_array()) {
    refuse("expected {\"results\": [...]} as shaftwork rate --format json writes it");
  }
  const json& results = document_["results"];
  taken_.assign(results.size(), false);
  for (std::size_t i = 0; i < results.size(); ++i) {
    const json& r = results[i];
    if (!r.is_object() || !r.contains("id") || !r["id"].is_string()) {
      refuse(fmt::format("results[{}] is not a result object with a string \"id\"", i));
    }
    if (r.contains("file") && !r["file"].is_string()) refuse(fmt::format("results[{}]: \"file\" is not a string", i));
    index_[match_key(normal_file_name(string_at(r, "file")), r["id"].get<std::string>())].at.push_back(i);
  }
}

const json* Baseline::take(const std::string& file, const std::string& id) {
  const auto found = index_.find(match_key(file, id));
  if (found == index_.end() || found->second.next == found->second.at.size()) return nullptr;
  const std::size_t i = found->second.at[found->second.next++];
  taken_[i] = true;
  return &document_["results"][i];
}

std::vector<const json*> Baseline::untaken() const {
  std::vector<const json*> out;
  const json& results = document_["results"];
  for (std::size_t i = 0; i < results.size(); ++i) {
    if (!taken_[i]) out.push_back(&results[i]);
  }
  return out;
}

}  // namespace shaftwork::io

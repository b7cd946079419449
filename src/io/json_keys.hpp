// Checks of JSON object keys shared by the case and fluid readers (internal to io).
#pragma once

#include <span>
#include <string>
#include <string_view>
#include <vector>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

namespace shaftwork::io::detail {

// Appends a warning for each key of `object` that is not in `known`, named by its
// dotted path (`prefix` holds the path of `object` with a trailing dot, or ""): a
// misspelt key must never be silently ignored.
inline void warn_unknown_keys(const nlohmann::json& object, std::span<const std::string_view> known,
                              const std::string& prefix, std::vector<std::string>& warnings) {
  for (const auto& item : object.items()) {
    bool found = false;
    for (std::string_view k : known) found = found || k == item.key();
    if (!found) warnings.push_back(fmt::format("unknown key \"{}{}\" ignored", prefix, item.key()));
  }
}

}  // namespace shaftwork::io::detail

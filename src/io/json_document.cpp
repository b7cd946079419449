#include "shaftwork/io/json_document.hpp"

#include <algorithm>
#include <set>
#include <vector>

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::io {

using nlohmann::json;

namespace {

// nlohmann's messages quote what it read ("last read: '...'"), which for a file holding one
// 100 MB line is the whole line. Quoted runs longer than this keep their two ends.
constexpr std::size_t kLongestQuote = 48;

std::string shorten_quotes(const std::string& message) {
  std::string out;
  std::size_t at = 0;
  while (at < message.size()) {
    const std::size_t open = message.find('\'', at);
    const std::size_t close = open == std::string::npos ? open : message.find('\'', open + 1);
    if (close == std::string::npos) break;
    const std::size_t length = close - open - 1;
    out.append(message, at, open + 1 - at);
    if (length > kLongestQuote) {
      out.append(message, open + 1, 16);
      out += fmt::format("... ({} characters) ...", length);
      out.append(message, close - 24, 24);
    } else {
      out.append(message, open + 1, length);
    }
    out += '\'';
    at = close + 1;
  }
  out.append(message, std::min(at, message.size()), std::string::npos);
  return out;
}

// `depth` is how many arrays and objects enclose the one that starts (nlohmann counts
// the outermost as depth 0). Throwing from the parser's callback stops it at once.
void refuse_depth(int depth, const std::string& origin) {
  if (depth >= kMaxJsonDepth) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: arrays and objects nested more than {} levels deep; no shaftwork input needs "
                            "more than ten",
                            origin, kMaxJsonDepth));
  }
}

}  // namespace

json parse_json_strict(std::string_view text, const std::string& origin) {
  std::vector<std::set<std::string>> keys_per_object;
  std::string duplicate;
  auto watch = [&](int depth, json::parse_event_t event, json& parsed) {
    switch (event) {
      case json::parse_event_t::object_start:
        refuse_depth(depth, origin);
        keys_per_object.emplace_back();
        break;
      case json::parse_event_t::array_start: refuse_depth(depth, origin); break;
      case json::parse_event_t::object_end: keys_per_object.pop_back(); break;
      case json::parse_event_t::key:
        if (!keys_per_object.back().insert(parsed.get<std::string>()).second && duplicate.empty()) {
          duplicate = parsed.get<std::string>();
        }
        break;
      default: break;
    }
    return true;
  };
  json document;
  try {
    document = json::parse(text.begin(), text.end(), watch);
  } catch (const json::parse_error& e) {
    // nlohmann's text reads "[json.exception.parse_error.101] parse error at line 3, column 5: ..."
    std::string what = e.what();
    if (auto at = what.find("parse error"); at != std::string::npos) what = what.substr(at);
    throw Error(ErrorKind::bad_input, fmt::format("{}: not valid JSON: {}", origin, shorten_quotes(what)));
  } catch (const json::exception& e) {
    // A number beyond double's range ("1e400") is out_of_range.406, not a parse_error.
    std::string what = e.what();
    if (auto at = what.find("] "); at != std::string::npos) what = what.substr(at + 2);
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: not valid JSON: {}{}", origin, shorten_quotes(what),
                            e.id == 406 ? " (beyond the largest number a double holds, about 1.8e308)" : ""));
  }
  if (!duplicate.empty()) {
    throw Error(ErrorKind::bad_input,
                fmt::format("{}: the key \"{}\" appears twice in one object; keep one", origin, duplicate));
  }
  return document;
}

}  // namespace shaftwork::io

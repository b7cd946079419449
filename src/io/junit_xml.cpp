// JUnit XML: the element and attribute names are those CI test-report readers expect
// (testsuites, testsuite, testcase, failure, error; tests, failures, errors, skipped).
#include "shaftwork/io/junit_xml.hpp"

#include <algorithm>
#include <cstdint>
#include <initializer_list>
#include <unordered_map>

#include <fmt/format.h>

#include "shaftwork/text.hpp"

namespace shaftwork::io {
namespace {

constexpr std::string_view kReplacement = "\xEF\xBF\xBD";  // U+FFFD in UTF-8

// The length of the well-formed UTF-8 sequence starting text[at] that is an XML character
// (RFC 3629: no overlong forms, no surrogates, nothing above U+10FFFF; XML 1.0 section
// 2.2: not U+FFFE or U+FFFF), or 0.
std::size_t utf8_char_length(std::string_view text, std::size_t at) {
  const auto byte = [&](std::size_t i) { return static_cast<std::uint8_t>(text[at + i]); };
  const std::uint8_t lead = byte(0);
  std::size_t length = 0;
  std::uint8_t low = 0x80, high = 0xBF;  // the range of the second byte
  if (lead >= 0xC2 && lead <= 0xDF) {
    length = 2;
  } else if (lead >= 0xE0 && lead <= 0xEF) {
    length = 3;
    if (lead == 0xE0) low = 0xA0;   // overlong
    if (lead == 0xED) high = 0x9F;  // surrogates
  } else if (lead >= 0xF0 && lead <= 0xF4) {
    length = 4;
    if (lead == 0xF0) low = 0x90;   // overlong
    if (lead == 0xF4) high = 0x8F;  // above U+10FFFF
  }
  if (length == 0 || at + length > text.size()) return 0;
  if (byte(1) < low || byte(1) > high) return 0;
  for (std::size_t i = 2; i < length; ++i) {
    if (byte(i) < 0x80 || byte(i) > 0xBF) return 0;
  }
  if (lead == 0xEF && byte(1) == 0xBF && (byte(2) == 0xBE || byte(2) == 0xBF)) return 0;  // U+FFFE, U+FFFF
  return length;
}

// One ASCII character.
void append_ascii(std::string& out, char c, bool attribute) {
  switch (c) {
    case '&': out += "&amp;"; return;
    case '<': out += "&lt;"; return;
    case '>': out += "&gt;"; return;
    case '"': out += "&quot;"; return;
    case '\'': out += "&apos;"; return;
    case '\r': out += "&#13;"; return;
    case '\n': out += attribute ? "&#10;" : "\n"; return;
    case '\t': out += attribute ? "&#9;" : "\t"; return;
    default: break;
  }
  if (static_cast<unsigned char>(c) < 0x20) {
    out += escape_control(std::string_view(&c, 1));
  } else {
    out += c;
  }
}

std::string attribute(std::string_view text) { return xml_escaped(text, true); }

std::size_t count(const std::vector<const CaseCheck*>& checks, std::initializer_list<Verdict> verdicts) {
  return static_cast<std::size_t>(std::count_if(checks.begin(), checks.end(), [&](const CaseCheck* c) {
    return std::find(verdicts.begin(), verdicts.end(), c->verdict) != verdicts.end();
  }));
}

std::string joined_lines(const std::vector<std::string>& lines) {
  std::string out;
  for (const std::string& line : lines) out += (out.empty() ? "" : "\n") + line;
  return out;
}

void write_testcase(std::ostream& out, const CaseCheck& c) {
  const bool whole_file = c.verdict == Verdict::unusable;
  out << fmt::format("    <testcase name=\"{}\" classname=\"{}\"", attribute(whole_file ? c.file : c.id),
                     attribute(c.file));
  if (c.verdict == Verdict::passed) {
    out << "/>\n";
    return;
  }
  const bool failure = c.verdict == Verdict::failed || c.verdict == Verdict::missing;
  const char* element = failure ? "failure" : "error";
  const char* type = c.verdict == Verdict::failed    ? "moved"
                     : c.verdict == Verdict::missing ? "missing"
                     : c.verdict == Verdict::error   ? "error"
                                                     : "unusable file";
  std::string message = c.details.empty() ? std::string() : c.details.front();
  if (c.details.size() > 1) message += fmt::format(" (and {} more)", c.details.size() - 1);
  out << fmt::format(">\n      <{} message=\"{}\" type=\"{}\">{}</{}>\n    </testcase>\n", element,
                     attribute(message), type, xml_escaped(joined_lines(c.details), false), element);
}

}  // namespace

std::string xml_escaped(std::string_view text, bool attr) {
  std::string out;
  out.reserve(text.size());
  for (std::size_t at = 0; at < text.size();) {
    if (static_cast<unsigned char>(text[at]) < 0x80) {
      append_ascii(out, text[at], attr);
      ++at;
      continue;
    }
    const std::size_t length = utf8_char_length(text, at);
    out += length == 0 ? kReplacement : text.substr(at, length);
    at += std::max<std::size_t>(length, 1);
  }
  return out;
}

void write_junit(std::ostream& out, const std::vector<CaseCheck>& checks) {
  std::vector<const CaseCheck*> all;
  std::vector<std::string> files;  // in the order first met
  std::unordered_map<std::string, std::vector<const CaseCheck*>> of_file;
  for (const CaseCheck& c : checks) {
    all.push_back(&c);
    const auto [at, first] = of_file.try_emplace(c.file);
    if (first) files.push_back(c.file);
    at->second.push_back(&c);
  }
  const auto counts = [](const std::vector<const CaseCheck*>& of) {
    return fmt::format("tests=\"{}\" failures=\"{}\" errors=\"{}\"", of.size(),
                       count(of, {Verdict::failed, Verdict::missing}), count(of, {Verdict::error, Verdict::unusable}));
  };
  out << "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n";
  out << fmt::format("<testsuites name=\"shaftwork check\" {}>\n", counts(all));
  for (const std::string& file : files) {
    const auto& cases = of_file[file];
    out << fmt::format("  <testsuite name=\"{}\" {} skipped=\"0\">\n", attribute(file), counts(cases));
    for (const CaseCheck* c : cases) write_testcase(out, *c);
    out << "  </testsuite>\n";
  }
  out << "</testsuites>\n";
}

}  // namespace shaftwork::io

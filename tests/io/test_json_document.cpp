// Strict JSON reading (io::parse_json_strict): the nesting limit. Syntax errors and
// duplicate keys are checked in test_case_reader.cpp.
#include <string>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/io/json_document.hpp"

using namespace shaftwork;

namespace {

std::string message(const std::string& text) {
  try {
    io::parse_json_strict(text, "deep.json");
  } catch (const Error& e) {
    return e.what();
  }
  return "";
}

std::string nested(int levels, char open, char close) {
  return std::string(static_cast<std::size_t>(levels), open) + std::string(static_cast<std::size_t>(levels), close);
}

std::string nested_objects(int levels) {
  std::string text;
  for (int i = 0; i < levels; ++i) text += "{\"a\": ";
  text += "1";
  for (int i = 0; i < levels; ++i) text += "}";
  return text;
}

const std::string kRefusal =
    "deep.json: arrays and objects nested more than 64 levels deep; no shaftwork input needs more than ten";

}  // namespace

TEST_CASE("JSON nested up to the limit is read; one level more is refused, naming the file") {
  CHECK(message(nested(io::kMaxJsonDepth, '[', ']')).empty());
  CHECK(message(nested_objects(io::kMaxJsonDepth)).empty());
  CHECK(message(nested(io::kMaxJsonDepth + 1, '[', ']')) == kRefusal);
  CHECK(message(nested_objects(io::kMaxJsonDepth + 1)) == kRefusal);
  // Mixed, and deep inside a case: the depth counts every enclosing array and object.
  const std::string fluid = "{\"cases\": [{\"fluid\": " + nested(io::kMaxJsonDepth - 2, '[', ']') + "}]}";
  CHECK(message(fluid) == kRefusal);
}

TEST_CASE("a file of 100,000 nested arrays is refused quickly, without exhausting the stack") {
  CHECK(message(nested(100000, '[', ']')) == kRefusal);
  CHECK(message("{\"fluid\": " + nested_objects(100000) + "}") == kRefusal);
}

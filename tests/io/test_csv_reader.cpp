// CSV reading (RFC 4180): quoting, doubled quotes, CRLF, the byte-order mark, line
// breaks inside quotes, ragged rows, malformed records with their messages, and the
// chunker's cuts, which must fall between records however the input arrives.
#include <algorithm>
#include <string>
#include <vector>

#include <catch2/catch.hpp>

#include "shaftwork/error.hpp"
#include "shaftwork/io/csv_reader.hpp"
#include "io/string_source.hpp"

using namespace shaftwork;
using io::CsvRow;
using Fields = std::vector<std::string>;

namespace {

using test::StringSource;

// Every record of `text` read through the chunker with chunks of about `target` bytes,
// arriving `step` bytes at a time; each row's fields, or its error, with its line.
std::vector<CsvRow> read_chunked(const std::string& text, std::size_t target, std::size_t step) {
  StringSource source(text, step);
  io::CsvChunker chunker(source, "test.csv", target);
  io::CsvChunk chunk;
  std::vector<CsvRow> rows;
  while (chunker.next(chunk)) {
    io::CsvRecordParser parser(chunk.text, chunk.first_line);
    io::CsvRecord record;
    while (parser.next(record)) {
      CsvRow row;
      row.line = record.line;
      row.error = record.error;
      for (auto f : record.fields) row.fields.emplace_back(f);
      rows.push_back(std::move(row));
    }
  }
  return rows;
}

}  // namespace

TEST_CASE("plain fields, LF and CRLF line ends, a last line without its end") {
  const auto rows = io::parse_csv("a,b,c\n1,2,3\r\n4,,6");
  REQUIRE(rows.size() == 3);
  CHECK(rows[0].fields == Fields{"a", "b", "c"});
  CHECK(rows[1].fields == Fields{"1", "2", "3"});  // the CR of CRLF is not part of the field
  CHECK(rows[2].fields == Fields{"4", "", "6"});
  CHECK(rows[2].line == 3);
}

TEST_CASE("quoted fields hold commas, doubled quotes and line breaks") {
  const auto rows = io::parse_csv("id,note\r\n\"A, B\",\"say \"\"hi\"\"\"\r\n\"two\r\nlines\",x\r\nlast,\"\"\r\n");
  REQUIRE(rows.size() == 4);
  CHECK(rows[1].fields == Fields{"A, B", "say \"hi\""});
  CHECK(rows[2].fields == Fields{"two\r\nlines", "x"});  // inside quotes the CRLF is data
  CHECK(rows[2].line == 3);
  CHECK(rows[3].fields == Fields{"last", ""});
  CHECK(rows[3].line == 5);  // the record with the line break took lines 3 and 4
}

TEST_CASE("a UTF-8 byte-order mark at the start is skipped, elsewhere it is data") {
  const auto rows = io::parse_csv("\xEF\xBB\xBF" "id,x\n" "\xEF\xBB\xBF" "a,1\n");
  REQUIRE(rows.size() == 2);
  CHECK(rows[0].fields == Fields{"id", "x"});
  CHECK(rows[1].fields[0] == "\xEF\xBB\xBF" "a");
}

TEST_CASE("empty lines are skipped and keep the line count") {
  const auto rows = io::parse_csv("a\n\n\r\nb\n\n");
  REQUIRE(rows.size() == 2);
  CHECK(rows[1].fields == Fields{"b"});
  CHECK(rows[1].line == 4);
}

TEST_CASE("ragged rows come back with the fields they have") {
  const auto rows = io::parse_csv("a,b,c\n1,2\n1,2,3,4\n");
  REQUIRE(rows.size() == 3);
  CHECK(rows[1].fields == Fields{"1", "2"});
  CHECK(rows[2].fields == Fields{"1", "2", "3", "4"});
}

TEST_CASE("malformed records are named, and the next record reads normally") {
  const auto rows = io::parse_csv("a,\"b\"x,c\nok,1\nlast,\"open\n");
  REQUIRE(rows.size() == 3);
  CHECK(rows[0].error == "text after the closing quote of field 2");
  CHECK(rows[0].fields.empty());
  CHECK(rows[1].fields == Fields{"ok", "1"});
  CHECK(rows[2].error == "the quoted field 2 is not closed before the end of the input");
  CHECK(rows[2].line == 3);
}

TEST_CASE("a stray quote in an unquoted field opens a quote up to the next one") {
  // A record ends at a line break after an even number of quotes; the stray quote
  // and the next quote pair up, so the record spans two lines and is refused.
  const auto rows = io::parse_csv("q\"uote,2\nnext,x\"\nafter,3\n");
  REQUIRE(rows.size() == 2);
  CHECK(rows[0].error ==
        "a quote inside the unquoted field 1; quote the whole field and double the quote (\"\")");
  CHECK(rows[1].fields == Fields{"after", "3"});
  CHECK(rows[1].line == 3);
}

TEST_CASE("records without quotes carry their text for a writer to copy whole") {
  std::string text = "a,b\n\"q\",c\n";
  io::CsvRecordParser parser(text, 1);
  io::CsvRecord record;
  REQUIRE(parser.next(record));
  CHECK_FALSE(record.has_quotes);
  CHECK(record.text == "a,b");
  REQUIRE(parser.next(record));
  CHECK(record.has_quotes);
  CHECK(record.text.empty());
}

TEST_CASE("the chunker cuts between records however small the chunks and reads") {
  std::string text = "\xEF\xBB\xBFid,note,x\r\n";
  for (int i = 0; i < 200; ++i) {
    text += std::to_string(i) + (i % 7 == 0 ? ",\"multi\nline, \"\"quoted\"\"\"," : ",plain,") + std::to_string(i * 3);
    text += i % 2 ? "\r\n" : "\n";
    if (i % 50 == 0) text += "\n";  // an empty line now and then
  }
  const auto whole = io::parse_csv(text);
  REQUIRE(whole.size() == 201);
  for (std::size_t target : {16u, 37u, 100u, 4096u}) {
    for (std::size_t step : {1u, 3u, 64u, 100000u}) {
      const auto rows = read_chunked(text, target, step);
      REQUIRE(rows.size() == whole.size());
      for (std::size_t i = 0; i < rows.size(); ++i) {
        INFO("target " << target << ", step " << step << ", record " << i);
        CHECK(rows[i].fields == whole[i].fields);
        CHECK(rows[i].line == whole[i].line);
        CHECK(rows[i].error.empty());
      }
    }
  }
}

TEST_CASE("a byte-order mark read a byte at a time, before a quoted header") {
  // The mark arrives in pieces; what was scanned before it was removed must be scanned again.
  const std::string text = "\xEF\xBB\xBF\"i,d\",x\n\"a\nb\",1\n";
  for (std::size_t step : {1u, 2u, 4u}) {
    const auto rows = read_chunked(text, 16, step);
    REQUIRE(rows.size() == 2);
    CHECK(rows[0].fields == Fields{"i,d", "x"});
    CHECK(rows[1].fields == Fields{"a\nb", "1"});
  }
}

TEST_CASE("an input shorter than a byte-order mark, and an empty input") {
  CHECK(read_chunked("", 16, 1).empty());
  const auto rows = read_chunked("a", 16, 1);
  REQUIRE(rows.size() == 1);
  CHECK(rows[0].fields == Fields{"a"});
  CHECK(read_chunked("\xEF\xBB\xBF", 16, 1).empty());
}

TEST_CASE("a record that never ends is a whole-input error, not unbounded memory") {
  std::string text = "id,note\n1,\"open";
  text += std::string(5000, 'x');
  StringSource source(text, 512);
  io::CsvChunker chunker(source, "log.csv", 64, 2048);
  io::CsvChunk chunk;
  try {
    while (chunker.next(chunk)) {
    }
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(std::string(e.what()) ==
          "log.csv: line 2: a record runs over 2048 bytes without ending; is a quote left open?");
  }
}

// The workbook stream: Excel's row limit refused with its message and nothing written;
// a workbook that is written is a zip archive (its cells are read back against the JSON
// results in tests/python/test_xlsx_workbook.py).
#include <catch2/catch.hpp>

#include <sstream>

#include "shaftwork/error.hpp"
#include "shaftwork/io/result_writer.hpp"

using namespace shaftwork;

namespace {

io::CaseOutcome failed_case(const std::string& id) {
  io::CaseOutcome o;
  o.id = id;
  o.error = "no solution";
  return o;
}

}  // namespace

TEST_CASE("a workbook past its row limit is refused and not written") {
  std::ostringstream out;
  // A limit of 4 rows: the two header rows and two cases.
  auto book = io::make_workbook_stream(out, io::TableOptions{}, 4);
  book->add(failed_case("a"));
  book->add(failed_case("b"));
  try {
    book->add(failed_case("c"));
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(std::string(e.what()) ==
          "the workbook would pass Excel's limit of 4 rows: 2 header rows and 2 cases; write --format csv or jsonl "
          "instead");
  }
  book->finish();
  CHECK(out.str().empty());
}

TEST_CASE("the default limit is Excel's 1,048,576 rows") {
  // Microsoft, "Excel specifications and limits": 1,048,576 rows by 16,384 columns.
  CHECK(io::kWorkbookRowLimit == 1048576);
}

TEST_CASE("a workbook within the limit is written whole at finish") {
  std::ostringstream out;
  auto book = io::make_workbook_stream(out, io::TableOptions{io::UnitSystem::us}, 4);
  book->add(failed_case("a"));
  CHECK(out.str().empty());  // nothing before finish
  book->finish();
  // An .xlsx file is a zip archive (ECMA-376 Part 2): it starts with the local file header "PK\3\4".
  REQUIRE(out.str().size() > 4);
  CHECK(out.str().substr(0, 4) == std::string("PK\x03\x04", 4));
}

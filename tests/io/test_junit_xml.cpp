// JUnit XML: escaping by the rules of XML 1.0 (W3C Recommendation, fifth edition: section
// 2.2 Characters, 2.4 Character Data, 3.3.3 Attribute-Value Normalization) and UTF-8 by
// RFC 3629, and the counts of the suites. tests/cli/check.sh reads a whole file back with
// python3-junitparser.
#include <sstream>
#include <string>

#include <catch2/catch.hpp>

#include "shaftwork/io/junit_xml.hpp"

using namespace shaftwork;

TEST_CASE("text and attribute values are escaped for XML 1.0") {
  CHECK(io::xml_escaped(R"(a<b & "c" 'd'>)", false) == "a&lt;b &amp; &quot;c&quot; &apos;d&apos;&gt;");
  // Tab and line feed stay in text but become references in attributes, where a parser
  // would otherwise turn them into spaces; a carriage return is a reference in both.
  CHECK(io::xml_escaped("1\t2\n3\r4", false) == "1\t2\n3&#13;4");
  CHECK(io::xml_escaped("1\t2\n3\r4", true) == "1&#9;2&#10;3&#13;4");
  // Other control characters cannot appear in XML 1.0 at all, not even as references.
  CHECK(io::xml_escaped(std::string("a\x01" "b\x1b" "c", 5), true) == "a\\x01b\\x1bc");
  CHECK(io::xml_escaped(std::string("nul\0end", 7), false) == "nul\\x00end");
}

TEST_CASE("UTF-8 is kept when well formed and replaced by U+FFFD when not") {
  CHECK(io::xml_escaped("\xC3\xA9 \xE2\x82\xAC \xF0\x9D\x84\x9E", false) == "\xC3\xA9 \xE2\x82\xAC \xF0\x9D\x84\x9E");
  const std::string replacement = "\xEF\xBF\xBD";
  CHECK(io::xml_escaped("a\xFF" "b", false) == "a" + replacement + "b");              // never a UTF-8 byte
  CHECK(io::xml_escaped("\xC0\xAF", false) == replacement + replacement);             // overlong '/'
  CHECK(io::xml_escaped("\xED\xA0\x80", false) == replacement + replacement + replacement);  // a surrogate
  CHECK(io::xml_escaped("\xE2\x82", false) == replacement + replacement);             // cut short
  CHECK(io::xml_escaped("\xEF\xBF\xBE", false) == replacement + replacement + replacement);  // U+FFFE
  CHECK(io::xml_escaped("\xF4\x90\x80\x80", false) == replacement + replacement + replacement + replacement);
}

TEST_CASE("one suite per file, one case per check, with the counts") {
  using io::Verdict;
  const std::vector<io::CaseCheck> checks = {
      {Verdict::passed, "a.json", "A1", {}},
      {Verdict::failed, "a.json", "A<2>", {"power: now 2 W, expected 1 W (expect)", "not in the baseline"}},
      {Verdict::error, "b.json", "B1", {"outlet.pressure: missing"}},
      {Verdict::missing, "a.json", "A3", {"in the baseline, not among the cases checked"}},
      {Verdict::unusable, "c.json", "", {"c.json: not valid JSON"}},
  };
  std::ostringstream out;
  io::write_junit(out, checks);
  CHECK(out.str() ==
        R"xml(<?xml version="1.0" encoding="UTF-8"?>
<testsuites name="shaftwork check" tests="5" failures="2" errors="2">
  <testsuite name="a.json" tests="3" failures="2" errors="0" skipped="0">
    <testcase name="A1" classname="a.json"/>
    <testcase name="A&lt;2&gt;" classname="a.json">
      <failure message="power: now 2 W, expected 1 W (expect) (and 1 more)" type="moved">power: now 2 W, expected 1 W (expect)
not in the baseline</failure>
    </testcase>
    <testcase name="A3" classname="a.json">
      <failure message="in the baseline, not among the cases checked" type="missing">in the baseline, not among the cases checked</failure>
    </testcase>
  </testsuite>
  <testsuite name="b.json" tests="1" failures="0" errors="1" skipped="0">
    <testcase name="B1" classname="b.json">
      <error message="outlet.pressure: missing" type="error">outlet.pressure: missing</error>
    </testcase>
  </testsuite>
  <testsuite name="c.json" tests="1" failures="0" errors="1" skipped="0">
    <testcase name="c.json" classname="c.json">
      <error message="c.json: not valid JSON" type="unusable file">c.json: not valid JSON</error>
    </testcase>
  </testsuite>
</testsuites>
)xml");
}

// shaftwork/io/junit_xml.hpp — the checks of a run as JUnit XML (`check --junit FILE`),
// the test-report format CI systems read.
//
// <testsuites> holds one <testsuite> per case file (named by the file, in the order the
// files were checked), each one <testcase> per case: name = the case id, classname = the
// file. A failed case carries <failure> (its moved keys, one per line), a case that could
// not be rated or whose expect block is wrong <error>, a baseline case missing from the
// files <failure type="missing">, a file that could not be used one <testcase> named by
// the file with <error>. Every suite and the root carry their counts of tests, failures
// and errors.
#pragma once

#include <ostream>
#include <string>
#include <string_view>
#include <vector>

#include "shaftwork/io/case_check.hpp"

namespace shaftwork::io {

// `text` as XML 1.0 character data, or as an attribute value when `attribute`: the five
// special characters as entities; tab, line feed and carriage return as character
// references in attributes (so they survive attribute-value normalisation) and a carriage
// return in text too; other control characters, which XML 1.0 cannot carry at all, written
// visibly as \xHH; bytes that are not UTF-8 and the non-characters U+FFFE and U+FFFF as
// U+FFFD.
std::string xml_escaped(std::string_view text, bool attribute);

void write_junit(std::ostream& out, const std::vector<CaseCheck>& checks);

}  // namespace shaftwork::io

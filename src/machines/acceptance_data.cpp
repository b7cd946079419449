// data/acceptance.txt: the ISO 9906:2012 pump grades and the ASME PTC 10-1997 similarity
// limits, read once and checked row by row (the file's head says what is checked).
#include <algorithm>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include <fmt/format.h>

#include "../fluids/text_lines.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/machines/guarantee.hpp"

namespace shaftwork::fluids {
std::string_view embedded_data(std::string_view file_name);  // generated from data/*.txt
}  // namespace shaftwork::fluids

namespace shaftwork::machines {
namespace {

using fluids::detail::fail;
using fluids::detail::Line;

struct MachRow {
  double m_sp, lower, upper;
  std::string source;
};

struct Acceptance {
  std::vector<PumpGrade> grades;
  std::vector<std::pair<std::string, SimilarityLimits>> ratios;
  std::vector<MachRow> mach;
};

constexpr const char* kOrigin = "acceptance.txt (built in)";

// The numbers of a row after its kind (and name), each finite, `count` of them.
std::vector<double> numbers(const std::vector<std::string_view>& words, std::size_t first, std::size_t count,
                            const Line& line) {
  if (words.size() != first + count) {
    fail(kOrigin, line.number, fmt::format("expected {} numbers after \"{}\"", count, words[0]));
  }
  std::vector<double> out;
  for (std::size_t i = first; i < words.size(); ++i) {
    const std::optional<double> x = fluids::detail::parse_number(words[i]);
    if (!x) fail(kOrigin, line.number, fmt::format("\"{}\" is not a number", words[i]));
    out.push_back(*x);
  }
  return out;
}

void add_grade(Acceptance& a, const std::vector<std::string_view>& words, const std::string& source, const Line& line) {
  const std::vector<double> x = numbers(words, 2, 6, line);
  if (!(x[0] <= 0 && x[1] >= 0 && x[0] < x[1] && x[2] <= 0 && x[3] >= 0 && x[2] < x[3] && x[4] > 0 && x[5] <= 0)) {
    fail(kOrigin, line.number, "grade figures out of order: flow and head need min <= 0 <= max, power above 0, "
                               "efficiency at most 0");
  }
  const std::string name(words[1]);
  if (std::any_of(a.grades.begin(), a.grades.end(), [&](const PumpGrade& g) { return g.name == name; })) {
    fail(kOrigin, line.number, fmt::format("grade {} given twice", name));
  }
  a.grades.push_back(PumpGrade{name, {x[0], x[1]}, {x[2], x[3]}, {std::nullopt, x[4]}, {x[5], std::nullopt}, source});
}

void add_ratio(Acceptance& a, const std::vector<std::string_view>& words, const std::string& source, const Line& line) {
  const std::vector<double> x = numbers(words, 2, 2, line);
  if (!(x[0] < 1 && 1 < x[1])) fail(kOrigin, line.number, "ratio limits need low < 1 < high");
  a.ratios.emplace_back(std::string(words[1]), SimilarityLimits{x[0], x[1], source});
}

void add_mach(Acceptance& a, const std::vector<std::string_view>& words, const std::string& source, const Line& line) {
  const std::vector<double> x = numbers(words, 1, 3, line);
  if (!(x[1] < 0 && 0 < x[2])) fail(kOrigin, line.number, "Mach number limits need lower < 0 < upper");
  if (!a.mach.empty() && !(x[0] > a.mach.back().m_sp)) fail(kOrigin, line.number, "M_sp must rise from row to row");
  a.mach.push_back(MachRow{x[0], x[1], x[2], source});
}

Acceptance parse(std::string_view text) {
  Acceptance a;
  for (const Line& line : fluids::detail::split_lines(text)) {
    if (fluids::detail::is_comment_line(line.text)) continue;
    const std::size_t bar = line.text.find('|');
    const std::string source(fluids::detail::trim(bar == std::string_view::npos ? "" : line.text.substr(bar + 1)));
    if (source.empty()) fail(kOrigin, line.number, "no source after '|'");
    const auto words = fluids::detail::split_words(line.text.substr(0, bar));
    if (words[0] == "grade" && words.size() > 1) {
      add_grade(a, words, source, line);
    } else if (words[0] == "ratio" && words.size() > 1) {
      add_ratio(a, words, source, line);
    } else if (words[0] == "mach") {
      add_mach(a, words, source, line);
    } else {
      fail(kOrigin, line.number, fmt::format("unknown row \"{}\"; rows are grade, ratio and mach", words[0]));
    }
  }
  if (a.grades.empty() || a.ratios.empty() || a.mach.empty()) {
    fail(kOrigin, 0, "grades, ratios and Mach number rows are all needed");
  }
  return a;
}

const Acceptance& acceptance() {
  static const Acceptance data = [] {
    const std::string_view text = fluids::embedded_data("acceptance.txt");
    if (text.empty()) throw Error(ErrorKind::not_available, "data/acceptance.txt is missing from this build");
    return parse(text);
  }();
  return data;
}

}  // namespace

const std::vector<PumpGrade>& pump_grades() { return acceptance().grades; }

const PumpGrade* find_pump_grade(std::string_view name) {
  for (const PumpGrade& g : pump_grades()) {
    if (g.name == name) return &g;
  }
  return nullptr;
}

const SimilarityLimits& similarity_limits(std::string_view parameter) {
  for (const auto& [name, limits] : acceptance().ratios) {
    if (name == parameter) return limits;
  }
  throw Error(ErrorKind::not_available, fmt::format("no similarity limits for {} in data/acceptance.txt", parameter));
}

SimilarityLimits mach_number_limits(double m_sp) {
  const std::vector<MachRow>& rows = acceptance().mach;
  if (m_sp <= rows.front().m_sp) return {rows.front().lower, rows.front().upper, rows.front().source};
  for (std::size_t i = 1; i < rows.size(); ++i) {
    if (m_sp <= rows[i].m_sp) {
      const double t = (m_sp - rows[i - 1].m_sp) / (rows[i].m_sp - rows[i - 1].m_sp);
      return {rows[i - 1].lower + t * (rows[i].lower - rows[i - 1].lower),
              rows[i - 1].upper + t * (rows[i].upper - rows[i - 1].upper), rows[i].source};
    }
  }
  return {rows.back().lower, rows.back().upper, rows.back().source};
}

}  // namespace shaftwork::machines

// SpeciesLibrary: reads species coefficients in three formats and checks them on load.
//
// The formats:
//   own   data/species.txt: keyword lines (species, alias, molar_mass, source, interval,
//         end); the file's header comment and docs/properties.md describe it.
//   nasa9 the published NASA Glenn 9-coefficient format, McBride, Zehe & Gordon,
//         NASA/TP-2002-211556 (2002), Appendix A: fixed columns, Fortran D exponents.
//   nasa7 the older 7-coefficient format (Gordon & McBride, NASA TM-4513; the CHEMKIN
//         THERMO layout): 4 fixed-column lines per species, two intervals.
// Every problem is a bad_input error "ORIGIN:LINE: what is wrong", ninja-style.
//
// The load check (all formats): a positive molar mass; intervals with 0 < T_low < T_high,
// ascending and contiguous (each starts exactly where the previous one ends); and at each
// joint H° and S° of the two intervals agree within kJointTolerance = 1e-4 relative and cp°
// within kJointToleranceCp = 1e-3 (a step of 0.1 % in cp° is inside the fits' own accuracy,
// and the published database has one, ALOCL's 0.05 % at 1000 K; a misplaced coefficient
// makes steps of whole percent or more).
// "Relative" means |below - above| / scale with scale = max(|cp° below|, |cp° above|) for
// cp°, max(|H° below|, |H° above|, R T) for H° (H° includes the enthalpy of formation and
// can pass through zero), and max(|S° below|, |S° above|, R) for S°. The NASA Glenn fits
// of the built-in species meet this by three orders of magnitude (their joints differ by
// 1e-7 or less), and so does every gas record of the 2004 database.
#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include <fmt/format.h>

#include "nasa_interval.hpp"
#include "text_lines.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::fluids {

using detail::fail;
using detail::first_word_upper;
using detail::is_comment_line;
using detail::Line;
using detail::parse_number;
using detail::split_lines;
using detail::split_words;
using detail::trim;

// The text of a data/*.txt file compiled into the program (build/generated/embedded_data.cpp,
// written by cmake/embed_data.cmake); empty when there is no such file.
std::string_view embedded_data(std::string_view file_name);

namespace {

constexpr double kJointTolerance = 1e-4;    // relative, H° and S°; see the file comment
constexpr double kJointToleranceCp = 1e-3;  // relative, cp°; see the file comment

// ---------------------------------------------------------------------------------------
// Text helpers (the line splitting, trimming and number parsing are in text_lines.hpp)

// Columns first..last (1-based, inclusive) of a fixed-column line; a short line reads as blanks.
std::string_view columns(std::string_view line, std::size_t first, std::size_t last) {
  if (line.size() < first) return {};
  return line.substr(first - 1, std::min(last, line.size()) - (first - 1));
}

// The number in columns first..last (1-based, inclusive) of a fixed-column record line;
// a field that holds none is an error naming the species, the columns and `what`.
double number_in_columns(const Line& line, std::size_t first, std::size_t last, const std::string& what,
                         const std::string& species, const std::string& origin) {
  const auto value = parse_number(columns(line.text, first, last));
  if (!value) {
    fail(origin, line.number,
         fmt::format("{}: columns {}-{} should hold {}, found '{}'", species, first, last, what,
                     trim(columns(line.text, first, last))));
  }
  return *value;
}

// ---------------------------------------------------------------------------------------
// The load check

void check_joint(const NasaSpecies& sp, std::size_t upper, const std::string& origin, int line) {
  const NasaInterval& below = sp.intervals[upper - 1];
  const NasaInterval& above = sp.intervals[upper];
  const double T = above.t_low;
  const detail::NasaValues a = detail::evaluate(below, T);
  const detail::NasaValues b = detail::evaluate(above, T);
  struct Quantity {
    const char* name;
    double below, above, scale;
    const char* unit;
    double to_unit;  // multiplies a dimensionless value (…/R) into `unit`
    double tolerance;
    const char* tolerance_text;
  };
  const double R = units::kGasConstant;  // J/(mol K)
  const Quantity quantities[] = {
      {"cp°", a.cp_over_r, b.cp_over_r, std::max(std::fabs(a.cp_over_r), std::fabs(b.cp_over_r)),
       "J/(mol K)", R, kJointToleranceCp, "1e-3"},
      {"H°", a.h_over_r, b.h_over_r,
       std::max({std::fabs(a.h_over_r), std::fabs(b.h_over_r), T}), "kJ/mol", R / 1000, kJointTolerance, "1e-4"},
      {"S°", a.s_over_r, b.s_over_r, std::max({std::fabs(a.s_over_r), std::fabs(b.s_over_r), 1.0}),
       "J/(mol K)", R, kJointTolerance, "1e-4"},
  };
  for (const Quantity& q : quantities) {
    const double jump = std::fabs(q.below - q.above) / q.scale;
    if (!(jump <= q.tolerance)) {
      fail(origin, line,
           fmt::format("{}: {} jumps by {:.2g} (relative) at the joint {:g} K of intervals {} and {}: "
                       "{:.8g} {} below, {:.8g} {} above; the intervals must meet within {}",
                       sp.name, q.name, jump, T, upper, upper + 1, q.below * q.to_unit, q.unit,
                       q.above * q.to_unit, q.unit, q.tolerance_text));
    }
  }
}

// `record_line` is where the species begins; `interval_lines[i]` where interval i is written.
void check_species(const NasaSpecies& sp, const std::string& origin, int record_line,
                   const std::vector<int>& interval_lines) {
  if (!(std::isfinite(sp.molar_mass) && sp.molar_mass > 0)) {
    fail(origin, record_line,
         fmt::format("{}: the molar mass must be above 0, got {:g} kg/mol", sp.name, sp.molar_mass));
  }
  if (sp.intervals.empty()) fail(origin, record_line, fmt::format("{}: no temperature interval", sp.name));
  for (std::size_t i = 0; i < sp.intervals.size(); ++i) {
    const NasaInterval& in = sp.intervals[i];
    const int line = interval_lines[i];
    if (!(in.t_low > 0 && in.t_high > in.t_low)) {
      fail(origin, line,
           fmt::format("{}: interval {} runs from {:g} K to {:g} K; it needs 0 < T_low < T_high",
                       sp.name, i + 1, in.t_low, in.t_high));
    }
    if (i == 0) continue;
    const NasaInterval& previous = sp.intervals[i - 1];
    if (in.t_low != previous.t_high) {
      fail(origin, line,
           fmt::format("{}: interval {} starts at {:g} K but interval {} ends at {:g} K; the "
                       "intervals must be ascending and contiguous",
                       sp.name, i + 1, in.t_low, i, previous.t_high));
    }
    check_joint(sp, i, origin, line);
  }
}

// ---------------------------------------------------------------------------------------
// Building a library while parsing: names and aliases must be unique.

class Builder {
 public:
  explicit Builder(std::string origin) : origin_(std::move(origin)) {}

  const std::string& origin() const { return origin_; }

  void add(NasaSpecies sp, int record_line, const std::vector<int>& interval_lines) {
    check_species(sp, origin_, record_line, interval_lines);
    if (const auto seen = first_line_of(sp.name)) {
      fail(origin_, record_line,
           fmt::format("{} is defined twice (first on line {})", sp.name, *seen));
    }
    lines_.emplace_back(sp.name, record_line);
    species.push_back(std::move(sp));
  }

  void add_alias(const std::string& alias, const std::string& name, int line) {
    if (const auto seen = first_line_of(alias)) {
      fail(origin_, line,
           fmt::format("alias {} of {} is already a name or alias on line {}", alias, name, *seen));
    }
    lines_.emplace_back(alias, line);
    aliases.emplace_back(alias, name);
  }

  std::vector<NasaSpecies> species;                          // in the order read
  std::vector<std::pair<std::string, std::string>> aliases;  // {alias, species name}

 private:
  std::optional<int> first_line_of(const std::string& name) const {
    for (const auto& [known, line] : lines_) {
      if (known == name) return line;
    }
    return std::nullopt;
  }

  std::string origin_;
  std::vector<std::pair<std::string, int>> lines_;  // every name and alias, with its line
};

// ---------------------------------------------------------------------------------------
// Atomic weights for the 7-coefficient format (data/elements.txt, from the NASA database).

const std::map<std::string, double>& atomic_weights() {
  static const std::map<std::string, double> weights = [] {
    const std::string origin = "elements.txt (built in)";
    const std::string_view text = embedded_data("elements.txt");
    if (text.empty()) {
      throw Error(ErrorKind::not_available,
                  "the built-in atomic weights (data/elements.txt) are missing from this build");
    }
    std::map<std::string, double> table;
    for (const Line& line : split_lines(text)) {
      const auto words = split_words(line.text);
      if (words.empty() || words.front().front() == '#') continue;
      if (words.size() != 3 || words.front() != "element") {
        fail(origin, line.number, "expected 'element SYMBOL ATOMIC_WEIGHT'");
      }
      const double weight = parse_number(words[2]).value_or(0.0);
      if (!(weight > 0)) fail(origin, line.number, "the atomic weight must be a number above 0");
      std::string symbol(words[1]);
      for (char& c : symbol) c = static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
      table[symbol] = weight / 1000.0;  // g/mol -> kg/mol
    }
    return table;
  }();
  return weights;
}

}  // namespace

// =======================================================================================
// The project's own format

namespace {

// One block of the own format, from 'species NAME' to 'end'.
struct OwnBlock {
  NasaSpecies species;
  int first_line = 0;
  bool has_molar_mass = false;
  std::vector<int> interval_lines;
  std::vector<std::pair<std::string, int>> aliases;
};

// A line of the own format: its keyword, the rest, and the rest's words.
struct OwnLine {
  int number = 0;
  std::string_view keyword;
  std::string_view rest;
  std::vector<std::string_view> words;
};

void read_molar_mass(OwnBlock& block, const OwnLine& line, const std::string& origin) {
  const auto& words = line.words;
  const auto value = words.size() == 2 ? parse_number(words[0]) : std::nullopt;
  const bool grams = words.size() == 2 && words[1] == "g/mol";
  const bool kilograms = words.size() == 2 && words[1] == "kg/mol";
  const std::string& name = block.species.name;
  if (!value || !(grams || kilograms)) {
    fail(origin, line.number,
         fmt::format("{}: 'molar_mass' needs a number and a unit, g/mol or kg/mol; found '{}'", name, line.rest));
  }
  if (block.has_molar_mass) fail(origin, line.number, fmt::format("{}: a second molar_mass", name));
  block.species.molar_mass = grams ? *value / 1000.0 : *value;
  block.has_molar_mass = true;
}

void read_interval(OwnBlock& block, const OwnLine& line, const std::string& origin) {
  static constexpr const char* kFieldNames[] = {"T_low", "T_high", "a0", "a1", "a2", "a3",
                                                "a4",    "a5",     "a6", "b1", "b2"};
  const std::string& name = block.species.name;
  if (line.words.size() != 11) {
    fail(origin, line.number,
         fmt::format("{}: an interval needs 11 numbers (T_low T_high a0 a1 a2 a3 a4 a5 a6 b1 b2), found {}", name,
                     line.words.size()));
  }
  double values[11];
  for (std::size_t k = 0; k < 11; ++k) {
    const auto value = parse_number(line.words[k]);
    if (!value) fail(origin, line.number, fmt::format("{}: {} '{}' is not a number", name, kFieldNames[k], line.words[k]));
    values[k] = *value;
  }
  NasaInterval in;
  in.t_low = values[0];
  in.t_high = values[1];
  std::copy(values + 2, values + 9, in.a.begin());
  in.b1 = values[9];
  in.b2 = values[10];
  block.species.intervals.push_back(in);
  block.interval_lines.push_back(line.number);
}

// 'end': the block is complete; its species and aliases go to `builder`.
void close_block(OwnBlock& block, const OwnLine& line, Builder& builder, const std::string& origin) {
  NasaSpecies& sp = block.species;
  if (!block.has_molar_mass) fail(origin, line.number, fmt::format("{}: the block has no molar_mass line", sp.name));
  if (sp.source.empty()) {
    fail(origin, line.number, fmt::format("{}: the block has no source line (say where the figures come from)", sp.name));
  }
  if (sp.intervals.empty()) fail(origin, line.number, fmt::format("{}: the block has no interval line", sp.name));
  const std::string name = sp.name;
  builder.add(std::move(sp), block.first_line, block.interval_lines);
  for (const auto& [alias, alias_line] : block.aliases) builder.add_alias(alias, name, alias_line);
}

// A line inside a block (not 'species'). Returns true at 'end'.
bool read_block_line(OwnBlock& block, const OwnLine& line, Builder& builder, const std::string& origin) {
  NasaSpecies& sp = block.species;
  if (line.keyword == "alias") {
    if (line.words.size() != 1) fail(origin, line.number, fmt::format("{}: 'alias' needs one name, without spaces", sp.name));
    block.aliases.emplace_back(std::string(line.words[0]), line.number);
  } else if (line.keyword == "molar_mass") {
    read_molar_mass(block, line, origin);
  } else if (line.keyword == "source") {
    if (line.rest.empty()) fail(origin, line.number, fmt::format("{}: 'source' needs a text", sp.name));
    if (!sp.source.empty()) fail(origin, line.number, fmt::format("{}: a second source", sp.name));
    sp.source = std::string(line.rest);
  } else if (line.keyword == "interval") {
    read_interval(block, line, origin);
  } else if (line.keyword == "end") {
    close_block(block, line, builder, origin);
    return true;
  } else {
    fail(origin, line.number,
         fmt::format("unknown keyword '{}' (expected species, alias, molar_mass, source, interval or end)",
                     line.keyword));
  }
  return false;
}

OwnLine split_own_line(const Line& line, std::string_view content) {
  OwnLine l;
  l.number = line.number;
  const std::size_t space = content.find_first_of(" \t");
  l.keyword = content.substr(0, space);
  l.rest = space == std::string_view::npos ? std::string_view() : trim(content.substr(space));
  l.words = split_words(l.rest);
  return l;
}

}  // namespace

SpeciesLibrary SpeciesLibrary::parse_own_format(std::string_view text, const std::string& origin) {
  Builder builder(origin);
  std::optional<OwnBlock> block;
  int last_line = 0;
  for (const Line& raw : split_lines(text)) {
    last_line = raw.number;
    const std::string_view content = trim(raw.text);
    if (content.empty() || content.front() == '#') continue;
    const OwnLine line = split_own_line(raw, content);
    if (line.keyword == "species") {
      if (block) {
        fail(origin, line.number,
             fmt::format("'species {}' begins before the block of {} (line {}) is closed with 'end'", line.rest,
                         block->species.name, block->first_line));
      }
      if (line.words.size() != 1) fail(origin, line.number, "'species' needs one name, without spaces");
      block.emplace();
      block->species.name = std::string(line.words[0]);
      block->first_line = line.number;
    } else if (!block) {
      fail(origin, line.number,
           fmt::format("'{}' outside a species block (a block begins with 'species NAME')", line.keyword));
    } else if (read_block_line(*block, line, builder, origin)) {
      block.reset();
    }
  }
  if (block) {
    fail(origin, last_line,
         fmt::format("{}: the text ends inside the block that begins on line {} (no 'end')", block->species.name,
                     block->first_line));
  }
  return from_parts(std::move(builder.species), std::move(builder.aliases));
}

SpeciesLibrary SpeciesLibrary::from_parts(std::vector<NasaSpecies> species,
                                          std::vector<std::pair<std::string, std::string>> aliases) {
  SpeciesLibrary library;
  library.species_ = std::move(species);
  library.aliases_ = std::move(aliases);
  return library;
}

// =======================================================================================
// NASA Glenn 9-coefficient format (NASA/TP-2002-211556, Appendix A)
//
// Record line 1: name (first word), then the comment (reference text).
// Line 2: cols 1-2 number of intervals; 4-9 reference-date code; 11-50 formula;
//         51-52 phase (0 gas); 53-65 molecular weight, g/mol; 66-80 heat of formation.
// Per interval, three lines: (a) cols 1-22 T range (2F11.3), 23 number of coefficients (7),
//         24-63 the T exponents (8F5.1: -2 -1 0 1 2 3 4 0), 66-80 H(298.15)-H(0);
//         (b) a0..a4 in 5 fields of 16 columns; (c) a5, a6 in columns 1-32, columns 33-48
//         blank or zero, b1 in 49-64, b2 in 65-80.

namespace {

// The line after 'thermo': the global temperature ranges (and a date). Steps past it.
void skip_thermo_ranges(const std::vector<Line>& lines, std::size_t& i, const std::string& origin) {
  const int thermo_line = lines[i].number;
  ++i;
  while (i < lines.size() && is_comment_line(lines[i].text)) ++i;
  const auto words = i < lines.size() ? split_words(lines[i].text) : std::vector<std::string_view>{};
  if (words.empty() || !parse_number(words[0])) {
    fail(origin, i < lines.size() ? lines[i].number : thermo_line,
         "'thermo' must be followed by the line of global temperature ranges, e.g. '200.00 "
         "1000.00 6000.00 20000.'");
  }
  ++i;
}

// The lines of one 9-coefficient record, each fetched with what it should hold.
struct Nasa9Record {
  const std::vector<Line>& lines;
  std::size_t start;
  std::string name;
  const std::string& origin;

  // The line `offset` after the first, or an error saying what is missing.
  const Line& at(std::size_t offset, const std::string& what) const {
    if (start + offset >= lines.size()) {
      fail(origin, lines.back().number,
           fmt::format("{}: the record that begins on line {} ends early: {} is missing", name, lines[start].number,
                       what));
    }
    return lines[start + offset];
  }
  double number(const Line& line, std::size_t first, std::size_t last, const std::string& what) const {
    return number_in_columns(line, first, last, what, name, origin);
  }
};

// The temperature line of interval k: its range, the count 7 and the fixed exponents.
void read_nasa9_temperatures(const Nasa9Record& rec, const Line& t_line, const std::string& which, NasaInterval& in) {
  in.t_low = rec.number(t_line, 1, 11, fmt::format("the lower temperature of {}", which));
  in.t_high = rec.number(t_line, 12, 22, fmt::format("the upper temperature of {}", which));
  if (rec.number(t_line, 23, 23, "the number of coefficients (7)") != 7) {
    fail(rec.origin, t_line.number,
         fmt::format("{}: column 23 should hold 7, the number of cp coefficients, found '{}'", rec.name,
                     columns(t_line.text, 23, 23)));
  }
  static constexpr double kExponents[8] = {-2, -1, 0, 1, 2, 3, 4, 0};
  for (std::size_t e = 0; e < 8; ++e) {
    const std::size_t first = 24 + 5 * e;
    if (rec.number(t_line, first, first + 4, "a temperature exponent") != kExponents[e]) {
      fail(rec.origin, t_line.number,
           fmt::format("{}: the temperature exponents in columns 24-63 must be -2 -1 0 1 2 3 4 0, found '{}'",
                       rec.name, trim(columns(t_line.text, 24, 63))));
    }
  }
}

// Interval k (0-based) of `count`: its temperature line and two coefficient lines.
NasaInterval read_nasa9_interval(const Nasa9Record& rec, std::size_t k, std::size_t count) {
  const std::string which = fmt::format("interval {} of {}", k + 1, count);
  const Line& t_line = rec.at(2 + 3 * k, fmt::format("the temperature line of {}", which));
  const Line& c_line = rec.at(3 + 3 * k, fmt::format("the first coefficient line of {}", which));
  const Line& d_line = rec.at(4 + 3 * k, fmt::format("the second coefficient line of {}", which));
  NasaInterval in;
  read_nasa9_temperatures(rec, t_line, which, in);
  for (std::size_t j = 0; j < 5; ++j) {
    in.a[j] = rec.number(c_line, 1 + 16 * j, 16 + 16 * j, fmt::format("coefficient a{} of interval {}", j, k + 1));
  }
  in.a[5] = rec.number(d_line, 1, 16, fmt::format("coefficient a5 of interval {}", k + 1));
  in.a[6] = rec.number(d_line, 17, 32, fmt::format("coefficient a6 of interval {}", k + 1));
  if (!trim(columns(d_line.text, 33, 48)).empty() &&
      rec.number(d_line, 33, 48, "a blank or zero eighth coefficient") != 0) {
    fail(rec.origin, d_line.number,
         fmt::format("{}: columns 33-48 (an eighth coefficient) must be blank or zero", rec.name));
  }
  in.b1 = rec.number(d_line, 49, 64, fmt::format("the constant b1 of interval {}", k + 1));
  in.b2 = rec.number(d_line, 65, 80, fmt::format("the constant b2 of interval {}", k + 1));
  return in;
}

// One record at `start`: adds a gas to `builder` (a condensed phase or a reactant with an
// assigned enthalpy only is skipped); returns the number of lines the record takes.
std::size_t parse_nasa9_record(const std::vector<Line>& lines, std::size_t start, Builder& builder,
                               const std::string& origin) {
  const auto head_words = split_words(lines[start].text);
  const Nasa9Record rec{lines, start, std::string(head_words.front()), origin};
  const Line& second = rec.at(1, "line 2 (number of intervals, formula, molecular weight)");
  const double count_value = rec.number(second, 1, 2, "the number of temperature intervals");
  if (count_value < 0 || count_value > 20 || count_value != std::floor(count_value)) {
    fail(origin, second.number,
         fmt::format("{}: columns 1-2 should hold the number of temperature intervals, found '{}'", rec.name,
                     columns(second.text, 1, 2)));
  }
  const auto count = static_cast<std::size_t>(count_value);
  const std::string_view phase_field = trim(columns(second.text, 51, 52));
  const double phase = phase_field.empty() ? 0.0 : rec.number(second, 51, 52, "the phase (0 for a gas)");
  const double molecular_weight = rec.number(second, 53, 65, "the molecular weight in g/mol");
  if (count == 0) return 3;                // a reactant with an assigned enthalpy only: name, line 2, one T line
  if (phase != 0) return 2 + 3 * count;  // a condensed phase: not an ideal gas, skipped
  NasaSpecies sp;
  sp.name = rec.name;
  std::vector<int> interval_lines;
  for (std::size_t k = 0; k < count; ++k) {
    sp.intervals.push_back(read_nasa9_interval(rec, k, count));
    interval_lines.push_back(lines[start + 2 + 3 * k].number);
  }
  sp.molar_mass = molecular_weight / 1000.0;
  const std::string_view after_name = trim(trim(lines[start].text).substr(head_words.front().size()));
  sp.source = fmt::format("{} line {} (NASA 9-coefficient record, code {}): {}", origin, lines[start].number,
                          trim(columns(second.text, 4, 9)), after_name);
  builder.add(std::move(sp), lines[start].number, interval_lines);
  return 2 + 3 * count;
}

}  // namespace

SpeciesLibrary SpeciesLibrary::parse_nasa9(std::string_view text, const std::string& origin) {
  const std::vector<Line> lines = split_lines(text);
  Builder builder(origin);
  std::size_t i = 0;
  while (i < lines.size()) {
    if (is_comment_line(lines[i].text)) {
      ++i;
      continue;
    }
    const std::string word = first_word_upper(lines[i].text);
    if (word == "THERMO") {
      skip_thermo_ranges(lines, i, origin);
    } else if (word.rfind("END", 0) == 0) {  // END PRODUCTS, END REACTANTS
      ++i;
    } else {
      i = std::min(lines.size(), i + parse_nasa9_record(lines, i, builder, origin));
    }
  }
  return from_parts(std::move(builder.species), std::move(builder.aliases));
}

// =======================================================================================
// NASA 7-coefficient format (CHEMKIN THERMO layout)
//
// Line 1: cols 1-18 name (first word) and comment; 19-24 date; 25-44 formula, four
//         fields of a 2-column element symbol and a 3-column count; 45 phase G, L or S;
//         46-55 T low; 56-65 T high; 66-73 T common; 74-78 an optional fifth element;
//         80 the digit 1. Many files write T common as "  1000.000", spilling into columns
//         74-75; when those hold no letter they are read as part of T common.
// Line 2: upper-interval a1..a5 (5E15.8, cols 1-75); 80 the digit 2.
// Line 3: upper a6, a7, lower a1, a2, a3; 80 the digit 3.
// Line 4: lower a4..a7 (cols 1-60); 80 the digit 4.
// cp/R = a1 + a2 T + a3 T^2 + a4 T^3 + a5 T^4, a6 and a7 the enthalpy and entropy
// constants: the 9-coefficient form with a0 = a1 = 0, so a2..a6, b1, b2 = a1..a5, a6, a7.
// An optional 'THERMO' (or 'THERMO ALL') line may be followed by the three global
// temperatures (low, common, high); the common one stands in for a blank T common.
// 'END' ends the section.

namespace {

// The THERMO line's optional second line: the default lower, common and upper temperatures.
// Returns the common one when the line holds three numbers (and steps past it).
std::optional<double> read_thermo_defaults(const std::vector<Line>& lines, std::size_t& i) {
  while (i < lines.size() && is_comment_line(lines[i].text)) ++i;
  if (i >= lines.size()) return std::nullopt;
  const auto words = split_words(lines[i].text);
  if (words.size() < 3 || !parse_number(words[0]) || !parse_number(words[1]) || !parse_number(words[2])) {
    return std::nullopt;
  }
  ++i;
  return parse_number(words[1]);
}

// The four lines of the record at `start` are there, each numbered in column 80 (a wrong
// digit means a line is missing or extra).
void check_record_lines(const std::vector<Line>& lines, std::size_t start, const std::string& name,
                        const std::string& origin) {
  const int record_line = lines[start].number;
  if (start + 3 >= lines.size()) {
    fail(origin, lines.back().number,
         fmt::format("{}: the record that begins on line {} ends early: line {} of 4 is missing", name,
                     record_line, lines.size() - start + 1));
  }
  for (std::size_t r = 0; r < 4; ++r) {
    const Line& line = lines[start + r];
    const std::string_view mark = trim(columns(line.text, 80, 80));
    if (!mark.empty() && mark.front() != static_cast<char>('1' + r)) {
      fail(origin, line.number,
           fmt::format("{}: this should be line {} of the record (column 80 '{}'), found '{}'; is "
                       "a line missing?",
                       name, r + 1, r + 1, mark));
    }
  }
}

// A fifth element of the formula, in columns 74-78 (then the common temperature ends at 73).
bool has_fifth_element(const Line& head) {
  const std::string_view t = head.text;
  return std::any_of(t.begin() + std::min<std::size_t>(73, t.size()), t.begin() + std::min<std::size_t>(75, t.size()),
                     [](char c) { return std::isalpha(static_cast<unsigned char>(c)); });
}

// The molar mass (in the atomic weights' unit) from the elemental formula of the head line.
double nasa7_molar_mass(const Line& head, const std::string& name, const std::string& origin) {
  std::vector<std::pair<std::size_t, std::size_t>> fields = {{25, 29}, {30, 34}, {35, 39}, {40, 44}};
  if (has_fifth_element(head)) fields.emplace_back(74, 78);
  double molar_mass = 0;
  for (const auto& [first, last] : fields) {
    const std::string_view symbol_field = trim(columns(head.text, first, first + 1));
    const std::string_view count_field = trim(columns(head.text, first + 2, last));
    if (symbol_field.empty() && (count_field.empty() || parse_number(count_field) == 0.0)) continue;
    const auto count = parse_number(count_field);
    if (!count || *count < 0) {
      fail(origin, head.number,
           fmt::format("{}: columns {}-{} should hold an element count, found '{}'", name, first + 2, last,
                       columns(head.text, first + 2, last)));
    }
    if (*count == 0) continue;
    std::string symbol(symbol_field);
    for (char& c : symbol) c = static_cast<char>(std::toupper(static_cast<unsigned char>(c)));
    const auto found = atomic_weights().find(symbol);
    if (found == atomic_weights().end()) {
      fail(origin, head.number,
           fmt::format("{}: element '{}' of the formula (columns {}-{}) is not known", name, symbol_field, first,
                       first + 1));
    }
    molar_mass += *count * found->second;
  }
  if (!(molar_mass > 0)) {
    fail(origin, head.number,
         fmt::format("{}: columns 25-44 should hold the elemental formula, found '{}'", name,
                     trim(columns(head.text, 25, 44))));
  }
  return molar_mass;
}

// The two intervals of a 7-coefficient record: temperatures from the head line (a blank
// common temperature takes the THERMO line's), the 14 coefficients from lines 2-4.
std::vector<NasaInterval> nasa7_intervals(const std::vector<Line>& lines, std::size_t start,
                                          std::optional<double> default_common, const std::string& name,
                                          const std::string& origin) {
  const Line& head = lines[start];
  const auto number_at = [&](const Line& line, std::size_t first, std::size_t last, const std::string& what) {
    return number_in_columns(line, first, last, what, name, origin);
  };
  const double t_low = number_at(head, 46, 55, "the lower temperature");
  const double t_high = number_at(head, 56, 65, "the upper temperature");
  const std::size_t common_last = has_fifth_element(head) ? 73 : 75;
  double t_common = 0;
  if (!trim(columns(head.text, 66, common_last)).empty()) {
    t_common = number_at(head, 66, common_last, "the common temperature");
  } else if (default_common) {
    t_common = *default_common;
  } else {
    fail(origin, head.number,
         fmt::format("{}: columns 66-73 (the common temperature) are blank and no THERMO line gives a default", name));
  }
  double c[14];  // upper a1..a7, then lower a1..a7
  for (std::size_t k = 0; k < 14; ++k) {
    const std::size_t first = 1 + 15 * (k % 5);
    c[k] = number_at(lines[start + 1 + k / 5], first, first + 14,
                     fmt::format("coefficient a{} of the {} interval", k % 7 + 1, k < 7 ? "upper" : "lower"));
  }
  const auto interval_from = [](double low, double high, const double* a) {
    NasaInterval in;
    in.t_low = low;
    in.t_high = high;
    in.a = {0, 0, a[0], a[1], a[2], a[3], a[4]};
    in.b1 = a[5];
    in.b2 = a[6];
    return in;
  };
  return {interval_from(t_low, t_common, c + 7), interval_from(t_common, t_high, c)};
}

// The 7-coefficient record at `start`, or nothing for a condensed phase (not an ideal gas).
std::optional<NasaSpecies> parse_nasa7_record(const std::vector<Line>& lines, std::size_t start,
                                              std::optional<double> default_common, const std::string& origin) {
  const Line& head = lines[start];
  const auto name_words = split_words(columns(head.text, 1, 18));
  if (name_words.empty()) fail(origin, head.number, "columns 1-18 should begin with a species name");
  NasaSpecies sp;
  sp.name = std::string(name_words.front());
  check_record_lines(lines, start, sp.name, origin);
  const std::string_view phase = trim(columns(head.text, 45, 45));
  if (phase.size() != 1 || std::string_view("GgLlSs").find(phase.front()) == std::string_view::npos) {
    fail(origin, head.number, fmt::format("{}: column 45 should hold the phase, G, L or S, found '{}'", sp.name, phase));
  }
  if (phase != "G" && phase != "g") return std::nullopt;
  sp.molar_mass = nasa7_molar_mass(head, sp.name, origin);
  sp.intervals = nasa7_intervals(lines, start, default_common, sp.name, origin);
  const std::string date(trim(columns(head.text, 19, 24)));
  sp.source = fmt::format("{} line {} (NASA 7-coefficient record{})", origin, head.number,
                          date.empty() ? std::string() : ", date/code " + date);
  return sp;
}

}  // namespace

SpeciesLibrary SpeciesLibrary::parse_nasa7(std::string_view text, const std::string& origin) {
  const std::vector<Line> lines = split_lines(text);
  Builder builder(origin);
  std::optional<double> default_common;
  std::size_t i = 0;
  while (i < lines.size()) {
    const std::string word = is_comment_line(lines[i].text) ? std::string() : first_word_upper(lines[i].text);
    if (is_comment_line(lines[i].text)) {
      ++i;
    } else if (word == "THERMO") {
      ++i;
      if (const auto common = read_thermo_defaults(lines, i)) default_common = common;
    } else if (word == "END") {
      break;
    } else {
      const int record_line = lines[i].number;
      if (auto sp = parse_nasa7_record(lines, i, default_common, origin)) {
        builder.add(std::move(*sp), record_line, {record_line, record_line});
      }
      i += 4;
    }
  }
  return from_parts(std::move(builder.species), std::move(builder.aliases));
}

// =======================================================================================

const SpeciesLibrary& SpeciesLibrary::built_in() {
  // Parsed once, on first use; C++11 guarantees the initialisation is thread-safe.
  static const SpeciesLibrary library = [] {
    const std::string_view text = embedded_data("species.txt");
    if (text.empty()) {
      throw Error(ErrorKind::not_available,
                  "the built-in species data (data/species.txt) are missing from this build");
    }
    return parse_own_format(text, "species.txt (built in)");
  }();
  return library;
}

const NasaSpecies* SpeciesLibrary::find(std::string_view name) const {
  for (const NasaSpecies& sp : species_) {
    if (sp.name == name) return &sp;
  }
  for (const auto& [alias, target] : aliases_) {
    if (alias == name) {
      for (const NasaSpecies& sp : species_) {
        if (sp.name == target) return &sp;
      }
    }
  }
  return nullptr;
}

std::vector<std::string> SpeciesLibrary::aliases_of(std::string_view name) const {
  std::vector<std::string> found;
  for (const auto& [alias, target] : aliases_) {
    if (target == name) found.push_back(alias);
  }
  return found;
}

void SpeciesLibrary::merge(const SpeciesLibrary& other) {
  for (const NasaSpecies& sp : other.species_) {
    const auto same = std::find_if(species_.begin(), species_.end(),
                                   [&](const NasaSpecies& mine) { return mine.name == sp.name; });
    if (same != species_.end()) {
      *same = sp;
    } else {
      species_.push_back(sp);
    }
  }
  // Not a structured binding: clang 14 cannot capture one in a lambda (P1091 came in clang 16).
  for (const auto& entry : other.aliases_) {
    const std::string& alias = entry.first;
    const std::string& target = entry.second;
    const auto same = std::find_if(aliases_.begin(), aliases_.end(),
                                   [&](const auto& mine) { return mine.first == alias; });
    if (same != aliases_.end()) {
      same->second = target;
    } else {
      aliases_.emplace_back(alias, target);
    }
  }
}

}  // namespace shaftwork::fluids

// CriticalData: the critical-constant and interaction tables, read and checked.
#include "shaftwork/fluids/critical_data.hpp"

#include <cmath>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "text_lines.hpp"

namespace shaftwork::fluids {

std::string_view embedded_data(std::string_view file_name);  // generated from data/*.txt

namespace {

using detail::fail;
using detail::is_comment_line;
using detail::Line;
using detail::parse_number;
using detail::split_lines;
using detail::split_words;
using detail::trim;

// A data line: the words before '|' and the source text after it.
struct Record {
  std::vector<std::string_view> words;
  std::string source;
};

Record split_record(const Line& line, const std::string& origin) {
  const std::size_t bar = line.text.find('|');
  if (bar == std::string_view::npos) fail(origin, line.number, "expected '| source' at the end of the line");
  Record r{split_words(line.text.substr(0, bar)), std::string(trim(line.text.substr(bar + 1)))};
  if (r.source.empty()) fail(origin, line.number, "the source after '|' is empty");
  return r;
}

std::string species_name(std::string_view word, const SpeciesLibrary& species, const std::string& origin,
                         int line) {
  const NasaSpecies* sp = species.find(word);
  if (sp == nullptr) fail(origin, line, fmt::format("unknown species \"{}\"", word));
  return sp->name;
}

double number(std::string_view word, const char* what, const std::string& origin, int line) {
  const auto value = parse_number(word);
  if (!value) fail(origin, line, fmt::format("{} should be a number, found '{}'", what, word));
  return *value;
}

std::vector<std::pair<std::string, CriticalConstants>> parse_constants(std::string_view text,
                                                                        const std::string& origin,
                                                                        const SpeciesLibrary& species) {
  std::vector<std::pair<std::string, CriticalConstants>> out;
  for (const Line& line : split_lines(text)) {
    if (is_comment_line(line.text)) continue;
    const Record r = split_record(line, origin);
    if (r.words.size() != 4) {
      fail(origin, line.number, "expected: species, critical temperature (K), critical pressure (Pa), "
                                "acentric factor, '|' and the source");
    }
    const std::string name = species_name(r.words[0], species, origin, line.number);
    CriticalConstants c{number(r.words[1], "the critical temperature", origin, line.number),
                        number(r.words[2], "the critical pressure", origin, line.number),
                        number(r.words[3], "the acentric factor", origin, line.number), r.source};
    try {
      check_critical_constants(c, name);
    } catch (const Error& e) {
      fail(origin, line.number, e.what());
    }
    for (const auto& entry : out) {
      if (entry.first == name) fail(origin, line.number, fmt::format("{} is listed twice", name));
    }
    out.emplace_back(name, c);
  }
  return out;
}

bool same_pair(const InteractionParameter& a, const InteractionParameter& b) {
  return (a.first == b.first && a.second == b.second) || (a.first == b.second && a.second == b.first);
}

InteractionParameter parse_interaction(const Line& line, const std::string& origin, const SpeciesLibrary& species) {
  const Record r = split_record(line, origin);
  if (r.words.size() != 4) {
    fail(origin, line.number, "expected: two species, k_ij, the equations (pr, srk or pr,srk), '|' and the source");
  }
  InteractionParameter p;
  p.first = species_name(r.words[0], species, origin, line.number);
  p.second = species_name(r.words[1], species, origin, line.number);
  p.k = number(r.words[2], "k_ij", origin, line.number);
  p.source = r.source;
  const std::string_view kinds = r.words[3];
  p.peng_robinson = kinds == "pr" || kinds == "pr,srk";
  p.soave_redlich_kwong = kinds == "srk" || kinds == "pr,srk";
  if (!p.peng_robinson && !p.soave_redlich_kwong) {
    fail(origin, line.number, fmt::format("the equations should be pr, srk or pr,srk, found '{}'", kinds));
  }
  if (p.first == p.second) fail(origin, line.number, fmt::format("{} paired with itself", p.first));
  if (!(std::fabs(p.k) < 1)) {
    fail(origin, line.number, fmt::format("k_ij of {}-{} must lie between -1 and 1, got {:g}", p.first, p.second, p.k));
  }
  return p;
}

std::vector<InteractionParameter> parse_interactions(std::string_view text, const std::string& origin,
                                                     const SpeciesLibrary& species) {
  std::vector<InteractionParameter> out;
  for (const Line& line : split_lines(text)) {
    if (is_comment_line(line.text)) continue;
    InteractionParameter p = parse_interaction(line, origin, species);
    for (const InteractionParameter& q : out) {
      const bool overlap = (p.peng_robinson && q.peng_robinson) || (p.soave_redlich_kwong && q.soave_redlich_kwong);
      if (overlap && same_pair(p, q)) {
        fail(origin, line.number, fmt::format("the pair {}-{} is listed twice for one equation", p.first, p.second));
      }
    }
    out.push_back(std::move(p));
  }
  return out;
}

}  // namespace

std::string cubic_model_name(CubicKind kind) {
  return kind == CubicKind::peng_robinson ? "peng-robinson" : "soave-redlich-kwong";
}

void check_critical_constants(const CriticalConstants& c, const std::string& where) {
  const auto refuse = [&](const char* what, double value, const char* range) {
    throw Error(ErrorKind::bad_input, fmt::format("{}: the {} must lie {}, got {:g}", where, what, range, value));
  };
  if (!(c.critical_temperature > 1 && c.critical_temperature < 5000)) {
    refuse("critical temperature", c.critical_temperature, "between 1 and 5000 K");
  }
  if (!(c.critical_pressure > 1e3 && c.critical_pressure < 1e9)) {
    refuse("critical pressure", c.critical_pressure, "between 1 kPa and 1 GPa");
  }
  if (!(c.acentric_factor > -1 && c.acentric_factor < 2)) {
    refuse("acentric factor", c.acentric_factor, "between -1 and 2");
  }
}

CriticalData CriticalData::parse(std::string_view critical_text, const std::string& critical_origin,
                                 std::string_view interaction_text, const std::string& interaction_origin,
                                 const SpeciesLibrary& species) {
  CriticalData data;
  data.constants_ = parse_constants(critical_text, critical_origin, species);
  data.interactions_ = parse_interactions(interaction_text, interaction_origin, species);
  return data;
}

const CriticalData& CriticalData::built_in() {
  // Parsed once, on first use; C++11 guarantees the initialisation is thread-safe.
  static const CriticalData data = [] {
    const std::string_view critical = embedded_data("critical.txt");
    const std::string_view interaction = embedded_data("interaction.txt");
    if (critical.empty() || interaction.empty()) {
      throw Error(ErrorKind::not_available,
                  "the built-in critical constants (data/critical.txt, data/interaction.txt) are missing from "
                  "this build");
    }
    return parse(critical, "critical.txt (built in)", interaction, "interaction.txt (built in)",
                 SpeciesLibrary::built_in());
  }();
  return data;
}

const CriticalConstants* CriticalData::find(std::string_view species_name) const {
  for (const auto& [name, c] : constants_) {
    if (name == species_name) return &c;
  }
  return nullptr;
}

const InteractionParameter* CriticalData::interaction(std::string_view a, std::string_view b, CubicKind kind) const {
  for (const InteractionParameter& p : interactions_) {
    const bool applies = kind == CubicKind::peng_robinson ? p.peng_robinson : p.soave_redlich_kwong;
    if (applies && ((p.first == a && p.second == b) || (p.first == b && p.second == a))) return &p;
  }
  return nullptr;
}

}  // namespace shaftwork::fluids

// The batch rater: a CSV header becomes a plan of column setters, built once; each
// row then costs a number parse and a multiply-add per cell, one machines::rate and
// the formatting of its results. Nothing per row goes through JSON (except the jsonl
// output itself, which is JSON by definition).
#include "shaftwork/io/batch.hpp"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <condition_variable>
#include <cstdint>
#include <cstring>
#include <deque>
#include <exception>
#include <memory>
#include <mutex>
#include <optional>
#include <string_view>
#include <thread>
#include <vector>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/csv_reader.hpp"
#include "shaftwork/io/number_format.hpp"

namespace shaftwork::io {
namespace {

using machines::Quantity;
using units::Dimension;

constexpr int kSignificantDigits = 10;  // of the csv result columns, as write_csv's %.10g

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

// ---- What a column can set ----------------------------------------------------

enum class Target : std::uint8_t {
  id,
  note,
  inlet_pressure,
  inlet_temperature,
  inlet_enthalpy,
  outlet_pressure,
  outlet_temperature,
  outlet_enthalpy,
  outlet_quality,
  mass_flow,
  volume_flow,
  standard_volume_flow,
  power,
  efficiency_isentropic,
  efficiency_polytropic,
  mechanical_efficiency,
  head,
  barometer,
};

// Keys that give the same thing: two columns of one group contradict each other.
enum class Group : std::uint8_t {
  id,
  note,
  inlet_pressure,
  inlet_state,
  outlet_pressure,
  outlet_state,
  flow,
  power,
  efficiency,
  mechanical_efficiency,
  barometer,
};

const char* group_name(Group g) {
  switch (g) {
    case Group::id: return "the id";
    case Group::note: return "the note";
    case Group::inlet_pressure: return "the inlet pressure";
    case Group::inlet_state: return "the inlet temperature or enthalpy";
    case Group::outlet_pressure: return "the outlet pressure (or the pump head)";
    case Group::outlet_state: return "the outlet temperature, enthalpy or quality";
    case Group::flow: return "the flow";
    case Group::power: return "the power";
    case Group::efficiency: return "the efficiency";
    case Group::mechanical_efficiency: return "the mechanical efficiency";
    case Group::barometer: return "the barometric pressure";
  }
  return "a quantity";
}

struct KeyInfo {
  std::string_view key;
  Target target;
  Group group;
  Dimension dimension;  // fraction for text keys too; `text` says which
  bool text;
};

constexpr KeyInfo kKeys[] = {
    {"id", Target::id, Group::id, Dimension::fraction, true},
    {"note", Target::note, Group::note, Dimension::fraction, true},
    {"inlet.pressure", Target::inlet_pressure, Group::inlet_pressure, Dimension::pressure, false},
    {"inlet.temperature", Target::inlet_temperature, Group::inlet_state, Dimension::temperature, false},
    {"inlet.enthalpy", Target::inlet_enthalpy, Group::inlet_state, Dimension::specific_energy, false},
    {"outlet.pressure", Target::outlet_pressure, Group::outlet_pressure, Dimension::pressure, false},
    {"outlet.temperature", Target::outlet_temperature, Group::outlet_state, Dimension::temperature, false},
    {"outlet.enthalpy", Target::outlet_enthalpy, Group::outlet_state, Dimension::specific_energy, false},
    {"outlet.quality", Target::outlet_quality, Group::outlet_state, Dimension::fraction, false},
    {"mass_flow", Target::mass_flow, Group::flow, Dimension::mass_flow, false},
    {"volume_flow", Target::volume_flow, Group::flow, Dimension::volume_flow, false},
    {"standard_volume_flow", Target::standard_volume_flow, Group::flow, Dimension::standard_volume_flow, false},
    {"power", Target::power, Group::power, Dimension::power, false},
    {"efficiency", Target::efficiency_isentropic, Group::efficiency, Dimension::fraction, false},
    {"efficiency.isentropic", Target::efficiency_isentropic, Group::efficiency, Dimension::fraction, false},
    {"efficiency.polytropic", Target::efficiency_polytropic, Group::efficiency, Dimension::fraction, false},
    {"mechanical_efficiency", Target::mechanical_efficiency, Group::mechanical_efficiency, Dimension::fraction,
     false},
    // A pump head is a height ("85 m") or an energy per mass ("0.83 kJ/kg"): the
    // column's unit decides, so the dimension here is only for the "needs a unit" message.
    {"head", Target::head, Group::outlet_pressure, Dimension::length, false},
    {"site.barometric_pressure", Target::barometer, Group::barometer, Dimension::pressure, false},
};

std::string known_keys() {
  std::string list;
  for (const KeyInfo& k : kKeys) {
    if (!list.empty()) list += ", ";
    list += k.key;
  }
  return list;
}

// A unit to show in "needs its unit" messages.
const char* example_unit(Dimension d) {
  switch (d) {
    case Dimension::pressure: return "kPa";
    case Dimension::temperature: return "degC";
    case Dimension::mass_flow: return "kg/s";
    case Dimension::volume_flow: return "m3/h";
    case Dimension::standard_volume_flow: return "Nm3/h";
    case Dimension::power: return "kW";
    case Dimension::specific_energy: return "kJ/kg";
    case Dimension::length: return "m";
    default: return "%";
  }
}

inline std::string_view trim(std::string_view s) {
  if (!s.empty() && s.front() > ' ' && s.back() > ' ') return s;  // the common cell: nothing to trim
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
  return s;
}

// The problem the units layer finds with `unit` for dimension `d` ("unknown unit ...",
// "a temperature unit where a pressure belongs"), without the quoted value it puts first.
std::string unit_problem(std::string_view unit, Dimension d) {
  try {
    units::ParseNotes notes;
    units::to_si(1.0, unit, d, {}, notes);
  } catch (const Error& e) {
    std::string message = e.what();
    if (!message.empty() && message.front() == '"') {
      const auto close = message.find("\": ", 1);
      if (close != std::string::npos) message.erase(0, close + 3);
    }
    return message;
  }
  return {};
}

// ---- The plan: one setter per column --------------------------------------------

struct Column {
  std::size_t index = 0;  // field index in a row
  std::string header;     // as written, for messages
  Target target = Target::note;
  Dimension dimension = Dimension::fraction;
  bool text = false;
  std::string unit;            // as written in the brackets, "" for none
  double scale = 1, offset = 0;  // SI = scale * x + offset (+ barometer when gauge)
  bool gauge = false;
  std::string path;  // the key, for range messages ("efficiency.isentropic")
};

// An output column: a result value shown in a display unit.
struct OutputColumn {
  const ResultColumn* result;
  double scale = 1, offset = 0;  // display = (SI - offset) / scale
};

struct Plan {
  std::vector<std::string> header;  // the input header fields, as read
  std::vector<Column> columns;      // in the order cells are applied: the barometer first
  std::optional<std::size_t> id_index;
  bool has_barometer_column = false;
  std::vector<OutputColumn> outputs;
  std::string output_header;  // the whole csv header line, with its line end
};

Plan make_plan(std::vector<std::string> header, std::size_t header_line, const std::string& points_name,
               const BatchTemplate& templ, const BatchOptions& options) {
  Plan plan;
  auto fail = [&](std::size_t i, const std::string& problem) {
    refuse(fmt::format("{}: line {}, column {} \"{}\": {}", points_name, header_line, i + 1, header[i], problem));
  };
  std::vector<std::pair<Group, std::size_t>> seen;  // group, column index
  for (std::size_t i = 0; i < header.size(); ++i) {
    const std::string_view field = trim(header[i]);
    if (field.empty()) {
      refuse(fmt::format("{}: line {}, column {} has no name; name a case key such as inlet.pressure [kPa]",
                         points_name, header_line, i + 1));
    }
    std::string_view key = field;
    std::string_view unit;
    if (const auto open = field.find('['); open != std::string_view::npos) {
      if (field.back() != ']' || field.find('[', open + 1) != std::string_view::npos) {
        fail(i, "write the unit in square brackets after the key, as in \"inlet.pressure [barg]\"");
      }
      key = trim(field.substr(0, open));
      unit = trim(field.substr(open + 1, field.size() - open - 2));
      if (unit.empty()) fail(i, "the brackets hold no unit");
    }
    if (key == "machine" || key == "fluid") {
      fail(i, "machine and fluid come from the template (--case): they are the same for every row");
    }
    const KeyInfo* info = nullptr;
    for (const KeyInfo& k : kKeys) {
      if (k.key == key) info = &k;
    }
    if (!info) fail(i, fmt::format("unknown key \"{}\"; a column names one of {}", key, known_keys()));
    for (const auto& [group, other] : seen) {
      if (group == info->group) {
        fail(i, fmt::format("{} is given by column {} \"{}\" already; keep one", group_name(group), other + 1,
                            header[other]));
      }
    }
    seen.emplace_back(info->group, i);

    Column c;
    c.index = i;
    c.header = header[i];
    c.target = info->target;
    c.dimension = info->dimension;
    c.text = info->text;
    c.unit = std::string(unit);
    c.path = std::string(key);
    if (c.text) {
      if (!unit.empty()) fail(i, fmt::format("{} is text and takes no unit", key));
    } else if (unit.empty()) {
      if (c.dimension != Dimension::fraction) {
        fail(i, fmt::format("a {} needs its unit in square brackets, as in \"{} [{}]\"",
                            units::dimension_name(c.dimension), key, example_unit(c.dimension)));
      }
    } else {
      if (c.target == Target::head) {
        const units::UnitInfo* u = units::find_unit(unit);
        c.dimension = u && u->dimension == Dimension::length ? Dimension::length : Dimension::specific_energy;
      }
      const std::string problem = unit_problem(unit, c.dimension);
      if (!problem.empty()) fail(i, problem);
      // to_si() above forgives blanks around a unit; find_unit() does not ("kW\r" from a
      // header cut at a carriage return), so a unit that passed may still have no row.
      const units::UnitInfo* found = units::find_unit(unit);
      if (found == nullptr) {
        fail(i, fmt::format("unknown unit \"{}\" for a {} (a blank or control character in the brackets?)",
                            unit, units::dimension_name(c.dimension)));
      }
      const units::UnitInfo& u = *found;
      c.scale = u.scale;
      c.offset = u.offset;
      c.gauge = u.gauge;
      if (c.target == Target::barometer && c.gauge) {
        fail(i, fmt::format("the barometer is an absolute pressure: give it in kPa, mbar or inHg, not {}", unit));
      }
    }
    if (c.target == Target::id) plan.id_index = i;
    if (c.target == Target::barometer) plan.has_barometer_column = true;
    plan.columns.push_back(std::move(c));
  }
  // The barometer first: the gauge cells of its row need it.
  std::stable_partition(plan.columns.begin(), plan.columns.end(),
                        [](const Column& c) { return c.target == Target::barometer; });

  // The output columns.
  const fluids::FluidModel& fluid = *templ.input.rating.fluid;
  const bool two_phase = fluid.saturation_temperature(units::kStandardAtmosphere).has_value();
  const bool pump = templ.input.rating.machine == machines::MachineKind::pump;
  std::string& line = plan.output_header;
  for (std::size_t i = 0; i < header.size(); ++i) {
    if (i) line += ',';
    line += csv_field(header[i]);
  }
  line += header.empty() ? "" : ",";
  if (options.format == BatchFormat::csv) line += "status,error,solved_for";
  // A result that only repeats a given column (the same quantity in another unit) is
  // left out; so is the power balance when no power is given anywhere.
  auto given_by_column = [&plan](std::string_view key) {
    return std::any_of(plan.columns.begin(), plan.columns.end(), [key](const Column& c) {
      return c.path == key && c.target != Target::efficiency_isentropic && c.target != Target::efficiency_polytropic;
    });
  };
  const bool power_known = templ.input.rating.power.has_value() || given_by_column("power");
  for (const ResultColumn& r : result_columns()) {
    if (!r.in_batch || given_by_column(r.key)) continue;
    if (r.applies == ResultColumn::Applies::two_phase && !two_phase) continue;
    if (r.applies == ResultColumn::Applies::pump && !pump) continue;
    if (std::string_view(r.key) == "power_balance.difference_percent" && !power_known) continue;
    OutputColumn out{&r};
    const char* unit = display_unit(r.dimension, options.units);
    if (*unit) {
      const units::UnitInfo& u = *units::find_unit(unit);
      out.scale = u.scale;
      out.offset = u.offset;
      line += fmt::format(",{}", csv_field(fmt::format("{} [{}]", r.key, unit)));
    } else {
      line += fmt::format(",{}", r.key);
    }
    plan.outputs.push_back(out);
  }
  line += ",warnings\r\n";
  plan.header = std::move(header);
  return plan;
}

// ---- Rating rows ------------------------------------------------------------------

// Output text of a chunk: grows without filling, and is written through a pointer, so
// that a row of twenty numbers costs no more than the numbers themselves.
class OutputBuffer {
 public:
  // Room for n more bytes; write there, then commit(end).
  char* room(std::size_t n) {
    if (size_ + n > capacity_) grow(size_ + n);
    return data_.get() + size_;
  }
  void commit(const char* end) { size_ = static_cast<std::size_t>(end - data_.get()); }
  void append(std::string_view text) {
    if (text.empty()) return;  // memcpy into a buffer not yet allocated (null) is undefined
    char* p = room(text.size());
    std::memcpy(p, text.data(), text.size());
    size_ += text.size();
  }
  void push_back(char c) {
    char* p = room(1);
    *p = c;
    ++size_;
  }
  std::string_view view() const { return {data_.get(), size_}; }
  void clear() { size_ = 0; }

 private:
  void grow(std::size_t needed) {
    const std::size_t capacity = std::max(needed, 2 * capacity_ + 4096);
    std::unique_ptr<char[]> data(new char[capacity]);  // not zero-filled: written before read
    if (size_) std::memcpy(data.get(), data_.get(), size_);
    data_ = std::move(data);
    capacity_ = capacity;
  }

  std::unique_ptr<char[]> data_;
  std::size_t size_ = 0;
  std::size_t capacity_ = 0;
};

// What every worker shares, read-only.
struct Shared {
  const Plan& plan;
  const BatchTemplate& templ;
  const BatchOptions& options;
  machines::RatingInput base;         // the template with the columns' alternatives cleared
  std::vector<std::string> warnings;  // of every rated row (the template's, the barometer's)
  std::string warnings_joined;        // the same joined by "; ", for csv
};

void append_csv_field(OutputBuffer& out, std::string_view text) {
  bool plain = true;
  for (char ch : text) plain = plain && ch != ',' && ch != '"' && ch != '\r' && ch != '\n';
  if (plain) {
    out.append(text);
    return;
  }
  out.push_back('"');
  for (char ch : text) {
    if (ch == '"') out.push_back('"');
    out.push_back(ch);
  }
  out.push_back('"');
}

// 10^k for k = 0..15, exact in a double.
constexpr double kExactPowersOfTen[] = {1e0, 1e1, 1e2,  1e3,  1e4,  1e5,  1e6,  1e7,
                                        1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15};

// The common cell of a log, a plain decimal of at most 15 digits ("-0.0139", "172.5"),
// by Clinger's fast path: the digits as an integer below 2^53 and a division by an exact
// power of ten, which IEEE arithmetic rounds correctly, so the result is the one
// std::from_chars gives. False for anything else (exponents, long digit strings, text).
bool parse_plain_decimal(std::string_view cell, double& x) {
  const char* p = cell.data();
  const char* const end = p + cell.size();
  bool negative = false;
  if (p < end && (*p == '-' || *p == '+')) negative = *p++ == '-';
  std::uint64_t digits = 0;
  int count = 0;
  int decimals = 0;
  bool point = false;
  for (; p < end; ++p) {
    const char c = *p;
    if (c >= '0' && c <= '9') {
      if (++count > 15) return false;
      digits = digits * 10 + static_cast<std::uint64_t>(c - '0');
      decimals += point;
    } else if (c == '.' && !point) {
      point = true;
    } else {
      return false;
    }
  }
  if (count == 0) return false;
  x = static_cast<double>(digits) / kExactPowersOfTen[decimals];
  if (negative) x = -x;
  return true;
}

// Parses a cell as a number: the whole cell, locale-independent, a leading '+' allowed.
// Returns the problem, or an empty view.
std::string_view parse_number(std::string_view cell, double& x) {
  if (cell.empty()) return "the cell is empty";
  if (parse_plain_decimal(cell, x)) return {};
  const char* first = cell.data();
  const char* const last = cell.data() + cell.size();
  if (*first == '+' && cell.size() > 1 && cell[1] != '+' && cell[1] != '-') ++first;
  const auto [end, ec] = std::from_chars(first, last, x, std::chars_format::general);
  if (ec == std::errc::result_out_of_range && end == last) return "out of range";
  if (ec != std::errc() || end != last) return "not a number";
  if (!std::isfinite(x)) return "not finite";
  return {};
}

// The checks units::parse makes on an SI value of each dimension.
bool within_domain(Dimension d, double si) {
  if (!std::isfinite(si)) return false;
  switch (d) {
    case Dimension::pressure:
    case Dimension::temperature: return si > 0;
    case Dimension::mass_flow:
    case Dimension::volume_flow:
    case Dimension::standard_volume_flow:
    case Dimension::power:
    case Dimension::length: return si >= 0;
    default: return true;
  }
}

// Rates the rows of chunks; one per worker thread, since it keeps a RatingInput that
// each row overwrites in the columns' fields.
class RowRater {
 public:
  explicit RowRater(const Shared& shared) : shared_(shared), plan_(shared.plan), input_(shared.base) {}

  // Rates every record of `chunk`, appending the output to `out`.
  void rate_chunk(CsvChunk& chunk, OutputBuffer& out, std::size_t& rows, std::size_t& failed) {
    CsvRecordParser parser(chunk.text, chunk.first_line);
    while (parser.next(record_)) {
      ++rows;
      if (!rate_record(out)) ++failed;
    }
  }

 private:
  // Returns false when the row is written as an error.
  bool rate_record(OutputBuffer& out) {
    const std::size_t line = record_.line;
    error_.clear();
    id_ = {};
    cell_error_ = false;
    if (!record_.error.empty()) {
      error_ = fmt::format("line {}: {}", line, record_.error);
      cell_error_ = true;
    } else if (record_.fields.size() != plan_.header.size()) {
      error_ = fmt::format("line {}: {} {} where the header has {}", line, record_.fields.size(),
                           record_.fields.size() == 1 ? "field" : "fields", plan_.header.size());
      cell_error_ = true;
    } else {
      barometer_ = shared_.templ.input.barometric_pressure;
      barometer_given_ = shared_.templ.barometer_given;
      for (const Column& c : plan_.columns) {
        if (!apply(c, record_.fields[c.index], line)) {
          cell_error_ = true;
          break;
        }
      }
    }
    bool rated = false;
    if (error_.empty()) {
      try {
        rating_ = machines::rate(input_);
        rated = true;
      } catch (const Error& e) {
        error_ = fmt::format("line {}: {}", line, e.what());
      }
    }
    if (shared_.options.format == BatchFormat::jsonl) {
      write_jsonl(out, rated, line);
    } else {
      write_csv_row(out, rated);
    }
    return rated;
  }

  // Sets the field of column `c` from its cell; false with error_ set when it cannot.
  bool apply(const Column& c, std::string_view raw, std::size_t line) {
    if (c.target == Target::id) {
      id_ = raw;
      return true;
    }
    if (c.target == Target::note) return true;
    const std::string_view cell = trim(raw);
    double x = 0;
    if (const std::string_view problem = parse_number(cell, x); !problem.empty()) {
      if (problem == "the cell is empty") {
        error_ = fmt::format("line {}, column \"{}\": the cell is empty", line, c.header);
      } else if (problem == "out of range") {
        error_ = fmt::format("line {}, column \"{}\": the number \"{}\" is out of range", line, c.header, cell);
      } else if (problem == "not finite") {
        error_ = fmt::format("line {}, column \"{}\": \"{}\" is not a finite number", line, c.header, cell);
      } else {
        error_ = fmt::format("line {}, column \"{}\": \"{}\" is not a number", line, c.header, cell);
      }
      return false;
    }
    double si = x;
    if (!c.unit.empty()) {
      si = c.scale * x + c.offset;
      if (c.gauge) si += barometer_;
      if (!within_domain(c.dimension, si)) {
        error_ = fmt::format("line {}, column \"{}\": {}", line, c.header, domain_problem(c, cell));
        return false;
      }
    }
    si += 0.0;  // as units::parse: no -0.0
    machines::RatingInput& r = input_;
    switch (c.target) {
      case Target::inlet_pressure: r.inlet_pressure = si; break;
      case Target::inlet_temperature: r.inlet_temperature = si; break;
      case Target::inlet_enthalpy: r.inlet_enthalpy = si; break;
      case Target::outlet_pressure: r.outlet_pressure = si; break;
      case Target::outlet_temperature: r.outlet_temperature = si; break;
      case Target::outlet_enthalpy: r.outlet_enthalpy = si; break;
      case Target::outlet_quality: r.outlet_quality = si; break;
      case Target::mass_flow: r.flow = machines::Flow{machines::Flow::Kind::mass, si}; break;
      case Target::volume_flow: r.flow = machines::Flow{machines::Flow::Kind::actual_volume, si}; break;
      case Target::standard_volume_flow: r.flow = machines::Flow{machines::Flow::Kind::molar, si}; break;
      case Target::power: r.power = si; break;
      case Target::efficiency_isentropic:
      case Target::efficiency_polytropic:
        if (!(si > 0 && si <= 1)) {
          error_ = fmt::format("line {}, column \"{}\": must be above 0 and at most 1 (or 100 %), got {:.6g}", line,
                               c.header, si);
          return false;
        }
        r.efficiency = machines::Efficiency{c.target == Target::efficiency_isentropic
                                                ? machines::EfficiencyBasis::isentropic
                                                : machines::EfficiencyBasis::polytropic,
                                            si};
        break;
      case Target::mechanical_efficiency:
        if (!(si > 0 && si <= 1)) {
          error_ = fmt::format("line {}, column \"{}\": must be above 0 and at most 1, got {:.6g}", line, c.header, si);
          return false;
        }
        r.mechanical_efficiency = si;
        break;
      case Target::head: r.pump_head = c.dimension == Dimension::length ? si * units::kStandardGravity : si; break;
      case Target::barometer:
        barometer_ = si;
        barometer_given_ = true;
        break;
      case Target::id:
      case Target::note: break;
    }
    return true;
  }

  // Why a converted cell is out of its dimension's domain, in the units layer's words.
  std::string domain_problem(const Column& c, std::string_view cell) const {
    try {
      units::ParseContext context;
      if (barometer_given_) context.barometric_pressure = barometer_;
      units::ParseNotes notes;
      units::parse(fmt::format("{} {}", cell, c.unit), c.dimension, context, notes);
    } catch (const Error& e) {
      return e.what();
    }
    return fmt::format("\"{} {}\" is out of range", cell, c.unit);
  }

  void write_csv_row(OutputBuffer& out, bool rated) {
    const Plan& plan = plan_;
    const std::size_t n = plan.header.size();
    if (!record_.has_quotes && record_.fields.size() == n) {
      out.append(record_.text);  // the fields as written, commas and all
    } else {
      for (std::size_t i = 0; i < n; ++i) {
        if (i) out.push_back(',');
        if (i < record_.fields.size()) append_csv_field(out, record_.fields[i]);
      }
    }
    if (n) out.push_back(',');
    if (!rated) {
      out.append("error,");
      append_csv_field(out, error_);
      out.push_back(',');
      char* p = out.room(plan.outputs.size() + 1);
      for (std::size_t i = 0; i <= plan.outputs.size(); ++i) *p++ = ',';
      out.commit(p);
      if (!cell_error_) append_warnings(out, nullptr);
      out.append("\r\n");
      return;
    }
    out.append("ok,,");
    const machines::SolvedFor& solved = rating_.solved_for;
    if (!std::equal(solved.begin(), solved.end(), solved_for_.begin(), solved_for_.end()) ||
        solved_for_text_.empty()) {  // the rows of a log mostly solve for the same quantities
      solved_for_ = rating_.solved_for;
      solved_for_text_.clear();
      for (Quantity q : solved_for_) {
        if (!solved_for_text_.empty()) solved_for_text_ += ' ';
        solved_for_text_ += machines::quantity_key(q);
      }
    }
    out.append(solved_for_text_);
    char* p = out.room(plan.outputs.size() * (kMaxNumberChars + 1));
    for (const OutputColumn& o : plan.outputs) {
      *p++ = ',';
      const std::optional<double> v = o.result->value(rating_);
      if (v && std::isfinite(*v)) p = format_significant(p, (*v - o.offset) / o.scale, kSignificantDigits);
    }
    out.commit(p);
    out.push_back(',');
    append_warnings(out, &rating_.warnings);
    out.append("\r\n");
  }

  void append_warnings(OutputBuffer& out, const std::vector<std::string>* extra) {
    if (!extra || extra->empty()) {
      append_csv_field(out, shared_.warnings_joined);
      return;
    }
    std::string joined = shared_.warnings_joined;
    for (const auto& w : *extra) joined += (joined.empty() ? "" : "; ") + w;
    append_csv_field(out, joined);
  }

  void write_jsonl(OutputBuffer& out, bool rated, std::size_t line) {
    const std::string id = id_.empty() ? fmt::format("line {}", line) : std::string(id_);
    if (rated) {
      std::vector<std::string> warnings = shared_.warnings;
      warnings.insert(warnings.end(), rating_.warnings.begin(), rating_.warnings.end());
      // A CSV cell may hold bytes that are not UTF-8 (an id from a logger): written as U+FFFD,
      // where dump() would otherwise throw out of the batch.
      out.append(result_json(id, shared_.templ.input.fluid_name, rating_, warnings)
                     .dump(-1, ' ', false, nlohmann::ordered_json::error_handler_t::replace));
    } else {
      out.append(error_json(id, error_, cell_error_ ? std::vector<std::string>{} : shared_.warnings)
                     .dump(-1, ' ', false, nlohmann::ordered_json::error_handler_t::replace));
    }
    out.push_back('\n');
  }

  const Shared& shared_;
  const Plan& plan_;
  machines::RatingInput input_;
  CsvRecord record_;
  machines::Rating rating_;
  std::string_view id_;  // the id cell of the row being rated
  machines::SolvedFor solved_for_;  // of the previous rated row, and as text
  std::string solved_for_text_;
  std::string error_;
  bool cell_error_ = false;  // the row failed before rating: no warnings, as for a case that cannot be read
  double barometer_ = units::kStandardAtmosphere;
  bool barometer_given_ = false;
};

// The template's RatingInput with the fields that columns give cleared, and the
// warnings every rated row carries.
Shared make_shared_state(const Plan& plan, const BatchTemplate& templ, const BatchOptions& options) {
  Shared shared{plan, templ, options, templ.input.rating, {}, {}};
  machines::RatingInput& r = shared.base;
  std::map<Quantity, std::string> written = templ.input.unit_written;
  bool gauge_column = false;
  bool inlet_pressure_column = false;
  bool outlet_pressure_column = false;
  for (const Column& c : plan.columns) {
    gauge_column = gauge_column || c.gauge;
    inlet_pressure_column = inlet_pressure_column || c.target == Target::inlet_pressure;
    outlet_pressure_column =
        outlet_pressure_column || c.target == Target::outlet_pressure || c.target == Target::head;
    switch (c.target) {
      case Target::inlet_pressure: written[Quantity::inlet_pressure] = c.unit; break;
      case Target::inlet_temperature:
      case Target::inlet_enthalpy:
        r.inlet_temperature.reset();
        r.inlet_enthalpy.reset();
        written.erase(Quantity::inlet_temperature);
        if (c.target == Target::inlet_temperature) written[Quantity::inlet_temperature] = c.unit;
        break;
      case Target::outlet_pressure:
      case Target::head:
        r.outlet_pressure.reset();
        r.pump_head.reset();
        written.erase(Quantity::outlet_pressure);
        if (c.target == Target::outlet_pressure) written[Quantity::outlet_pressure] = c.unit;
        break;
      case Target::outlet_temperature:
      case Target::outlet_enthalpy:
      case Target::outlet_quality:
        r.outlet_temperature.reset();
        r.outlet_enthalpy.reset();
        r.outlet_quality.reset();
        written.erase(Quantity::outlet_temperature);
        if (c.target == Target::outlet_temperature) written[Quantity::outlet_temperature] = c.unit;
        break;
      case Target::mass_flow:
      case Target::volume_flow:
      case Target::standard_volume_flow:
        written.erase(Quantity::flow);
        if (c.target == Target::mass_flow) written[Quantity::flow] = c.unit;
        break;
      case Target::power: written[Quantity::power] = c.unit; break;
      case Target::efficiency_isentropic:
      case Target::efficiency_polytropic: written[Quantity::efficiency] = c.unit; break;
      default: break;
    }
  }
  // Gauge units still given by the template, and the barometer they are read against.
  bool gauge_in_template = false;
  for (Quantity q : {Quantity::inlet_pressure, Quantity::outlet_pressure}) {
    const bool overridden = q == Quantity::inlet_pressure ? inlet_pressure_column : outlet_pressure_column;
    const auto it = templ.input.unit_written.find(q);
    if (it != templ.input.unit_written.end() && !overridden) {
      const units::UnitInfo* u = units::find_unit(it->second);
      gauge_in_template = gauge_in_template || (u && u->gauge);
    }
  }
  if (plan.has_barometer_column) {
    // Rows carry their own barometer: messages show gauge readings as absolute kPa.
    for (auto& [q, unit] : written) {
      const units::UnitInfo* u = units::find_unit(unit);
      if (u && u->gauge) unit.clear();
    }
  }
  r.echo = make_value_echo(std::move(written), templ.input.barometric_pressure);

  for (const std::string& w : templ.input.warnings) {
    if (w != kDefaultBarometerWarning) shared.warnings.push_back(w);
  }
  if ((gauge_column || gauge_in_template) && !templ.barometer_given && !plan.has_barometer_column) {
    shared.warnings.emplace_back(kDefaultBarometerWarning);
  }
  for (const std::string& w : shared.warnings) shared.warnings_joined += (shared.warnings_joined.empty() ? "" : "; ") + w;
  return shared;
}

// ---- The pipeline -------------------------------------------------------------------

struct Job {
  CsvChunk chunk;
  OutputBuffer out;
  std::size_t rows = 0;
  std::size_t failed = 0;
  bool done = false;
  std::exception_ptr error;
};

// Worker threads taking jobs from a queue; the caller waits for each job in turn.
// Starts as many of the threads asked for as the system allows (std::thread throws
// std::system_error when it cannot make one, e.g. under a small ulimit -v); with none
// started, submit() rates each job on the calling thread.
class WorkerPool {
 public:
  WorkerPool(const Shared& shared, unsigned threads) : shared_(shared) {
    try {
      threads_.reserve(threads);
      for (unsigned i = 0; i < threads; ++i) threads_.emplace_back([this] { work(); });
    } catch (const std::exception&) {
      // Run with the threads that started.
    }
  }
  WorkerPool(const WorkerPool&) = delete;
  WorkerPool& operator=(const WorkerPool&) = delete;
  ~WorkerPool() {
    {
      const std::lock_guard lock(mutex_);
      closing_ = true;
      queue_.clear();  // jobs not yet started are dropped (the batch is over or failed)
    }
    work_ready_.notify_all();
    for (auto& t : threads_) t.join();
  }

  // The threads that rate: those started, or the calling thread alone.
  unsigned threads() const { return std::max(1u, static_cast<unsigned>(threads_.size())); }

  void submit(Job* job) {
    if (threads_.empty()) {
      if (!inline_rater_) inline_rater_ = std::make_unique<RowRater>(shared_);
      run(*inline_rater_, *job);
      job->done = true;
      return;
    }
    {
      const std::lock_guard lock(mutex_);
      queue_.push_back(job);
    }
    work_ready_.notify_one();
  }

  void wait(Job* job) {
    std::unique_lock lock(mutex_);
    job_done_.wait(lock, [job] { return job->done; });
  }

 private:
  static void run(RowRater& rater, Job& job) {
    try {
      rater.rate_chunk(job.chunk, job.out, job.rows, job.failed);
    } catch (...) {
      job.error = std::current_exception();
    }
  }

  void work() {
    // A rater that cannot be made (memory) fails each job this thread takes.
    std::unique_ptr<RowRater> rater;
    std::exception_ptr broken;
    try {
      rater = std::make_unique<RowRater>(shared_);
    } catch (...) {
      broken = std::current_exception();
    }
    for (;;) {
      Job* job = nullptr;
      {
        std::unique_lock lock(mutex_);
        work_ready_.wait(lock, [this] { return closing_ || !queue_.empty(); });
        if (queue_.empty()) return;
        job = queue_.front();
        queue_.pop_front();
      }
      if (rater) {
        run(*rater, *job);
      } else {
        job->error = broken;
      }
      {
        const std::lock_guard lock(mutex_);
        job->done = true;
      }
      job_done_.notify_all();
    }
  }

  const Shared& shared_;
  std::unique_ptr<RowRater> inline_rater_;
  std::mutex mutex_;
  std::condition_variable work_ready_;
  std::condition_variable job_done_;
  std::deque<Job*> queue_;
  bool closing_ = false;
  std::vector<std::thread> threads_;
};

}  // namespace

BatchTemplate read_batch_template(const nlohmann::json& document, const std::string& origin, FluidFactory& fluids) {
  const auto cases = case_objects(document, origin);
  if (cases.size() != 1) {
    refuse(fmt::format("{}: a template holds one case; this file holds {}", origin, cases.size()));
  }
  BatchTemplate templ;
  try {
    templ.input = read_case(*cases.front(), 0, fluids);
  } catch (const Error& e) {
    refuse(fmt::format("{}: {}", origin, e.what()));
  } catch (const nlohmann::json::exception& e) {
    refuse(fmt::format("{}: unexpected JSON content: {}", origin, e.what()));
  }
  const nlohmann::json& c = *cases.front();
  templ.barometer_given = c.contains("site") && c["site"].is_object() && c["site"].contains("barometric_pressure");
  return templ;
}

BatchSummary rate_batch(ByteSource& points, const std::string& points_name, const BatchTemplate& templ,
                        ByteSink& out, const BatchOptions& options, BatchProgress* progress) {
  CsvChunker chunker(points, points_name, options.chunk_bytes);

  // The header: the first record of the first chunk.
  auto first = std::make_unique<Job>();
  if (!chunker.next(first->chunk)) refuse(fmt::format("{}: the input is empty: expected a header row", points_name));
  std::vector<std::string> header;
  std::size_t header_line = 1;
  {
    CsvRecordParser parser(first->chunk.text, first->chunk.first_line);
    CsvRecord record;
    if (!parser.next(record)) refuse(fmt::format("{}: the input is empty: expected a header row", points_name));
    if (!record.error.empty()) refuse(fmt::format("{}: line {}: {}", points_name, record.line, record.error));
    header_line = record.line;
    for (std::string_view f : record.fields) header.emplace_back(f);
    first->chunk.text.erase(0, parser.position());
    first->chunk.first_line = parser.line();
  }
  const Plan plan = make_plan(std::move(header), header_line, points_name, templ, options);
  const Shared shared = make_shared_state(plan, templ, options);
  if (options.format == BatchFormat::csv) out.write(plan.output_header);

  BatchSummary summary;
  auto finish_job = [&](Job& job) {
    if (job.error) std::rethrow_exception(job.error);
    out.write(job.out.view());
    summary.rows += job.rows;
    summary.failed += job.failed;
    if (progress) progress->update(summary.rows, chunker.bytes_read(), points.size_hint());
  };

  if (options.jobs <= 1) {
    RowRater rater(shared);
    Job& job = *first;
    for (bool more = true; more; more = chunker.next(job.chunk)) {
      job.out.clear();
      job.rows = job.failed = 0;
      rater.rate_chunk(job.chunk, job.out, job.rows, job.failed);
      finish_job(job);
    }
  } else {
    // A few chunks per worker in flight: enough to keep every worker busy while the
    // oldest is written, few enough that memory does not follow the input's length.
    const std::size_t max_in_flight = 2 * static_cast<std::size_t>(options.jobs) + 1;
    std::vector<std::unique_ptr<Job>> spare;
    std::deque<std::unique_ptr<Job>> in_flight;
    WorkerPool pool(shared, options.jobs);
    summary.threads = pool.threads();
    pool.submit(first.get());
    in_flight.push_back(std::move(first));
    bool more = true;
    while (!in_flight.empty() || more) {
      while (more && in_flight.size() < max_in_flight) {
        std::unique_ptr<Job> job;
        if (spare.empty()) {
          job = std::make_unique<Job>();
        } else {
          job = std::move(spare.back());
          spare.pop_back();
        }
        if (!chunker.next(job->chunk)) {
          more = false;
          break;
        }
        job->out.clear();
        job->rows = job->failed = 0;
        job->done = false;
        pool.submit(job.get());
        in_flight.push_back(std::move(job));
      }
      if (in_flight.empty()) break;
      std::unique_ptr<Job> job = std::move(in_flight.front());
      in_flight.pop_front();
      pool.wait(job.get());
      finish_job(*job);
      spare.push_back(std::move(job));
    }
  }
  if (progress) progress->finish(summary.rows);
  return summary;
}

}  // namespace shaftwork::io

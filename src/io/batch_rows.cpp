#include "batch_rows.hpp"

#include <algorithm>
#include <cmath>
#include <span>

#include <fmt/format.h>

#include "cell_number.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/guarantee_reader.hpp"
#include "shaftwork/io/number_format.hpp"
#include "shaftwork/io/result_writer.hpp"
#include "shaftwork/io/timestamp.hpp"
#include "shaftwork/io/uncertainty_input.hpp"
#include "shaftwork/text.hpp"

namespace shaftwork::io {
namespace {

using machines::Input;
using units::Dimension;

constexpr int kSignificantDigits = 10;  // of the csv result columns, as write_csv's

// True when a column gives `input` or another form of the same quantity: the template's
// value then gives way to the row's.
bool overridden(const Plan& plan, Input input) {
  const auto gives = machines::spec(input).gives;
  return std::any_of(plan.inputs.begin(), plan.inputs.end(), [&](const InputColumn& c) {
    return c.input == input || (gives && machines::spec(c.input).gives == gives);
  });
}

// The template as the rows see it: the values the columns replace dropped, the columns'
// units added for messages (no value), gauge units dropped when rows bring a barometer.
CaseInput row_shape(const Plan& plan, const CaseInput& templ) {
  CaseInput shape = templ;
  std::erase_if(shape.given, [&](const GivenValue& g) { return overridden(plan, g.input); });
  for (const InputColumn& c : plan.inputs) shape.given.push_back(GivenValue{c.input, 0, c.gauge, "", c.unit, {}});
  if (plan.has_barometer_column) {
    for (GivenValue& g : shape.given) {
      if (g.on_barometer) g.unit.clear();  // messages show absolute kPa
    }
  }
  return shape;
}

// The units layer's own checks on an SI value of each dimension.
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

// The template's statement for a column's key: on its own value of that key (which the
// column replaces), else by key.
std::optional<StatedUncertainty> template_statement(const CaseInput& templ, Input input) {
  if (const GivenValue* g = templ.find(input); g && g->uncertainty) return g->uncertainty;
  for (const StatedUncertainty& s : templ.uncertainty_by_key) {
    if (s.input == input) return s;
  }
  return std::nullopt;
}

const UncertaintyColumn* uncertainty_column_of(const Plan& plan, Input input) {
  for (const UncertaintyColumn& u : plan.uncertainty_columns) {
    if (u.input == input) return &u;
  }
  return nullptr;
}

// The values of the rows that may carry an uncertainty, and the readings that move with the
// barometer.
void plan_row_uncertainty(const Plan& plan, const CaseInput& templ, BatchShared& shared) {
  for (const InputColumn& c : plan.inputs) {
    UncertainValue v{c.input, uncertainty_column_of(plan, c.input), template_statement(templ, c.input), true, 0};
    if (v.column || v.statement) shared.uncertain.push_back(v);
    if (c.gauge) shared.barometer_moves.add_barometer_move(c.input);
  }
  for (const GivenValue& g : templ.given) {
    if (overridden(plan, g.input)) continue;
    UncertainValue v{g.input, uncertainty_column_of(plan, g.input), g.uncertainty, false,
                     reading_magnitude(g, templ.barometer())};
    if (v.column || v.statement) shared.uncertain.push_back(v);
    if (g.on_barometer) shared.barometer_moves.add_barometer_move(g.input);
  }
}

}  // namespace

BatchShared::BatchShared(const Plan& p, const BatchTemplate& t, const BatchOptions& o, const std::string& name)
    : plan(p), templ(t), options(o), points_name(name) {
  base = to_rating_input(row_shape(plan, templ.input));
  for (const InputColumn& c : plan.inputs) {
    if (const auto field = machines::spec(c.input).field) base.*field = std::nullopt;
    if (c.input != Input::standard_volume_flow) continue;
    if (const auto reference = units::standard_reference(*units::find_unit(c.unit), templ.input.context())) {
      standard_reference = units::describe(*reference);
    }
  }
  bool gauge = std::any_of(plan.inputs.begin(), plan.inputs.end(), [](const InputColumn& c) { return c.gauge; });
  for (const GivenValue& g : templ.input.given) {
    if (g.on_barometer && !overridden(plan, g.input)) template_gauge_inputs.push_back(g.input);
    gauge = gauge || g.on_barometer;
  }
  for (const std::string& w : templ.input.warnings) {
    if (w != kDefaultBarometerWarning) warnings.push_back(w);
  }
  if (gauge && !templ.input.find(Input::barometric_pressure) && !plan.has_barometer_column) {
    warnings.emplace_back(kDefaultBarometerWarning);
  }
  for (const std::string& w : warnings) warnings_joined += (warnings_joined.empty() ? "" : "; ") + w;
  if (plan.uncertainty) plan_row_uncertainty(plan, templ.input, *this);
}

namespace {

// The propagation a row needs: every key with contributions for jsonl; the csv's result
// columns alone otherwise.
UncertaintyPropagator propagator_for(const BatchShared& shared) {
  if (shared.options.format == BatchFormat::jsonl) return UncertaintyPropagator();
  std::vector<std::size_t> keys;
  for (const OutputColumn& o : shared.plan.outputs) {
    keys.push_back(static_cast<std::size_t>(o.key - result_keys().data()));
  }
  if (shared.options.points) {
    // The chart's bands: the two efficiencies, whatever the columns.
    for (const std::string_view key : {"efficiency.isentropic", "efficiency.polytropic"}) {
      const std::size_t k = row_of(*find_result_key(key));
      if (std::find(keys.begin(), keys.end(), k) == keys.end()) keys.push_back(k);
    }
  }
  return UncertaintyPropagator(std::move(keys));
}

}  // namespace

RowRater::RowRater(const BatchShared& shared)
    : shared_(shared), plan_(shared.plan), input_(shared.base), propagator_(propagator_for(shared)) {}

void RowRater::rate_chunk(CsvChunk& chunk, OutputBuffer& out, RowCounts& counts, std::vector<BatchPoint>& points) {
  CsvRecordParser parser(chunk.text, chunk.first_line);
  const bool want_points = shared_.options.points != nullptr;
  while (parser.next(record_)) {
    ++counts.rows;
    const bool rated = rate_record(out, counts);
    if (!rated) ++counts.failed;
    if (want_points) points.push_back(point_of(rated, counts.rows));
  }
}

// The row's verdict on the template's guarantee, as a single test point.
void RowRater::judge_guarantee(std::size_t line, RowCounts& counts) {
  guarantee_.reset();
  guarantee_error_.clear();
  machines::TestPoint point;
  point.id = id_.empty() ? fmt::format("line {}", line) : std::string(id_);
  point.input = input_;
  point.rating = rating_;
  if (rated_uncertainty_) point.uncertainty = uncertainty_by_result_key(uncertainty_);
  try {
    guarantee_ = machines::judge(*shared_.templ.guarantee, std::span(&point, 1));
    if (guarantee_->verdict == machines::Verdict::fail) ++counts.guarantees_failed;
  } catch (const Error& e) {
    guarantee_error_ = fmt::format("guarantee: {}", e.what());
    ++counts.guarantees_not_judged;
  }
}

BatchPoint RowRater::point_of(bool rated, std::size_t row) const {
  BatchPoint p;
  p.row = row;
  p.rated = rated;
  if (plan_.time_index && *plan_.time_index < record_.fields.size()) {
    if (const auto t = parse_timestamp(trim(record_.fields[*plan_.time_index]))) p.time = *t;
  }
  if (!rated) return p;
  p.efficiency_isentropic = rating_.efficiency_isentropic;
  p.efficiency_polytropic = rating_.efficiency_polytropic;
  if (rating_.power_balance) p.balance_percent = rating_.power_balance->difference_percent;
  if (rated_uncertainty_) {
    const auto expanded = [&](std::string_view key) {
      const std::optional<double> u = uncertainty_.expanded[row_of(*find_result_key(key))];
      return u ? *u : BatchPoint::kNone;
    };
    p.uncertainty_isentropic = expanded("efficiency.isentropic");
    p.uncertainty_polytropic = expanded("efficiency.polytropic");
  }
  return p;
}

bool RowRater::rate_record(OutputBuffer& out, RowCounts& counts) {
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
    cell_error_ = !apply_cells(line);
  }
  bool rated = false;
  rated_uncertainty_ = false;
  if (error_.empty()) {
    try {
      rating_ = machines::rate(input_, plan_.rating);
      rated = true;
    } catch (const Error& e) {
      error_ = fmt::format("line {}: {}", line, e.what());
    }
  }
  if (rated && plan_.uncertainty && sources_.count > 0) {
    propagator_.propagate(input_, sources_, rating_, uncertainty_);
    rated_uncertainty_ = true;
  }
  if (rated && shared_.templ.guarantee) judge_guarantee(line, counts);
  if (shared_.options.format == BatchFormat::jsonl) {
    write_jsonl(out, rated, line);
  } else {
    write_csv_row(out, rated);
  }
  return rated;
}

// Sets every column's value of the row; false with error_ set at the first bad cell.
bool RowRater::apply_cells(std::size_t line) {
  if (plan_.id_index) id_ = record_.fields[*plan_.id_index];
  barometer_ = shared_.templ.input.barometer();
  for (const InputColumn& c : plan_.inputs) {
    const std::string_view cell = record_.fields[c.index];
    if (!apply_plain(c, cell) && !apply(c, cell, line)) return false;
  }
  if (plan_.has_barometer_column) {
    // The template's gauge readings, read against this row's barometer.
    const double shift = barometer_ - shared_.templ.input.barometer();
    for (Input input : shared_.template_gauge_inputs) {
      input_.*machines::spec(input).field = shared_.templ.input.find(input)->si + shift;
    }
  }
  return !plan_.uncertainty || apply_uncertainties(line);
}

// The row's uncertainties into sources_; false with error_ set at a bad uncertainty cell.
bool RowRater::apply_uncertainties(std::size_t line) {
  sources_ = shared_.barometer_moves;
  sources_.barometer = barometer_;
  for (const UncertainValue& v : shared_.uncertain) {
    const double reading = v.from_row ? readings_[static_cast<std::size_t>(v.input)] : v.template_reading;
    const std::string_view cell = v.column ? trim(record_.fields[v.column->index]) : std::string_view();
    if (cell.empty()) {
      if (v.statement) sources_.add(v.input, expanded_of(*v.statement, reading));
      continue;
    }
    double x = 0;
    if (const std::string_view problem = parse_cell_number(cell, x); !problem.empty() || x < 0) {
      error_ = fmt::format("line {}, column \"{}\": \"{}\"{}", line, v.column->header, cell,
                           problem.empty() ? ": an uncertainty cannot be negative" : " is not a number");
      return false;
    }
    sources_.add(v.input, v.column->relative ? x / 100 * reading : x * v.column->scale);
  }
  return true;
}

// A log's common cell, in full: a plain decimal whose value is in its column's plain range
// (which implies the units layer's domain, the factor being positive), not a negative vacuum
// reading, not the barometer. False for any other cell, which apply() takes from the start.
// Inline and without calls: every cell of a batch comes here first.
inline bool RowRater::apply_plain(const InputColumn& c, std::string_view cell) {
  double x = 0;
  if (!parse_plain_decimal(cell, x) || !c.field) return false;
  const double si = in_unit_si(c, x) * c.factor + 0.0;  // as apply()
  if (!c.plain.contains(si) || (c.vacuum && x < 0)) return false;
  set_value(c, x, si);
  return true;
}

// The cell's value x in SI of the column's unit (a head in m: a length), before the factor.
inline double RowRater::in_unit_si(const InputColumn& c, double x) const {
  return c.scale * x + c.offset + (c.gauge ? barometer_ : 0.0);
}

// An accepted value into the rating input (or the row's barometer), and its reading.
inline void RowRater::set_value(const InputColumn& c, double x, double si) {
  if (plan_.uncertainty) readings_[static_cast<std::size_t>(c.input)] = std::fabs(c.scale * x) * c.factor;
  if (c.field) {
    input_.*c.field = si;
  } else {
    barometer_ = si;
  }
}

bool RowRater::apply(const InputColumn& c, std::string_view raw, std::size_t line) {
  double x = 0;
  std::string_view cell = raw;
  // The common cell at once; any other trimmed and read in full.
  if (!parse_plain_decimal(raw, x)) {
    cell = trim(raw);
    if (const std::string_view problem = parse_cell_number(cell, x); !problem.empty()) {
      refuse_cell(c, cell, problem, line);
      return false;
    }
  }
  const double unit_si = in_unit_si(c, x);
  const double si = unit_si * c.factor + 0.0;  // as units::parse: no -0.0
  if (!c.plain.contains(si) || (c.vacuum && x < 0)) {
    if (const std::string problem = value_problem(c, cell, x, unit_si, si); !problem.empty()) {
      error_ = fmt::format("line {}, column \"{}\": {}", line, c.header, problem);
      return false;
    }
  }
  set_value(c, x, si);
  return true;
}

// Why the value of a cell is refused ("" when it is not): the units layer's domain of the
// value in SI of the column's unit (a head in m: a length), then the input's range and the
// unit's sense.
std::string RowRater::value_problem(const InputColumn& c, std::string_view cell, double x, double in_unit_si,
                                    double si) const {
  if (!c.unit.empty() && (!within_domain(c.dimension, in_unit_si) || (c.vacuum && x < 0))) {
    return domain_problem(c, cell);
  }
  return given_value_problem(c.input, si, c.unit);
}

// The message of a cell that is not a number (parse_cell_number's `problem`).
void RowRater::refuse_cell(const InputColumn& c, std::string_view cell, std::string_view problem, std::size_t line) {
  if (problem == "the cell is empty") {
    error_ = fmt::format("line {}, column \"{}\": the cell is empty", line, c.header);
  } else if (problem == "out of range") {
    error_ = fmt::format("line {}, column \"{}\": the number \"{}\" is out of range", line, c.header, cell);
  } else if (problem == "not finite") {
    error_ = fmt::format("line {}, column \"{}\": \"{}\" is not a finite number", line, c.header, cell);
  } else {
    error_ = fmt::format("line {}, column \"{}\": \"{}\" is not a number", line, c.header, cell);
  }
}

// Why a converted cell is out of its dimension's domain, in the units layer's words.
std::string RowRater::domain_problem(const InputColumn& c, std::string_view cell) const {
  try {
    units::ParseContext context = shared_.templ.input.context();
    context.barometric_pressure = barometer_;
    units::ParseNotes notes;
    units::parse(fmt::format("{} {}", cell, c.unit), c.dimension, context, notes);
  } catch (const Error& e) {
    return e.what();
  }
  return fmt::format("\"{} {}\" is out of range", cell, c.unit);
}

void RowRater::write_csv_row(OutputBuffer& out, bool rated) {
  const std::size_t n = plan_.header.size();
  if (!record_.has_quotes && record_.fields.size() == n) {
    out.append(record_.text);  // the fields as written, commas and all
  } else {
    for (std::size_t i = 0; i < n; ++i) {
      if (i) out.push_back(',');
      if (i < record_.fields.size()) out.append_csv_field(record_.fields[i]);
    }
  }
  if (n) out.push_back(',');
  out.append(rated ? "ok," : "error,");
  out.append_csv_field(error_);
  if (plan_.solved_for_column) {
    out.push_back(',');
    if (rated && !(rating_.solved_for == solved_for_ && !solved_for_text_.empty())) {
      solved_for_ = rating_.solved_for;  // the rows of a log mostly solve for the same quantities
      solved_for_text_ = solved_for_.joined(" ");
    }
    if (rated) out.append(solved_for_text_);
  }
  char* p = out.room(plan_.outputs.size() * (kMaxNumberChars + 1));
  for (const OutputColumn& o : plan_.outputs) {
    *p++ = ',';
    if (!rated) continue;
    const std::optional<double> v = o.key->value(rating_);
    if (v && std::isfinite(*v)) p = format_significant(p, (*v - o.offset) / o.scale, kSignificantDigits);
  }
  out.commit(p);
  if (plan_.uncertainty) write_uncertainty_cells(out);
  if (plan_.guarantee) {
    out.append(plan_.guarantee->cells(rated && guarantee_ ? &*guarantee_ : nullptr, shared_.options.units,
                                      rated ? guarantee_error_ : std::string()));
  }
  out.push_back(',');
  append_warnings(out, rated);
  out.append("\r\n");
}

// U of each result column in its unit (a difference); empty cells for a row without.
void RowRater::write_uncertainty_cells(OutputBuffer& out) {
  char* p = out.room(plan_.outputs.size() * (kMaxNumberChars + 1));
  for (const OutputColumn& o : plan_.outputs) {
    *p++ = ',';
    if (!rated_uncertainty_) continue;
    const auto k = static_cast<std::size_t>(o.key - result_keys().data());
    const std::optional<double> u = uncertainty_.expanded[k];
    if (u) p = format_significant(p, *u / std::fabs(o.scale), kSignificantDigits);
  }
  out.commit(p);
}

void RowRater::append_warnings(OutputBuffer& out, bool rated) {
  if (cell_error_) return;
  const bool uncertainty_warnings = rated_uncertainty_ && !uncertainty_.warnings.empty();
  if (!rated || (rating_.warnings.empty() && !uncertainty_warnings)) {
    out.append_csv_field(shared_.warnings_joined);
    return;
  }
  std::string joined = shared_.warnings_joined;
  for (const auto& w : rating_.warnings) joined += (joined.empty() ? "" : "; ") + w;
  if (uncertainty_warnings) {
    for (const auto& w : uncertainty_.warnings) joined += (joined.empty() ? "" : "; ") + w;
  }
  out.append_csv_field(joined);
}

void RowRater::write_jsonl(OutputBuffer& out, bool rated, std::size_t line) {
  CaseOutcome o;
  o.id = id_.empty() ? fmt::format("line {}", line) : std::string(id_);
  o.error = error_;
  if (!cell_error_) o.warnings = shared_.warnings;
  if (rated) {
    CaseInput input = shared_.templ.input;
    std::erase_if(input.given, [&](const GivenValue& g) { return overridden(plan_, g.input); });
    for (const InputColumn& c : plan_.inputs) {
      const std::string cell(trim(record_.fields[c.index]));
      input.given.push_back({c.input, 0, c.gauge, c.unit.empty() ? cell : cell + " " + c.unit, c.unit, {}});
    }
    if (!shared_.standard_reference.empty()) input.standard_reference = shared_.standard_reference;
    std::stable_sort(input.given.begin(), input.given.end(),
                     [](const GivenValue& a, const GivenValue& b) { return a.input < b.input; });
    o.input = std::move(input);
    o.warnings.insert(o.warnings.end(), rating_.warnings.begin(), rating_.warnings.end());
    o.rating = rating_;
    if (rated_uncertainty_) {
      o.uncertainty = uncertainty_;
      o.warnings.insert(o.warnings.end(), uncertainty_.warnings.begin(), uncertainty_.warnings.end());
    }
    if (shared_.templ.guarantee) {
      o.guarantee = guarantee_;
      o.guarantee_error = guarantee_error_;
    }
  }
  // A CSV cell may hold bytes that are not UTF-8 (an id from a logger): written as U+FFFD,
  // where dump() would otherwise throw out of the batch.
  out.append(result_json(o).dump(-1, ' ', false, nlohmann::ordered_json::error_handler_t::replace));
  out.push_back('\n');
}

}  // namespace shaftwork::io

// Results as CSV for spreadsheets: one row per case, a column per result key in the
// unit system's unit (RFC 4180: CRLF line ends, quoted fields where needed).
#include <algorithm>
#include <cmath>

#include <fmt/format.h>
#include <fmt/ranges.h>

#include "shaftwork/io/number_format.hpp"
#include "shaftwork/io/result_keys.hpp"
#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::io {

std::string csv_field(std::string_view text) {
  if (text.find_first_of(",\"\r\n") == std::string_view::npos) return std::string(text);
  std::string quoted = "\"";
  for (char ch : text) {
    if (ch == '"') quoted += '"';
    quoted += ch;
  }
  return quoted + '"';
}

namespace {

constexpr int kDigits = 10;

// "outlet.temperature [degC]", or the key alone for a fraction; `prefix` "uncertainty.".
std::string column_header(std::string_view prefix, const ResultKey& k, UnitSystem system) {
  const std::string_view unit = column_unit(k.dimension, system);
  return csv_field(unit.empty() ? fmt::format("{}{}", prefix, k.key) : fmt::format("{}{} [{}]", prefix, k.key, unit));
}

// The cells of the uncertainty columns: U of each result key in its column's unit.
void append_uncertainty_cells(std::string& out, const CaseOutcome& o, UnitSystem system) {
  for (std::size_t k = 0; k < result_keys().size(); ++k) {
    out += ',';
    if (const std::optional<double> u = uncertainty_in_column_unit(o, k, system)) append_significant(out, *u, kDigits);
  }
}

}  // namespace

std::optional<double> uncertainty_in_column_unit(const CaseOutcome& o, std::size_t key, UnitSystem system) {
  if (!o.ok() || !o.uncertainty || key >= o.uncertainty->expanded.size()) return std::nullopt;
  const std::optional<double> u = o.uncertainty->expanded[key];
  if (!u) return std::nullopt;
  return difference_from_si(*u, column_unit(result_keys()[key].dimension, system));
}

std::string csv_header(const TableOptions& options) {
  const UnitSystem system = options.system;
  std::string out = "id,file,status,error,machine,fluid,model,solved_for";
  for (const ResultKey& k : result_keys()) out += ',' + column_header("", k, system);
  if (options.uncertainty_columns) {
    for (const ResultKey& k : result_keys()) out += ',' + column_header("uncertainty.", k, system);
  }
  if (options.guarantee_columns) out += options.guarantee_columns->header(system);
  return out + ",warnings\r\n";
}

std::string csv_row(const CaseOutcome& o, const TableOptions& options) {
  const UnitSystem system = options.system;
  std::string out = fmt::format("{},{},{},{},", csv_field(o.id), csv_field(o.origin), o.ok() ? "ok" : "error",
                                csv_field(o.error));
  if (o.ok()) {
    const machines::Rating& r = *o.rating;
    out += fmt::format("{},{},{},{}", csv_field(o.input ? o.input->machine_written : machines::machine_name(r.machine)),
                       csv_field(o.input ? o.input->fluid_label : ""), r.model, r.solved_for.joined(" "));
    for (const ResultKey& k : result_keys()) {
      out += ',';
      const std::optional<double> v = k.value(r);
      if (!v || !std::isfinite(*v)) continue;
      const std::string_view unit = column_unit(k.dimension, system);
      append_significant(out, unit.empty() ? *v : units::from_si(*v, unit, k.dimension), kDigits);
    }
  } else {
    out += ",,,";
    out.append(result_keys().size(), ',');
  }
  if (options.uncertainty_columns) append_uncertainty_cells(out, o, system);
  if (options.guarantee_columns) {
    out += options.guarantee_columns->cells(o.guarantee ? &*o.guarantee : nullptr, system, o.guarantee_error);
  }
  return out + ',' + csv_field(fmt::format("{}", fmt::join(o.warnings, "; "))) + "\r\n";
}

}  // namespace shaftwork::io

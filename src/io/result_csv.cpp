// Results as CSV for spreadsheets: one row per case, a column per result key in the
// unit system's unit (RFC 4180: CRLF line ends, quoted fields where needed).
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

void write_csv(std::ostream& out, const std::vector<CaseOutcome>& outcomes, UnitSystem system) {
  out << "id,file,status,error,machine,fluid,model,solved_for";
  for (const ResultKey& k : result_keys()) {
    const std::string_view unit = column_unit(k.dimension, system);
    out << ',' << csv_field(unit.empty() ? std::string(k.key) : fmt::format("{} [{}]", k.key, unit));
  }
  // Guarantee columns when some case has a guarantee of its own.
  std::vector<const machines::GuaranteeResult*> judged;
  bool guarantees = false;
  for (const auto& o : outcomes) {
    if (o.guarantee) judged.push_back(&*o.guarantee);
    guarantees = guarantees || o.guarantee || !o.guarantee_error.empty();
  }
  const GuaranteeColumns columns = guarantee_columns(judged);
  if (guarantees) out << columns.header(system);
  out << ",warnings\r\n";
  constexpr int kDigits = 10;
  for (const auto& o : outcomes) {
    out << csv_field(o.id) << ',' << csv_field(o.origin) << ',' << (o.ok() ? "ok" : "error") << ','
        << csv_field(o.error) << ',';
    if (o.ok()) {
      const machines::Rating& r = *o.rating;
      out << csv_field(o.input ? o.input->machine_written : machines::machine_name(r.machine)) << ','
          << csv_field(o.input ? o.input->fluid_label : "") << ',' << r.model << ',' << r.solved_for.joined(" ");
      for (const ResultKey& k : result_keys()) {
        out << ',';
        const std::optional<double> v = k.value(r);
        if (!v || !std::isfinite(*v)) continue;
        const std::string_view unit = column_unit(k.dimension, system);
        std::string text;
        append_significant(text, unit.empty() ? *v : units::from_si(*v, unit, k.dimension), kDigits);
        out << text;
      }
    } else {
      out << ",,,";
      for (std::size_t i = 0; i < result_keys().size(); ++i) out << ',';
    }
    if (guarantees) out << columns.cells(o.guarantee ? &*o.guarantee : nullptr, system, o.guarantee_error);
    out << ',' << csv_field(fmt::format("{}", fmt::join(o.warnings, "; "))) << "\r\n";
  }
}

}  // namespace shaftwork::io

// Results as a table for a person: the seven quantities as given (in the user's words)
// or solved, then what the rating derived, in the units of the case.
#include <algorithm>
#include <cmath>
#include <optional>

#include <fmt/format.h>

#include "shaftwork/io/result_keys.hpp"
#include "shaftwork/io/result_writer.hpp"
#include "shaftwork/text.hpp"

namespace shaftwork::io {
namespace {

using machines::Input;
using machines::Quantity;
using machines::Rating;

constexpr int kLabelWidth = 31;
constexpr int kValueWidth = 20;
constexpr int kValueWidthWithUncertainty = 30;  // "4758.03 ± 52 m3/h"
constexpr std::size_t kContributorsShown = 3;

class CaseTable {
 public:
  CaseTable(std::ostream& out, const CaseOutcome& o, const TableOptions& options)
      : out_(out), o_(o), r_(*o.rating), units_(options.system, options.system_forced, in(), r_),
        value_width_(o.uncertainty ? kValueWidthWithUncertainty : kValueWidth) {}

  void write(bool show_origin) {
    write_header(show_origin);
    if (o_.uncertainty) out_ << "  ± U: expanded uncertainty, k = 2 (about 95 %)\n";
    for (Quantity q : machines::kAllQuantities) write_quantity(q);
    write_given_qualifiers();
    write_results();
    write_checks();
    for (const auto& w : o_.warnings) out_ << "  warning: " << escape_control(w) << '\n';
  }

 private:
  const CaseInput* in() const { return o_.input ? &*o_.input : nullptr; }

  void row(std::string_view label, const std::string& value, std::string_view note) {
    // A value wider than its column (a long written number) keeps one space before the note.
    const auto columns = static_cast<int>(std::count_if(value.begin(), value.end(), [](char c) {
      return (static_cast<unsigned char>(c) & 0xC0) != 0x80;  // code points, as fmt pads
    }));
    const int width = std::max(value_width_, columns + (note.empty() ? 0 : 1));
    std::string line = fmt::format("  {:<{}}{:<{}}{}", label, kLabelWidth, value, width, note);
    line.erase(line.find_last_not_of(' ') + 1);
    out_ << escape_control(line) << '\n';
  }

  void result_row(const ResultKey& k, std::string_view note) {
    const std::optional<double> v = k.value(r_);
    if (!v || (r_.machine == machines::MachineKind::pump && !k.pump_table)) return;
    printed_.push_back(&k);
    const std::optional<double> u = uncertainty_of(k);
    const bool shown = o_.uncertainty && !(u && *u == 0);  // "± 0" only says nothing was stated
    row(k.label, shown ? units_.text(*v, u, k.dimension, k.precision) : units_.text(*v, k.dimension, k.precision),
        note);
    if (k.section == Section::efficiency) write_contributors(k.key);
  }

  std::optional<double> uncertainty_of(const ResultKey& k) const {
    if (!o_.uncertainty) return std::nullopt;
    const auto index = static_cast<std::size_t>(&k - result_keys().data());
    return index < o_.uncertainty->expanded.size() ? o_.uncertainty->expanded[index] : std::nullopt;
  }

  // "    from outlet temperature 71 %, inlet temperature 18 %, outlet pressure 6 %": the
  // largest shares of the efficiency's U^2.
  void write_contributors(std::string_view key) {
    const std::vector<Contribution>* shares = o_.uncertainty ? o_.uncertainty->contributions_of(key) : nullptr;
    if (!shares || shares->empty()) return;
    std::string line = "    U² from ";
    for (std::size_t i = 0; i < shares->size() && i < kContributorsShown; ++i) {
      if ((*shares)[i].share_percent < 0.5) break;  // would read "0 %"
      line += fmt::format("{}{} {:.0f} %", i ? ", " : "", machines::spec((*shares)[i].input).label,
                          (*shares)[i].share_percent);
    }
    out_ << line << '\n';
  }

  // A given value as written, with its stated uncertainty as written.
  static std::string given_text(const GivenValue& g) {
    return g.uncertainty ? fmt::format("{} ± {}", g.written, g.uncertainty->written) : g.written;
  }

  void write_header(bool show_origin) {
    out_ << escape_control(o_.id) << '\n';
    const std::string machine = in() ? in()->machine_written : machines::machine_name(r_.machine);
    const std::string fluid = in() ? in()->fluid_label : r_.model;
    out_ << escape_control(fmt::format("  {} on {} ({})", machine, fluid, r_.model)) << '\n';
    if (show_origin && !o_.origin.empty()) out_ << escape_control(fmt::format("  from {}", o_.origin)) << '\n';
  }

  // The given forms of q as written, and its result rows: solved, or worked out from a
  // form given in other words ("mass flow ... from standard volume flow").
  void write_quantity(Quantity q) {
    const GivenValue* given_form = nullptr;
    for (const GivenValue& g : given()) {
      if (machines::spec(g.input).gives != q) continue;
      const bool standard = g.input == Input::standard_volume_flow && !in()->standard_reference.empty();
      row(machines::spec(g.input).label, given_text(g),
          standard ? fmt::format("given, at {}", in()->standard_reference) : std::string("given"));
      given_form = &g;
      // A redundant efficiency's result is the one from the states: shown beside it.
      if (!(q == Quantity::efficiency && r_.efficiency_check)) mark(machines::key_of(g.input));
    }
    for (const ResultKey& k : result_keys()) {
      if (k.reports != q || done(&k)) continue;
      if (r_.solved_for.contains(q)) {
        result_row(k, "solved");
      } else if (given_form && q == Quantity::efficiency) {
        result_row(k, r_.efficiency_check ? "from the states" : "");
      } else if (given_form) {
        result_row(k, fmt::format("from {}", machines::spec(given_form->input).label));
      }
    }
    if (q == Quantity::inlet_temperature) write_quality_row(machines::key_of(Input::inlet_quality));
    if (q == Quantity::outlet_temperature) write_quality_row(machines::key_of(Input::outlet_quality));
  }

  const std::vector<GivenValue>& given() const {
    static const std::vector<GivenValue> none;
    return in() ? in()->given : none;
  }

  void mark(std::string_view key) {
    if (const ResultKey* k = find_result_key(key)) printed_.push_back(k);
  }

  void write_quality_row(std::string_view key) {
    const ResultKey* k = find_result_key(key);
    if (k && !done(k)) result_row(*k, "");
  }

  void write_given_qualifiers() {
    for (const GivenValue& g : given()) {
      if (machines::spec(g.input).gives) continue;
      row(machines::spec(g.input).label, given_text(g), "given");
      mark(machines::key_of(g.input));
    }
  }

  void write_results() {
    out_ << "  results\n";
    for (const ResultKey& k : result_keys()) {
      if (k.section == Section::hidden || done(&k)) continue;
      result_row(k, "");
    }
  }

  void write_checks() {
    if (!r_.power_balance && !r_.efficiency_check) return;
    const auto check = [&](std::string_view label, const std::string& given, const std::string& computed,
                           const std::string& difference) {
      out_ << fmt::format("  {:<{}}{:<{}}{:<21}{}\n", label, kLabelWidth, given, kValueWidth, computed, difference);
    };
    check("redundant values", "given", "from the fluid side", "difference");
    if (const auto& pb = r_.power_balance) {
      const Precision p{Precision::Kind::significant, 5};
      check("shaft power", units_.text(pb->given_power, units::Dimension::power, p),
            units_.text(pb->shaft_power, units::Dimension::power, p),
            fmt::format("{:+.2f}{} %", pb->difference_percent,
                        plus_minus(uncertainty_of("power_balance.difference_percent"))));
    }
    if (const auto& ec = r_.efficiency_check) {
      // The given efficiency and the one from the states rest on different inputs.
      const std::optional<double> computed = uncertainty_of("efficiency_check.computed");
      const std::optional<double> given = uncertainty_of("efficiency_check.given");
      const std::string u =
          computed && given ? plus_minus(100 * std::hypot(*computed, *given)) : plus_minus(std::nullopt);
      check(machines::spec(ec->input).label, fmt::format("{:.4f}", ec->given), fmt::format("{:.4f}", ec->computed),
            fmt::format("{:+.2f}{} points", 100 * (ec->computed - ec->given), u));
    }
  }

  std::optional<double> uncertainty_of(std::string_view key) const {
    const ResultKey* k = find_result_key(key);
    return k ? uncertainty_of(*k) : std::nullopt;
  }

  // " ± 1.6" (two significant digits), " ± n/a", or "" for a case without uncertainties.
  std::string plus_minus(std::optional<double> u) const {
    if (!o_.uncertainty) return {};
    return u ? plus_minus(*u) : " ± n/a";
  }
  std::string plus_minus(double u) const {
    if (!o_.uncertainty) return {};
    return " ± " + format_number(u, Precision{Precision::Kind::significant, 2});
  }

  bool done(const ResultKey* k) const { return std::find(printed_.begin(), printed_.end(), k) != printed_.end(); }

  std::ostream& out_;
  const CaseOutcome& o_;
  const Rating& r_;
  DisplayUnits units_;
  int value_width_;
  std::vector<const ResultKey*> printed_;
};

}  // namespace

void write_case_table(std::ostream& out, const CaseOutcome& o, const TableOptions& options) {
  if (o.ok()) {
    CaseTable(out, o, options).write(options.show_origin);
    return;
  }
  out << escape_control(o.id) << '\n';
  if (options.show_origin && !o.origin.empty()) out << escape_control(fmt::format("  from {}", o.origin)) << '\n';
  out << "  could not be rated: " << escape_control(o.error) << '\n';
  for (const auto& w : o.warnings) out << "  warning: " << escape_control(w) << '\n';
}

}  // namespace shaftwork::io

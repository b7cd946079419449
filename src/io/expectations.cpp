#include "shaftwork/io/expectations.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/case_input.hpp"
#include "shaftwork/io/json_quantity.hpp"
#include "shaftwork/io/number_format.hpp"
#include "shaftwork/text.hpp"

namespace shaftwork::io {
namespace {

using nlohmann::json;
using units::Dimension;

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

// The symbols of a dimension's units, for messages: "K, degC, C, ...".
std::string unit_list(Dimension d) {
  std::string out;
  for (const units::UnitInfo* u : units::units_of(d)) {
    if (!out.empty()) out += ", ";
    out += u->symbol;
  }
  return out;
}

// "<number> <unit>" as a difference in SI: the unit's scale only, neither its offset
// (a temperature scale's zero) nor the barometer (a gauge unit's).
double difference_in(std::string_view text, std::string_view unit, Dimension d) {
  const units::UnitInfo* info = units::find_unit(unit);
  const auto of_dimension = units::units_of(d);
  if (info == nullptr) {
    refuse(fmt::format("\"{}\": unknown unit \"{}\"; give a percentage or a {} unit ({})", text, unit,
                       units::dimension_name(d), unit_list(d)));
  }
  if (std::find(of_dimension.begin(), of_dimension.end(), info) == of_dimension.end()) {
    refuse(fmt::format("\"{}\": a {} unit where a {} belongs", text, units::dimension_name(info->dimension),
                       units::dimension_name(d)));
  }
  const std::string_view number = trim(trim(text).substr(0, trim(text).size() - unit.size()));
  units::ParseNotes notes;
  return units::parse(number, Dimension::fraction, {}, notes) * std::abs(info->scale);
}

Tolerance read_tolerance(const json& t, const ResultKey& k) {
  Tolerance tol;
  tol.kind = Tolerance::Kind::absolute;
  if (t.is_number()) {
    tol.amount = t.get<double>();
    const std::string_view si = si_symbol(k.dimension);
    tol.written = si.empty() ? t.dump() : t.dump() + " " + std::string(si);
  } else if (t.is_string()) {
    const std::string& text = t.get_ref<const std::string&>();
    tol.written = std::string(trim(text));
    const std::string_view unit = unit_written(text);
    units::ParseNotes notes;
    if (unit == "%") {
      tol.kind = Tolerance::Kind::relative;
      tol.amount = units::parse(text, Dimension::fraction, {}, notes);
    } else if (unit.empty()) {
      if (k.dimension != Dimension::fraction) {
        refuse(fmt::format("\"{}\": give a unit of {} ({}) or a percentage", text,
                           units::dimension_name(k.dimension), unit_list(k.dimension)));
      }
      tol.amount = units::parse(text, Dimension::fraction, {}, notes);
    } else {
      tol.amount = difference_in(text, unit, k.dimension);
    }
  } else {
    refuse(fmt::format("expected a string such as \"0.1 %\" or \"0.05 K\", got {}", t.type_name()));
  }
  if (tol.amount < 0) refuse(fmt::format("\"{}\": a tolerance cannot be negative", tol.written));
  return tol;
}

Expectation read_expectation(const std::string& key, const json& entry, const units::ParseContext& context) {
  const ResultKey* k = find_result_key(key);
  if (k == nullptr) refuse(fmt::format("{}: {}", kExpectKey, no_result_key(key)));
  const std::string path = fmt::format("{}.{}", kExpectKey, key);
  Expectation e;
  e.key = k;
  const json* value = &entry;
  if (entry.is_object()) {
    value = nullptr;
    for (const auto& item : entry.items()) {
      if (item.key() == "value") {
        value = &item.value();
      } else if (item.key() == "tolerance") {
        try {
          e.tolerance = read_tolerance(item.value(), *k);
        } catch (const Error& err) {
          throw err.with_context(path + ": tolerance");
        }
      } else {
        refuse(fmt::format("{}: unknown key \"{}\"; give \"value\" and, if you like, \"tolerance\"", path,
                           item.key()));
      }
    }
    if (value == nullptr) refuse(fmt::format("{}: \"value\" is missing", path));
  }
  // A key already in percent (power_balance.difference_percent) takes the plain number.
  if (key.ends_with("_percent") && value->is_string() && unit_written(value->get<std::string>()) == "%") {
    refuse(fmt::format("{}: \"{}\": this result is in percent already; write the plain number", path,
                       value->get<std::string>()));
  }
  units::ParseNotes notes;
  e.value = rounded_for_output(read_quantity(*value, k->dimension, path, context, notes).si);  // as results are
  return e;
}

}  // namespace

bool Tolerance::allows(double now, double expected) const {
  if (now == expected) return true;
  const double allowed = kind == Kind::relative ? amount * std::abs(expected) : amount;
  return std::abs(now - expected) <= allowed;
}

std::string Tolerance::describe() const {
  return written.empty() ? fmt::format("{:g} relative", amount) : written;
}

Tolerance relative_tolerance(double fraction) { return {Tolerance::Kind::relative, fraction, ""}; }

std::vector<Expectation> read_expectations(const json& case_object, double barometer) {
  std::vector<Expectation> out;
  const std::string block(kExpectKey);
  if (!case_object.is_object() || !case_object.contains(block)) return out;
  const json& expect = case_object[block];
  if (!expect.is_object()) {
    refuse(fmt::format("{}: expected an object of result keys and values, got {}", block, expect.type_name()));
  }
  units::ParseContext context;
  context.barometric_pressure = barometer;
  for (const auto& item : expect.items()) out.push_back(read_expectation(item.key(), item.value(), context));
  return out;
}

}  // namespace shaftwork::io

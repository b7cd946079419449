#include "shaftwork/io/uncertainty_input.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <span>

#include <fmt/format.h>

#include "cell_number.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/json_quantity.hpp"
#include "shaftwork/text.hpp"

namespace shaftwork::io {
namespace {

using nlohmann::json;
using machines::Input;
using units::Dimension;

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

constexpr std::string_view kValueField = "value";

// The dimensions a value of `input` may be written in: a pump head also as a height.
std::span<const Dimension> allowed_dimensions(Input input) {
  static constexpr std::array<Dimension, 2> kHead = {Dimension::specific_energy, Dimension::length};
  if (input == Input::head) return kHead;
  return {&machines::spec(input).dimension, 1};
}

// A difference of `x` in `unit` in SI, or the units layer's refusal of the unit.
double difference_in_si(double x, std::string_view unit, Input input, const units::ParseContext& context) {
  const std::span<const Dimension> allowed = allowed_dimensions(input);
  const units::UnitInfo* info = units::find_unit(unit);
  if (!info || std::find(allowed.begin(), allowed.end(), info->dimension) == allowed.end()) {
    units::ParseNotes notes;
    // Throws the units layer's message ('"0.3 kPa": a pressure unit where a temperature belongs').
    if (allowed.size() > 1) {
      units::to_si_any(x, unit, allowed, machines::key_of(input), context, notes);
    } else {
      units::to_si(x, unit, allowed.front(), context, notes);
    }
    refuse(fmt::format("\"{:g} {}\": not a unit of a {}", x, unit, units::dimension_name(allowed.front())));
  }
  const double per_unit = std::fabs(units::effective_scale(*info, context));
  return x * per_unit * (info->dimension == Dimension::length ? units::kStandardGravity : 1.0);
}

StatedUncertainty read_text(const std::string& raw, Input input, const units::ParseContext& context) {
  const std::string_view text = trim(raw);
  std::size_t end = 0;
  while (end < text.size() && !is_space(text[end]) && text[end] != '%') ++end;
  const std::string_view unit = trim(text.substr(end));
  double x = 0;
  if (!parse_cell_number(text.substr(0, end), x).empty()) {
    refuse(fmt::format("\"{}\" is not an uncertainty: write \"<number> %\" (of the reading) or \"<number> <unit>\"",
                       raw));
  }
  if (x < 0) refuse(fmt::format("\"{}\": an uncertainty cannot be negative", raw));
  StatedUncertainty s{input, unit == "%", 0.0, std::string(text)};
  const Dimension d = machines::spec(input).dimension;
  if (s.relative) {
    s.value = x / 100;
  } else if (unit.empty()) {
    if (d != Dimension::fraction) {
      refuse(fmt::format("\"{}\": a {} uncertainty needs its unit, as in \"{} {}\", or \"%\" of the reading", raw,
                         units::dimension_name(d), raw, si_symbol(d)));
    }
    s.value = x;
  } else {
    s.value = difference_in_si(x, unit, input, context);
  }
  return s;
}

}  // namespace

MeasuredJson split_measured(const json& value, const std::string& path) {
  if (!value.is_object()) return {&value, nullptr};
  for (const auto& item : value.items()) {
    if (item.key() != kValueField && item.key() != kUncertaintyKey) {
      refuse(fmt::format("{}: unknown key \"{}\" in a measured value; give \"value\" and \"uncertainty\"", path,
                         item.key()));
    }
  }
  const std::string field(kValueField);
  if (!value.contains(field) || value[field].is_null()) {
    refuse(fmt::format("{}: a measured value needs \"value\", as in {{ \"value\": \"2.10 barg\", \"uncertainty\": "
                       "\"0.25 %\" }}",
                       path));
  }
  const std::string u(kUncertaintyKey);
  const json* uncertainty = value.contains(u) && !value[u].is_null() ? &value[u] : nullptr;
  return {&value[field], uncertainty};
}

StatedUncertainty read_stated_uncertainty(const json& u, Input input, const std::string& path,
                                          const units::ParseContext& context) {
  try {
    if (u.is_string()) return read_text(u.get<std::string>(), input, context);
    if (!u.is_number()) {
      refuse(fmt::format("expected \"<number> %\", \"<number> <unit>\" or a number, got {}", u.type_name()));
    }
    const double x = u.get<double>();
    if (!std::isfinite(x)) refuse("the number is not finite");
    if (x < 0) refuse(fmt::format("{}: an uncertainty cannot be negative", u.dump()));
    const Dimension d = machines::spec(input).dimension;
    if (d == Dimension::standard_volume_flow) {
      refuse("a standard volume flow's uncertainty needs its unit (Nm3/h, Sm3/h, scfm, MMSCFD) or \"%\"");
    }
    const std::string_view si = si_symbol(d);
    return {input, false, x, si.empty() ? u.dump() : u.dump() + " " + std::string(si)};
  } catch (const Error& e) {
    throw e.with_context(path);
  }
}

std::vector<StatedUncertainty> read_uncertainty_by_key(const json& object, const std::string& path,
                                                       const units::ParseContext& context) {
  if (!object.is_object()) {
    refuse(fmt::format("{}: expected an object of dotted keys, such as {{ \"outlet.temperature\": \"0.3 K\" }}, got {}",
                       path, object.type_name()));
  }
  std::vector<StatedUncertainty> out;
  for (const auto& item : object.items()) {
    const machines::InputSpec* s = find_case_input(item.key());
    const std::string where = fmt::format("{}.{}", path, item.key());
    if (!s) {
      std::string keys;
      for (const machines::InputSpec& k : machines::kInputs) keys += (keys.empty() ? "" : ", ") + std::string(k.key);
      refuse(fmt::format("{}: \"{}\" is no case value; the keys are {}", where, item.key(), keys));
    }
    if (item.value().is_null()) continue;
    out.push_back(read_stated_uncertainty(item.value(), s->input, where, context));
  }
  return out;
}

void apply_uncertainty_by_key(CaseInput& c, const std::vector<StatedUncertainty>& statements) {
  for (GivenValue& g : c.given) {
    if (g.uncertainty) continue;
    for (const StatedUncertainty& s : statements) {
      if (s.input == g.input) g.uncertainty = s;
    }
  }
}

std::string unused_uncertainty_problem(const CaseInput& c) {
  for (const StatedUncertainty& s : c.uncertainty_by_key) {
    if (c.find(s.input)) continue;
    const std::string_view key = machines::key_of(s.input);
    return fmt::format("{}.{}: the case does not give {}, so there is no reading to state an uncertainty for; a "
                       "solved value's uncertainty follows from those of the given values",
                       kUncertaintyKey, key, key);
  }
  return {};
}

double reading_magnitude(const GivenValue& g, double barometer) {
  const units::UnitInfo* unit = g.unit.empty() ? nullptr : units::find_unit(g.unit);
  if (!unit) return std::fabs(g.si);
  const double factor = unit->dimension == Dimension::length ? units::kStandardGravity : 1.0;
  return std::fabs(g.si / factor - unit->offset - (unit->gauge ? barometer : 0.0)) * factor;
}

bool has_uncertainty(const CaseInput& c) {
  return std::any_of(c.given.begin(), c.given.end(), [](const GivenValue& g) { return g.uncertainty.has_value(); });
}

namespace {

bool mentions_uncertainty(const json& object, int depth) {
  if (!object.is_object() || depth > 4) return false;
  if (object.contains(std::string(kUncertaintyKey))) return true;
  return std::any_of(object.begin(), object.end(), [&](const json& v) { return mentions_uncertainty(v, depth + 1); });
}

}  // namespace

bool states_uncertainty(const json& document) {
  if (!document.is_object()) return false;
  if (!document.contains("cases")) return mentions_uncertainty(document, 0);
  const json& cases = document["cases"];
  return cases.is_array() &&
         std::any_of(cases.begin(), cases.end(), [](const json& c) { return mentions_uncertainty(c, 0); });
}

}  // namespace shaftwork::io

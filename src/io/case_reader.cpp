#include "shaftwork/io/case_reader.hpp"

#include <set>
#include <string_view>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/json_quantity.hpp"

namespace shaftwork::io {
namespace {

using nlohmann::json;
using machines::Input;
using machines::InputSpec;
using units::Dimension;

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

// Keys of a case that are not values of kInputs.
constexpr std::string_view kOtherKeys[] = {kIdKey, kMachineKey, kFluidKey, kNoteKey, kGuaranteeKey};

// The first segment of a dotted key ("inlet" of "inlet.pressure"), and the rest.
std::string_view head_of(std::string_view key) { return key.substr(0, key.find('.')); }
std::string_view tail_of(std::string_view key) {
  const auto dot = key.find('.');
  return dot == std::string_view::npos ? std::string_view() : key.substr(dot + 1);
}

// Warns of every key that no row of kInputs (and no other case key) names: a misspelt
// key must never be silently ignored. Objects are the dotted keys' first segments.
void warn_unknown_keys(const json& c, std::vector<std::string>& warnings) {
  for (const auto& item : c.items()) {
    const std::string& key = item.key();
    bool known = std::find(std::begin(kOtherKeys), std::end(kOtherKeys), key) != std::end(kOtherKeys);
    bool is_section = false;
    for (const InputSpec& s : machines::kInputs) {
      known = known || head_of(s.key) == key;
      is_section = is_section || (head_of(s.key) == key && !tail_of(s.key).empty());
    }
    if (!known) {
      warnings.push_back(fmt::format("unknown key \"{}\" ignored", key));
      continue;
    }
    if (!is_section || !item.value().is_object()) continue;
    for (const auto& sub : item.value().items()) {
      const std::string dotted = key + "." + sub.key();
      if (!machines::find_input(dotted)) warnings.push_back(fmt::format("unknown key \"{}\" ignored", dotted));
    }
  }
}

machines::MachineKind read_machine(const json& c, std::string& written) {
  const std::string key(kMachineKey);
  if (!c.contains(key)) refuse("machine: missing; give \"compressor\", \"turbine\" or \"pump\"");
  const json& m = c[key];
  written = m.is_string() ? m.get<std::string>() : m.dump();
  if (m == "compressor" || m == "fan") return machines::MachineKind::compressor;
  if (m == "turbine" || m == "expander") return machines::MachineKind::turbine;
  if (m == "pump") return machines::MachineKind::pump;
  refuse(fmt::format("machine: unknown machine {}; give \"compressor\" (or \"fan\"), \"turbine\" (or "
                     "\"expander\") or \"pump\"",
                     m.dump()));
}

// The JSON value at a dotted key, or nullptr. An object on the way that is not an object
// is an error; "efficiency" as a bare value stands for "efficiency.isentropic".
const json* value_at(const json& c, const InputSpec& s) {
  const std::string head(head_of(s.key));
  if (!c.contains(head) || c[head].is_null()) return nullptr;
  const json& first = c[head];
  const std::string_view tail = tail_of(s.key);
  if (tail.empty()) return &first;
  if (!first.is_object()) {
    if (s.input == Input::efficiency_isentropic) return &first;  // "efficiency": 0.82
    if (s.input == Input::efficiency_polytropic) return nullptr;
    refuse(fmt::format("{}: expected an object, got {}", head, first.type_name()));
  }
  const std::string rest(tail);
  if (!first.contains(rest) || first[rest].is_null()) return nullptr;
  return &first[rest];
}

// The dimension a value is read in: a pump head may be a height ("85 m") or an energy
// per mass ("0.83 kJ/kg"), told by its unit.
Dimension reading_dimension(const InputSpec& s, const json& value) {
  if (s.input != Input::head || !value.is_string()) return s.dimension;
  const units::UnitInfo* unit = units::find_unit(unit_written(value.get<std::string>()));
  return unit && unit->dimension == Dimension::length ? Dimension::length : Dimension::specific_energy;
}

GivenValue read_given(const InputSpec& s, const json& value, const std::string& path,
                      const units::ParseContext& context, units::ParseNotes& notes) {
  const Dimension d = reading_dimension(s, value);
  const ReadQuantity q = read_quantity(value, d, path, context, notes);
  GivenValue g;
  g.input = s.input;
  // A pump head as a height ("85 m") is held as energy per mass; an impeller's length is a length.
  g.si = s.input == Input::head && d == Dimension::length ? q.si * units::kStandardGravity : q.si;
  g.unit = q.unit;
  const units::UnitInfo* unit = q.unit.empty() ? nullptr : units::find_unit(q.unit);
  g.on_barometer = unit && unit->gauge;
  // A plain number is SI: echoed with its unit ("101325 Pa").
  const std::string_view si = si_symbol(d);
  g.written = value.is_string() ? value.get<std::string>() : si.empty() ? value.dump() : value.dump() + " " + std::string(si);
  const std::string problem = given_value_problem(s.input, g.si, g.unit);
  if (!problem.empty()) refuse(fmt::format("{}: {}", path, problem));
  return g;
}

void read_values(const json& c, CaseInput& out) {
  units::ParseContext context;
  units::ParseNotes notes;
  const InputSpec& barometer = machines::spec(Input::barometric_pressure);
  if (const json* b = value_at(c, barometer)) {
    GivenValue g = read_given(barometer, *b, std::string(barometer.key), context, notes);
    context.barometric_pressure = g.si;
    out.given.push_back(std::move(g));
  }
  for (const InputSpec& s : machines::kInputs) {
    if (s.input == Input::barometric_pressure) continue;
    const json* v = value_at(c, s);
    if (!v) continue;
    // "efficiency": 0.82 is named as written in messages.
    const bool shorthand = s.input == Input::efficiency_isentropic && !c[std::string(head_of(s.key))].is_object();
    out.given.push_back(read_given(s, *v, std::string(shorthand ? head_of(s.key) : s.key), context, notes));
  }
  // The barometer was read first; it belongs at its place in the table's order.
  std::stable_sort(out.given.begin(), out.given.end(),
                   [](const GivenValue& a, const GivenValue& b) { return a.input < b.input; });
  if (notes.used_default_barometer) out.warnings.emplace_back(kDefaultBarometerWarning);
}

}  // namespace

std::vector<const json*> case_objects(const json& document, const std::string& origin) {
  std::vector<const json*> out;
  if (!document.is_object()) {
    refuse(fmt::format("{}: not a case file: expected a JSON object, got {}", origin, document.type_name()));
  }
  if (document.contains("cases")) {
    const json& cases = document["cases"];
    if (!cases.is_array()) refuse(fmt::format("{}: \"cases\" must be an array", origin));
    if (cases.empty()) refuse(fmt::format("{}: \"cases\" is empty", origin));
    for (const json& c : cases) out.push_back(&c);
    return out;
  }
  if (!document.contains(std::string(kMachineKey))) {
    refuse(fmt::format("{}: not a case file: expected \"cases\" or a case with \"machine\"", origin));
  }
  out.push_back(&document);
  return out;
}

std::string case_label(const json& c, size_t index) {
  const std::string id(kIdKey);
  if (c.is_object() && c.contains(id)) {
    if (c[id].is_string()) return c[id].get<std::string>();
    if (c[id].is_number()) return c[id].dump();
  }
  return fmt::format("case {}", index + 1);
}

const InputSpec* find_case_input(std::string_view key) {
  if (key == machines::quantity_key(machines::Quantity::efficiency)) return &machines::spec(Input::efficiency_isentropic);
  return machines::find_input(key);
}

std::string given_value_problem(Input input, double si, std::string_view unit) {
  std::string problem = machines::value_problem(input, si);
  if (!problem.empty()) return problem;
  const bool efficiency = machines::spec(input).dimension == Dimension::fraction && input != Input::inlet_quality &&
                          input != Input::outlet_quality;
  if (efficiency && unit == "%" && si < 0.01) {
    return fmt::format("{:g} % is implausible for an efficiency: write {:g} % (or the fraction {:g} without a unit)",
                       100 * si, 1e4 * si, 100 * si);
  }
  if (input == Input::barometric_pressure) {
    const units::UnitInfo* u = units::find_unit(unit);
    if (u && u->gauge) {
      return fmt::format("the barometer is an absolute pressure: give it in kPa, mbar, bar or inHg, not {}", unit);
    }
  }
  return {};
}

CaseInput read_case(const json& c, size_t index, FluidFactory& fluids, const std::string& origin) {
  if (!c.is_object()) refuse(fmt::format("expected a case object, got {}", c.type_name()));
  const std::string id(kIdKey);
  if (c.contains(id) && !c[id].is_string() && !c[id].is_number()) {
    refuse(fmt::format("id: must be a string or a number, got {}", c[id].type_name()));
  }
  CaseInput out;
  out.id = case_label(c, index);
  out.origin = origin;
  warn_unknown_keys(c, out.warnings);
  out.machine = read_machine(c, out.machine_written);
  const std::string fluid(kFluidKey);
  if (!c.contains(fluid)) refuse("fluid: missing; give a fluid name (shaftwork fluids lists them) or object");
  out.fluid = fluids.make(c[fluid], fluid, out.warnings);
  out.fluid_label = fluids.label(c[fluid], *out.fluid);
  read_values(c, out);
  if (const std::string problem = machines::input_problem(to_rating_input(out)); !problem.empty()) refuse(problem);
  return out;
}

}  // namespace shaftwork::io

#include "shaftwork/io/case_reader.hpp"

#include <set>
#include <string_view>

#include <fmt/format.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/json_quantity.hpp"
#include "shaftwork/io/uncertainty_input.hpp"

namespace shaftwork::io {
namespace {

using nlohmann::json;
using machines::Input;
using machines::InputSpec;
using units::Dimension;

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

// Keys of a case that are not values of kInputs.
constexpr std::string_view kOtherKeys[] = {kIdKey,          kMachineKey, kFluidKey, kNoteKey, kUncertaintyKey,
                                           kExpectKey,      kGuaranteeKey};

// The first segment of a dotted key ("inlet" of "inlet.pressure").
std::string_view head_of(std::string_view key) { return key.substr(0, key.find('.')); }

// True when some case key lies below `prefix` ("site" for "site.barometric_pressure").
bool is_section(const std::string& prefix) {
  return std::any_of(machines::kInputs.begin(), machines::kInputs.end(), [&](const InputSpec& s) {
    return s.key.size() > prefix.size() && s.key.substr(0, prefix.size()) == prefix && s.key[prefix.size()] == '.';
  });
}

// {"value": ..., "uncertainty": ...}: one value ("efficiency" as a bare value), not a section.
bool is_measured(const json& v) { return v.is_object() && v.contains("value"); }

// Warns of every key of `object` (at dotted path `path`, "" at the top) that no row of
// kInputs names, nor a section above one, nor (at the top) another case key: a misspelt
// key must never be silently ignored.
void warn_unknown_keys(const json& object, const std::string& path, std::vector<std::string>& warnings) {
  for (const auto& item : object.items()) {
    const std::string dotted = path.empty() ? item.key() : path + "." + item.key();
    const bool other = path.empty() && std::find(std::begin(kOtherKeys), std::end(kOtherKeys), dotted) !=
                                           std::end(kOtherKeys);
    if (other || machines::find_input(dotted)) continue;
    if (!is_section(dotted)) {
      warnings.push_back(fmt::format("unknown key \"{}\" ignored", dotted));
    } else if (item.value().is_object() && !is_measured(item.value())) {
      warn_unknown_keys(item.value(), dotted, warnings);
    }
  }
}

machines::MachineKind read_machine(const json& c, std::string& written) {
  const std::string key(kMachineKey);
  if (!c.contains(key)) refuse("machine: missing; give \"compressor\", \"turbine\" or \"pump\"");
  const json& m = c[key];
  written = m.is_string() ? m.get<std::string>() : m.dump();
  if (m == "compressor" || m == "fan" || m == "blower") return machines::MachineKind::compressor;
  if (m == "turbine" || m == "expander") return machines::MachineKind::turbine;
  if (m == "pump") return machines::MachineKind::pump;
  refuse(fmt::format("machine: unknown machine {}; give \"compressor\" (or \"fan\", \"blower\"), \"turbine\" (or "
                     "\"expander\") or \"pump\"",
                     m.dump()));
}

// The JSON value at a dotted key, or nullptr. An object on the way that is not an object
// is an error; "efficiency" as a bare value stands for "efficiency.isentropic".
const json* value_at(const json& c, const InputSpec& s) {
  const json* at = &c;
  std::string_view rest = s.key;
  std::string walked;
  for (auto dot = rest.find('.'); dot != std::string_view::npos; dot = rest.find('.')) {
    const std::string name(rest.substr(0, dot));
    walked += walked.empty() ? name : "." + name;
    if (!at->contains(name) || (*at)[name].is_null()) return nullptr;
    at = &(*at)[name];
    rest.remove_prefix(dot + 1);
    if (!at->is_object() || is_measured(*at)) {
      if (s.input == Input::efficiency_isentropic) return at;  // "efficiency": 0.82
      if (s.input == Input::efficiency_polytropic) return nullptr;
      if (at->is_object()) {
        refuse(fmt::format("{}: expected an object of keys such as \"{}\", got a measured value", walked, rest));
      }
      refuse(fmt::format("{}: expected an object, got {}", walked, at->type_name()));
    }
  }
  const std::string leaf(rest);
  if (!at->contains(leaf) || (*at)[leaf].is_null()) return nullptr;
  return &(*at)[leaf];
}

// A pump head is a height ("85 m") or an energy per mass ("0.83 kJ/kg"): its unit tells.
Dimension head_dimension(const json& value, const std::string& path, const units::ParseContext& context,
                         units::ParseNotes& notes) {
  static constexpr Dimension kForms[] = {Dimension::length, Dimension::specific_energy};
  try {
    return units::parse_any(value.get<std::string>(), kForms, path, context, notes).dimension;
  } catch (const Error& e) {
    throw e.with_context(path);
  }
}

GivenValue read_given(const InputSpec& s, const json& measured, const std::string& path,
                      const units::ParseContext& context, units::ParseNotes& notes) {
  const auto [value_ptr, uncertainty] = split_measured(measured, path);
  const json& value = *value_ptr;
  const Dimension d = s.input == Input::head && value.is_string() ? head_dimension(value, path, context, notes)
                                                                  : s.dimension;
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
  if (uncertainty) {
    const std::string where = fmt::format("{}.{}", path, kUncertaintyKey);
    g.uncertainty = read_stated_uncertainty(*uncertainty, s.input, where, context);
  }
  return g;
}

// The site's values, which the others are read against: the barometer and the standard
// conditions (both of them, or neither).
units::ParseContext read_site(const json& c, CaseInput& out, units::ParseNotes& notes) {
  units::ParseContext context;
  for (const InputSpec& s : machines::kInputs) {
    if (s.field) continue;
    const json* v = value_at(c, s);
    if (!v) continue;
    GivenValue g = read_given(s, *v, std::string(s.key), context, notes);
    if (s.input == Input::barometric_pressure) context.barometric_pressure = g.si;
    out.given.push_back(std::move(g));
  }
  const GivenValue* p = out.find(Input::standard_pressure);
  const GivenValue* T = out.find(Input::standard_temperature);
  if ((p == nullptr) != (T == nullptr)) {
    refuse("site.standard_conditions: give both pressure and temperature");
  }
  if (p) {
    if (p->on_barometer) refuse("site.standard_conditions.pressure: an absolute pressure: not a gauge unit");
    context.standard_conditions = units::StandardConditions{p->si, T->si};
  }
  return context;
}

void read_values(const json& c, CaseInput& out) {
  units::ParseNotes notes;
  const units::ParseContext context = read_site(c, out, notes);
  for (const InputSpec& s : machines::kInputs) {
    if (!s.field) continue;
    const json* v = value_at(c, s);
    if (!v) continue;
    // "efficiency": 0.82 is named as written in messages.
    const json& head = c[std::string(head_of(s.key))];
    const bool shorthand = s.input == Input::efficiency_isentropic && (!head.is_object() || is_measured(head));
    out.given.push_back(read_given(s, *v, std::string(shorthand ? head_of(s.key) : s.key), context, notes));
  }
  // The barometer was read first; it belongs at its place in the table's order.
  std::stable_sort(out.given.begin(), out.given.end(),
                   [](const GivenValue& a, const GivenValue& b) { return a.input < b.input; });
  if (notes.used_default_barometer) out.warnings.emplace_back(kDefaultBarometerWarning);
  const std::string uncertainty(kUncertaintyKey);
  if (c.contains(uncertainty) && !c[uncertainty].is_null()) {
    out.uncertainty_by_key = read_uncertainty_by_key(c[uncertainty], uncertainty, context);
    apply_uncertainty_by_key(out, out.uncertainty_by_key);
  }
  if (notes.absolute_water_column) {
    out.warnings.emplace_back("a water column (inH2O, mmH2O) was read as an absolute pressure; a reading against the "
                              "barometer is written inH2Og or mmH2Og");
  }
  if (notes.standard_reference) out.standard_reference = units::describe(*notes.standard_reference);
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
  if (!machines::value_acceptable(input, si)) return machines::value_problem(input, si);
  const bool efficiency = machines::spec(input).dimension == Dimension::fraction && input != Input::inlet_quality &&
                          input != Input::outlet_quality;
  if (si < 0.01 && efficiency && unit == "%") {
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
  warn_unknown_keys(c, "", out.warnings);
  out.machine = read_machine(c, out.machine_written);
  const std::string fluid(kFluidKey);
  if (!c.contains(fluid)) refuse("fluid: missing; give a fluid name (shaftwork fluids lists them) or object");
  read_values(c, out);
  // A moist gas takes its water content at the inlet state.
  const GivenValue* p1 = out.find(Input::inlet_pressure);
  const GivenValue* T1 = out.find(Input::inlet_temperature);
  const FluidSite site{p1 ? std::optional<double>(p1->si) : std::nullopt,
                       T1 ? std::optional<double>(T1->si) : std::nullopt};
  out.fluid = fluids.make(c[fluid], fluid, out.warnings, site);
  out.fluid_label = fluids.label(c[fluid], *out.fluid);
  if (const std::string problem = machines::input_problem(to_rating_input(out)); !problem.empty()) refuse(problem);
  return out;
}

}  // namespace shaftwork::io

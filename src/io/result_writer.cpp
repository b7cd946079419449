#include "shaftwork/io/result_writer.hpp"

#include <algorithm>
#include <cmath>

#include <fmt/format.h>
#include <fmt/ranges.h>

#include "shaftwork/units/quantity.hpp"

namespace shaftwork::io {
namespace {

using nlohmann::ordered_json;
using machines::Quantity;
using machines::Rating;
using units::Dimension;

double in_display(double si, Dimension d, UnitSystem system) {
  const char* unit = display_unit(d, system);
  if (!*unit) return si;
  return units::from_si(si, unit, d);
}

ordered_json state_json(const fluids::State& s, bool full) {
  ordered_json j;
  j["pressure"] = s.pressure;
  j["temperature"] = s.temperature;
  j["enthalpy"] = s.enthalpy;
  if (full) {
    j["entropy"] = s.entropy;
    j["density"] = s.density;
  }
  if (s.quality) j["quality"] = *s.quality;
  return j;
}

// Throws when a number anywhere in j is not finite, naming its key.
void check_finite(const ordered_json& j, const std::string& path) {
  if (j.is_object()) {
    for (const auto& [key, value] : j.items()) check_finite(value, path.empty() ? key : path + "." + key);
  } else if (j.is_array()) {
    for (const auto& value : j) check_finite(value, path);
  } else if (j.is_number_float() && !std::isfinite(j.get<double>())) {
    throw std::runtime_error(path);
  }
}

std::string format_value(double v) {
  if (v == 0) return "0";
  const double a = std::fabs(v);
  if (a >= 1e7 || a < 1e-3) return fmt::format("{:.5e}", v);
  // About six significant figures, without trailing noise.
  const int decimals = std::max(0, 5 - static_cast<int>(std::floor(std::log10(a))));
  return fmt::format("{:.{}f}", v, decimals);
}

}  // namespace

const char* display_unit(Dimension d, UnitSystem system) {
  const bool us = system == UnitSystem::us;
  switch (d) {
    case Dimension::pressure: return us ? "psia" : "kPa";
    case Dimension::temperature: return us ? "degF" : "degC";
    case Dimension::mass_flow: return us ? "lb/h" : "kg/s";
    case Dimension::volume_flow: return us ? "acfm" : "m3/h";
    case Dimension::power: return us ? "hp" : "kW";
    case Dimension::specific_energy: return us ? "Btu/lb" : "kJ/kg";
    case Dimension::length: return us ? "ft" : "m";
    case Dimension::specific_heat:
    case Dimension::specific_entropy: return us ? "Btu/(lb R)" : "kJ/(kg K)";
    case Dimension::density: return us ? "lb/ft3" : "kg/m3";
    case Dimension::molar_mass: return "g/mol";
    case Dimension::standard_volume_flow:
    case Dimension::fraction: return "";
  }
  return "";
}

const std::vector<ResultColumn>& result_columns() {
  using R = const Rating&;
  using O = std::optional<double>;
  using A = ResultColumn::Applies;
  // The batch leaves out the states' enthalpies, entropies and densities: each model
  // has its own reference state, so only differences mean anything, and the heads,
  // powers and efficiencies carry those (docs/batch.md).
  constexpr bool batch = true;
  constexpr bool not_in_batch = false;
  static const std::vector<ResultColumn> cols = {
      {"inlet.pressure", Dimension::pressure, [](R r) -> O { return r.inlet.pressure; }, batch, A::always},
      {"inlet.temperature", Dimension::temperature, [](R r) -> O { return r.inlet.temperature; }, batch, A::always},
      {"inlet.enthalpy", Dimension::specific_energy,
       [](R r) -> O { return r.inlet.enthalpy; }, not_in_batch, A::always},
      {"inlet.entropy", Dimension::specific_entropy,
       [](R r) -> O { return r.inlet.entropy; }, not_in_batch, A::always},
      {"inlet.density", Dimension::density, [](R r) -> O { return r.inlet.density; }, not_in_batch, A::always},
      {"inlet.quality", Dimension::fraction, [](R r) -> O { return r.inlet.quality; }, batch, A::two_phase},
      {"outlet.pressure", Dimension::pressure, [](R r) -> O { return r.outlet.pressure; }, batch, A::always},
      {"outlet.temperature", Dimension::temperature, [](R r) -> O { return r.outlet.temperature; }, batch, A::always},
      {"outlet.enthalpy", Dimension::specific_energy,
       [](R r) -> O { return r.outlet.enthalpy; }, not_in_batch, A::always},
      {"outlet.entropy", Dimension::specific_entropy,
       [](R r) -> O { return r.outlet.entropy; }, not_in_batch, A::always},
      {"outlet.density", Dimension::density, [](R r) -> O { return r.outlet.density; }, not_in_batch, A::always},
      {"outlet.quality", Dimension::fraction, [](R r) -> O { return r.outlet.quality; }, batch, A::two_phase},
      {"outlet_isentropic.temperature", Dimension::temperature,
       [](R r) -> O { return r.outlet_isentropic.temperature; }, batch, A::always},
      {"outlet_isentropic.enthalpy", Dimension::specific_energy,
       [](R r) -> O { return r.outlet_isentropic.enthalpy; }, not_in_batch, A::always},
      {"outlet_isentropic.quality", Dimension::fraction,
       [](R r) -> O { return r.outlet_isentropic.quality; }, batch, A::two_phase},
      {"mass_flow", Dimension::mass_flow, [](R r) -> O { return r.mass_flow; }, batch, A::always},
      {"volume_flow", Dimension::volume_flow, [](R r) -> O { return r.volume_flow; }, batch, A::always},
      {"power", Dimension::power, [](R r) -> O { return r.power; }, batch, A::always},
      {"fluid_power", Dimension::power, [](R r) -> O { return r.fluid_power; }, batch, A::always},
      {"efficiency.isentropic", Dimension::fraction,
       [](R r) -> O { return r.efficiency_isentropic; }, batch, A::always},
      {"efficiency.polytropic", Dimension::fraction,
       [](R r) -> O { return r.efficiency_polytropic; }, batch, A::always},
      {"mechanical_efficiency", Dimension::fraction,
       [](R r) -> O { return r.mechanical_efficiency; }, not_in_batch, A::always},
      {"head.isentropic", Dimension::specific_energy, [](R r) -> O { return r.head_isentropic; }, batch, A::always},
      {"head.polytropic", Dimension::specific_energy, [](R r) -> O { return r.head_polytropic; }, batch, A::always},
      {"head_height", Dimension::length, [](R r) -> O { return r.head_height; }, batch, A::pump},
      {"pressure_ratio", Dimension::fraction, [](R r) -> O { return r.pressure_ratio; }, batch, A::always},
      {"power_balance.difference_percent", Dimension::fraction,
       [](R r) -> O { return r.power_balance ? O(r.power_balance->difference_percent) : std::nullopt; },
       batch, A::always},
  };
  return cols;
}

ordered_json error_json(const std::string& id, const std::string& error, const std::vector<std::string>& warnings) {
  ordered_json j;
  j["id"] = id;
  j["status"] = "error";
  j["error"] = error;
  if (!warnings.empty()) j["warnings"] = warnings;
  return j;
}

ordered_json result_json(const CaseOutcome& o) {
  if (!o.ok()) return error_json(o.id, o.error, o.warnings);
  return result_json(o.id, o.input ? std::string_view(o.input->fluid_name) : std::string_view(), *o.rating,
                     o.warnings);
}

ordered_json result_json(const std::string& id, std::string_view fluid_name, const Rating& r,
                         const std::vector<std::string>& warnings) {
  ordered_json j;
  j["id"] = id;
  j["status"] = "ok";
  j["machine"] = machines::machine_name(r.machine);
  if (!fluid_name.empty()) j["fluid"] = fluid_name;
  j["model"] = r.model;
  j["solved_for"] = r.solved_for.keys();
  j["inlet"] = state_json(r.inlet, true);
  j["outlet"] = state_json(r.outlet, true);
  j["outlet_isentropic"] = state_json(r.outlet_isentropic, false);
  j["mass_flow"] = r.mass_flow;
  j["volume_flow"] = r.volume_flow;
  j["power"] = r.power;
  j["fluid_power"] = r.fluid_power;
  j["mechanical_efficiency"] = r.mechanical_efficiency;
  j["efficiency"] = {{"isentropic", r.efficiency_isentropic}, {"polytropic", r.efficiency_polytropic}};
  j["head"] = {{"isentropic", r.head_isentropic}, {"polytropic", r.head_polytropic}};
  if (r.head_height) j["head_height"] = *r.head_height;
  j["pressure_ratio"] = r.pressure_ratio;
  if (r.power_balance) {
    j["power_balance"] = {{"fluid_power", r.power_balance->fluid_power},
                          {"shaft_power", r.power_balance->shaft_power},
                          {"given_power", r.power_balance->given_power},
                          {"difference_percent", r.power_balance->difference_percent}};
  }
  if (!r.checks.empty()) {
    ordered_json checks = ordered_json::array();
    for (const auto& c : r.checks) {
      checks.push_back({{"key", c.key}, {"given", c.given}, {"computed", c.computed}});
    }
    j["redundant"] = checks;
  }
  j["warnings"] = warnings;
  try {
    check_finite(j, "");
  } catch (const std::runtime_error& e) {
    return error_json(id, fmt::format("the result {} is not a finite number; the case cannot be rated", e.what()),
                      warnings);
  }
  return j;
}

void write_json(std::ostream& out, const std::vector<CaseOutcome>& outcomes) {
  ordered_json doc;
  doc["results"] = ordered_json::array();
  for (const auto& o : outcomes) doc["results"].push_back(result_json(o));
  out << doc.dump(2) << '\n';
}

std::string csv_field(const std::string& text) {
  if (text.find_first_of(",\"\r\n") == std::string::npos) return text;
  std::string quoted = "\"";
  for (char ch : text) {
    if (ch == '"') quoted += '"';
    quoted += ch;
  }
  return quoted + '"';
}

void write_csv(std::ostream& out, const std::vector<CaseOutcome>& outcomes, UnitSystem system) {
  out << "id,status,error,machine,fluid,model,solved_for";
  for (const ResultColumn& c : result_columns()) {
    const char* unit = display_unit(c.dimension, system);
    out << ',' << csv_field(*unit ? fmt::format("{} [{}]", c.key, unit) : c.key);
  }
  out << ",warnings\r\n";
  for (const auto& o : outcomes) {
    out << csv_field(o.id) << ',' << (o.ok() ? "ok" : "error") << ',' << csv_field(o.error) << ',';
    const std::string warnings = fmt::format("{}", fmt::join(o.warnings, "; "));
    if (o.ok()) {
      const Rating& r = *o.rating;
      const std::string solved = fmt::format("{}", fmt::join(r.solved_for.keys(), " "));
      out << machines::machine_name(r.machine) << ',' << csv_field(o.input ? o.input->fluid_name : "") << ','
          << r.model << ',' << solved;
      for (const ResultColumn& c : result_columns()) {
        out << ',';
        if (auto v = c.value(r); v && std::isfinite(*v)) out << fmt::format("{:.10g}", in_display(*v, c.dimension, system));
      }
    } else {
      out << ",,,";
      for (size_t i = 0; i < result_columns().size(); ++i) out << ',';
    }
    out << ',' << csv_field(warnings) << "\r\n";
  }
}

void write_table(std::ostream& out, const std::vector<CaseOutcome>& outcomes, UnitSystem system) {
  bool first = true;
  for (const auto& o : outcomes) {
    if (!first) out << '\n';
    first = false;
    if (!o.ok()) {
      out << fmt::format("{}\n  could not be rated: {}\n", o.id, o.error);
      for (const auto& w : o.warnings) out << "  warning: " << w << '\n';
      continue;
    }
    const Rating& r = *o.rating;
    const CaseInput* in = o.input ? &*o.input : nullptr;
    out << fmt::format("{}\n  {} on {} ({})\n", o.id, machines::machine_name(r.machine),
                       in ? in->fluid_name : r.model, r.model);

    auto solved = [&](const char* key) {
      return r.solved_for.contains(std::string_view(key));
    };
    // A line: label, value with unit, and how the value came about.
    auto line = [&](const char* label, double si, Dimension d, const char* mark, const std::string& unit_given) {
      std::string text;
      if (!unit_given.empty() && unit_given != "%") {
        const double baro = in ? in->barometric_pressure : units::kStandardAtmosphere;
        text = fmt::format("{:.6g} {}", units::from_si(si, unit_given, d, baro), unit_given);
      } else {
        const char* unit = display_unit(d, system);
        text = format_value(in_display(si, d, system)) + (*unit ? std::string(" ") + unit : "");
      }
      std::string row = fmt::format("  {:<28}{:<24}{}", label, text, mark);
      row.erase(row.find_last_not_of(' ') + 1);
      out << row << '\n';
    };
    auto written = [&](Quantity q) -> std::string {
      if (!in) return "";
      auto it = in->unit_written.find(q);
      return it == in->unit_written.end() ? "" : it->second;
    };
    auto mark_for = [&](const char* key) { return solved(key) ? "solved" : "given"; };
    auto given_unit = [&](const char* key, Quantity q) { return solved(key) ? std::string() : written(q); };

    line("inlet pressure", r.inlet.pressure, Dimension::pressure, mark_for("inlet.pressure"),
         given_unit("inlet.pressure", Quantity::inlet_pressure));
    line("inlet temperature", r.inlet.temperature, Dimension::temperature, mark_for("inlet.temperature"),
         given_unit("inlet.temperature", Quantity::inlet_temperature));
    const bool outlet_pressure_given = in && in->rating.outlet_pressure;
    line("outlet pressure", r.outlet.pressure, Dimension::pressure,
         solved("outlet.pressure") ? "solved" : (outlet_pressure_given ? "given" : "from head"),
         given_unit("outlet.pressure", Quantity::outlet_pressure));
    const bool outlet_t_given = in && in->rating.outlet_temperature;
    line("outlet temperature", r.outlet.temperature, Dimension::temperature,
         solved("outlet.temperature") ? "solved" : (outlet_t_given ? "given" : "from the given outlet"),
         given_unit("outlet.temperature", Quantity::outlet_temperature));
    if (r.outlet.quality) line("outlet quality", *r.outlet.quality, Dimension::fraction, "", "");
    const char* flow_mark = "given";
    if (solved("mass_flow")) {
      flow_mark = "solved";
    } else if (in && in->rating.flow && in->rating.flow->kind == machines::Flow::Kind::actual_volume) {
      flow_mark = "from the given volume flow";
    } else if (in && in->rating.flow && in->rating.flow->kind == machines::Flow::Kind::molar) {
      flow_mark = "from the given standard flow";
    }
    line("mass flow", r.mass_flow, Dimension::mass_flow, flow_mark, given_unit("mass_flow", Quantity::flow));
    line("power (shaft)", r.power, Dimension::power, mark_for("power"), given_unit("power", Quantity::power));
    const bool eta_solved = solved("efficiency");
    const bool polytropic_given =
        in && in->rating.efficiency && in->rating.efficiency->basis == machines::EfficiencyBasis::polytropic;
    line("isentropic efficiency", r.efficiency_isentropic, Dimension::fraction,
         eta_solved ? "solved" : (polytropic_given ? "" : "given"), "");
    line("polytropic efficiency", r.efficiency_polytropic, Dimension::fraction,
         eta_solved ? "solved" : (polytropic_given ? "given" : ""), "");
    out << "  derived\n";
    line("pressure ratio", r.pressure_ratio, Dimension::fraction, "", "");
    line("isentropic outlet temp.", r.outlet_isentropic.temperature, Dimension::temperature, "", "");
    if (r.outlet_isentropic.quality) line("isentropic outlet quality", *r.outlet_isentropic.quality, Dimension::fraction, "", "");
    line("isentropic head", r.head_isentropic, Dimension::specific_energy, "", "");
    line("polytropic head", r.head_polytropic, Dimension::specific_energy, "", "");
    if (r.head_height) line("pump head", *r.head_height, Dimension::length, "", "");
    line("fluid power", r.fluid_power, Dimension::power, "", "");
    if (r.mechanical_efficiency != 1) line("mechanical efficiency", r.mechanical_efficiency, Dimension::fraction, "given", "");
    line("inlet volume flow", r.volume_flow, Dimension::volume_flow, "", "");
    line("inlet density", r.inlet.density, Dimension::density, "", "");
    if (r.power_balance) {
      out << "  power balance (fluid side against the given power)\n";
      line("shaft power from fluid", r.power_balance->shaft_power, Dimension::power, "", "");
      line("given power", r.power_balance->given_power, Dimension::power, "", "");
      out << fmt::format("  {:<28}{:+.2f} %\n", "difference", r.power_balance->difference_percent);
    }
    for (const auto& c : r.checks) {
      out << fmt::format("  check: {} given {:.4f}, from the temperatures {:.4f}\n", c.key, c.given, c.computed);
    }
    for (const auto& w : o.warnings) out << "  warning: " << w << '\n';
  }
}

}  // namespace shaftwork::io

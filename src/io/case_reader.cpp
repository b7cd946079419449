#include "shaftwork/io/case_reader.hpp"

#include <string_view>

#include <fmt/format.h>

#include "json_keys.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/json_quantity.hpp"

namespace shaftwork::io {
namespace {

using nlohmann::json;
using machines::Quantity;
using units::Dimension;

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

// An optional sub-object ("inlet", "outlet", "site"): absent or {} is empty.
const json& section(const json& c, const char* key) {
  static const json empty = json::object();
  if (!c.contains(key) || c[key].is_null()) return empty;
  if (!c[key].is_object()) refuse(fmt::format("{}: expected an object, got {}", key, c[key].type_name()));
  return c[key];
}

Dimension dimension_of(Quantity q) {
  switch (q) {
    case Quantity::inlet_pressure:
    case Quantity::outlet_pressure: return Dimension::pressure;
    case Quantity::inlet_temperature:
    case Quantity::outlet_temperature: return Dimension::temperature;
    case Quantity::flow: return Dimension::mass_flow;
    case Quantity::power: return Dimension::power;
    case Quantity::efficiency: return Dimension::fraction;
  }
  return Dimension::fraction;
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
  if (!document.contains("machine")) {
    refuse(fmt::format("{}: not a case file: expected \"cases\" or a case with \"machine\"", origin));
  }
  out.push_back(&document);
  return out;
}

std::string case_label(const json& c, size_t index) {
  if (c.is_object() && c.contains("id")) {
    if (c["id"].is_string()) return c["id"].get<std::string>();
    if (c["id"].is_number()) return c["id"].dump();
  }
  return fmt::format("case {}", index + 1);
}

machines::ValueEcho make_value_echo(std::map<machines::Quantity, std::string> unit_written,
                                    double barometric_pressure) {
  return [written = std::move(unit_written), barometer = barometric_pressure](Quantity q, double si) {
    auto it = written.find(q);
    if (it != written.end() && !it->second.empty() && it->second != "%") {
      try {
        return fmt::format("{:.6g} {}", units::from_si(si, it->second, dimension_of(q), barometer), it->second);
      } catch (const Error&) {
      }
    }
    switch (q) {
      case Quantity::inlet_pressure:
      case Quantity::outlet_pressure: return fmt::format("{:.6g} kPa", si / 1000);
      case Quantity::inlet_temperature:
      case Quantity::outlet_temperature: return fmt::format("{:.2f} K", si);
      case Quantity::flow: return fmt::format("{:.6g} kg/s", si);
      case Quantity::power: return fmt::format("{:.6g} kW", si / 1000);
      case Quantity::efficiency: return fmt::format("{:.4f}", si);
    }
    return fmt::format("{:.6g}", si);
  };
}

CaseInput read_case(const json& c, size_t index, FluidFactory& fluids) {
  if (!c.is_object()) refuse(fmt::format("expected a case object, got {}", c.type_name()));
  CaseInput out;
  out.id = case_label(c, index);
  detail::warn_unknown_keys(c,
                    {"id", "machine", "fluid", "inlet", "outlet", "mass_flow", "volume_flow",
                     "standard_volume_flow", "power", "efficiency", "mechanical_efficiency", "head", "site",
                     "note"},
                    "", out.warnings);

  machines::RatingInput& r = out.rating;
  // machine
  if (!c.contains("machine")) refuse("machine: missing; give \"compressor\", \"turbine\" or \"pump\"");
  const json& machine = c["machine"];
  if (machine == "compressor" || machine == "fan") {
    r.machine = machines::MachineKind::compressor;
  } else if (machine == "turbine" || machine == "expander") {
    r.machine = machines::MachineKind::turbine;
  } else if (machine == "pump") {
    r.machine = machines::MachineKind::pump;
  } else {
    refuse(fmt::format("machine: unknown machine {}; give \"compressor\", \"turbine\" or \"pump\"", machine.dump()));
  }

  // site first: gauge pressures need the barometer.
  const json& site = section(c, "site");
  detail::warn_unknown_keys(site, {"barometric_pressure"}, "site.", out.warnings);
  units::ParseContext context;
  units::ParseNotes notes;
  if (site.contains("barometric_pressure")) {
    context.barometric_pressure =
        read_quantity(site["barometric_pressure"], Dimension::pressure, "site.barometric_pressure", {}, notes).si;
    out.barometric_pressure = *context.barometric_pressure;
  }

  // fluid
  if (!c.contains("fluid")) refuse("fluid: missing; give a fluid name (shaftwork fluids lists them) or object");
  r.fluid = fluids.make(c["fluid"], "fluid", out.warnings);
  out.fluid_name = c["fluid"].is_string() ? c["fluid"].get<std::string>() : r.fluid->model_name();

  auto read = [&](const json& value, Dimension d, const std::string& path) {
    return read_quantity(value, d, path, context, notes);
  };
  auto keep = [&](Quantity q, const ReadQuantity& v) {
    out.unit_written[q] = v.unit;
    return v.si;
  };

  const json& inlet = section(c, "inlet");
  detail::warn_unknown_keys(inlet, {"pressure", "temperature", "enthalpy"}, "inlet.", out.warnings);
  if (inlet.contains("pressure")) {
    r.inlet_pressure = keep(Quantity::inlet_pressure, read(inlet["pressure"], Dimension::pressure, "inlet.pressure"));
  }
  if (inlet.contains("temperature")) {
    r.inlet_temperature =
        keep(Quantity::inlet_temperature, read(inlet["temperature"], Dimension::temperature, "inlet.temperature"));
  }
  if (inlet.contains("enthalpy")) {
    r.inlet_enthalpy = read(inlet["enthalpy"], Dimension::specific_energy, "inlet.enthalpy").si;
  }

  const json& outlet = section(c, "outlet");
  detail::warn_unknown_keys(outlet, {"pressure", "temperature", "enthalpy", "quality"}, "outlet.", out.warnings);
  if (outlet.contains("pressure")) {
    r.outlet_pressure =
        keep(Quantity::outlet_pressure, read(outlet["pressure"], Dimension::pressure, "outlet.pressure"));
  }
  if (outlet.contains("temperature")) {
    r.outlet_temperature =
        keep(Quantity::outlet_temperature, read(outlet["temperature"], Dimension::temperature, "outlet.temperature"));
  }
  if (outlet.contains("enthalpy")) {
    r.outlet_enthalpy = read(outlet["enthalpy"], Dimension::specific_energy, "outlet.enthalpy").si;
  }
  if (outlet.contains("quality")) {
    r.outlet_quality = read(outlet["quality"], Dimension::fraction, "outlet.quality").si;
  }

  // flow: one of three forms
  const int flow_forms = c.contains("mass_flow") + c.contains("volume_flow") + c.contains("standard_volume_flow");
  if (flow_forms > 1) refuse("give one of mass_flow, volume_flow and standard_volume_flow, not several");
  if (c.contains("mass_flow")) {
    r.flow = machines::Flow{machines::Flow::Kind::mass,
                            keep(Quantity::flow, read(c["mass_flow"], Dimension::mass_flow, "mass_flow"))};
  } else if (c.contains("volume_flow")) {
    r.flow = machines::Flow{machines::Flow::Kind::actual_volume,
                            read(c["volume_flow"], Dimension::volume_flow, "volume_flow").si};
  } else if (c.contains("standard_volume_flow")) {
    r.flow = machines::Flow{machines::Flow::Kind::molar,
                            read(c["standard_volume_flow"], Dimension::standard_volume_flow, "standard_volume_flow").si};
  }

  if (c.contains("power")) r.power = keep(Quantity::power, read(c["power"], Dimension::power, "power"));

  if (c.contains("efficiency")) {
    const json& e = c["efficiency"];
    machines::Efficiency eff;
    std::string path = "efficiency";
    const json* value = &e;
    if (e.is_object()) {
      detail::warn_unknown_keys(e, {"isentropic", "polytropic"}, "efficiency.", out.warnings);
      if (e.contains("isentropic") == e.contains("polytropic")) {
        refuse("efficiency: give one of \"isentropic\" and \"polytropic\"");
      }
      eff.basis = e.contains("isentropic") ? machines::EfficiencyBasis::isentropic
                                           : machines::EfficiencyBasis::polytropic;
      path = e.contains("isentropic") ? "efficiency.isentropic" : "efficiency.polytropic";
      value = &e[e.contains("isentropic") ? "isentropic" : "polytropic"];
    }
    eff.value = keep(Quantity::efficiency, read(*value, Dimension::fraction, path));
    if (!(eff.value > 0 && eff.value <= 1)) {
      refuse(fmt::format("{}: must be above 0 and at most 1 (or 100 %), got {:.6g}", path, eff.value));
    }
    r.efficiency = eff;
  }

  if (c.contains("mechanical_efficiency")) {
    r.mechanical_efficiency = read(c["mechanical_efficiency"], Dimension::fraction, "mechanical_efficiency").si;
    if (!(r.mechanical_efficiency > 0 && r.mechanical_efficiency <= 1)) {
      refuse(fmt::format("mechanical_efficiency: must be above 0 and at most 1, got {:.6g}", r.mechanical_efficiency));
    }
  }

  if (c.contains("head")) {
    const json& h = c["head"];
    if (h.is_string()) {
      // A height ("85 m", "280 ft") or an energy per mass ("0.83 kJ/kg").
      try {
        units::ParseNotes ignored;
        r.pump_head = units::parse(h.get<std::string>(), Dimension::length, context, ignored) *
                      units::kStandardGravity;
      } catch (const Error&) {
        r.pump_head = read(h, Dimension::specific_energy, "head").si;
      }
    } else {
      r.pump_head = read(h, Dimension::specific_energy, "head").si;
    }
  }

  if (notes.used_default_barometer) {
    out.warnings.emplace_back(kDefaultBarometerWarning);
  }

  // Messages echo values in the units the user wrote them in.
  r.echo = make_value_echo(out.unit_written, out.barometric_pressure);
  return out;
}

}  // namespace shaftwork::io

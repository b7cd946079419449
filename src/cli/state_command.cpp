// shaftwork state — the thermodynamic state of a fluid at (p, T), (p, h) or (p, s).
#include <iostream>
#include <memory>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/fluid_factory.hpp"
#include "shaftwork/io/json_quantity.hpp"
#include "shaftwork/io/text_file.hpp"

namespace shaftwork::cli {
namespace {

struct StateOptions {
  std::string fluid;
  std::string fluid_file;
  std::string pressure;
  std::optional<std::string> temperature;
  std::optional<std::string> enthalpy;
  std::optional<std::string> entropy;
  std::optional<std::string> barometer;
  std::string format = "table";
  std::vector<std::string> species_files;
};

double quantity(const std::string& text, units::Dimension d, const char* option,
                const units::ParseContext& context, units::ParseNotes& notes) {
  // A bare number on the command line is SI, as in case files.
  nlohmann::json value;
  double number = 0;
  std::istringstream probe(text);
  if ((probe >> number) && probe.eof()) {
    value = number;
  } else {
    value = text;
  }
  return io::read_quantity(value, d, option, context, notes).si;
}

nlohmann::ordered_json state_json(const fluids::State& s) {
  nlohmann::ordered_json j;
  j["pressure"] = s.pressure;
  j["temperature"] = s.temperature;
  j["enthalpy"] = s.enthalpy;
  j["entropy"] = s.entropy;
  j["density"] = s.density;
  // Heat capacities are not defined for a wet state; unknown values print as null.
  j["cp"] = s.is_wet() ? nlohmann::ordered_json() : nlohmann::ordered_json(s.cp);
  j["cv"] = s.is_wet() ? nlohmann::ordered_json() : nlohmann::ordered_json(s.cv);
  j["k"] = s.is_wet() ? nlohmann::ordered_json() : nlohmann::ordered_json(s.k());
  j["molar_mass"] = s.molar_mass > 0 ? nlohmann::ordered_json(s.molar_mass) : nlohmann::ordered_json();
  j["compressibility"] = s.compressibility > 0 ? nlohmann::ordered_json(s.compressibility) : nlohmann::ordered_json();
  if (s.quality) j["quality"] = *s.quality;
  return j;
}

void print_table(const fluids::State& s, const std::string& fluid, const fluids::FluidModel& model) {
  std::cout << fmt::format("{} ({}: {})\n", fluid, model.model_name(), model.description());
  auto row = [](const char* name, const std::string& value, const char* unit) {
    std::cout << fmt::format("  {:<18}{:>16}  {}\n", name, value, unit);
  };
  row("pressure", fmt::format("{:.6g}", s.pressure / 1000), "kPa");
  row("temperature", fmt::format("{:.4f}", s.temperature), fmt::format("K ({:.2f} degC)", s.temperature - 273.15).c_str());
  row("enthalpy", fmt::format("{:.6g}", s.enthalpy / 1000), "kJ/kg");
  row("entropy", fmt::format("{:.6g}", s.entropy / 1000), "kJ/(kg K)");
  row("density", fmt::format("{:.6g}", s.density), "kg/m3");
  if (s.quality) {
    row("quality", fmt::format("{:.6g}", *s.quality), "(vapour mass fraction)");
  } else {
    row("cp", fmt::format("{:.6g}", s.cp / 1000), "kJ/(kg K)");
    row("cv", fmt::format("{:.6g}", s.cv / 1000), "kJ/(kg K)");
    row("k = cp/cv", fmt::format("{:.6g}", s.k()), "");
  }
  if (s.molar_mass > 0) row("molar mass", fmt::format("{:.6g}", s.molar_mass * 1000), "g/mol");
  if (s.compressibility > 0) row("compressibility", fmt::format("{:.6g}", s.compressibility), "");
}

int run_state(const StateOptions& o) {
  try {
    io::FluidFactory factory;
    for (const auto& path : o.species_files) factory.add_species_file(path);
    nlohmann::json fluid_spec;
    std::string fluid_label;
    if (!o.fluid_file.empty()) {
      fluid_spec = io::parse_json_strict(io::read_text_file(o.fluid_file), o.fluid_file);
      fluid_label = o.fluid_file;
    } else {
      fluid_spec = o.fluid;
      fluid_label = o.fluid;
    }
    std::vector<std::string> warnings;
    const auto model = factory.make(fluid_spec, "--fluid", warnings);

    units::ParseContext context;
    units::ParseNotes notes;
    if (o.barometer) context.barometric_pressure = quantity(*o.barometer, units::Dimension::pressure, "--barometer", {}, notes);
    const double p = quantity(o.pressure, units::Dimension::pressure, "--pressure", context, notes);
    if (notes.used_default_barometer) warnings.push_back("a gauge pressure without --barometer: 101.325 kPa assumed");
    fluids::State s;
    if (o.temperature) {
      s = model->from_pt(p, quantity(*o.temperature, units::Dimension::temperature, "--temperature", context, notes));
    } else if (o.enthalpy) {
      s = model->from_ph(p, quantity(*o.enthalpy, units::Dimension::specific_energy, "--enthalpy", context, notes));
    } else {
      s = model->from_ps(p, quantity(*o.entropy, units::Dimension::specific_entropy, "--entropy", context, notes));
    }
    for (const auto& w : warnings) std::cerr << "warning: " << w << '\n';
    if (o.format == "json") {
      std::cout << state_json(s).dump(2) << '\n';
    } else {
      print_table(s, fluid_label, *model);
    }
    return kExitOk;
  } catch (const Error& e) {
    std::cerr << "error: " << e.what() << '\n';
    return e.kind() == ErrorKind::bad_input ? kExitUnusable : kExitCaseFailed;
  }
}

}  // namespace

void install_state(CLI::App& sub, int& exit_status) {
  auto o = std::make_shared<StateOptions>();
  auto* fluid = sub.add_option("--fluid", o->fluid, "A named fluid (shaftwork fluids lists them)");
  auto* file = sub.add_option("--fluid-file", o->fluid_file, "A JSON file holding a fluid object");
  fluid->excludes(file);
  sub.add_option("--pressure", o->pressure, "Pressure, e.g. \"1 bar\" (a bare number is Pa)")->required();
  auto* t = sub.add_option("--temperature", o->temperature, "Temperature, e.g. \"300 K\", \"25 degC\"");
  auto* h = sub.add_option("--enthalpy", o->enthalpy, "Specific enthalpy, e.g. \"2800 kJ/kg\"");
  auto* s = sub.add_option("--entropy", o->entropy, "Specific entropy, e.g. \"6.5 kJ/(kg K)\"");
  t->excludes(h)->excludes(s);
  h->excludes(s);
  sub.add_option("--barometer", o->barometer, "Site barometric pressure for gauge units");
  sub.add_option("--format", o->format, "Output format")->check(CLI::IsMember({"table", "json"}))->capture_default_str();
  sub.add_option("--species-file", o->species_files, "Extra species in the NASA 9-coefficient format");
  sub.callback([o, fluid, file, t, h, s, &exit_status] {
    if (fluid->count() + file->count() != 1) {
      std::cerr << "error: give --fluid NAME or --fluid-file FILE\n";
      exit_status = kExitUnusable;
      return;
    }
    if (t->count() + h->count() + s->count() != 1) {
      std::cerr << "error: give one of --temperature, --enthalpy, --entropy with --pressure\n";
      exit_status = kExitUnusable;
      return;
    }
    exit_status = run_state(*o);
  });
}

}  // namespace shaftwork::cli

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
#include "shaftwork/text.hpp"
#include "shaftwork/io/number_format.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/display_units.hpp"
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
  std::string units = "si";
  std::vector<std::string> species_files;
};

// A value read from the command line, and the unit it was written in ("" for a bare SI number).
struct Given {
  double si = 0;
  std::string unit;
};

Given quantity(const std::string& text, units::Dimension d, const char* option, const units::ParseContext& context,
               units::ParseNotes& notes) {
  // A bare number on the command line is SI, as in case files.
  nlohmann::json value;
  double number = 0;
  std::istringstream probe(text);
  if ((probe >> number) && probe.eof()) {
    value = number;
  } else {
    value = text;
  }
  const io::ReadQuantity q = io::read_quantity(value, d, option, context, notes);
  return {q.si, q.unit};
}

// cp (and with it k) as the equation gives it means something only where cp >= cv > 0: at
// water's critical point cp diverges, and IF97's region 3 there gives (dp/drho)_T <= 0 and a
// cp of either sign and any size.
bool heat_capacities_defined(const fluids::State& s) { return !s.is_wet() && s.cv > 0 && s.cp >= s.cv; }
constexpr std::string_view kNotDefined = "not defined here: at the critical point cp diverges";

nlohmann::ordered_json state_json(const fluids::State& s) {
  nlohmann::ordered_json j;
  j["pressure"] = io::rounded_for_output(s.pressure);
  j["temperature"] = io::rounded_for_output(s.temperature);
  j["enthalpy"] = io::rounded_for_output(s.enthalpy);
  j["entropy"] = io::rounded_for_output(s.entropy);
  j["density"] = io::rounded_for_output(s.density);
  // Heat capacities are not defined for a wet state; unknown values print as null.
  const bool defined = heat_capacities_defined(s);
  j["cp"] = defined ? nlohmann::ordered_json(io::rounded_for_output(s.cp)) : nlohmann::ordered_json();
  j["cv"] = s.is_wet() ? nlohmann::ordered_json() : nlohmann::ordered_json(io::rounded_for_output(s.cv));
  j["k"] = defined ? nlohmann::ordered_json(io::rounded_for_output(s.k())) : nlohmann::ordered_json();
  j["molar_mass"] = s.molar_mass > 0 ? nlohmann::ordered_json(s.molar_mass) : nlohmann::ordered_json();
  j["compressibility"] = s.compressibility > 0 ? nlohmann::ordered_json(io::rounded_for_output(s.compressibility)) : nlohmann::ordered_json();
  if (s.quality) j["quality"] = io::rounded_for_output(*s.quality);
  return j;
}

// The state as rate's table shows a case: a label, the value in the unit the user wrote
// for that dimension (or the unit system's), and how it came about.
struct StateTable {
  const io::UnitSystem system;
  const double barometer;
  std::string pressure_unit;     // as given
  std::string temperature_unit;  // as given, when the temperature was
  char given = 'T';              // 'T', 'h' or 's': which property was given with p

  void row(std::string_view label, double si, units::Dimension d, std::string unit, io::Precision precision,
           std::string_view note) const {
    if (unit.empty()) unit = io::column_unit(d, system);
    const double shown = unit.empty() ? si : units::from_si(si, unit, d, barometer);
    const std::string text = io::format_number(shown, precision) + (unit.empty() ? "" : " " + unit);
    std::string line = fmt::format("  {:<31}{:<20}{}", label, text, note);
    line.erase(line.find_last_not_of(' ') + 1);
    std::cout << line << '\n';
  }

  void print(const fluids::State& s, const std::string& fluid, const fluids::FluidModel& model) const {
    using D = units::Dimension;
    const io::Precision sig5{io::Precision::Kind::significant, 6};
    const io::Precision dec2{io::Precision::Kind::decimals, 2};
    const io::Precision dec4{io::Precision::Kind::decimals, 4};
    std::cout << fmt::format("{} ({})\n", escape_control(fluid), model.model_name());
    row("pressure", s.pressure, D::pressure, pressure_unit, sig5, "given");
    row("temperature", s.temperature, D::temperature, temperature_unit, dec2, given == 'T' ? "given" : "");
    row("enthalpy", s.enthalpy, D::specific_energy, "", sig5, given == 'h' ? "given" : "");
    row("entropy", s.entropy, D::specific_entropy, "", sig5, given == 's' ? "given" : "");
    row("density", s.density, D::density, "", sig5, "");
    if (s.quality) {
      row("quality", *s.quality, D::fraction, "", dec4, "vapour mass fraction");
    } else {
      if (heat_capacities_defined(s)) {
        row("cp", s.cp, D::specific_heat, "", sig5, "");
      } else {
        std::cout << fmt::format("  {:<31}{}\n", "cp", kNotDefined);
      }
      row("cv", s.cv, D::specific_heat, "", sig5, "");
      if (heat_capacities_defined(s)) row("k = cp/cv", s.k(), D::fraction, "", sig5, "");
    }
    if (s.molar_mass > 0) row("molar mass", s.molar_mass, D::molar_mass, "", sig5, "");
    if (s.compressibility > 0) row("compressibility", s.compressibility, D::fraction, "", sig5, "");
  }
};

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
    if (o.barometer) {
      context.barometric_pressure = quantity(*o.barometer, units::Dimension::pressure, "--barometer", {}, notes).si;
    }
    const Given p = quantity(o.pressure, units::Dimension::pressure, "--pressure", context, notes);
    if (notes.used_default_barometer) warnings.push_back("a gauge pressure without --barometer: 101.325 kPa assumed");
    StateTable table{o.units == "us" ? io::UnitSystem::us : io::UnitSystem::si,
                     context.barometric_pressure.value_or(units::kStandardAtmosphere), p.unit, "", 'T'};
    fluids::State s;
    if (o.temperature) {
      const Given T = quantity(*o.temperature, units::Dimension::temperature, "--temperature", context, notes);
      table.temperature_unit = T.unit;
      s = model->from_pt(p.si, T.si);
    } else if (o.enthalpy) {
      table.given = 'h';
      s = model->from_ph(p.si, quantity(*o.enthalpy, units::Dimension::specific_energy, "--enthalpy", context, notes).si);
    } else {
      table.given = 's';
      s = model->from_ps(p.si, quantity(*o.entropy, units::Dimension::specific_entropy, "--entropy", context, notes).si);
    }
    for (const auto& w : warnings) std::cerr << "warning: " << w << '\n';
    if (o.format == "json") {
      std::cout << state_json(s).dump(2) << '\n';
    } else {
      table.print(s, fluid_label, *model);
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
  auto* fluid = sub.add_option("--fluid", o->fluid, "A named fluid or a species (shaftwork fluids lists them)");
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
  sub.add_option("--units", o->units, "Units of the table (json is always SI); given values keep their own")
      ->check(CLI::IsMember({"si", "us"}))
      ->capture_default_str();
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

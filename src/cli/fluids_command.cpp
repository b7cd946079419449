// shaftwork fluids — the named fluids, species and models with their ranges.
#include <iostream>
#include <memory>
#include <string>
#include <vector>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/fluid_factory.hpp"

namespace shaftwork::cli {
namespace {

std::string range_text(const fluids::Range& r) { return fmt::format("{:g}-{:g} K", r.low, r.high); }

int run_fluids(const std::string& format, const std::vector<std::string>& species_files) {
  try {
    io::FluidFactory factory;
    for (const auto& path : species_files) factory.add_species_file(path);
    nlohmann::ordered_json doc;
    doc["fluids"] = nlohmann::ordered_json::array();
    for (const io::NamedFluid& named : io::named_fluids()) {
      std::vector<std::string> warnings;
      const auto model = factory.make(nlohmann::json(named.name), "fluid", warnings);
      const fluids::Range t = model->temperature_range();
      doc["fluids"].push_back({{"name", named.name},
                               {"model", model->model_name()},
                               {"description", model->description()},
                               {"temperature_range", {t.low, t.high}},
                               {"note", named.note}});
    }
    doc["species"] = nlohmann::ordered_json::array();
    for (const fluids::NasaSpecies& sp : factory.species().species()) {
      doc["species"].push_back({{"name", sp.name},
                                {"molar_mass", sp.molar_mass},
                                {"temperature_range", {sp.intervals.front().t_low, sp.intervals.back().t_high}},
                                {"source", sp.source}});
    }
    doc["models"] = {
        {{"name", "constant-cp"}, {"keys", "any two of cp, cv, k, R, molar_mass"}},
        {{"name", "nasa-polynomial"}, {"keys", "species, or mixture with basis (mole or mass)"}},
        {{"name", "iapws-if97"}, {"keys", "none"}},
        {{"name", "incompressible"}, {"keys", "density, cp"}},
    };
    if (format == "json") {
      std::cout << doc.dump(2) << '\n';
      return kExitOk;
    }
    std::cout << "Named fluids (name, model, temperature range; then what it is)\n";
    for (const auto& f : doc["fluids"]) {
      std::cout << fmt::format("  {:<29}{:<17}{}\n      {}\n", f["name"].get<std::string>(),
                               f["model"].get<std::string>(),
                               fmt::format("{:g}-{:g} K", f["temperature_range"][0].get<double>(),
                                           f["temperature_range"][1].get<double>()),
                               f["description"].get<std::string>());
      if (const std::string note = f["note"].get<std::string>(); !note.empty()) {
        std::cout << "      " << note << '\n';
      }
    }
    std::cout << "\nSpecies (NASA polynomials, ideal gas)\n";
    for (const fluids::NasaSpecies& sp : factory.species().species()) {
      std::cout << fmt::format("  {:<18}{:>9.4f} g/mol  {:<13}{}\n", sp.name, sp.molar_mass * 1000,
                               range_text({sp.intervals.front().t_low, sp.intervals.back().t_high}), sp.source);
    }
    std::cout << "\nModels (a case's \"fluid\" may be an object with one of these)\n";
    for (const auto& m : doc["models"]) {
      std::cout << fmt::format("  {:<18}keys: {}\n", m["name"].get<std::string>(), m["keys"].get<std::string>());
    }
    return kExitOk;
  } catch (const Error& e) {
    std::cerr << "error: " << e.what() << '\n';
    return kExitUnusable;
  }
}

}  // namespace

void install_fluids(CLI::App& sub, int& exit_status) {
  auto format = std::make_shared<std::string>("table");
  auto species_files = std::make_shared<std::vector<std::string>>();
  sub.add_option("--format", *format, "Output format")->check(CLI::IsMember({"table", "json"}))->capture_default_str();
  sub.add_option("--species-file", *species_files, "Extra species in the NASA 9-coefficient format");
  sub.callback([format, species_files, &exit_status] { exit_status = run_fluids(*format, *species_files); });
}

}  // namespace shaftwork::cli

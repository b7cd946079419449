// shaftwork fluids — the named fluids, species and models with their ranges.
#include <iostream>
#include <memory>
#include <string>
#include <vector>

#include <fmt/format.h>
#include <fmt/ranges.h>
#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/critical_data.hpp"
#include "shaftwork/io/fluid_factory.hpp"

namespace shaftwork::cli {
namespace {

std::string range_text(const fluids::Range& r) { return fmt::format("{:g}-{:g} K", r.low, r.high); }

// The critical constants and k_ij of the cubic models, with their sources.
void add_cubic_data(nlohmann::ordered_json& doc) {
  const fluids::CriticalData& data = fluids::CriticalData::built_in();
  doc["critical"] = nlohmann::ordered_json::array();
  for (const auto& [name, c] : data.constants()) {
    doc["critical"].push_back({{"species", name},
                               {"critical_temperature", c.critical_temperature},
                               {"critical_pressure", c.critical_pressure},
                               {"acentric_factor", c.acentric_factor},
                               {"source", c.source}});
  }
  doc["interaction"] = nlohmann::ordered_json::array();
  for (const fluids::InteractionParameter& p : data.interactions()) {
    std::string models = p.peng_robinson ? "peng-robinson" : "";
    if (p.soave_redlich_kwong) models += models.empty() ? "soave-redlich-kwong" : ", soave-redlich-kwong";
    doc["interaction"].push_back(
        {{"pair", p.first + "-" + p.second}, {"k", p.k}, {"models", models}, {"source", p.source}});
  }
}

void print_cubic_data(const nlohmann::ordered_json& doc) {
  std::cout << "\nCritical constants (peng-robinson, soave-redlich-kwong; data/critical.txt)\n";
  for (const auto& c : doc["critical"]) {
    std::cout << fmt::format("  {:<18}Tc {:>7g} K  pc {:>8.4g} bar  omega {:>7g}  {}\n",
                             c["species"].get<std::string>(), c["critical_temperature"].get<double>(),
                             c["critical_pressure"].get<double>() / 1e5, c["acentric_factor"].get<double>(),
                             c["source"].get<std::string>());
  }
  std::cout << fmt::format("\nInteraction parameters k_ij ({} pairs, data/interaction.txt; other pairs 0)\n",
                           doc["interaction"].size());
  for (const auto& p : doc["interaction"]) {
    std::cout << fmt::format("  {:<26}{:>8.4f}  {}  {}\n", p["pair"].get<std::string>(), p["k"].get<double>(),
                             p["models"].get<std::string>(), p["source"].get<std::string>());
  }
}

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
    doc["models"] = nlohmann::ordered_json::array();
    for (const io::FluidModelInfo& m : io::fluid_models()) {
      const std::vector<std::string> keys(m.keys.begin() + 1, m.keys.end());  // without "model"
      doc["models"].push_back({{"name", m.name}, {"keys", keys}, {"summary", m.summary}});
    }
    add_cubic_data(doc);
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
      const auto keys = m["keys"].get<std::vector<std::string>>();
      std::cout << fmt::format("  {:<21}{}\n  {:<21}keys: {}\n", m["name"].get<std::string>(),
                               m["summary"].get<std::string>(), "", keys.empty() ? "none" : fmt::format("{}", fmt::join(keys, ", ")));
    }
    print_cubic_data(doc);
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

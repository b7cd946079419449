#include "shaftwork/io/fluid_factory.hpp"

#include <cmath>
#include <sstream>
#include <string_view>

#include <fmt/format.h>
#include <fmt/ranges.h>

#include "fluid_builders.hpp"
#include "json_keys.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/json_quantity.hpp"
#include "shaftwork/io/text_file.hpp"

namespace shaftwork::fluids {
std::string_view embedded_data(std::string_view name);  // generated from data/*.txt
}

namespace shaftwork::io {
namespace {

using nlohmann::json;

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

std::vector<NamedFluid> parse_named_fluids(std::string_view text) {
  std::vector<NamedFluid> out;
  std::string note;
  std::istringstream in{std::string(text)};
  std::string line;
  int number = 0;
  while (std::getline(in, line)) {
    ++number;
    if (line.empty()) {
      note.clear();
      continue;
    }
    if (line[0] == '#') {
      const auto start = line.find_first_not_of("# ");
      if (start != std::string::npos) note = fmt::format("{}{}{}", note, note.empty() ? "" : " ", line.substr(start));
      continue;
    }
    const auto eq = line.find('=');
    if (eq == std::string::npos) refuse(fmt::format("data/fluids.txt line {}: expected 'name = {{...}}'", number));
    std::string name = line.substr(0, eq);
    name.erase(name.find_last_not_of(' ') + 1);
    try {
      out.push_back({name, json::parse(line.substr(eq + 1)), note});
      note.clear();  // a comment describes the line right below it
    } catch (const json::exception& e) {
      refuse(fmt::format("data/fluids.txt line {}: {}", number, e.what()));
    }
  }
  return out;
}

enum class SpeciesFileFormat { own, nasa7, nasa9 };

// Tells the three species formats apart by their first record: our own format
// opens a block with "species NAME"; the 7-coefficient format numbers its record
// lines 1 to 4 in column 80 (or starts with a THERMO line); anything else is read
// as the published 9-coefficient format, whose parser names the line it cannot read.
SpeciesFileFormat species_file_format(std::string_view text) {
  std::istringstream in{std::string(text)};
  std::string line;
  while (std::getline(in, line)) {
    if (!line.empty() && line.back() == '\r') line.pop_back();
    const auto first = line.find_first_not_of(" \t");
    if (first == std::string::npos || line[first] == '#' || line[first] == '!') continue;
    if (line.compare(first, 8, "species ") == 0) return SpeciesFileFormat::own;
    if (line.compare(first, 6, "THERMO") == 0) return SpeciesFileFormat::nasa7;
    if (line.size() >= 80 && line[79] == '1') return SpeciesFileFormat::nasa7;
    return SpeciesFileFormat::nasa9;
  }
  return SpeciesFileFormat::nasa9;
}

}  // namespace

const std::vector<NamedFluid>& named_fluids() {
  static const std::vector<NamedFluid> fluids = parse_named_fluids(fluids::embedded_data("fluids.txt"));
  return fluids;
}

std::vector<FluidModelInfo> fluid_models() {
  std::vector<FluidModelInfo> out;
  for (const detail::ModelEntry& m : detail::models()) {
    out.push_back({std::string(m.name), std::vector<std::string>(m.keys.begin(), m.keys.end()),
                   std::string(m.summary)});
  }
  return out;
}

FluidFactory::FluidFactory()
    : species_(std::make_shared<fluids::SpeciesLibrary>(fluids::SpeciesLibrary::built_in())) {}

void FluidFactory::add_species_file(const std::string& path) {
  const std::string content = read_text_file(path);
  fluids::SpeciesLibrary added;
  switch (species_file_format(content)) {
    case SpeciesFileFormat::own: added = fluids::SpeciesLibrary::parse_own_format(content, path); break;
    case SpeciesFileFormat::nasa7: added = fluids::SpeciesLibrary::parse_nasa7(content, path); break;
    case SpeciesFileFormat::nasa9: added = fluids::SpeciesLibrary::parse_nasa9(content, path); break;
  }
  if (added.species().empty()) {
    // An empty file, or one of condensed phases only: most likely the wrong file.
    refuse(fmt::format("{}: no gas-phase species in the file", path));
  }
  const std::lock_guard lock(mutex_);
  species_->merge(added);
  cache_.clear();  // definitions may now mean other species
}

std::string FluidFactory::label(const json& fluid, const fluids::FluidModel& model) {
  if (fluid.is_string()) return fluid.get<std::string>();
  if (fluid.is_object() && fluid.contains("species") && fluid["species"].is_string()) {
    return fluid["species"].get<std::string>();
  }
  if (fluid.is_object() && fluid.contains("fluid") && fluid["fluid"].is_string()) {
    return fluid["fluid"].get<std::string>();
  }
  return model.description();
}

std::shared_ptr<const fluids::FluidModel> FluidFactory::make(const json& fluid, const std::string& path,
                                                             std::vector<std::string>& warnings, const FluidSite& site) {
  // A model that depends on the case's state (humid air at a relative humidity) is cached
  // per state.
  std::string key = fluid.dump();
  if (site.pressure && site.temperature) key += fmt::format("@{}/{}", *site.pressure, *site.temperature);
  const std::lock_guard lock(mutex_);
  if (auto it = cache_.find(key); it != cache_.end()) {
    warnings.insert(warnings.end(), it->second.warnings.begin(), it->second.warnings.end());
    return it->second.model;
  }
  std::vector<std::string> own;
  auto model = build(fluid, path, site, own);
  warnings.insert(warnings.end(), own.begin(), own.end());
  cache_.emplace(std::move(key), Built{model, std::move(own)});
  return model;
}

std::shared_ptr<const fluids::FluidModel> FluidFactory::build(const json& fluid, const std::string& path,
                                                              const FluidSite& site,
                                                              std::vector<std::string>& warnings) {
  if (fluid.is_string()) {
    const std::string& name = fluid.get_ref<const std::string&>();
    for (const NamedFluid& named : named_fluids()) {
      if (named.name == name) return build(named.definition, fmt::format("{} (\"{}\")", path, name), site, warnings);
    }
    // A species name stands for that species as an ideal gas: "CO2".
    if (species_->find(name)) return build(json{{"model", "nasa-polynomial"}, {"species", name}}, path, site, warnings);
    std::vector<std::string> known;
    for (const NamedFluid& named : named_fluids()) known.push_back(named.name);
    refuse(fmt::format("{}: unknown fluid \"{}\"; named fluids are: {}; any species of shaftwork fluids may be named "
                       "too",
                       path, name, fmt::join(known, ", ")));
  }
  if (!fluid.is_object()) {
    refuse(fmt::format("{}: expected a fluid name or an object with a \"model\", got {}", path, fluid.type_name()));
  }
  if (!fluid.contains("model") || !fluid["model"].is_string()) {
    refuse(fmt::format("{}: a fluid object needs \"model\": one of {}", path, detail::model_names()));
  }
  const std::string name = fluid["model"].get<std::string>();
  const detail::ModelEntry* model = detail::find_model(name);
  if (!model) refuse(fmt::format("{}.model: unknown model \"{}\"; models are {}", path, name, detail::model_names()));
  detail::warn_unknown_keys(fluid, model->keys, path + ".", warnings);
  return model->build(detail::BuildContext{fluid, path, *species_, site, warnings});
}

}  // namespace shaftwork::io

#include "shaftwork/io/fluid_factory.hpp"

#include <cmath>
#include <sstream>
#include <string_view>

#include <fmt/format.h>
#include <fmt/ranges.h>

#include "json_keys.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/constant_cp.hpp"
#include "shaftwork/fluids/critical_data.hpp"
#include "shaftwork/fluids/cubic_eos.hpp"
#include "shaftwork/fluids/iapws_if97.hpp"
#include "shaftwork/fluids/incompressible.hpp"
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

double read_number(const json& object, const char* key, units::Dimension d, const std::string& path) {
  units::ParseNotes notes;
  return read_quantity(object.at(key), d, path + "." + key, {}, notes).si;
}

std::shared_ptr<const fluids::FluidModel> make_constant_cp(const json& j, const std::string& path) {
  fluids::ConstantCpInputs in;
  if (j.contains("cp")) in.cp = read_number(j, "cp", units::Dimension::specific_heat, path);
  if (j.contains("cv")) in.cv = read_number(j, "cv", units::Dimension::specific_heat, path);
  if (j.contains("k")) in.k = read_number(j, "k", units::Dimension::fraction, path);
  if (j.contains("R")) in.R = read_number(j, "R", units::Dimension::specific_heat, path);
  if (j.contains("molar_mass")) in.molar_mass = read_number(j, "molar_mass", units::Dimension::molar_mass, path);
  try {
    return std::make_shared<fluids::ConstantCpGas>(in);
  } catch (const Error& e) {
    throw e.with_context(path);
  }
}

// The composition of a gas on NASA species: "species", or "mixture" with "basis".
struct Composition {
  std::vector<fluids::Component> components;
  fluids::CompositionBasis basis = fluids::CompositionBasis::mole;
};

// The basis of a mixture's numbers: "mole" or "mass" (fractions), "mole %" or "mass %"
// (a gas analysis). Returns true for percent.
bool read_basis(const json& j, const std::string& path, fluids::CompositionBasis& basis) {
  if (!j.contains("basis")) return false;
  const json& b = j["basis"];
  if (b == "mole" || b == "mole %") {
    basis = fluids::CompositionBasis::mole;
  } else if (b == "mass" || b == "mass %") {
    basis = fluids::CompositionBasis::mass;
  } else {
    refuse(fmt::format("{}.basis: expected \"mole\", \"mass\", \"mole %\" or \"mass %\", got {}", path, b.dump()));
  }
  return b == "mole %" || b == "mass %";
}

// A gas analysis in percent is scaled to fractions, with a warning when it is more than
// 1 % off 100; fractions that sum to about 100 were meant as percent: the message says so.
void normalise(std::vector<fluids::Component>& components, bool percent, const std::string& path,
               std::vector<std::string>& warnings) {
  double sum = 0;
  for (const auto& c : components) sum += c.fraction;
  if (!percent) {
    if (std::fabs(sum - 100) <= 5) {
      refuse(fmt::format("{}.mixture: the fractions sum to {:.6g}: for a gas analysis in percent, give \"basis\": "
                         "\"mole %\" (or \"mass %\")",
                         path, sum));
    }
    return;
  }
  if (!(sum > 0)) refuse(fmt::format("{}.mixture: the percentages sum to {:.6g}", path, sum));
  if (std::fabs(sum - 100) > 1) {
    warnings.push_back(fmt::format("{}.mixture: the analysis sums to {:.6g} %; normalised to 100 %", path, sum));
  }
  for (auto& c : components) c.fraction /= sum;
}

Composition read_composition(const json& j, const std::string& path, const fluids::SpeciesLibrary& library,
                             const std::string& model, std::vector<std::string>& warnings,
                             const char* forms = "\"species\" or \"mixture\"") {
  auto species_named = [&](const std::string& name, const std::string& where) {
    const fluids::NasaSpecies* sp = library.find(name);
    if (!sp) {
      refuse(fmt::format("{}: unknown species \"{}\" (shaftwork fluids lists the species; a NASA "
                         "9-coefficient file may add more with --species-file)",
                         where, name));
    }
    return sp;
  };
  Composition c;
  if (j.contains("species") == j.contains("mixture")) {
    refuse(fmt::format("{}: a {} fluid needs {}, one of them", path, model, forms));
  }
  if (j.contains("species")) {
    if (!j["species"].is_string()) refuse(fmt::format("{}.species: expected a species name", path));
    c.components.push_back({species_named(j["species"].get<std::string>(), path + ".species"), 1.0});
    return c;
  }
  const json& mix = j["mixture"];
  if (!mix.is_object() || mix.empty()) {
    refuse(fmt::format("{}.mixture: expected an object of species and fractions", path));
  }
  for (const auto& [name, value] : mix.items()) {
    units::ParseNotes notes;
    const double x = read_quantity(value, units::Dimension::fraction, path + ".mixture." + name, {}, notes).si;
    c.components.push_back({species_named(name, path + ".mixture"), x});
  }
  normalise(c.components, read_basis(j, path, c.basis), path, warnings);
  return c;
}

void warn_if_renormalised(bool renormalised, double given_sum, const std::string& path,
                          std::vector<std::string>& warnings) {
  if (renormalised) {
    warnings.push_back(fmt::format("{}.mixture: the fractions add up to {:.6g}; scaled to sum to 1", path, given_sum));
  }
}

std::shared_ptr<const fluids::FluidModel> make_nasa(const json& j, const std::string& path,
                                                    const fluids::SpeciesLibrary& library,
                                                    std::vector<std::string>& warnings) {
  const Composition c = read_composition(j, path, library, "nasa-polynomial", warnings);
  try {
    auto gas = std::make_shared<fluids::NasaPolynomialGas>(c.components, c.basis);
    warn_if_renormalised(gas->renormalised(), gas->given_sum(), path, warnings);
    return gas;
  } catch (const Error& e) {
    throw e.with_context(path);
  }
}

// --- Cubic equations of state: { "model": "peng-robinson" | "soave-redlich-kwong", "species" |
// "mixture" + "basis" | "fluid": a named NASA gas, "critical": {...}, "interaction": {...} }.
// One function, so that it can move into a table of models as it is.

// A named fluid's composition keys, for {"fluid": "natural-gas-example"}.
json named_composition(const json& j, const std::string& path) {
  if (!j["fluid"].is_string()) refuse(fmt::format("{}.fluid: expected the name of a gas in data/fluids.txt", path));
  const std::string name = j["fluid"].get<std::string>();
  for (const NamedFluid& named : named_fluids()) {
    if (named.name != name) continue;
    const json& d = named.definition;
    if (d.value("model", "") != "nasa-polynomial") {
      refuse(fmt::format("{}.fluid: \"{}\" is not a gas of NASA species (its model is {})", path, name,
                         d.value("model", "?")));
    }
    json out = json::object();
    for (const char* key : {"species", "mixture", "basis"}) {
      if (d.contains(key)) out[key] = d[key];
    }
    return out;
  }
  refuse(fmt::format("{}.fluid: unknown fluid \"{}\" (shaftwork fluids lists the named fluids)", path, name));
}

fluids::CubicOverrides read_cubic_overrides(const json& j, const std::string& path,
                                            const fluids::SpeciesLibrary& library, std::vector<std::string>& warnings) {
  fluids::CubicOverrides o;
  if (j.contains("critical")) {
    const json& crit = j["critical"];
    if (!crit.is_object()) refuse(fmt::format("{}.critical: expected an object of species", path));
    for (const auto& [name, value] : crit.items()) {
      const std::string where = path + ".critical." + name;
      const fluids::NasaSpecies* sp = library.find(name);
      if (!sp) refuse(fmt::format("{}: unknown species \"{}\"", where, name));
      if (!value.is_object()) {
        refuse(fmt::format("{}: expected critical_temperature, critical_pressure, acentric_factor", where));
      }
      detail::warn_unknown_keys(value, {"critical_temperature", "critical_pressure", "acentric_factor"}, where + ".",
                                warnings);
      const fluids::CriticalConstants* built = fluids::CriticalData::built_in().find(sp->name);
      fluids::CriticalConstants c = built ? *built : fluids::CriticalConstants{};
      c.source = "given in the case";
      const bool all = value.contains("critical_temperature") && value.contains("critical_pressure") &&
                       value.contains("acentric_factor");
      if (!built && !all) {
        refuse(fmt::format("{}: {} has no built-in critical constants; give all three of critical_temperature, "
                           "critical_pressure and acentric_factor",
                           where, sp->name));
      }
      if (value.contains("critical_temperature")) {
        c.critical_temperature = read_number(value, "critical_temperature", units::Dimension::temperature, where);
      }
      if (value.contains("critical_pressure")) {
        c.critical_pressure = read_number(value, "critical_pressure", units::Dimension::pressure, where);
      }
      if (value.contains("acentric_factor")) {
        if (!value["acentric_factor"].is_number()) refuse(fmt::format("{}.acentric_factor: expected a number", where));
        c.acentric_factor = value["acentric_factor"].get<double>();
      }
      try {
        fluids::check_critical_constants(c, where);
      } catch (const Error& e) {
        refuse(e.what());
      }
      o.critical.emplace_back(sp->name, c);
    }
  }
  if (j.contains("interaction")) {
    const json& inter = j["interaction"];
    if (!inter.is_object()) refuse(fmt::format("{}.interaction: expected an object like {{\"CH4-CO2\": 0.1}}", path));
    for (const auto& [pair, value] : inter.items()) {
      const std::string where = path + ".interaction." + pair;
      // Species names may hold '-' themselves (n-C4H10): take the one split into two known species.
      std::vector<std::pair<std::string, std::string>> splits;
      for (std::size_t dash = pair.find('-'); dash != std::string::npos; dash = pair.find('-', dash + 1)) {
        const fluids::NasaSpecies* a = library.find(pair.substr(0, dash));
        const fluids::NasaSpecies* b = library.find(pair.substr(dash + 1));
        if (a && b) splits.emplace_back(a->name, b->name);
      }
      if (splits.size() != 1) {
        refuse(fmt::format("{}: expected two species joined by '-', like \"CH4-CO2\"", where));
      }
      if (!value.is_number()) refuse(fmt::format("{}: expected k_ij as a number", where));
      const double k = value.get<double>();
      if (!(std::fabs(k) < 1) || splits[0].first == splits[0].second) {
        refuse(fmt::format("{}: k_ij must lie between -1 and 1 for two different species, got {}", where,
                           value.dump()));
      }
      o.interaction.push_back({splits[0].first, splits[0].second, k, true, true, "given in the case"});
    }
  }
  return o;
}

std::shared_ptr<const fluids::FluidModel> make_cubic(const json& fluid, const std::string& path, fluids::CubicKind kind,
                                                     const fluids::SpeciesLibrary& library,
                                                     std::vector<std::string>& warnings) {
  const std::string model = fluids::cubic_model_name(kind);
  detail::warn_unknown_keys(fluid, {"model", "species", "mixture", "basis", "fluid", "critical", "interaction"},
                            path + ".", warnings);
  json j = fluid;
  if (fluid.contains("fluid")) {
    if (fluid.contains("species") || fluid.contains("mixture")) {
      refuse(fmt::format("{}: give \"fluid\", or \"species\" or \"mixture\", not both", path));
    }
    j.update(named_composition(fluid, path));
  }
  const Composition c = read_composition(j, path, library, model, warnings, "\"species\", \"mixture\" or \"fluid\"");
  const fluids::CubicOverrides overrides = read_cubic_overrides(fluid, path, library, warnings);
  try {
    auto gas = std::make_shared<fluids::CubicGas>(kind, c.components, c.basis, overrides);
    warn_if_renormalised(gas->renormalised(), gas->given_sum(), path, warnings);
    return gas;
  } catch (const Error& e) {
    throw e.with_context(path);
  }
}

}  // namespace

const std::vector<NamedFluid>& named_fluids() {
  static const std::vector<NamedFluid> fluids = parse_named_fluids(fluids::embedded_data("fluids.txt"));
  return fluids;
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
                                                             std::vector<std::string>& warnings) {
  std::string key = fluid.dump();
  const std::lock_guard lock(mutex_);
  if (auto it = cache_.find(key); it != cache_.end()) {
    warnings.insert(warnings.end(), it->second.warnings.begin(), it->second.warnings.end());
    return it->second.model;
  }
  std::vector<std::string> own;
  auto model = build(fluid, path, own);
  warnings.insert(warnings.end(), own.begin(), own.end());
  cache_.emplace(std::move(key), Built{model, std::move(own)});
  return model;
}

std::shared_ptr<const fluids::FluidModel> FluidFactory::build(const json& fluid, const std::string& path,
                                                              std::vector<std::string>& warnings) {
  if (fluid.is_string()) {
    const std::string& name = fluid.get_ref<const std::string&>();
    for (const NamedFluid& named : named_fluids()) {
      if (named.name == name) return build(named.definition, fmt::format("{} (\"{}\")", path, name), warnings);
    }
    // A species name stands for that species as an ideal gas: "CO2".
    if (species_->find(name)) return build(json{{"model", "nasa-polynomial"}, {"species", name}}, path, warnings);
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
    refuse(fmt::format("{}: a fluid object needs \"model\": one of constant-cp, nasa-polynomial, "
                       "peng-robinson, soave-redlich-kwong, iapws-if97, incompressible",
                       path));
  }
  const std::string model = fluid["model"].get<std::string>();
  if (model == "constant-cp") {
    detail::warn_unknown_keys(fluid, {"model", "cp", "cv", "k", "R", "molar_mass"}, path + ".", warnings);
    return make_constant_cp(fluid, path);
  }
  if (model == "nasa-polynomial") {
    detail::warn_unknown_keys(fluid, {"model", "species", "mixture", "basis"}, path + ".", warnings);
    return make_nasa(fluid, path, *species_, warnings);
  }
  if (model == "peng-robinson" || model == "soave-redlich-kwong") {
    const auto kind =
        model == "peng-robinson" ? fluids::CubicKind::peng_robinson : fluids::CubicKind::soave_redlich_kwong;
    return make_cubic(fluid, path, kind, *species_, warnings);
  }
  if (model == "iapws-if97") {
    detail::warn_unknown_keys(fluid, {"model"}, path + ".", warnings);
    static const auto water = std::make_shared<const fluids::IapwsIf97>();
    return water;
  }
  if (model == "incompressible") {
    detail::warn_unknown_keys(fluid, {"model", "density", "cp"}, path + ".", warnings);
    if (!fluid.contains("density") || !fluid.contains("cp")) {
      refuse(fmt::format("{}: an incompressible fluid needs \"density\" and \"cp\"", path));
    }
    const double rho = read_number(fluid, "density", units::Dimension::density, path);
    const double cp = read_number(fluid, "cp", units::Dimension::specific_heat, path);
    try {
      return std::make_shared<fluids::IncompressibleLiquid>(rho, cp);
    } catch (const Error& e) {
      throw e.with_context(path);
    }
  }
  refuse(fmt::format("{}.model: unknown model \"{}\"; models are constant-cp, nasa-polynomial, "
                     "peng-robinson, soave-redlich-kwong, iapws-if97, incompressible",
                     path, model));
}

}  // namespace shaftwork::io

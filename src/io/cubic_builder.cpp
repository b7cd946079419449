// The cubic equations of state as case files write them: { "model": "peng-robinson" |
// "soave-redlich-kwong", "species" | "mixture" + "basis" | "fluid": a named NASA gas,
// "critical": {...}, "interaction": {...} }.
#include <cmath>

#include <fmt/format.h>

#include "fluid_builders.hpp"
#include "json_keys.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/critical_data.hpp"
#include "shaftwork/fluids/cubic_eos.hpp"

namespace shaftwork::io::detail {
namespace {

using nlohmann::json;

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

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
      static constexpr std::string_view kKeys[] = {"critical_temperature", "critical_pressure", "acentric_factor"};
      warn_unknown_keys(value, kKeys, where + ".",
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

std::shared_ptr<const fluids::FluidModel> make_cubic(const BuildContext& context, fluids::CubicKind kind) {
  const json& fluid = context.fluid;
  const std::string& path = context.path;
  const fluids::SpeciesLibrary& library = context.species;
  std::vector<std::string>& warnings = context.warnings;
  const std::string model = fluids::cubic_model_name(kind);
  json j = fluid;
  if (fluid.contains("fluid")) {
    if (fluid.contains("species") || fluid.contains("mixture")) {
      refuse(fmt::format("{}: give \"fluid\", or \"species\" or \"mixture\", not both", path));
    }
    if (!fluid["fluid"].is_string()) {
      refuse(fmt::format("{}.fluid: expected the name of a gas in data/fluids.txt", path));
    }
    j.update(named_gas_composition(fluid["fluid"].get<std::string>(), path + ".fluid"));
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

std::shared_ptr<const fluids::FluidModel> make_peng_robinson(const BuildContext& c) {
  return make_cubic(c, fluids::CubicKind::peng_robinson);
}

std::shared_ptr<const fluids::FluidModel> make_soave_redlich_kwong(const BuildContext& c) {
  return make_cubic(c, fluids::CubicKind::soave_redlich_kwong);
}

}  // namespace shaftwork::io::detail

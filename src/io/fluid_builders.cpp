// The fluid models and their builders: one row of the table per model.
#include "fluid_builders.hpp"

#include <algorithm>
#include <cmath>
#include <string>

#include <fmt/format.h>

#include "json_keys.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/fluids/constant_cp.hpp"
#include "shaftwork/fluids/humid_air_gas.hpp"
#include "shaftwork/fluids/iapws_if97.hpp"
#include "shaftwork/fluids/incompressible.hpp"
#include "shaftwork/io/json_quantity.hpp"

namespace shaftwork::io::detail {
namespace {

using nlohmann::json;

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

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

}  // namespace

Composition read_composition(const json& j, const std::string& path, const fluids::SpeciesLibrary& library,
                             const std::string& model, std::vector<std::string>& warnings, const char* forms) {
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

double read_number(const json& object, const char* key, units::Dimension d, const std::string& path) {
  units::ParseNotes notes;
  return read_quantity(object.at(key), d, path + "." + key, {}, notes).si;
}

json named_gas_composition(const std::string& name, const std::string& path) {
  for (const NamedFluid& named : named_fluids()) {
    if (named.name != name) continue;
    const json& d = named.definition;
    if (d.value("model", "") != "nasa-polynomial") {
      refuse(fmt::format("{}: \"{}\" is not a gas of NASA species (its model is {})", path, name, d.value("model", "?")));
    }
    json out = json::object();
    for (const char* key : {"species", "mixture", "basis"}) {
      if (d.contains(key)) out[key] = d[key];
    }
    return out;
  }
  refuse(fmt::format("{}: unknown fluid \"{}\" (shaftwork fluids lists the named fluids)", path, name));
}

namespace {

std::shared_ptr<const fluids::FluidModel> make_constant_cp(const BuildContext& c) {
  const json& j = c.fluid;
  const std::string& path = c.path;
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

std::shared_ptr<const fluids::FluidModel> make_nasa(const BuildContext& c) {
  const Composition comp = read_composition(c.fluid, c.path, c.species, "nasa-polynomial", c.warnings);
  try {
    auto gas = std::make_shared<fluids::NasaPolynomialGas>(comp.components, comp.basis);
    warn_if_renormalised(gas->renormalised(), gas->given_sum(), c.path, c.warnings);
    return gas;
  } catch (const Error& e) {
    throw e.with_context(c.path);
  }
}

std::shared_ptr<const fluids::FluidModel> make_if97(const BuildContext&) {
  static const auto water = std::make_shared<const fluids::IapwsIf97>();
  return water;
}

std::shared_ptr<const fluids::FluidModel> make_incompressible(const BuildContext& c) {
  if (!c.fluid.contains("density") || !c.fluid.contains("cp")) {
    refuse(fmt::format("{}: an incompressible fluid needs \"density\" and \"cp\"", c.path));
  }
  const double rho = read_number(c.fluid, "density", units::Dimension::density, c.path);
  const double cp = read_number(c.fluid, "cp", units::Dimension::specific_heat, c.path);
  try {
    return std::make_shared<fluids::IncompressibleLiquid>(rho, cp);
  } catch (const Error& e) {
    throw e.with_context(c.path);
  }
}

// Moist air: the dry air of the named fluid "air" with water vapour, at a relative
// humidity of the case's inlet state or at a humidity ratio.
std::shared_ptr<const fluids::FluidModel> make_humid_air(const BuildContext& c) {
  const bool rh = c.fluid.contains("relative_humidity");
  if (rh == c.fluid.contains("humidity_ratio")) {
    refuse(fmt::format("{}: humid-air needs \"relative_humidity\" (at the inlet state) or \"humidity_ratio\" "
                       "(kg water per kg dry air), one of them",
                       c.path));
  }
  json air = named_gas_composition("air", c.path);
  std::vector<std::string> ignored;
  const fluids::HumidAir humid(read_composition(air, c.path, c.species, "humid-air", ignored).components, c.species);
  const bool inlet_known = c.site.pressure && c.site.temperature;
  if (rh && !inlet_known) {
    refuse(fmt::format("{}: a relative humidity is taken at the inlet state: give inlet.pressure and "
                       "inlet.temperature, or a \"humidity_ratio\" instead",
                       c.path));
  }
  try {
    const double value = read_number(c.fluid, rh ? "relative_humidity" : "humidity_ratio",
                                     units::Dimension::fraction, c.path);
    if (!inlet_known) {  // a batch template: each row brings its inlet; the rating warns below the dew point
      if (!(std::isfinite(value) && value >= 0)) {
        refuse(fmt::format("humidity ratio must be a finite number of 0 or more kg water per kg dry gas, got {:.6g}",
                           value));
      }
      return std::make_shared<fluids::HumidAirGas>(humid, value);
    }
    const fluids::MoistAirState state = rh ? humid.at_relative_humidity(*c.site.pressure, *c.site.temperature, value)
                                           : humid.at_humidity_ratio(*c.site.pressure, *c.site.temperature, value);
    return std::make_shared<fluids::HumidAirGas>(humid, state);
  } catch (const Error& e) {
    throw e.with_context(c.path);
  }
}

constexpr std::string_view kConstantCpKeys[] = {"model", "cp", "cv", "k", "R", "molar_mass"};
constexpr std::string_view kNasaKeys[] = {"model", "species", "mixture", "basis"};
constexpr std::string_view kCubicKeys[] = {"model", "species", "mixture", "basis", "fluid", "critical", "interaction"};
constexpr std::string_view kIf97Keys[] = {"model"};
constexpr std::string_view kIncompressibleKeys[] = {"model", "density", "cp"};
constexpr std::string_view kHumidAirKeys[] = {"model", "relative_humidity", "humidity_ratio"};

constexpr ModelEntry kModels[] = {
    {"constant-cp", kConstantCpKeys, make_constant_cp, "ideal gas of constant cp, from two of cp, cv, k, R, molar_mass"},
    {"nasa-polynomial", kNasaKeys, make_nasa, "ideal gas on NASA polynomials: a species or a mixture"},
    {"peng-robinson", kCubicKeys, make_peng_robinson,
     "real gas: Peng-Robinson (1976; 1978 alpha for omega > 0.491) on the NASA ideal-gas part"},
    {"soave-redlich-kwong", kCubicKeys, make_soave_redlich_kwong,
     "real gas: Soave-Redlich-Kwong (1972) on the NASA ideal-gas part"},
    {"iapws-if97", kIf97Keys, make_if97, "water and steam, IAPWS-IF97"},
    {"incompressible", kIncompressibleKeys, make_incompressible, "liquid of constant density and cp"},
    {"humid-air", kHumidAirKeys, make_humid_air,
     "moist air: dry air and water vapour, the water content at the inlet state"},
};

}  // namespace

std::span<const ModelEntry> models() { return kModels; }

const ModelEntry* find_model(std::string_view name) {
  for (const ModelEntry& m : kModels) {
    if (m.name == name) return &m;
  }
  return nullptr;
}

std::string model_names() {
  std::string out;
  for (const ModelEntry& m : kModels) out += fmt::format("{}{}", out.empty() ? "" : ", ", m.name);
  return out;
}

}  // namespace shaftwork::io::detail

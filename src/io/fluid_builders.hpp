// The fluid models a case may name, one row each: the model's name as case files write
// it, the keys its object takes, and the function that builds it. Internal to the io
// layer (fluid_factory.cpp dispatches by the table; `shaftwork fluids` lists it).
#pragma once

#include <memory>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/fluids/fluid_model.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"
#include "shaftwork/io/fluid_factory.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::io::detail {

// What a builder reads from: the fluid object, its JSON path for messages, the species,
// the state a humidity is given at, and where its warnings go.
struct BuildContext {
  const nlohmann::json& fluid;
  const std::string& path;
  const fluids::SpeciesLibrary& species;
  const FluidSite& site;
  std::vector<std::string>& warnings;
};

using Builder = std::shared_ptr<const fluids::FluidModel> (*)(const BuildContext&);

struct ModelEntry {
  std::string_view name;
  std::span<const std::string_view> keys;  // the keys of its object, "model" included
  Builder build;
  std::string_view summary;                // one line for `shaftwork fluids`
};

// Every model, in the order listings show them.
std::span<const ModelEntry> models();
// The row of a model name, or nullptr.
const ModelEntry* find_model(std::string_view name);
// "constant-cp, nasa-polynomial, ...", for messages.
std::string model_names();

// Builders of the cubic equations of state (cubic_builder.cpp).
std::shared_ptr<const fluids::FluidModel> make_peng_robinson(const BuildContext& c);
std::shared_ptr<const fluids::FluidModel> make_soave_redlich_kwong(const BuildContext& c);

// The composition of a gas on NASA species: "species", or "mixture" with "basis" (mole,
// mass, mole %, mass %: a gas analysis in percent is normalised).
struct Composition {
  std::vector<fluids::Component> components;
  fluids::CompositionBasis basis = fluids::CompositionBasis::mole;
};
Composition read_composition(const nlohmann::json& j, const std::string& path, const fluids::SpeciesLibrary& library,
                             const std::string& model, std::vector<std::string>& warnings,
                             const char* forms = "\"species\" or \"mixture\"");
void warn_if_renormalised(bool renormalised, double given_sum, const std::string& path,
                          std::vector<std::string>& warnings);
// The composition keys ("species", "mixture", "basis") of a named gas of NASA species
// in data/fluids.txt; `path` names it in messages.
nlohmann::json named_gas_composition(const std::string& name, const std::string& path);
// A number (SI) or "<number> <unit>" at object[key].
double read_number(const nlohmann::json& object, const char* key, units::Dimension d, const std::string& path);

}  // namespace shaftwork::io::detail

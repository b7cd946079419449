// shaftwork/io/fluid_factory.hpp — fluid models from names and JSON fluid objects.
//
// A fluid is a name from data/fluids.txt ("air", "water", ...) or an object
// { "model": ..., ... } as the contract describes (src/io/fluid_builders.cpp holds the
// table of models). Models are immutable; the factory hands out one shared
// model per distinct definition, so a batch of a million cases builds air once.
#pragma once

#include <map>
#include <memory>
#include <mutex>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/fluids/fluid_model.hpp"
#include "shaftwork/fluids/nasa_polynomial.hpp"

namespace shaftwork::io {

struct NamedFluid {
  std::string name;
  nlohmann::json definition;  // the fluid object the name stands for
  std::string note;           // the comment lines just above it in data/fluids.txt
};

// A model a fluid object may name: its name, the keys of its object and one line on it.
struct FluidModelInfo {
  std::string name;
  std::vector<std::string> keys;  // "model" first
  std::string summary;
};
// Every model, in the order listings show them.
std::vector<FluidModelInfo> fluid_models();

// The named fluids of data/fluids.txt, in file order. Throws bad_input if the
// embedded file is malformed (a build defect, caught by the tests).
const std::vector<NamedFluid>& named_fluids();

// The state a model that depends on it is made at: humid air at a relative humidity takes
// its water content at the case's inlet pressure [Pa] and temperature [K].
struct FluidSite {
  std::optional<double> pressure;
  std::optional<double> temperature;
};

class FluidFactory {
 public:
  FluidFactory();

  // Adds species from a file in the published NASA 9-coefficient format, the older
  // 7-coefficient format, or the project's own format (told apart by their first
  // record); they replace built-in species of the same name. Throws bad_input
  // naming the file and line.
  void add_species_file(const std::string& path);

  // The model for a fluid name or object. `path` is the JSON path for messages
  // ("fluid"); warnings (renormalised fractions) are appended to `warnings`.
  std::shared_ptr<const fluids::FluidModel> make(const nlohmann::json& fluid, const std::string& path,
                                                 std::vector<std::string>& warnings, const FluidSite& site = {});

  // A short label for results: the name of a named fluid or species, else the model's
  // own description (an inline mixture lists its species and mole fractions).
  static std::string label(const nlohmann::json& fluid, const fluids::FluidModel& model);

  const fluids::SpeciesLibrary& species() const { return *species_; }

 private:
  std::shared_ptr<const fluids::FluidModel> build(const nlohmann::json& fluid, const std::string& path,
                                                  const FluidSite& site, std::vector<std::string>& warnings);

  std::shared_ptr<fluids::SpeciesLibrary> species_;
  struct Built {
    std::shared_ptr<const fluids::FluidModel> model;
    std::vector<std::string> warnings;
  };
  std::mutex mutex_;                    // guards cache_: cases may be read on several threads
  std::map<std::string, Built> cache_;  // by the definition's JSON text
};

}  // namespace shaftwork::io

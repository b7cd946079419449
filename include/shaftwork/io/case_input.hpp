// shaftwork/io/case_input.hpp — one case as the user gave it, before rating.
//
// A case is its machine, its fluid and a list of given values, one per row of
// machines::kInputs that the case file (or a CSV row) names. Each value keeps the text the
// user wrote, so that results echo it in the user's unit and digits, and whether it was
// read against the site barometer (a gauge or vacuum pressure), so that the barometer can
// be varied on its own (the uncertainty of a gauge reading and of the barometer are
// separate inputs). to_rating_input() hands the values to the solver.
#pragma once

#include <memory>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "shaftwork/fluids/fluid_model.hpp"
#include "shaftwork/machines/inputs.hpp"

namespace shaftwork::io {

// The keys of a case that are not values (machines::kInputs holds those).
inline constexpr std::string_view kIdKey = "id";
inline constexpr std::string_view kMachineKey = "machine";
inline constexpr std::string_view kFluidKey = "fluid";
inline constexpr std::string_view kNoteKey = "note";
// A case's own guarantee (io/guarantee_reader.hpp); at the top of a file, the file's.
inline constexpr std::string_view kGuaranteeKey = "guarantee";

struct GivenValue {
  machines::Input input;
  double si = 0;              // SI, absolute (a gauge reading has the barometer added)
  bool on_barometer = false;  // read against the site barometer: moves with it, one for one
  std::string written;        // as the user wrote it: "2.10 barg", "0.82", "101325 Pa"
  std::string unit;           // the unit symbol written ("barg"), "" for a plain SI number
};

struct CaseInput {
  std::string id;
  std::string origin;  // the file the case came from ("" when not from a file)
  machines::MachineKind machine = machines::MachineKind::compressor;
  std::string machine_written;  // the word the user wrote: "fan" for a compressor
  std::shared_ptr<const fluids::FluidModel> fluid;
  std::string fluid_label;  // the fluid's name, or a short readable description
  std::vector<GivenValue> given;  // in the order of machines::kInputs
  std::vector<std::string> warnings;

  // The given value of `input`, or nullptr.
  const GivenValue* find(machines::Input input) const;
  // The site barometer [Pa]: given, or one standard atmosphere.
  double barometer() const;
  // The unit the user wrote for some given value of dimension `d` ("" if none): results
  // of that dimension are shown in it.
  std::string unit_used_for(units::Dimension d) const;
};

// The solver's input: the given values in their fields, and messages that echo values
// in the units the user wrote.
machines::RatingInput to_rating_input(const CaseInput& c);

// Writes an SI value of one of the seven quantities for messages: in the unit the user
// wrote that quantity in, or kPa, K, kg/s, kW; gauge units against `barometer` [Pa].
std::string echo_value(const CaseInput& c, machines::Quantity q, double si);

}  // namespace shaftwork::io

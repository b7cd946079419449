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
inline constexpr std::string_view kUncertaintyKey = "uncertainty";
// The expected results of `shaftwork check` (io/expectations.hpp reads them; rating ignores them).
inline constexpr std::string_view kExpectKey = "expect";
// A case's own guarantee (io/guarantee_reader.hpp); at the top of a file, the file's.
inline constexpr std::string_view kGuaranteeKey = "guarantee";

// A stated expanded uncertainty (k = 2, about 95 %) of a given value, as on an instrument
// datasheet: a percent of the reading ("0.25 %") or a difference in the value's own
// dimension ("0.3 K", "0.5 degF"). docs/uncertainty.md describes the forms.
struct StatedUncertainty {
  machines::Input input;
  bool relative = false;  // a fraction of the reading as written (0.0025 for "0.25 %")
  double value = 0;       // that fraction, or the difference in SI (0.3 for "0.3 K"); >= 0
  std::string written;    // as stated: "0.25 %", "0.3 K"
};

struct GivenValue {
  machines::Input input;
  double si = 0;              // SI, absolute (a gauge reading has the barometer added)
  bool on_barometer = false;  // read against the site barometer: moves with it, one for one
  std::string written;        // as the user wrote it: "2.10 barg", "0.82", "101325 Pa"
  std::string unit;           // the unit symbol written ("barg"), "" for a plain SI number
  // Its own, or one stated by key for the case (or file, or batch template); empty: none.
  std::optional<StatedUncertainty> uncertainty = {};
};

struct CaseInput {
  std::string id;
  std::string origin;  // the file the case came from ("" when not from a file)
  machines::MachineKind machine = machines::MachineKind::compressor;
  std::string machine_written;  // the word the user wrote: "fan" for a compressor
  std::shared_ptr<const fluids::FluidModel> fluid;
  std::string fluid_label;  // the fluid's name, or a short readable description
  std::vector<GivenValue> given;  // in the order of machines::kInputs
  std::string standard_reference;  // a standard volume flow's reference, in words ("" without one)
  std::vector<std::string> warnings;
  // The case's "uncertainty" object by dotted key: the statements the case made for its
  // given values (a batch template's also cover the columns' values).
  std::vector<StatedUncertainty> uncertainty_by_key;

  // The given value of `input`, or nullptr.
  const GivenValue* find(machines::Input input) const;
  // The site barometer [Pa]: given, or one standard atmosphere.
  double barometer() const;
  // What other values are read against: the barometer (when given) and the site's
  // standard conditions (when given).
  units::ParseContext context() const;
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

// shaftwork/io/result_keys.hpp — the one table of what a result holds.
//
// Each row is one number of a rated case: its dotted result key (the JSON path:
// "outlet.temperature" is the key "temperature" of the object "outlet"), its dimension,
// how it is read off a machines::Rating, which of the seven quantities it reports (so the
// table can mark it given or solved), how a table shows it, and whether batches write it
// by default. The JSON, table and CSV writers, the batch columns, --columns and the
// expectations of `shaftwork check` all take their keys from here; a new result is one
// row (and the code that computes it).
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "shaftwork/machines/rating.hpp"
#include "shaftwork/units/quantity.hpp"

namespace shaftwork::io {

// How a table writes a value: significant digits, or decimals (temperatures).
struct Precision {
  enum class Kind { significant, decimals } kind = Kind::significant;
  int digits = 5;
};

// Where a row stands in a table.
enum class Section {
  state,      // the inlet and outlet states: shown with the seven quantities
  size,       // flow and power: shown with the seven
  efficiency, // the two efficiencies: shown with the seven
  derived,    // everything else the rating gives
  hidden,     // in JSON and CSV only (reference-state enthalpies and entropies)
};

// Which cases have a value for a row (batches choose their default columns by it).
enum class Applies {
  always,
  two_phase,  // fluids with a liquid and a vapour phase: qualities
  pump,       // pumps: head as a height, hydraulic power
  speed,      // cases that give the shaft speed
  impeller,   // compressors that give the speed and the impeller: tip speed, flow coefficient, Mach number
  real_gas,   // real-gas models: compressibility, the Schultz method
};

// What a row needs computed beyond the end states, the isentropic efficiency and the size
// (machines::RatingOptions): a batch whose columns need no polytropic row skips that path.
enum class Needs {
  states,
  polytropic,  // the polytropic path (and the Schultz method of real gases)
};

struct ResultKey {
  std::string_view key;
  units::Dimension dimension;
  std::optional<double> (*value)(const machines::Rating&);  // empty where it does not apply
  std::optional<machines::Quantity> reports;  // of the seven: marked given or solved
  std::string_view label;                      // for tables
  Precision precision;
  Section section;
  bool in_batch;  // a default column of a batch's CSV (docs/batch.md says why some are not)
  Applies applies = Applies::always;
  // Shown in a pump's table. A pump engineer reads head as a height, the hydraulic power and
  // the pump efficiency; polytropic values, heads in energy per mass, the pressure ratio and
  // the isentropic outlet are a gas machine's (JSON and CSV keep them for every machine).
  bool pump_table = true;
  Needs needs = Needs::states;
};

// Every row, in output order (the JSON objects follow it).
const std::vector<ResultKey>& result_keys();
// The position of a row in result_keys().
std::size_t row_of(const ResultKey& k);

// The numbers of one result by row of result_keys(), each as result_json writes it
// (rounded_for_output), empty where the row does not apply. A non-finite value is kept
// as it is (result_json turns the case into an error naming it).
using ResultNumbers = std::vector<std::optional<double>>;
ResultNumbers result_numbers(const machines::Rating& rating);
// The options of a rating whose results are read only through `keys`: the polytropic path
// only when one of them needs it.
machines::RatingOptions rating_options_for(const std::vector<const ResultKey*>& keys);
// The row of a dotted key, or nullptr.
const ResultKey* find_result_key(std::string_view key);
// Every key, comma-separated, for messages.
std::string result_key_list();
// The message for a key that is none: "\"efficiency.isentropc\" is no result key; did you
// mean efficiency.isentropic?", or with no key near it "...; the keys are: " and the list.
std::string no_result_key(std::string_view key);

}  // namespace shaftwork::io

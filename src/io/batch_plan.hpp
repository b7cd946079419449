// The plan of a batch, made once from the CSV header: which case value each column sets
// and in which unit, which columns are carried through, and which result columns are
// written. Internal to the io layer (batch.cpp, batch_rows.cpp).
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "shaftwork/io/batch.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/result_keys.hpp"
#include "shaftwork/machines/inputs.hpp"

namespace shaftwork::io {

// A column that sets a case value: SI = scale * cell + offset (+ the row's barometer
// when gauge), times `factor` into the rating input's unit (g for a head as a height).
struct InputColumn {
  std::size_t index = 0;  // field index in a row
  std::string header;     // as written, for messages
  machines::Input input = machines::Input::inlet_pressure;
  units::Dimension dimension = units::Dimension::fraction;  // of the cell
  std::string unit;  // as written in the brackets, "" for none
  double scale = 1, offset = 0, factor = 1;
  bool gauge = false;
  bool vacuum = false;  // a reading below the barometer (inHgV): never negative
  // Where the SI value goes (nullptr: the barometer), and the values that need no further
  // check (plainly_acceptable_range): a cell's common case at a glance.
  std::optional<double> machines::RatingInput::*field = nullptr;
  PlainRange plain;
};

// A column that states the uncertainty of a case value, "uncertainty.outlet.temperature [K]":
// U = scale * cell (SI, a difference), or with "[%]" cell / 100 of the row's reading.
struct UncertaintyColumn {
  std::size_t index = 0;
  std::string header;
  machines::Input input = machines::Input::inlet_pressure;
  bool relative = false;
  double scale = 1;  // SI per unit of the cell (g for a head in m)
};

// A result column: display = (SI - offset) / scale.
struct OutputColumn {
  const ResultKey* key = nullptr;
  double scale = 1, offset = 0;
};

struct Plan {
  std::vector<std::string> header;   // the input header fields, as read
  std::vector<InputColumn> inputs;   // in the order cells are applied: the barometer first
  std::optional<std::size_t> id_index;
  std::optional<std::size_t> time_index;  // the column BatchPoint::time is read from
  bool has_barometer_column = false;
  std::vector<OutputColumn> outputs;
  machines::RatingOptions rating;    // what the rows' ratings compute: what the outputs need
  std::vector<UncertaintyColumn> uncertainty_columns;
  // The batch states uncertainties (columns or template): "uncertainty.<key> [unit]"
  // columns follow the result columns.
  bool uncertainty = false;
  bool solved_for_column = true;     // the default columns only
  std::optional<GuaranteeColumns> guarantee;  // the verdict columns, when the template has a guarantee
  std::string output_header;         // the whole csv header line, with its line end
  std::vector<std::string> notices;  // one per carried column
};

// Throws bad_input naming the input, line and column for an unusable header cell.
Plan make_plan(std::vector<std::string> header, std::size_t header_line, const std::string& points_name,
               const BatchTemplate& templ, const BatchOptions& options);

}  // namespace shaftwork::io

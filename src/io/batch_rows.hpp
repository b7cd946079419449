// Rating the rows of a batch: each row's cells set the columns' case values on a copy of
// the template's input, one machines::rate, and the row's output text. Internal to the io
// layer.
#pragma once

#include <array>
#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "batch_plan.hpp"
#include "output_buffer.hpp"
#include "shaftwork/io/csv_reader.hpp"
#include "shaftwork/io/uncertainty.hpp"

namespace shaftwork::io {

// What a chunk's rows came to.
struct RowCounts {
  std::size_t rows = 0;
  std::size_t failed = 0;                 // written as errors
  std::size_t guarantees_failed = 0;      // rated, and the template's guarantee not met
  std::size_t guarantees_not_judged = 0;  // rated, and the guarantee could not be judged
};

// A value of the rows that may carry an uncertainty: from its uncertainty column, or where
// that is absent or its cell empty, from the template's statement for its key.
struct UncertainValue {
  machines::Input input = machines::Input::inlet_pressure;
  const UncertaintyColumn* column = nullptr;
  std::optional<StatedUncertainty> statement;
  bool from_row = true;         // the value is a column's; else the template's
  double template_reading = 0;  // the template value's reading_magnitude, when !from_row
};

// What every row shares, read-only.
struct BatchShared {
  BatchShared(const Plan& plan, const BatchTemplate& templ, const BatchOptions& options,
              const std::string& points_name);

  const Plan& plan;
  const BatchTemplate& templ;
  const BatchOptions& options;
  std::string points_name;
  machines::RatingInput base;  // the template with the columns' quantities cleared
  // The template's values read against its barometer, re-read against a row's barometer.
  std::vector<machines::Input> template_gauge_inputs;
  std::string standard_reference;     // of a standard volume flow column, in words
  std::vector<std::string> warnings;  // of every rated row (the template's, the barometer's)
  std::string warnings_joined;        // the same joined by "; ", for csv
  std::vector<UncertainValue> uncertain;     // empty when the batch states no uncertainty
  UncertaintySources barometer_moves;        // no uncertainties yet; the readings that move with the barometer
};

// Rates the rows of chunks; one per worker thread, since it keeps a RatingInput that each
// row overwrites in the columns' fields.
class RowRater {
 public:
  explicit RowRater(const BatchShared& shared);

  // Rates every record of `chunk`, appending the output to `out`.
  // With BatchOptions::points set, each row's BatchPoint goes to `points` too (its row
  // counted within the chunk).
  void rate_chunk(CsvChunk& chunk, OutputBuffer& out, RowCounts& counts, std::vector<BatchPoint>& points);

 private:
  bool rate_record(OutputBuffer& out, RowCounts& counts);
  void judge_guarantee(std::size_t line, RowCounts& counts);
  BatchPoint point_of(bool rated, std::size_t row) const;
  bool apply_cells(std::size_t line);
  bool apply_plain(const InputColumn& c, std::string_view cell);
  double in_unit_si(const InputColumn& c, double x) const;
  void set_value(const InputColumn& c, double x, double si);
  bool apply(const InputColumn& c, std::string_view raw, std::size_t line);
  void refuse_cell(const InputColumn& c, std::string_view cell, std::string_view problem, std::size_t line);
  bool apply_uncertainties(std::size_t line);
  std::string value_problem(const InputColumn& c, std::string_view cell, double x, double in_unit_si,
                            double si) const;
  std::string domain_problem(const InputColumn& c, std::string_view cell) const;
  void write_csv_row(OutputBuffer& out, bool rated);
  void write_jsonl(OutputBuffer& out, bool rated, std::size_t line);
  void write_uncertainty_cells(OutputBuffer& out);
  void append_warnings(OutputBuffer& out, bool rated);

  const BatchShared& shared_;
  const Plan& plan_;
  machines::RatingInput input_;
  CsvRecord record_;
  machines::Rating rating_;
  std::string_view id_;  // the id cell of the row being rated
  machines::SolvedFor solved_for_;  // of the previous rated row, and as text
  std::string solved_for_text_;
  std::string error_;
  std::optional<machines::GuaranteeResult> guarantee_;  // the row's verdict on the template's guarantee
  std::string guarantee_error_;
  bool cell_error_ = false;  // the row failed before rating: no warnings, as for a case that cannot be read
  double barometer_ = units::kStandardAtmosphere;
  // The row's readings as SI differences (|cell| x scale), by machines::Input: what a
  // percent-of-reading uncertainty is a percent of.
  std::array<double, machines::kInputCount> readings_{};
  UncertaintySources sources_;
  UncertaintyPropagator propagator_;
  UncertaintyResult uncertainty_;
  bool rated_uncertainty_ = false;  // uncertainty_ is this row's
};

}  // namespace shaftwork::io

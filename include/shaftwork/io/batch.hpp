// shaftwork/io/batch.hpp — rate a CSV file of test points against a template case.
//
// The template (one case read by read_case) gives what every row shares: machine,
// fluid, site, and any quantity the CSV does not give. Each CSV column names a case
// key in dotted form with its unit in brackets ("outlet.temperature [degC]"); a row's
// values override the template's. docs/batch.md describes the format for users.
//
// The work streams: the input is cut into chunks of whole records, worker threads
// parse, rate and format chunks, and the results are written in input order, so
// memory holds a few chunks whatever the length of the input. A row that cannot be
// read or rated becomes an error row in its place; the others are rated all the same.
#pragma once

#include <cstddef>
#include <limits>
#include <optional>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "shaftwork/io/byte_stream.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::io {

enum class BatchFormat {
  csv,    // the input columns, then status, error, solved_for, result columns, warnings
  jsonl,  // one result object per line, as result_json writes it
  xlsx,   // the csv's rows as a workbook: a row of keys, a row of units, numbers as numbers
};

// The few numbers of one row that a batch chart draws; NaN where the row has none.
struct BatchPoint {
  static constexpr double kNone = std::numeric_limits<double>::quiet_NaN();
  std::size_t row = 0;  // 1 for the first data row
  double time = kNone;  // the row's timestamp (io/timestamp.hpp), in seconds
  bool rated = false;
  double efficiency_isentropic = kNone, efficiency_polytropic = kNone;
  // Their expanded uncertainties, where the batch states uncertainties (docs/uncertainty.md).
  double uncertainty_isentropic = kNone, uncertainty_polytropic = kNone;
  double balance_percent = kNone;  // power_balance.difference_percent
};

// Hears of every row as the batch writes it: in row order, on the thread that called
// rate_batch, so it may keep what it likes (a chart keeps a bounded summary).
class BatchPointSink {
 public:
  virtual ~BatchPointSink() = default;
  // Once, before the first row: the header of the column the times come from, "" for none.
  virtual void time_column(const std::string& header) = 0;
  virtual void add(const BatchPoint& point) = 0;
};

struct BatchOptions {
  BatchFormat format = BatchFormat::csv;
  UnitSystem units = UnitSystem::si;  // of the csv result columns
  unsigned jobs = 1;                  // worker threads; 1 rates on the calling thread
  std::size_t chunk_bytes = 256 * 1024;  // the largest chunk; slow rows get smaller ones
  // The result columns of the csv, by dotted result key (--columns); empty: the defaults.
  std::vector<std::string> columns;
  // Told each row's BatchPoint when set. The times come from the first carried column
  // headed timestamp, time, date or datetime (in any case), else from the id column.
  BatchPointSink* points = nullptr;
};

// Told how far the batch has got, from the thread that called rate_batch, after each
// chunk is written.
class BatchProgress {
 public:
  virtual ~BatchProgress() = default;
  // `bytes_total` is 0 when the size of the input is not known (a pipe).
  virtual void update(std::size_t rows, std::size_t bytes_read, std::size_t bytes_total) = 0;
  virtual void finish(std::size_t rows) = 0;
};

struct BatchSummary {
  std::size_t rows = 0;    // data rows seen (not the header, not empty lines)
  std::size_t failed = 0;  // rows written as errors
  unsigned threads = 1;    // threads that rated: fewer than BatchOptions::jobs when the
                           // system would not start more (the batch still completes)
  std::size_t guarantees_failed = 0;      // rows whose verdict on the template's guarantee is fail
  std::size_t guarantees_not_judged = 0;  // rated rows the guarantee could not be judged on
};

// The template of a batch: its one case, read, and the guarantee every row is judged
// against (in the case, or beside "cases"), when it gives one.
struct BatchTemplate {
  CaseInput input;
  std::optional<machines::Guarantee> guarantee;
};

// Told once about each column that is carried through unchanged (a logger's timestamp),
// before any row is rated.
class BatchNotices {
 public:
  virtual ~BatchNotices() = default;
  virtual void notice(const std::string& text) = 0;
};

// Reads the template from a parsed case file named `origin`. Throws bad_input
// "<origin>: ..." when it is not a case file, holds more than one case, or its case
// cannot be read.
BatchTemplate read_batch_template(const nlohmann::json& document, const std::string& origin,
                                  FluidFactory& fluids);

// Rates every row of `points` (named `points_name` in messages) against `template_case`
// and writes the results to `out`. A column whose header names no case key is carried
// through unchanged (`notices` hears of it). Throws bad_input naming the input for a
// problem with the whole input, before anything is written when it is the header: a
// case key with a missing, unknown or mismatched unit, two columns that give the same
// quantity, a --columns key that is no result key, no header at all; or later a record
// that never ends, or a read or write failure.
BatchSummary rate_batch(ByteSource& points, const std::string& points_name, const BatchTemplate& template_case,
                        ByteSink& out, const BatchOptions& options, BatchProgress* progress = nullptr,
                        BatchNotices* notices = nullptr);

}  // namespace shaftwork::io

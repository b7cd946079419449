// A worksheet of rows written one at a time into an .xlsx workbook (libxlsxwriter in its
// constant-memory mode: rows go to temporary files in a private directory, removed at the
// end). Internal to the io layer: the result stream of case files (result_xlsx.cpp) and
// the batch's CSV turned into cells (batch_workbook.cpp).
#pragma once

#include <cstddef>
#include <memory>
#include <string>
#include <string_view>
#include <vector>

#include "shaftwork/io/byte_stream.hpp"
#include "shaftwork/io/result_writer.hpp"

struct lxw_workbook;
struct lxw_worksheet;
struct lxw_format;

namespace shaftwork::io {

struct TempDir;

class Workbook {
 public:
  // At most `row_limit` rows in all (header rows included).
  explicit Workbook(std::size_t row_limit);
  Workbook(const Workbook&) = delete;
  Workbook& operator=(const Workbook&) = delete;
  ~Workbook();

  // Starts another worksheet: the rows that follow go there, from its first row.
  void add_sheet(const char* name);
  // Before a data row: throws bad_input "the workbook would pass Excel's limit of N rows:
  // ..." when the row would be one too many (the workbook is then never written).
  void begin_row();
  void text(std::size_t col, std::string_view value, bool bold = false);  // "" leaves the cell empty
  void number(std::size_t col, double value);
  void end_row() { ++row_; }
  // The first two rows and the first column stay in view.
  void freeze_header();
  // Zips the workbook into `out`; nothing when the row limit was passed.
  void finish(ByteSink& out);

 private:
  std::unique_ptr<TempDir> dir_;
  std::size_t row_limit_;
  std::size_t row_ = 0;
  lxw_workbook* workbook_ = nullptr;
  lxw_worksheet* sheet_ = nullptr;
  lxw_format* bold_ = nullptr;
  bool overflowed_ = false;
};

// A batch's CSV output (RFC 4180, as the batch writes it) turned into a workbook as it
// streams in: its header row split into a row of keys and a row of the units in brackets;
// in a column with a unit, named by a result key or its uncertainty, or holding a guarantee's
// converted value or deviation, a cell that reads whole as a number becomes a number; every
// other cell stays text. finish() writes the workbook.
class CsvWorkbookSink final : public ByteSink {
 public:
  explicit CsvWorkbookSink(std::size_t row_limit = kWorkbookRowLimit) : book_(row_limit) {}
  void write(std::string_view bytes) override;
  void finish(ByteSink& out);

 private:
  void end_field();
  void end_record();

  Workbook book_;
  std::vector<bool> numeric_;  // by column, from the header
  std::vector<std::string> record_;
  std::string field_;
  bool quoted_ = false;        // inside a quoted field
  bool quote_pending_ = false; // a quote seen inside a quoted field: its end, or the first of ""
  bool header_done_ = false;
};

}  // namespace shaftwork::io

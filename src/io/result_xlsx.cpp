// Results as an Excel workbook through libxlsxwriter, in its constant-memory mode: each row
// goes to a temporary file as it is written, and the workbook is zipped at the end.
#include <stdlib.h>
#include <unistd.h>

#include <cerrno>
#include <cmath>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <iterator>

#include <fmt/format.h>
#include <fmt/ranges.h>
#include <xlsxwriter.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/result_keys.hpp"
#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::io {
namespace {

namespace fs = std::filesystem;

// Excel's longest text in a cell (Microsoft, "Excel specifications and limits").
constexpr std::size_t kCellTextLimit = 32767;
// The leading text columns, as the CSV writes them.
constexpr std::string_view kLeading[] = {"id", "file", "status", "error", "machine", "fluid", "model", "solved_for"};

Error workbook_error(const char* step, lxw_error e) {
  return Error(ErrorKind::bad_input, fmt::format("cannot write the workbook ({}): {}", step, lxw_strerror(e)));
}

// A private directory for the workbook's temporary files, removed with everything in it.
struct TempDir {
  TempDir() {
    const char* base = ::getenv("TMPDIR");
    path = std::string(base && *base ? base : "/tmp") + "/shaftwork-xlsx-XXXXXX";
    if (::mkdtemp(path.data()) == nullptr) {
      throw Error(ErrorKind::bad_input,
                  fmt::format("cannot make a temporary directory for the workbook: {}", std::strerror(errno)));
    }
  }
  TempDir(const TempDir&) = delete;
  TempDir& operator=(const TempDir&) = delete;
  ~TempDir() {
    std::error_code ec;
    fs::remove_all(path, ec);
  }
  std::string path;
};

class WorkbookStream final : public ResultStream {
 public:
  WorkbookStream(std::ostream& out, UnitSystem system, std::size_t row_limit)
      : out_(out), system_(system), row_limit_(row_limit) {
    lxw_workbook_options options{};
    options.constant_memory = LXW_TRUE;
    options.tmpdir = dir_.path.data();
    workbook_ = workbook_new_opt((dir_.path + "/results.xlsx").c_str(), &options);
    if (workbook_ == nullptr) throw workbook_error("start", LXW_ERROR_CREATING_XLSX_FILE);
    sheet_ = workbook_add_worksheet(workbook_, "results");
    bold_ = workbook_add_format(workbook_);
    format_set_bold(bold_);
    write_header();
  }
  ~WorkbookStream() override {
    if (workbook_) lxw_workbook_free(workbook_);
  }

  void add(const CaseOutcome& o) override {
    if (row_ >= row_limit_) {
      overflowed_ = true;
      throw Error(ErrorKind::bad_input,
                  fmt::format("the workbook would pass Excel's limit of {} rows: 2 header rows and {} cases; "
                              "write --format csv or jsonl instead",
                              row_limit_, row_limit_ - 2));
    }
    write_case(o);
    ++row_;
  }

  void finish() override {
    if (overflowed_ || workbook_ == nullptr) return;
    lxw_workbook* done = workbook_;
    workbook_ = nullptr;
    if (const lxw_error e = workbook_close(done); e != LXW_NO_ERROR) throw workbook_error("close", e);
    std::ifstream in(dir_.path + "/results.xlsx", std::ios::binary);
    out_ << in.rdbuf();
  }

 private:
  void text(lxw_col_t col, std::string_view value, lxw_format* format = nullptr) {
    if (value.empty()) return;
    const std::string cell(value.substr(0, kCellTextLimit));
    if (const lxw_error e = worksheet_write_string(sheet_, row_, col, cell.c_str(), format); e != LXW_NO_ERROR) {
      throw workbook_error("a cell", e);
    }
  }
  void write_header();
  void write_case(const CaseOutcome& o);

  std::ostream& out_;
  UnitSystem system_;
  std::size_t row_limit_;
  TempDir dir_;
  lxw_workbook* workbook_ = nullptr;
  lxw_worksheet* sheet_ = nullptr;
  lxw_format* bold_ = nullptr;
  lxw_row_t row_ = 0;
  bool overflowed_ = false;
};

void WorkbookStream::write_header() {
  lxw_col_t col = 0;
  for (const std::string_view key : kLeading) text(col++, key, bold_);
  for (const ResultKey& k : result_keys()) text(col++, k.key, bold_);
  text(col, "warnings", bold_);
  ++row_;
  col = static_cast<lxw_col_t>(std::size(kLeading));
  for (const ResultKey& k : result_keys()) text(col++, column_unit(k.dimension, system_));
  ++row_;
  worksheet_freeze_panes(sheet_, 2, 1);
}

void WorkbookStream::write_case(const CaseOutcome& o) {
  text(0, o.id);
  text(1, o.origin);
  text(2, o.ok() ? "ok" : "error");
  text(3, o.error);
  lxw_col_t col = static_cast<lxw_col_t>(std::size(kLeading));
  if (o.ok()) {
    const machines::Rating& r = *o.rating;
    text(4, o.input ? o.input->machine_written : machines::machine_name(r.machine));
    text(5, o.input ? o.input->fluid_label : "");
    text(6, r.model);
    text(7, r.solved_for.joined(" "));
    for (const ResultKey& k : result_keys()) {
      const std::optional<double> v = k.value(r);
      if (v && std::isfinite(*v)) {
        const std::string_view unit = column_unit(k.dimension, system_);
        worksheet_write_number(sheet_, row_, col, unit.empty() ? *v : units::from_si(*v, unit, k.dimension), nullptr);
      }
      ++col;
    }
  } else {
    col = static_cast<lxw_col_t>(col + result_keys().size());
  }
  text(col, fmt::format("{}", fmt::join(o.warnings, "; ")));
}

}  // namespace

std::unique_ptr<ResultStream> make_workbook_stream(std::ostream& out, UnitSystem system, std::size_t row_limit) {
  return std::make_unique<WorkbookStream>(out, system, row_limit);
}

}  // namespace shaftwork::io

// Results as an Excel workbook through libxlsxwriter, in its constant-memory mode: each row
// goes to a temporary file as it is written, and the workbook is zipped at the end.
#include <stdlib.h>
#include <unistd.h>

#include <cerrno>
#include <cmath>
#include <cstring>
#include <filesystem>
#include <iterator>

#include <fmt/format.h>
#include <fmt/ranges.h>
#include <xlsxwriter.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/result_keys.hpp"
#include "shaftwork/io/result_writer.hpp"
#include "workbook.hpp"

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

}  // namespace

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

Workbook::Workbook(std::size_t row_limit) : dir_(std::make_unique<TempDir>()), row_limit_(row_limit) {
  lxw_workbook_options options{};
  options.constant_memory = LXW_TRUE;
  options.tmpdir = dir_->path.data();
  workbook_ = workbook_new_opt((dir_->path + "/results.xlsx").c_str(), &options);
  if (workbook_ == nullptr) throw workbook_error("start", LXW_ERROR_CREATING_XLSX_FILE);
  sheet_ = workbook_add_worksheet(workbook_, "results");
  bold_ = workbook_add_format(workbook_);
  format_set_bold(bold_);
}

Workbook::~Workbook() {
  if (workbook_) lxw_workbook_free(workbook_);
}

void Workbook::begin_row() {
  if (row_ >= row_limit_) {
    overflowed_ = true;
    throw Error(ErrorKind::bad_input,
                fmt::format("the workbook would pass Excel's limit of {} rows: 2 header rows and {} cases; "
                            "write --format csv or jsonl instead",
                            row_limit_, row_limit_ - 2));
  }
}

void Workbook::text(std::size_t col, std::string_view value, bool bold) {
  if (value.empty()) return;
  const std::string cell(value.substr(0, kCellTextLimit));
  const lxw_error e = worksheet_write_string(sheet_, static_cast<lxw_row_t>(row_), static_cast<lxw_col_t>(col),
                                             cell.c_str(), bold ? bold_ : nullptr);
  if (e != LXW_NO_ERROR) throw workbook_error("a cell", e);
}

void Workbook::number(std::size_t col, double value) {
  worksheet_write_number(sheet_, static_cast<lxw_row_t>(row_), static_cast<lxw_col_t>(col), value, nullptr);
}

void Workbook::freeze_header() { worksheet_freeze_panes(sheet_, 2, 1); }

void Workbook::finish(ByteSink& out) {
  if (overflowed_ || workbook_ == nullptr) return;
  lxw_workbook* done = workbook_;
  workbook_ = nullptr;
  if (const lxw_error e = workbook_close(done); e != LXW_NO_ERROR) throw workbook_error("close", e);
  FdSource in = FdSource::open(dir_->path + "/results.xlsx");
  char buffer[65536];
  for (std::size_t n; (n = in.read(buffer, sizeof buffer)) > 0;) out.write(std::string_view(buffer, n));
}

namespace {

// Adapts an ostream (the result streams' target) to a ByteSink.
class OstreamSink final : public ByteSink {
 public:
  explicit OstreamSink(std::ostream& out) : out_(out) {}
  void write(std::string_view bytes) override { out_.write(bytes.data(), static_cast<std::streamsize>(bytes.size())); }

 private:
  std::ostream& out_;
};

class WorkbookStream final : public ResultStream {
 public:
  WorkbookStream(std::ostream& out, UnitSystem system, std::size_t row_limit)
      : out_(out), system_(system), book_(row_limit) {
    write_header();
  }
  void add(const CaseOutcome& o) override {
    book_.begin_row();
    write_case(o);
    book_.end_row();
  }
  void finish() override { book_.finish(out_); }

 private:
  void write_header();
  void write_case(const CaseOutcome& o);

  OstreamSink out_;
  UnitSystem system_;
  Workbook book_;
};

void WorkbookStream::write_header() {
  std::size_t col = 0;
  for (const std::string_view key : kLeading) book_.text(col++, key, true);
  for (const ResultKey& k : result_keys()) book_.text(col++, k.key, true);
  book_.text(col, "warnings", true);
  book_.end_row();
  col = std::size(kLeading);
  for (const ResultKey& k : result_keys()) book_.text(col++, column_unit(k.dimension, system_));
  book_.end_row();
  book_.freeze_header();
}

void WorkbookStream::write_case(const CaseOutcome& o) {
  book_.text(0, o.id);
  book_.text(1, o.origin);
  book_.text(2, o.ok() ? "ok" : "error");
  book_.text(3, o.error);
  std::size_t col = std::size(kLeading);
  if (o.ok()) {
    const machines::Rating& r = *o.rating;
    book_.text(4, o.input ? o.input->machine_written : machines::machine_name(r.machine));
    book_.text(5, o.input ? o.input->fluid_label : "");
    book_.text(6, r.model);
    book_.text(7, r.solved_for.joined(" "));
    for (const ResultKey& k : result_keys()) {
      const std::optional<double> v = k.value(r);
      if (v && std::isfinite(*v)) {
        const std::string_view unit = column_unit(k.dimension, system_);
        book_.number(col, unit.empty() ? *v : units::from_si(*v, unit, k.dimension));
      }
      ++col;
    }
  } else {
    col += result_keys().size();
  }
  book_.text(col, fmt::format("{}", fmt::join(o.warnings, "; ")));
}

}  // namespace

std::unique_ptr<ResultStream> make_workbook_stream(std::ostream& out, UnitSystem system, std::size_t row_limit) {
  return std::make_unique<WorkbookStream>(out, system, row_limit);
}

}  // namespace shaftwork::io

// Results as an Excel workbook through libxlsxwriter, in its constant-memory mode: each row
// goes to a temporary file as it is written, and the workbook is zipped at the end. The
// library is opened by the first Workbook (xlsx_api.hpp).
#include <stdlib.h>
#include <unistd.h>

#include <cerrno>
#include <cmath>
#include <cstring>
#include <filesystem>
#include <iterator>
#include <vector>

#include <fmt/format.h>
#include <fmt/ranges.h>

#include "shaftwork/error.hpp"
#include "shaftwork/io/result_keys.hpp"
#include "shaftwork/io/result_writer.hpp"
#include "workbook.hpp"
#include "xlsx_api.hpp"

namespace shaftwork::io {
namespace {

namespace fs = std::filesystem;

// Excel's longest text in a cell (Microsoft, "Excel specifications and limits").
constexpr std::size_t kCellTextLimit = 32767;
// The leading text columns, as the CSV writes them.
constexpr std::string_view kLeading[] = {"id", "file", "status", "error", "machine", "fluid", "model", "solved_for"};

Error workbook_error(const char* step, lxw_error e) {
  return Error(ErrorKind::bad_input, fmt::format("cannot write the workbook ({}): {}", step, xlsx_api().strerror(e)));
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
  workbook_ = xlsx_api().workbook_new_opt((dir_->path + "/results.xlsx").c_str(), &options);
  if (workbook_ == nullptr) throw workbook_error("start", LXW_ERROR_CREATING_XLSX_FILE);
  sheet_ = xlsx_api().workbook_add_worksheet(workbook_, "results");
  bold_ = xlsx_api().workbook_add_format(workbook_);
  xlsx_api().format_set_bold(bold_);
}

void Workbook::add_sheet(const char* name) {
  sheet_ = xlsx_api().workbook_add_worksheet(workbook_, name);
  if (sheet_ == nullptr) throw workbook_error("a worksheet", LXW_ERROR_MEMORY_MALLOC_FAILED);
  row_ = 0;
}

Workbook::~Workbook() {
  if (workbook_) xlsx_api().workbook_free(workbook_);
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
  const lxw_error e = xlsx_api().worksheet_write_string(sheet_, static_cast<lxw_row_t>(row_),
                                                        static_cast<lxw_col_t>(col), cell.c_str(), bold ? bold_ : nullptr);
  if (e != LXW_NO_ERROR) throw workbook_error("a cell", e);
}

void Workbook::number(std::size_t col, double value) {
  xlsx_api().worksheet_write_number(sheet_, static_cast<lxw_row_t>(row_), static_cast<lxw_col_t>(col), value,
                                    nullptr);
}

void Workbook::freeze_header() { xlsx_api().worksheet_freeze_panes(sheet_, 2, 1); }

void Workbook::finish(ByteSink& out) {
  if (overflowed_ || workbook_ == nullptr) return;
  lxw_workbook* done = workbook_;
  workbook_ = nullptr;
  if (const lxw_error e = xlsx_api().workbook_close(done); e != LXW_NO_ERROR) throw workbook_error("close", e);
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

// The columns of the sheet "tests": a row per check of a file's guarantee.
constexpr std::string_view kTestColumns[] = {
    "file",      "points",    "verdict",           "quantity",          "measured",          "converted",
    "guaranteed", "unit",     "deviation_percent", "tolerance.min_percent", "tolerance.max_percent",
    "check_verdict", "error"};

class WorkbookStream final : public ResultStream {
 public:
  WorkbookStream(std::ostream& out, const TableOptions& options, std::size_t row_limit)
      : out_(out), options_(options), book_(row_limit) {
    write_header();
  }
  void add(const CaseOutcome& o) override {
    book_.begin_row();
    write_case(o);
    book_.end_row();
  }
  // Kept until the end (a test is small), then written on the sheet "tests".
  void add_test(const TestOutcome& t) override { tests_.push_back(t); }
  void finish() override {
    if (!tests_.empty()) write_tests();
    book_.finish(out_);
  }

 private:
  void write_header();
  void write_case(const CaseOutcome& o);
  void write_tests();
  void write_check(const TestOutcome& t, const machines::Check& c);
  void cell(std::size_t col, const std::optional<double>& number, std::string_view text = {}) {
    if (number && std::isfinite(*number)) {
      book_.number(col, *number);
    } else {
      book_.text(col, text);
    }
  }

  OstreamSink out_;
  TableOptions options_;
  Workbook book_;
  std::vector<TestOutcome> tests_;
};

void WorkbookStream::write_header() {
  const UnitSystem system = options_.system;
  std::vector<std::pair<std::string, std::string>> columns;  // key, unit
  for (const ResultKey& k : result_keys()) columns.emplace_back(k.key, column_unit(k.dimension, system));
  if (options_.uncertainty_columns) {
    for (const ResultKey& k : result_keys()) {
      columns.emplace_back(fmt::format("uncertainty.{}", k.key), column_unit(k.dimension, system));
    }
  }
  if (options_.guarantee_columns) {
    for (auto& c : options_.guarantee_columns->columns(system)) columns.emplace_back(std::move(c.key), std::move(c.unit));
  }
  std::size_t col = 0;
  for (const std::string_view key : kLeading) book_.text(col++, key, true);
  for (const auto& c : columns) book_.text(col++, c.first, true);
  book_.text(col, "warnings", true);
  book_.end_row();
  col = std::size(kLeading);
  for (const auto& c : columns) book_.text(col++, c.second);
  book_.end_row();
  book_.freeze_header();
}

void WorkbookStream::write_case(const CaseOutcome& o) {
  const UnitSystem system = options_.system;
  book_.text(0, o.id);
  book_.text(1, o.origin);
  book_.text(2, o.ok() ? "ok" : "error");
  book_.text(3, o.error);
  std::size_t col = std::size(kLeading);
  const std::size_t count = result_keys().size();
  if (o.ok()) {
    const machines::Rating& r = *o.rating;
    book_.text(4, o.input ? o.input->machine_written : machines::machine_name(r.machine));
    book_.text(5, o.input ? o.input->fluid_label : "");
    book_.text(6, r.model);
    book_.text(7, r.solved_for.joined(" "));
    for (const ResultKey& k : result_keys()) {
      const std::optional<double> v = k.value(r);
      const std::string_view unit = column_unit(k.dimension, system);
      if (v && std::isfinite(*v)) book_.number(col, unit.empty() ? *v : units::from_si(*v, unit, k.dimension));
      ++col;
    }
  } else {
    col += count;
  }
  if (options_.uncertainty_columns) {
    for (std::size_t k = 0; k < count; ++k) cell(col++, uncertainty_in_column_unit(o, k, system));
  }
  if (options_.guarantee_columns) {
    for (const auto& c : options_.guarantee_columns->row(o.guarantee ? &*o.guarantee : nullptr, system,
                                                         o.guarantee_error)) {
      cell(col++, c.number, c.text);
    }
  }
  book_.text(col, fmt::format("{}", fmt::join(o.warnings, "; ")));
}

void WorkbookStream::write_tests() {
  book_.add_sheet("tests");
  std::size_t col = 0;
  for (const std::string_view key : kTestColumns) book_.text(col++, key, true);
  book_.end_row();
  for (const TestOutcome& t : tests_) {
    if (!t.result) {
      book_.begin_row();
      book_.text(0, t.origin);
      book_.text(1, fmt::format("{}", fmt::join(t.points, "; ")));
      book_.text(std::size(kTestColumns) - 1, t.error);
      book_.end_row();
      continue;
    }
    for (const machines::Check& c : t.result->checks) write_check(t, c);
  }
}

// One check of a file's guarantee; values in the unit of the results sheet's columns.
void WorkbookStream::write_check(const TestOutcome& t, const machines::Check& c) {
  const machines::CheckedSpec& spec = machines::checked_spec(c.quantity);
  const std::string_view unit = column_unit(spec.dimension, options_.system);
  const auto shown = [&](std::optional<double> si) -> std::optional<double> {
    if (!si || unit.empty()) return si;
    return units::from_si(*si, unit, spec.dimension);
  };
  book_.begin_row();
  book_.text(0, t.origin);
  book_.text(1, fmt::format("{}", fmt::join(t.points, "; ")));
  book_.text(2, machines::verdict_name(t.result->verdict));
  book_.text(3, spec.key);
  cell(4, shown(c.measured));
  cell(5, shown(c.converted));
  cell(6, shown(c.guaranteed));
  book_.text(7, unit);
  cell(8, c.deviation_percent);
  cell(9, c.tolerance.min_percent);
  cell(10, c.tolerance.max_percent);
  book_.text(11, machines::verdict_name(c.verdict));
  book_.end_row();
}

}  // namespace

std::unique_ptr<ResultStream> make_workbook_stream(std::ostream& out, const TableOptions& options,
                                                   std::size_t row_limit) {
  return std::make_unique<WorkbookStream>(out, options, row_limit);
}

}  // namespace shaftwork::io

// The result writers as streams: each case is written as it comes.
#include <algorithm>
#include <sstream>
#include <string>
#include <vector>

#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::io {
namespace {

class TableStream final : public ResultStream {
 public:
  TableStream(std::ostream& out, const TableOptions& options) : out_(out), options_(options) {}
  void add(const CaseOutcome& o) override {
    if (!first_) out_ << '\n';
    first_ = false;
    write_case_table(out_, o, options_);
  }
  void add_test(const TestOutcome& t) override {
    out_ << '\n';
    write_test_table(out_, t, options_);
  }

 private:
  std::ostream& out_;
  TableOptions options_;
  bool first_ = true;
};

// {"results": [...]} as nlohmann's dump(2) of the whole document writes it: each result
// is that result's own dump(2), its lines indented by the four spaces of its depth.
class JsonStream final : public ResultStream {
 public:
  explicit JsonStream(std::ostream& out) : out_(out) { out_ << "{\n  \"results\": ["; }
  void add(const CaseOutcome& o) override {
    const std::string text =
        result_json(o).dump(2, ' ', false, nlohmann::ordered_json::error_handler_t::replace);
    out_ << (first_ ? "\n    " : ",\n    ");
    first_ = false;
    for (const char c : text) {
      out_ << c;
      if (c == '\n') out_ << "    ";
    }
  }
  // Kept until the end: "test" follows "results" (a test object is small).
  void add_test(const TestOutcome& t) override { tests_.push_back(test_json(t)); }
  void finish() override {
    out_ << (first_ ? "]" : "\n  ]");
    if (!tests_.empty()) {
      const nlohmann::ordered_json test = tests_.size() == 1 ? tests_.front() : nlohmann::ordered_json(tests_);
      out_ << ",\n  \"test\": ";
      const std::string text = test.dump(2, ' ', false, nlohmann::ordered_json::error_handler_t::replace);
      for (const char c : text) {
        out_ << c;
        if (c == '\n') out_ << "  ";
      }
    }
    out_ << "\n}\n";
  }

 private:
  std::ostream& out_;
  bool first_ = true;
  std::vector<nlohmann::ordered_json> tests_;
};

class JsonLinesStream final : public ResultStream {
 public:
  explicit JsonLinesStream(std::ostream& out) : out_(out) {}
  void add(const CaseOutcome& o) override { line(result_json(o)); }
  void add_test(const TestOutcome& t) override { line(nlohmann::ordered_json{{"test", test_json(t)}}); }

 private:
  void line(const nlohmann::ordered_json& object) {
    out_ << object.dump(-1, ' ', false, nlohmann::ordered_json::error_handler_t::replace) << '\n';
  }

  std::ostream& out_;
};

class CsvStream final : public ResultStream {
 public:
  CsvStream(std::ostream& out, const TableOptions& options) : out_(out), options_(options) {
    out_ << csv_header(options_);
  }
  void add(const CaseOutcome& o) override { out_ << csv_row(o, options_); }

 private:
  std::ostream& out_;
  TableOptions options_;
};

}  // namespace

std::unique_ptr<ResultStream> make_result_stream(ResultFormat format, std::ostream& out, const TableOptions& options) {
  switch (format) {
    case ResultFormat::json: return std::make_unique<JsonStream>(out);
    case ResultFormat::jsonl: return std::make_unique<JsonLinesStream>(out);
    case ResultFormat::csv: return std::make_unique<CsvStream>(out, options);
    case ResultFormat::xlsx: return make_workbook_stream(out, options);
    case ResultFormat::table: break;
  }
  return std::make_unique<TableStream>(out, options);
}

void write_results(std::ostream& out, ResultFormat format, const std::vector<CaseOutcome>& outcomes,
                   const TableOptions& options, const std::vector<TestOutcome>& tests) {
  TableOptions whole = options;
  whole.uncertainty_columns = options.uncertainty_columns ||
                              std::any_of(outcomes.begin(), outcomes.end(),
                                          [](const CaseOutcome& o) { return o.uncertainty.has_value(); });
  // Guarantee columns when some case has a guarantee of its own: the checks any of them made.
  std::vector<const machines::GuaranteeResult*> judged;
  for (const CaseOutcome& o : outcomes) {
    if (o.guarantee) judged.push_back(&*o.guarantee);
    if (!whole.guarantee_columns && (o.guarantee || !o.guarantee_error.empty())) whole.guarantee_columns.emplace();
  }
  if (whole.guarantee_columns) whole.guarantee_columns->add(guarantee_columns(judged));
  const auto stream = make_result_stream(format, out, whole);
  for (const CaseOutcome& o : outcomes) stream->add(o);
  for (const TestOutcome& t : tests) stream->add_test(t);
  stream->finish();
}

}  // namespace shaftwork::io

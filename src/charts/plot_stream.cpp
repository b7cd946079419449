#include "shaftwork/charts/plot_stream.hpp"

#include <cctype>
#include <filesystem>
#include <optional>
#include <set>

#include <fmt/format.h>

#include "shaftwork/charts/document.hpp"
#include "shaftwork/charts/guarantee_chart.hpp"
#include "shaftwork/io/atomic_file.hpp"

namespace shaftwork::charts {
namespace {

class StringSink final : public io::ByteSink {
 public:
  void write(std::string_view bytes) override { data.append(bytes); }
  std::string data;
};

void write_file(const std::string& path, const std::string& bytes) {
  io::OutputFile file(path);
  file.write(bytes);
  file.commit();
}

// A guarantee chart of a case's own guarantee, or of a file's test, when there is one to draw.
std::optional<GuaranteeChart> guarantee_chart_of(const io::CaseOutcome& o, const ProcessChartOptions& options) {
  if (!o.ok() || !o.guarantee || !has_guarantee_chart(*o.guarantee)) return std::nullopt;
  return make_guarantee_chart(o, options);
}
std::optional<GuaranteeChart> guarantee_chart_of(const io::TestOutcome& t, const ProcessChartOptions& options) {
  if (!t.result || !has_guarantee_chart(*t.result)) return std::nullopt;
  return make_guarantee_chart(t, options);
}

// The name a file's test gives its chart: "<file stem>-guarantee".
std::string test_chart_id(const io::TestOutcome& t) {
  return std::filesystem::path(t.origin).stem().string() + "-guarantee";
}

// Every chart a page of one PDF: a case's process chart, then its guarantee chart; a
// file's test after the file's cases.
class PdfPlots final : public io::ResultStream {
 public:
  PdfPlots(const std::string& path, const ProcessChartOptions& options)
      : options_(options), file_(path), document_(ImageFormat::pdf, file_, kChartPage.width, kChartPage.height) {}
  void add(const io::CaseOutcome& o) override {
    if (!o.ok()) return;
    const ProcessChart chart = make_process_chart(o, options_);
    draw_process_chart(document_.begin_page(), chart, kChartPage);
    end_page();
    if (const auto g = guarantee_chart_of(o, options_)) draw(*g);
  }
  void add_test(const io::TestOutcome& t) override {
    if (const auto g = guarantee_chart_of(t, options_)) draw(*g);
  }
  void finish() override {
    document_.finish();
    if (pages_ > 0) file_.commit();  // no rated case: no file
  }

 private:
  void draw(const GuaranteeChart& chart) {
    draw_guarantee_chart(document_.begin_page(), chart, kChartPage);
    end_page();
  }
  void end_page() {
    document_.end_page();
    ++pages_;
  }

  ProcessChartOptions options_;
  io::OutputFile file_;
  Document document_;
  int pages_ = 0;
};

// The bytes of one chart drawn by `draw(cr, frame)` in `format`.
template <class Draw>
std::string render(ImageFormat format, Draw draw) {
  StringSink sink;
  Document document(format, sink, kChartPage.width, kChartPage.height);
  draw(document.begin_page(), kChartPage);
  document.end_page();
  document.finish();
  return std::move(sink.data);
}

// One SVG or PNG per chart; the first case's wait until a second case shows how to name them.
class FilePlots final : public io::ResultStream {
 public:
  FilePlots(std::string path, ImageFormat format, const ProcessChartOptions& options)
      : path_(std::move(path)), format_(format), options_(options) {}
  void add(const io::CaseOutcome& o) override {
    ++cases_;
    if (cases_ == 2 && first_) write_case(*first_);
    if (!o.ok()) return;
    Drawn drawn{o.id, render(format_, [&](cairo_t* cr, const Rect& f) {
                  draw_process_chart(cr, make_process_chart(o, options_), f);
                }), std::nullopt};
    if (const auto g = guarantee_chart_of(o, options_)) drawn.guarantee = draw(*g);
    if (cases_ == 1) {
      first_.emplace(std::move(drawn));
    } else {
      write_case(drawn);
    }
  }
  void add_test(const io::TestOutcome& t) override {
    if (const auto g = guarantee_chart_of(t, options_)) write_named(test_chart_id(t), draw(*g));
  }
  void finish() override {
    if (cases_ != 1 || !first_) return;
    write_file(path_, first_->process);
    if (first_->guarantee) write_named("guarantee", *first_->guarantee);
  }

 private:
  struct Drawn {
    std::string id, process;
    std::optional<std::string> guarantee;
  };
  std::string draw(const GuaranteeChart& chart) const {
    return render(format_, [&](cairo_t* cr, const Rect& f) { draw_guarantee_chart(cr, chart, f); });
  }
  void write_case(const Drawn& d) {
    write_named(d.id, d.process);
    if (d.guarantee) write_named(d.id + "-guarantee", *d.guarantee);
  }
  void write_named(const std::string& id, const std::string& bytes) {
    std::string name = case_file_name(path_, id);
    const std::string stem = name.substr(0, name.size() - 4);
    for (int n = 2; !used_.insert(name).second; ++n) name = fmt::format("{}-{}{}", stem, n, name.substr(stem.size()));
    write_file(name, bytes);
  }

  std::string path_;
  ImageFormat format_;
  ProcessChartOptions options_;
  int cases_ = 0;
  std::optional<Drawn> first_;
  std::set<std::string> used_;
};

}  // namespace

std::string case_file_name(const std::string& path, const std::string& id) {
  const std::string ext = extension_of(image_format_of(path));
  const std::string stem = path.substr(0, path.size() - ext.size());
  std::string safe;
  for (const char c : id) {
    const bool keep = std::isalnum(static_cast<unsigned char>(c)) || c == '.' || c == '_' || c == '-';
    if (keep) {
      safe += c;
    } else if (safe.empty() || safe.back() != '_') {
      safe += '_';
    }
  }
  if (safe.empty() || safe.find_first_not_of("._") == std::string::npos) safe = "case";
  return fmt::format("{}-{}{}", stem, safe, path.substr(stem.size()));
}

std::unique_ptr<io::ResultStream> make_plot_stream(const std::string& path, const ProcessChartOptions& options) {
  const ImageFormat format = image_format_of(path);
  load_cairo();  // the first chart may come late: a missing Cairo costs no rating
  if (format == ImageFormat::pdf) return std::make_unique<PdfPlots>(path, options);
  return std::make_unique<FilePlots>(path, format, options);
}

}  // namespace shaftwork::charts

#include "shaftwork/charts/plot_stream.hpp"

#include <cctype>
#include <optional>
#include <set>

#include <fmt/format.h>

#include "shaftwork/charts/document.hpp"
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

// Every chart a page of one PDF.
class PdfPlots final : public io::ResultStream {
 public:
  PdfPlots(const std::string& path, const ProcessChartOptions& options)
      : options_(options), file_(path), document_(ImageFormat::pdf, file_, kChartPage.width, kChartPage.height) {}
  void add(const io::CaseOutcome& o) override {
    if (!o.ok()) return;
    const ProcessChart chart = make_process_chart(o, options_);
    draw_process_chart(document_.begin_page(), chart, kChartPage);
    document_.end_page();
    ++pages_;
  }
  void finish() override {
    document_.finish();
    if (pages_ > 0) file_.commit();  // no rated case: no file
  }

 private:
  ProcessChartOptions options_;
  io::OutputFile file_;
  Document document_;
  int pages_ = 0;
};

// One SVG or PNG per case; the first waits until a second case shows how to name it.
class FilePlots final : public io::ResultStream {
 public:
  FilePlots(std::string path, ImageFormat format, const ProcessChartOptions& options)
      : path_(std::move(path)), format_(format), options_(options) {}
  void add(const io::CaseOutcome& o) override {
    ++cases_;
    if (cases_ == 2 && first_) write_named(first_->first, first_->second);
    if (!o.ok()) return;
    std::string bytes = render(o);
    if (cases_ == 1) {
      first_.emplace(o.id, std::move(bytes));
    } else {
      write_named(o.id, bytes);
    }
  }
  void finish() override {
    if (cases_ == 1 && first_) write_file(path_, first_->second);
  }

 private:
  std::string render(const io::CaseOutcome& o) const {
    StringSink sink;
    Document document(format_, sink, kChartPage.width, kChartPage.height);
    draw_process_chart(document.begin_page(), make_process_chart(o, options_), kChartPage);
    document.end_page();
    document.finish();
    return std::move(sink.data);
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
  std::optional<std::pair<std::string, std::string>> first_;  // id, bytes
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
  if (format == ImageFormat::pdf) return std::make_unique<PdfPlots>(path, options);
  return std::make_unique<FilePlots>(path, format, options);
}

}  // namespace shaftwork::charts

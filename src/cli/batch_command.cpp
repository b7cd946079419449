#include "batch_command.hpp"

#include <unistd.h>

#include <iostream>
#include <iterator>
#include <memory>
#include <sstream>
#include <thread>

#include <fmt/format.h>

#include "commands.hpp"
#include "progress_line.hpp"
#include "shaftwork/charts/batch_chart.hpp"
#include "shaftwork/charts/document.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/atomic_file.hpp"
#include "shaftwork/io/batch.hpp"
#include "shaftwork/io/byte_stream.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/text_file.hpp"

namespace shaftwork::cli {
namespace {

// Notices of the batch (columns carried through) go to standard error.
class StderrNotices final : public io::BatchNotices {
 public:
  void notice(const std::string& text) override { std::cerr << "notice: " << text << '\n'; }
};

// Rating is arithmetic, so threads beyond the cores only take turns; a few per core are
// allowed (docs/batch.md), more are capped with a warning rather than asked of the system.
constexpr unsigned kThreadsPerCore = 4;

unsigned thread_count(unsigned asked) {
  const unsigned cores = std::max(1u, std::thread::hardware_concurrency());
  if (asked == 0) return cores;
  const unsigned cap = kThreadsPerCore * cores;
  if (asked <= cap) return asked;
  std::cerr << fmt::format("warning: --jobs: at most {} threads are used on {} cores ({} a core); rating with {}\n",
                           cap, cores, kThreadsPerCore, cap);
  return cap;
}

// The batch chart into `path`, whole or not at all; false (with the message on standard
// error) when it cannot be written: the results are written all the same.
bool write_chart(const std::string& path, const charts::BatchChartData& chart, const io::CaseInput& templ,
                 const std::string& points_name) {
  try {
    io::OutputFile file(path);
    charts::Document document(charts::image_format_of(path), file, charts::kChartPage.width,
                              charts::kChartPage.height);
    const charts::BatchChartText text{
        templ.id, fmt::format("{}: {} on {}", points_name, templ.machine_written, templ.fluid_label)};
    charts::draw_batch_chart(document.begin_page(), chart, text, charts::kChartPage);
    document.end_page();
    document.finish();
    file.commit();
    return true;
  } catch (const Error& e) {
    std::cerr << "error: " << e.what() << '\n';
    return false;
  }
}

}  // namespace

int run_batch(const BatchCommandOptions& options) {
  try {
    std::vector<std::string> inputs = {options.points, options.template_file};
    inputs.insert(inputs.end(), options.species_files.begin(), options.species_files.end());
    for (const std::string& out : {options.output, options.plot}) {
      if (!out.empty()) io::refuse_output_among_inputs(out, inputs);
    }
    if (!options.plot.empty()) {  // a bad name, or no Cairo to draw with, costs no rating
      charts::image_format_of(options.plot);
      charts::load_cairo();
    }
    io::FluidFactory fluids;
    for (const auto& path : options.species_files) fluids.add_species_file(path);
    const auto document = io::parse_json_strict(io::read_text_file(options.template_file), options.template_file);
    const io::BatchTemplate templ = io::read_batch_template(document, options.template_file, fluids);

    io::BatchOptions batch;
    batch.format = options.format == "jsonl"  ? io::BatchFormat::jsonl
                   : options.format == "xlsx" ? io::BatchFormat::xlsx
                                              : io::BatchFormat::csv;
    batch.units = options.units == "us" ? io::UnitSystem::us : io::UnitSystem::si;
    batch.jobs = thread_count(options.jobs);
    batch.columns = options.columns;
    charts::BatchChartData chart;
    if (!options.plot.empty()) batch.points = &chart;

    const bool from_stdin = options.points == "-";
    const std::string points_name = from_stdin ? "standard input" : options.points;
    std::unique_ptr<io::FdSource> source = std::make_unique<io::FdSource>(
        from_stdin ? io::FdSource(STDIN_FILENO, points_name) : io::FdSource::open(options.points));
    std::unique_ptr<io::OutputFile> file;
    std::unique_ptr<io::FdSink> stdout_sink;
    io::ByteSink* sink = nullptr;
    if (options.output.empty()) {
      stdout_sink = std::make_unique<io::FdSink>(STDOUT_FILENO, "standard output");
      sink = stdout_sink.get();
    } else {
      file = std::make_unique<io::OutputFile>(options.output);
      sink = file.get();
    }
    std::unique_ptr<ProgressLine> progress;
    if (!options.quiet && ProgressLine::wanted()) progress = std::make_unique<ProgressLine>();

    StderrNotices notices;
    const io::BatchSummary summary =
        io::rate_batch(*source, points_name, templ, *sink, batch, progress.get(), &notices);
    if (file) file->commit();
    if (!options.plot.empty() && !write_chart(options.plot, chart, templ.input, points_name)) return kExitUnusable;
    if (summary.threads < batch.jobs) {
      std::cerr << fmt::format("warning: the system started {} of the {} threads asked for; the batch was rated on {}\n",
                               summary.threads, batch.jobs, summary.threads);
    }
    if (summary.guarantees_not_judged > 0) {
      std::cerr << fmt::format("error: {} of {} rows were rated but not judged against the guarantee; each one's "
                               "\"guarantee.error\" says why\n",
                               summary.guarantees_not_judged, summary.rows);
    }
    if (summary.failed > 0) {
      std::cerr << fmt::format("error: {} of {} rows could not be rated; each one's \"error\" says why\n",
                               summary.failed, summary.rows);
    }
    if (summary.failed > 0 || summary.guarantees_not_judged > 0) return kExitCaseFailed;
    if (summary.guarantees_failed > 0) {
      std::cerr << fmt::format("{} of {} rows do not meet the guarantee\n", summary.guarantees_failed, summary.rows);
      return kExitGuaranteeFailed;
    }
    return kExitOk;
  } catch (const Error& e) {
    std::cerr << "error: " << e.what() << '\n';
    return kExitUnusable;
  }
}

}  // namespace shaftwork::cli

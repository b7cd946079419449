// shaftwork rate FILE... — rate the cases of JSON case files; with --case, the rows of
// a CSV file of test points (batch_command.cpp).
#include <unistd.h>

#include <algorithm>
#include <iostream>
#include <iterator>
#include <map>
#include <memory>
#include <optional>
#include <sstream>
#include <string>
#include <string_view>
#include <vector>

#include <fmt/format.h>

#include "batch_command.hpp"
#include "commands.hpp"
#include "picture_options.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/uncertainty_input.hpp"
#include "shaftwork/io/atomic_file.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/guarantee_reader.hpp"
#include "shaftwork/io/result_writer.hpp"
#include "shaftwork/io/text_file.hpp"

namespace shaftwork::cli {
namespace {

struct RateOptions {
  std::vector<std::string> files;
  std::string format = "table";
  std::string units = "si";
  std::string output;
  std::vector<std::string> species_files;
  std::string template_file;  // --case: the files are CSV test points
  unsigned jobs = 0;
  bool quiet = false;
  bool format_given = false;
  bool units_given = false;
  std::vector<std::string> columns;  // --columns: result keys of a batch's csv
  PictureOptions pictures;           // --plot, --plot-diagram
};


// Each case's warnings and, for a failed case or a guarantee that could not be judged, its
// error, on standard error (the results keep them too).
void report_case(const io::CaseOutcome& o) {
  for (const auto& w : o.warnings) std::cerr << fmt::format("warning: case \"{}\": {}\n", o.id, w);
  if (!o.ok()) {
    std::cerr << fmt::format("error: case \"{}\": {}\n", o.id, o.error);
  } else if (!o.guarantee_error.empty()) {
    std::cerr << fmt::format("error: case \"{}\": {}\n", o.id, o.guarantee_error);
  }
}

// A file's test: its warnings and, when it could not be judged, its error, on standard error.
void report_test(const io::TestOutcome& t) {
  for (const auto& w : t.warnings) std::cerr << fmt::format("warning: {}: {}\n", t.origin, w);
  if (!t.result) std::cerr << fmt::format("error: {}: {}\n", t.origin, t.error);
}

// What the cases and tests of a run came to, for the exit status (the contract: 2, 1, 3, 0).
struct RunState {
  bool file_unusable = false;
  bool case_failed = false;       // a case not rated, or a guarantee not judged
  bool guarantee_failed = false;  // a guarantee judged and not met
  void add(const io::CaseOutcome& o) {
    case_failed = case_failed || !o.ok() || !o.guarantee_error.empty();
    guarantee_failed = guarantee_failed || o.guarantee_failed();
  }
  void add(const io::TestOutcome& t) {
    case_failed = case_failed || !t.result;
    guarantee_failed = guarantee_failed || t.failed();
  }
};

io::ResultFormat result_format(const std::string& name) {
  if (name == "json") return io::ResultFormat::json;
  if (name == "jsonl") return io::ResultFormat::jsonl;
  if (name == "csv") return io::ResultFormat::csv;
  if (name == "xlsx") return io::ResultFormat::xlsx;
  return io::ResultFormat::table;
}

// A file's text; standard input is read once and kept, as the CSV's header may need to know
// what it holds before the cases are rated.
class InputTexts {
 public:
  std::string text(const std::string& path) {
    if (path != "-") return io::read_text_file(path);
    if (!stdin_) stdin_ = io::read_text_file(path);
    return *stdin_;
  }

 private:
  std::optional<std::string> stdin_;
};

// The optional columns of the CSV and the workbook, decided before their header: the uncertainty columns when some
// case of the files states an uncertainty, the guarantee columns when some case has a
// guarantee of its own. A file that cannot be read or parsed is left to rate_files to report.
void choose_csv_columns(const std::vector<std::string>& files, InputTexts& texts, io::FluidFactory& fluids,
                        io::TableOptions& table) {
  for (const auto& path : files) {
    try {
      const auto document = io::parse_json_strict(texts.text(path), path);
      table.uncertainty_columns = table.uncertainty_columns || io::states_uncertainty(document);
      io::add_case_guarantee_columns(document, path, fluids, table.guarantee_columns);
    } catch (const Error&) {
    }
  }
}

// Rates the cases of each file as they come and writes each result at once: memory holds
// one file's document, one result and, for a file's guarantee, its test points; the file's
// test is judged and written after its cases.
RunState rate_files(const RateOptions& options, io::FluidFactory& fluids, io::ResultStream& results,
                    InputTexts& texts) {
  RunState state;
  io::CaseIdRegister ids;
  for (const auto& path : options.files) {
    const std::string origin = path == "-" ? "standard input" : path;
    try {
      const auto document = io::parse_json_strict(texts.text(path), origin);
      const auto cases = io::case_objects(document, origin);
      const std::vector<io::StatedUncertainty> defaults = io::file_uncertainty(document, origin);
      io::FileTest test(document, origin);
      for (std::size_t i = 0; i < cases.size(); ++i) {
        io::CaseOutcome o = io::rate_case(*cases[i], i, fluids, origin, defaults);
        ids.check(o, i);
        report_case(o);
        state.add(o);
        test.add(o);
        results.add(o);
      }
      if (!test.active()) continue;
      const io::TestOutcome t = test.finish(fluids);
      report_test(t);
      state.add(t);
      results.add_test(t);
    } catch (const Error& e) {
      std::cerr << "error: " << e.what() << '\n';
      state.file_unusable = true;
    }
  }
  results.finish();
  return state;
}

int run_rate(const RateOptions& options) {
  io::FluidFactory fluids;
  std::optional<io::OutputFile> file;  // opened first: a path it refuses costs no rating
  io::TableOptions table;
  table.system = options.units == "us" ? io::UnitSystem::us : io::UnitSystem::si;
  table.system_forced = options.units_given;
  table.show_origin = options.files.size() > 1;
  std::vector<std::unique_ptr<io::ResultStream>> pictures;
  try {
    std::vector<std::string> inputs = options.files;
    inputs.insert(inputs.end(), options.species_files.begin(), options.species_files.end());
    if (!options.output.empty()) io::refuse_output_among_inputs(options.output, inputs);
    for (const auto& path : options.pictures.outputs()) io::refuse_output_among_inputs(path, inputs);
    for (const auto& path : options.species_files) fluids.add_species_file(path);
    pictures = picture_streams(options.pictures, table.system, table.system_forced);
    if (!options.output.empty()) file.emplace(options.output);
  } catch (const Error& e) {
    std::cerr << "error: " << e.what() << '\n';
    return kExitUnusable;
  }
  InputTexts texts;
  if (options.format == "csv" || options.format == "xlsx") choose_csv_columns(options.files, texts, fluids, table);
  io::SinkStream out(file ? static_cast<io::ByteSink&>(*file) : io::standard_output());
  std::unique_ptr<io::ResultStream> results;
  try {
    results = io::make_result_stream(result_format(options.format), out, table);  // a workbook opens its library
  } catch (const Error& e) {
    std::cerr << "error: " << e.what() << '\n';
    return kExitUnusable;
  }
  ResultTee tee(*results, std::move(pictures));
  RunState state;
  try {
    state = rate_files(options, fluids, tee, texts);
    out.flush();
    if (file && state.file_unusable) {
      // Exit 2 leaves an existing output file as it was (the temporary file goes with `file`):
      // the results of some inputs must not pass for the run's.
      std::cerr << fmt::format("error: {}: not written, since an input could not be used\n", options.output);
    } else if (file) {
      file->commit();
    }
  } catch (const Error& e) {
    std::cerr << "error: " << e.what() << '\n';
    return kExitUnusable;
  }
  if (state.file_unusable || tee.failed()) return kExitUnusable;
  if (state.case_failed) return kExitCaseFailed;
  return state.guarantee_failed ? kExitGuaranteeFailed : kExitOk;
}

// --jobs: a whole number of threads, at least 1. (CLI11's PositiveNumber answered 0 with the
// whole range of a double, 309 digits.) A number too large for `unsigned` is taken as the
// largest one: the cap in batch_command.cpp then says how many threads are used.
const CLI::Validator kThreadCount(
    [](std::string& text) -> std::string {
      const bool digits = !text.empty() && text.find_first_not_of("0123456789") == std::string::npos;
      if (!digits || text.find_first_not_of('0') == std::string::npos) {
        return fmt::format("expected a whole number of threads, at least 1; got \"{}\"", text);
      }
      if (text.size() > 9) text = "999999999";
      return "";
    },
    "THREADS");

bool ends_with(const std::string& text, std::string_view suffix) {
  return text.size() >= suffix.size() && text.compare(text.size() - suffix.size(), suffix.size(), suffix) == 0;
}

// A CSV file or --case: the batch form. Returns the exit status.
int run_rate_batch(const RateOptions& options) {
  const std::string& first = options.files.front();
  if (options.template_file.empty()) {
    std::cerr << fmt::format("error: {}: a CSV file of test points needs its template case: --case TEMPLATE.json\n",
                             first);
    return kExitUnusable;
  }
  if (options.files.size() != 1) {
    std::cerr << fmt::format("error: --case rates one CSV file of test points; {} files were given\n",
                             options.files.size());
    return kExitUnusable;
  }
  if (options.format_given && options.format != "csv" && options.format != "jsonl" && options.format != "xlsx") {
    std::cerr << fmt::format(
        "error: --format {} is for JSON case files; a batch of test points writes csv, jsonl or xlsx\n",
        options.format);
    return kExitUnusable;
  }
  if (!options.pictures.report.empty()) {
    std::cerr << "error: --report writes the cases of JSON case files; a batch of test points draws its chart with "
                 "--plot FILE\n";
    return kExitUnusable;
  }
  BatchCommandOptions batch;
  batch.points = first;
  batch.template_file = options.template_file;
  batch.format = options.format_given ? options.format : "csv";
  batch.units = options.units;
  batch.output = options.output;
  batch.jobs = options.jobs;
  batch.quiet = options.quiet;
  batch.species_files = options.species_files;
  batch.columns = options.columns;
  batch.plot = options.pictures.plot;
  return run_batch(batch);
}

}  // namespace

void install_rate(CLI::App& sub, int& exit_status) {
  auto options = std::make_shared<RateOptions>();
  sub.add_option("files", options->files,
                 "JSON case files, or with --case one CSV file of test points; - reads standard input")
      ->required();
  auto* format = sub.add_option("--format", options->format,
                                "Output format (jsonl: one result per line; xlsx: a workbook, with -o; a batch writes csv, jsonl or xlsx)")
                     ->check(CLI::IsMember({"table", "json", "csv", "jsonl", "xlsx"}))
                     ->capture_default_str();
  auto* units = sub.add_option("--units", options->units,
                                "Units of table and csv output (json is always SI); a table otherwise shows each "
                                "case in the units it was given in")
                     ->check(CLI::IsMember({"si", "us"}))
                     ->capture_default_str();
  sub.add_option("--columns", options->columns,
                 "Result columns of a batch's csv, by dotted result key (comma-separated); default: the usual set")
      ->delimiter(',');
  sub.add_option("-o,--output", options->output, "Write the results to this file (whole or not at all)");
  sub.add_option("--species-file", options->species_files,
                 "Extra species in the NASA 9-coefficient format (may be repeated)");
  sub.add_option("--case", options->template_file,
                 "Template case file for a CSV of test points: what every row shares (docs/batch.md)");
  sub.add_option("--jobs", options->jobs, "Threads for a batch (default: every core; at most 4 a core)")
      ->transform(kThreadCount);
  sub.add_flag("--quiet", options->quiet, "No progress line for a long batch");
  add_picture_options(sub, options->pictures);
  sub.callback([options, format, units, &exit_status] {
    options->format_given = format->count() > 0;
    options->units_given = units->count() > 0;
    const bool batch = !options->template_file.empty() ||
                       std::any_of(options->files.begin(), options->files.end(),
                                   [](const std::string& f) { return ends_with(f, ".csv") || ends_with(f, ".CSV"); });
    if (options->format == "xlsx" && options->output.empty()) {
      std::cerr << "error: --format xlsx writes a workbook file: give it with -o FILE.xlsx\n";
      exit_status = kExitUnusable;
      return;
    }
    exit_status = batch ? run_rate_batch(*options) : run_rate(*options);
  });
}

}  // namespace shaftwork::cli

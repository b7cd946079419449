// shaftwork rate FILE... — rate the cases of JSON case files; with --case, the rows of
// a CSV file of test points (batch_command.cpp).
#include <unistd.h>

#include <algorithm>
#include <iostream>
#include <iterator>
#include <memory>
#include <optional>
#include <sstream>
#include <string>
#include <string_view>
#include <vector>

#include <fmt/format.h>

#include "batch_command.hpp"
#include "commands.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/atomic_file.hpp"
#include "shaftwork/io/case_runner.hpp"
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
};


// Each case's warnings and, for a failed case, its error, on standard error (the results
// keep them too). Returns whether a case failed.
bool report_cases(const std::vector<io::CaseOutcome>& outcomes) {
  bool case_failed = false;
  for (const auto& o : outcomes) {
    for (const auto& w : o.warnings) std::cerr << fmt::format("warning: case \"{}\": {}\n", o.id, w);
    if (!o.ok()) {
      case_failed = true;
      std::cerr << fmt::format("error: case \"{}\": {}\n", o.id, o.error);
    } else if (!o.guarantee_error.empty()) {
      case_failed = true;
      std::cerr << fmt::format("error: case \"{}\": {}\n", o.id, o.guarantee_error);
    }
  }
  return case_failed;
}

// Each file-level guarantee that could not be judged, on standard error. Returns whether one
// could not be judged.
bool report_tests(const std::vector<io::TestOutcome>& tests) {
  bool failed = false;
  for (const auto& t : tests) {
    for (const auto& w : t.warnings) std::cerr << fmt::format("warning: {}: {}\n", t.origin, w);
    if (!t.result) {
      failed = true;
      std::cerr << fmt::format("error: {}: {}\n", t.origin, t.error);
    }
  }
  return failed;
}

// Exit 3 (the contract): every case rated, and a guarantee not met.
bool guarantee_failed(const std::vector<io::CaseOutcome>& outcomes, const std::vector<io::TestOutcome>& tests) {
  return std::any_of(outcomes.begin(), outcomes.end(), [](const io::CaseOutcome& o) { return o.guarantee_failed(); }) ||
         std::any_of(tests.begin(), tests.end(), [](const io::TestOutcome& t) { return t.failed(); });
}

std::string format_results(const std::vector<io::CaseOutcome>& outcomes, const std::vector<io::TestOutcome>& tests,
                           const RateOptions& options) {
  const io::UnitSystem system = options.units == "us" ? io::UnitSystem::us : io::UnitSystem::si;
  std::ostringstream text;
  if (options.format == "json") {
    io::write_json(text, outcomes, tests);
  } else if (options.format == "jsonl") {
    for (const auto& o : outcomes) text << io::result_json(o).dump() << '\n';
  } else if (options.format == "csv") {
    io::write_csv(text, outcomes, system);
  } else {
    io::TableOptions table;
    table.system = system;
    table.system_forced = options.units_given;
    table.show_origin = options.files.size() > 1;
    io::write_table(text, outcomes, table, tests);
  }
  return text.str();
}

int run_rate(const RateOptions& options) {
  io::FluidFactory fluids;
  std::optional<io::OutputFile> file;  // opened first: a path it refuses costs no rating
  try {
    std::vector<std::string> inputs = options.files;
    inputs.insert(inputs.end(), options.species_files.begin(), options.species_files.end());
    if (!options.output.empty()) io::refuse_output_among_inputs(options.output, inputs);
    for (const auto& path : options.species_files) fluids.add_species_file(path);
    if (!options.output.empty()) file.emplace(options.output);
  } catch (const Error& e) {
    std::cerr << "error: " << e.what() << '\n';
    return kExitUnusable;
  }
  bool file_unusable = false;
  std::vector<io::CaseOutcome> outcomes;
  std::vector<io::TestOutcome> tests;  // the files' own guarantees
  for (const auto& path : options.files) {
    const std::string origin = path == "-" ? "standard input" : path;
    try {
      const auto document = io::parse_json_strict(io::read_text_file(path), origin);
      auto rated = io::rate_file(document, origin, fluids);
      for (auto& o : rated.cases) outcomes.push_back(std::move(o));
      if (rated.test) tests.push_back(std::move(*rated.test));
    } catch (const Error& e) {
      std::cerr << "error: " << e.what() << '\n';
      file_unusable = true;
    }
  }
  const std::string text = format_results(outcomes, tests, options);
  const bool cases_failed = report_cases(outcomes);  // both report: each prints its messages
  const bool tests_failed = report_tests(tests);
  const bool case_failed = cases_failed || tests_failed;
  if (!file) {
    std::cout << text << std::flush;
  } else if (file_unusable) {
    // Exit 2 leaves an existing output file as it was (the temporary file goes with `file`):
    // the results of some inputs must not pass for the run's.
    std::cerr << fmt::format("error: {}: not written, since an input could not be used\n", options.output);
  } else {
    try {
      file->write(text);
      file->commit();
    } catch (const Error& e) {
      std::cerr << "error: " << e.what() << '\n';
      return kExitUnusable;
    }
  }
  if (file_unusable) return kExitUnusable;
  if (case_failed) return kExitCaseFailed;
  return guarantee_failed(outcomes, tests) ? kExitGuaranteeFailed : kExitOk;
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
  if (options.format_given && options.format != "csv" && options.format != "jsonl") {
    std::cerr << fmt::format("error: --format {} is for JSON case files; a batch of test points writes csv or jsonl\n",
                             options.format);
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
  return run_batch(batch);
}

}  // namespace

void install_rate(CLI::App& sub, int& exit_status) {
  auto options = std::make_shared<RateOptions>();
  sub.add_option("files", options->files,
                 "JSON case files, or with --case one CSV file of test points; - reads standard input")
      ->required();
  auto* format = sub.add_option("--format", options->format,
                                "Output format (jsonl: one result per line; a batch writes csv or jsonl)")
                     ->check(CLI::IsMember({"table", "json", "csv", "jsonl"}))
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
  sub.callback([options, format, units, &exit_status] {
    options->format_given = format->count() > 0;
    options->units_given = units->count() > 0;
    const bool batch = !options->template_file.empty() ||
                       std::any_of(options->files.begin(), options->files.end(),
                                   [](const std::string& f) { return ends_with(f, ".csv") || ends_with(f, ".CSV"); });
    exit_status = batch ? run_rate_batch(*options) : run_rate(*options);
  });
}

}  // namespace shaftwork::cli

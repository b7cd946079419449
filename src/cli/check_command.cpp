// shaftwork check FILE|DIR... — rate every case, hold each to its `expect` block and, with
// --baseline, to its recorded result; report one line per case and "N passed, N failed"
// (docs/check.md). Directories are searched for *.json case files.
#include <algorithm>
#include <cctype>
#include <cmath>
#include <filesystem>
#include <iostream>
#include <memory>
#include <optional>
#include <set>
#include <sstream>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "commands.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/atomic_file.hpp"
#include "shaftwork/io/baseline.hpp"
#include "shaftwork/io/case_check.hpp"
#include "shaftwork/io/case_reader.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/junit_xml.hpp"
#include "shaftwork/io/result_keys.hpp"
#include "shaftwork/io/text_file.hpp"

namespace shaftwork::cli {
namespace {

namespace fs = std::filesystem;

struct CheckOptions {
  std::vector<std::string> paths;
  std::string baseline;
  std::string record;
  std::string junit;
  double rtol = 1e-6;
  std::vector<std::string> ignore;
  std::vector<std::string> species_files;
};

// A file to check: as named (for reading and messages), and whether a directory search
// found it (then a JSON file that is not a case file is skipped, not refused).
struct CaseFile {
  std::string path;
  bool found_in_directory = false;
};

struct CheckRun {
  io::FluidFactory fluids;
  std::optional<io::Baseline> baseline;
  io::CompareOptions compare;
  std::vector<io::CaseCheck> checks;
  bool keep_outcomes = false;             // --record: the results are written at the end
  std::vector<io::CaseOutcome> outcomes;  // kept only then
  io::CaseIdRegister ids;
};

bool is_json_name(const fs::path& p) {
  std::string ext = p.extension().string();
  std::transform(ext.begin(), ext.end(), ext.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return ext == ".json";
}

// The *.json regular files below `dir`, sorted by path. Throws bad_input when the
// directory cannot be read.
std::vector<std::string> json_files_below(const std::string& dir) {
  std::vector<std::string> found;
  std::error_code ec;
  fs::recursive_directory_iterator it(dir, ec), end;
  for (; !ec && it != end; it.increment(ec)) {
    std::error_code type_ec;
    if (is_json_name(it->path()) && it->is_regular_file(type_ec)) found.push_back(it->path().generic_string());
  }
  if (ec) throw Error(ErrorKind::bad_input, fmt::format("{}: cannot search the directory: {}", dir, ec.message()));
  std::sort(found.begin(), found.end());
  return found;
}

// The case files the arguments name: files as given, directories expanded; each file once.
// A directory that cannot be searched or holds no *.json file becomes an unusable check.
std::vector<CaseFile> case_files(const std::vector<std::string>& paths, std::vector<io::CaseCheck>& unusable) {
  std::vector<CaseFile> files;
  std::set<std::string> seen;
  const auto add = [&](const std::string& path, bool in_directory) {
    if (seen.insert(io::normal_file_name(path)).second) files.push_back({path, in_directory});
  };
  for (const std::string& path : paths) {
    std::error_code ec;
    if (path == "-" || !fs::is_directory(path, ec)) {
      add(path, false);
      continue;
    }
    try {
      const std::vector<std::string> found = json_files_below(path);
      if (found.empty()) {
        throw Error(ErrorKind::bad_input, fmt::format("{}: no *.json case file in this directory or below", path));
      }
      for (const std::string& f : found) add(f, true);
    } catch (const Error& e) {
      unusable.push_back({io::Verdict::unusable, io::normal_file_name(path), "", {e.what()}});
    }
  }
  return files;
}

bool is_case_file(const nlohmann::json& document) {
  return document.is_object() && (document.contains("cases") || document.contains("machine"));
}

// Rates and checks the cases of one file, printing their lines.
void check_file(const CaseFile& file, CheckRun& run) {
  const std::string origin = file.path == "-" ? "standard input" : io::normal_file_name(file.path);
  std::ostringstream lines;
  try {
    const auto document = io::parse_json_strict(io::read_text_file(file.path), origin);
    if (file.found_in_directory && !is_case_file(document)) {
      std::cerr << fmt::format("notice: {}: not a case file (no \"cases\" and no \"machine\"), skipped\n", origin);
      return;
    }
    const auto cases = io::case_objects(document, origin);
    auto outcomes = io::rate_document(document, origin, run.fluids);
    for (std::size_t i = 0; i < outcomes.size(); ++i) {
      run.ids.check(outcomes[i], i);
      run.checks.push_back(io::check_case(outcomes[i], *cases[i], run.baseline ? &*run.baseline : nullptr, run.compare));
      io::write_check_lines(lines, run.checks.back());
      if (run.keep_outcomes) run.outcomes.push_back(std::move(outcomes[i]));
    }
  } catch (const Error& e) {
    run.checks.push_back({io::Verdict::unusable, origin, "", {e.what()}});
    io::write_check_lines(lines, run.checks.back());
  }
  std::cout << lines.str();
}

// Writes an output file whole or not at all; false (with the message) when it cannot.
bool write_output(const std::string& path, const std::string& text) {
  try {
    io::OutputFile file(path);
    file.write(text);
    file.commit();
    return true;
  } catch (const Error& e) {
    std::cerr << "error: " << e.what() << '\n';
    return false;
  }
}

// Sets up a run from the options; false (with the message) when they cannot be used.
bool prepare(const CheckOptions& options, CheckRun& run) {
  try {
    if (!std::isfinite(options.rtol) || options.rtol < 0) {
      throw Error(ErrorKind::bad_input, fmt::format("--rtol: expected a finite number of at least 0, got {}", options.rtol));
    }
    for (const std::string& key : options.ignore) {
      if (io::find_result_key(key) == nullptr) {
        throw Error(ErrorKind::bad_input, "--ignore: " + io::no_result_key(key));
      }
    }
    run.compare = {options.rtol, options.ignore};
    for (const auto& path : options.species_files) run.fluids.add_species_file(path);
    if (!options.baseline.empty()) {
      run.baseline.emplace(io::read_text_file(options.baseline), options.baseline);
    }
  } catch (const Error& e) {
    std::cerr << "error: " << e.what() << '\n';
    return false;
  }
  run.keep_outcomes = !options.record.empty();
  return true;
}

// The exit status of the checks: 2, 1, 3, 0, the highest applicable first.
int exit_status_of(const std::vector<io::CaseCheck>& checks) {
  const auto any = [&](io::Verdict v) {
    return std::any_of(checks.begin(), checks.end(), [v](const io::CaseCheck& c) { return c.verdict == v; });
  };
  if (any(io::Verdict::unusable)) return kExitUnusable;
  if (any(io::Verdict::error)) return kExitCaseFailed;
  if (any(io::Verdict::failed) || any(io::Verdict::missing)) return kExitCheckFailed;
  return kExitOk;
}

// --junit and --record (not when a case could not be rated: a baseline holds every case);
// false when a file could not be written.
bool write_outputs(const CheckOptions& options, const CheckRun& run, int status) {
  bool written = true;
  if (!options.junit.empty()) {
    std::ostringstream xml;
    io::write_junit(xml, run.checks);
    written = write_output(options.junit, xml.str());
  }
  if (!options.record.empty()) {
    if (status == kExitUnusable || status == kExitCaseFailed) {  // the status says so already
      std::cerr << fmt::format("error: {}: not recorded, since not every case was rated\n", options.record);
      return written;
    }
    std::ostringstream json;
    io::write_results(json, io::ResultFormat::json, run.outcomes);
    written = write_output(options.record, json.str()) && written;
  }
  return written;
}

// Whether --record or --junit names one of the case files, which it would replace.
bool output_among_inputs(const CheckOptions& options, const std::vector<CaseFile>& files) {
  for (const std::string& output : {options.record, options.junit}) {
    for (const CaseFile& f : files) {
      std::error_code ec;
      if (output.empty() || f.path == "-" || !fs::equivalent(output, f.path, ec)) continue;
      std::cerr << fmt::format("error: {}: is also a case file of this run; write the output to another file\n",
                               output);
      return true;
    }
  }
  return false;
}

int run_check(const CheckOptions& options) {
  CheckRun run;
  if (!prepare(options, run)) return kExitUnusable;
  const std::vector<CaseFile> files = case_files(options.paths, run.checks);
  if (output_among_inputs(options, files)) return kExitUnusable;
  for (const io::CaseCheck& c : run.checks) io::write_check_lines(std::cout, c);  // directories that gave nothing
  for (const CaseFile& file : files) check_file(file, run);
  if (run.baseline) {
    std::ostringstream lines;
    for (const io::RecordedResult* recorded : run.baseline->untaken()) {
      run.checks.push_back(io::missing_case(*recorded));
      io::write_check_lines(lines, run.checks.back());
    }
    std::cout << lines.str();
  }
  std::cout << io::summary_line(run.checks) << '\n' << std::flush;
  const int status = exit_status_of(run.checks);
  if (!write_outputs(options, run, status)) return kExitUnusable;
  return status;
}

}  // namespace

void install_check(CLI::App& sub, int& exit_status) {
  auto options = std::make_shared<CheckOptions>();
  sub.add_option("paths", options->paths,
                 "Case files, or directories searched (recursively) for *.json case files; - reads standard input")
      ->required();
  sub.add_option("--baseline", options->baseline,
                 "Compare every numeric result key with these recorded results (rate --format json, check --record)");
  sub.add_option("--record", options->record,
                 "Write the results of this run as the baseline (the JSON of rate --format json; whole or not at all)");
  sub.add_option("--rtol", options->rtol,
                 "Relative tolerance of baseline keys and of expectations that give none")
      ->capture_default_str();
  sub.add_option("--ignore", options->ignore, "Result keys the baseline comparison skips (comma-separated)")
      ->delimiter(',');
  sub.add_option("--junit", options->junit, "Also write the checks as JUnit XML to this file (whole or not at all)");
  sub.add_option("--species-file", options->species_files,
                 "Extra species in the NASA 9-coefficient format (may be repeated)");
  sub.callback([options, &exit_status] { exit_status = run_check(*options); });
}

}  // namespace shaftwork::cli

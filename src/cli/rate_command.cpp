// shaftwork rate FILE... — rate the cases of JSON case files.
#include <unistd.h>

#include <fstream>
#include <iostream>
#include <iterator>
#include <memory>
#include <sstream>
#include <string>
#include <vector>

#include <fmt/format.h>

#include "commands.hpp"
#include "shaftwork/error.hpp"
#include "shaftwork/io/atomic_file.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::cli {
namespace {

struct RateOptions {
  std::vector<std::string> files;
  std::string format = "table";
  std::string units = "si";
  std::string output;
  std::vector<std::string> species_files;
};

// The whole text of a file, or of standard input for "-".
std::string read_input(const std::string& path) {
  if (path == "-") {
    return std::string(std::istreambuf_iterator<char>(std::cin), std::istreambuf_iterator<char>());
  }
  std::ifstream file(path, std::ios::binary);
  if (!file) throw Error(ErrorKind::bad_input, fmt::format("{}: cannot read the file", path));
  std::ostringstream text;
  text << file.rdbuf();
  if (file.bad()) throw Error(ErrorKind::bad_input, fmt::format("{}: cannot read the file", path));
  return text.str();
}

int run_rate(const RateOptions& options) {
  io::FluidFactory fluids;
  try {
    for (const auto& path : options.species_files) fluids.add_species_file(path);
  } catch (const Error& e) {
    std::cerr << "error: " << e.what() << '\n';
    return kExitUnusable;
  }
  bool file_unusable = false;
  std::vector<io::CaseOutcome> outcomes;
  for (const auto& path : options.files) {
    const std::string origin = path == "-" ? "standard input" : path;
    try {
      const auto document = io::parse_json_strict(read_input(path), origin);
      auto rated = io::rate_document(document, origin, fluids);
      for (auto& o : rated) outcomes.push_back(std::move(o));
    } catch (const Error& e) {
      std::cerr << "error: " << e.what() << '\n';
      file_unusable = true;
    }
  }

  const io::UnitSystem system = options.units == "us" ? io::UnitSystem::us : io::UnitSystem::si;
  std::ostringstream text;
  if (options.format == "json") {
    io::write_json(text, outcomes);
  } else if (options.format == "csv") {
    io::write_csv(text, outcomes, system);
  } else {
    io::write_table(text, outcomes, system);
  }

  bool case_failed = false;
  for (const auto& o : outcomes) {
    if (!o.ok()) {
      case_failed = true;
      std::cerr << fmt::format("error: case \"{}\": {}\n", o.id, o.error);
    }
  }
  if (options.output.empty()) {
    std::cout << text.str() << std::flush;
  } else {
    try {
      io::write_file_atomically(options.output, text.str());
    } catch (const Error& e) {
      std::cerr << "error: " << e.what() << '\n';
      return kExitUnusable;
    }
  }
  if (file_unusable) return kExitUnusable;
  return case_failed ? kExitCaseFailed : kExitOk;
}

}  // namespace

void install_rate(CLI::App& sub, int& exit_status) {
  auto options = std::make_shared<RateOptions>();
  sub.add_option("files", options->files, "JSON case files; - reads standard input")->required();
  sub.add_option("--format", options->format, "Output format")
      ->check(CLI::IsMember({"table", "json", "csv"}))
      ->capture_default_str();
  sub.add_option("--units", options->units, "Units of table and csv output (json is always SI)")
      ->check(CLI::IsMember({"si", "us"}))
      ->capture_default_str();
  sub.add_option("-o,--output", options->output, "Write the results to this file (whole or not at all)");
  sub.add_option("--species-file", options->species_files,
                 "Extra species in the NASA 9-coefficient format (may be repeated)");
  sub.callback([options, &exit_status] { exit_status = run_rate(*options); });
}

}  // namespace shaftwork::cli

// shaftwork rate POINTS.csv --case TEMPLATE.json — the batch form of rate.
#pragma once

#include <string>
#include <vector>

namespace shaftwork::cli {

struct BatchCommandOptions {
  std::string points;         // the CSV file, or "-" for standard input
  std::string template_file;  // the case file holding the template case
  std::string format;         // "csv", "jsonl" or "xlsx"
  std::string units;          // "si" or "us"
  std::string output;         // -o FILE, or "" for standard output
  unsigned jobs = 0;          // 0: every core
  bool quiet = false;
  std::vector<std::string> species_files;
  std::vector<std::string> columns;  // --columns: result keys; empty for the defaults
  std::string plot;                  // --plot FILE.svg|.png|.pdf: the batch chart; "" for none
};

// Runs a batch and returns the exit status (0 every row rated, 1 a row failed,
// 2 the template, the CSV header or an output could not be used).
int run_batch(const BatchCommandOptions& options);

}  // namespace shaftwork::cli

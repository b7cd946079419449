// --plot, --plot-diagram and --report, shared by rate and check: the options, and the
// result streams that draw what they ask for beside the results.
#pragma once

#include <memory>
#include <string>
#include <vector>

#include <CLI/CLI.hpp>

#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::cli {

struct PictureOptions {
  std::string plot;              // --plot FILE.svg|.png|.pdf
  std::string diagram = "h-s";   // --plot-diagram h-s|T-s
  std::string report;            // --report FILE.pdf

  bool any() const { return !plot.empty() || !report.empty(); }
  std::vector<std::string> outputs() const;  // the files named
};

void add_picture_options(CLI::App& sub, PictureOptions& options);

// Results go to `results` and to every picture stream. A picture that cannot be drawn or
// written is reported on standard error once, its stream dropped, and failed() set: the
// results themselves are still written.
class ResultTee final : public io::ResultStream {
 public:
  ResultTee(io::ResultStream& results, std::vector<std::unique_ptr<io::ResultStream>> pictures);
  void add(const io::CaseOutcome& outcome) override;
  void add_test(const io::TestOutcome& test) override;
  void finish() override;
  bool failed() const { return failed_; }

 private:
  template <class Act>
  void each_picture(Act act);

  io::ResultStream& results_;
  std::vector<std::unique_ptr<io::ResultStream>> pictures_;
  bool failed_ = false;
};

// The picture streams the options ask for. Throws bad_input for a file name they cannot use.
std::vector<std::unique_ptr<io::ResultStream>> picture_streams(const PictureOptions& options, io::UnitSystem system,
                                                               bool system_forced);

}  // namespace shaftwork::cli

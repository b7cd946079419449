#include "picture_options.hpp"

#include <iostream>

#include "shaftwork/charts/plot_stream.hpp"
#include "shaftwork/charts/report.hpp"
#include "shaftwork/error.hpp"

namespace shaftwork::cli {

std::vector<std::string> PictureOptions::outputs() const {
  std::vector<std::string> out;
  for (const std::string& f : {plot, report}) {
    if (!f.empty()) out.push_back(f);
  }
  return out;
}

void add_picture_options(CLI::App& sub, PictureOptions& options) {
  sub.add_option("--plot", options.plot,
                 "Draw each rated case's process chart, and each guarantee's chart, into this file: .svg, .png or "
                 ".pdf (several cases: FILE-<id>.svg/.png, or one PDF page each)");
  sub.add_option("--plot-diagram", options.diagram, "The process chart's axes: h-s (enthalpy) or T-s (temperature)")
      ->check(CLI::IsMember({"h-s", "T-s"}))
      ->capture_default_str();
  sub.add_option("--report", options.report,
                 "Write a test report of the cases into this PDF: one A4 page each (readable on Letter too)");
}

ResultTee::ResultTee(io::ResultStream& results, std::vector<std::unique_ptr<io::ResultStream>> pictures)
    : results_(results), pictures_(std::move(pictures)) {}

template <class Act>
void ResultTee::each_picture(Act act) {
  for (auto& p : pictures_) {
    if (!p) continue;
    try {
      act(*p);
    } catch (const Error& e) {
      std::cerr << "error: " << e.what() << '\n';
      p.reset();
      failed_ = true;
    }
  }
}

void ResultTee::add(const io::CaseOutcome& outcome) {
  results_.add(outcome);
  each_picture([&](io::ResultStream& p) { p.add(outcome); });
}

void ResultTee::add_test(const io::TestOutcome& test) {
  results_.add_test(test);
  each_picture([&](io::ResultStream& p) { p.add_test(test); });
}

void ResultTee::finish() {
  results_.finish();
  each_picture([](io::ResultStream& p) { p.finish(); });
}

std::vector<std::unique_ptr<io::ResultStream>> picture_streams(const PictureOptions& options, io::UnitSystem system,
                                                               bool system_forced) {
  std::vector<std::unique_ptr<io::ResultStream>> streams;
  charts::ProcessChartOptions chart;
  chart.diagram = options.diagram == "T-s" ? charts::Diagram::temperature_entropy : charts::Diagram::enthalpy_entropy;
  chart.system = system;
  chart.system_forced = system_forced;
  if (!options.plot.empty()) streams.push_back(charts::make_plot_stream(options.plot, chart));
  if (!options.report.empty()) {
    charts::ReportOptions report;
    report.chart = chart;
    report.table.system = system;
    report.table.system_forced = system_forced;
    streams.push_back(charts::make_report_stream(options.report, report));
  }
  return streams;
}

}  // namespace shaftwork::cli

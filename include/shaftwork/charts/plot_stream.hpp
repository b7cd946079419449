// shaftwork/charts/plot_stream.hpp — `--plot FILE`: a process chart of every rated case.
//
// The format comes from FILE's extension. A PDF gets one page per rated case. An SVG or
// PNG holds one chart: a run of one case writes FILE itself; a run of several writes
// FILE-<id>.ext for each (the id made safe for a file name; a repeated one gets -2, -3...).
// A case that was not rated gets no chart (its error is reported with the results).
// Each file is written whole or not at all (io::OutputFile).
#pragma once

#include <memory>
#include <string>

#include "shaftwork/charts/process_chart.hpp"
#include "shaftwork/io/result_writer.hpp"

namespace shaftwork::charts {

// Checks FILE's extension at once (bad_input, see image_format_of) so a bad name costs no rating.
std::unique_ptr<io::ResultStream> make_plot_stream(const std::string& path, const ProcessChartOptions& options);

// FILE-<id>.ext for a case of a run of several: letters, digits, '.', '_' and '-' of the id
// are kept, any other run of characters becomes one '_'.
std::string case_file_name(const std::string& path, const std::string& id);

}  // namespace shaftwork::charts

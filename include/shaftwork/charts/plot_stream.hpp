// shaftwork/charts/plot_stream.hpp — `--plot FILE`: a process chart of every rated case,
// and a guarantee chart of every guarantee judged on a curve (charts/guarantee_chart.hpp).
//
// The format comes from FILE's extension. A PDF gets one page per rated case, followed by
// a page for its own guarantee, and a page for a file's test after the file's cases. An
// SVG or PNG holds one chart: a run of one case writes FILE itself and FILE-guarantee.ext;
// a run of several writes FILE-<id>.ext and FILE-<id>-guarantee.ext for each (the id made
// safe for a file name; a repeated one gets -2, -3...). A file's test writes
// FILE-<file's stem>-guarantee.ext. A case that was not rated, a guarantee that could not
// be judged and a turbine's guarantee get no chart (the results say why).
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

// The batch rater: the CSV header becomes a plan (batch_plan.cpp), built once; chunks of
// rows are rated by workers (batch_rows.cpp, worker_pool.cpp) and written in input order.
// Nothing per row goes through JSON (except the jsonl output itself).
#include "shaftwork/io/batch.hpp"
#include "shaftwork/io/guarantee_reader.hpp"

#include <algorithm>
#include <chrono>
#include <deque>
#include <memory>

#include <fmt/format.h>

#include "batch_plan.hpp"
#include "batch_rows.hpp"
#include "shaftwork/io/case_runner.hpp"
#include "shaftwork/io/uncertainty_input.hpp"
#include "workbook.hpp"
#include "shaftwork/error.hpp"
#include "worker_pool.hpp"

namespace shaftwork::io {
namespace {

[[noreturn]] void refuse(const std::string& message) { throw Error(ErrorKind::bad_input, message); }

// The header: the first record of the first chunk, taken out of it.
std::vector<std::string> read_header(Job& first, const std::string& points_name, std::size_t& header_line) {
  CsvRecordParser parser(first.chunk.text, first.chunk.first_line);
  CsvRecord record;
  if (!parser.next(record)) refuse(fmt::format("{}: the input is empty: expected a header row", points_name));
  if (!record.error.empty()) refuse(fmt::format("{}: line {}: {}", points_name, record.line, record.error));
  header_line = record.line;
  // A header that takes the whole input and holds a carriage return: the lines end with CR
  // alone (classic Mac OS), which RFC 4180 does not know; its cells would run together.
  const bool whole_input = parser.position() == first.chunk.text.size();
  if (whole_input && std::any_of(record.fields.begin(), record.fields.end(),
                                 [](std::string_view f) { return f.find('\r') != std::string_view::npos; })) {
    refuse(fmt::format("{}: the lines end with a carriage return alone; save the file with LF or CRLF line ends",
                       points_name));
  }
  std::vector<std::string> header(record.fields.begin(), record.fields.end());
  first.chunk.text.erase(0, parser.position());
  first.chunk.first_line = parser.line();
  return header;
}

// Chunk sizes that keep each chunk near kChunkSeconds of work: large chunks for fast rows
// (less hand-off), small ones for slow rows (every worker busy, progress at least every
// second).
class ChunkSizer {
 public:
  explicit ChunkSizer(std::size_t largest) : largest_(largest), next_(std::min<std::size_t>(largest, 16 * 1024)) {}
  std::size_t next() const { return next_; }
  void observe(std::size_t bytes, double seconds) {
    if (bytes == 0) return;
    const double wanted = static_cast<double>(bytes) * kChunkSeconds / std::max(seconds, 1e-6);
    next_ = static_cast<std::size_t>(std::clamp(wanted, 512.0, static_cast<double>(largest_)));
  }

 private:
  static constexpr double kChunkSeconds = 0.05;
  std::size_t largest_;
  std::size_t next_;
};

double seconds_since(std::chrono::steady_clock::time_point start) {
  return std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
}

}  // namespace

BatchTemplate read_batch_template(const nlohmann::json& document, const std::string& origin, FluidFactory& fluids) {
  const auto cases = case_objects(document, origin);
  if (cases.size() != 1) {
    refuse(fmt::format("{}: a template holds one case; this file holds {}", origin, cases.size()));
  }
  BatchTemplate templ;
  // The file's uncertainties by key stand beside the case's own (which win).
  const std::vector<StatedUncertainty> file_statements = file_uncertainty(document, origin);
  try {
    templ.input = read_case(*cases.front(), 0, fluids, origin);
    std::vector<StatedUncertainty>& statements = templ.input.uncertainty_by_key;
    for (const StatedUncertainty& s : file_statements) {
      const auto stated = [&](const StatedUncertainty& own) { return own.input == s.input; };
      if (std::none_of(statements.begin(), statements.end(), stated)) statements.push_back(s);
    }
    apply_uncertainty_by_key(templ.input, statements);
    // The template's guarantee, in its case or beside "cases": every row is judged against it.
    const std::string key(kGuaranteeKey);
    const nlohmann::json* g = cases.front()->contains(key) ? &(*cases.front())[key]
                              : document.contains(key)      ? &document[key]
                                                            : nullptr;
    if (g) {
      templ.guarantee = read_guarantee(*g, templ.input.machine, fluids, templ.input.barometer(), templ.input.warnings);
    }
  } catch (const Error& e) {
    refuse(fmt::format("{}: {}", origin, e.what()));
  } catch (const nlohmann::json::exception& e) {
    refuse(fmt::format("{}: unexpected JSON content: {}", origin, e.what()));
  }
  return templ;
}

namespace {

// Rates the chunks and writes them in order: on the calling thread, or through a pool.
class Pipeline {
 public:
  Pipeline(CsvChunker& chunker, const BatchShared& shared, ByteSink& out, BatchProgress* progress,
           std::size_t size_hint)
      : chunker_(chunker), shared_(shared), out_(out), progress_(progress), size_hint_(size_hint),
        sizer_(shared.options.chunk_bytes) {}

  BatchSummary run(std::unique_ptr<Job> first) {
    if (shared_.options.jobs <= 1) {
      run_here(*first);
    } else {
      run_pooled(std::move(first));
    }
    if (progress_) progress_->finish(summary_.rows);
    return summary_;
  }

 private:
  void run_here(Job& job) {
    RowRater rater(shared_);
    for (bool more = true; more; more = next(job)) {
      const auto chunk_start = std::chrono::steady_clock::now();
      rater.rate_chunk(job.chunk, job.out, job.counts, job.points);
      sizer_.observe(job.chunk.text.size(), seconds_since(chunk_start));
      finish(job);
    }
  }

  // A few chunks per worker in flight: enough to keep every worker busy while the oldest
  // is written, few enough that memory does not follow the input's length.
  void run_pooled(std::unique_ptr<Job> first) {
    const unsigned jobs = shared_.options.jobs;
    const std::size_t max_in_flight = 2 * static_cast<std::size_t>(jobs) + 1;
    std::vector<std::unique_ptr<Job>> spare;
    std::deque<std::unique_ptr<Job>> in_flight;
    WorkerPool pool(shared_, jobs);
    summary_.threads = pool.threads();
    pool.submit(first.get());
    in_flight.push_back(std::move(first));
    const auto start = std::chrono::steady_clock::now();
    std::size_t bytes_done = 0;
    for (bool more = true; more || !in_flight.empty();) {
      while (more && in_flight.size() < max_in_flight) {
        std::unique_ptr<Job> job = spare.empty() ? std::make_unique<Job>() : std::move(spare.back());
        if (!spare.empty()) spare.pop_back();
        if (!(more = next(*job))) break;
        pool.submit(job.get());
        in_flight.push_back(std::move(job));
      }
      if (in_flight.empty()) break;
      std::unique_ptr<Job> job = std::move(in_flight.front());
      in_flight.pop_front();
      pool.wait(job.get());
      // The pool's throughput so far, per worker, sizes the chunks still to come.
      bytes_done += job->chunk.text.size();
      sizer_.observe(bytes_done / summary_.threads, seconds_since(start));
      finish(*job);
      spare.push_back(std::move(job));
    }
  }

  // The next chunk into `job`, its output and counts cleared; false at the end.
  bool next(Job& job) {
    chunker_.set_target_size(sizer_.next());
    if (!chunker_.next(job.chunk)) return false;
    job.out.clear();
    job.counts = RowCounts{};
    job.points.clear();
    job.done = false;
    return true;
  }

  void finish(Job& job) {
    if (job.error) std::rethrow_exception(job.error);
    out_.write(job.out.view());
    if (BatchPointSink* points = shared_.options.points) {
      for (BatchPoint& p : job.points) {
        p.row += summary_.rows;  // from the chunk's count to the batch's
        points->add(p);
      }
    }
    summary_.rows += job.counts.rows;
    summary_.failed += job.counts.failed;
    summary_.guarantees_failed += job.counts.guarantees_failed;
    summary_.guarantees_not_judged += job.counts.guarantees_not_judged;
    if (progress_) progress_->update(summary_.rows, chunker_.bytes_read(), size_hint_);
  }

  CsvChunker& chunker_;
  const BatchShared& shared_;
  ByteSink& out_;
  BatchProgress* progress_;
  std::size_t size_hint_;
  ChunkSizer sizer_;
  BatchSummary summary_;
};

}  // namespace

BatchSummary rate_batch(ByteSource& points, const std::string& points_name, const BatchTemplate& templ,
                        ByteSink& out, const BatchOptions& options, BatchProgress* progress, BatchNotices* notices) {
  if (options.format == BatchFormat::xlsx) {
    // The csv's rows, turned into cells as they come.
    BatchOptions csv = options;
    csv.format = BatchFormat::csv;
    CsvWorkbookSink book;
    const BatchSummary summary = rate_batch(points, points_name, templ, book, csv, progress, notices);
    book.finish(out);
    return summary;
  }
  CsvChunker chunker(points, points_name, ChunkSizer(options.chunk_bytes).next());
  auto first = std::make_unique<Job>();
  if (!chunker.next(first->chunk)) refuse(fmt::format("{}: the input is empty: expected a header row", points_name));
  std::size_t header_line = 1;
  std::vector<std::string> header = read_header(*first, points_name, header_line);
  const Plan plan = make_plan(std::move(header), header_line, points_name, templ, options);
  if (notices) {
    for (const std::string& n : plan.notices) notices->notice(n);
  }
  if (options.points) options.points->time_column(plan.time_index ? plan.header[*plan.time_index] : "");
  const BatchShared shared(plan, templ, options, points_name);
  if (options.format == BatchFormat::csv) out.write(plan.output_header);
  return Pipeline(chunker, shared, out, progress, points.size_hint()).run(std::move(first));
}

}  // namespace shaftwork::io

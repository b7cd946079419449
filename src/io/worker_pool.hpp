// Worker threads that rate batch chunks. Internal to the io layer.
#pragma once

#include <condition_variable>
#include <cstddef>
#include <deque>
#include <exception>
#include <memory>
#include <mutex>
#include <thread>
#include <vector>

#include "batch_rows.hpp"

namespace shaftwork::io {

// One chunk of input and the output it becomes.
struct Job {
  CsvChunk chunk;
  OutputBuffer out;
  RowCounts counts;
  std::vector<BatchPoint> points;  // when BatchOptions::points is set
  bool done = false;
  std::exception_ptr error;
};

// Worker threads taking jobs from a queue; the caller waits for each job in turn.
// Starts as many of the threads asked for as the system allows (std::thread throws
// std::system_error when it cannot start one: a thread limit, or too little address
// space); with none started, the calling thread rates each job as it is submitted.
class WorkerPool {
 public:
  WorkerPool(const BatchShared& shared, unsigned threads);
  WorkerPool(const WorkerPool&) = delete;
  WorkerPool& operator=(const WorkerPool&) = delete;
  // Jobs not yet started are dropped (the batch is over or failed); running ones finish.
  ~WorkerPool();

  // The threads that rate: those started, or the calling thread alone.
  unsigned threads() const { return std::max(1u, static_cast<unsigned>(threads_.size())); }

  void submit(Job* job);
  void wait(Job* job);

 private:
  static void run(RowRater& rater, Job& job);
  void work();

  const BatchShared& shared_;
  std::unique_ptr<RowRater> inline_rater_;
  std::mutex mutex_;
  std::condition_variable work_ready_;
  std::condition_variable job_done_;
  std::deque<Job*> queue_;
  bool closing_ = false;
  std::vector<std::thread> threads_;
};

}  // namespace shaftwork::io

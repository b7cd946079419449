#include "worker_pool.hpp"

#include <algorithm>

namespace shaftwork::io {

WorkerPool::WorkerPool(const BatchShared& shared, unsigned threads) : shared_(shared) {
  try {
    threads_.reserve(threads);
    for (unsigned i = 0; i < threads; ++i) threads_.emplace_back([this] { work(); });
  } catch (const std::exception&) {
    // Run with the threads that started.
  }
}

WorkerPool::~WorkerPool() {
  {
    const std::lock_guard lock(mutex_);
    closing_ = true;
    queue_.clear();
  }
  work_ready_.notify_all();
  for (auto& t : threads_) t.join();
}

void WorkerPool::submit(Job* job) {
  if (threads_.empty()) {
    if (!inline_rater_) inline_rater_ = std::make_unique<RowRater>(shared_);
    run(*inline_rater_, *job);
    job->done = true;
    return;
  }
  {
    const std::lock_guard lock(mutex_);
    queue_.push_back(job);
  }
  work_ready_.notify_one();
}

void WorkerPool::wait(Job* job) {
  std::unique_lock lock(mutex_);
  job_done_.wait(lock, [job] { return job->done; });
}

void WorkerPool::run(RowRater& rater, Job& job) {
  try {
    rater.rate_chunk(job.chunk, job.out, job.counts, job.points);
  } catch (...) {
    job.error = std::current_exception();
  }
}

void WorkerPool::work() {
  // A rater that cannot be made (memory) fails each job this thread takes.
  std::unique_ptr<RowRater> rater;
  std::exception_ptr broken;
  try {
    rater = std::make_unique<RowRater>(shared_);
  } catch (...) {
    broken = std::current_exception();
  }
  for (;;) {
    Job* job = nullptr;
    {
      std::unique_lock lock(mutex_);
      work_ready_.wait(lock, [this] { return closing_ || !queue_.empty(); });
      if (queue_.empty()) return;
      job = queue_.front();
      queue_.pop_front();
    }
    if (rater) {
      run(*rater, *job);
    } else {
      job->error = broken;
    }
    {
      const std::lock_guard lock(mutex_);
      job->done = true;
    }
    job_done_.notify_all();
  }
}

}  // namespace shaftwork::io

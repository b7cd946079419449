#include "worker_pool.hpp"

namespace shaftwork::io {

WorkerPool::WorkerPool(const BatchShared& shared, unsigned threads) {
  for (unsigned i = 0; i < threads; ++i) {
    threads_.emplace_back([this, &shared] { work(shared); });
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

void WorkerPool::work(const BatchShared& shared) {
  RowRater rater(shared);
  for (;;) {
    Job* job = nullptr;
    {
      std::unique_lock lock(mutex_);
      work_ready_.wait(lock, [this] { return closing_ || !queue_.empty(); });
      if (queue_.empty()) return;
      job = queue_.front();
      queue_.pop_front();
    }
    try {
      rater.rate_chunk(job->chunk, job->out, job->rows, job->failed);
    } catch (...) {
      job->error = std::current_exception();
    }
    {
      const std::lock_guard lock(mutex_);
      job->done = true;
    }
    job_done_.notify_all();
  }
}

}  // namespace shaftwork::io

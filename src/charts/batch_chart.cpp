// The batch chart's data: rows into buckets of consecutive rows, merged in pairs as the
// batch grows, each keeping the extremes of its series.
#include "shaftwork/charts/batch_chart.hpp"

#include <cmath>

namespace shaftwork::charts {
namespace {

// Widens `span` by the value v (with its band v -/+ u) of a row at (row, time).
void widen(SeriesSpan& span, double row, double time, double v, double u) {
  if (!std::isfinite(v)) return;
  if (!std::isfinite(span.low.value) || v < span.low.value) span.low = {row, time, v};
  if (!std::isfinite(span.high.value) || v > span.high.value) span.high = {row, time, v};
  if (!std::isfinite(u)) return;
  if (!std::isfinite(span.band_low) || v - u < span.band_low) span.band_low = v - u;
  if (!std::isfinite(span.band_high) || v + u > span.band_high) span.band_high = v + u;
}

// The two spans as one: the lower low, the higher high, the outer band edges.
SeriesSpan joined(const SeriesSpan& a, const SeriesSpan& b) {
  SeriesSpan out = a;
  widen(out, b.low.row, b.low.time, b.low.value, io::BatchPoint::kNone);
  widen(out, b.high.row, b.high.time, b.high.value, io::BatchPoint::kNone);
  for (const double edge : {b.band_low, b.band_high}) {
    if (!std::isfinite(edge)) continue;
    if (!std::isfinite(out.band_low) || edge < out.band_low) out.band_low = edge;
    if (!std::isfinite(out.band_high) || edge > out.band_high) out.band_high = edge;
  }
  return out;
}

BatchBucket joined(const BatchBucket& a, const BatchBucket& b) {
  BatchBucket out = a;
  out.rows += b.rows;
  out.failed += b.failed;
  if (a.failed == 0) out.first_failed = b.first_failed;
  for (std::size_t s = 0; s < kSeriesCount; ++s) out.series[s] = joined(a.series[s], b.series[s]);
  return out;
}

}  // namespace

void BatchChartData::add(const io::BatchPoint& p) {
  if (!buckets_.empty() && buckets_.back().rows == width_ && buckets_.size() == kBatchBuckets) merge_pairs();
  if (buckets_.empty() || buckets_.back().rows == width_) buckets_.emplace_back();
  BatchBucket& b = buckets_.back();
  const auto row = static_cast<double>(p.row);
  if (b.rows == 0) b.first = {row, p.time, io::BatchPoint::kNone};
  ++b.rows;
  ++rows_;
  if (!(p.time >= last_time_)) times_in_order_ = false;  // NaN too: a row without a time
  last_time_ = p.time;
  if (!p.rated) {
    if (b.failed++ == 0) b.first_failed = {row, p.time, io::BatchPoint::kNone};
    ++failed_;
    return;
  }
  widen(b.series[kIsentropic], row, p.time, p.efficiency_isentropic, p.uncertainty_isentropic);
  widen(b.series[kPolytropic], row, p.time, p.efficiency_polytropic, p.uncertainty_polytropic);
  widen(b.series[kBalance], row, p.time, p.balance_percent, io::BatchPoint::kNone);
}

void BatchChartData::merge_pairs() {
  std::vector<BatchBucket> merged;
  merged.reserve(kBatchBuckets);
  for (std::size_t i = 0; i + 1 < buckets_.size(); i += 2) merged.push_back(joined(buckets_[i], buckets_[i + 1]));
  if (buckets_.size() % 2 == 1) merged.push_back(buckets_.back());
  buckets_ = std::move(merged);
  width_ *= 2;
}

}  // namespace shaftwork::charts

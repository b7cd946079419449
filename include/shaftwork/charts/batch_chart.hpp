// shaftwork/charts/batch_chart.hpp — the picture of a CSV batch: the isentropic and
// polytropic efficiencies (with their uncertainty bands where the rows carry them) and
// the power balance difference, against row number or the rows' timestamps, failed rows
// marked, so that drift and bad rows stand out.
//
// Memory stays flat however long the log: BatchChartData hears each row (it is an
// io::BatchPointSink) and keeps at most kBatchBuckets buckets of consecutive rows. A bucket
// holds 1, 2, 4, ... rows (the width doubles, neighbours merging, each time the buckets
// fill) and keeps, per series, its lowest and its highest value with the row and time each
// fell on, the outer edges of the band, and its failed rows (how many, and the first). So
// a single bad row among a million still shows at its own height and place.
#pragma once

#include <array>
#include <cstddef>
#include <string>
#include <vector>

#include <cairo.h>

#include "shaftwork/charts/axes.hpp"
#include "shaftwork/io/batch.hpp"

namespace shaftwork::charts {

inline constexpr std::size_t kBatchBuckets = 1024;

// A value kept from one row, with where it fell; value NaN: none.
struct KeptValue {
  double row = 0, time = io::BatchPoint::kNone, value = io::BatchPoint::kNone;
};

enum BatchSeries : std::size_t { kIsentropic = 0, kPolytropic = 1, kBalance = 2, kSeriesCount = 3 };

struct SeriesSpan {
  KeptValue low, high;
  double band_low = io::BatchPoint::kNone, band_high = io::BatchPoint::kNone;  // value -/+ U, outermost
};

struct BatchBucket {
  std::size_t rows = 0, failed = 0;
  KeptValue first;         // row and time of its first row
  KeptValue first_failed;  // row and time of its first failed row (rows > 0 when failed > 0)
  std::array<SeriesSpan, kSeriesCount> series;
};

class BatchChartData final : public io::BatchPointSink {
 public:
  void time_column(const std::string& header) override { time_header_ = header; }
  void add(const io::BatchPoint& point) override;

  const std::vector<BatchBucket>& buckets() const { return buckets_; }
  std::size_t rows() const { return rows_; }
  std::size_t failed() const { return failed_; }
  std::size_t rows_per_bucket() const { return width_; }
  // The x axis is time: the rows have a time column, every row's cell is a timestamp, in
  // order (never earlier than the row before).
  bool by_time() const { return !time_header_.empty() && rows_ > 0 && times_in_order_; }
  const std::string& time_header() const { return time_header_; }
  // The x of a kept value: its time or its row.
  double x_of(const KeptValue& v) const { return by_time() ? v.time : v.row; }
  // The x of the first and of the last row.
  double first_x() const { return buckets_.empty() ? 1 : x_of(buckets_.front().first); }
  double last_x() const { return by_time() ? last_time_ : static_cast<double>(rows_); }

 private:
  void merge_pairs();

  std::vector<BatchBucket> buckets_;
  std::size_t width_ = 1;  // rows a full bucket holds
  std::size_t rows_ = 0, failed_ = 0;
  std::string time_header_;
  bool times_in_order_ = true;
  double last_time_ = -1e300;
};

struct BatchChartText {
  std::string title;     // the template's id
  std::string subtitle;  // the points file, machine and fluid
};

// The two plot areas on a page region `frame`, with their data windows: efficiency above,
// power balance difference [%] below, sharing x.
struct BatchAxes {
  Axes efficiency, balance;
};
BatchAxes batch_axes(const BatchChartData& data, const Rect& frame);

// Draws the chart into `frame` (kChartPage is its own page size). A batch of at most
// kMarkedRows rows gets a mark on every value; a longer one lines through each bucket's
// lowest and highest values.
inline constexpr std::size_t kMarkedRows = 150;
void draw_batch_chart(cairo_t* cr, const BatchChartData& data, const BatchChartText& text, const Rect& frame);

}  // namespace shaftwork::charts

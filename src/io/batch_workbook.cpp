// A batch's CSV rows into a workbook, parsed as they stream in (RFC 4180 quoting).
#include <charconv>
#include <cmath>

#include "shaftwork/io/result_keys.hpp"
#include "workbook.hpp"

namespace shaftwork::io {
namespace {

// The number a cell holds when all of it reads as one (finite), else none.
std::optional<double> whole_number(const std::string& cell) {
  if (cell.empty()) return std::nullopt;
  double value = 0;
  const auto [end, ec] = std::from_chars(cell.data(), cell.data() + cell.size(), value);
  if (ec != std::errc() || end != cell.data() + cell.size() || !std::isfinite(value)) return std::nullopt;
  return value;
}

// Whether a column of the batch's CSV holds numbers: one with a unit, a result key, its
// uncertainty, or a guarantee's converted value or deviation (the rest is text).
bool numeric_column(std::string_view key, bool has_unit) {
  constexpr std::string_view kUncertainty = "uncertainty.";
  if (has_unit || find_result_key(key) != nullptr) return true;
  if (key.starts_with(kUncertainty) && find_result_key(key.substr(kUncertainty.size())) != nullptr) return true;
  return key.starts_with("guarantee.") && (key.ends_with(".converted") || key.ends_with(".deviation_percent"));
}

}  // namespace

void CsvWorkbookSink::write(std::string_view bytes) {
  for (const char c : bytes) {
    if (quote_pending_) {
      quote_pending_ = false;
      if (c == '"') {
        field_ += '"';
        continue;
      }
      quoted_ = false;
    }
    if (quoted_) {
      if (c == '"') {
        quote_pending_ = true;
      } else {
        field_ += c;
      }
    } else if (c == '"') {
      quoted_ = true;
    } else if (c == ',') {
      end_field();
    } else if (c == '\n') {
      end_field();
      end_record();
    } else if (c != '\r') {
      field_ += c;
    }
  }
}

void CsvWorkbookSink::end_field() {
  record_.push_back(std::move(field_));
  field_.clear();
}

void CsvWorkbookSink::end_record() {
  if (!header_done_) {
    // "outlet.temperature [degC]": the key in the first row, the unit in the second.
    for (std::size_t col = 0; col < record_.size(); ++col) {
      const std::string& h = record_[col];
      const std::size_t open = h.rfind(" [");
      const bool unit = open != std::string::npos && h.back() == ']';
      const std::string key = unit ? h.substr(0, open) : h;
      book_.text(col, key, true);
      numeric_.push_back(numeric_column(key, unit));
      record_[col] = unit ? h.substr(open + 2, h.size() - open - 3) : std::string();
    }
    book_.end_row();
    for (std::size_t col = 0; col < record_.size(); ++col) {
      if (numeric_[col]) book_.text(col, record_[col]);
    }
    book_.end_row();
    book_.freeze_header();
    header_done_ = true;
  } else {
    book_.begin_row();
    for (std::size_t col = 0; col < record_.size(); ++col) {
      const std::optional<double> v = col < numeric_.size() && numeric_[col] ? whole_number(record_[col]) : std::nullopt;
      if (v) {
        book_.number(col, *v);
      } else {
        book_.text(col, record_[col]);
      }
    }
    book_.end_row();
  }
  record_.clear();
}

void CsvWorkbookSink::finish(ByteSink& out) { book_.finish(out); }

}  // namespace shaftwork::io

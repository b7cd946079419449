#include "shaftwork/io/csv_reader.hpp"

#include <algorithm>
#include <array>
#include <bit>
#include <cstring>

#if defined(__SSE2__)
#include <emmintrin.h>
#endif

#include <fmt/format.h>

#include "shaftwork/error.hpp"

namespace shaftwork::io {
namespace {

constexpr std::string_view kByteOrderMark = "\xEF\xBB\xBF";

// The bytes that end a field or a record, or start a quote: one lookup per byte.
constexpr auto kSpecial = [] {
  std::array<bool, 256> table{};
  table[static_cast<unsigned char>(',')] = true;
  table[static_cast<unsigned char>('\n')] = true;
  table[static_cast<unsigned char>('"')] = true;
  return table;
}();

#if defined(__SSE2__)
// A bit for each of the 16 bytes at p that kSpecial marks (',', '\n', '"').
unsigned special_bytes(const char* p) {
  const __m128i v = _mm_loadu_si128(reinterpret_cast<const __m128i*>(p));
  const __m128i commas = _mm_cmpeq_epi8(v, _mm_set1_epi8(','));
  const __m128i line_ends = _mm_cmpeq_epi8(v, _mm_set1_epi8('\n'));
  const __m128i quotes = _mm_cmpeq_epi8(v, _mm_set1_epi8('"'));
  const __m128i hits = _mm_or_si128(_mm_or_si128(commas, line_ends), quotes);
  return static_cast<unsigned>(_mm_movemask_epi8(hits));
}
#endif

// The line ends in text[0, size): with SSE2, sixteen bytes a compare, counted in byte lanes
// (at most 255 blocks before the lanes are summed); the rest one by one.
std::size_t count_newlines(const char* text, std::size_t size) {
  std::size_t n = 0;
  std::size_t i = 0;
#if defined(__SSE2__)
  const __m128i newline = _mm_set1_epi8('\n');
  const __m128i zero = _mm_setzero_si128();
  while (i + 16 <= size) {
    __m128i lanes = zero;
    for (int k = 0; k < 255 && i + 16 <= size; ++k, i += 16) {
      const __m128i v = _mm_loadu_si128(reinterpret_cast<const __m128i*>(text + i));
      lanes = _mm_sub_epi8(lanes, _mm_cmpeq_epi8(v, newline));  // a match is -1
    }
    const __m128i sums = _mm_sad_epu8(lanes, zero);  // two 16-bit sums, one per half
    n += static_cast<std::size_t>(_mm_cvtsi128_si32(sums)) + static_cast<std::size_t>(_mm_extract_epi16(sums, 4));
  }
#endif
  for (; i < size; ++i) n += text[i] == '\n';
  return n;
}

// Position just after the last record end in text[from, size), given the quote
// parity at `from`; updates the parity to the end. npos when no record ends there.
// Jumps from quote to quote with memchr: a file without quotes costs one memrchr.
std::size_t last_record_end(const char* text, std::size_t from, std::size_t size, bool& in_quotes) {
  std::size_t boundary = std::string::npos;
  std::size_t pos = from;
  while (pos < size) {
    const void* quote = std::memchr(text + pos, '"', size - pos);
    const std::size_t stop = quote ? static_cast<std::size_t>(static_cast<const char*>(quote) - text) : size;
    if (!in_quotes) {
      if (const void* nl = ::memrchr(text + pos, '\n', stop - pos)) {
        boundary = static_cast<std::size_t>(static_cast<const char*>(nl) - text) + 1;
      }
    }
    if (!quote) break;
    in_quotes = !in_quotes;
    pos = stop + 1;
  }
  return boundary;
}

}  // namespace

CsvChunker::CsvChunker(ByteSource& source, std::string name, std::size_t target_size, std::size_t max_record)
    : source_(source), name_(std::move(name)), target_size_(std::max<std::size_t>(target_size, 16)),
      max_record_(max_record) {}

bool CsvChunker::fill(std::string& text) {
  const std::size_t old_size = text.size();
  const std::size_t block = std::max<std::size_t>(target_size_, 4096);
  text.resize(old_size + block);
  const std::size_t n = source_.read(text.data() + old_size, block);
  text.resize(old_size + n);
  bytes_read_ += n;
  return n > 0;
}

bool CsvChunker::next(CsvChunk& chunk) {
  std::string& text = chunk.text;
  text.clear();
  text.swap(pending_);  // the reused buffer of `chunk` becomes the next pending buffer
  chunk.first_line = line_;

  bool in_quotes = false;
  std::size_t scanned = 0;
  std::size_t boundary = std::string::npos;
  // Scan what is already there (the tail of the previous block), then read on.
  for (;;) {
    if (at_start_ && text.size() >= kByteOrderMark.size()) {
      if (std::string_view(text).substr(0, kByteOrderMark.size()) == kByteOrderMark) {
        text.erase(0, kByteOrderMark.size());
        scanned = 0;  // what was scanned has moved: scan it again from the start
        in_quotes = false;
        boundary = std::string::npos;
      }
      at_start_ = false;
    }
    if (scanned < text.size()) {
      const std::size_t end = last_record_end(text.data(), scanned, text.size(), in_quotes);
      if (end != std::string::npos) boundary = end;
      scanned = text.size();
    }
    if (boundary != std::string::npos && text.size() >= target_size_) break;
    if (boundary == std::string::npos && text.size() > max_record_) {
      const std::string limit = max_record_ % (1u << 20) == 0 ? fmt::format("{} MiB", max_record_ >> 20)
                                                              : fmt::format("{} bytes", max_record_);
      throw Error(ErrorKind::bad_input,
                  fmt::format("{}: line {}: a record runs over {} without ending; is a quote left open?", name_,
                              line_, limit));
    }
    if (at_end_ || !fill(text)) {
      at_end_ = true;
      if (at_start_) {  // an input shorter than the byte-order mark
        at_start_ = false;
        continue;
      }
      break;
    }
  }
  if (text.empty()) return false;

  if (at_end_) {
    boundary = text.size();  // the last record may lack its line end
  }
  pending_.assign(text, boundary, std::string::npos);
  text.resize(boundary);
  line_ += count_newlines(text.data(), text.size());
  return true;
}

CsvRecordParser::CsvRecordParser(std::string& text, std::size_t first_line)
    : data_(text.data()), size_(text.size()), line_(first_line) {}

bool CsvRecordParser::skip_empty_lines() {
  while (pos_ < size_) {
    if (data_[pos_] == '\n') {
      ++pos_;
    } else if (data_[pos_] == '\r' && pos_ + 1 < size_ && data_[pos_ + 1] == '\n') {
      pos_ += 2;
    } else {
      return true;
    }
    ++line_;
  }
  return false;
}

bool CsvRecordParser::next_plain(CsvRecord& record) {
  std::size_t i = pos_;
  std::size_t field_start = pos_;
  bool at_line_end = false;
#if defined(__SSE2__)
  // Sixteen bytes at a time while they last: a mask of the special bytes, taken in order.
  while (!at_line_end && i + 16 <= size_) {
    const std::size_t block = i;
    i += 16;
    for (unsigned mask = special_bytes(data_ + block); mask != 0; mask &= mask - 1) {
      const std::size_t at = block + static_cast<std::size_t>(std::countr_zero(mask));
      const char c = data_[at];
      if (c == ',') {
        record.fields.emplace_back(data_ + field_start, at - field_start);
        field_start = at + 1;
      } else if (c == '\n') {
        i = at;
        at_line_end = true;
        break;
      } else {  // a quote
        record.fields.clear();
        return false;
      }
    }
  }
#endif
  for (; !at_line_end && i < size_; ++i) {
    while (i < size_ && !kSpecial[static_cast<unsigned char>(data_[i])]) ++i;  // plain bytes
    if (i == size_) break;
    const char c = data_[i];
    if (c == ',') {
      record.fields.emplace_back(data_ + field_start, i - field_start);
      field_start = i + 1;
    } else if (c == '\n') {
      break;
    } else if (c == '"') {
      record.fields.clear();
      return false;
    }
  }
  std::size_t stop = i;
  if (stop > field_start && data_[stop - 1] == '\r') --stop;
  record.fields.emplace_back(data_ + field_start, stop - field_start);
  record.has_quotes = false;
  record.text = std::string_view(data_ + pos_, std::max(stop, field_start) - pos_);
  pos_ = i < size_ ? i + 1 : i;
  ++line_;
  return true;
}

std::size_t CsvRecordParser::take_quoted_extent(CsvRecord& record) {
  std::size_t end = pos_;
  bool in_quotes = false;
  std::size_t newlines = 0;
  for (; end < size_; ++end) {
    const char c = data_[end];
    if (c == '"') {
      in_quotes = !in_quotes;
    } else if (c == '\n') {
      if (!in_quotes) break;
      ++newlines;
    }
  }
  std::size_t stop = end;  // the record's text is [pos_, stop)
  if (stop > pos_ && data_[stop - 1] == '\r' && !in_quotes) --stop;
  pos_ = end < size_ ? end + 1 : end;
  line_ += newlines + (end < size_ ? 1 : 0);
  record.has_quotes = true;
  return stop;
}

void CsvRecordParser::split_quoted(CsvRecord& record, std::size_t i, std::size_t stop) {
  auto fail = [&](std::string message) {
    record.fields.clear();
    record.error = std::move(message);
  };
  for (;;) {
    const std::size_t field_number = record.fields.size() + 1;
    if (i < stop && data_[i] == '"') {  // quoted: unquote in place
      char* out = data_ + i;
      const char* const begin = out;
      std::size_t j = i + 1;
      bool closed = false;
      while (j < stop && !closed) {
        if (data_[j] != '"') {
          *out++ = data_[j++];
        } else if (j + 1 < stop && data_[j + 1] == '"') {
          *out++ = '"';
          j += 2;
        } else {
          closed = true;
          ++j;
        }
      }
      if (!closed) return fail(fmt::format("the quoted field {} is not closed before the end of the input", field_number));
      record.fields.emplace_back(begin, static_cast<std::size_t>(out - begin));
      if (j == stop) return;
      if (data_[j] != ',') return fail(fmt::format("text after the closing quote of field {}", field_number));
      i = j + 1;
    } else {
      std::size_t j = i;
      while (j < stop && data_[j] != ',' && data_[j] != '"') ++j;
      if (j < stop && data_[j] == '"') {
        return fail(fmt::format(
            "a quote inside the unquoted field {}; quote the whole field and double the quote (\"\")", field_number));
      }
      record.fields.emplace_back(data_ + i, j - i);
      if (j == stop) return;
      i = j + 1;
    }
  }
}

bool CsvRecordParser::next(CsvRecord& record) {
  record.fields.clear();
  record.error.clear();
  record.text = {};
  if (!skip_empty_lines()) return false;
  record.line = line_;
  // The common record, without quotes, is split in one pass; at its first quote the
  // general path starts again from the record's beginning.
  if (next_plain(record)) return true;
  const std::size_t start = pos_;
  const std::size_t stop = take_quoted_extent(record);
  split_quoted(record, start, stop);
  return true;
}

std::vector<CsvRow> parse_csv(std::string text) {
  if (std::string_view(text).substr(0, kByteOrderMark.size()) == kByteOrderMark) {
    text.erase(0, kByteOrderMark.size());
  }
  std::vector<CsvRow> rows;
  CsvRecordParser parser(text, 1);
  CsvRecord record;
  while (parser.next(record)) {
    CsvRow row;
    row.line = record.line;
    row.error = record.error;
    for (std::string_view f : record.fields) row.fields.emplace_back(f);
    rows.push_back(std::move(row));
  }
  return rows;
}

}  // namespace shaftwork::io

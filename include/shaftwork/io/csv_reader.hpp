// shaftwork/io/csv_reader.hpp — CSV text (RFC 4180) in chunks of whole records, and
// records into fields.
//
// The format read: fields separated by commas, records ended by CRLF or LF (the
// last record may lack its line end), a field may be quoted ("...") and then hold
// commas, line breaks and doubled quotes (""), a UTF-8 byte-order mark at the very
// start is skipped, empty lines are skipped. A record ends at a line break that
// follows an even number of quotes in that record; the chunker and the record
// parser both use this rule, so a chunk always ends where a record ends.
//
// Lines are counted as an editor counts them (1 = the first line of the input), so
// a message can send the user to the place: a record that spans lines inside a
// quoted field is named by its first line.
#pragma once

#include <algorithm>
#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include "shaftwork/io/byte_stream.hpp"

namespace shaftwork::io {

// A run of whole records and the line number of its first byte.
struct CsvChunk {
  std::string text;
  std::size_t first_line = 1;
};

// Cuts an input into chunks of whole records of about `target_size` bytes each, so
// that memory stays bounded whatever the length of the input.
class CsvChunker {
 public:
  // `name` is the input's name for messages. A record longer than `max_record`
  // bytes is a whole-input error (most likely a quote left open).
  CsvChunker(ByteSource& source, std::string name, std::size_t target_size = 256 * 1024,
             std::size_t max_record = 16 * 1024 * 1024);

  // The next chunk into `chunk` (its buffer is reused); false at the end of input.
  // Throws bad_input when a record exceeds max_record or the input cannot be read.
  bool next(CsvChunk& chunk);

  // Bytes taken from the source so far (for progress).
  std::size_t bytes_read() const { return bytes_read_; }

  // The size of the chunks to come (slow rows want small chunks, so that every worker
  // has one and progress shows often).
  void set_target_size(std::size_t bytes) { target_size_ = std::max<std::size_t>(bytes, 16); }

 private:
  // Reads one block into `text`; returns false at the end of input.
  bool fill(std::string& text);

  ByteSource& source_;
  std::string name_;
  std::size_t target_size_;
  std::size_t max_record_;
  std::string pending_;  // bytes after the last record boundary of the previous chunk
  std::size_t line_ = 1;
  std::size_t bytes_read_ = 0;
  bool at_start_ = true;
  bool at_end_ = false;
};

// One record: its fields (views into the chunk's buffer, with quotes removed and
// doubled quotes made single) and where it starts.
struct CsvRecord {
  std::vector<std::string_view> fields;
  std::size_t line = 0;  // the line it starts on
  std::string error;     // set when the record is malformed; fields are then empty
  bool has_quotes = false;
  // The record as written, without its line end, when it has no quotes: the fields
  // joined by commas, which a writer may copy in one piece. Empty when has_quotes.
  std::string_view text;
};

// Walks the records of a chunk. Unquoting happens in place, so the parser takes the
// chunk's buffer as mutable text; views stay valid while the buffer lives.
class CsvRecordParser {
 public:
  CsvRecordParser(std::string& text, std::size_t first_line);
  // The next record into `record`; false when the chunk is done. A malformed record
  // comes back with `error` set (e.g. "text after the closing quote of field 3").
  bool next(CsvRecord& record);

  // Where the next record starts: its byte offset and line.
  std::size_t position() const { return pos_; }
  std::size_t line() const { return line_; }

 private:
  // Steps over empty lines; false at the end of the chunk.
  bool skip_empty_lines();
  // A record without quotes, split in one pass; false (nothing taken) at a quote.
  bool next_plain(CsvRecord& record);
  // Takes a record with quotes by the quote-parity rule; returns the end of its text.
  std::size_t take_quoted_extent(CsvRecord& record);
  // Splits [i, stop) into fields, unquoting in place; sets record.error when malformed.
  void split_quoted(CsvRecord& record, std::size_t i, std::size_t stop);

  char* data_;
  std::size_t size_;
  std::size_t pos_ = 0;
  std::size_t line_;
};

// Splits a whole text (tests, small inputs) into records: each one's fields as
// strings, or the error, with its line.
struct CsvRow {
  std::vector<std::string> fields;
  std::size_t line = 0;
  std::string error;
};
std::vector<CsvRow> parse_csv(std::string text);

}  // namespace shaftwork::io

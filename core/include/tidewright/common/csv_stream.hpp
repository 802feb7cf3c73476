// CSV in pieces: records found one at a time in text that arrives in chunks, so a batch of any
// size runs in constant memory. Same grammar as csv::parse (RFC 4180; LF, CRLF or CR line
// ends; a quote opens a quoted field only at the start of a cell; "" inside quotes is one
// quote; a UTF-8 byte-order mark at the very start is skipped; blank lines are skipped) and
// the same line numbers. The core never reads files: the caller feeds the text.
#pragma once

#include <cstddef>
#include <string>
#include <string_view>
#include <vector>

#include "tidewright/common/csv.hpp"
#include "tidewright/common/result.hpp"

namespace tw::csv {

// Finds complete records in text appended chunk by chunk.
//   RecordStream s;  s.append(chunk);  while (s.next(rec)) use(rec);  s.compact();  ...
//   at the end:  s.finish();  while (s.next(rec)) use(rec);  then check s.error().
// Views returned by next() stay valid until the next append() or compact().
class RecordStream {
 public:
  // Longest record accepted; a longer one (usually an unclosed quote) stops the stream with an
  // error naming its line, so memory stays bounded.
  static constexpr std::size_t kMaxRecordBytes = std::size_t{1} << 20;

  struct Record {
    std::string_view text;  // the record without its line end
    int line = 0;           // 1-based line where it starts
  };

  void append(std::string_view chunk);
  // No more text will come: the last record may end without a line end.
  void finish() { at_end_ = true; }
  // The next complete, non-blank record; false when more text is needed, at the end, or after
  // an error.
  bool next(Record& record);
  // Drops the text of the records already returned (call between next() and append()).
  void compact();
  // An unclosed quote at the end, or a record over kMaxRecordBytes; ok() otherwise.
  const Status& error() const { return error_; }

 private:
  std::string buffer_;
  std::size_t pos_ = 0;    // start of the first record not yet returned
  int line_ = 1;           // line number at pos_
  bool bom_checked_ = false;
  bool at_end_ = false;
  Status error_ = Ok{};
};

// Splits one record (as RecordStream returns it) into cells. Unquoted cells are views into
// the record; quoted cells are unescaped into `scratch` (reserved here so views stay valid).
void split_record(std::string_view record, std::vector<std::string_view>& cells,
                  std::string& scratch);

// The same record as a csv::Row (owning strings), for callers that want csv::parse's shape.
Row to_row(const RecordStream::Record& record);

// Trims ASCII spaces and tabs from both ends, without copying.
std::string_view trim_view(std::string_view text);

// Appends a cell as csv::escape_cell_for_spreadsheet would write it, copying nothing when the
// cell needs neither quotes nor defusing (the usual case).
void append_cell_for_spreadsheet(std::string& out, std::string_view cell);

}  // namespace tw::csv

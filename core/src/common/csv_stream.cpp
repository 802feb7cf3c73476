// CSV records from streamed text (csv_stream.hpp). The state machine is csv::parse's, cell by
// cell: a quote opens a quoted field only at the start of a cell; after the closing quote the
// rest of the cell is plain text.
#include "tidewright/common/csv_stream.hpp"

#include <string>

namespace tw::csv {

namespace {

enum class CellState { Start, Unquoted, Quoted, AfterQuoted };

// Result of scanning for the end of one record starting at `from`.
struct Scan {
  bool complete = false;    // a line end outside quotes was found (or the text ended at_end)
  std::size_t end = 0;      // one past the record's last character (before its line end)
  std::size_t next = 0;     // where the following record starts
  int newlines_in_quotes = 0;
  bool open_quote = false;  // the text ended inside a quoted field
};

Scan scan_record(const std::string& text, std::size_t from, bool at_end) {
  Scan s;
  CellState state = CellState::Start;
  const std::size_t n = text.size();
  for (std::size_t i = from; i < n; ++i) {
    const char c = text[i];
    if (state == CellState::Quoted) {
      if (c == '"') {
        if (i + 1 >= n && !at_end) return s;  // "" or " then something: need the next byte
        if (i + 1 < n && text[i + 1] == '"') {
          ++i;
        } else {
          state = CellState::AfterQuoted;
        }
      } else if (c == '\n') {
        ++s.newlines_in_quotes;
      }
      continue;
    }
    if (c == ',') {
      state = CellState::Start;
    } else if (c == '\n' || c == '\r') {
      if (c == '\r') {
        if (i + 1 >= n && !at_end) return s;  // CR at the end of a chunk: maybe CRLF
        s.next = (i + 1 < n && text[i + 1] == '\n') ? i + 2 : i + 1;
      } else {
        s.next = i + 1;
      }
      s.complete = true;
      s.end = i;
      return s;
    } else if (c == '"' && state == CellState::Start) {
      state = CellState::Quoted;
    } else if (state == CellState::Start) {
      state = CellState::Unquoted;
    }
  }
  if (at_end) {
    s.open_quote = state == CellState::Quoted;
    s.complete = !s.open_quote;
    s.end = s.next = n;
  }
  return s;
}

}  // namespace

void RecordStream::append(std::string_view chunk) { buffer_.append(chunk.data(), chunk.size()); }

bool RecordStream::next(Record& record) {
  if (!error_) return false;
  if (!bom_checked_) {
    if (buffer_.size() < 3 && !at_end_) return false;
    if (buffer_.compare(0, 3, "\xEF\xBB\xBF") == 0) pos_ = 3;
    bom_checked_ = true;
  }
  while (pos_ < buffer_.size()) {
    const Scan s = scan_record(buffer_, pos_, at_end_);
    if (!s.complete) {
      if (s.open_quote) {
        error_ = Error{"csv", "line " + std::to_string(line_) +
                                  ": a quoted field is not closed (missing \")"};
      } else if (buffer_.size() - pos_ > kMaxRecordBytes) {
        error_ = Error{"csv", "line " + std::to_string(line_) + ": a record longer than " +
                                  std::to_string(kMaxRecordBytes >> 20) +
                                  " MB (is a quote not closed?)"};
      }
      return false;
    }
    const int line = line_;
    const std::size_t start = pos_;
    line_ += 1 + s.newlines_in_quotes;
    pos_ = s.next;
    if (s.end == start) continue;  // blank line
    record.text = std::string_view(buffer_).substr(start, s.end - start);
    record.line = line;
    return true;
  }
  return false;
}

void RecordStream::compact() {
  buffer_.erase(0, pos_);
  pos_ = 0;
}

void split_record(std::string_view record, std::vector<std::string_view>& cells,
                  std::string& scratch) {
  cells.clear();
  scratch.clear();
  scratch.reserve(record.size());  // unescaped text is never longer: views into it stay valid
  const std::size_t n = record.size();
  std::size_t i = 0;
  while (true) {
    if (i < n && record[i] == '"') {
      // Quoted cell: unescape into scratch, then keep any text after the closing quote.
      const std::size_t begin = scratch.size();
      ++i;
      while (i < n) {
        if (record[i] == '"') {
          if (i + 1 < n && record[i + 1] == '"') {
            scratch += '"';
            i += 2;
            continue;
          }
          ++i;
          break;
        }
        scratch += record[i++];
      }
      while (i < n && record[i] != ',') scratch += record[i++];
      cells.emplace_back(scratch.data() + begin, scratch.size() - begin);
    } else {
      const std::size_t begin = i;
      while (i < n && record[i] != ',') ++i;
      cells.push_back(record.substr(begin, i - begin));
    }
    if (i >= n) break;
    ++i;  // the comma
  }
}

Row to_row(const RecordStream::Record& record) {
  std::vector<std::string_view> views;
  std::string scratch;
  split_record(record.text, views, scratch);
  Row row;
  row.line = record.line;
  row.cells.reserve(views.size());
  for (std::string_view v : views) row.cells.emplace_back(v);
  return row;
}

std::string_view trim_view(std::string_view text) {
  std::size_t b = 0, e = text.size();
  while (b < e && (text[b] == ' ' || text[b] == '\t')) ++b;
  while (e > b && (text[e - 1] == ' ' || text[e - 1] == '\t')) --e;
  return text.substr(b, e - b);
}

void append_cell_for_spreadsheet(std::string& out, std::string_view cell) {
  bool plain = true;
  for (char c : cell) {
    if (c == ',' || c == '"' || c == '\r' || c == '\n') {
      plain = false;
      break;
    }
  }
  if (plain && !cell.empty()) {
    const char first = cell.front();
    plain = !(first == '=' || first == '+' || first == '-' || first == '@' || first == '\t');
  }
  if (plain) {
    out.append(cell.data(), cell.size());
  } else {
    out += escape_cell_for_spreadsheet(std::string(cell));
  }
}

}  // namespace tw::csv

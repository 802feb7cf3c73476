#include "tidewright/common/csv.hpp"

#include <cctype>
#include <cstdlib>

namespace tw::csv {

Result<std::vector<Row>> parse(const std::string& text) { return parse(text, ','); }

char detect_delimiter(const std::string& text) {
  int comma = 0, semicolon = 0, tab = 0;
  bool in_quotes = false;
  for (char c : text) {
    if (c == '"') in_quotes = !in_quotes;
    if (in_quotes) continue;
    if (c == '\n' || c == '\r') break;
    if (c == ',') ++comma;
    else if (c == ';') ++semicolon;
    else if (c == '\t') ++tab;
  }
  if (semicolon > comma && semicolon >= tab) return ';';
  if (tab > comma && tab > semicolon) return '\t';
  return ',';
}

Result<std::vector<Row>> parse(const std::string& text, char delimiter) {
  std::vector<Row> rows;
  size_t i = 0;
  if (text.size() >= 3 && text.compare(0, 3, "\xEF\xBB\xBF") == 0) i = 3;
  int line = 1;
  Row row;
  row.line = line;
  std::string cell;
  bool in_quotes = false, cell_was_quoted = false, any_content = false;
  auto end_cell = [&] {
    row.cells.push_back(cell);
    cell.clear();
    cell_was_quoted = false;
  };
  auto end_row = [&] {
    end_cell();
    const bool blank = row.cells.size() == 1 && row.cells[0].empty() && !any_content;
    if (!blank) rows.push_back(std::move(row));
    row = Row{};
    any_content = false;
  };
  int quote_line = 0;
  for (; i < text.size(); ++i) {
    const char c = text[i];
    if (in_quotes) {
      if (c == '"') {
        if (i + 1 < text.size() && text[i + 1] == '"') {
          cell += '"';
          ++i;
        } else {
          in_quotes = false;
        }
      } else {
        if (c == '\n') ++line;
        cell += c;
      }
      continue;
    }
    switch (c) {
      case '"':
        if (cell.empty() && !cell_was_quoted) {
          in_quotes = true;
          cell_was_quoted = true;
          any_content = true;
          quote_line = line;
        } else {
          cell += c;  // a stray quote inside an unquoted field is kept as text
        }
        break;
      case '\r':
        if (i + 1 < text.size() && text[i + 1] == '\n') ++i;
        [[fallthrough]];
      case '\n':
        end_row();
        ++line;
        row.line = line;
        break;
      default:
        any_content = true;
        if (c == delimiter) end_cell();
        else cell += c;
    }
  }
  if (in_quotes) {
    return Error{"csv", "line " + std::to_string(quote_line) +
                            ": a quoted field is not closed (missing \")"};
  }
  if (!cell.empty() || !row.cells.empty() || any_content) end_row();
  return rows;
}

std::string escape_cell(const std::string& cell) {
  if (cell.find_first_of(",\"\r\n") == std::string::npos) return cell;
  std::string out = "\"";
  for (char c : cell) {
    if (c == '"') out += '"';
    out += c;
  }
  out += '"';
  return out;
}

namespace {
bool is_plain_number(const std::string& s) {
  if (s.empty()) return false;
  char* end = nullptr;
  std::strtod(s.c_str(), &end);
  return end == s.c_str() + s.size() && s.find_first_of("xXpP") == std::string::npos &&
         std::isalpha(static_cast<unsigned char>(s.back())) == 0;
}
}  // namespace

std::string escape_cell_for_spreadsheet(const std::string& cell) {
  if (!cell.empty()) {
    const char first = cell.front();
    const bool risky = first == '=' || first == '+' || first == '-' || first == '@' ||
                       first == '\t' || first == '\r';
    if (risky && !is_plain_number(cell)) return escape_cell("'" + cell);
  }
  return escape_cell(cell);
}

std::string format_row(const std::vector<std::string>& cells, bool defuse_formulas) {
  std::string out;
  for (size_t i = 0; i < cells.size(); ++i) {
    if (i) out += ',';
    out += defuse_formulas ? escape_cell_for_spreadsheet(cells[i]) : escape_cell(cells[i]);
  }
  out += "\r\n";
  return out;
}

std::string trim(const std::string& text) {
  size_t b = 0, e = text.size();
  while (b < e && (text[b] == ' ' || text[b] == '\t')) ++b;
  while (e > b && (text[e - 1] == ' ' || text[e - 1] == '\t')) --e;
  return text.substr(b, e - b);
}

int find_column(const std::vector<std::string>& header, const std::string& name) {
  auto lower = [](std::string s) {
    for (auto& ch : s) ch = static_cast<char>(std::tolower(static_cast<unsigned char>(ch)));
    return s;
  };
  const std::string want = lower(name);
  for (size_t i = 0; i < header.size(); ++i) {
    if (lower(trim(header[i])) == want) return static_cast<int>(i);
  }
  return -1;
}

}  // namespace tw::csv

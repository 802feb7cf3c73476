// RFC 4180 comma-separated values: reading into rows of cells and writing escaped cells.
// Shared by every CSV reader and writer of the core (carbonate batch, journal import/export,
// plan and hatchery tables) so that quoting rules live in one place.
#pragma once

#include <string>
#include <vector>

#include "tidewright/common/result.hpp"

namespace tw::csv {

struct Row {
  int line = 0;                     // 1-based line number where the record starts
  std::vector<std::string> cells;
};

// Parses RFC 4180 text: fields separated by commas, records by CRLF or LF, fields may be
// quoted with "..." and contain commas, line breaks and doubled quotes. A UTF-8 byte-order
// mark at the start is skipped. Blank lines are skipped. An unterminated quote is an error
// naming its line.
Result<std::vector<Row>> parse(const std::string& text);
// The same with another field separator (';' or '\t' as spreadsheets in many locales write).
Result<std::vector<Row>> parse(const std::string& text, char delimiter);

// The separator a spreadsheet most likely used, read from the first record (the header):
// whichever of ',' ';' and TAB occurs most often outside quotes; ',' when none does.
char detect_delimiter(const std::string& text);

// Quotes a cell when it holds a comma, quote, CR or LF (RFC 4180 section 2.6-2.7).
std::string escape_cell(const std::string& cell);

// Like escape_cell, but also defuses cells a spreadsheet would run as a formula (starting
// with = + - @ TAB or CR) by prefixing an apostrophe -- unless the whole cell is a plain
// number such as -3.5, which stays a number (OWASP "CSV injection" guidance).
std::string escape_cell_for_spreadsheet(const std::string& cell);

// Joins cells with commas and ends the record with CRLF. Each cell is escaped with
// escape_cell, or with escape_cell_for_spreadsheet when defuse_formulas is set.
std::string format_row(const std::vector<std::string>& cells, bool defuse_formulas = false);

// Index of a header cell, matched case-insensitively after trimming spaces; -1 if absent.
int find_column(const std::vector<std::string>& header, const std::string& name);

// Trims ASCII spaces and tabs from both ends.
std::string trim(const std::string& text);

}  // namespace tw::csv

// RFC 4180 reader/writer (RFC 4180 sections 2.1-2.7 define the quoting rules checked here).
#include <doctest/doctest.h>

#include "tidewright/common/csv.hpp"

using tw::csv::escape_cell;
using tw::csv::escape_cell_for_spreadsheet;
using tw::csv::format_row;
using tw::csv::parse;

TEST_CASE("csv: quoted fields with commas, quotes and line breaks (RFC 4180 2.6, 2.7)") {
  auto rows = parse("a,b,c\r\n\"x, y\",\"say \"\"hi\"\"\",\"two\nlines\"\r\n");
  REQUIRE(rows.ok());
  REQUIRE(rows->size() == 2);
  CHECK((*rows)[1].cells[0] == "x, y");
  CHECK((*rows)[1].cells[1] == "say \"hi\"");
  CHECK((*rows)[1].cells[2] == "two\nlines");
  CHECK((*rows)[1].line == 2);
}

TEST_CASE("csv: LF endings, blank lines skipped, empty cells kept, BOM skipped, no final newline") {
  auto rows = parse("\xEF\xBB\xBFid,v\n\n1,\n2,5");
  REQUIRE(rows.ok());
  REQUIRE(rows->size() == 3);
  CHECK((*rows)[0].cells[0] == "id");
  CHECK((*rows)[1].cells.size() == 2);
  CHECK((*rows)[1].cells[1].empty());
  CHECK((*rows)[2].cells[1] == "5");
  CHECK((*rows)[2].line == 4);
}

TEST_CASE("csv: an unclosed quote is an error that names its line") {
  auto rows = parse("a\n\"open\n");
  REQUIRE_FALSE(rows.ok());
  CHECK(rows.error().message.find("line 2") != std::string::npos);
}

TEST_CASE("csv: escaping round-trips through the parser") {
  const std::vector<std::string> cells = {"plain", "with,comma", "quote\"inside", "line\r\nbreak", ""};
  auto rows = parse(format_row(cells));
  REQUIRE(rows.ok());
  REQUIRE(rows->size() == 1);
  CHECK((*rows)[0].cells == cells);
}

TEST_CASE("csv: spreadsheet formulas are defused, plain numbers are not (OWASP CSV injection)") {
  CHECK(escape_cell_for_spreadsheet("=SUM(A1:A9)") == "'=SUM(A1:A9)");
  CHECK(escape_cell_for_spreadsheet("@cmd") == "'@cmd");
  CHECK(escape_cell_for_spreadsheet("+1+2") == "'+1+2");
  CHECK(escape_cell_for_spreadsheet("-2+3") == "'-2+3");
  CHECK(escape_cell_for_spreadsheet("-3.5") == "-3.5");
  CHECK(escape_cell_for_spreadsheet("+12") == "+12");
  CHECK(escape_cell_for_spreadsheet("1e-3") == "1e-3");
  CHECK(escape_cell_for_spreadsheet("=a,b") == "\"'=a,b\"");
  CHECK(escape_cell("x") == "x");
}

TEST_CASE("csv: header lookup ignores case and surrounding spaces") {
  const std::vector<std::string> header = {"ID", " Salinity ", "ph"};
  CHECK(tw::csv::find_column(header, "salinity") == 1);
  CHECK(tw::csv::find_column(header, "id") == 0);
  CHECK(tw::csv::find_column(header, "dic_umol_kg") == -1);
}

// csv::RecordStream finds the same records, cells and line numbers as csv::parse, however
// the text is cut into pieces (the streamed batches depend on it).
#include <doctest/doctest.h>

#include <string>
#include <vector>

#include "tidewright/common/csv.hpp"
#include "tidewright/common/csv_stream.hpp"

namespace {

std::vector<tw::csv::Row> streamed(const std::string& text, std::size_t piece, tw::Status* error) {
  tw::csv::RecordStream stream;
  std::vector<tw::csv::Row> rows;
  tw::csv::RecordStream::Record r;
  for (std::size_t at = 0; at < text.size(); at += piece) {
    stream.append(std::string_view(text).substr(at, piece));
    while (stream.next(r)) rows.push_back(tw::csv::to_row(r));
    stream.compact();
  }
  stream.finish();
  while (stream.next(r)) rows.push_back(tw::csv::to_row(r));
  *error = stream.error();
  return rows;
}

}  // namespace

TEST_CASE("csv stream: same records as csv::parse for any piece size") {
  const std::string texts[] = {
      "a,b\r\n1,2\r\n",
      "\xEF\xBB\xBFh1,h2\n\n\"x\"\"y\",\"multi\nline, cell\"\nlast,row",
      "a\rb\r\rc\r\n\"q\"tail,  spaced  ,\n,\n",
      "one\n\"\",\"\"\"\"\n ,x\"y\n",
  };
  for (const std::string& text : texts) {
    const auto whole = tw::csv::parse(text);
    REQUIRE(whole.ok());
    for (std::size_t piece : {std::size_t{1}, std::size_t{2}, std::size_t{3}, std::size_t{5}, std::size_t{1000}}) {
      tw::Status error = tw::Ok{};
      const auto rows = streamed(text, piece, &error);
      INFO("text: ", text, " pieces of ", piece);
      CHECK(error.ok());
      REQUIRE(rows.size() == whole->size());
      for (std::size_t i = 0; i < rows.size(); ++i) {
        CHECK(rows[i].line == (*whole)[i].line);
        CHECK(rows[i].cells == (*whole)[i].cells);
      }
    }
  }
}

TEST_CASE("csv stream: an unclosed quote is an error naming its line, after the rows before it") {
  tw::Status error = tw::Ok{};
  const auto rows = streamed("a,b\n1,2\n3,\"open\n4,5\n", 4, &error);
  CHECK(rows.size() == 2);
  REQUIRE_FALSE(error.ok());
  CHECK(error.error().message.find("line 3") != std::string::npos);
  CHECK_FALSE(tw::csv::parse("a,b\n1,2\n3,\"open\n4,5\n").ok());
}

TEST_CASE("csv stream: cells for a spreadsheet are written as csv::escape_cell_for_spreadsheet writes them") {
  for (const char* cell : {"plain", "", "-3.5", "=cmd", "+1+1", "a,b", "say \"hi\"", "@x", "-x"}) {
    std::string out;
    tw::csv::append_cell_for_spreadsheet(out, cell);
    CHECK(out == tw::csv::escape_cell_for_spreadsheet(cell));
  }
}

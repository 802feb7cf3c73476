// Spreadsheet headers read flexibly (journal_csv_columns.hpp) and the import's spreadsheet
// habits: separators, decimal commas, blank rows, unused columns, future rows.
#include <doctest/doctest.h>

#include <algorithm>

#include "tidewright/common/csv.hpp"
#include "tidewright/journal/journal_csv.hpp"
#include "tidewright/journal/journal_csv_columns.hpp"

using namespace tw::journal;
using Kind = CsvColumn::Kind;

TEST_CASE("journal csv columns: units in brackets, after the name, or with underscores") {
  struct Case {
    const char* header;
    Parameter p;
    const char* unit;
  };
  const Case cases[] = {
      {"Calcium (mg/L)", Parameter::Calcium, "mg/L"},      {"Ca_mg_l", Parameter::Calcium, "mg/L"},
      {"Alkalinity [dKH]", Parameter::Alkalinity, "dKH"}, {"alk meq/L", Parameter::Alkalinity, "meq/L"},
      {"alkalinity_mg_l_caco3", Parameter::Alkalinity, "mg/L CaCO3"},
      {"Temp (\xc2\xb0" "F)", Parameter::Temperature, "F"}, {"Mg", Parameter::Magnesium, ""},
      {"\xEF\xBB\xBF" "calcium_mg_l", Parameter::Calcium, "mg/L"}, {"Salinity (ppt)", Parameter::Salinity, "psu"},
  };
  for (const auto& c : cases) {
    CAPTURE(c.header);
    const CsvColumn col = match_csv_column(c.header);
    REQUIRE(col.kind == Kind::Reading);
    CHECK(col.parameter == c.p);
    CHECK(col.unit == c.unit);
  }
  const CsvColumn ph = match_csv_column("pH total");
  REQUIRE(ph.kind == Kind::Reading);
  CHECK(ph.ph_scale == tw::carbonate::PhScale::Total);
}

TEST_CASE("journal csv columns: long names and their aliases; unknown names and units say why") {
  CHECK(match_csv_column("Date").long_name == "time");
  CHECK(match_csv_column(" Notes ").long_name == "note");
  CHECK(match_csv_column("Other Name").long_name == "other_name");
  const CsvColumn who = match_csv_column("Observer");
  CHECK(who.kind == Kind::Unused);
  CHECK(who.reason.find("Observer") != std::string::npos);
  const CsvColumn bad_unit = match_csv_column("Calcium (furlongs)");
  CHECK(bad_unit.kind == Kind::Unused);
  CHECK(bad_unit.reason.find("mg/L") != std::string::npos);
}

TEST_CASE("journal csv columns: the user's mapping, skip, and a second time column") {
  auto cols = match_csv_header({"When", "Reading 1", "Extra", "Date"},
                               {{"Reading 1", "alkalinity dKH"}, {"extra", "skip"}});
  REQUIRE(cols.ok());
  CHECK((*cols)[0].long_name == "time");
  CHECK((*cols)[1].kind == Kind::Reading);
  CHECK((*cols)[2].kind == Kind::Unused);
  CHECK((*cols)[3].kind == Kind::Unused);  // already read as time
  CHECK_FALSE(match_csv_header({"time"}, {{"Nope", "note"}}).ok());
  CHECK_FALSE(match_csv_header({"time", "x"}, {{"x", "frobs"}}).ok());
  CHECK_FALSE(parse_column_mapping("no equals sign").ok());
  CHECK(parse_column_mapping("a=b=note")->meaning == "note");
}

TEST_CASE("journal csv columns: every meaning offered is one the import reads, in plain words") {
  const auto& meanings = csv_column_meanings();
  REQUIRE(meanings.size() >= 20);
  std::vector<std::string> labels;
  for (const CsvColumnMeaning& m : meanings) {
    CAPTURE(m.meaning);
    const CsvColumn col = match_csv_column(m.meaning);
    CHECK(col.kind != Kind::Unused);
    CHECK_FALSE(m.label.empty());
    CHECK(std::find(labels.begin(), labels.end(), m.label) == labels.end());
    labels.push_back(m.label);
    auto mapped = match_csv_header({"time", "Reading"}, {{"Reading", m.meaning}});
    if (m.meaning != "time") CHECK(mapped.ok());
  }
  auto find = [&](const std::string& meaning) {
    return std::find_if(meanings.begin(), meanings.end(), [&](const CsvColumnMeaning& m) { return m.meaning == meaning; });
  };
  REQUIRE(find("alkalinity dKH") != meanings.end());
  CHECK(find("alkalinity dKH")->label == "Alkalinity in dKH");
  const CsvColumn alk = match_csv_column("alkalinity dKH");
  CHECK((alk.parameter == Parameter::Alkalinity && alk.unit == "dKH"));
  const CsvColumn ph = match_csv_column(find("ph total")->meaning);
  CHECK(ph.ph_scale == tw::carbonate::PhScale::Total);
  CHECK(find("calcium mmol/kg") != meanings.end());
  CHECK(find("time") != meanings.end());
  CHECK(find("note") != meanings.end());
}

TEST_CASE("journal csv columns: a column read as a meaning the user picked; reasons name no front end's option") {
  Journal j;
  System s;
  s.name = "Rack 1";
  s.volume_l = 400;
  REQUIRE(add_system(j, s).ok());
  CsvImportOptions opt;
  opt.default_system = j.systems[0].id;
  const std::string text = "Date,Alk reading\n2026-11-02T08:00Z,8.1\n";
  Journal before = j;
  auto plain = import_csv(before, text, opt);
  REQUIRE(plain.ok());
  CHECK(plain->added.empty());
  REQUIRE(plain->unused_columns.size() == 1);
  const std::string reason = plain->unused_columns[0].reason;
  CHECK(reason.find("Alk reading") != std::string::npos);
  CHECK(reason.find("mapping") == std::string::npos);  // the CLI says --map, the app offers "Read as"
  opt.mappings = {{"Alk reading", "alkalinity dKH"}};
  auto mapped = import_csv(j, text, opt);
  REQUIRE(mapped.ok());
  REQUIRE(mapped->added.size() == 1);
  CHECK(mapped->unused_columns.empty());
  const auto* t = std::get_if<TestResult>(&j.events.back().data);
  REQUIRE(t != nullptr);
  CHECK((t->parameter == Parameter::Alkalinity && t->value == doctest::Approx(8.1) && t->unit == "dKH"));
  opt.mappings = {{"Alk reading", "alkalinity furlongs"}};
  auto refused = import_csv(j, text, opt);
  REQUIRE_FALSE(refused.ok());
  CHECK(refused.error().field == "column mapping");
  CHECK(refused.error().message.find("Alk reading") != std::string::npos);
  CHECK(refused.error().message.find("alkalinity dKH") != std::string::npos);  // an accepted form
}

TEST_CASE("csv: separators detected from the header; a semicolon file keeps decimal commas whole") {
  CHECK(tw::csv::detect_delimiter("a;b;c\n1,5;2;3") == ';');
  CHECK(tw::csv::detect_delimiter("a\tb\n") == '\t');
  CHECK(tw::csv::detect_delimiter("\"x;y\",b\n") == ',');
  auto rows = tw::csv::parse("a;b\n1,5;\"x;y\"\n", ';');
  REQUIRE(rows.ok());
  CHECK((*rows)[1].cells[0] == "1,5");
  CHECK((*rows)[1].cells[1] == "x;y");
}

TEST_CASE("journal csv import: semicolons, decimal commas, blank rows, unused columns, future rows") {
  Journal j;
  System s;
  s.name = "Reef";
  s.volume_l = 300;
  REQUIRE(add_system(j, s).ok());
  const std::string text =
      "Date;Alkalinity [dKH];Observer\r\n"
      "25.10.2026 08:00;8,2;sam\r\n"
      ";;\r\n"
      "02.11.2099 08:00;8,1;sam\r\n";
  CsvImportOptions opt;
  opt.now_s = *tw::datetime::parse_datetime("2026-12-01T00:00Z");
  auto rep = import_csv(j, text, opt);
  REQUIRE(rep.ok());
  CHECK(rep->delimiter == ';');
  CHECK(rep->date_order == tw::datetime::DateOrder::DayMonthYear);
  REQUIRE(rep->added.size() == 1);
  CHECK(std::get<TestResult>(find_event(j, rep->added[0])->data).value == doctest::Approx(8.2));
  CHECK(rep->blank_rows_skipped == 1);
  REQUIRE(rep->unused_columns.size() == 1);
  CHECK(rep->unused_columns[0].name == "Observer");
  REQUIRE(rep->rejected.size() == 1);
  CHECK(rep->rejected[0].line == 4);
  CHECK(rep->rejected[0].reason.find("future") != std::string::npos);
}

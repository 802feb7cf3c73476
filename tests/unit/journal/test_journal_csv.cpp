// Journal CSV import (good and bad rows, dates, units per row/column) and export escaping.
#include <doctest/doctest.h>

#include "tidewright/journal/journal_csv.hpp"
#include "tidewright/journal/journal_file.hpp"

using namespace tw::journal;

namespace {

Journal two_systems() {
  Journal j;
  System a;
  a.name = "Reef";
  a.volume_l = 380;
  System b;
  b.name = "Rack 1";
  b.volume_l = 1150;
  b.units.alkalinity = tw::units::AlkalinityUnit::MeqPerL;
  b.units.ph_scale = tw::carbonate::PhScale::Total;
  b.units.volume = tw::units::VolumeUnit::UsGallon;
  REQUIRE(add_system(j, a).ok());
  REQUIRE(add_system(j, b).ok());
  Event note{0, 1, 1700000000, "", Note{"existing"}};
  REQUIRE(add_event(j, note).ok());
  return j;
}

const TestResult& test_of(const Journal& j, EventId id) {
  return std::get<TestResult>(find_event(j, id)->data);
}

}  // namespace

TEST_CASE("journal: CSV import adds good rows and reports each bad row with line and reason") {
  Journal j = two_systems();
  const Event existing = j.events[0];
  const std::string text =
      "Time,System,Parameter,Value,Unit,Precision,Additive,Amount,Amount_Unit,Note\r\n"
      "2026-11-01 08:00,Reef,alkalinity,8.1,dKH,0.2,,,,\r\n"                 // 2 ok
      "2026-11-01 08:00,reef,calcium,425,ppm,,,,,\r\n"                       // 3 ok (ppm->mg/L)
      "2026-11-01 08:05,Reef,ph,3,,,,,,\r\n"                                 // 4 pH 3
      "2026-11-02 09:00,Reef,alkalinity,40,dKH,,,,,\r\n"                     // 5 40 dKH
      "2026-11-02 09:00,Nowhere,alkalinity,8,dKH,,,,,\r\n"                   // 6 system
      "2026-13-02 09:00,Reef,alkalinity,8,dKH,,,,,\r\n"                      // 7 month 13
      "2026-11-02 09:00,Reef,alkalinity,eight,dKH,,,,,\r\n"                  // 8 not a number
      "2026-11-02 09:00,Reef,,,,,sodium_carbonate,12.5,mL,\"pump A, 4 doses\"\r\n"  // 9 ok +note
      "2026-11-02 09:00,Reef,,,,,sodium_carbonate,-3,mL,\r\n"                // 10 negative
      "2026-11-02 09:00,Reef,fluffiness,3,,,,,,\r\n"                         // 11 parameter
      "\r\n"                                                                 // 12 blank
      "2026-11-03 09:00,Rack 1,alkalinity,2.9,,,,,,\r\n"                     // 13 ok (meq/L pref)
      "2026-11-03 09:00,2,ph,8.05,,,,,,\r\n";                                // 14 ok by id, total
  auto r = import_csv(j, text);
  REQUIRE_MESSAGE(r.ok(), r.error().message);
  const auto& rep = *r;
  CHECK(rep.added.size() == 6);  // 4 rows + dose note + ... see below
  REQUIRE(rep.rejected.size() == 7);
  CHECK(rep.rejected[0].line == 4);
  CHECK(rep.rejected[0].field == "value");
  CHECK(rep.rejected[0].reason.find("6 to 10") != std::string::npos);
  CHECK(rep.rejected[1].line == 5);
  CHECK(rep.rejected[1].reason.find("0 to 25 dKH") != std::string::npos);
  CHECK(rep.rejected[2].line == 6);
  CHECK(rep.rejected[2].field == "system");
  CHECK(rep.rejected[3].line == 7);
  CHECK(rep.rejected[3].field == "time");
  CHECK(rep.rejected[4].line == 8);
  CHECK(rep.rejected[4].field == "value");
  CHECK(rep.rejected[5].line == 10);
  CHECK(rep.rejected[5].field == "amount");
  CHECK(rep.rejected[6].line == 11);
  CHECK(rep.rejected[6].field == "parameter");

  CHECK(find_event(j, existing.id) != nullptr);  // nothing already logged is lost
  CHECK(*find_event(j, existing.id) == existing);
  CHECK(test_of(j, rep.added[1]).unit == "mg/L");
  const auto& dose = std::get<Dose>(find_event(j, rep.added[2])->data);
  CHECK(dose.amount == 12.5);
  CHECK(dose.unit == DoseUnit::Millilitres);
  CHECK(std::get<Note>(find_event(j, rep.added[3])->data).text == "pump A, 4 doses");
  CHECK(test_of(j, rep.added[4]).unit == "meq/L");  // unit from the system's preference
  CHECK(test_of(j, rep.added[5]).ph_scale == tw::carbonate::PhScale::Total);
  CHECK(find_event(j, rep.added[5])->system_id == 2);
  CHECK(find_event(j, rep.added[0])->time_text == "2026-11-01 08:00");

  // Importing the same file again adds nothing and loses nothing.
  const Journal after = j;
  auto again = import_csv(j, text);
  REQUIRE(again.ok());
  CHECK(again->added.empty());
  CHECK(again->duplicates_skipped == 6);
  CHECK(j == after);
}

TEST_CASE("journal: CSV import of ambiguous day/month dates needs dmy or mdy") {
  Journal j = two_systems();
  const std::string text =
      "time,system,parameter,value,unit\n"
      "03/04/2026,Reef,calcium,420,mg/L\n"       // ambiguous
      "25/04/2026 07:30,Reef,calcium,421,mg/L\n"  // only day/month fits
      "04/25/2026,Reef,calcium,422,mg/L\n";       // only month/day fits
  auto r = import_csv(j, text);
  REQUIRE(r.ok());
  REQUIRE(r->rejected.size() == 1);
  CHECK(r->rejected[0].line == 2);
  CHECK(r->rejected[0].field == "time");
  CHECK(r->rejected[0].reason.find("choose") != std::string::npos);
  CHECK(r->rejected[0].reason.find("dmy") != std::string::npos);
  CHECK(r->added.size() == 2);

  CsvImportOptions dmy;
  dmy.time.order = tw::datetime::DateOrder::DayMonthYear;
  auto r2 = import_csv(j, text, dmy);
  REQUIRE(r2.ok());
  // Row 2 is now 3 April; row 4 (04/25) cannot be day/month and is refused; row 3 duplicate.
  CHECK(r2->added.size() == 1);
  CHECK(find_event(j, r2->added[0])->time_s == *tw::datetime::parse_datetime("2026-04-03"));
  CHECK(r2->duplicates_skipped == 1);
  REQUIRE(r2->rejected.size() == 1);
  CHECK(r2->rejected[0].line == 4);

  CsvImportOptions mdy;
  mdy.time.order = tw::datetime::DateOrder::MonthDayYear;
  auto r3 = import_csv(j, "time,system,parameter,value,unit\n03/04/2026,Reef,calcium,420,mg/L\n", mdy);
  REQUIRE(r3.ok());
  REQUIRE(r3->added.size() == 1);
  CHECK(find_event(j, r3->added[0])->time_s == *tw::datetime::parse_datetime("2026-03-04"));
}

TEST_CASE("journal: CSV import with units per column (wide form) and per row") {
  Journal j = two_systems();
  const std::string wide =
      "TIME,system,alkalinity_meq_l,calcium_mg_l,ph_total,temperature_f,note\n"
      "2026-11-05T08:00:00Z,Reef,2.85,430,8.02,77.5,after feeding\n"
      "2026-11-06T08:00:00Z,Reef,2.80,,,,\n"
      "2026-11-07T08:00:00Z,Reef,2.80,1430,,,\n";  // Ca 1430: whole row refused
  auto r = import_csv(j, wide);
  REQUIRE(r.ok());
  CHECK(r->added.size() == 6);  // 4 tests + note, then 1 test
  REQUIRE(r->rejected.size() == 1);
  CHECK(r->rejected[0].line == 4);
  CHECK(r->rejected[0].reason.find("0 to 1000 mg/L") != std::string::npos);
  CHECK(test_of(j, r->added[0]).unit == "meq/L");
  CHECK(*canonical_value(test_of(j, r->added[0])) == doctest::Approx(2.85 / 0.35665).epsilon(1e-4));
  CHECK(test_of(j, r->added[2]).ph_scale == tw::carbonate::PhScale::Total);
  CHECK(test_of(j, r->added[3]).unit == "F");

  // Per row: each row names its own unit; a volume in US gallons turns into litres.
  const std::string per_row =
      "time,system,type,parameter,value,unit,volume,volume_unit,top_off_kind\n"
      "2026-11-08,Reef,test,alkalinity,8.0,dKH,,,\n"
      "2026-11-08,Reef,test,alkalinity,2.86,meq/L,,,\n"
      "2026-11-08,Reef,test,alkalinity,143,mg/L CaCO3,,,\n"
      "2026-11-08,Rack 1,water_change,,,,10,gal,\n"
      "2026-11-08,Rack 1,top_off,,,,2,,limewater\n";  // unit from the system's preference (gal)
  auto p = import_csv(j, per_row);
  REQUIRE(p.ok());
  REQUIRE(p->rejected.empty());
  REQUIRE(p->added.size() == 5);
  for (int i = 0; i < 3; ++i) {
    CHECK(*canonical_value(test_of(j, p->added[static_cast<size_t>(i)])) ==
          doctest::Approx(8.0).epsilon(0.005));
  }
  CHECK(std::get<WaterChange>(find_event(j, p->added[3])->data).volume_l ==
        doctest::Approx(37.854).epsilon(1e-4));  // 10 US gal = 37.854 L (231 in^3 definition)
  CHECK(std::get<TopOff>(find_event(j, p->added[4])->data).kind == TopOffKind::Limewater);

  // File-level errors: nothing added.
  const Journal before = j;
  CHECK(import_csv(j, "system,value\nReef,8\n").error().field == "time");
  CHECK_FALSE(import_csv(j, "time,parameter\n2026-11-01,\"alk\n").ok());  // unclosed quote
  CHECK(import_csv(j, "time,parameter,value\n2026-11-01,alk,8\n").error().field == "system");
  CHECK(j == before);
}

TEST_CASE("journal: CSV export escapes formulas, keeps negative numbers, and re-imports") {
  Journal j;
  System s;
  s.name = "=HYPERLINK(\"http://x\")";
  s.volume_l = 100;
  const SystemId id = *add_system(j, s);
  TestResult other{Parameter::Other, "redox", -35.5, "mV", {}, {}, "@probe"};
  REQUIRE(add_event(j, Event{0, id, 1790000000, "", other}).ok());
  REQUIRE(add_event(j, Event{0, id, 1790000100, "", Note{"+1 coral; -2 dKH drop, \"odd\""}}).ok());
  REQUIRE(add_event(j, Event{0, id, 1790000200, "", Note{"\tcmd|' /C calc'!A0"}}).ok());
  const std::string out = export_csv(j);
  CHECK(out.find("\"'=HYPERLINK(\"\"http://x\"\")\"") != std::string::npos);
  CHECK(out.find(",-35.5,") != std::string::npos);  // a negative number stays a number
  CHECK(out.find(",'@probe,") != std::string::npos);
  CHECK(out.find("\"'+1 coral; -2 dKH drop, \"\"odd\"\"\"") != std::string::npos);
  CHECK(out.find("'\tcmd") != std::string::npos);
  CHECK(out.find("\r\n") != std::string::npos);
  CHECK(out.rfind("time,system,type,", 0) == 0);

  // Export -> import into a copy without events gives the same events.
  Journal copy = j;
  copy.events.clear();
  auto r = import_csv(copy, out);
  REQUIRE(r.ok());
  CHECK(r->rejected.empty());
  REQUIRE(copy.events.size() == j.events.size());
  for (size_t i = 0; i < j.events.size(); ++i) CHECK(copy.events[i].data == j.events[i].data);
}

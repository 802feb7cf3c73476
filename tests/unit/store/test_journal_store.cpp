// The journal store (core/store, SQLite): changes validated by the core and refused without a
// trace, exports byte for byte as the core writes them, streamed CSV import reporting the
// same rows as the core's import of the whole text, merge imports, the schema's own checks,
// backup/restore and the integrity check. Every database lives in a fresh temporary file.
#include <doctest/doctest.h>

#include <sqlite3.h>
#include <unistd.h>

#include <cstdio>
#include <filesystem>
#include <fmt/format.h>
#include <sstream>

#include "tidewright/journal/journal_csv.hpp"
#include "tidewright/journal/journal_file.hpp"
#include "tidewright/store/journal_location.hpp"
#include "tidewright/store/journal_store.hpp"
#include "store_test_support.hpp"

using namespace tw::journal;
using tw::store::JournalStore;

namespace {

using tw::store::testing::open_store;
using tw::store::testing::TempDir;

// Invented data: two systems, every event type, n daily alkalinity tests on the first.
Journal sample_journal(int daily_tests) {
  Journal j;
  j.description = "invented test data";
  System reef;
  reef.name = "Reef";
  reef.volume_l = 380;
  reef.targets.alkalinity_dkh = 8.0;
  System rack;
  rack.name = "Rack 1";
  rack.volume_l = 1150;
  rack.volume_parts = VolumeParts{1000, 250, 100};
  rack.units.volume = tw::units::VolumeUnit::UsGallon;
  rack.units.ph_scale = tw::carbonate::PhScale::Total;
  REQUIRE(add_system(j, reef).ok());
  REQUIRE(add_system(j, rack).ok());
  const std::int64_t t0 = 1700000000;
  for (int i = 0; i < daily_tests; ++i) {
    TestResult t{Parameter::Alkalinity, "", 7.5 + 0.001 * (i % 500), "dKH", 0.2, std::nullopt, "kit"};
    REQUIRE(add_event(j, Event{0, 1, t0 + 86400LL * i, "", t}).ok());
  }
  TestResult ph{Parameter::PH, "", 8.05, "pH", std::nullopt, tw::carbonate::PhScale::Total, ""};
  TestResult other{Parameter::Other, "potassium", 400, "mg/L", std::nullopt, std::nullopt, ""};
  REQUIRE(add_event(j, Event{0, 2, t0 + 100, "2023-11-14 22:15", ph}).ok());
  REQUIRE(add_event(j, Event{0, 2, t0 + 200, "", other}).ok());
  REQUIRE(add_event(j, Event{0, 1, t0 + 300, "", Dose{"sodium_carbonate", 12.5, DoseUnit::Grams, std::nullopt}}).ok());
  REQUIRE(add_event(j, Event{0, 2, t0 + 400, "", Dose{"calcium_chloride_dihydrate", 30, DoseUnit::Millilitres, 300.0}}).ok());
  REQUIRE(add_event(j, Event{0, 1, t0 + 500, "", WaterChange{40, 8.0, 430.0, std::nullopt, 35.0}}).ok());
  REQUIRE(add_event(j, Event{0, 2, t0 + 600, "", TopOff{10, TopOffKind::Limewater, 1.2}}).ok());
  REQUIRE(add_event(j, Event{0, 1, t0 + 700, "", Note{"new \"skimmer\", cup\ncleaned"}}).ok());
  return j;
}

std::string json_of(const JournalStore& st) {
  std::ostringstream out;
  REQUIRE(st.export_json(out).ok());
  return out.str();
}

}  // namespace

TEST_CASE("store: a journal imported into an empty database exports byte for byte as the core writes it") {
  TempDir dir;
  auto st = open_store(dir.file("j.db"));
  const Journal j = sample_journal(30);
  auto rep = st->import_journal(j);
  REQUIRE(rep.ok());
  CHECK(rep->systems_added == 2);
  CHECK(rep->events_added == static_cast<std::int64_t>(j.events.size()));
  CHECK(json_of(*st) == serialize_journal(j));
  auto back = parse_journal(json_of(*st));
  REQUIRE(back.ok());
  CHECK(*back == j);
  CHECK(st->schema_version() == 4);
}

TEST_CASE("store: changes are validated by the core and a refused one changes nothing") {
  TempDir dir;
  auto st = open_store(dir.file("j.db"));
  System s;
  s.name = "Quarantine";
  s.volume_l = 60;
  auto id = st->add_system(s);
  REQUIRE(id.ok());
  CHECK(*id == 1);
  s.name = "QUARANTINE";  // names are unique without regard to case
  auto dup = st->add_system(s);
  REQUIRE_FALSE(dup.ok());
  CHECK(dup.error().field == "name");

  const std::string before = json_of(*st);
  TestResult too_high{Parameter::Alkalinity, "", 40, "dKH", std::nullopt, std::nullopt, ""};
  auto refused = st->add_event(Event{0, 1, 1700000000, "", too_high});
  REQUIRE_FALSE(refused.ok());
  CHECK(refused.error().field == "value");
  auto too_big = st->add_event(Event{0, 1, 1700000000, "", WaterChange{61, {}, {}, {}, {}}});
  REQUIRE_FALSE(too_big.ok());
  CHECK(too_big.error().field == "volume_l");
  auto no_system = st->add_event(Event{0, 7, 1700000000, "", Note{"x"}});
  REQUIRE_FALSE(no_system.ok());
  CHECK(no_system.error().field == "system_id");
  CHECK(json_of(*st) == before);

  TestResult ok{Parameter::Alkalinity, "", 8.1, "dKH", std::nullopt, std::nullopt, ""};
  auto e = st->add_event(Event{0, 1, 1700000000, "", ok});
  REQUIRE(e.ok());
  CHECK(*e == 2);  // one counter for systems and events, as in the core
  auto stored = st->event(*e);
  REQUIRE(stored.has_value());
  CHECK(std::get<TestResult>(stored->data) == ok);

  auto has_events = st->remove_system(1);
  REQUIRE_FALSE(has_events.ok());
  CHECK(has_events.error().field == "id");
  Event changed = *stored;
  std::get<TestResult>(changed.data).value = 8.3;
  REQUIRE(st->update_event(changed).ok());
  CHECK(std::get<TestResult>(st->event(*e)->data).value == doctest::Approx(8.3));
  s.id = 1;
  s.name = "Quarantine";
  s.volume_l = 0.05;  // below the accepted 0.1 L
  CHECK_FALSE(st->update_system(s).ok());
  REQUIRE(st->remove_event(*e).ok());
  CHECK_FALSE(st->remove_event(*e).ok());
  REQUIRE(st->remove_system(1).ok());
  CHECK(st->systems().empty());
}

TEST_CASE("store: reads by system, parameter and time, newest first with a limit") {
  TempDir dir;
  auto st = open_store(dir.file("j.db"));
  const Journal j = sample_journal(200);
  REQUIRE(st->import_journal(j).ok());
  EventFilter f;
  f.system_id = 1;
  f.parameter = Parameter::Alkalinity;
  CHECK(st->event_count(f) == 200);
  std::vector<EventId> newest;
  JournalStore::Query q{f, true, 5};
  REQUIRE(st->for_each_event(q, [&](const Event& e) { newest.push_back(e.id); return true; }).ok());
  std::vector<EventId> expected;
  for (const Event* e : select_events(j, f)) expected.push_back(e->id);
  REQUIRE(newest.size() == 5);
  for (std::size_t i = 0; i < 5; ++i) CHECK(newest[i] == expected[expected.size() - 1 - i]);
  auto one = st->system_journal(2);
  REQUIRE(one.ok());
  CHECK(one->systems.size() == 1);
  EventFilter of2;
  of2.system_id = 2;
  CHECK(one->events.size() == select_events(j, of2).size());
  for (const Event& e : one->events) CHECK(e.system_id == 2);
}

TEST_CASE("store: CSV export in chunks equals the core's export of the whole journal") {
  TempDir dir;
  auto st = open_store(dir.file("j.db"));
  const Journal j = sample_journal(12000);  // more than two chunks of 5000
  REQUIRE(st->import_journal(j).ok());
  std::ostringstream out;
  REQUIRE(st->export_csv(out).ok());
  CHECK(out.str() == export_csv(j));
  EventFilter f;
  f.system_id = 2;
  std::ostringstream part;
  REQUIRE(st->export_csv(part, f).ok());
  CHECK(part.str() == export_csv(j, f));
}

TEST_CASE("store: streamed CSV import adds and rejects the same rows as the core's import of the whole text") {
  TempDir dir;
  auto st = open_store(dir.file("j.db"));
  Journal base = sample_journal(0);
  REQUIRE(st->import_journal(base).ok());
  std::string csv = "time,system,parameter,value,unit,note\r\n";
  for (int i = 0; i < 4500; ++i) {  // three chunks of 2000 rows
    const std::string day = fmt::format("2024-{:02d}-{:02d} {:02d}:{:02d}", 1 + (i / 600) % 12, 1 + (i / 24) % 25, i % 24, i % 60);
    if (i % 997 == 5) csv += fmt::format("{},Reef,alkalinity,99,dKH,\r\n", day);       // out of range
    else if (i % 1499 == 7) csv += fmt::format("not a time,Reef,calcium,420,mg/L,\r\n");  // bad time
    else if (i == 2001) csv += fmt::format("{},Reef,,,,\"two\r\nlines\"\r\n", day);      // quoted line break
    else csv += fmt::format("{},Rack 1,magnesium,{},mg/L,\r\n", day, 1200 + i % 300);
  }
  Journal whole = base;
  auto core = import_csv(whole, csv, {});
  REQUIRE(core.ok());
  std::istringstream in(csv);
  auto rep = st->import_csv(in, {});
  REQUIRE(rep.ok());
  CHECK(rep->events_added + rep->duplicates_skipped == static_cast<std::int64_t>(core->added.size()) + core->duplicates_skipped);
  REQUIRE(rep->rejected.size() == core->rejected.size());
  for (std::size_t i = 0; i < rep->rejected.size(); ++i) {
    CHECK(rep->rejected[i].line == core->rejected[i].line);
    CHECK(rep->rejected[i].field == core->rejected[i].field);
  }
  CHECK(st->event_count() == static_cast<std::int64_t>(whole.events.size()));
  // The same file again adds nothing.
  std::istringstream again(csv);
  auto rep2 = st->import_csv(again, {});
  REQUIRE(rep2.ok());
  CHECK(rep2->events_added == 0);
  CHECK(st->event_count() == static_cast<std::int64_t>(whole.events.size()));
  // A file-level error adds nothing at all.
  const auto count = st->event_count();
  std::istringstream broken("time,system,parameter,value\r\n2024-01-01,Reef,alkalinity,8\r\n2024-01-02,Reef,\"alkalinity,8\r\n");
  CHECK_FALSE(st->import_csv(broken, {}).ok());
  CHECK(st->event_count() == count);
}

TEST_CASE("store: a journal merged into a non-empty one matches systems by name and skips what is there") {
  TempDir dir;
  auto st = open_store(dir.file("j.db"));
  const Journal j = sample_journal(20);
  REQUIRE(st->import_journal(j).ok());
  auto again = st->import_journal(j);
  REQUIRE(again.ok());
  CHECK(again->events_added == 0);
  CHECK(again->duplicates_skipped == static_cast<std::int64_t>(j.events.size()));
  Journal other;
  System s;
  s.name = "reef";  // the same system, other case
  s.volume_l = 380;
  REQUIRE(add_system(other, s).ok());
  System n;
  n.name = "New tank";
  n.volume_l = 100;
  REQUIRE(add_system(other, n).ok());
  REQUIRE(add_event(other, Event{0, 1, 1800000000, "", Note{"from the other file"}}).ok());
  REQUIRE(add_event(other, Event{0, 2, 1800000000, "", Note{"new tank"}}).ok());
  auto merged = st->import_journal(other);
  REQUIRE(merged.ok());
  CHECK(merged->systems_added == 1);
  CHECK(merged->events_added == 2);
  EventFilter reef;
  reef.system_id = 1;
  reef.from_s = 1800000000;
  CHECK(st->event_count(reef) == 1);
}

TEST_CASE("store: the schema refuses what the core would refuse, even written past the store") {
  TempDir dir;
  auto st = open_store(dir.file("j.db"));
  REQUIRE(st->import_journal(sample_journal(3)).ok());
  sqlite3* db = st->handle();
  auto refused = [db](const char* sql) { return sqlite3_exec(db, sql, nullptr, nullptr, nullptr) != SQLITE_OK; };
  CHECK(refused("UPDATE events SET time_s = -1 WHERE id = 3"));
  CHECK(refused("UPDATE events SET type = 'party' WHERE id = 3"));
  CHECK(refused("UPDATE events SET system_id = 99 WHERE id = 3"));  // foreign key
  CHECK(refused("UPDATE events SET parameter = NULL WHERE type = 'test'"));
  CHECK(refused("UPDATE events SET amount = 0 WHERE type = 'dose'"));
  CHECK(refused("UPDATE systems SET volume_l = 0 WHERE id = 1"));
  CHECK(refused("DELETE FROM systems WHERE id = 1"));  // it has events
  CHECK(refused("INSERT INTO systems (id, name, kind, volume_l, default_salinity, default_temperature_c, alkalinity_unit, "
                "calcium_magnesium_unit, temperature_unit, ph_scale, volume_unit) VALUES (50, 'reef', 'reef_display', 1, 35, 25, "
                "'dKH', 'mg/L', 'C', 'nbs', 'L')"));  // name taken (no case)
  CHECK(st->check_integrity().ok);
  // What only the core knows (a water change larger than a shrunken tank) is found by the check.
  REQUIRE_FALSE(refused("UPDATE systems SET volume_l = 10 WHERE id = 1"));
  const auto report = st->check_integrity();
  CHECK_FALSE(report.ok);
  REQUIRE_FALSE(report.problems.empty());
  CHECK(report.problems[0].find("volume_l") != std::string::npos);
}

TEST_CASE("store: a database newer than this program is refused, and an older one is migrated on opening") {
  TempDir dir;
  const std::string path = dir.file("j.db");
  { auto st = open_store(path); }
  sqlite3* db = nullptr;
  REQUIRE(sqlite3_open(path.c_str(), &db) == SQLITE_OK);
  REQUIRE(sqlite3_exec(db, "INSERT INTO schema_version (version) VALUES (99)", nullptr, nullptr, nullptr) == SQLITE_OK);
  sqlite3_close(db);
  auto newer = JournalStore::open(path);
  REQUIRE_FALSE(newer.ok());
  CHECK(newer.error().message.find("newer") != std::string::npos);

  std::FILE* f = std::fopen(dir.file("not.db").c_str(), "w");
  std::fputs("{\"format\": \"tidewright-journal\"}", f);
  std::fclose(f);
  auto foreign = JournalStore::open(dir.file("not.db"));
  REQUIRE_FALSE(foreign.ok());
  CHECK(foreign.error().message.find("not a Tidewright journal database") != std::string::npos);
}

TEST_CASE("store: backup while in use, restore from the database or from JSON, ids kept") {
  TempDir dir;
  auto st = open_store(dir.file("j.db"));
  const Journal j = sample_journal(50);
  REQUIRE(st->import_journal(j).ok());
  REQUIRE(st->backup_to(dir.file("copy.db")).ok());
  CHECK_FALSE(st->backup_to(dir.file("copy.db")).ok());  // never overwrites
  REQUIRE(st->remove_event(5).ok());
  REQUIRE(st->add_event(Event{0, 1, 1750000000, "", Note{"after the backup"}}).ok());
  REQUIRE(st->restore_from_database(dir.file("copy.db")).ok());
  CHECK(json_of(*st) == serialize_journal(j));
  REQUIRE(st->remove_event(6).ok());
  REQUIRE(st->restore_from_journal(j).ok());
  CHECK(json_of(*st) == serialize_journal(j));
  CHECK(st->check_integrity().ok);
}

TEST_CASE("store: --journal names: a JSON journal is read in memory, and copied into FILE.db on the first change") {
  TempDir dir;
  const std::string json_path = dir.file("old.json");
  const std::string text = serialize_journal(sample_journal(10));
  {
    std::FILE* f = std::fopen(json_path.c_str(), "w");
    std::fputs(text.c_str(), f);
    std::fclose(f);
  }
  auto read = tw::store::open_journal(json_path, tw::store::Access::Read);
  REQUIRE(read.ok());
  CHECK(read->store->event_count() == 17);
  CHECK_FALSE(std::filesystem::exists(dir.file("old.db")));
  auto write = tw::store::open_journal(json_path, tw::store::Access::Write);
  REQUIRE(write.ok());
  CHECK(write->notice.find("old.db") != std::string::npos);
  CHECK(std::filesystem::exists(dir.file("old.db")));
  CHECK(json_of(*write->store) == text);
  write->store.reset();
  auto reopened = tw::store::open_journal(dir.file("old.db"), tw::store::Access::Write);
  REQUIRE(reopened.ok());
  CHECK(reopened->notice.empty());
  auto missing = tw::store::open_journal(dir.file("new.json"), tw::store::Access::WriteOrCreate);
  REQUIRE_FALSE(missing.ok());
  CHECK(missing.error().message.find("new.db") != std::string::npos);
}

TEST_CASE("store: an app's changes are applied in one transaction, and a clash of new ids moves the later one") {
  TempDir dir;
  auto st = open_store(dir.file("j.db"));
  const Journal j = sample_journal(10);
  REQUIRE(st->import_journal(j).ok());
  // Two copies of the app start from the same journal and each add an entry.
  Journal a = j, b = j;
  auto ida = add_event(a, Event{0, 1, 1750000000, "", Note{"from window A"}});
  auto idb = add_event(b, Event{0, 1, 1750000001, "", Note{"from window B"}});
  REQUIRE(ida.ok());
  REQUIRE(idb.ok());
  CHECK(*ida == *idb);  // the same id handed out twice
  auto ra = st->apply(diff_journals(j, a));
  REQUIRE(ra.ok());
  CHECK(ra->moved_ids.empty());
  auto rb = st->apply(diff_journals(j, b));
  REQUIRE(rb.ok());
  REQUIRE(rb->moved_ids.size() == 1);
  CHECK(st->event(*ida)->data == EventData{Note{"from window A"}});
  CHECK(st->event(rb->moved_ids[0].second)->data == EventData{Note{"from window B"}});
  // An edit and a removal go through; a refused record writes nothing at all.
  Journal c = j;
  REQUIRE(remove_event(c, c.events.front().id).ok());
  Event bad = c.events.back();
  bad.data = Note{""};
  c.events.back() = bad;
  const auto before = st->event_count();
  CHECK_FALSE(st->apply(diff_journals(j, c)).ok());
  CHECK(st->event_count() == before);
}

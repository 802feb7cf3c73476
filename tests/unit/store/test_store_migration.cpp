// Schema migrations of the journal database: a database exactly as an older build wrote it
// (journal_schema_v2.sql: the `sqlite3 .dump` of a schema-version-2 database holding 18
// invented events of every type, a dose schedule and a dose marked against it, made with the
// build before version 3) is brought to the current version on opening, by a writer or by a
// reader, without losing or changing a record; a newer database is refused.
#include <doctest/doctest.h>

#include <sqlite3.h>
#include <sys/stat.h>
#include <unistd.h>

#include <filesystem>
#include <fmt/format.h>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "tidewright/store/journal_store.hpp"

using namespace tw::journal;
using tw::store::JournalStore;

namespace {

constexpr int kCurrentVersion = 4;

std::string fixture_sql() {
  const std::string here = __FILE__;  // .../tests/unit/store/test_store_migration.cpp
  const std::string path = here.substr(0, here.rfind('/')) + "/journal_schema_v2.sql";
  std::ifstream in(path, std::ios::binary);
  REQUIRE_MESSAGE(in.good(), path << " not found");
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

// A fresh file holding the version-2 database of the fixture.
std::string make_v2_database(const std::string& name) {
  const auto dir = std::filesystem::temp_directory_path() / fmt::format("tw_migration_{}", ::getpid());
  std::filesystem::create_directories(dir);
  const std::string path = (dir / name).string();
  std::filesystem::remove(path);
  sqlite3* db = nullptr;
  REQUIRE(sqlite3_open(path.c_str(), &db) == SQLITE_OK);
  char* err = nullptr;
  const int rc = sqlite3_exec(db, fixture_sql().c_str(), nullptr, nullptr, &err);
  const std::string why = err ? err : "";
  sqlite3_free(err);
  sqlite3_close(db);
  REQUIRE_MESSAGE(rc == SQLITE_OK, why);
  return path;
}

// Every row of a query, each as its columns' SQL literals (quote() keeps types: 8 vs 8.0 vs '8').
std::vector<std::string> rows_of(const std::string& path, const std::string& table, const std::string& order) {
  sqlite3* db = nullptr;
  REQUIRE(sqlite3_open_v2(path.c_str(), &db, SQLITE_OPEN_READONLY, nullptr) == SQLITE_OK);
  std::vector<std::string> out;
  sqlite3_stmt* st = nullptr;
  REQUIRE(sqlite3_prepare_v2(db, ("SELECT * FROM " + table + " ORDER BY " + order).c_str(), -1, &st, nullptr) ==
          SQLITE_OK);
  while (sqlite3_step(st) == SQLITE_ROW) {
    std::string row;
    for (int c = 0; c < sqlite3_column_count(st); ++c) {
      row += std::string(sqlite3_column_name(st, c)) + "=";
      switch (sqlite3_column_type(st, c)) {
        case SQLITE_NULL: row += "NULL"; break;
        case SQLITE_INTEGER: row += fmt::format("i{}", sqlite3_column_int64(st, c)); break;
        case SQLITE_FLOAT: row += fmt::format("r{}", sqlite3_column_double(st, c)); break;
        default: row += fmt::format("'{}'", reinterpret_cast<const char*>(sqlite3_column_text(st, c))); break;
      }
      row += ";";
    }
    out.push_back(row);
  }
  sqlite3_finalize(st);
  sqlite3_close(db);
  return out;
}

std::string scalar(sqlite3* db, const char* sql) {
  sqlite3_stmt* st = nullptr;
  REQUIRE(sqlite3_prepare_v2(db, sql, -1, &st, nullptr) == SQLITE_OK);
  std::string v;
  if (sqlite3_step(st) == SQLITE_ROW && sqlite3_column_text(st, 0)) {
    v = reinterpret_cast<const char*>(sqlite3_column_text(st, 0));
  }
  sqlite3_finalize(st);
  return v;
}

}  // namespace

TEST_CASE("store migration: a version-2 database opens as version 3 with every record unchanged") {
  const std::string path = make_v2_database("writer.db");
  const auto events_before = rows_of(path, "events", "id");
  const auto systems_before = rows_of(path, "systems", "id");
  const auto meta_before = rows_of(path, "meta", "key");
  REQUIRE(events_before.size() == 18);
  REQUIRE(systems_before.size() == 3);

  auto opened = JournalStore::open(path);
  REQUIRE_MESSAGE(opened.ok(), (opened.ok() ? "" : opened.error().message));
  auto& st = **opened;
  CHECK(st.schema_version() == kCurrentVersion);
  CHECK(rows_of(path, "events", "id") == events_before);
  CHECK(rows_of(path, "systems", "id") == systems_before);
  CHECK(rows_of(path, "meta", "key") == meta_before);
  const auto report = st.check_integrity();
  CHECK_MESSAGE(report.ok, (report.problems.empty() ? "" : report.problems[0]));
  CHECK(report.events == 18);

  // The events are now clustered by system and time, and one system's read uses that order.
  sqlite3* db = st.handle();
  CHECK(scalar(db, "SELECT sql FROM sqlite_schema WHERE name = 'events'").find("WITHOUT ROWID") != std::string::npos);
  sqlite3_stmt* q = nullptr;
  REQUIRE(sqlite3_prepare_v2(db, "EXPLAIN QUERY PLAN SELECT * FROM events WHERE system_id = 1 ORDER BY time_s, id", -1,
                             &q, nullptr) == SQLITE_OK);
  std::string details;
  while (sqlite3_step(q) == SQLITE_ROW) details += reinterpret_cast<const char*>(sqlite3_column_text(q, 3));
  sqlite3_finalize(q);
  CHECK_MESSAGE(details.find("PRIMARY KEY") != std::string::npos, details);
  CHECK_MESSAGE(details.find("TEMP B-TREE") == std::string::npos, details);  // no sort step

  // A schedule's marked dose still finds its schedule; ids stay unique; new ids continue.
  EventFilter one;
  one.system_id = 1;
  auto j = st.system_journal(1);
  REQUIRE(j.ok());
  CHECK(static_cast<std::int64_t>(j->events.size()) == st.event_count(one));
  const std::int64_t next_before = std::stoll(scalar(db, "SELECT value FROM meta WHERE key = 'next_id'"));
  auto added = st.add_event(Event{0, 1, 1790000000, "", Note{"after the migration"}});
  REQUIRE(added.ok());
  CHECK(*added == next_before);
  CHECK(sqlite3_exec(db, fmt::format("INSERT INTO events (id, system_id, time_s, type, note) VALUES ({}, 2, 1, 'note', 'x')",
                                     *added).c_str(), nullptr, nullptr, nullptr) != SQLITE_OK);  // id taken
  CHECK(st.check_integrity().ok);
}

TEST_CASE("store migration: a reader of a writable older database migrates it; a read-only one is refused clearly") {
  const std::string path = make_v2_database("reader.db");
  const auto events_before = rows_of(path, "events", "id");
  tw::store::OpenOptions read;
  read.read_only = true;
  {
    auto opened = JournalStore::open(path, read);
    REQUIRE_MESSAGE(opened.ok(), (opened.ok() ? "" : opened.error().message));
    CHECK((*opened)->schema_version() == kCurrentVersion);
    CHECK((*opened)->event_count() == 18);
    // Still a reader: no record can be changed through it.
    CHECK_FALSE((*opened)->add_event(Event{0, 1, 1790000000, "", Note{"x"}}).ok());
  }
  CHECK(rows_of(path, "events", "id") == events_before);

  const std::string locked = make_v2_database("locked.db");
  REQUIRE(::chmod(locked.c_str(), 0444) == 0);
  auto refused = JournalStore::open(locked, read);
  REQUIRE_FALSE(refused.ok());
  CHECK(refused.error().message.find("schema version 2") != std::string::npos);
  CHECK(refused.error().message.find("make it writable") != std::string::npos);
  ::chmod(locked.c_str(), 0644);
  std::filesystem::remove_all(std::filesystem::path(path).parent_path());
}

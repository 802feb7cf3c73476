// The streamed JSON import and restore (JournalStore::import_journal_stream,
// restore_from_journal_stream) give exactly the database the whole-journal way gives (the
// demo journal, a generated one, into an empty database, merged into a non-empty one, as a
// restore), and a bad record in the middle of a large file rolls everything back, named.
#include <doctest/doctest.h>

#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <sstream>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "tidewright/journal/journal_file.hpp"
#include "tidewright/store/journal_location.hpp"
#include "tidewright/store/journal_store.hpp"
#include "store_test_support.hpp"

using namespace tw::journal;
using tw::Ok;
using tw::Result;
using tw::Status;
using tw::store::JournalStore;

namespace {

using tw::store::testing::open_store;
using tw::store::testing::TempDir;

std::string demo_text() {
  std::string here = __FILE__;
  const std::string root = here.substr(0, here.rfind("/tests/"));
  std::ifstream in(root + "/assets/demo/demo_journal.json", std::ios::binary);
  REQUIRE(in.good());
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}

// Invented data: three systems, n events of several kinds spread over them.
Journal generated(int events) {
  Journal j;
  j.description = "generated";
  for (int s = 0; s < 3; ++s) {
    System sys;
    sys.name = fmt::format("Tank {}", s + 1);
    sys.volume_l = 200 + 100 * s;
    REQUIRE(add_system(j, sys).ok());
  }
  const std::int64_t t0 = 1600000000;
  for (int i = 0; i < events; ++i) {
    const SystemId sid = 1 + i % 3;
    const std::int64_t t = t0 + 3600LL * i;
    switch (i % 4) {
      case 0: REQUIRE(add_event(j, Event{0, sid, t, "", TestResult{Parameter::Alkalinity, "", 7 + 0.01 * (i % 200), "dKH", std::nullopt, std::nullopt, ""}}).ok()); break;
      case 1: REQUIRE(add_event(j, Event{0, sid, t, "", TestResult{Parameter::Calcium, "", 400.0 + i % 50, "mg/L", std::nullopt, std::nullopt, ""}}).ok()); break;
      case 2: REQUIRE(add_event(j, Event{0, sid, t, "", Dose{"sodium_carbonate", 5.0 + i % 7, DoseUnit::Grams, std::nullopt}}).ok()); break;
      default: REQUIRE(add_event(j, Event{0, sid, t, "", Note{fmt::format("note {}", i)}}).ok()); break;
    }
  }
  return j;
}

std::string json_of(const JournalStore& st) {
  std::ostringstream out;
  REQUIRE(st.export_json(out).ok());
  return out.str();
}

JournalStore::ImportReport stream_import(JournalStore& st, const std::string& text,
                                         JournalStore::ImportMode mode = JournalStore::ImportMode::Commit) {
  std::istringstream in(text);
  auto r = st.import_journal_stream(in, mode);
  REQUIRE_MESSAGE(r.ok(), (r.ok() ? "" : r.error().message));
  return std::move(r).value();
}

void same_report(const JournalStore::ImportReport& a, const JournalStore::ImportReport& b) {
  CHECK(a.systems_added == b.systems_added);
  CHECK(a.events_added == b.events_added);
  CHECK(a.duplicates_skipped == b.duplicates_skipped);
}

}  // namespace

TEST_CASE("store stream: the demo journal and a generated one, into an empty database, as the whole-journal import") {
  for (const std::string& text : {demo_text(), serialize_journal(generated(3000))}) {
    TempDir dir;
    auto old_way = open_store(dir.file("old.db"));
    auto new_way = open_store(dir.file("new.db"));
    auto j = parse_journal(text);
    REQUIRE(j.ok());
    auto a = old_way->import_journal(*j);
    REQUIRE(a.ok());
    const auto b = stream_import(*new_way, text);
    same_report(*a, b);
    CHECK(json_of(*new_way) == json_of(*old_way));
    CHECK(json_of(*new_way) == serialize_journal(*j));
    CHECK(new_way->check_integrity().ok);
  }
}

TEST_CASE("store stream: merged into a non-empty database: systems by name, new ids, duplicates skipped") {
  TempDir dir;
  const Journal base = generated(40);
  Journal other = generated(120);  // the first 40 events are the base's: duplicates
  System extra;
  extra.name = "Quarantine";
  extra.volume_l = 80;
  auto extra_id = add_system(other, extra);
  REQUIRE(extra_id.ok());
  REQUIRE(add_event(other, Event{0, *extra_id, 1700000000, "", Note{"new tank"}}).ok());
  auto old_way = open_store(dir.file("old.db"));
  auto new_way = open_store(dir.file("new.db"));
  REQUIRE(old_way->import_journal(base).ok());
  stream_import(*new_way, serialize_journal(base));
  auto a = old_way->import_journal(other);
  REQUIRE(a.ok());
  const auto b = stream_import(*new_way, serialize_journal(other));
  same_report(*a, b);
  CHECK(b.systems_added == 1);
  CHECK(b.duplicates_skipped == 40);
  CHECK(json_of(*new_way) == json_of(*old_way));
  // A dry run stores nothing and lists what it would add.
  const std::string before = json_of(*new_way);
  Journal third = generated(5);
  third.systems[0].name = "Tank 9";
  const auto dry = stream_import(*new_way, serialize_journal(third), JournalStore::ImportMode::DryRun);
  auto old_dry = old_way->import_journal(third, JournalStore::ImportMode::DryRun);
  REQUIRE(old_dry.ok());
  same_report(*old_dry, dry);
  CHECK(dry.events_added == 2);  // the events of the new "Tank 9"; the others are there already
  CHECK(dry.would_add == old_dry->would_add);
  CHECK(json_of(*new_way) == before);
}

TEST_CASE("store import: a dose marked against a schedule merges into a non-empty store, both ways") {
  // The demo journal (invented data) has schedules and a dose marked against one: merged into
  // a store that already holds another system, the schedule gets a new id and the dose points
  // at it; merged again, everything is a duplicate (the marked dose matched through the stored
  // schedule's id). Before 2026-12-04 the marked dose kept the file's schedule id and the
  // merge was refused.
  const std::string text = demo_text();
  auto j = parse_journal(text);
  REQUIRE(j.ok());
  std::size_t marked = 0;
  for (const Event& e : j->events) {
    if (const auto* d = std::get_if<Dose>(&e.data); d && d->schedule_id) ++marked;
  }
  REQUIRE(marked >= 1);
  Journal first;
  System other;
  other.name = "Frag rack";
  other.volume_l = 120;
  REQUIRE(add_system(first, other).ok());
  REQUIRE(add_event(first, Event{0, 1, 1700000000, "", Note{"already here"}}).ok());
  TempDir dir;
  auto whole = open_store(dir.file("whole.db"));
  auto streamed = open_store(dir.file("streamed.db"));
  REQUIRE(whole->import_journal(first).ok());
  stream_import(*streamed, serialize_journal(first));
  auto a = whole->import_journal(*j);
  REQUIRE_MESSAGE(a.ok(), (a.ok() ? "" : a.error().message));
  const auto b = stream_import(*streamed, text);
  same_report(*a, b);
  CHECK(a->events_added == static_cast<std::int64_t>(j->events.size()));
  CHECK(json_of(*streamed) == json_of(*whole));
  CHECK(whole->check_integrity().ok);
  // Every marked dose points at a stored schedule of its own system.
  std::size_t pointed = 0;
  REQUIRE(whole->for_each_event({}, [&](const Event& e) {
    if (const auto* d = std::get_if<Dose>(&e.data); d && d->schedule_id) {
      auto s = whole->event(*d->schedule_id);
      CHECK((s && std::holds_alternative<DoseSchedule>(s->data) && s->system_id == e.system_id));
      ++pointed;
    }
    return true;
  }).ok());
  CHECK(pointed == marked);
  // Again: nothing new.
  auto again = whole->import_journal(*j);
  REQUIRE_MESSAGE(again.ok(), (again.ok() ? "" : again.error().message));
  CHECK(again->events_added == 0);
  CHECK(again->duplicates_skipped == static_cast<std::int64_t>(j->events.size()));
  const auto again_streamed = stream_import(*streamed, text);
  same_report(*again, again_streamed);
}

TEST_CASE("store stream: a restore from a JSON stream equals the restore from the parsed journal") {
  TempDir dir;
  const std::string text = demo_text();
  auto old_way = open_store(dir.file("old.db"));
  auto new_way = open_store(dir.file("new.db"));
  REQUIRE(old_way->import_journal(generated(30)).ok());
  REQUIRE(new_way->import_journal(generated(30)).ok());
  REQUIRE(old_way->restore_from_journal(*parse_journal(text)).ok());
  std::istringstream in(text);
  Status st = new_way->restore_from_journal_stream(in);
  REQUIRE_MESSAGE(st.ok(), (st.ok() ? "" : st.error().message));
  CHECK(json_of(*new_way) == json_of(*old_way));
}

TEST_CASE("store stream: a bad record in the middle rolls everything back and is named") {
  TempDir dir;
  auto doc = nlohmann::json::parse(serialize_journal(generated(10000)));
  REQUIRE(doc["events"][5000]["type"] == "test");
  doc["events"][5000]["value"] = -1;
  const std::string bad = doc.dump(2);
  for (bool empty : {true, false}) {
    auto st = open_store(dir.file(empty ? "empty.db" : "full.db"));
    if (!empty) stream_import(*st, serialize_journal(generated(10)));
    const std::string before = json_of(*st);
    std::istringstream in(bad);
    auto r = st->import_journal_stream(in);
    REQUIRE_FALSE(r.ok());
    CHECK(r.error().message.rfind("events[5000]", 0) == 0);
    CHECK(r.error().field.rfind("events[5000].", 0) == 0);
    CHECK(json_of(*st) == before);
    std::istringstream again(bad);
    Status restored = st->restore_from_journal_stream(again);
    REQUIRE_FALSE(restored.ok());
    CHECK(restored.error().message.rfind("events[5000]", 0) == 0);
    CHECK(json_of(*st) == before);
  }
  // An error only seen after the last event (next_id not above every id) rolls back too.
  auto low = nlohmann::json::parse(serialize_journal(generated(100)));
  low["next_id"] = 50;
  auto st = open_store(dir.file("low.db"));
  std::istringstream in(low.dump());
  auto r = st->import_journal_stream(in);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "next_id");
  CHECK(st->event_count() == 0);
  CHECK(st->systems().empty());
}

TEST_CASE("store stream: an old JSON journal is copied into FILE.db through the stream, and a bad one leaves no database") {
  TempDir dir;
  const std::string json = dir.file("old.json");
  std::ofstream(json) << serialize_journal(generated(200));
  auto opened = tw::store::open_journal(json, tw::store::Access::Write);
  REQUIRE_MESSAGE(opened.ok(), (opened.ok() ? "" : opened.error().message));
  CHECK(opened->store->event_count() == 200);
  CHECK(std::filesystem::exists(dir.file("old.db")));

  const std::string broken = dir.file("broken.json");
  auto doc = nlohmann::json::parse(serialize_journal(generated(200)));
  doc["events"][150]["system_id"] = 77;
  std::ofstream(broken) << doc.dump(2);
  auto refused = tw::store::open_journal(broken, tw::store::Access::Write);
  REQUIRE_FALSE(refused.ok());
  CHECK(refused.error().message.find("events[150]") != std::string::npos);
  CHECK_FALSE(std::filesystem::exists(dir.file("broken.db")));
}

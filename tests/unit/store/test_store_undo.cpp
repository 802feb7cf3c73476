// The change log (schema version 4): every add, edit and remove through the store is undone by
// undo_last, newest first, back to exactly what was stored; restores stop it.
#include <doctest/doctest.h>

#include <unistd.h>

#include <filesystem>
#include <fmt/format.h>
#include <sstream>

#include "tidewright/store/journal_store.hpp"

using namespace tw::journal;
using tw::store::JournalStore;

namespace {

struct UndoFile {
  std::string path = (std::filesystem::temp_directory_path() / fmt::format("tw_undo_{}.db", ::getpid())).string();
  UndoFile() { clean(); }
  ~UndoFile() { clean(); }
  void clean() {
    for (const char* end : {"", "-wal", "-shm"}) std::filesystem::remove(path + end);
  }
};

// The journal's JSON without its next_id: undo never hands an id out again.
std::string snapshot(const JournalStore& st) {
  std::ostringstream out;
  REQUIRE(st.export_json(out).ok());
  std::string text = out.str();
  const auto at = text.find("  \"next_id\"");
  if (at != std::string::npos) text.erase(at, text.find('\n', at) - at + 1);
  return text;
}

}  // namespace

TEST_CASE("store: undo_last reverts adds, edits and removals one at a time") {
  UndoFile file;
  auto opened = JournalStore::open(file.path);
  REQUIRE(opened.ok());
  JournalStore& st = **opened;
  CHECK(st.schema_version() == 4);
  CHECK(st.undo_last().error().field == "undo");  // nothing yet

  System reef;
  reef.name = "Reef";
  reef.volume_l = 300;
  const std::string empty = snapshot(st);
  const SystemId sys = *st.add_system(reef);
  const std::string with_system = snapshot(st);
  TestResult alk{Parameter::Alkalinity, "", 8.1, "dKH", std::nullopt, std::nullopt, ""};
  const EventId ev = *st.add_event(Event{0, sys, 1700000000, "", alk});
  const std::string with_test = snapshot(st);

  Event changed = *st.event(ev);
  std::get<TestResult>(changed.data).value = 7.4;
  REQUIRE(st.update_event(changed).ok());
  System bigger = *st.system(sys);
  bigger.volume_l = 450;
  bigger.name = "Big reef";
  REQUIRE(st.update_system(bigger).ok());
  const std::string edited = snapshot(st);
  REQUIRE(st.remove_event(ev).ok());

  auto u = st.undo_last();
  REQUIRE(u.ok());
  CHECK(u->find("removed test") != std::string::npos);
  CHECK(snapshot(st) == edited);
  REQUIRE(st.undo_last().ok());  // the system's edit
  CHECK(st.system(sys)->volume_l == 300);
  CHECK(st.system(sys)->name == "Reef");
  REQUIRE(st.undo_last().ok());  // the test's edit
  CHECK(snapshot(st) == with_test);
  REQUIRE(st.undo_last().ok());  // the test
  CHECK(snapshot(st) == with_system);
  REQUIRE(st.undo_last().ok());  // the system
  CHECK(snapshot(st) == empty);
  CHECK_FALSE(st.undo_last().ok());
}

TEST_CASE("store: a removed system comes back with its events; a restore stops undo") {
  UndoFile file;
  auto opened = JournalStore::open(file.path);
  REQUIRE(opened.ok());
  JournalStore& st = **opened;
  System rack;
  rack.name = "Rack";
  rack.volume_l = 800;
  const SystemId sys = *st.add_system(rack);
  REQUIRE(st.add_event(Event{0, sys, 1700000000, "", Note{" =1+2"}}).ok());
  const std::string before = snapshot(st);
  REQUIRE(st.remove_system(sys, true).ok());
  CHECK(st.systems().empty());
  REQUIRE(st.undo_last().ok());
  CHECK(snapshot(st) == before);

  Journal other;
  REQUIRE(st.restore_from_journal(other).ok());
  auto stop = st.undo_last();
  REQUIRE_FALSE(stop.ok());
  CHECK(stop.error().message.find("restore") != std::string::npos);
}

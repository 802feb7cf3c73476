// The JSON export honours the filters of the CSV export (issue 14): the events the filter
// selects, only the filtered system, and the schedule a kept marked dose refers to, so the file stays valid.
#include <doctest/doctest.h>

#include <unistd.h>

#include <filesystem>
#include <fmt/format.h>
#include <sstream>

#include "tidewright/journal/journal_file.hpp"
#include "tidewright/store/journal_store.hpp"

using namespace tw::journal;
using tw::store::JournalStore;

namespace {

struct ScratchFile {
  std::string path = (std::filesystem::temp_directory_path() /
                      fmt::format("tw_export_filter_{}.db", ::getpid())).string();
  ScratchFile() { std::filesystem::remove(path); }
  ~ScratchFile() {
    for (const char* end : {"", "-wal", "-shm"}) std::filesystem::remove(path + end);
  }
};

std::string json_of(const JournalStore& st, const EventFilter& f) {
  std::ostringstream out;
  REQUIRE(st.export_json(out, f).ok());
  return out.str();
}

}  // namespace

TEST_CASE("store: export_json keeps what the filter keeps, as the CSV export does") {
  ScratchFile file;
  auto opened = JournalStore::open(file.path);
  REQUIRE(opened.ok());
  JournalStore& st = **opened;
  System a;
  a.name = "Reef";
  a.volume_l = 300;
  System b = a;
  b.name = "Frag rack";
  const SystemId ra = *st.add_system(a), rb = *st.add_system(b);
  const std::int64_t t0 = 1700000000, day = 86400;
  for (int i = 0; i < 6; ++i) {
    TestResult alk{Parameter::Alkalinity, "", 8.0, "dKH", std::nullopt, std::nullopt, ""};
    TestResult ca{Parameter::Calcium, "", 420, "mg/L", std::nullopt, std::nullopt, ""};
    REQUIRE(st.add_event(Event{0, i % 2 ? rb : ra, t0 + day * i, "", alk}).ok());
    REQUIRE(st.add_event(Event{0, ra, t0 + day * i + 60, "", ca}).ok());
  }
  DoseSchedule pump{"pump 1", "sodium_carbonate", 5, DoseUnit::Millilitres, 100.0, "", 4, 1.0, std::nullopt};
  const EventId sched = *st.add_event(Event{0, ra, t0, "", pump});
  Dose missed{"sodium_carbonate", 5, DoseUnit::Millilitres, 100.0, ScheduleMark::Missed, sched};
  REQUIRE(st.add_event(Event{0, ra, t0 + 4 * day + 3600, "", missed}).ok());

  EventFilter f;
  f.system_id = ra;
  f.from_s = t0 + 3 * day;
  auto back = parse_journal(json_of(st, f));
  REQUIRE_MESSAGE(back.ok(), (back.ok() ? "" : back.error().message));
  REQUIRE(back->systems.size() == 1);
  CHECK(back->systems[0].name == "Reef");
  // The events the filter selects (the CSV export writes those it has a form for: not
  // schedules or marked doses), and the schedule the missed dose refers to.
  CHECK(back->events.size() == static_cast<std::size_t>(st.event_count(f)) + 1);
  CHECK(back->events.size() == 6);
  CHECK(back->events.front().id == sched);
  for (const Event& e : back->events) {
    CHECK(e.system_id == ra);
    if (e.id != sched) CHECK(e.time_s >= *f.from_s);
  }

  EventFilter calcium;
  calcium.parameter = Parameter::Calcium;
  auto only_ca = parse_journal(json_of(st, calcium));
  REQUIRE(only_ca.ok());
  CHECK(only_ca->events.size() == 6);
  CHECK(only_ca->systems.size() == 2);

  // No filter: the whole journal, as before.
  auto all = parse_journal(json_of(st, {}));
  REQUIRE(all.ok());
  CHECK(all->events.size() == 14);
}

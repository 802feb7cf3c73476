// merge_journal (journal_merge.hpp): systems matched by name keep their own settings, new
// ones come with theirs, ids are remapped, duplicates skipped (a second merge adds nothing),
// schedules and the doses marked against them come along, and a refused entry changes nothing.
#include <algorithm>

#include <doctest/doctest.h>

#include "tidewright/journal/journal_merge.hpp"
#include "tidewright/journal/schedule.hpp"

using namespace tw::journal;

namespace {

constexpr std::int64_t kT = 1785542400;  // 2026-08-01T00:00:00Z

System system_named(const std::string& name, double volume_l) {
  System s;
  s.name = name;
  s.volume_l = volume_l;
  return s;
}

Event test_at(SystemId sys, std::int64_t t, double dkh) {
  TestResult r;
  r.parameter = tw::Parameter::Alkalinity;
  r.value = dkh;
  r.unit = "dKH";
  return Event{0, sys, t, "", r};
}

DoseSchedule pump(double ml) {
  DoseSchedule d;
  d.device = "pump 1";
  d.additive_id = "sodium_carbonate";
  d.amount = ml;
  d.stock_g_per_l = 80;
  d.doses_per_day = 4;
  return d;
}

// Here: "Reef" (380 L) with one test. The file: "reef " (500 L, gallons) with the same test and a
// new one, and "Frag tank" with a schedule and a dose marked missed against it. The file's ids
// are made to clash with the target's.
struct Pair {
  Journal here, file;
  SystemId here_reef = 0;
};

Pair make_pair() {
  Pair p;
  p.here_reef = *add_system(p.here, system_named("Reef", 380));
  REQUIRE(add_event(p.here, test_at(p.here_reef, kT, 8.0)).ok());
  Journal& f = p.file;
  f.next_id = 1;
  System reef = system_named("reef", 500);
  reef.units.volume = tw::units::VolumeUnit::UsGallon;
  const SystemId f_reef = *add_system(f, reef);
  const SystemId f_frag = *add_system(f, system_named("Frag tank", 200));
  REQUIRE(add_event(f, test_at(f_reef, kT, 8.0)).ok());            // already here
  REQUIRE(add_event(f, test_at(f_reef, kT + 86400, 7.8)).ok());    // new
  auto sch = start_schedule(f, f_frag, kT, pump(10));
  REQUIRE(sch.ok());
  Dose missed;
  missed.additive_id = "sodium_carbonate";
  missed.amount = 10;
  missed.unit = DoseUnit::Millilitres;
  missed.stock_g_per_l = 80;
  missed.mark = ScheduleMark::Missed;
  missed.schedule_id = *sch;
  REQUIRE(add_event(f, Event{0, f_frag, kT + 6 * 3600, "", missed}).ok());
  return p;
}

}  // namespace

TEST_CASE("journal: merging adds new systems and entries, skips what is already there") {
  Pair p = make_pair();
  auto rep = merge_journal(p.here, p.file);
  REQUIRE_MESSAGE(rep.ok(), rep.error().message);
  CHECK(rep->systems_matched == 1);
  CHECK(rep->systems_added == 1);
  CHECK(rep->entries_added == 3);  // the new test, the schedule, the marked dose
  CHECK(rep->duplicates_skipped == 1);
  CHECK(p.here.systems.size() == 2);
  CHECK(p.here.events.size() == 4);
  // Merging the same file again adds nothing and counts everything as already there.
  const Journal once = p.here;
  auto again = merge_journal(p.here, p.file);
  REQUIRE(again.ok());
  CHECK(again->entries_added == 0);
  CHECK(again->systems_added == 0);
  CHECK(again->duplicates_skipped == 4);
  CHECK(p.here == once);
}

TEST_CASE("journal: a system matched by name keeps its own settings and the report says so") {
  Pair p = make_pair();
  auto rep = merge_journal(p.here, p.file);
  REQUIRE(rep.ok());
  const System* reef = find_system(p.here, p.here_reef);
  REQUIRE(reef);
  CHECK(reef->name == "Reef");
  CHECK(reef->volume_l == 380);
  CHECK(reef->units.volume == tw::units::VolumeUnit::Litre);
  REQUIRE(rep->settings_kept.size() == 1);
  CHECK(rep->settings_kept[0] == "Reef");
  // The file's test of "reef" is now an entry of the Reef here.
  EventFilter of_reef;
  of_reef.system_id = p.here_reef;
  CHECK(select_events(p.here, of_reef).size() == 2);
}

TEST_CASE("journal: merged ids are new, systems and schedules remapped, schedules kept") {
  Pair p = make_pair();
  auto rep = merge_journal(p.here, p.file);
  REQUIRE(rep.ok());
  const System* frag = find_system_by_name(p.here, "Frag tank");
  REQUIRE(frag);
  CHECK(frag->volume_l == 200);
  CHECK(rep->system_ids.at(p.file.systems[1].id) == frag->id);
  const Event* schedule = nullptr;
  const Event* dose = nullptr;
  for (const Event& e : p.here.events) {
    if (std::holds_alternative<DoseSchedule>(e.data)) schedule = &e;
    if (std::holds_alternative<Dose>(e.data)) dose = &e;
  }
  REQUIRE(schedule);
  REQUIRE(dose);
  CHECK(schedule->system_id == frag->id);
  CHECK(std::get<DoseSchedule>(schedule->data) == pump(10));
  CHECK(std::get<Dose>(dose->data).schedule_id == schedule->id);
  // Every id unique and below next_id.
  std::vector<std::int64_t> ids;
  for (const auto& s : p.here.systems) ids.push_back(s.id);
  for (const auto& e : p.here.events) ids.push_back(e.id);
  std::sort(ids.begin(), ids.end());
  CHECK(std::adjacent_find(ids.begin(), ids.end()) == ids.end());
  CHECK(ids.back() < p.here.next_id);
  // Four doses a day, one of them marked missed against the merged schedule: three given.
  CHECK(scheduled_doses(p.here, frag->id, kT, kT + 86400 - 1).size() == 3);
}

TEST_CASE("journal: a merge refused by the core changes nothing") {
  Pair p = make_pair();
  // A water change larger than the Reef here (380 L) holds: the file's reef was 500 L.
  WaterChange wc;
  wc.volume_l = 450;
  REQUIRE(add_event(p.file, Event{0, p.file.systems[0].id, kT + 2 * 86400, "", wc}).ok());
  const Journal before = p.here;
  auto rep = merge_journal(p.here, p.file);
  REQUIRE_FALSE(rep.ok());
  CHECK(rep.error().field == "volume_l");
  CHECK(p.here == before);
}

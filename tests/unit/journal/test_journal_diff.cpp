// diff_journals: only the records that changed, by id.
#include <doctest/doctest.h>

#include "tidewright/journal/journal_diff.hpp"

using namespace tw::journal;

TEST_CASE("journal: diff_journals lists added, changed and removed records only") {
  Journal before;
  System s;
  s.name = "Reef";
  s.volume_l = 300;
  REQUIRE(add_system(before, s).ok());
  for (int i = 0; i < 5; ++i) REQUIRE(add_event(before, Event{0, 1, 1700000000 + i, "", Note{"n" + std::to_string(i)}}).ok());
  CHECK(diff_journals(before, before).empty());

  Journal after = before;
  REQUIRE(remove_event(after, 3).ok());
  Event changed = *find_event(after, 4);
  std::get<Note>(changed.data).text = "edited";
  REQUIRE(update_event(after, changed).ok());
  auto added = add_event(after, Event{0, 1, 1700000100, "", Note{"new"}});
  REQUIRE(added.ok());
  after.description = "farm";
  const JournalChanges c = diff_journals(before, after);
  CHECK(c.systems_put.empty());
  CHECK(c.systems_removed.empty());
  REQUIRE(c.events_removed.size() == 1);
  CHECK(c.events_removed[0] == 3);
  REQUIRE(c.events_put.size() == 2);
  CHECK(c.events_put[0].id == 4);
  CHECK(c.events_put[1].id == *added);
  CHECK(c.description == std::optional<std::string>("farm"));
  CHECK(c.next_id == after.next_id);
}

TEST_CASE("journal: apply_changes brings a journal up to another's state, record by record") {
  Journal before;
  System s;
  s.name = "Reef";
  s.volume_l = 300;
  REQUIRE(add_system(before, s).ok());
  for (int i = 0; i < 6; ++i) REQUIRE(add_event(before, Event{0, 1, 1700000000 + 50 * i, "", Note{"n" + std::to_string(i)}}).ok());

  Journal after = before;
  REQUIRE(remove_event(after, 2).ok());
  Event moved = *find_event(after, 5);
  moved.time_s = 1699999000;  // edited to an earlier time: must move to the front
  REQUIRE(update_event(after, moved).ok());
  s.name = "Frag tank";
  auto second = add_system(after, s);
  REQUIRE(second.ok());
  REQUIRE(add_event(after, Event{0, *second, 1700000010, "", Note{"first in the new tank"}}).ok());
  after.description = "two tanks";

  Journal applied = before;
  apply_changes(applied, diff_journals(before, after));
  CHECK(applied == after);

  // Removing a system and its events, and a put of a record already there (a change seen twice).
  Journal fewer = after;
  REQUIRE(remove_system(fewer, *second, true).ok());
  JournalChanges c = diff_journals(after, fewer);
  apply_changes(applied, c);
  apply_changes(applied, c);
  CHECK(applied == fewer);

  // next_id never goes back, even when the change was made from an older state.
  JournalChanges old;
  old.next_id = 2;
  apply_changes(applied, old);
  CHECK(applied.next_id == fewer.next_id);
}

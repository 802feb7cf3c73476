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

// System names: trimmed, no control characters, never an id; older names still load.
#include <doctest/doctest.h>

#include "tidewright/journal/journal.hpp"
#include "tidewright/journal/journal_file.hpp"
#include "tidewright/journal/system_name.hpp"

using namespace tw::journal;

namespace {
System named(const std::string& name) {
  System s;
  s.name = name;
  s.volume_l = 200;
  return s;
}
}  // namespace

TEST_CASE("journal: id_from_text reads what a person types as an id") {
  CHECK(id_from_text("2") == 2);
  CHECK(id_from_text(" 2 ") == 2);
  CHECK(id_from_text("+17") == 17);
  CHECK(id_from_text("#3") == 3);
  CHECK_FALSE(id_from_text("0"));
  CHECK_FALSE(id_from_text("-2"));
  CHECK_FALSE(id_from_text("2a"));
  CHECK_FALSE(id_from_text("tank 2"));
  CHECK_FALSE(id_from_text(""));
  CHECK_FALSE(id_from_text("1234567890123456789"));  // 19 digits: not an id we hand out
}

TEST_CASE("journal: a new system's name is trimmed and must not be blank, control or an id") {
  Journal j;
  auto id = add_system(j, named("  Frag tank \t"));
  REQUIRE(id.ok());
  CHECK(find_system(j, *id)->name == "Frag tank");

  for (const char* bad : {"", "   ", "2", " 42 ", "+7", "#3", "line\nbreak", "tab\there", "bell\x07", "c1\xC2\x85x"}) {
    CAPTURE(bad);
    Journal before = j;
    auto r = add_system(j, named(bad));
    REQUIRE_FALSE(r.ok());
    CHECK(r.error().field == "name");
    CHECK(j == before);
  }
  auto digits = add_system(j, named("2"));
  CHECK(digits.error().message.find("reads as the id 2") != std::string::npos);
  auto blank = add_system(j, named("  "));
  CHECK(blank.error().message.find("1 to 100") != std::string::npos);
  // Look-alikes with spaces around them are the same name once trimmed.
  auto twin = add_system(j, named(" frag TANK "));
  REQUIRE_FALSE(twin.ok());
  CHECK(twin.error().message.find("already used") != std::string::npos);
  CHECK(add_system(j, named("Tank 2")).ok());
  CHECK(add_system(j, named("2nd reef")).ok());
  CHECK(add_system(j, named("Récif")).ok());
}

TEST_CASE("journal: a name from before the rule loads, may stay, and may only change to a good one") {
  // A journal written before the rule, with a system named "2" (put in directly, as an older
  // program did), goes through its file and loads again.
  Journal old;
  old.systems = {named("2"), named("Reef")};
  old.systems[0].id = 1;
  old.systems[1].id = 2;
  old.next_id = 3;
  auto parsed = parse_journal(serialize_journal(old));
  REQUIRE_MESSAGE(parsed.ok(), (parsed.ok() ? "" : parsed.error().message));
  Journal j = *parsed;
  CHECK(find_system(j, 1)->name == "2");

  System bigger = *find_system(j, 1);
  bigger.volume_l = 150;  // name unchanged: accepted
  CHECK(update_system(j, bigger).ok());
  CHECK(find_system(j, 1)->volume_l == 150);

  System renamed = bigger;
  renamed.name = "3";
  auto r = update_system(j, renamed);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "name");
  CHECK(find_system(j, 1)->name == "2");

  renamed.name = "  Quarantine  ";
  CHECK(update_system(j, renamed).ok());
  CHECK(find_system(j, 1)->name == "Quarantine");
}

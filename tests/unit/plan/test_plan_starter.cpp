// The plan input `plan --starter` writes (plan_starter.hpp): from the demo journal (invented
// data, assets/demo/make_demo_journal.py) and from a system with nothing logged.
#include <algorithm>
#include <fstream>
#include <iterator>
#include <string>

#include <doctest/doctest.h>

#include "tidewright/common/datetime.hpp"
#include "tidewright/journal/journal_file.hpp"
#include "tidewright/journal/schedule.hpp"
#include "tidewright/plan/plan.hpp"
#include "tidewright/plan/plan_starter.hpp"

using namespace tw;

namespace {
std::string demo_journal_text() {
  std::string here = __FILE__;
  std::ifstream in(here.substr(0, here.rfind("/tests/")) + "/assets/demo/demo_journal.json", std::ios::binary);
  REQUIRE(in.good());
  return std::string((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
}
bool any_note_has(const plan::StarterInput& s, const std::string& part) {
  return std::any_of(s.notes.begin(), s.notes.end(), [&](const std::string& n) { return n.find(part) != std::string::npos; });
}
}  // namespace

TEST_CASE("plan starter: the demo reef's running schedules, estimate and targets, read back to the same plan") {
  auto j = journal::parse_journal(demo_journal_text());
  REQUIRE(j.ok());
  const journal::System* sys = journal::find_system_by_name(*j, "Living room reef");
  REQUIRE(sys != nullptr);
  std::int64_t last = 0;
  for (const auto& e : j->events) last = std::max(last, e.time_s);
  const std::int64_t now = last + 3600;
  auto s = plan::starter_plan_input(*j, sys->id, now);
  REQUIRE(s.ok());
  // One delivery per schedule running now, named by its device.
  const auto running = journal::schedules_running(*j, sys->id, now);
  REQUIRE_FALSE(running.empty());
  // The schedules first, then what the keeper doses by hand beside them (the demo's magnesium).
  REQUIRE(s->input.deliveries.size() > running.size());
  CHECK(s->input.deliveries.back().manual);
  for (const journal::Event* e : running) {
    const auto& device = std::get<journal::DoseSchedule>(e->data).device;
    CHECK(std::any_of(s->input.deliveries.begin(), s->input.deliveries.end(),
                      [&](const plan::Delivery& d) { return d.device == device; }));
  }
  CHECK(any_note_has(*s, "schedules running now"));
  CHECK(s->input.system.volume_l == doctest::Approx(sys->volume_l));
  CHECK(s->input.demand.alkalinity_meq_per_day > 0);  // the demo reef consumes (make_demo_journal.py)
  // The limits are written as set: `plan --journal` keeps room for the estimates again.
  CHECK_FALSE(s->input.limits_as_set.has_value());
  CHECK(s->input.start_date == datetime::format_date_utc((now / 86400 + 1) * 86400));

  // Written with comments in front (as the command line does) and read back: the same input.
  auto text = plan::plan_input_to_json(s->input);
  REQUIRE(text.ok());
  auto back = plan::plan_input_from_json("// a starter\n/* with comments */\n" + *text);
  REQUIRE_MESSAGE(back.ok(), back.error().message);
  CHECK(*plan::plan_input_to_json(*back) == *text);
  auto p = plan::make_plan(*back);
  REQUIRE(p.ok());
  const plan::CheckReport check = plan::check_plan(*back, *p);
  CHECK((check.ok() || (!p->verdict.holds && check.only_floors_and_falls())));
}

TEST_CASE("plan starter: a system with nothing logged starts at its targets with the starting pair of stocks") {
  journal::Journal j;
  journal::System sys;
  sys.name = "Quarantine 60";
  sys.volume_l = 60;
  auto id = journal::add_system(j, sys);
  REQUIRE(id.ok());
  auto s = plan::starter_plan_input(j, *id, 1785542400);
  REQUIRE(s.ok());
  REQUIRE(s->input.deliveries.size() == 2);
  CHECK(s->input.deliveries[0].device == "pump 1");
  CHECK(s->input.system.alkalinity_dkh == doctest::Approx(s->input.targets.alkalinity_dkh.target));
  CHECK(s->input.demand.alkalinity_meq_per_day == 0);
  CHECK(any_note_has(*s, "starting pair"));
  CHECK(any_note_has(*s, "no test in the journal"));
  CHECK(any_note_has(*s, "default"));  // targets the system does not set
  auto text = plan::plan_input_to_json(s->input);
  REQUIRE(text.ok());
  CHECK(plan::plan_input_from_json(*text).ok());

  auto missing = plan::starter_plan_input(j, *id + 7, 1785542400);
  REQUIRE_FALSE(missing.ok());
  CHECK(missing.error().field == "system");
}

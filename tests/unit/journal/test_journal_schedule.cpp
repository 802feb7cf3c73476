// Standing dose schedules in the journal (schedule.hpp): start, change, stop, the doses they
// gave with missed marks applied, validation of marked doses, and the JSON round trip.
#include <doctest/doctest.h>

#include "tidewright/journal/journal_file.hpp"
#include "tidewright/journal/schedule.hpp"

using namespace tw::journal;

namespace {

constexpr std::int64_t kDay = 86400;
constexpr std::int64_t kStart = 1785542400;  // 2026-08-01T00:00:00Z

Journal one_system(SystemId* id) {
  Journal j;
  System s;
  s.name = "Reef";
  s.volume_l = 380;
  *id = *add_system(j, s);
  return j;
}

DoseSchedule pump(double ml, int per_day) {
  DoseSchedule d;
  d.device = "pump 1";
  d.additive_id = "sodium_carbonate";
  d.amount = ml;
  d.unit = DoseUnit::Millilitres;
  d.stock_g_per_l = 80;
  d.doses_per_day = per_day;
  return d;
}

double total_ml(const std::vector<ScheduledDose>& doses) {
  double sum = 0;
  for (const auto& d : doses) sum += d.dose.amount;
  return sum;
}

}  // namespace

TEST_CASE("journal: a schedule gives its doses from its start until it is changed or stopped") {
  SystemId sys = 0;
  Journal j = one_system(&sys);
  auto first = start_schedule(j, sys, kStart, pump(10, 4));
  REQUIRE_MESSAGE(first.ok(), first.error().message);
  // Ten days at 4 x 10 mL, then changed to 2 x 30 mL for five days, then stopped.
  auto second = change_schedule(j, *first, kStart + 10 * kDay, pump(30, 2));
  REQUIRE_MESSAGE(second.ok(), second.error().message);
  REQUIRE(stop_schedule(j, *second, kStart + 15 * kDay).ok());
  const auto doses = scheduled_doses(j, sys, kStart, kStart + 30 * kDay);
  CHECK(doses.size() == 40 + 10);
  CHECK(total_ml(doses) == doctest::Approx(400 + 300));
  CHECK(doses.front().time_s == kStart);
  CHECK(doses[1].time_s == kStart + 6 * 3600);  // every 24 h / 4
  CHECK(schedules_running(j, sys, kStart + 12 * kDay).size() == 1);
  CHECK(schedules_running(j, sys, kStart + 16 * kDay).empty());
  // A window inside the span counts only its own doses.
  CHECK(scheduled_doses(j, sys, kStart + 2 * kDay, kStart + 3 * kDay - 1).size() == 4);
}

TEST_CASE("journal: pump calibration and missed marks change what the water got") {
  SystemId sys = 0;
  Journal j = one_system(&sys);
  DoseSchedule d = pump(10, 2);
  d.calibration = 1.1;  // the pump delivers 11 mL per 10 mL set
  const EventId id = *start_schedule(j, sys, kStart, d);
  CHECK(total_ml(scheduled_doses(j, sys, kStart, kStart + kDay - 1)) == doctest::Approx(22.0));
  // Missed: the dose at 12:00 on day 0 was not given (logged 40 minutes late).
  Event missed;
  missed.system_id = sys;
  missed.time_s = kStart + 12 * 3600 + 40 * 60;
  missed.data = Dose{"sodium_carbonate", 10, DoseUnit::Millilitres, 80, ScheduleMark::Missed, id};
  REQUIRE(add_event(j, missed).ok());
  const auto doses = scheduled_doses(j, sys, kStart, kStart + kDay - 1);
  REQUIRE(doses.size() == 1);
  CHECK(doses[0].time_s == kStart);
  CHECK(doses[0].dose.amount == doctest::Approx(11.0));
  // The schedule cannot be removed while a mark refers to it.
  CHECK_FALSE(remove_event(j, id).ok());
}

TEST_CASE("journal: marked doses are refused when they do not fit their schedule") {
  SystemId sys = 0;
  Journal j = one_system(&sys);
  const EventId id = *start_schedule(j, sys, kStart, pump(10, 2));
  Event e;
  e.system_id = sys;
  e.time_s = kStart + kDay;
  e.data = Dose{"calcium_chloride_dihydrate", 10, DoseUnit::Millilitres, 80, ScheduleMark::Extra, id};
  auto r = add_event(j, e);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "additive_id");
  e.data = Dose{"sodium_carbonate", 10, DoseUnit::Millilitres, 80, ScheduleMark::Extra, std::nullopt};
  r = add_event(j, e);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "schedule_id");
  e.time_s = kStart - kDay;  // before the schedule started
  e.data = Dose{"sodium_carbonate", 10, DoseUnit::Millilitres, 80, ScheduleMark::Extra, id};
  r = add_event(j, e);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "time");
  // Bad schedules name their field.
  DoseSchedule bad = pump(10, 0);
  auto s = start_schedule(j, sys, kStart, bad);
  REQUIRE_FALSE(s.ok());
  CHECK(s.error().field == "doses_per_day");
  bad = pump(10, 2);
  bad.calibration = 3;
  s = start_schedule(j, sys, kStart, bad);
  REQUIRE_FALSE(s.ok());
  CHECK(s.error().field == "calibration");
  // Stopping before the start is refused and leaves the journal as it was.
  const Journal before = j;
  CHECK_FALSE(stop_schedule(j, id, kStart - 1).ok());
  CHECK(j == before);
}

TEST_CASE("journal: schedules and marked doses survive the JSON round trip") {
  SystemId sys = 0;
  Journal j = one_system(&sys);
  DoseSchedule d = pump(12.5, 24);
  d.stock_name = "soda ash 80";
  d.calibration = 0.97;
  const EventId id = *start_schedule(j, sys, kStart, d);
  Event e;
  e.system_id = sys;
  e.time_s = kStart + 3 * kDay;
  e.data = Dose{"sodium_carbonate", 12.5, DoseUnit::Millilitres, 80, ScheduleMark::Extra, id};
  REQUIRE(add_event(j, e).ok());
  REQUIRE(stop_schedule(j, id, kStart + 9 * kDay).ok());
  const std::string text = serialize_journal(j);
  CHECK(text.find("\"type\": \"schedule\"") != std::string::npos);
  CHECK(text.find("\"mark\": \"extra\"") != std::string::npos);
  auto back = parse_journal(text);
  REQUIRE_MESSAGE(back.ok(), back.error().message);
  CHECK(*back == j);
}

TEST_CASE("journal: a schedule's one-line summary names the compound and says the strength once") {
  DoseSchedule d = pump(47.5, 2);
  CHECK(schedule_summary(d) == "pump 1: 47.5 mL x 2 a day of Sodium carbonate (soda ash), stock 80 g/L");
  d.stock_name = "soda ash 80 g/L";  // the keeper's own name already says the strength
  d.calibration = 1.03;
  CHECK(schedule_summary(d) ==
        "pump 1: 47.5 mL x 2 a day of Sodium carbonate (soda ash), stock soda ash 80 g/L, calibration 1.03");
  d.stock_name = "alk stock";
  d.additive_id = "something_else";  // not in the catalog: shown as stored
  d.calibration = 1.0;
  CHECK(schedule_summary(d) == "pump 1: 47.5 mL x 2 a day of something_else, stock alk stock, 80 g/L");
}

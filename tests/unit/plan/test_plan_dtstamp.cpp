// The iCalendar DTSTAMP is a real UTC date-time (RFC 5545 3.3.5): month 13, day 32 or hour 24
// are refused naming the field and what is accepted.
#include <doctest/doctest.h>

#include "tidewright/plan/plan.hpp"

using namespace tw::plan;

TEST_CASE("plan: iCalendar DTSTAMP must be a real UTC date-time") {
  const char* input = R"({
    "system": {"volume_l": 100, "salinity": 35, "temperature_c": 25, "alkalinity_dkh": 7.5, "calcium_mg_l": 420,
               "magnesium_mg_l": 1300},
    "demand": {"alkalinity_meq_per_day": 20},
    "additives": [{"compound": "sodium_carbonate", "device": "hand", "doses_per_day": 1, "max_dose": 20}],
    "horizon_days": 2
  })";
  auto in = plan_input_from_json(input);
  REQUIRE(in.ok());
  auto plan = make_plan(*in);
  REQUIRE(plan.ok());
  CHECK(plan_to_icalendar(*in, *plan, "20261231T235959Z").ok());
  for (const char* bad : {"20261301T120000Z", "20260132T120000Z", "20260229T120000Z", "20261201T240000Z",
                          "20261201T126000Z", "2026120xT120000Z", "20261201 120000Z"}) {
    CAPTURE(bad);
    auto r = plan_to_icalendar(*in, *plan, bad);
    REQUIRE_FALSE(r.ok());
    CHECK(r.error().field == "dtstamp_utc");
  }
}

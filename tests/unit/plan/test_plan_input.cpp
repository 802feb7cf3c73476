// Strict plan input: the water is required (or left to a journal, listed), unknown keys are
// refused naming the nearest known key, dates are real dates, errors use the file's own names,
// and capped_by / the limit record say when a pump setting or a limit shaped a dose.
#include <doctest/doctest.h>

#include <string>

#include "tidewright/plan/plan.hpp"

using namespace tw::plan;

namespace {
const std::string kSystem =
    R"("system": {"volume_l": 60, "salinity": 35, "temperature_c": 25, "alkalinity_dkh": 7.0, "calcium_mg_l": 420, "magnesium_mg_l": 1300})";
const std::string kAdditive =
    R"("additives": [{"stock": {"name": "alk", "ingredients": [{"compound": "sodium_carbonate", "grams_per_l": 50}]}, "doses_per_day": 4, "max_dose": 5, "max_per_day": 8}])";
std::string doc(const std::string& extra) { return "{" + kSystem + ", " + kAdditive + extra + "}"; }
}  // namespace

TEST_CASE("plan input: the water is required; without it no plan for a tank that is not yours") {
  auto none = plan_input_from_json("{" + kAdditive + "}");
  REQUIRE_FALSE(none.ok());
  CHECK(none.error().field == "system.volume_l");
  CHECK(none.error().message.find("--journal") != std::string::npos);
  // With a journal to fill them, the missing ones are listed instead.
  std::vector<std::string> left;
  auto some = plan_input_from_json(R"({"system": {"volume_l": 60}, )" + kAdditive + "}", &left);
  REQUIRE(some.ok());
  CHECK(left == std::vector<std::string>{"salinity", "temperature_c", "alkalinity_dkh", "calcium_mg_l",
                                         "magnesium_mg_l"});
  CHECK(plan_input_from_json(doc("")).ok());
}

TEST_CASE("plan input: unknown keys are refused naming the nearest known key") {
  auto typo = plan_input_from_json(doc(R"(, "horizon_day": 10)"));
  REQUIRE_FALSE(typo.ok());
  CHECK(typo.error().field == "horizon_day");
  CHECK(typo.error().message.find("\"horizon_days\"") != std::string::npos);
  auto inner = plan_input_from_json(R"({"system": {"volum_l": 60, "volume_l": 60, "salinity": 35, "temperature_c": 25, "alkalinity_dkh": 7, "calcium_mg_l": 420, "magnesium_mg_l": 1300}, )" + kAdditive + "}");
  REQUIRE_FALSE(inner.ok());
  CHECK(inner.error().field == "system.volum_l");
  CHECK(inner.error().message.find("\"volume_l\"") != std::string::npos);
  auto pump = plan_input_from_json("{" + kSystem + R"(, "additives": [{"compound": "sodium_carbonate", "max_doze": 3}]})");
  REQUIRE_FALSE(pump.ok());
  CHECK(pump.error().field == "additives[0].max_doze");
  CHECK(pump.error().message.find("\"max_dose\"") != std::string::npos);
  auto limit = plan_input_from_json(doc(R"(, "limits": {"alkalinity_min_dk": 6.5})"));
  REQUIRE_FALSE(limit.ok());
  CHECK(limit.error().field == "limits.alkalinity_min_dk");
  CHECK(limit.error().message.find("\"alkalinity_min_dkh\"") != std::string::npos);
}

TEST_CASE("plan input: dates are real calendar dates") {
  auto feb30 = plan_input_from_json(doc(R"(, "start_date": "2026-02-30")"));
  REQUIRE_FALSE(feb30.ok());
  CHECK(feb30.error().field == "start_date");
  CHECK_FALSE(plan_input_from_json(doc(R"(, "start_date": "2026-13-01")")).ok());
  CHECK_FALSE(plan_input_from_json(doc(R"(, "start_date": "2026-1-01")")).ok());
  CHECK(plan_input_from_json(doc(R"(, "start_date": "2028-02-29")")).ok());  // leap year
  CHECK_FALSE(plan_input_from_json(doc(R"(, "start_date": "2027-02-29")")).ok());
}

TEST_CASE("plan input: errors use the file's names; caps and overrides are recorded with the dose") {
  auto in = plan_input_from_json(doc(""));
  REQUIRE(in.ok());
  in->deliveries[0].max_dose = -1;
  auto refused = make_plan(*in);
  REQUIRE_FALSE(refused.ok());
  CHECK(refused.error().field == "additives[0].max_dose");  // not the internal "deliveries"
  // A pump allowed 8 mL/day of 50 g/L soda ash in 60 L: 0.4 g = 7.55 meq = 0.35 dKH/day; a
  // demand of 30 meq/day is far beyond it, so the pump's volume per day binds every day.
  auto short_in = plan_input_from_json(doc(R"(, "demand": {"alkalinity_meq_per_day": 30}, "horizon_days": 3)"));
  REQUIRE(short_in.ok());
  auto plan = make_plan(*short_in);
  REQUIRE(plan.ok());
  REQUIRE_FALSE(plan->doses.empty());
  for (const auto& d : plan->doses) CHECK_FALSE(d.cap.empty());
  bool recorded = false;
  for (const auto& r : plan->limits.record) recorded = recorded || r.find("max_per_day") != std::string::npos;
  CHECK(recorded);
  const std::string json = plan_to_json(*short_in, *plan);
  CHECK(json.find("\"capped_by\": \"max_per_day\"") != std::string::npos);
  // An override is refused without a reason and recorded with one.
  CHECK_FALSE(plan_input_from_json(doc(R"(, "overrides": [{"limit": "alkalinity_min_dkh", "value": 4}])")).ok());
  auto over = plan_input_from_json(doc(R"(, "overrides": [{"limit": "alkalinity_min_dkh", "value": 4, "reason": "recovering system, vet's advice"}])"));
  REQUIRE(over.ok());
  REQUIRE(over->limits.record.size() == 1);
  CHECK(over->limits.record.front().find("OVERRIDE") != std::string::npos);
}

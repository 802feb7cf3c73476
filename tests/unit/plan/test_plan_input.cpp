// Strict plan input: the water is required (or left to a journal, listed), unknown keys are
// refused naming the nearest known key, dates are real dates, errors use the file's own names,
// and capped_by / the limit record say when a pump setting or a limit shaped a dose.
#include <doctest/doctest.h>

#include <string>
#include <utility>

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

TEST_CASE("plan input: a member of the wrong type is refused naming it, never thrown") {
  // Each of these once reached json::value(), which throws on a member of another type.
  const std::pair<std::string, std::string> cases[] = {
      {R"({"stock": {"name": 7, "ingredients": [{"compound": "sodium_carbonate", "grams_per_l": 50}]}})",
       "additives[0].stock.name"},
      {R"({"stock": {"ingredients": [{"compound": 12, "grams_per_l": 50}]}})",
       "additives[0].stock.ingredients.compound"},
      {R"({"label": {"name": false, "dose_ml": 1, "tank_volume_l": 100, "rise": 0.1}})",
       "additives[0].label.name"},
      {R"({"label": {"parameter": 1, "dose_ml": 1, "tank_volume_l": 100, "rise": 0.1}})",
       "additives[0].label.parameter"},
      {R"({"label": {"caustic": "yes", "dose_ml": 1, "tank_volume_l": 100, "rise": 0.1}})",
       "additives[0].label.caustic"},
      {R"({"compound": "sodium_carbonate", "device": 5})", "additives[0].device"},
      {R"({"compound": "sodium_carbonate", "manual": "no"})", "additives[0].manual"},
  };
  for (const auto& [additive, field] : cases) {
    auto r = plan_input_from_json("{" + kSystem + R"(, "additives": [)" + additive + "]}");
    REQUIRE_FALSE(r.ok());
    CHECK(r.error().field == field);
    CHECK(r.error().message.find(field) != std::string::npos);
  }
  // A whole number too large for the reader is refused, not wrapped (2^32 + 1 once read as 1).
  auto wrapped = plan_input_from_json(doc(R"(, "horizon_days": 4294967297)"));
  REQUIRE_FALSE(wrapped.ok());
  CHECK(wrapped.error().field == "horizon_days");
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
  // The record is read by keepers: the cap in words; the file keeps its key (capped_by below).
  for (const auto& r : plan->limits.record) {
    recorded = recorded || r.find("the pump's largest amount per day") != std::string::npos;
  }
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

TEST_CASE("plan input file written back: read again, it gives the same input and the same plan") {
  // Every kind of additive a file can describe, a loosened limit, a limit past its hard bound
  // (an override) and every optional setting away from its default.
  const std::string text = R"({
    "system": {"name": "Frag tank 3", "volume_l": 240, "salinity": 34.2, "temperature_c": 26.1,
               "alkalinity_dkh": 7.1, "calcium_mg_l": 418, "magnesium_mg_l": 1320, "ph_total": 8.05,
               "air_co2_ppm": 650},
    "targets": {"alkalinity_dkh": {"target": 8.2, "low": 7.8, "high": 8.6}},
    "demand": {"alkalinity_meq_per_day": 40, "calcium_mg_per_day": 700, "magnesium_mg_per_day": 90},
    "additives": [
      {"stock": {"name": "soda 90", "temperature_c": 21,
                 "ingredients": [{"compound": "sodium_carbonate", "grams_per_l": 90}]},
       "device": "pump A", "doses_per_day": 6, "min_dose": 0.5, "max_dose": 12, "max_per_day": 60, "reservoir": 1800,
       "calibration": 0.92},
      {"limewater": {"temperature_c": 20, "fraction_of_saturation": 0.8}, "device": "top-off", "max_dose": 5000},
      {"label": {"name": "Mg liquid", "parameter": "magnesium", "dose_ml": 10, "tank_volume_l": 200, "rise": 5}},
      {"compound": "calcium_chloride_dihydrate", "device": "hand", "first_hour": 18, "last_hour": 20}
    ],
    "limits": {"alkalinity_rise_dkh_per_day": 0.6, "calcium_max_mg_l": 520},
    "overrides": [{"limit": "alkalinity_max_dkh", "value": 14.5, "reason": "reef-wide test"}],
    "evaporation_l_per_day": 2.5, "horizon_days": 9, "gas_exchange_hours": 6, "salinity_tolerance": 0.7,
    "start_date": "2027-01-15"
  })";
  auto first = plan_input_from_json(text);
  REQUIRE_MESSAGE(first.ok(), first.error().message);
  auto written = plan_input_to_json(*first);
  REQUIRE(written.ok());
  auto second = plan_input_from_json(*written);
  REQUIRE_MESSAGE(second.ok(), second.error().message << "\n" << *written);
  // Written again, the same text: nothing was lost or changed on the way.
  CHECK(*plan_input_to_json(*second) == *written);
  CHECK(second->system.name == "Frag tank 3");
  CHECK(second->system.ph_total == first->system.ph_total);
  CHECK(second->deliveries.size() == 4);
  for (std::size_t i = 0; i < first->deliveries.size(); ++i) {
    CAPTURE(i);
    CHECK(second->deliveries[i].additive.name == first->deliveries[i].additive.name);
    CHECK(second->deliveries[i].additive.per_unit.alkalinity_eq == first->deliveries[i].additive.per_unit.alkalinity_eq);
    CHECK(second->deliveries[i].max_per_day == first->deliveries[i].max_per_day);
    CHECK(second->deliveries[i].calibration == first->deliveries[i].calibration);
  }
  CHECK(second->deliveries[0].calibration == 0.92);
  for (const LimitSpec& spec : limit_specs()) CHECK(second->limits.get(spec.id) == first->limits.get(spec.id));
  CHECK(second->start_date == "2027-01-15");
  // The plans are the same, dose for dose.
  auto a = make_plan(*first);
  auto b = make_plan(*second);
  REQUIRE_MESSAGE(a.ok(), a.error().message);
  REQUIRE_MESSAGE(b.ok(), b.error().message);
  REQUIRE(a->doses.size() == b->doses.size());
  for (std::size_t i = 0; i < a->doses.size(); ++i) {
    CHECK(a->doses[i].amount == b->doses[i].amount);
    CHECK(a->doses[i].minute == b->doses[i].minute);
  }
  // The plan's own JSON carries the input it was made from.
  CHECK(plan_to_json(*first, *a).find("\"input\"") != std::string::npos);
}

TEST_CASE("plan input file written back: an additive described only by its effect cannot be written") {
  auto in = plan_input_from_json(doc(""));
  REQUIRE(in.ok());
  in->deliveries[0].additive.origin = {};
  auto written = plan_input_to_json(*in);
  REQUIRE_FALSE(written.ok());
  CHECK(written.error().field == "additives[0]");
}

// The verdict "cannot hold" and the mishap answers, checked against figures worked by hand.
#include <doctest/doctest.h>

#include <algorithm>
#include <string>

#include "tidewright/plan/plan.hpp"

using namespace tw::plan;
namespace ad = tw::additives;

namespace {
PlanInput base(double volume_l) {
  PlanInput in;
  in.system.volume_l = volume_l;
  in.system.salinity = 35;
  in.system.temperature_c = 25;
  in.system.alkalinity_dkh = 8.0;
  in.system.calcium_mg_l = 430;
  in.system.magnesium_mg_l = 1350;
  in.system.air_co2_ppm = 425;
  in.targets = {{8.0, 7.5, 8.5}, {430, 410, 450}, {1350, 1300, 1400}};
  in.horizon_days = 7;
  return in;
}
// "pump 1" dosing 50 g/L soda ash 12 times a day, at most 10 mL a dose and max_per_day a day.
Delivery soda_pump(double max_per_day) {
  auto soda = ad::additive_from_stock({"soda ash 50 g/L", {{ad::CompoundId::SodiumCarbonate, 50.0}}, 22.0});
  REQUIRE(soda.ok());
  Delivery d;
  d.additive = *soda;
  d.device = "pump 1";
  d.doses_per_day = 12;
  d.max_dose = 10;
  d.max_per_day = max_per_day;
  return d;
}
}  // namespace

TEST_CASE("plan verdict: pumps far short of the demand (the issue's 2,390 L system), worked by hand") {
  // By hand: 50 g/L sodium carbonate (105.988 g/mol, 2 eq/mol): 0.05 g/mL / 105.988 x 2 x 1000
  // = 0.943503 meq/mL. The pump gives at most min(12 doses x 10 mL, 50 mL/day) = 50 mL/day
  // = 47.175 meq/day; the system consumes 925 meq/day. To cover it alone: 925 / 0.943503
  // = 980.39 mL/day. Largest dose: the pump's 10 mL (the single-dose limit 0.5 dKH in 2,390 L
  // = 0.5 x 0.356652 x 2390 = 426.2 meq = 451.7 mL allows more), so 980.39 / 10 -> 99 doses a
  // day; or a stock 980.39 / 50 = 19.6 times as strong.
  PlanInput in = base(2390);
  in.system.alkalinity_dkh = 6.85;
  in.demand.alkalinity_meq_per_day = 925;
  in.deliveries.push_back(soda_pump(50));
  auto plan = make_plan(in);
  REQUIRE(plan.ok());
  const Verdict& v = plan->verdict;
  MESSAGE(v.headline);
  for (const auto& f : v.fixes) MESSAGE(f);
  CHECK_FALSE(v.holds);
  CHECK(v.headline.rfind("CANNOT HOLD", 0) == 0);
  REQUIRE(v.shortfalls.size() == 1);
  CHECK(v.shortfalls[0].parameter == "alkalinity");
  CHECK(v.shortfalls[0].deliverable_per_day == doctest::Approx(47.175).epsilon(1e-4));
  CHECK(v.shortfalls[0].consumed_per_day == 925.0);
  REQUIRE(v.first_limit.has_value());
  CHECK(*v.first_limit == LimitId::AlkalinityFloor);
  // In plain words, as the app shows it: the limit's description, not its plan-file key.
  CHECK(v.headline.find(limit_spec(LimitId::AlkalinityFloor).description) != std::string::npos);
  CHECK(v.headline.find(limit_spec(LimitId::AlkalinityFloor).key) == std::string::npos);
  // 6.85 -> 6.0 dKH: 0.85 x 0.356652 x 2390 = 724.5 meq at a net loss of at most 925 - 47.2 =
  // 877.8 meq/day: the floor is crossed within the first day.
  CHECK(v.first_day == 1);
  REQUIRE(v.fixes.size() == 1);
  CHECK(v.fixes[0].find("980.4 mL/day") != std::string::npos);
  CHECK(v.fixes[0].find("99 doses/day") != std::string::npos);
  CHECK(v.fixes[0].find("19.6 times") != std::string::npos);
  // The checker agrees: the floor is crossed, and nothing but floors and falls.
  const CheckReport rep = check_plan(in, *plan);
  CHECK(rep.only_floors_and_falls());
  CHECK(rep.crossings[static_cast<std::size_t>(LimitId::AlkalinityFloor)] > 0);
  // Following the fix holds it (1000 mL/day in 100 doses of 10 mL).
  in.deliveries[0].max_per_day = 1000;
  in.deliveries[0].doses_per_day = 100;
  in.system.alkalinity_dkh = 8.0;
  auto fixed = make_plan(in);
  REQUIRE(fixed.ok());
  CHECK(fixed->verdict.holds);
  CHECK(check_plan(in, *fixed).ok());
}

TEST_CASE("plan verdict: limewater bounded by little evaporation, worked by hand") {
  // By hand: limewater at 20 C is 1.73 g/L Ca(OH)2 (the upper bound of published solubility,
  // additives::saturated_limewater); 1.5 L/day of evaporation carries 2.595 g / 74.092 g/mol =
  // 0.035024 mol: 70.05 meq alkalinity and 1,403.7 mg calcium a day. The system consumes
  // 100 meq/day of alkalinity: short, and no pump additive raises it, so the fix names one.
  PlanInput in = base(200);
  in.demand.alkalinity_meq_per_day = 100;
  in.demand.calcium_mg_per_day = 1000;
  in.evaporation_l_per_day = 1.5;
  auto lw = ad::limewater_additive(20.0);
  REQUIRE(lw.ok());
  Delivery d;
  d.additive = *lw;
  d.doses_per_day = 24;
  d.max_dose = 1000;
  in.deliveries.push_back(d);
  auto plan = make_plan(in);
  REQUIRE(plan.ok());
  const Verdict& v = plan->verdict;
  MESSAGE(v.headline);
  CHECK_FALSE(v.holds);
  REQUIRE(v.shortfalls.size() == 1);  // calcium: 1,403.7 mg/day delivered >= 1,000 consumed
  CHECK(v.shortfalls[0].deliverable_per_day == doctest::Approx(70.048).epsilon(1e-4));
  CHECK(v.shortfalls[0].consumed_per_day == 100.0);
  REQUIRE_FALSE(v.fixes.empty());
  CHECK(v.fixes[0].find("limewater is bounded by the 1.5 L/day") != std::string::npos);
  CHECK(check_plan(in, *plan).only_floors_and_falls());
}

TEST_CASE("plan mishaps: every dose tried; the missed and doubled dose worked by hand") {
  // By hand: 100 L at its 8.0 dKH target, demand 0.5 dKH/day = 0.5 x 0.356652 x 100 = 17.8326
  // meq/day, four doses a day of 100 g/L sodium carbonate (1.886999 meq/mL): each dose is
  // 17.8326 / 4 / 1.886999 = 2.3626 mL, emitted to 0.001 mL as 2.362 mL = 4.4571 meq =
  // 0.12497 dKH in 100 L. A missed dose leaves its day 0.12497 dKH lower; a doubled one
  // moves the water 2 x 0.12497 = 0.24994 dKH at once (below the 0.5 dKH single-dose limit)
  // and leaves the day 0.12497 dKH higher.
  PlanInput in = base(100);
  in.system.air_co2_ppm = 1000;  // a closed room: a doubled dose stays under the Omega limit of 5
  in.demand = demand_from_per_litre(0.5, 0, 0, 100);
  auto soda = ad::additive_from_stock({"soda ash 100 g/L", {{ad::CompoundId::SodiumCarbonate, 100.0}}, 25.0});
  REQUIRE(soda.ok());
  Delivery d;
  d.additive = *soda;
  d.doses_per_day = 4;
  d.max_dose = 20;
  in.deliveries.push_back(d);
  in.horizon_days = 3;
  auto plan = make_plan(in);
  REQUIRE(plan.ok());
  REQUIRE(plan->verdict.holds);
  REQUIRE(plan->doses.size() == 12);
  CHECK(plan->doses[0].amount == doctest::Approx(2.362).epsilon(1e-9));
  const double per_dose_dkh = 2.362 * 0.1 / 105.988 * 2 * 1000 / (0.356652 * 100);
  CHECK(per_dose_dkh == doctest::Approx(0.12497).epsilon(1e-4));
  const auto list = mishap_summary(in, *plan);
  REQUIRE(list.size() == 2);
  for (const auto& m : list) {
    MESSAGE(m.summary);
    CHECK(m.doses_tried == 12);
    CHECK(m.worst.within_limits);
    if (m.mishap == Mishap::Missed) CHECK(m.worst.alkalinity_dkh_change == doctest::Approx(-per_dose_dkh).epsilon(1e-3));
    if (m.mishap == Mishap::RanTwice) CHECK(m.worst.alkalinity_dkh_change == doctest::Approx(per_dose_dkh).epsilon(1e-3));
  }
  // The doubled dose's single step, from the checker's replay of that dose given twice.
  auto twice = what_if(in, *plan, 5, Mishap::RanTwice);
  REQUIRE(twice.ok());
  CHECK(twice->within_limits);
  CHECK(twice->day == plan->doses[5].day);
  CHECK(twice->minute == plan->doses[5].minute);
  // Tighten the single-dose limit below the doubled step (0.2 < 0.24994 dKH): now every
  // doubled dose crosses it, and the summary says so with where.
  auto tight = make_limits({{LimitId::AlkalinityStepPerDose, 0.2, false, ""}});
  REQUIRE(tight.ok());
  in.limits = *tight;
  auto plan2 = make_plan(in);
  REQUIRE(plan2.ok());
  const auto list2 = mishap_summary(in, *plan2);
  REQUIRE(list2.size() == 2);
  CHECK(list2[1].mishap == Mishap::RanTwice);
  CHECK(list2[1].doses_crossing == list2[1].doses_tried);
  // In words a keeper reads, not the plan file's key.
  CHECK(list2[1].summary.find("the largest change of alkalinity from one dose reached") != std::string::npos);
  CHECK(list2[1].summary.find("alkalinity_step_dkh_per_dose") == std::string::npos);
}

TEST_CASE("plan texts: a value's unit follows it, except where the description names it (pH) or there is none (Omega)") {
  CHECK(limit_spec(LimitId::AlkalinityFloor).unit_suffix() == " dKH");
  CHECK(limit_spec(LimitId::CalciumCeiling).unit_suffix() == " mg/L");
  CHECK(limit_spec(LimitId::PhFloor).unit_suffix().empty());  // "the lowest pH ... reached 7.65"
  CHECK(limit_spec(LimitId::PhAfterDose).unit_suffix().empty());
  CHECK(limit_spec(LimitId::OmegaAragoniteFloor).unit_suffix().empty());
}

TEST_CASE("plan verdict: water starting at its floor before the pump's first slot gets a dose by hand, worked by hand") {
  // 400 L consuming 0.5 dKH a day: 0.5 x 0.356652 x 400 = 71.3304 meq/day. The pump doses 12
  // times from 03:00 to 23:59, its first slot half a spacing in: 180 + 0.5 x 1260 / 12 = 03:52.
  // The water starts 0.03 dKH above the floor, so it is below it by 03:52, before any dose (the
  // trough before that dose). Until 03:52 the system consumes 71.3304 x 232 / 1440 = 11.4921 meq
  // = 0.080556 dKH; of 50 g/L soda ash (0.943503 meq/mL) that is 12.180 mL.
  PlanInput in = base(400);
  const double floor = in.limits.get(LimitId::AlkalinityFloor);
  in.system.alkalinity_dkh = floor + 0.03;
  in.targets.alkalinity_dkh = {floor + 0.5, floor + 0.2, floor + 0.9};
  in.demand.alkalinity_meq_per_day = 0.5 * 0.356652 * 400;
  Delivery d = soda_pump(120);
  d.first_hour = 3;
  in.deliveries.push_back(d);
  auto plan = make_plan(in);
  REQUIRE(plan.ok());
  const Verdict& v = plan->verdict;
  MESSAGE(v.headline);
  for (const auto& f : v.fixes) MESSAGE(f);
  CHECK_FALSE(v.holds);
  REQUIRE(v.first_limit.has_value());
  CHECK(*v.first_limit == LimitId::AlkalinityFloor);
  CHECK(v.first_day == 1);
  CHECK(v.first_minute == 232);
  REQUIRE_FALSE(plan->doses.empty());
  CHECK(plan->doses.front().minute == 232);
  REQUIRE_FALSE(v.reasons.empty());
  CHECK(v.reasons.front() == "the water starts close to the floor and the first alkalinity dose is at 03:52 on day 1");
  CHECK(v.headline.find("first alkalinity dose is at 03:52") != std::string::npos);
  // The plan's doses are even through the day (10 mL, 0.066 dKH, against 105 minutes' 0.036 dKH
  // of consumption): moved earlier, the dose would leave the water as planned from 03:52, under
  // the floor again by 05:37. On top of the plan's doses, the 12.18 mL lift the whole plan by
  // 0.081 dKH: every floor kept, and every rise and ceiling too.
  REQUIRE(v.start_dose.has_value());
  CHECK(v.start_dose->delivery == 0);
  CHECK(v.start_dose->amount == doctest::Approx(12.180).epsilon(1e-3));
  CHECK(v.start_dose->first_dose_minute == 232);
  CHECK(v.start_dose->on_top);
  CHECK(v.start_dose->keeps_limits);
  REQUIRE(v.fixes.size() == 1);  // not "more, smaller doses per day": no slot comes earlier
  CHECK(v.fixes.front() ==
        "at the plan's start (day 1, 00:00) give 12.2 mL of soda ash 50 g/L by hand (it lifts alkalinity by 0.081 dKH, "
        "enough to stay above the floors until 03:52), on top of the plan's doses; with it the plan keeps every limit");
  CHECK(plan_to_json(in, *plan).find("\"first_dose_minute\": 232") != std::string::npos);
  const auto given = doses_with_start_dose(*plan, *v.start_dose, in.horizon_days);
  REQUIRE(given.size() == plan->doses.size() + 1);
  CHECK(given[0].minute == 0);
  CHECK(given[0].amount == doctest::Approx(12.180).epsilon(1e-3));
  CHECK(given[1].amount == plan->doses[0].amount);
  CHECK(check_doses(in, given).violations.empty());

  // Moved earlier instead (the pump's first doses that much smaller): 12.18 mL at 00:00, the
  // 03:52 dose (10 mL) skipped, the next 2.18 mL smaller.
  StartDose moved = *v.start_dose;
  moved.on_top = false;
  const auto moved_doses = doses_with_start_dose(*plan, moved, 1);
  const auto day1 = std::count_if(plan->doses.begin(), plan->doses.end(), [](const DoseRecord& r) { return r.day == 1; });
  REQUIRE(moved_doses.size() == static_cast<std::size_t>(day1));  // one added, one dropped
  CHECK(moved_doses[1].minute == plan->doses[1].minute);
  CHECK(moved_doses[1].amount == doctest::Approx(plan->doses[1].amount - (moved.amount - plan->doses[0].amount)));

  // A pump short of the demand (60 mL/day, 0.4 dKH/day against 0.5): no dose at the start keeps
  // the floors for the week. The dose is moved earlier, and the fix says when the water still
  // falls below a floor; the shortfall's own fix follows it.
  in.deliveries[0].max_per_day = 60;
  auto short_plan = make_plan(in);
  REQUIRE(short_plan.ok());
  const Verdict& sv = short_plan->verdict;
  for (const auto& f : sv.fixes) MESSAGE(f);
  REQUIRE(sv.start_dose.has_value());
  CHECK_FALSE(sv.start_dose->on_top);
  CHECK_FALSE(sv.start_dose->keeps_limits);
  REQUIRE(sv.fixes.size() >= 2);
  CHECK(sv.fixes.front().find("and give 12.2 mL less from pump 1's doses from 03:52 on (that one, planned 5 mL, skipped)") !=
        std::string::npos);
  CHECK(sv.fixes.front().find("the water still falls below a floor on day") != std::string::npos);
  CHECK(sv.fixes[1].rfind("soda ash 50 g/L (pump 1): at least", 0) == 0);

  // With the pump free to dose from midnight the first slot comes before the crossing: no such fix.
  in.deliveries[0].max_per_day = 120;
  in.deliveries[0].first_hour = 0;
  auto early = make_plan(in);
  REQUIRE(early.ok());
  for (const auto& f : early->verdict.fixes) CHECK(f.find("by hand") == std::string::npos);
  CHECK_FALSE(early->verdict.start_dose.has_value());
}

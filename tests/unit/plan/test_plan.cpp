// Planner: limits table and overrides, a demo-like plan that reaches target and holds it,
// capping at pH/Omega/daily-rise limits, limewater bounded by evaporation, reservoirs, salinity
// drift, refusal of bad input, and what a missed or doubled dose does.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "tidewright/plan/plan.hpp"

using namespace tw::plan;
namespace ad = tw::additives;

namespace {

Delivery pump(ad::Additive a, int per_day, double max_dose) {
  Delivery d;
  d.additive = std::move(a);
  d.doses_per_day = per_day;
  d.max_dose = max_dose;
  return d;
}

PlanInput reef() {
  PlanInput in;
  in.system.name = "Living room reef";
  in.system.volume_l = 380;
  in.system.temperature_c = 25.5;
  in.system.alkalinity_dkh = 7.0;
  in.system.calcium_mg_l = 400;
  in.system.magnesium_mg_l = 1300;
  in.system.air_co2_ppm = 800;
  in.demand = demand_from_per_litre(0.6, 4.3, 1.0, 380.0);
  auto alk = ad::additive_from_stock({"alk stock", {{ad::CompoundId::SodiumCarbonate, 100.0}}, 25.0});
  auto ca = ad::additive_from_stock({"calcium stock", {{ad::CompoundId::CalciumChlorideDihydrate, 200.0}}, 25.0});
  REQUIRE(alk.ok());
  REQUIRE(ca.ok());
  in.deliveries.push_back(pump(*alk, 12, 20));
  in.deliveries.push_back(pump(*ca, 12, 20));
  in.deliveries.push_back(pump(ad::additive_from_compound(ad::CompoundId::MagnesiumChlorideHexahydrate), 1, 50));
  in.deliveries.back().manual = true;
  in.deliveries.back().device = "hand";
  in.horizon_days = 14;
  return in;
}

}  // namespace

TEST_CASE("plan: limit table shows defaults with sources; overrides are recorded") {
  const auto& specs = limit_specs();
  CHECK(limit_spec(LimitId::AlkalinityRisePerDay).default_value == 1.0);  // common practice
  CHECK(limit_spec(LimitId::OmegaAragoniteAfterDose).default_value == 5.0);  // Moras et al. 2022
  CHECK(std::string(limit_spec(LimitId::OmegaAragoniteAfterDose).source).find("Moras") != std::string::npos);
  CHECK(limit_spec(LimitId::PhAfterDose).default_value == 8.45);
  for (const auto& s : specs) {
    // Loosening past the hard bound is further than the default, on the limit's own side.
    if (s.side == LimitSide::Upper) CHECK(s.hard_bound >= s.default_value);
    else CHECK(s.hard_bound <= s.default_value);
  }
  // Tighten: accepted, nothing recorded.
  auto tight = make_limits({{LimitId::AlkalinityRisePerDay, 0.5, false, ""}});
  REQUIRE(tight.ok());
  CHECK(tight->get(LimitId::AlkalinityRisePerDay) == 0.5);
  CHECK(tight->record.empty());
  // Loosen within the ceiling: accepted and noted.
  auto loose = make_limits({{LimitId::AlkalinityRisePerDay, 1.2, false, ""}});
  REQUIRE(loose.ok());
  CHECK(loose->record.size() == 1);
  // Past the ceiling: refused without an override, recorded with one.
  auto past = make_limits({{LimitId::OmegaAragoniteAfterDose, 8.0, false, ""}});
  REQUIRE(!past.ok());
  CHECK(past.error().field == "limits.omega_aragonite_after_dose");
  CHECK(past.error().message.find("hard ceiling 7") != std::string::npos);
  auto over = make_limits({{LimitId::OmegaAragoniteAfterDose, 8.0, true, "lab trial"}});
  REQUIRE(over.ok());
  CHECK(over->record.front().find("OVERRIDE") != std::string::npos);
  CHECK(over->record.front().find("lab trial") != std::string::npos);
  CHECK(limit_from_key("ph_after_dose_total").ok());
  CHECK_FALSE(limit_from_key("ph").ok());
}

TEST_CASE("plan: a two-part plan ramps to target, holds it, and the checker agrees") {
  PlanInput in = reef();
  auto plan = make_plan(in);
  REQUIRE(plan.ok());
  CHECK(std::string(plan->ph_scale) == "total");
  REQUIRE(plan->target_day[0].has_value());
  REQUIRE(plan->target_day[1].has_value());
  // 7.0 -> band 7.5..8.5 at <= 0.9 dKH/day of ramp: in band on day 1 or 2.
  CHECK(*plan->target_day[0] <= 2);
  // Calcium 400 -> 410..450 at <= 18 mg/L/day of ramp.
  CHECK(*plan->target_day[1] <= 2);
  const auto& last = plan->days.back().end;
  CHECK(last.alkalinity_dkh == doctest::Approx(8.0).epsilon(0.03));
  CHECK(last.calcium_mg_l == doctest::Approx(430).epsilon(0.02));
  for (const auto& d : plan->days) CHECK(d.rise_alkalinity_dkh <= 1.0 + 1e-9);
  const CheckReport rep = check_plan(in, *plan);
  for (const auto& v : rep.violations) MESSAGE(v.message);
  for (const auto& o : rep.other) MESSAGE(o);
  CHECK(rep.ok());
  CHECK(plan->verdict.holds);
  // The checker recomputes the same states the planner reports.
  double worst = 0;
  for (std::size_t i = 0; i < plan->doses.size(); ++i) {
    worst = std::max(worst, std::abs(rep.after[i].ph_total - plan->doses[i].after.ph_total));
    worst = std::max(worst, std::abs(rep.after[i].omega_aragonite - plan->doses[i].after.omega_aragonite));
  }
  MESSAGE("worst planner/checker gap in pH or Omega: " << worst);
  CHECK(worst < 1e-8);
  // Salinity drift from Na and Cl is reported with a water change.
  CHECK(plan->salinity.per_day > 0);
  CHECK(plan->salinity.water_change_percent_per_week > 0);
}

TEST_CASE("plan: a strong hydroxide dose is capped by the pH-after-dose limit") {
  PlanInput in = reef();
  in.system.alkalinity_dkh = 6.0;
  in.deliveries.clear();
  auto naoh = ad::additive_from_stock({"lye", {{ad::CompoundId::SodiumHydroxide, 40.0}}, 25.0});
  REQUIRE(naoh.ok());
  in.deliveries.push_back(pump(*naoh, 1, 500));  // one big dose a day
  in.demand = {};
  auto limits = make_limits({{LimitId::PhAfterDose, 8.2, false, ""},  // tightened by the user
                             {LimitId::AlkalinityStepPerDose, 1.0, false, ""}});  // loosened to its hard bound
  REQUIRE(limits.ok());
  in.limits = *limits;
  auto plan = make_plan(in);
  REQUIRE(plan.ok());
  REQUIRE(!plan->doses.empty());
  CHECK(plan->doses.front().cap == std::string("ph_after_dose_total"));
  CHECK(plan->doses.front().after.ph_total <= 8.2 + 1e-9);
  CHECK(plan->doses.front().after.ph_total > 8.19);  // it is the binding limit, not an arbitrary cut
  CHECK(check_plan(in, *plan).ok());
  CHECK_FALSE(plan->cautions.empty());  // caustic cautions travel with the plan
  bool codes = false;
  for (const auto& c : plan->cautions) codes = codes || c.find("local codes") != std::string::npos;
  CHECK(codes);
}

TEST_CASE("plan: limewater is bounded by evaporation and a far target is reported, not forced") {
  PlanInput in = reef();
  in.system.alkalinity_dkh = 6.0;
  in.deliveries.clear();
  auto lw = ad::limewater_additive(25.5);
  REQUIRE(lw.ok());
  Delivery d = pump(*lw, 24, 1000);
  in.deliveries.push_back(d);
  in.evaporation_l_per_day = 2.0;
  auto plan = make_plan(in);
  REQUIRE(plan.ok());
  for (const auto& day : plan->days) CHECK(day.amount_per_delivery[0] <= 2000.0 + 1e-9);
  const CheckReport rep = check_plan(in, *plan);
  for (const auto& v : rep.violations) MESSAGE(v.message);
  for (const auto& o : rep.other) MESSAGE(o);
  MESSAGE(plan->verdict.headline);
  // Falling below the alkalinity floor is what the verdict explains, and the checker agrees.
  CHECK_FALSE(plan->verdict.holds);
  CHECK(rep.only_floors_and_falls());
  CHECK(rep.crossings[static_cast<std::size_t>(LimitId::AlkalinityFloor)] > 0);
  // 2 L/day limewater (~81 meq) cannot cover 136 meq/day of demand: the plan says why.
  bool said = false;
  for (const auto& f : plan->findings) said = said || f.find("below the band") != std::string::npos;
  CHECK(said);
}

TEST_CASE("plan: reservoirs run dry and the plan says when") {
  PlanInput in = reef();
  in.deliveries[0].reservoir = 500;  // mL of alkalinity stock
  auto plan = make_plan(in);
  REQUIRE(plan.ok());
  REQUIRE(!plan->reservoirs_empty.empty());
  CHECK(plan->reservoirs_empty.front().delivery == 0);
  const CheckReport rep = check_plan(in, *plan);
  for (const auto& v : rep.violations) MESSAGE(v.message);
  for (const auto& o : rep.other) MESSAGE(o);
  MESSAGE(plan->verdict.headline);
  CHECK_FALSE(plan->verdict.holds);
  CHECK(rep.only_floors_and_falls());
  CHECK(plan->verdict.headline.find("runs dry") != std::string::npos);
}

TEST_CASE("plan: bad input is refused naming the field and the range") {
  PlanInput in = reef();
  in.system.volume_l = -5;
  auto a = make_plan(in);
  REQUIRE(!a.ok());
  CHECK(a.error().field == "system.volume_l");
  CHECK(a.error().message.find("0.1 to 1e+07") != std::string::npos);
  in = reef();
  in.targets.alkalinity_dkh = {13.0, 12.5, 13.5};  // above the 12 dKH ceiling
  auto b = make_plan(in);
  REQUIRE(!b.ok());
  CHECK(b.error().field.rfind("targets.alkalinity_dkh", 0) == 0);
  in = reef();
  in.deliveries.push_back(pump(ad::additive_from_compound(ad::CompoundId::CarbonDioxide), 1, 1));
  auto c = make_plan(in);
  REQUIRE(!c.ok());
  CHECK(c.error().field == "additives[3].additive");  // the plan file's own name
}

TEST_CASE("plan: the worst missed and doubled dose over every dose of the plan") {
  PlanInput in = reef();
  auto plan = make_plan(in);
  REQUIRE(plan.ok());
  const auto list = mishap_summary(in, *plan);
  REQUIRE(list.size() == 2);  // worst missed, worst doubled
  for (const auto& w : list) {
    MESSAGE(w.summary);
    CHECK(w.doses_tried == plan->doses.size());  // every dose, not the first largest one
    if (w.mishap == Mishap::Missed) CHECK(w.worst.alkalinity_dkh_change <= 1e-9);
    if (w.mishap == Mishap::RanTwice) CHECK(w.worst.ph_total_after > 7.5);
    // No single dose is worse than the one reported.
    for (std::size_t i = 0; i < plan->doses.size(); i += 37) {
      auto one = what_if(in, *plan, i, w.mishap);
      REQUIRE(one.ok());
      CHECK(one->closest_margin >= w.worst.closest_margin - 1e-12);
    }
  }
  CHECK_FALSE(what_if(in, *plan, plan->doses.size(), Mishap::Missed).ok());
}

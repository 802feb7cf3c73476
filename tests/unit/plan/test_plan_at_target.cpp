// Issue 11: a plan for a tank already at its targets doses no more than the water uses. With
// no consumption it gives no dose at all; with a consumption it gives back what is used each
// day (the sum of the doses' rises over the plan equals consumption x days) and the water never
// rises more than one dose's worth over the target.
#include <cmath>

#include <doctest/doctest.h>

#include "tidewright/additives/additives.hpp"
#include "tidewright/plan/plan.hpp"

using namespace tw;

namespace {

plan::Delivery stock_pump(additives::CompoundId id, double g_per_l, const char* device) {
  additives::StockRecipe r;
  r.name = device;
  r.ingredients.push_back({id, g_per_l});
  auto a = additives::additive_from_stock(r);
  REQUIRE(a.ok());
  plan::Delivery d;
  d.additive = *a;
  d.device = device;
  d.doses_per_day = 6;
  d.max_dose = 100;
  return d;
}

plan::PlanInput at_target(double alk_dkh_per_day, double ca_mg_l_per_day) {
  plan::PlanInput in;
  in.system.volume_l = 380;
  in.system.air_co2_ppm = 800;
  in.system.alkalinity_dkh = in.targets.alkalinity_dkh.target;
  in.system.calcium_mg_l = in.targets.calcium_mg_l.target;
  in.system.magnesium_mg_l = in.targets.magnesium_mg_l.target;
  in.demand = plan::demand_from_per_litre(alk_dkh_per_day, ca_mg_l_per_day, 0, in.system.volume_l);
  in.deliveries.push_back(stock_pump(additives::CompoundId::SodiumCarbonate, 80, "pump 1"));
  in.deliveries.push_back(stock_pump(additives::CompoundId::CalciumChlorideDihydrate, 200, "pump 2"));
  in.horizon_days = 14;
  return in;
}

}  // namespace

TEST_CASE("plan: a tank already at its targets with no consumption gets no dose") {
  const plan::PlanInput in = at_target(0, 0);
  auto p = plan::make_plan(in);
  REQUIRE(p.ok());
  double total = 0;
  for (const auto& d : p->doses) total += d.amount;
  CHECK(total == 0.0);
  CHECK(p->days.back().end.alkalinity_dkh == doctest::Approx(in.system.alkalinity_dkh).epsilon(1e-6));
  CHECK(plan::check_plan(in, *p).ok());
}

TEST_CASE("plan: a tank already at its targets is dosed only its consumption") {
  for (double alk : {0.4, 0.8, 1.4}) {
    CAPTURE(alk);
    const double ca = alk * 7.147;  // calcification: 1 Ca : 2 alkalinity (Gazeau et al. 2015), mg/L per dKH
    const plan::PlanInput in = at_target(alk, ca);
    auto p = plan::make_plan(in);
    REQUIRE(p.ok());
    double alk_added = 0, ca_added = 0, highest = in.system.alkalinity_dkh;
    for (const auto& d : p->doses) {
      if (d.delivery == 0) alk_added += d.after.alkalinity_dkh - d.before.alkalinity_dkh;
      if (d.delivery == 1) ca_added += d.after.calcium_mg_l - d.before.calcium_mg_l;
      highest = std::max(highest, d.after.alkalinity_dkh);
    }
    const double days = in.horizon_days;
    MESSAGE("consumption " << alk << " dKH/day: added " << alk_added / days << " dKH/day, highest " << highest);
    CHECK(alk_added == doctest::Approx(alk * days).epsilon(0.03));
    CHECK(ca_added == doctest::Approx(ca * days).epsilon(0.03));
    // Never more than one dose's worth (a sixth of a day's consumption) over the target.
    CHECK(highest <= in.targets.alkalinity_dkh.target + alk / 6.0 + 1e-6);
    for (const auto& d : p->days) CHECK(std::fabs(d.end.alkalinity_dkh - in.targets.alkalinity_dkh.target) <= alk / 6.0 + 1e-6);
    CHECK(plan::check_plan(in, *p).ok());
  }
}

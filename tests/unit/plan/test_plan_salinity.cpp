// Salinity drift from dosing (issue 18): the weekly water change comes from the days that hold
// the levels, and the ramp's extra salinity is stated once, separately.
#include <doctest/doctest.h>

#include <string>
#include <vector>

#include "tidewright/plan/plan.hpp"
#include "tidewright/seawater/seawater.hpp"

using namespace tw::plan;
namespace ad = tw::additives;

TEST_CASE("plan: salinity drift splits the ramp from holding (hand-worked series)") {
  // Days 1-2 ramp (0.05 and 0.03 salinity units), days 3-5 hold at 0.01. Worked by hand:
  // holding 0.01/day -> 100 x 7 x 0.01 / 1.0 = 7.0 % a week; the ramp adds 0.08 - 2 x 0.01 =
  // 0.06 once; the average over five days, 0.11 / 5 = 0.022/day, would have asked 15.4 %.
  const SalinityDrift d = salinity_drift({0.05, 0.03, 0.01, 0.01, 0.01}, 2, 1.0);
  CHECK(d.holding_seen);
  CHECK(d.ramp_days == 2);
  CHECK(d.holding_per_day == doctest::Approx(0.01));
  CHECK(d.water_change_percent_per_week == doctest::Approx(7.0));
  CHECK(d.ramp_extra == doctest::Approx(0.06));
  CHECK(d.per_day == doctest::Approx(0.022));
  CHECK(d.over_horizon == doctest::Approx(0.11));
  // A tolerance of 0.5 doubles the change: 14 %.
  CHECK(salinity_drift({0.05, 0.03, 0.01, 0.01, 0.01}, 2, 0.5).water_change_percent_per_week == doctest::Approx(14.0));
  // Still ramping at the end: no holding day, the average is all there is, and the text says so.
  const SalinityDrift r = salinity_drift({0.05, 0.04, 0.03}, 3, 1.0);
  CHECK_FALSE(r.holding_seen);
  CHECK(r.holding_per_day == doctest::Approx(0.04));
  CHECK(salinity_drift_text(r, 3, 1.0).find("still ramping") != std::string::npos);
  // Salinity from ions: 1 mol NaCl (58.44 g) in 1000 kg of water is 0.05844 g/kg of reference
  // salinity, x 35 / 35.16504 = 0.058166 practical salinity units (Millero et al. 2008 ratio).
  ad::ChemicalChange nacl;
  nacl.sodium_mol = 1;
  nacl.chloride_mol = 1;
  CHECK(salinity_added(nacl, 1000.0) == doctest::Approx(0.058166).epsilon(1e-4));
}

TEST_CASE("plan: a reef plan's weekly water change is the holding dose's, worked from the demand") {
  // 380 L at S 35, 25.5 C; start 7.2 dKH / 405 / 1290 mg/L, targets 8 / 430 / 1340; demand
  // 81 meq/day alkalinity, 1630 mg/day calcium, 190 mg/day magnesium (the demo plan's numbers);
  // soda ash, CaCl2.2H2O and MgCl2.6H2O.
  PlanInput in;
  in.system.volume_l = 380;
  in.system.temperature_c = 25.5;
  in.system.alkalinity_dkh = 7.2;
  in.system.calcium_mg_l = 405;
  in.system.magnesium_mg_l = 1290;
  in.system.air_co2_ppm = 800;
  in.demand.alkalinity_meq_per_day = 81;
  in.demand.calcium_mg_per_day = 1630;
  in.demand.magnesium_mg_per_day = 190;
  auto alk = ad::additive_from_stock({"alk", {{ad::CompoundId::SodiumCarbonate, 100.0}}, 22.0});
  auto ca = ad::additive_from_stock({"ca", {{ad::CompoundId::CalciumChlorideDihydrate, 200.0}}, 22.0});
  REQUIRE(alk.ok());
  REQUIRE(ca.ok());
  for (auto* a : {&*alk, &*ca}) {
    Delivery d;
    d.additive = *a;
    d.doses_per_day = 12;
    d.max_dose = 15;
    in.deliveries.push_back(d);
  }
  Delivery mg;
  mg.additive = ad::additive_from_compound(ad::CompoundId::MagnesiumChlorideHexahydrate);
  mg.manual = true;
  mg.device = "hand";
  mg.doses_per_day = 1;
  mg.max_dose = 20;
  in.deliveries.push_back(mg);
  in.horizon_days = 14;
  auto plan = make_plan(in);
  REQUIRE(plan.ok());
  // Holding doses exactly the demand. Worked by hand: Na 81 mmol (1 Na per eq from Na2CO3) =
  // 1.8622 g; Cl 2 x 1630 / 40.078 = 81.341 mmol = 2.8835 g; Cl 2 x 190 / 24.305 = 15.635 mmol =
  // 0.5542 g; 5.2999 g a day in 380 L x rho kg (rho: EOS-80 at S 35, 25.5 C, about 1.0235),
  // x 35 / 35.16504 -> about 0.01356 a day -> 9.5 % a week at a tolerance of 1.
  const double rho = tw::seawater::density_kg_per_l(35.0, 25.5);
  const double hand = (81e-3 * 22.990 + 2 * 1.630 / 40.078 * 35.45 + 2 * 0.190 / 24.305 * 35.45) / (380 * rho) *
                      35.0 / 35.16504;
  MESSAGE("holding " << plan->salinity.holding_per_day << " a day (hand " << hand << "), "
                     << plan->salinity.water_change_percent_per_week << " % a week; the average over the horizon "
                     << plan->salinity.per_day << " would ask " << 100 * 7 * plan->salinity.per_day
                     << " %; ramp days " << plan->salinity.ramp_days << ", ramp extra " << plan->salinity.ramp_extra);
  CHECK(plan->salinity.holding_seen);
  CHECK(plan->salinity.holding_per_day == doctest::Approx(hand).epsilon(0.005));
  CHECK(plan->salinity.water_change_percent_per_week == doctest::Approx(100 * 7 * hand).epsilon(0.005));
  // The ramp (magnesium 1290 -> 1340 at 20 g a day by hand) lasts beyond the first days, and
  // what it adds is stated once: the whole horizon's salt less 14 - ramp days of holding.
  CHECK(plan->salinity.ramp_days > 1);
  CHECK(plan->salinity.ramp_days < 14);
  CHECK(plan->salinity.ramp_extra ==
        doctest::Approx(plan->salinity.over_horizon - 14 * plan->salinity.holding_per_day).epsilon(1e-9));
  CHECK(plan->salinity.per_day > plan->salinity.holding_per_day);
  bool said = false;
  for (const auto& f : plan->findings) said = said || f.find("the ramp (days 1-") != std::string::npos;
  CHECK(said);
}

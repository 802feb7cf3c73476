// The one table of accepted ranges: every check in the core refuses and accepts at the same
// bounds, with the range in its message.
#include <doctest/doctest.h>

#include "tidewright/additives/additives.hpp"
#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/plan/plan.hpp"

namespace rg = tw::ranges;
namespace tc = tw::carbonate;

TEST_CASE("ranges: check names the field and the range") {
  CHECK(rg::check("temperature_c", 40.0, rg::kTemperatureC).ok());
  const auto s = rg::check("temperature_c", 45.0, rg::kTemperatureC);
  REQUIRE_FALSE(s.ok());
  CHECK(s.error().field == "temperature_c");
  CHECK(s.error().message.find("-2 to 40 C") != std::string::npos);
}

TEST_CASE("ranges: the chemistry and the journal take the same water temperatures") {
  // 45 C: the app refused it, chem accepted it and printed an EOS-80 density outside its range.
  for (double t : {rg::kTemperatureC.lo, rg::kTemperatureC.hi, rg::kTemperatureC.hi + 5.0}) {
    tc::Conditions c;
    c.temperature_c = t;
    const bool carbonate_ok = tc::compute_constants(c).ok();
    tw::journal::System sys;
    sys.name = "tank";
    sys.volume_l = 100;
    sys.default_temperature_c = t;
    const bool journal_ok = tw::journal::validate_system(tw::journal::Journal{}, sys).ok();
    INFO("t = ", t);
    CHECK(carbonate_ok == journal_ok);
    CHECK(carbonate_ok == (t <= rg::kTemperatureC.hi));
  }
}

TEST_CASE("ranges: a measured level the journal accepts is one a plan starts from") {
  // A crashed tank (1 dKH, 150 mg/L calcium) is where a plan is needed most: the plan refused
  // anything below 2 dKH / 200 mg/L, although the journal logs such tests.
  namespace ad = tw::additives;
  for (double alk : {1.0, 7.0}) {
    tw::plan::PlanInput in;
    in.system.volume_l = 200;
    in.system.alkalinity_dkh = alk;
    in.system.calcium_mg_l = 150;
    in.system.magnesium_mg_l = 1300;
    auto soda = ad::additive_from_stock({"alk stock", {{ad::CompoundId::SodiumCarbonate, 100.0}}, 25.0});
    REQUIRE(soda.ok());
    tw::plan::Delivery d;
    d.additive = *soda;
    d.doses_per_day = 12;
    d.max_dose = 20;
    in.deliveries.push_back(d);
    const auto plan = tw::plan::make_plan(in);
    INFO("alkalinity ", alk, ": ", plan.ok() ? std::string() : plan.error().message);
    REQUIRE(plan.ok());
    // Well below the floors the plan says it cannot hold the water rather than refusing to plan.
    CHECK(plan->verdict.holds == false);
  }
}

TEST_CASE("ranges: stocks and mixes are bounded by the table, not by each calculator") {
  namespace ad = tw::additives;
  // The stock strength: the journal logs up to kStockGPerL, the stock calculator took 2000 g/L.
  const double over = rg::kStockGPerL.hi + 100.0;
  auto s = ad::stock_strength({"strong", {{ad::CompoundId::CalciumChlorideDihydrate, over}}, 25.0});
  REQUIRE_FALSE(s.ok());
  CHECK(s.error().field == "ingredients[0].grams_per_l");
  CHECK(s.error().message.find("0 to 1500 g/L") != std::string::npos);
  // The stock's temperature: the app's Mixes field went to 60 C, the calculator to 40 C.
  auto warm = ad::stock_strength({"warm", {{ad::CompoundId::SodiumBicarbonate, 50.0}}, rg::kStockTemperatureC.hi + 5});
  REQUIRE_FALSE(warm.ok());
  CHECK(warm.error().field == "temperature_c");
  // A rise per dose: at most the parameter's measurable range, in its own unit.
  ad::TargetEffect t;
  t.parameter = tw::Parameter::Alkalinity;
  t.rise = rg::kAlkalinityDkh.hi + 1.0;
  t.dose_ml = 100;
  t.tank_volume_l = 100;
  auto r = ad::recipe_for_effect(ad::CompoundId::SodiumCarbonate, t, 25.0);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "rise");
  CHECK(r.error().message.find("to 25 dKH") != std::string::npos);
  CHECK(rg::of_rise(tw::Parameter::Calcium).hi == rg::kCalciumMgL.hi);
  t.rise = 0.5;
  t.dose_ml = rg::kMixDoseMl.lo / 2;
  CHECK_FALSE(ad::recipe_for_effect(ad::CompoundId::SodiumCarbonate, t, 25.0).ok());
}

TEST_CASE("ranges: a plan's consumption and evaporation are bounded per litre of the system") {
  namespace ad = tw::additives;
  tw::plan::PlanInput in;
  in.system.volume_l = 200;
  auto soda = ad::additive_from_stock({"alk stock", {{ad::CompoundId::SodiumCarbonate, 100.0}}, 25.0});
  REQUIRE(soda.ok());
  tw::plan::Delivery d;
  d.additive = *soda;
  d.max_dose = 20;
  in.deliveries.push_back(d);
  in.demand.alkalinity_meq_per_day = rg::kAlkalinityDemandMeqPerLDay.hi * 200 * 1.01;
  auto p = tw::plan::make_plan(in);
  REQUIRE_FALSE(p.ok());
  CHECK(p.error().field == "demand.alkalinity_meq_per_day");
  CHECK(p.error().message.find("0 to 1000 meq/day") != std::string::npos);
  in.demand.alkalinity_meq_per_day = 10;
  in.evaporation_l_per_day = rg::kEvaporationFractionPerDay.hi * 200 + 1;
  p = tw::plan::make_plan(in);
  REQUIRE_FALSE(p.ok());
  CHECK(p.error().field == "evaporation_l_per_day");
  CHECK(p.error().message.find("0 to 40 L/day") != std::string::npos);
}

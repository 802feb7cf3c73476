// Property test: over 100,000 seeded random scenarios, every plan the planner emits passes the
// independent checker (plan_checker.cpp recomputes each dose with the carbonate engine); a
// scenario that cannot be planned is refused with a typed error, never planned unsafely.
#include <doctest/doctest.h>

#include <chrono>
#include <cstdint>
#include <random>

#include "tidewright/plan/plan.hpp"

using namespace tw::plan;
namespace ad = tw::additives;

namespace {

std::vector<ad::Additive> additive_pool() {
  std::vector<ad::Additive> pool;
  auto add = [&](tw::Result<ad::Additive> a) {
    REQUIRE(a.ok());
    pool.push_back(*a);
  };
  add(ad::additive_from_stock({"bicarbonate", {{ad::CompoundId::SodiumBicarbonate, 80.0}}, 25.0}));
  add(ad::additive_from_stock({"carbonate", {{ad::CompoundId::SodiumCarbonate, 150.0}}, 25.0}));
  add(ad::additive_from_stock({"lye", {{ad::CompoundId::SodiumHydroxide, 40.0}}, 25.0}));
  add(ad::limewater_additive(25.0));
  add(ad::additive_from_stock({"calcium", {{ad::CompoundId::CalciumChlorideDihydrate, 300.0}}, 25.0}));
  add(ad::additive_from_stock({"magnesium", {{ad::CompoundId::MagnesiumChlorideHexahydrate, 400.0}}, 25.0}));
  pool.push_back(ad::additive_from_compound(ad::CompoundId::CalciumHydroxide));
  pool.push_back(ad::additive_from_compound(ad::CompoundId::SodiumCarbonate));
  add(ad::additive_from_label({"label alk", ad::Parameter::Alkalinity, 1.0, 50.0, 0.2, 0.0, true}));
  return pool;
}

}  // namespace

TEST_CASE("plan: property - 100,000 random scenarios, no emitted dose breaks a limit") {
  const auto pool = additive_pool();
  std::mt19937_64 rng(20261201);
  auto uni = [&](double lo, double hi) { return std::uniform_real_distribution<double>(lo, hi)(rng); };
  auto pick = [&](int lo, int hi) { return std::uniform_int_distribution<int>(lo, hi)(rng); };
  const int kScenarios = 100000;
  int planned = 0, refused = 0, capped_plans = 0, failures = 0;
  std::size_t doses = 0;
  double worst_ph_margin = 1e9, worst_omega_margin = 1e9;
  const auto t0 = std::chrono::steady_clock::now();
  for (int n = 0; n < kScenarios; ++n) {
    PlanInput in;
    in.system.volume_l = uni(20, 5000);
    in.system.salinity = uni(28, 38);
    in.system.temperature_c = uni(18, 30);
    in.system.alkalinity_dkh = uni(4, 13);     // sometimes above the 12 dKH ceiling
    in.system.calcium_mg_l = uni(330, 520);
    in.system.magnesium_mg_l = uni(1100, 1550);
    if (pick(0, 1)) in.system.ph_total = uni(7.6, 8.5);
    in.system.air_co2_ppm = uni(400, 2000);
    in.targets.alkalinity_dkh = {uni(7, 11), 0, 0};
    in.targets.alkalinity_dkh.low = in.targets.alkalinity_dkh.target - 0.5;
    in.targets.alkalinity_dkh.high = in.targets.alkalinity_dkh.target + 0.5;
    if (n % 50 == 0) {  // a target above the 12 dKH ceiling: must be refused, not planned
      in.targets.alkalinity_dkh = {uni(12.6, 14), 0, 0};
      in.targets.alkalinity_dkh.low = in.targets.alkalinity_dkh.target - 0.5;
      in.targets.alkalinity_dkh.high = in.targets.alkalinity_dkh.target + 0.5;
    }
    in.targets.calcium_mg_l = {uni(400, 470), 0, 0};
    in.targets.calcium_mg_l.low = in.targets.calcium_mg_l.target - 20;
    in.targets.calcium_mg_l.high = in.targets.calcium_mg_l.target + 20;
    in.demand = demand_from_per_litre(uni(0, 2), uni(0, 15), uni(0, 3), in.system.volume_l);
    in.evaporation_l_per_day = uni(0, 0.03) * in.system.volume_l;
    in.horizon_days = pick(3, 7);
    in.gas_exchange_hours = pick(0, 3) == 0 ? 0.0 : uni(0.5, 12);
    if (pick(0, 2) == 0) {  // the user tightens some limits
      auto l = make_limits({{LimitId::PhAfterDose, uni(8.1, 8.45), false, ""},
                            {LimitId::OmegaAragoniteAfterDose, uni(3, 5), false, ""},
                            {LimitId::AlkalinityRisePerDay, uni(0.2, 1.0), false, ""}});
      REQUIRE(l.ok());
      in.limits = *l;
    }
    const int count = pick(1, 3);
    for (int i = 0; i < count; ++i) {
      Delivery d;
      d.additive = pool[static_cast<std::size_t>(pick(0, static_cast<int>(pool.size()) - 1))];
      d.doses_per_day = pick(1, 4);
      d.max_dose = uni(1, 500);
      d.min_dose = pick(0, 1) ? 0.0 : uni(0, d.max_dose / 4);
      d.max_per_day = pick(0, 1) ? 1e9 : uni(1, 1000);
      d.first_hour = pick(0, 12);
      d.last_hour = pick(d.first_hour, 23);
      d.reservoir = pick(0, 2) == 0 ? uni(10, 2000) : 0.0;
      in.deliveries.push_back(d);
    }
    auto plan = make_plan(in);
    if (!plan) {
      ++refused;
      CHECK_FALSE(plan.error().field.empty());
      continue;
    }
    ++planned;
    doses += plan->doses.size();
    bool capped = false;
    for (const auto& d : plan->doses) capped = capped || !d.cap.empty();
    capped_plans += capped ? 1 : 0;
    const CheckReport rep = check_plan(in, *plan);
    if (!rep.ok()) {
      ++failures;
      if (failures <= 3) {
        for (const auto& v : rep.violations) {
          MESSAGE("scenario " << n << ": " << v.message);
          if (v.dose < plan->doses.size()) {
            const auto& d = plan->doses[v.dose];
            MESSAGE("  planner saw pH " << d.after.ph_total << " Omega " << d.after.omega_aragonite << " alk "
                                        << d.after.alkalinity_dkh << "; checker pH " << rep.after[v.dose].ph_total
                                        << " Omega " << rep.after[v.dose].omega_aragonite << " alk "
                                        << rep.after[v.dose].alkalinity_dkh << " cap '" << d.cap << "' additive "
                                        << in.deliveries[d.delivery].additive.name << " amount " << d.amount);
          }
        }
        for (const auto& o : rep.other) MESSAGE("scenario " << n << ": " << o);
        for (std::size_t j = 0; j < plan->doses.size(); ++j) {
          const auto& d = plan->doses[j];
          if (std::abs(d.after.ph_total - rep.after[j].ph_total) > 1e-6) {
            MESSAGE("  first divergence at dose " << j << " day " << d.day << " minute " << d.minute << " del "
                                                  << d.delivery << " amount " << d.amount << " tau "
                                                  << in.gas_exchange_hours << " planner dic " << d.after.dic_umol_kg
                                                  << " checker dic " << rep.after[j].dic_umol_kg);
            if (j > 0) MESSAGE("  previous: day " << plan->doses[j-1].day << " minute " << plan->doses[j-1].minute << " dic " << plan->doses[j-1].after.dic_umol_kg << " vs " << rep.after[j-1].dic_umol_kg);
            break;
          }
        }
      }
    }
    if (!plan->doses.empty()) {
      worst_ph_margin = std::min(worst_ph_margin, in.limits.get(LimitId::PhAfterDose) - rep.max_ph_total);
      worst_omega_margin =
          std::min(worst_omega_margin, in.limits.get(LimitId::OmegaAragoniteAfterDose) - rep.max_omega_aragonite);
    }
  }
  const double secs = std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
  MESSAGE(kScenarios << " scenarios in " << secs << " s: " << planned << " planned (" << doses << " doses, "
                     << capped_plans << " with capped doses), " << refused << " refused, " << failures
                     << " failing the checker; smallest margin to the pH limit " << worst_ph_margin
                     << ", to the Omega limit " << worst_omega_margin);
  CHECK(failures == 0);
  CHECK(planned > kScenarios / 2);
  CHECK(refused >= kScenarios / 50);  // every scenario with a target past the ceiling
  CHECK(capped_plans > 0);  // the limits did bind somewhere
  CHECK(worst_ph_margin >= -1e-7);
  CHECK(worst_omega_margin >= -1e-7);
}

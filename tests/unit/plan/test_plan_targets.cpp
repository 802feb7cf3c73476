// Targets against the limits at the room's CO2 (plan_targets.cpp), checked by hand from the
// equilibrium formulas: at air equilibrium CO2* = K0 fCO2 (Weiss 1974), HCO3 = K1 CO2*/[H],
// CO3 = K2 HCO3/[H] (Lueker et al. 2000 constants), Omega = [Ca][CO3]/Ksp (Mucci 1983), and
// alkalinity = HCO3 + 2 CO3 + B(OH)4 + OH - H_free (the minor bases are below 0.1 % here).
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/common/units.hpp"
#include "tidewright/plan/plan.hpp"
#include "tidewright/seawater/seawater.hpp"

using namespace tw::plan;
namespace cb = tw::carbonate;

namespace {
PlanInput reef(double alk_target_dkh, double air_co2_ppm) {
  PlanInput in;
  in.system.volume_l = 400;
  in.system.salinity = 35;
  in.system.temperature_c = 25;
  in.system.alkalinity_dkh = 8.0;
  in.system.calcium_mg_l = 430;
  in.system.magnesium_mg_l = 1350;
  in.system.air_co2_ppm = air_co2_ppm;
  in.targets = {{alk_target_dkh, alk_target_dkh - 0.5, alk_target_dkh + 0.5}, {430, 410, 450}, {1350, 1300, 1400}};
  in.horizon_days = 7;
  auto soda = tw::additives::additive_from_stock({"soda ash 50 g/L", {{tw::additives::CompoundId::SodiumCarbonate, 50.0}}, 22.0});
  Delivery d;
  d.additive = soda.value();
  d.doses_per_day = 12;
  in.deliveries.push_back(d);
  return in;
}

cb::Constants constants_at_calcium(double ca_mg_l) {
  const double rho = tw::seawater::density_kg_per_l(35, 25);
  cb::Conditions c;
  c.salinity = 35;
  c.temperature_c = 25;
  c.calcium_umol_kg = ca_mg_l / 40.078 * 1000.0 / rho;
  return cb::compute_constants(c).value();
}

double omega_at_rest(double alk_dkh, double ppm) {
  const double rho = tw::seawater::density_kg_per_l(35, 25);
  auto st = cb::equilibrate_with_air(constants_at_calcium(430), alk_dkh * tw::units::kMeqPerLPerDKH * 1000.0 / rho, ppm);
  return st.value().omega_aragonite;
}
}  // namespace

TEST_CASE("plan targets: 11 dKH at 425 ppm (the issue's example) is flagged with the target that fits, worked by hand") {
  PlanInput in = reef(11.0, 425);
  auto conflicts = check_targets_at_air(in);
  REQUIRE(conflicts.ok());
  REQUIRE_FALSE(conflicts->empty());
  const TargetConflict& t = conflicts->front();
  MESSAGE(t.message);
  CHECK(t.limit == LimitId::OmegaAragoniteAfterDose);
  CHECK(t.allowed == 5.0);
  // The figure: air equilibrium alone gives saturation "about 8" at 11 dKH.
  CHECK(t.omega_aragonite > 7.0);
  CHECK(t.omega_aragonite < 9.0);

  // By hand from the reported pH: the carbonate ion of air-equilibrated water, then Omega and
  // the alkalinity it implies, with the constants at S 35, 25 C.
  const cb::Constants k = constants_at_calcium(430);
  const double h = std::pow(10.0, -t.ph_total);                                      // mol/kg, total scale
  const double fco2_atm = cb::air_pco2_uatm(k, 425) * k.fco2_per_pco2 * 1e-6;
  const double co2 = k.k0 * fco2_atm;
  const double hco3 = k.k1 * co2 / h;
  const double co3 = k.k2 * hco3 / h;
  const double omega = k.totals.calcium * co3 / k.ksp_aragonite;
  CHECK(omega == doctest::Approx(t.omega_aragonite).epsilon(1e-6));
  const double borate = k.totals.boron * k.kb / (k.kb + h);
  const double oh = k.kw / h;
  const double h_free = h / k.free_to_total;
  const double alk_dkh = (hco3 + 2 * co3 + borate + oh - h_free) * 1e3 *
                         tw::seawater::density_kg_per_l(35, 25) / tw::units::kMeqPerLPerDKH;
  CHECK(alk_dkh == doctest::Approx(11.0).epsilon(2e-3));

  // The calcium that would fit at 11 dKH: Omega is proportional to calcium, 430 x 5 / 7.86 =
  // 273 mg/L, below the calcium floor of 350, so none is offered.
  CHECK(430.0 * 5.0 / t.omega_aragonite < 350.0);
  CHECK_FALSE(t.calcium_fit_mg_l.has_value());
  // At 8.6 dKH it is offered: 430 x 5 / Omega, rounded down, inside 350..500 mg/L.
  auto near = check_targets_at_air(reef(8.6, 425));
  REQUIRE(near.ok());
  REQUIRE_FALSE(near->empty());
  MESSAGE(near->front().message);
  REQUIRE(near->front().calcium_fit_mg_l.has_value());
  CHECK(*near->front().calcium_fit_mg_l == std::floor(430.0 * 5.0 / near->front().omega_aragonite));
  // The highest alkalinity target that fits: on the 0.05 dKH grid, at or under the limit, and
  // the next grid step above it crosses.
  REQUIRE(t.alkalinity_fit_dkh.has_value());
  const double fit = *t.alkalinity_fit_dkh;
  CHECK(fit < 11.0);
  CHECK(std::fabs(fit / 0.05 - std::round(fit / 0.05)) < 1e-6);
  CHECK(omega_at_rest(fit, 425) <= 5.0);
  CHECK(omega_at_rest(fit + 0.05, 425) > 5.0);
  // The message carries the reason and the numbers in plain words.
  CHECK(t.message.find("every dose would be held back") != std::string::npos);
  CHECK(t.message.find("highest alkalinity target that fits") != std::string::npos);

  // make_plan carries it in the verdict (flagged; the verdict's own rules decide the exit).
  auto plan = make_plan(in);
  if (!plan) MESSAGE(plan.error().field << ": " << plan.error().message);
  REQUIRE(plan.ok());
  REQUIRE_FALSE(plan->verdict.target_conflicts.empty());
  CHECK(verdict_to_text(*plan).find("TARGET CONFLICT") != std::string::npos);
  CHECK(plan_to_json(in, *plan).find("\"target_conflicts\"") != std::string::npos);
}

TEST_CASE("plan targets: 8 dKH at 425 ppm fits; at 3000 ppm pH sits below its floor and the lowest target is named") {
  auto ok = check_targets_at_air(reef(8.0, 425));
  REQUIRE(ok.ok());
  CHECK(ok->empty());

  auto stuffy = check_targets_at_air(reef(8.0, 3000));
  REQUIRE(stuffy.ok());
  REQUIRE_FALSE(stuffy->empty());
  const TargetConflict& t = stuffy->front();
  MESSAGE(t.message);
  CHECK(t.limit == LimitId::PhFloor);
  CHECK(t.value < 7.7);
  CHECK(t.message.find("fresh air") != std::string::npos);
  // Saturation at rest is under its floor too; the calcium that would lift it (2 x 430 / Omega)
  // lies above the calcium ceiling of 500 mg/L, so none is offered.
  REQUIRE(stuffy->size() == 2);
  CHECK((*stuffy)[1].limit == LimitId::OmegaAragoniteFloor);
  CHECK(430.0 * 2.0 / (*stuffy)[1].omega_aragonite > 500.0);
  CHECK_FALSE((*stuffy)[1].calcium_fit_mg_l.has_value());
  // No alkalinity target up to the ceiling (12 dKH) brings resting pH to 7.7 at 3000 ppm.
  CHECK_FALSE(t.alkalinity_fit_dkh.has_value());
  CHECK(t.message.find("no alkalinity target between 6 and 12 dKH") != std::string::npos);
  // At 1200 ppm one does: its resting pH is at or above the floor and 0.05 dKH lower is not.
  auto office = check_targets_at_air(reef(7.0, 1200));
  REQUIRE(office.ok());
  REQUIRE_FALSE(office->empty());
  MESSAGE(office->front().message);
  REQUIRE(office->front().alkalinity_fit_dkh.has_value());
  {
    const TargetConflict& u = office->front();
    const double ppm = 1200;
    const double rho = tw::seawater::density_kg_per_l(35, 25);
    auto at = [&](double dkh) {
      return cb::equilibrate_with_air(constants_at_calcium(430), dkh * tw::units::kMeqPerLPerDKH * 1000.0 / rho, ppm)
          .value()
          .ph_total;
    };
    CHECK(u.limit == LimitId::PhFloor);
    CHECK(at(*u.alkalinity_fit_dkh) >= 7.7);
    CHECK(at(*u.alkalinity_fit_dkh - 0.05) < 7.7);
  }
}

// Hatchery buffering: dose chemistry against the facts.md 8 worked example, blend choice,
// refusals, and the gas-exchange model.
//
// The worked example in facts.md 8 is "computed here" (arithmetic from the Dickson et al. 2007
// constants and Mucci 1983), NOT a published hatchery figure; it is used as a cross-check.
#include <cmath>

#include <doctest/doctest.h>

#include "tidewright/hatchery/hatchery.hpp"

namespace hy = tw::hatchery;
namespace cb = tw::carbonate;

namespace {

// facts.md 8: intake S 32, 20 C, TA 2150 umol/kg, pCO2 800 uatm.
hy::Water worked_intake() {
  hy::Water w;
  w.salinity = 32.0;
  w.temperature_c = 20.0;
  w.measurements = {{cb::Quantity::Alkalinity, 2150.0}, {cb::Quantity::PCO2, 800.0}, cb::PhScale::Total};
  return w;
}

hy::Settings omega_settings(double omega, hy::Buffer buffer, double ceiling = 8.3) {
  hy::Settings s;
  s.target = {hy::TargetKind::OmegaAragonite, omega, cb::PhScale::Total};
  s.buffer = buffer;
  s.limits.ph_ceiling = ceiling;
  return s;
}

constexpr double kMolarMassNa2CO3 = 105.988;  // g/mol, facts.md 5 (IUPAC weights)

}  // namespace

TEST_CASE("hatchery: worked example intake state (facts.md 8, computed here)") {
  auto t = hy::plan_treatment(worked_intake(), omega_settings(1.0, hy::Buffer::SodiumCarbonate));
  REQUIRE(t.ok());
  // facts.md 8 [computed here]: pH_T 7.767, CO3 93.8 umol/kg, Omega ar 1.481.
  CHECK(std::fabs(t->intake.ph_total - 7.767) < 0.0015);
  CHECK(std::fabs(t->intake.co3_umol_kg - 93.8) < 0.3);
  CHECK(std::fabs(t->intake.omega_aragonite - 1.481) < 0.004);
  CHECK_FALSE(t->dose_needed);  // already above Omega ar 1.0
}

TEST_CASE("hatchery: sodium carbonate to Omega ar 2.0 and 3.0 (facts.md 8, computed here)") {
  auto t2 = hy::plan_treatment(worked_intake(), omega_settings(2.0, hy::Buffer::SodiumCarbonate));
  REQUIRE(t2.ok());
  // facts.md 8: dTA 104 umol/kg, 5.5 mg/kg Na2CO3, pH_T 7.891, pCO2 608.
  CHECK(std::fabs(t2->dose.alkalinity_umol_kg() - 104.0) < 1.5);
  CHECK(std::fabs(t2->dose.carbonate_umol_kg * kMolarMassNa2CO3 * 1e-3 - 5.5) < 0.08);
  CHECK(std::fabs(t2->after_mixing.ph_total - 7.891) < 0.002);
  CHECK(std::fabs(t2->after_mixing.pco2_uatm - 608.0) < 2.0);
  CHECK(std::fabs(t2->after_mixing.omega_aragonite - 2.0) < 1e-4);

  auto t3 = hy::plan_treatment(worked_intake(), omega_settings(3.0, hy::Buffer::SodiumCarbonate));
  REQUIRE(t3.ok());
  // facts.md 8: dTA 287 umol/kg, 15.2 mg/kg, pH_T 8.060, pCO2 420.
  CHECK(std::fabs(t3->dose.alkalinity_umol_kg() - 287.0) < 1.5);
  CHECK(std::fabs(t3->dose.carbonate_umol_kg * kMolarMassNa2CO3 * 1e-3 - 15.2) < 0.08);
  CHECK(std::fabs(t3->after_mixing.ph_total - 8.060) < 0.002);
  CHECK(std::fabs(t3->after_mixing.pco2_uatm - 420.0) < 2.0);
  // Mass balance: one DIC per two alkalinity equivalents.
  CHECK(t3->after_mixing.dic_umol_kg - t3->intake.dic_umol_kg ==
        doctest::Approx(t3->dose.alkalinity_umol_kg() / 2.0).epsilon(1e-9));
}

TEST_CASE("hatchery: hydroxide and bicarbonate to Omega ar 3.0 (facts.md 8, computed here)") {
  auto oh = hy::plan_treatment(worked_intake(), omega_settings(3.0, hy::Buffer::SodiumHydroxide));
  REQUIRE(oh.ok());
  // facts.md 8: NaOH needs dTA 150 (pH_T 8.09); no DIC added.
  CHECK(std::fabs(oh->dose.alkalinity_umol_kg() - 150.0) < 1.5);
  CHECK(std::fabs(oh->after_mixing.ph_total - 8.09) < 0.006);
  CHECK(oh->after_mixing.dic_umol_kg == doctest::Approx(oh->intake.dic_umol_kg).epsilon(1e-9));

  auto hco3 = hy::plan_treatment(worked_intake(), omega_settings(3.0, hy::Buffer::SodiumBicarbonate));
  REQUIRE(hco3.ok());
  // facts.md 8: NaHCO3 alone needs about 3850 umol/kg and lowers pH.
  CHECK(std::fabs(hco3->dose.alkalinity_umol_kg() - 3850.0) < 60.0);
  CHECK(hco3->after_mixing.ph_total < hco3->intake.ph_total);
  // Rule (facts.md 8): carbonate raises Omega far more per equivalent than bicarbonate.
  CHECK(hco3->dose.alkalinity_umol_kg() > 10.0 * 287.0);
}

TEST_CASE("hatchery: pH target and alkalinity-rise target") {
  hy::Settings s = omega_settings(2.0, hy::Buffer::SodiumCarbonate);
  s.target = {hy::TargetKind::PH, 8.0, cb::PhScale::Total};
  auto t = hy::plan_treatment(worked_intake(), s);
  REQUIRE(t.ok());
  CHECK(std::fabs(t->after_mixing.ph_total - 8.0) < 1e-5);
  // pH 8.0 lies between 7.891 (dTA 104) and 8.060 (dTA 287), facts.md 8.
  CHECK(t->dose.alkalinity_umol_kg() > 104.0);
  CHECK(t->dose.alkalinity_umol_kg() < 287.0);

  s.target = {hy::TargetKind::AlkalinityRise, 287.0, cb::PhScale::Total};
  auto r = hy::plan_treatment(worked_intake(), s);
  REQUIRE(r.ok());
  CHECK(r->after_mixing.alkalinity_umol_kg - r->intake.alkalinity_umol_kg == doctest::Approx(287.0));
  CHECK(std::fabs(r->after_mixing.omega_aragonite - 3.0) < 0.02);  // facts.md 8 again

  // Bicarbonate cannot raise this intake's pH: refused, naming the target option.
  s.buffer = hy::Buffer::SodiumBicarbonate;
  s.target = {hy::TargetKind::PH, 8.0, cb::PhScale::Total};
  auto no = hy::plan_treatment(worked_intake(), s);
  REQUIRE_FALSE(no.ok());
  CHECK(no.error().field == "target_ph");
}

TEST_CASE("hatchery: refusal when the pH ceiling is too low for the target") {
  // Carbonate to Omega ar 3.0 needs pH_T 8.060 (facts.md 8): a ceiling of 8.00 refuses.
  auto t = hy::plan_treatment(worked_intake(), omega_settings(3.0, hy::Buffer::SodiumCarbonate, 8.0));
  REQUIRE_FALSE(t.ok());
  CHECK(t.error().field == "ph_ceiling");
  CHECK(t.error().message.find("ceiling") != std::string::npos);
  CHECK(t.error().message.find("blend") != std::string::npos);
  // A pH target above the ceiling is refused outright.
  hy::Settings s = omega_settings(3.0, hy::Buffer::SodiumCarbonate, 8.0);
  s.target = {hy::TargetKind::PH, 8.1, cb::PhScale::Total};
  auto p = hy::plan_treatment(worked_intake(), s);
  REQUIRE_FALSE(p.ok());
  CHECK(p.error().field == "ph_ceiling");
  // Even the blend refuses a ceiling below the intake pH (7.767).
  auto b = hy::plan_treatment(worked_intake(), omega_settings(3.0, hy::Buffer::Blend, 7.0));
  REQUIRE_FALSE(b.ok());
  CHECK(b.error().field == "ph_ceiling");
}

TEST_CASE("hatchery: blend keeps the pH at the ceiling with the largest carbonate share") {
  const double ceiling = 8.0;
  auto b = hy::plan_treatment(worked_intake(), omega_settings(3.0, hy::Buffer::Blend, ceiling));
  REQUIRE(b.ok());
  CHECK(std::fabs(b->after_mixing.omega_aragonite - 3.0) < 1e-4);
  CHECK(b->after_mixing.ph_total <= ceiling + 1e-6);
  CHECK(b->after_mixing.ph_total > ceiling - 1e-3);  // uses the room under the ceiling
  CHECK(b->carbonate_share > 0.0);
  CHECK(b->carbonate_share < 1.0);
  CHECK(b->dose.carbonate_umol_kg > 0.0);
  CHECK(b->dose.bicarbonate_umol_kg > 0.0);
  // Optimality: a little more carbonate share breaks the ceiling.
  const double a = b->dose.alkalinity_umol_kg();
  const double f = b->carbonate_share + 0.02;
  hy::DoseMix more{f * a / 2.0, (1.0 - f) * a, 0.0};
  hy::Settings s = omega_settings(3.0, hy::Buffer::Blend, ceiling);
  auto check = hy::apply_dose(worked_intake(), more, s);
  REQUIRE(check.ok());
  CHECK(check->after_mixing.ph_total > ceiling);
  // With room under the ceiling the blend is carbonate alone (smallest dose).
  auto wide = hy::plan_treatment(worked_intake(), omega_settings(3.0, hy::Buffer::Blend, 8.3));
  REQUIRE(wide.ok());
  CHECK(wide->carbonate_share == doctest::Approx(1.0));
  CHECK(std::fabs(wide->dose.alkalinity_umol_kg() - 287.0) < 1.5);
}

TEST_CASE("hatchery: gas exchange keeps alkalinity and moves DIC toward air") {
  hy::GasExchange g;
  g.residence_time_min = 30.0;
  g.exchange_time_constant_min = 30.0;
  CHECK(hy::degassing_fraction(g).value() == doctest::Approx(1.0 - std::exp(-1.0)));
  g.fraction = 0.25;
  CHECK(hy::degassing_fraction(g).value() == doctest::Approx(0.25));
  g.fraction = 1.5;
  REQUIRE_FALSE(hy::degassing_fraction(g).ok());
  CHECK(hy::degassing_fraction(g).error().field == "degas_fraction");

  hy::Settings s = omega_settings(2.0, hy::Buffer::SodiumCarbonate);
  s.gas.fraction = 1.0;
  s.gas.air_co2_ppm = 424.6;
  auto t = hy::plan_treatment(worked_intake(), s);
  REQUIRE(t.ok());
  CHECK(t->at_tanks.alkalinity_umol_kg == doctest::Approx(t->after_mixing.alkalinity_umol_kg));
  // Full equilibrium: pCO2 = xCO2 (1 atm - water vapour), about 2 % below 424.6 at 20 C (facts.md 10).
  CHECK(t->at_tanks.pco2_uatm < 424.6);
  CHECK(t->at_tanks.pco2_uatm > 410.0);
  // The intake is supersaturated in CO2 (800 uatm): losing it raises pH and Omega.
  CHECK(t->at_tanks.ph_total > t->after_mixing.ph_total);
  CHECK(t->at_tanks.omega_aragonite > t->after_mixing.omega_aragonite);

  // Full degassing alone lifts this intake above Omega ar 2 at the tanks: no dose needed there.
  s.target_point = hy::TargetPoint::AtTanks;
  auto full = hy::plan_treatment(worked_intake(), s);
  REQUIRE(full.ok());
  CHECK_FALSE(full->dose_needed);
  CHECK(full->at_tanks.omega_aragonite > 2.0);
  // Partial degassing: the target at the tanks needs less carbonate than after mixing.
  s.gas.fraction = 0.2;
  s.target = {hy::TargetKind::OmegaAragonite, 3.0, cb::PhScale::Total};
  auto at = hy::plan_treatment(worked_intake(), s);
  REQUIRE(at.ok());
  CHECK(at->dose_needed);
  CHECK(std::fabs(at->at_tanks.omega_aragonite - 3.0) < 1e-4);
  CHECK(at->at_tanks.ph_total > at->after_mixing.ph_total);
  CHECK(at->dose.alkalinity_umol_kg() < 287.0);  // 287 after mixing, facts.md 8
}

TEST_CASE("hatchery: settings out of range are refused naming the field") {
  hy::Settings s = omega_settings(20.0, hy::Buffer::SodiumCarbonate);
  auto t = hy::plan_treatment(worked_intake(), s);
  REQUIRE_FALSE(t.ok());
  CHECK(t.error().field == "target_omega");
  CHECK(t.error().message.find("0.5") != std::string::npos);
  s = omega_settings(2.0, hy::Buffer::SodiumCarbonate, 10.0);
  REQUIRE_FALSE(hy::plan_treatment(worked_intake(), s).ok());
  CHECK(hy::plan_treatment(worked_intake(), s).error().field == "ph_ceiling");
  CHECK(hy::buffer_from_string("soda").error().field == "additive");
  CHECK(hy::buffer_from_string("NaHCO3").value() == hy::Buffer::SodiumBicarbonate);
}

// Where calcium comes from (calcium_source.cpp), with check values worked by hand.
#include <doctest/doctest.h>

#include <string>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/hatchery/hatchery.hpp"

namespace cb = tw::carbonate;
namespace hy = tw::hatchery;

TEST_CASE("carbonate: calcium from salinity says so, and at low salinity how far it can be off (hand-worked)") {
  // By hand: Ca_sw(35) = 0.02128/40.078 x 35/1.80655 mol/kg = 10.287 mmol/kg = 412.3 mg/kg
  // (Riley & Tongudai 1967); at S 5 the scaled value is 5/35 of it, 58.90 mg/kg, and water
  // mixed from seawater and fresh water with 13.4 mg/kg calcium holds 6/7 x 13.4 = 11.49 mg/kg
  // more: 19.5 % of the scaled value; with 50 mg/kg, 42.86 mg/kg more: 72.8 %.
  CHECK(cb::calcium_scaling_missed_share(5, 13.4) == doctest::Approx(0.1950).epsilon(2e-3));
  CHECK(cb::calcium_scaling_missed_share(5, 50) == doctest::Approx(0.7277).epsilon(2e-3));
  CHECK(cb::calcium_scaling_missed_share(35, 50) == doctest::Approx(0.0));

  cb::Conditions c;
  c.salinity = 5;
  c.temperature_c = 20;
  c.k1k2 = cb::K1K2Option::Millero2010;
  const cb::CalciumSource low = cb::calcium_source(c);
  CHECK_FALSE(low.measured);
  CHECK(low.low_salinity);
  CHECK(low.calcium_umol_kg == doctest::Approx(10287.0 * 5 / 35).epsilon(1e-3));
  CHECK(low.note.find("from salinity") != std::string::npos);
  CHECK(low.note.find("20 % higher") != std::string::npos);
  CHECK(low.note.find("73 % higher") != std::string::npos);
  // The note is a warning of the constants at low salinity, and Constants carries it.
  auto k = cb::compute_constants(c);
  REQUIRE(k.ok());
  CHECK(k->calcium.note == low.note);
  bool warned = false;
  for (const auto& w : k->warnings) warned |= w == low.note;
  CHECK(warned);

  c.salinity = 35;
  const cb::CalciumSource sea = cb::calcium_source(c);
  CHECK_FALSE(sea.low_salinity);
  CHECK(sea.note.find("% higher") == std::string::npos);
  c.calcium_umol_kg = 2000;
  const cb::CalciumSource measured = cb::calcium_source(c);
  CHECK(measured.measured);
  CHECK(measured.note.find("as measured") != std::string::npos);
}

TEST_CASE("hatchery: measured calcium of a brackish intake sets its saturation and the dose (Omega proportional to Ca)") {
  // An estuarine intake at S 8 whose calcium is twice the salinity-scaled value: the intake's
  // Omega doubles (Omega = [Ca][CO3]/Ksp, [CO3] unchanged), and the dose to Omega 1 shrinks.
  hy::Water w;
  w.salinity = 8;
  w.temperature_c = 20;
  w.k1k2 = cb::K1K2Option::Millero2010;
  w.measurements = {{cb::Quantity::Alkalinity, 1200.0}, {cb::Quantity::PH, 7.6}, cb::PhScale::Total};
  hy::Settings s;
  s.target.value = 1.0;
  s.limits.ph_ceiling = 9.0;
  auto scaled = hy::plan_treatment(w, s);
  if (!scaled) MESSAGE(scaled.error().field << ": " << scaled.error().message);
  REQUIRE(scaled.ok());
  CHECK(scaled->calcium_source.find("from salinity") != std::string::npos);
  w.calcium_umol_kg = 2.0 * cb::calcium_source({8, 20}).calcium_umol_kg;
  auto measured = hy::plan_treatment(w, s);
  REQUIRE(measured.ok());
  CHECK(measured->calcium_source.find("as measured") != std::string::npos);
  CHECK(measured->intake.omega_aragonite == doctest::Approx(2.0 * scaled->intake.omega_aragonite).epsilon(1e-9));
  CHECK(measured->dose.alkalinity_umol_kg() < scaled->dose.alkalinity_umol_kg());
  MESSAGE("dose scaled Ca " << scaled->dose.alkalinity_umol_kg() << " umol/kg, measured 2x Ca "
                            << measured->dose.alkalinity_umol_kg() << " umol/kg");
}

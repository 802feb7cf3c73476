// The default conventions against values published with the reference packages, and the size
// of the change from the 2007 Guide's forms (issue 16). The grid comparison with an
// independent re-implementation of CO2SYS.m v3.1.1 is tests/reference/check_co2sys.py.
#include <cmath>
#include <string>

#include <doctest/doctest.h>

#include "tidewright/carbonate/carbonate.hpp"

namespace tc = tw::carbonate;

namespace {

tc::Constants constants_at(double salinity, double temperature_c, tc::ConstantsConvention conv,
                           tc::FluorideOption fluoride = tc::FluorideOption::PerezFraga1987,
                           double phosphate = 0, double silicate = 0) {
  tc::Conditions c;
  c.salinity = salinity;
  c.temperature_c = temperature_c;
  c.convention = conv;
  c.fluoride = fluoride;
  c.phosphate_umol_kg = phosphate;
  c.silicate_umol_kg = silicate;
  auto k = tc::compute_constants(c);
  REQUIRE(k.ok());
  return *k;
}

tc::CarbonateState solve_ok(const tc::Constants& k, tc::Measurement a, tc::Measurement b,
                            tc::PhScale scale = tc::PhScale::Total) {
  auto r = tc::solve(k, tc::InputPair{a, b, scale});
  const std::string why = r.ok() ? std::string("ok") : r.error().message;
  INFO(why);
  REQUIRE(r.ok());
  return *r;
}

void near(const char* what, double computed, double expected, double tolerance, const char* source) {
  INFO(std::string(what), ": computed ", computed, ", expected ", expected, " +/- ", tolerance,
       " (", std::string(source), "); abs error ", std::fabs(computed - expected));
  CHECK(std::fabs(computed - expected) <= tolerance);
}

using Q = tc::Quantity;
constexpr auto kReference = tc::ConstantsConvention::ReferencePackages;
constexpr auto kGuide = tc::ConstantsConvention::Guide2007;

}  // namespace

TEST_CASE("conventions: W1, the PyCO2SYS tutorial, under the packages' own conventions") {
  // PyCO2SYS-examples, welcome-to-PyCO2SYS.ipynb (facts.md 3 W1): pH_T 8.05, DIC 2050, S 35,
  // 25 C, Si 8.2, P 0.3 (and NH3 0.1, H2S 0.2 umol/kg, not modelled here: about +0.1 to +0.2
  // umol/kg of TA), Lueker K1 K2, Dickson KSO4, Uppstrom boron; PyCO2SYS's default HF
  // constant is Dickson & Riley (opt_k_HF 1). Published: TA 2358.7; at 10 C and 5 dbar with
  // the same TA and DIC, pCO2 214.8 uatm, Omega aragonite 3.2398.
  const char* src = "PyCO2SYS tutorial notebook output, facts.md 3 W1";
  const auto k25 = constants_at(35, 25, kReference, tc::FluorideOption::DicksonRiley1979, 0.3, 8.2);
  const auto s = solve_ok(k25, {Q::PH, 8.05}, {Q::DIC, 2050});
  // Published TA less what NH3 and H2S add there (0.1 to 0.2 umol/kg): 2358.5 to 2358.6,
  // with the notebook's rounding (0.05).
  near("TA without NH3, H2S", s.alkalinity_umol_kg, 2358.55, 0.1, src);
  // The notebook carries the same TA (its own, with NH3 and H2S; ours without them) and DIC
  // to 10 C: the carbonate part of the alkalinity is the same.
  const auto k10 = constants_at(35, 10, kReference, tc::FluorideOption::DicksonRiley1979, 0.3, 8.2);
  const auto c = solve_ok(k10, {Q::Alkalinity, s.alkalinity_umol_kg}, {Q::DIC, 2050});
  near("pCO2 at 10 C", c.pco2_uatm, 214.8, 0.1, src);
  // Omega: the 5 dbar pressure term on Ksp and CO2SYS's 40.087 for Ca (facts.md 1) explain
  // the 0.004 left.
  near("Omega aragonite at 10 C", c.omega_aragonite, 3.2398, 0.006, src);
}

TEST_CASE("conventions: what the Guide's forms change, in the size issue 16 measured") {
  // pH on the seawater and NBS scales: 0.0008 to 0.004 lower with Perez & Fraga read as total
  // (facts.md 1, "the reading moves pH_SWS/pH_NBS by 0.0008-0.004"), over S 20-40, 10-32 C.
  double least = 1, most = 0;
  for (double sal : {20.0, 30.0, 40.0})
    for (double t : {10.0, 20.0, 32.0}) {
      const auto r = constants_at(sal, t, kReference);
      const auto g = constants_at(sal, t, kGuide);
      const double d = r.ph_sws_minus_total - g.ph_sws_minus_total;
      least = std::min(least, d);
      most = std::max(most, d);
      CHECK(r.ph_nbs_minus_total - g.ph_nbs_minus_total == doctest::Approx(d).epsilon(1e-12));
    }
  INFO("pH_SWS(reference) - pH_SWS(Guide) from ", least, " to ", most);
  CHECK(least >= 0.0007);
  CHECK(most <= 0.0045);
  // From alkalinity and DIC at a warm, high-pH point: KW (and the nutrient constants) move
  // pH_T by a few 1e-4 (issue 16: up to 0.00035 and 0.4 uatm).
  const auto r = constants_at(35, 32, kReference, tc::FluorideOption::PerezFraga1987, 3, 60);
  const auto g = constants_at(35, 32, kGuide, tc::FluorideOption::PerezFraga1987, 3, 60);
  const auto sr = solve_ok(r, {Q::Alkalinity, 3500}, {Q::DIC, 2400});
  const auto sg = solve_ok(g, {Q::Alkalinity, 3500}, {Q::DIC, 2400});
  INFO("pH_T ", sr.ph_total, " vs ", sg.ph_total, "; pCO2 ", sr.pco2_uatm, " vs ", sg.pco2_uatm);
  CHECK(sr.ph_total - sg.ph_total > 5e-5);
  CHECK(sr.ph_total - sg.ph_total < 5e-4);
  // Both conventions agree exactly where neither KF's reading nor KW matters: pH_T + DIC.
  const auto pr = solve_ok(r, {Q::PH, 8.1}, {Q::DIC, 2000});
  const auto pg = solve_ok(g, {Q::PH, 8.1}, {Q::DIC, 2000});
  CHECK(pr.co3_umol_kg == pg.co3_umol_kg);
  CHECK(pr.pco2_uatm == pg.pco2_uatm);
}

// Typed errors for impossible or out-of-range inputs: each names the offending field.
#include <cmath>
#include <string>

#include <doctest/doctest.h>

#include "tidewright/carbonate/carbonate.hpp"

namespace tc = tw::carbonate;
using Q = tc::Quantity;

namespace {

tc::Constants seawater() {
  auto k = tc::compute_constants(tc::Conditions{});
  REQUIRE(k.ok());
  return *k;
}

// Solves and expects an error on `field`; returns its message.
std::string expect_error(const tc::Constants& k, tc::InputPair in, const std::string& field,
                         const tc::SolverOptions& o = {}) {
  const auto r = tc::solve(k, in, o);
  INFO(std::string(tc::to_string(in.first.quantity)), " ", in.first.value, " + ",
       std::string(tc::to_string(in.second.quantity)), " ", in.second.value);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == field);
  if (field != "inputs" && field != "solver")  // message names the field
    CHECK(r.error().message.find(field) != std::string::npos);
  return r.error().message;
}

}  // namespace

TEST_CASE("carbonate: out-of-range inputs name the field and the accepted range") {
  const auto k = seawater();
  CHECK(expect_error(k, {{Q::Alkalinity, -5}, {Q::DIC, 2000}}, "alkalinity_umol_kg")
            .find("0 to 30000") != std::string::npos);
  expect_error(k, {{Q::Alkalinity, 2300}, {Q::DIC, 0}}, "dic_umol_kg");
  expect_error(k, {{Q::Alkalinity, 2300}, {Q::DIC, NAN}}, "dic_umol_kg");
  CHECK(expect_error(k, {{Q::Alkalinity, 2300}, {Q::PH, 13}}, "ph").find("2 to 12") !=
        std::string::npos);
  expect_error(k, {{Q::Alkalinity, 2300}, {Q::PCO2, -400}}, "pco2_uatm");
  expect_error(k, {{Q::Alkalinity, 2300}, {Q::FCO2, INFINITY}}, "fco2_uatm");
  expect_error(k, {{Q::DIC, 2000}, {Q::Carbonate, 0}}, "co3_umol_kg");
  const auto r = tc::solve_alkalinity_dic(k, 2300, -1);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "dic_umol_kg");
}

TEST_CASE("carbonate: pairs with no solution are refused, never NaN") {
  const auto k = seawater();
  // Alkalinity far above what the DIC can carry below pH 12 (2 DIC + borate + OH- bound; at
  // 0 C, KW is small enough that OH- at pH 12 is about 5000 umol/kg).
  tc::Conditions cold;
  cold.temperature_c = 0.0;
  const auto k0 = tc::compute_constants(cold);
  REQUIRE(k0.ok());
  const std::string high = expect_error(*k0, {{Q::Alkalinity, 30000}, {Q::DIC, 100}},
                                        "alkalinity_umol_kg");
  CHECK(high.find("above 12") != std::string::npos);
  // pH 8 with alkalinity below borate + OH- (about 100 umol/kg at S 35): negative DIC.
  CHECK(expect_error(k, {{Q::Alkalinity, 50}, {Q::PH, 8}}, "alkalinity_umol_kg")
            .find("no positive DIC") != std::string::npos);
  // More dissolved CO2 than DIC.
  expect_error(k, {{Q::DIC, 2000}, {Q::PCO2, 200000}}, "pco2_uatm");
  // Carbonate ion above DIC.
  expect_error(k, {{Q::DIC, 200}, {Q::Carbonate, 300}}, "co3_umol_kg");
  // Alkalinity below the least the carbonate ion alone implies (2 CO3 + ...).
  expect_error(k, {{Q::Alkalinity, 100}, {Q::Carbonate, 200}}, "alkalinity_umol_kg");
  // pCO2 and fCO2 are not independent; the same quantity twice says nothing.
  expect_error(k, {{Q::PCO2, 400}, {Q::FCO2, 399}}, "inputs");
  expect_error(k, {{Q::DIC, 2000}, {Q::DIC, 2100}}, "inputs");
  // A pair that implies an absurd pH: the state would be outside pH 2 to 12.
  expect_error(k, {{Q::PCO2, 1e-4}, {Q::Carbonate, 9000}}, "co3_umol_kg");
  // An iteration cap too small to converge is reported, not returned as an answer.
  tc::SolverOptions tight;
  tight.max_iterations = 1;
  const auto r = tc::solve(k, {{Q::Alkalinity, 2300}, {Q::DIC, 2000}}, tight);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "solver");
}

TEST_CASE("carbonate: pH + pCO2 always has a state over pH 6-8.5 and pCO2 100-1000") {
  for (double s : {5.0, 35.0, 42.0})
    for (double t : {0.0, 25.0, 40.0}) {
      tc::Conditions c;
      c.salinity = s;
      c.temperature_c = t;
      const auto k = tc::compute_constants(c);
      REQUIRE(k.ok());
      for (double ph = 6.0; ph <= 8.5; ph += 0.25)
        for (double pco2 : {100.0, 400.0, 700.0, 1000.0}) {
          const auto r = tc::solve(*k, {{Q::PH, ph}, {Q::PCO2, pco2}});
          INFO("S ", s, " T ", t, " pH ", ph, " pCO2 ", pco2);
          REQUIRE(r.ok());
          CHECK(r->pco2_uatm == doctest::Approx(pco2).epsilon(1e-12));
        }
    }
}

// Measured total boron in place of the salinity-scaled value (issue 18, salt mixes).
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/carbonate/carbonate_batch.hpp"

namespace cb = tw::carbonate;

namespace {
cb::Constants constants_of(const cb::Conditions& c) {
  auto k = cb::compute_constants(c);
  REQUIRE(k.ok());
  return *k;
}
}  // namespace

TEST_CASE("boron: absent, the salinity ratio as before; given, it replaces the ratio and says so") {
  cb::Conditions c;  // S 35, 25 C, Uppstrom (1974)
  const cb::BoronSource scaled = cb::boron_source(c);
  CHECK_FALSE(scaled.measured);
  CHECK(scaled.boron_umol_kg == doctest::Approx(415.7).epsilon(2e-4));  // facts.md 1 (PyCO2SYS U74: 415.76)
  CHECK(scaled.note.find("from salinity") != std::string::npos);
  CHECK(scaled.note.find("Uppstrom 1974") != std::string::npos);
  CHECK(constants_of(c).totals.boron * 1e6 == doctest::Approx(scaled.boron_umol_kg).epsilon(1e-12));

  c.total_boron_umol_kg = 800.0;
  const cb::BoronSource measured = cb::boron_source(c);
  CHECK(measured.measured);
  CHECK(measured.boron_umol_kg == 800.0);
  CHECK(measured.scaled_umol_kg == doctest::Approx(415.7).epsilon(2e-4));
  // 800 umol/kg x 10.81 g/mol = 8.65 mg/kg of boron
  CHECK(measured.note.find("as measured, 800 umol/kg (8.65 mg/kg), in place of 416 umol/kg") != std::string::npos);
  const cb::Constants k = constants_of(c);
  CHECK(k.totals.boron * 1e6 == doctest::Approx(800.0).epsilon(1e-12));
  CHECK(k.boron.note == measured.note);
  // Only boron moves: the other totals and every constant stay.
  const cb::Constants plain = constants_of(cb::Conditions{});
  CHECK(k.totals.sulfate == plain.totals.sulfate);
  CHECK(k.kb == plain.kb);
  CHECK(k.k1 == plain.k1);
}

TEST_CASE("boron: a measured value equal to the scaled one gives identical results") {
  cb::Conditions c;
  const cb::Constants plain = constants_of(c);
  c.total_boron_umol_kg = plain.totals.boron * 1e6;
  const cb::Constants same = constants_of(c);
  auto a = cb::solve_alkalinity_dic(plain, 2300, 2000);
  auto b = cb::solve_alkalinity_dic(same, 2300, 2000);
  REQUIRE(a.ok());
  REQUIRE(b.ok());
  CHECK(a->ph_total == doctest::Approx(8.0457).epsilon(2e-5));  // facts.md 3, W3
  CHECK(std::fabs(a->ph_total - b->ph_total) < 1e-12);
  CHECK(std::fabs(a->pco2_uatm - b->pco2_uatm) < 1e-9);
  CHECK(std::fabs(a->omega_aragonite - b->omega_aragonite) < 1e-12);
}

TEST_CASE("boron: doubled boron shifts alkalinity by exactly the borate term (hand-worked)") {
  // Hand-worked at S 35, 25 C (W3 of facts.md 3): DIC 2000 umol/kg and pH_T 8.0457, so
  // [H+]_T = 10^-8.0457 = 9.000e-9 mol/kg; KB = exp(-19.7964) = 2.526e-9 (Dickson 1990, the
  // Guide's check value). Borate is BT KB/(KB + [H+]) = BT x 2.526/(2.526 + 9.000) = 0.2192 BT.
  // At a fixed pH and DIC every other term of the alkalinity stays, so doubling BT from 415.7
  // to 831.4 umol/kg raises the alkalinity by 415.7 x 0.2192 = 91.1 umol/kg. Conversely at a
  // fixed alkalinity and DIC the extra borate takes alkalinity from carbonate: pH falls and
  // pCO2 rises.
  cb::Conditions c;
  const cb::Constants plain = constants_of(c);
  c.total_boron_umol_kg = 2.0 * plain.totals.boron * 1e6;
  const cb::Constants doubled = constants_of(c);

  const cb::InputPair pair{{cb::Quantity::DIC, 2000}, {cb::Quantity::PH, 8.0457}, cb::PhScale::Total};
  auto a = cb::solve(plain, pair);
  auto b = cb::solve(doubled, pair);
  REQUIRE(a.ok());
  REQUIRE(b.ok());
  const double h = std::pow(10.0, -8.0457);
  const double borate_share = plain.kb / (plain.kb + h);
  CHECK(borate_share == doctest::Approx(0.2192).epsilon(1e-3));
  const double predicted = plain.totals.boron * 1e6 * borate_share;
  CHECK(predicted == doctest::Approx(91.1).epsilon(2e-3));
  CHECK(b->alkalinity_umol_kg - a->alkalinity_umol_kg == doctest::Approx(predicted).epsilon(1e-9));
  CHECK(b->borate_umol_kg == doctest::Approx(2.0 * a->borate_umol_kg).epsilon(1e-12));

  auto at_ta = cb::solve_alkalinity_dic(doubled, 2300, 2000);
  REQUIRE(at_ta.ok());
  CHECK(at_ta->ph_total < 8.0457 - 0.01);
  CHECK(at_ta->pco2_uatm > 397.1 + 10);
  // ... and the state it gives holds the alkalinity it was solved for.
  auto back = cb::solve(doubled, {{cb::Quantity::DIC, 2000}, {cb::Quantity::PH, at_ta->ph_total}, cb::PhScale::Total});
  REQUIRE(back.ok());
  CHECK(back->alkalinity_umol_kg == doctest::Approx(2300).epsilon(1e-9));
}

TEST_CASE("boron: refused outside the range table's span, naming the field and the range") {
  cb::Conditions c;
  c.total_boron_umol_kg = 2500.0;
  auto k = cb::compute_constants(c);
  REQUIRE_FALSE(k.ok());
  CHECK(k.error().field == "total_boron_umol_kg");
  CHECK(k.error().message.find("0 to 2000 umol/kg") != std::string::npos);
  c.total_boron_umol_kg = -1.0;
  CHECK_FALSE(cb::compute_constants(c).ok());
}

TEST_CASE("boron: the batch reads a total_boron_umol_kg column; an empty cell scales from salinity") {
  const std::string csv =
      "id,alkalinity_umol_kg,dic_umol_kg,total_boron_umol_kg\n"
      "scaled,2300,2000,\n"
      "doubled,2300,2000,831.4\n";
  auto out = cb::solve_csv_batch(csv);
  REQUIRE(out.ok());
  CHECK(out->failed == 0);
  CHECK(out->csv.find("scaled,8.045") != std::string::npos);
  CHECK(out->csv.find("doubled,8.045") == std::string::npos);
  CHECK(out->rows == 2);
}

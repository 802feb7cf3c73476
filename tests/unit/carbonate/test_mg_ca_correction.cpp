// The Mg/Ca correction of the constants (Hain et al. 2015, the MyAMI model's polynomial;
// carbonate_formulas.hpp 6, myami_polynomial.cpp), off by default.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "tidewright/carbonate/carbonate.hpp"

namespace cb = tw::carbonate;

namespace {
cb::Conditions reef_water() {
  cb::Conditions c;  // S 35, 25 C
  c.magnesium_umol_kg = 30000.0;  // 0.03 mol/kg: a salt mix low in magnesium
  c.calcium_umol_kg = 12000.0;    // 0.012 mol/kg
  return c;
}
}  // namespace

TEST_CASE("Mg/Ca correction: off by default, even with magnesium given") {
  cb::Conditions c = reef_water();
  auto with_mg = cb::compute_constants(c);
  c.magnesium_umol_kg.reset();
  auto without = cb::compute_constants(c);
  REQUIRE(with_mg.ok());
  REQUIRE(without.ok());
  CHECK_FALSE(with_mg->mg_ca_correction);
  CHECK(with_mg->k1 == without->k1);
  CHECK(with_mg->k2 == without->k2);
  CHECK(with_mg->ksp_aragonite == without->ksp_aragonite);
  CHECK(with_mg->warnings == without->warnings);
}

TEST_CASE("Mg/Ca correction: applied, each constant times its factor relative to modern seawater, and said") {
  cb::Conditions c = reef_water();
  auto plain = cb::compute_constants(c);
  c.mg_ca_correction = true;
  auto k = cb::compute_constants(c);
  REQUIRE(plain.ok());
  REQUIRE(k.ok());
  REQUIRE(k->mg_ca_correction);
  // At S 35 the normalisation to salinity 35 leaves the values as they are.
  CHECK(k->mg_ca_correction->magnesium_mol_kg_s35 == doctest::Approx(0.03));
  CHECK(k->mg_ca_correction->calcium_mol_kg_s35 == doctest::Approx(0.012));
  const cb::MyamiFactors water = cb::myami_factors_polynomial_hain2015(25, 35, 0.03, 0.012);
  const cb::MyamiFactors modern = cb::myami_factors_polynomial_hain2015(25, 35, cb::kMyamiModernMagnesiumMolKg,
                                                                        cb::kMyamiModernCalciumMolKg);
  CHECK(k->k1 / plain->k1 == doctest::Approx(water.k1 / modern.k1).epsilon(1e-12));
  CHECK(k->k2 / plain->k2 == doctest::Approx(water.k2 / modern.k2).epsilon(1e-12));
  CHECK(k->kb / plain->kb == doctest::Approx(water.kb / modern.kb).epsilon(1e-12));
  CHECK(k->k0 / plain->k0 == doctest::Approx(water.k0 / modern.k0).epsilon(1e-12));
  CHECK(k->ks_free / plain->ks_free == doctest::Approx(water.ks / modern.ks).epsilon(1e-12));
  CHECK(k->ksp_calcite / plain->ksp_calcite == doctest::Approx(water.ksp / modern.ksp).epsilon(1e-12));
  CHECK(k->ksp_aragonite / plain->ksp_aragonite == doctest::Approx(water.ksp / modern.ksp).epsilon(1e-12));
  // KW follows the total-scale factor, which the corrected KS moves slightly.
  CHECK(k->kw / plain->kw == doctest::Approx(water.kw / modern.kw).epsilon(2e-3));
  // Magnesium-poor water: K2 and the solubility products fall (factor 0.79 at 35 C above).
  CHECK(water.k2 / modern.k2 < 0.9);
  CHECK(water.ksp / modern.ksp < 0.9);
  // The note says it was applied, by what and where it holds; it is among the warnings.
  const std::string& note = k->mg_ca_correction->note;
  CHECK(note.find("Mg/Ca correction of the constants applied") != std::string::npos);
  CHECK(note.find("Hain et al. 2015") != std::string::npos);
  CHECK(note.find("salinity 30 to 40, 0 to 40 C, Mg and Ca up to 60 mmol/kg") != std::string::npos);
  bool warned = false;
  for (const auto& w : k->warnings) warned |= w == note;
  CHECK(warned);
  // And the states it gives move with it.
  auto a = cb::solve_alkalinity_dic(*plain, 2300, 2000);
  auto b = cb::solve_alkalinity_dic(*k, 2300, 2000);
  REQUIRE(a.ok());
  REQUIRE(b.ok());
  CHECK(std::fabs(a->omega_aragonite - b->omega_aragonite) > 0.01);
}

TEST_CASE("Mg/Ca correction: natural seawater's Mg and Ca give exactly the uncorrected constants") {
  cb::Conditions c;
  c.salinity = 33;
  c.temperature_c = 27;
  // modern seawater at S 35 scaled to S 33, as measured in that water
  c.magnesium_umol_kg = cb::kMyamiModernMagnesiumMolKg * 1e6 * 33 / 35;
  c.calcium_umol_kg = cb::kMyamiModernCalciumMolKg * 1e6 * 33 / 35;
  auto plain = cb::compute_constants(c);
  c.mg_ca_correction = true;
  auto k = cb::compute_constants(c);
  REQUIRE(plain.ok());
  REQUIRE(k.ok());
  CHECK(k->k1 / plain->k1 == doctest::Approx(1.0).epsilon(1e-12));
  CHECK(k->k2 / plain->k2 == doctest::Approx(1.0).epsilon(1e-12));
  CHECK(k->kw / plain->kw == doctest::Approx(1.0).epsilon(1e-12));
  CHECK(k->ksp_aragonite / plain->ksp_aragonite == doctest::Approx(1.0).epsilon(1e-12));
}

TEST_CASE("Mg/Ca correction: refused without measured Mg and Ca, or outside the polynomial's range") {
  cb::Conditions c = reef_water();
  c.mg_ca_correction = true;
  c.magnesium_umol_kg.reset();
  auto k = cb::compute_constants(c);
  REQUIRE_FALSE(k.ok());
  CHECK(k.error().field == "mg_ca_correction");
  CHECK(k.error().message.find("magnesium and calcium") != std::string::npos);

  c = reef_water();
  c.mg_ca_correction = true;
  c.salinity = 25;  // below the polynomial's 30 (c.calcium stays in range)
  k = cb::compute_constants(c);
  REQUIRE_FALSE(k.ok());
  CHECK(k.error().field == "mg_ca_correction");
  CHECK(k.error().message.find("salinity 30 to 40 and 0 to 40 C") != std::string::npos);

  c = reef_water();
  c.mg_ca_correction = true;
  c.magnesium_umol_kg = 70000.0;  // 70 mmol/kg at S 35, above the 60 the polynomial was fitted to
  k = cb::compute_constants(c);
  REQUIRE_FALSE(k.ok());
  CHECK(k.error().message.find("up to 60 mmol/kg") != std::string::npos);

  c = reef_water();
  c.magnesium_umol_kg = 150000.0;  // outside the range table's span, whether corrected or not
  k = cb::compute_constants(c);
  REQUIRE_FALSE(k.ok());
  CHECK(k.error().field == "magnesium_umol_kg");
}

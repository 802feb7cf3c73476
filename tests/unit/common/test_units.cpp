// Unit conversions at the edges of the core (core/include/tidewright/units.hpp).
// Sources beside each check: facts.md 5 (German degree, IUPAC molar masses), facts.md 4
// (seawater density at 25 C), exact definitions (US gallon, Fahrenheit).
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "tidewright/seawater/seawater.hpp"
#include "tidewright/common/units.hpp"

namespace u = tw::units;

TEST_CASE("units: dKH, meq/L and mg/L as CaCO3 per litre") {
  // 1 dKH = 0.35665 meq/L = 17.848 mg/L as CaCO3 [computed here with IUPAC weights, facts.md 5;
  // the degree itself is 10 mg CaO/L, published: ChemLin "Deutscher Haertegrad"].
  CHECK(std::fabs(u::kMeqPerLPerDKH - 0.35665) < 5e-6);
  // Any density works for per-litre to per-litre conversions; use 1.0233 kg/L.
  const double rho = 1.0233;
  const double umol_per_dkh = u::alkalinity_to_umol_kg(1.0, u::AlkalinityUnit::DKH, rho);
  CHECK(std::fabs(u::alkalinity_from_umol_kg(umol_per_dkh, u::AlkalinityUnit::MeqPerL, rho) -
                  0.35665) < 5e-6);
  CHECK(std::fabs(u::alkalinity_from_umol_kg(umol_per_dkh, u::AlkalinityUnit::MgPerLCaCO3, rho) -
                  17.848) < 5e-4);
  // Conversely 1 meq/L = 2.804 dKH = 50.04 mg/L CaCO3 [computed here, facts.md 5].
  const double umol_per_meq = u::alkalinity_to_umol_kg(1.0, u::AlkalinityUnit::MeqPerL, rho);
  CHECK(std::fabs(u::alkalinity_from_umol_kg(umol_per_meq, u::AlkalinityUnit::DKH, rho) - 2.804) <
        5e-4);
  CHECK(std::fabs(u::alkalinity_from_umol_kg(umol_per_meq, u::AlkalinityUnit::MgPerLCaCO3, rho) -
                  50.04) < 5e-3);
}

TEST_CASE("units: alkalinity per kg <-> per litre uses the seawater density") {
  // TA 2300 umol/kg ~ 6.60 dKH at rho 1.0233 kg/L [computed here, facts.md 5].
  const double dkh = u::alkalinity_from_umol_kg(2300, u::AlkalinityUnit::DKH, 1.0233);
  CHECK(std::fabs(dkh - 6.60) < 0.005);
  // 1 meq/L at rho 1.0233 is 1000/1.0233 umol/kg (definition: per litre / (kg per litre)).
  CHECK(u::alkalinity_to_umol_kg(1.0, u::AlkalinityUnit::MeqPerL, 1.0233) ==
        doctest::Approx(1000.0 / 1.0233));
  // The density itself from EOS-80 at S 35, 25 C: 1023.341 kg/m3 [computed here, facts.md 4].
  const double rho = tw::seawater::density_kg_per_l(35, 25);
  CHECK(std::fabs(rho - 1.023341) < 3e-6);
  CHECK(std::fabs(u::alkalinity_from_umol_kg(2300, u::AlkalinityUnit::DKH, rho) - 6.60) < 0.005);
  // umol/kg is the engine's unit: identity.
  CHECK(u::alkalinity_to_umol_kg(2300, u::AlkalinityUnit::UmolPerKg, rho) == 2300);
}

TEST_CASE("units: alkalinity round trips through every unit") {
  const u::AlkalinityUnit all[] = {u::AlkalinityUnit::UmolPerKg, u::AlkalinityUnit::MeqPerL,
                                   u::AlkalinityUnit::DKH, u::AlkalinityUnit::MgPerLCaCO3};
  for (auto unit : all) {
    for (double v : {0.0, 0.5, 7.0, 120.0, 2400.0}) {
      CAPTURE(u::to_string(unit));
      CAPTURE(v);
      const double umol = u::alkalinity_to_umol_kg(v, unit, 1.0245);
      CHECK(u::alkalinity_from_umol_kg(umol, unit, 1.0245) == doctest::Approx(v));
    }
  }
}

TEST_CASE("units: calcium and magnesium mg/L <-> mmol/kg") {
  // Ca 412.1 mg/kg = 10.2821 mmol/kg, Mg 1283.7 mg/kg = 52.8171 mmol/kg at S 35
  // [published molar amounts: Millero et al. 2008 via facts.md 9; mg/kg computed there].
  // mg/L = mg/kg x rho(kg/L), so at rho 1.0233 kg/L:
  const double rho = 1.0233;
  const double ca_mg_l = 412.1 * rho;
  const double ca_umol =
      u::ion_to_umol_kg(ca_mg_l, u::ConcentrationUnit::MgPerL, u::Ion::Calcium, rho);
  CHECK(std::fabs(ca_umol / 1000.0 - 10.2821) < 2e-3);
  CHECK(std::fabs(u::ion_from_umol_kg(ca_umol, u::ConcentrationUnit::MmolPerKg, u::Ion::Calcium,
                                      rho) -
                  10.2821) < 2e-3);
  const double mg_umol = u::ion_to_umol_kg(1283.7 * rho, u::ConcentrationUnit::MgPerL,
                                           u::Ion::Magnesium, rho);
  CHECK(std::fabs(mg_umol / 1000.0 - 52.8171) < 5e-3);
  // 1 mmol/kg Ca = 40.078 mg/kg [IUPAC atomic weight, facts.md 5] = 40.078 x rho mg/L.
  CHECK(u::ion_from_umol_kg(1000, u::ConcentrationUnit::MgPerL, u::Ion::Calcium, rho) ==
        doctest::Approx(40.078 * rho));
  CHECK(u::ion_from_umol_kg(1000, u::ConcentrationUnit::MgPerL, u::Ion::Magnesium, rho) ==
        doctest::Approx(24.305 * rho));
  for (auto unit : {u::ConcentrationUnit::MgPerL, u::ConcentrationUnit::MmolPerKg,
                    u::ConcentrationUnit::UmolPerKg}) {
    for (auto ion : {u::Ion::Calcium, u::Ion::Magnesium}) {
      const double x = u::ion_to_umol_kg(420, unit, ion, rho);
      CHECK(u::ion_from_umol_kg(x, unit, ion, rho) == doctest::Approx(420));
    }
  }
}

TEST_CASE("units: temperature C <-> F and volume L <-> US gal") {
  // Definitions: 0 C = 32 F, 100 C = 212 F, -40 is the same on both; 1 US gal = 231 in^3
  // = 3.785411784 L exactly.
  CHECK(u::celsius_to_fahrenheit(0) == doctest::Approx(32));
  CHECK(u::celsius_to_fahrenheit(100) == doctest::Approx(212));
  CHECK(u::fahrenheit_to_celsius(-40) == doctest::Approx(-40));
  CHECK(u::fahrenheit_to_celsius(77) == doctest::Approx(25));
  CHECK(u::fahrenheit_to_celsius(u::celsius_to_fahrenheit(26.5)) == doctest::Approx(26.5));
  CHECK(u::us_gallons_to_litres(1) == doctest::Approx(3.785411784));
  CHECK(u::litres_to_us_gallons(378.5411784) == doctest::Approx(100));
  CHECK(u::volume_to_litres(10, u::VolumeUnit::UsGallon) == doctest::Approx(37.85411784));
  CHECK(u::volume_to_litres(10, u::VolumeUnit::Litre) == 10);
  CHECK(u::volume_from_litres(37.85411784, u::VolumeUnit::UsGallon) == doctest::Approx(10));
}

TEST_CASE("units: unit strings parse, print and round trip") {
  for (auto unit : {u::AlkalinityUnit::UmolPerKg, u::AlkalinityUnit::MeqPerL,
                    u::AlkalinityUnit::DKH, u::AlkalinityUnit::MgPerLCaCO3}) {
    auto parsed = u::alkalinity_unit_from_string(u::to_string(unit));
    REQUIRE(parsed.ok());
    CHECK(*parsed == unit);
  }
  CHECK(*u::alkalinity_unit_from_string("DKH") == u::AlkalinityUnit::DKH);
  CHECK(*u::alkalinity_unit_from_string("MEQ/L") == u::AlkalinityUnit::MeqPerL);
  for (auto unit : {u::ConcentrationUnit::MgPerL, u::ConcentrationUnit::MmolPerKg,
                    u::ConcentrationUnit::UmolPerKg}) {
    auto parsed = u::concentration_unit_from_string(u::to_string(unit));
    REQUIRE(parsed.ok());
    CHECK(*parsed == unit);
  }
  for (auto unit : {u::VolumeUnit::Litre, u::VolumeUnit::UsGallon}) {
    auto parsed = u::volume_unit_from_string(u::to_string(unit));
    REQUIRE(parsed.ok());
    CHECK(*parsed == unit);
  }
  CHECK(*u::volume_unit_from_string("Gallons") == u::VolumeUnit::UsGallon);
}

TEST_CASE("units: unknown unit strings are refused with the accepted list") {
  auto a = u::alkalinity_unit_from_string("dGH");
  REQUIRE_FALSE(a.ok());
  CHECK(a.error().field == "alkalinity unit");
  CHECK(a.error().message.find("dKH") != std::string::npos);
  CHECK(a.error().message.find("'dGH'") != std::string::npos);
  auto c = u::concentration_unit_from_string("g/L");
  REQUIRE_FALSE(c.ok());
  CHECK(c.error().field == "concentration unit");
  CHECK(c.error().message.find("mmol/kg") != std::string::npos);
  auto v = u::volume_unit_from_string("imp gal");
  REQUIRE_FALSE(v.ok());
  CHECK(v.error().field == "volume unit");
  CHECK(v.error().message.find("US") != std::string::npos);
  CHECK_FALSE(u::alkalinity_unit_from_string("").ok());
  CHECK_FALSE(u::volume_unit_from_string(" L").ok());
}

// One sample in every salinity form, and its CSV batch (salinity_convert.hpp).
// Round robin: every input form of the same water gives the same salinity and outputs.
#include <doctest/doctest.h>

#include <cmath>
#include <string>

#include "tidewright/seawater/salinity_convert.hpp"
#include "tidewright/seawater/seawater.hpp"

namespace sw = tw::seawater;

TEST_CASE("seawater: describe_salinity round robin over every input form") {
  sw::SalinitySample base;
  base.input = sw::SalinityInput::Salinity;
  base.value = 34.2;
  base.sample_temperature_c = 26.5;
  base.reference_temperature_c = 20.0;
  base.pressure_dbar = 0.0;
  auto ref = sw::describe_salinity(base);
  REQUIRE(ref.ok());
  REQUIRE(ref->conductivity_ms_cm.has_value());
  CHECK(ref->notes.empty());
  // Outputs equal the seawater.hpp functions they chain [same formulas; round trip].
  CHECK(ref->density_kg_m3 == doctest::Approx(sw::density_eos80_kg_m3(34.2, 26.5)));
  CHECK(ref->specific_gravity == doctest::Approx(sw::specific_gravity_from_salinity(34.2, {26.5, 20})));
  const std::pair<sw::SalinityInput, double> forms[] = {
      {sw::SalinityInput::SpecificGravity, ref->specific_gravity},
      {sw::SalinityInput::ConductivityMsCm, *ref->conductivity_ms_cm},
      {sw::SalinityInput::ConductivityRatio, *ref->conductivity_ratio},
      {sw::SalinityInput::DensityKgM3, ref->density_kg_m3}};
  for (const auto& form : forms) {  // no structured binding: clang 14 cannot capture one
    CAPTURE(sw::to_string(form.first));
    sw::SalinitySample s = base;
    s.input = form.first;
    s.value = form.second;
    auto r = sw::describe_salinity(s);
    REQUIRE(r.ok());
    CHECK(std::fabs(r->salinity - 34.2) < 1e-9);
    CHECK(std::fabs(r->density_kg_m3 - ref->density_kg_m3) < 1e-8);
  }
}

TEST_CASE("seawater: describe_salinity leaves conductivity out below S 2 and names fields") {
  sw::SalinitySample s;
  s.value = 1.0;  // brackish: EOS-80 covers it, PSS-78 does not
  auto r = sw::describe_salinity(s);
  REQUIRE(r.ok());
  CHECK_FALSE(r->conductivity_ms_cm.has_value());
  REQUIRE(r->notes.size() == 1);
  CHECK(r->notes[0].find("2 to 42") != std::string::npos);
  // A conductivity read at 37 C is outside PSS-78 (-2..35 C): the field is the sample's.
  s.input = sw::SalinityInput::ConductivityMsCm;
  s.value = 55.0;
  s.sample_temperature_c = 37.0;
  auto hot = sw::describe_salinity(s);
  REQUIRE_FALSE(hot.ok());
  CHECK(hot.error().field == "sample_temperature_c");
  CHECK(hot.error().message.rfind("sample_temperature_c 37", 0) == 0);
  s.sample_temperature_c = 25.0;
  s.reference_temperature_c = 60.0;
  auto bad_ref = sw::describe_salinity(s);
  REQUIRE_FALSE(bad_ref.ok());
  CHECK(bad_ref.error().field == "reference_temperature_c");
}

TEST_CASE("seawater: salinity CSV batch keeps good rows and explains bad ones") {
  const std::string csv =
      "Specific_Gravity,sample_temperature_f,conductivity_ms_cm,pressure_dbar,comment\r\n"
      "1.0264,77,,,reef\r\n"          // line 2: 25 C
      ",,53.07,0,\r\n"                // line 3: defaults (25 C)
      "1.050,77,,,too salty\r\n"      // line 4: out of range
      "1.02,77,40,,two inputs\r\n"    // line 5
      "x,77,,,\r\n";                  // line 6: not a number
  auto batch = sw::describe_salinity_csv(csv);
  REQUIRE(batch.ok());
  REQUIRE(batch->rows.size() == 5);
  CHECK(batch->failed == 3);
  REQUIRE(batch->rows[0].report.ok());
  CHECK(batch->rows[0].line == 2);
  CHECK(batch->rows[0].report->sample.sample_temperature_c == doctest::Approx(25.0));
  CHECK(std::fabs(batch->rows[0].report->salinity - 35.04) < 0.01);
  REQUIRE(batch->rows[1].report.ok());
  CHECK(std::fabs(batch->rows[1].report->salinity - 35.0) < 0.01);
  CHECK(batch->rows[2].report.error().field == "specific_gravity");
  CHECK(batch->rows[3].report.error().field == "input");
  CHECK(batch->rows[4].report.error().message == "specific_gravity 'x' is not a number");
  const std::string out = sw::format_salinity_batch_csv(*batch);
  CHECK(out.rfind("line,input,salinity,specific_gravity,", 0) == 0);
  CHECK(out.find("\r\n2,specific_gravity,35.0") != std::string::npos);
  CHECK(out.find("outside the accepted range") != std::string::npos);
}

TEST_CASE("seawater: salinity CSV batch refuses text without an input column") {
  auto none = sw::describe_salinity_csv("temperature_c,ph\r\n25,8.1\r\n");
  REQUIRE_FALSE(none.ok());
  CHECK(none.error().message.find("specific_gravity") != std::string::npos);
  CHECK_FALSE(sw::describe_salinity_csv("").ok());
  auto both = sw::describe_salinity_csv("salinity,temperature_c,temperature_f\r\n35,25,77\r\n");
  REQUIRE(both.ok());
  REQUIRE_FALSE(both->rows[0].report.ok());
  CHECK(both->rows[0].report.error().field == "sample_temperature");
}

// A test's kit precision in the unit it is logged in: the typical value from the parameter
// table and the accepted range add_event checks.
#include <doctest/doctest.h>

#include "tidewright/common/parameter.hpp"
#include "tidewright/common/units.hpp"
#include "tidewright/journal/test_precision.hpp"

using namespace tw::journal;

TEST_CASE("journal: typical kit precision in the logged unit") {
  // The table's 0.2 dKH (common practice) as it is, and in meq/L by the unit table's factor.
  CHECK(*typical_precision_in_unit(Parameter::Alkalinity, "dKH") == doctest::Approx(0.2));
  CHECK(*typical_precision_in_unit(Parameter::Alkalinity, "meq/L") ==
        doctest::Approx(0.2 * tw::units::kMeqPerLPerDKH));
  // A temperature difference: 0.2 C is 0.36 F (no 32 F offset).
  CHECK(*typical_precision_in_unit(Parameter::Temperature, "F") == doctest::Approx(0.36));
  CHECK(*typical_precision_in_unit(Parameter::Calcium, "mg/L") == doctest::Approx(*tw::info_of(Parameter::Calcium).typical_precision));
  CHECK_FALSE(typical_precision_in_unit(Parameter::Other, "mg/L").has_value());
  CHECK_FALSE(typical_precision_in_unit(Parameter::Alkalinity, "furlongs").has_value());
}

TEST_CASE("journal: a test's precision is accepted up to half the measurable span, in its unit") {
  const auto dkh = accepted_precision_in_unit(Parameter::Alkalinity, "dKH");
  REQUIRE(dkh);
  CHECK(dkh->lo == 0.0);
  CHECK(dkh->hi == doctest::Approx(12.5));  // 0 to 25 dKH
  const auto f = accepted_precision_in_unit(Parameter::Temperature, "F");
  REQUIRE(f);
  CHECK(f->hi == doctest::Approx(21.0 * 9.0 / 5.0));  // -2 to 40 C
  CHECK_FALSE(accepted_precision_in_unit(Parameter::Alkalinity, "furlongs"));
  // add_event checks the same bounds.
  Journal j;
  System s;
  s.name = "Reef";
  s.volume_l = 100;
  const SystemId id = *add_system(j, s);
  TestResult t;
  t.parameter = Parameter::Alkalinity;
  t.value = 8;
  t.unit = "dKH";
  t.precision = 12.5;
  CHECK(add_event(j, Event{0, id, 1000, "", t}));
  t.precision = 12.6;
  const auto refused = add_event(j, Event{0, id, 2000, "", t});
  REQUIRE_FALSE(refused);
  CHECK(refused.error().field == "precision");
  t.precision = 0.0;
  CHECK_FALSE(add_event(j, Event{0, id, 3000, "", t}));
}

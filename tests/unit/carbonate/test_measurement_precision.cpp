// Default measurement precisions (measurement_precision.hpp): the one table agrees with the
// journal's typical precision and with the ranges of common practice named in issue 13
// (alkalinity kit 0.2-0.5 dKH, hobby pH meter 0.05-0.1 NBS, calcium kit 10-20 mg/L; magnesium
// kit 25-50 mg/L, issue 18; common practice, no single source), and bad precisions are refused
// with the field and the range.
#include <cmath>
#include <string>

#include <doctest/doctest.h>

#include "tidewright/carbonate/measurement_precision.hpp"

namespace tc = tw::carbonate;
using P = tw::journal::Parameter;

TEST_CASE("measurement precision: defaults sit in the ranges of common practice") {
  struct Row { P p; double low, high; const char* unit; };
  const Row rows[] = {{P::Alkalinity, 0.2, 0.5, "dKH"}, {P::PH, 0.05, 0.1, "pH (NBS)"},
                      {P::Calcium, 10, 20, "mg/L"}, {P::Magnesium, 25, 50, "mg/L"}};
  for (const Row& r : rows) {
    auto d = tc::default_precision(r.p);
    REQUIRE(d);
    INFO(tw::parameter_name(r.p), ": typical ", d->typical, ", coarse ", d->coarse);
    CHECK(d->typical == *tw::info_of(r.p).typical_precision);  // one number, two users
    CHECK(d->typical >= r.low);
    CHECK(d->coarse <= r.high);
    CHECK(d->typical <= d->coarse);
    CHECK(d->coarse < d->maximum);
    CHECK(std::string(d->unit) == r.unit);
  }
  CHECK_FALSE(tc::default_precision(P::Nitrate));
  CHECK(tc::kPhNbsToTotalUncertainty >= 0.01);  // "a few hundredths" (facts.md)
  CHECK(tc::kPhNbsToTotalUncertainty <= 0.05);
}

TEST_CASE("measurement precision: a bad precision names the field and the accepted range") {
  CHECK(tc::check_precision(P::Alkalinity, 0.3, "--alkalinity-precision").ok());
  CHECK(tc::check_precision(P::Alkalinity, 0.0, "--alkalinity-precision").ok());
  for (double bad : {-0.1, 2.5, std::nan("")}) {
    auto s = tc::check_precision(P::Alkalinity, bad, "--alkalinity-precision");
    REQUIRE_FALSE(s.ok());
    CHECK(s.error().field == "--alkalinity-precision");
    CHECK(s.error().message.find("0 to 2 dKH") != std::string::npos);
  }
  auto ph = tc::check_precision(P::PH, 0.7, "pH precision");
  REQUIRE_FALSE(ph.ok());
  CHECK(ph.error().message.find("0 to 0.5") != std::string::npos);
}

// The target band of a dosed parameter and where a level stands against it (common/parameter.hpp).
#include <doctest/doctest.h>

#include "tidewright/common/parameter.hpp"

using namespace tw;

TEST_CASE("common: band_side reads a level against the target band, ends inside") {
  const TargetBand b = target_band(Parameter::Calcium, 430.0);
  const double half = *info_of(Parameter::Calcium).band_half_width;
  CHECK(b.low == doctest::Approx(430.0 - half));
  CHECK(b.high == doctest::Approx(430.0 + half));
  CHECK(band_side(b, 430.0) == BandSide::Inside);
  CHECK(band_side(b, b.low) == BandSide::Inside);
  CHECK(band_side(b, b.high) == BandSide::Inside);
  CHECK(band_side(b, b.low - 0.001) == BandSide::Below);
  CHECK(band_side(b, b.high + 0.001) == BandSide::Above);
}

// A test's kit precision in the unit it is logged in (test_precision.hpp).
#include "tidewright/journal/test_precision.hpp"

#include "tidewright/common/ranges.hpp"

namespace tw::journal {

namespace {
// Canonical units per unit of `unit`: every conversion is v -> a v + b with a > 0 (a scale,
// or C from F), and a precision (a difference) converts by a alone.
Result<double> scale_of(Parameter p, const std::string& unit, double density_kg_per_l) {
  auto at0 = canonical_value(p, 0.0, unit, density_kg_per_l);
  if (!at0) return at0.error();
  auto at1 = canonical_value(p, 1.0, unit, density_kg_per_l);
  if (!at1) return at1.error();
  return *at1 - *at0;
}
}  // namespace

Result<UnitBounds> accepted_precision_in_unit(Parameter p, const std::string& unit, double density_kg_per_l) {
  auto a = scale_of(p, unit, density_kg_per_l);
  if (!a) return a.error();
  const ranges::Range& r = ranges::of_measurement(p);
  const double half_span = (r.hi - r.lo) / 2.0;
  return UnitBounds{0.0, *a > 0 ? half_span / *a : half_span};
}

std::optional<double> typical_precision_in_unit(Parameter p, const std::string& unit, double density_kg_per_l) {
  const auto typical = info_of(p).typical_precision;
  if (!typical) return std::nullopt;
  auto a = scale_of(p, unit, density_kg_per_l);
  if (!a || !(*a > 0)) return std::nullopt;
  return *typical / *a;
}

}  // namespace tw::journal

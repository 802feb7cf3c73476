// A logged test's kit precision (TestResult::precision, one standard deviation in the test's
// own unit): its accepted range and the parameter's typical precision, in the unit a keeper
// logs in. add_event checks with the same rule, and the app's Log form reads both from here.
#pragma once

#include <optional>
#include <string>

#include "tidewright/journal/journal.hpp"

namespace tw::journal {

// The accepted range of a test's precision in `unit`: more than lo (0) up to hi, half of the
// parameter's measurable span (ranges::of_measurement) in that unit: a precision wider than
// that says nothing about the water. An unknown unit is refused (field "unit").
Result<UnitBounds> accepted_precision_in_unit(Parameter p, const std::string& unit,
                                              double density_kg_per_l = kNominalDensityKgPerL);

// The parameter's typical kit precision (info_of(p).typical_precision, common/parameter.hpp:
// the one table) in `unit`; unset for Other or an unknown unit.
std::optional<double> typical_precision_in_unit(Parameter p, const std::string& unit,
                                                double density_kg_per_l = kNominalDensityKgPerL);

}  // namespace tw::journal

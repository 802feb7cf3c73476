// Numbers as the journal stores and shows them.
//
// stored_number: a value converted from the unit a person typed (2 gal -> 7.570823568 L, 607.6
// gal -> 2300.000000000001 L) carries binary noise in its last digits. What goes into the
// journal is rounded to 12 significant digits, far finer than any kit, scale or tank reading,
// so files and JSON show 2300 and not 2300.000000000001.
// volume_text: a volume in the unit a system is shown in, "2.00 gal" or "40 L".
#pragma once

#include <string>

#include "tidewright/common/units.hpp"

namespace tw {

inline constexpr int kStoredSignificantDigits = 12;

double stored_number(double value);  // non-finite values are returned unchanged

// Gallons with two decimals ("2.00 gal"); litres as the shortest text of the value rounded to
// 0.01 L ("40 L", "7.57 L").
std::string volume_text(double litres, units::VolumeUnit unit);

}  // namespace tw

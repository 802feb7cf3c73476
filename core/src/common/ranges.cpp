#include "tidewright/common/ranges.hpp"

namespace tw::ranges {

Status check(const std::string& field, double value, const Range& r) {
  return check_range(field, value, r.lo, r.hi, r.unit);
}

const Range& of_measurement(Parameter p) {
  switch (p) {
    case Parameter::Alkalinity: return kAlkalinityDkh;
    case Parameter::Calcium: return kCalciumMgL;
    case Parameter::Magnesium: return kMagnesiumMgL;
    case Parameter::PH: return kPh;
    case Parameter::Salinity: return kSalinity;
    case Parameter::SpecificGravity: return kSpecificGravity;
    case Parameter::Temperature: return kTemperatureC;
    case Parameter::Nitrate: return kNitrateMgL;
    case Parameter::Phosphate: return kPhosphateMgL;
    case Parameter::Other: return kOtherValue;
  }
  return kOtherValue;
}

Range of_rise(Parameter p) {
  return Range{1e-6, of_measurement(p).hi, parameter_unit(p)};
}

}  // namespace tw::ranges

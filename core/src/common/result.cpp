#include "tidewright/common/result.hpp"

#include <cmath>

#include <fmt/format.h>

namespace tw {

Error out_of_range_error(const std::string& field, double value, double lo, double hi,
                         const std::string& unit) {
  const std::string u = unit.empty() ? "" : " " + unit;
  if (!std::isfinite(value)) {
    return {field, fmt::format("{} is not a number; accepted range is {:g} to {:g}{}", field, lo,
                               hi, u)};
  }
  return {field, fmt::format("{} {:g}{} is outside the accepted range {:g} to {:g}{}", field,
                             value, u, lo, hi, u)};
}

Status check_range(const std::string& field, double value, double lo, double hi,
                   const std::string& unit) {
  if (!std::isfinite(value) || value < lo || value > hi) {
    return out_of_range_error(field, value, lo, hi, unit);
  }
  return Ok{};
}

}  // namespace tw

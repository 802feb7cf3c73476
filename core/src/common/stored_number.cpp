// Numbers as the journal stores and shows them (stored_number.hpp).
#include "tidewright/common/stored_number.hpp"

#include <cmath>
#include <cstdlib>

#include <fmt/format.h>

namespace tw {

double stored_number(double value) {
  if (!std::isfinite(value) || value == 0) return value;
  const std::string text = fmt::format("{:.{}g}", value, kStoredSignificantDigits);
  return std::strtod(text.c_str(), nullptr);
}

std::string volume_text(double litres, units::VolumeUnit unit) {
  if (unit == units::VolumeUnit::UsGallon) {
    return fmt::format("{:.2f} gal", units::volume_from_litres(litres, unit));
  }
  return fmt::format("{:g} L", std::round(litres * 100.0) / 100.0);
}

}  // namespace tw

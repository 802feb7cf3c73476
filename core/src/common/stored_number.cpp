// Numbers as the journal stores and shows them (stored_number.hpp).
#include "tidewright/common/stored_number.hpp"

#include <cmath>
#include <cstdlib>

#include <fmt/format.h>

namespace tw {

namespace {

// Digits in the mantissa of a number's text ("-0.00123" -> 3, "2300" -> 4, "1.5e-05" -> 2):
// leading zeros are not counted, trailing ones are (never fewer than the significant digits).
int mantissa_digits(const char* begin, const char* end) {
  int digits = 0;
  for (const char* c = begin; c != end && *c != 'e'; ++c) {
    if (*c >= '1' && *c <= '9') ++digits;
    else if (*c == '0' && digits > 0) ++digits;
  }
  return digits;
}

}  // namespace

double stored_number(double value) {
  if (!std::isfinite(value) || value == 0) return value;
  // Most numbers (a kit's 8.3, a tank's 400) are already at most 12 digits in their shortest
  // round-trip text, and rounding such a value to 12 digits gives the value back exactly. That
  // check is fast; the rounding below formats with a fixed precision and parses again, which
  // was about a ninth of reading the demo journal at the app's start in WebAssembly.
  char shortest[32];
  const char* end = fmt::format_to_n(shortest, sizeof shortest, "{}", value).out;
  if (mantissa_digits(shortest, end) <= kStoredSignificantDigits) return value;
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

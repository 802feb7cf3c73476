// The rule for a pump's (or a hand routine's) name, DoseSchedule::device: what a keeper types
// is trimmed of surrounding white space and must then be 1 to 60 characters (bytes of UTF-8,
// as the journal has always counted them). The journal checks stored schedules with the same
// constant; the app's Plan screen names its pumps through device_name_from_text.
#pragma once

#include <cstddef>
#include <string>

#include "tidewright/common/result.hpp"

namespace tw::journal {

inline constexpr std::size_t kMaxDeviceNameChars = 60;

// The trimmed name, or an error (field `field`) that says the accepted length.
Result<std::string> device_name_from_text(const std::string& typed, const std::string& field = "device");

}  // namespace tw::journal

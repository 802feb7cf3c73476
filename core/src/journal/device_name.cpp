// A pump's name typed by a keeper (device_name.hpp).
#include "tidewright/journal/device_name.hpp"

#include <fmt/format.h>

#include "tidewright/journal/system_name.hpp"

namespace tw::journal {

Result<std::string> device_name_from_text(const std::string& typed, const std::string& field) {
  const std::string name = trim_system_name(typed);  // the same white space as a system's name
  if (name.empty() || name.size() > kMaxDeviceNameChars) {
    return Error{field, fmt::format("{} must name the pump or routine in 1 to {} characters (it has {})", field,
                                    kMaxDeviceNameChars, name.size())};
  }
  for (unsigned char c : name) {
    if (c < 0x20 || c == 0x7F) return Error{field, field + " must not hold control characters such as line breaks"};
  }
  return name;
}

}  // namespace tw::journal

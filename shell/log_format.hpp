// One-line text descriptions of journal systems and events for `tidewright log`.
#pragma once

#include <string>

#include "tidewright/journal/journal.hpp"

namespace tw::shell {

// "Living room reef (reef_display, 380 L net, S 35, 25.5 C, targets alk 8 dKH, Ca 430 mg/L)"
std::string describe_system_line(const journal::System& system);

// "12  2026-11-01 08:00Z  Living room reef  test alkalinity 8.1 dKH (sd 0.2)"
// Water changes and top-offs in the system's volume unit ("water change 2.00 gal").
// Always one line: line breaks and other control characters in free text are escaped
// (text::one_line: "note: first\nsecond"); leading spaces of a note are kept.
std::string describe_event_line(const journal::Journal& journal, const journal::Event& event);

}  // namespace tw::shell

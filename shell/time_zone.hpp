// Times people type, read in the zone they live in. One rule for every command:
//   --utc-offset +05:30   a fixed offset (-12:00 to +14:00, the core's parse_utc_offset);
//   --time-zone NAME      an IANA zone from the platform's zone data (/usr/share/zoneinfo),
//                         daylight saving included;
//   neither               the machine's own zone (TZ, else /etc/localtime).
// A time written with its zone (2026-11-01T08:00Z, +01:00) is always read as written.
#pragma once

#include <functional>
#include <string>

#include "tidewright/common/datetime.hpp"

namespace tw::shell {

// Help texts, so every command says the same thing.
inline constexpr const char* kUtcOffsetHelp =
    "Offset from UTC for times without a zone, -12:00 to +14:00, e.g. +05:30 or -8 (default: the machine's time zone)";
inline constexpr const char* kTimeZoneHelp =
    "IANA time zone for times without a zone, e.g. Europe/Berlin (default: the machine's time zone)";

// The core's parse options for the given texts; refusals name the option and the range.
datetime::ParseOptions time_parse_options(const std::string& date_order, const std::string& utc_offset,
                                          const std::string& time_zone);

// The offset in minutes of the zone chosen by these options at a local civil time (written as
// if it were UTC), for commands that need one offset (a plan's first day).
int offset_minutes_at(std::int64_t local_as_utc_s, const std::string& utc_offset, const std::string& time_zone);

// The moment a command reads the journal at: --at TIME when given (a time with its zone, e.g.
// 2026-12-03T08:00Z), else now. Refusals name `option`.
inline constexpr const char* kAtHelp = "Read the journal as at this time, e.g. 2026-12-03T08:00Z (default: now)";
std::int64_t now_or_at(const std::string& at, const char* option);

}  // namespace tw::shell

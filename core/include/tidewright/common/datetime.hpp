// Calendar dates and times as text <-> seconds since the Unix epoch (UTC).
// Own small implementation (no date library): the civil-calendar conversions follow Howard
// Hinnant's public-domain algorithms "days_from_civil" and "civil_from_days" (proleptic
// Gregorian calendar), written here from their published description.
#pragma once

#include <cstdint>
#include <functional>
#include <string>
#include <vector>

#include "tidewright/common/result.hpp"

namespace tw::datetime {

// Days since 1970-01-01 for a proleptic Gregorian date (Hinnant, "chrono-Compatible Low-Level
// Date Algorithms", days_from_civil). Check value: 2000-03-01 -> 11017.
std::int64_t days_from_civil(std::int64_t year, unsigned month, unsigned day);

struct CivilDate {
  std::int64_t year;
  unsigned month;  // 1..12
  unsigned day;    // 1..31
};
// Inverse of days_from_civil (Hinnant, civil_from_days).
CivilDate civil_from_days(std::int64_t days);

bool is_leap_year(std::int64_t year);
unsigned days_in_month(std::int64_t year, unsigned month);

// How to read a date written with the day and month both as numbers, e.g. 03/04/2026.
enum class DateOrder {
  Unspecified,  // infer when only one reading is a valid date; refuse when both are
  DayMonthYear,  // "dmy": 03/04/2026 is 3 April
  MonthDayYear,  // "mdy": 03/04/2026 is 4 March
};
Result<DateOrder> date_order_from_string(const std::string& text);  // "dmy", "mdy", "" -> Unspecified

struct ParseOptions {
  DateOrder order = DateOrder::Unspecified;
  // Offset of local time from UTC in minutes for texts without a zone (e.g. +60 for UTC+1).
  int utc_offset_minutes = 0;
  // When set, it decides the offset of a text without a zone instead: given the local civil
  // time written as if it were UTC (seconds since the epoch), the offset of that zone then in
  // minutes. The shell passes the machine's or a named IANA zone (daylight saving included);
  // the core never reads zone data itself.
  std::function<int(std::int64_t local_as_utc_s)> zone_offset_minutes;
};

// The offset of a zone at a local civil time (written as if it were UTC), from the zone's
// offset at an instant (what a platform can tell: the C library's localtime, a browser's Date):
// guess with the offset at that instant read as UTC, then take the offset at the corrected
// instant. Right on both sides of a daylight-saving change; in the hour that does not exist
// (clocks forward) or exists twice (clocks back) it takes one of the two offsets. One rule, so
// the command line and the app read every time, those hours included, the same way.
int zone_offset_at_local(std::int64_t local_as_utc_s, const std::function<int(std::int64_t unix_s)>& offset_at_instant);

// The local date of an instant (days since 1970-01-01 on the zone's calendar), with the zone's
// offset at that instant: 2026-03-29T22:30Z is 03-30 in Berlin (+120 that night), 03-29 with
// the winter's +60 a chart took for every date.
std::int64_t local_day_of(std::int64_t unix_s, const std::function<int(std::int64_t unix_s)>& offset_at_instant);
// The instants of the zone's local midnights from from_s to to_s (both included), of the local
// days whose number is a multiple of step_days (1 = every day), each with its own date's
// offset: the ticks of a time axis stay on midnight across a daylight-saving change.
std::vector<std::int64_t> local_midnights(std::int64_t from_s, std::int64_t to_s, int step_days,
                                          const std::function<int(std::int64_t unix_s)>& offset_at_instant);

// A UTC offset as people write it: +05:30, -08:00, +0530, +5, -8, Z or 0. Accepted range
// -12:00 to +14:00 (ranges::kUtcOffsetMinutes, the offsets in use on Earth). Errors name the
// field "utc_offset" and the range.
Result<int> parse_utc_offset(const std::string& text);

// The date order a column of times shows: DayMonthYear when some text reads only as
// day/month/year and none only as month/day/year, MonthDayYear the other way round,
// Unspecified when no text decides it or when the texts disagree.
DateOrder infer_date_order(const std::vector<std::string>& texts);

// Parses one date-time into seconds since 1970-01-01T00:00:00Z. Accepted forms:
//   ISO 8601: YYYY-MM-DD, YYYY-MM-DDTHH:MM[:SS[.fff]] with 'T' or a space, optional zone
//             Z, +HH:MM, +HHMM or +HH (fractions of a second are dropped);
//   YYYY/MM/DD and YYYY.MM.DD [HH:MM[:SS]];
//   DD/MM/YYYY or MM/DD/YYYY (also with '.' or '-') [HH:MM[:SS]], read with options.order;
//   a bare integer of seconds since the epoch, prefixed with '@' (e.g. @1780000000).
// Errors name the field "time" and say what was expected; an ambiguous day/month says to
// choose dmy or mdy.
Result<std::int64_t> parse_datetime(const std::string& text, const ParseOptions& options = {});

// "2026-08-01T08:00:00Z" (always UTC, whole seconds).
std::string format_iso8601_utc(std::int64_t seconds);
// "2026-08-01" (UTC).
std::string format_date_utc(std::int64_t seconds);

}  // namespace tw::datetime

// The keeper's local time, one rule for every screen: a time is shown, and a typed or imported
// time without a zone is read, with the offset the device's zone has at that date (daylight
// saving included), by the core's zone_offset_at_local, as `tidewright` reads them. Using the
// offset of today for every date put a summer time read in winter an hour off.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "tidewright/common/datetime.hpp"

namespace twapp::local_time {

// "2026-07-01 08:00" in the zone's offset at that instant.
std::string text(std::int64_t unix_s);
// Options for parse_datetime (and import_csv) that read a time without a zone as local time.
tw::datetime::ParseOptions parse_options(tw::datetime::DateOrder order = tw::datetime::DateOrder::Unspecified);
// The instant of a local civil time written as if it were UTC (e.g. a local midnight).
std::int64_t to_utc(std::int64_t local_as_utc_s);
// "03-30": the local month and day of a time in days since the epoch (the charts' dates).
std::string month_day(double t_days);
// The local midnights from lo to hi (days since the epoch) on days that are multiples of
// step_days, in days since the epoch: a chart's date ticks.
std::vector<double> midnights(double lo_days, double hi_days, int step_days);

}  // namespace twapp::local_time

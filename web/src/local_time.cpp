// The keeper's local time (local_time.hpp): the platform tells the zone's offset at an instant,
// the core turns that into the offset at a local time.
#include "local_time.hpp"

#include <cmath>
#include <cstdio>

#include "format.hpp"
#include "platform.hpp"

namespace twapp::local_time {

namespace {
int offset_at_local(std::int64_t local_as_utc_s) {
  return tw::datetime::zone_offset_at_local(local_as_utc_s, platform::utc_offset_minutes_at);
}
}  // namespace

std::string text(std::int64_t unix_s) { return fmtx::local_time_text(unix_s, platform::utc_offset_minutes_at(unix_s)); }

tw::datetime::ParseOptions parse_options(tw::datetime::DateOrder order) {
  tw::datetime::ParseOptions o;
  o.order = order;
  o.zone_offset_minutes = offset_at_local;
  return o;
}

std::int64_t to_utc(std::int64_t local_as_utc_s) { return local_as_utc_s - 60LL * offset_at_local(local_as_utc_s); }

std::string month_day(double t_days) {
  const auto unix_s = static_cast<std::int64_t>(std::floor(t_days * 86400.0));
  const auto c = tw::datetime::civil_from_days(tw::datetime::local_day_of(unix_s, platform::utc_offset_minutes_at));
  char buf[16];
  std::snprintf(buf, sizeof buf, "%02u-%02u", c.month, c.day);
  return buf;
}

std::vector<double> midnights(double lo_days, double hi_days, int step_days) {
  std::vector<double> out;
  for (const std::int64_t t : tw::datetime::local_midnights(static_cast<std::int64_t>(std::ceil(lo_days * 86400.0)),
                                                            static_cast<std::int64_t>(std::floor(hi_days * 86400.0)),
                                                            step_days, platform::utc_offset_minutes_at)) {
    out.push_back(static_cast<double>(t) / 86400.0);
  }
  return out;
}

}  // namespace twapp::local_time

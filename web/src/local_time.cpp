// The keeper's local time (local_time.hpp): the platform tells the zone's offset at an instant,
// the core turns that into the offset at a local time.
#include "local_time.hpp"

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

}  // namespace twapp::local_time

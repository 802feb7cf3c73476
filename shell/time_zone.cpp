// Local time for typed times (time_zone.hpp): the platform's zone data through the C library.
#include "time_zone.hpp"

#include <cstdlib>
#include <ctime>
#include <sys/stat.h>

#include "commands.hpp"

namespace tw::shell {

namespace {

// An IANA name that names a file of the platform's zone data; the C library is then told to
// use it (TZ) for the rest of this run.
void use_zone(const std::string& name) {
  const bool plain = !name.empty() && name[0] != '/' && name.find("..") == std::string::npos;
  struct stat info {};
  const std::string path = "/usr/share/zoneinfo/" + name;
  if (!plain || stat(path.c_str(), &info) != 0 || !S_ISREG(info.st_mode)) {
    throw CommandError("--time-zone '" + name + "' is not a time zone of /usr/share/zoneinfo; accepted: IANA names "
                       "such as Europe/Berlin, America/New_York, Australia/Brisbane or UTC");
  }
  setenv("TZ", name.c_str(), 1);
  tzset();
}

int gmtoff_minutes(std::time_t t) {
  std::tm tm{};
  localtime_r(&t, &tm);
  return static_cast<int>(tm.tm_gmtoff / 60);
}

// The zone's offset at a local time, by the core's rule (the app uses the same one).
int local_offset(std::int64_t local_as_utc_s) {
  return datetime::zone_offset_at_local(local_as_utc_s, [](std::int64_t t) { return gmtoff_minutes(static_cast<std::time_t>(t)); });
}

}  // namespace

datetime::ParseOptions time_parse_options(const std::string& date_order, const std::string& utc_offset,
                                          const std::string& time_zone) {
  datetime::ParseOptions p;
  auto order = datetime::date_order_from_string(date_order);
  if (!order) throw CommandError("--date-order '" + date_order + "' is not known; accepted: dmy, mdy");
  p.order = *order;
  if (!utc_offset.empty() && !time_zone.empty()) throw CommandError("give --utc-offset or --time-zone, not both");
  if (!utc_offset.empty()) {
    auto off = datetime::parse_utc_offset(utc_offset);
    if (!off) throw CommandError("--utc-offset '" + utc_offset + "' is not a UTC offset; accepted: -12:00 to +14:00, "
                                 "written like +05:30, -08:00, +0530, +5 or Z");
    p.utc_offset_minutes = *off;
    return p;
  }
  if (!time_zone.empty()) use_zone(time_zone);
  p.zone_offset_minutes = local_offset;
  return p;
}

int offset_minutes_at(std::int64_t local_as_utc_s, const std::string& utc_offset, const std::string& time_zone) {
  const datetime::ParseOptions p = time_parse_options("", utc_offset, time_zone);
  return p.zone_offset_minutes ? p.zone_offset_minutes(local_as_utc_s) : p.utc_offset_minutes;
}

std::int64_t now_or_at(const std::string& at, const char* option) {
  if (at.empty()) return static_cast<std::int64_t>(std::time(nullptr));
  auto t = datetime::parse_datetime(at);
  if (!t) throw CommandError(std::string(option) + ": " + t.error().message);
  return *t;
}

}  // namespace tw::shell

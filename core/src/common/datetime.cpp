#include "tidewright/common/datetime.hpp"
#include "tidewright/common/ranges.hpp"

#include <cctype>
#include <vector>

#include <fmt/format.h>

namespace tw::datetime {

// Howard Hinnant, "chrono-Compatible Low-Level Date Algorithms" (public domain): shifts the
// year to start on 1 March so the leap day is the last day of the year, then counts 400-year
// eras of 146097 days.
std::int64_t days_from_civil(std::int64_t y, unsigned m, unsigned d) {
  y -= m <= 2 ? 1 : 0;
  const std::int64_t era = (y >= 0 ? y : y - 399) / 400;
  const auto yoe = static_cast<unsigned>(y - era * 400);                      // [0, 399]
  const unsigned doy = (153 * (m > 2 ? m - 3 : m + 9) + 2) / 5 + d - 1;       // [0, 365]
  const unsigned doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;                 // [0, 146096]
  return era * 146097 + static_cast<std::int64_t>(doe) - 719468;
}

CivilDate civil_from_days(std::int64_t z) {
  z += 719468;
  const std::int64_t era = (z >= 0 ? z : z - 146096) / 146097;
  const auto doe = static_cast<unsigned>(z - era * 146097);                     // [0, 146096]
  const unsigned yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;   // [0, 399]
  const std::int64_t y = static_cast<std::int64_t>(yoe) + era * 400;
  const unsigned doy = doe - (365 * yoe + yoe / 4 - yoe / 100);                 // [0, 365]
  const unsigned mp = (5 * doy + 2) / 153;                                      // [0, 11]
  const unsigned d = doy - (153 * mp + 2) / 5 + 1;                              // [1, 31]
  const unsigned m = mp < 10 ? mp + 3 : mp - 9;                                 // [1, 12]
  return {y + (m <= 2 ? 1 : 0), m, d};
}

bool is_leap_year(std::int64_t y) { return y % 4 == 0 && (y % 100 != 0 || y % 400 == 0); }

unsigned days_in_month(std::int64_t y, unsigned m) {
  static const unsigned kDays[] = {31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31};
  if (m < 1 || m > 12) return 0;
  return m == 2 && is_leap_year(y) ? 29 : kDays[m - 1];
}

Result<DateOrder> date_order_from_string(const std::string& text) {
  std::string t;
  for (char c : text) t += static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  if (t.empty()) return DateOrder::Unspecified;
  if (t == "dmy") return DateOrder::DayMonthYear;
  if (t == "mdy") return DateOrder::MonthDayYear;
  return Error{"date_order", "date order '" + text + "' is not known; accepted: dmy, mdy"};
}

namespace {

// A tiny cursor over the text.
struct Scanner {
  const std::string& s;
  size_t i = 0;
  bool done() const { return i >= s.size(); }
  char peek() const { return done() ? '\0' : s[i]; }
  // Reads 1..max_digits digits; returns -1 if none.
  std::int64_t digits(size_t max_digits, size_t* count = nullptr) {
    size_t n = 0;
    std::int64_t v = 0;
    while (!done() && n < max_digits && std::isdigit(static_cast<unsigned char>(s[i]))) {
      v = v * 10 + (s[i] - '0');
      ++i;
      ++n;
    }
    if (count) *count = n;
    return n == 0 ? -1 : v;
  }
};

Error time_error(const std::string& text, const std::string& why) {
  return Error{"time", "time '" + text + "' " + why};
}

const char* kForms =
    "; accepted: YYYY-MM-DD[THH:MM[:SS]][Z|+HH:MM], DD/MM/YYYY or MM/DD/YYYY [HH:MM[:SS]]";

Result<std::int64_t> to_seconds(const std::string& text, std::int64_t y, std::int64_t mo,
                                std::int64_t d, std::int64_t h, std::int64_t mi, std::int64_t sec,
                                int offset_minutes) {
  if (y < 1 || y > 9999) return time_error(text, "has a year outside 1 to 9999");
  if (mo < 1 || mo > 12) return time_error(text, "has a month outside 1 to 12");
  const unsigned dim = days_in_month(y, static_cast<unsigned>(mo));
  if (d < 1 || d > dim) {
    return time_error(text, fmt::format("has day {} but that month has {} days", d, dim));
  }
  if (h < 0 || h > 24 || mi < 0 || mi > 59 || sec < 0 || sec > 60 ||
      (h == 24 && (mi != 0 || sec != 0))) {
    return time_error(text, "has a time of day outside 00:00:00 to 23:59:59");
  }
  if (sec == 60) sec = 59;  // a leap second is kept in its minute
  const std::int64_t days =
      days_from_civil(y, static_cast<unsigned>(mo), static_cast<unsigned>(d));
  return days * 86400 + h * 3600 + mi * 60 + sec - static_cast<std::int64_t>(offset_minutes) * 60;
}

// Parses "[T| ]HH:MM[:SS[.fff]][zone]" from the scanner; fills h, mi, sec, offset.
Status parse_time_of_day(Scanner& sc, const std::string& text, bool allow_zone, std::int64_t& h,
                         std::int64_t& mi, std::int64_t& sec, int& offset, bool& zoned) {
  if (sc.done()) return Ok{};
  if (sc.peek() != 'T' && sc.peek() != 't' && sc.peek() != ' ') {
    return time_error(text, std::string("has unexpected text after the date") + kForms);
  }
  ++sc.i;
  while (sc.peek() == ' ') ++sc.i;
  size_t n = 0;
  h = sc.digits(2, &n);
  if (h < 0 || sc.peek() != ':') return time_error(text, std::string("has no HH:MM time") + kForms);
  ++sc.i;
  mi = sc.digits(2, &n);
  if (mi < 0 || n != 2) return time_error(text, "needs two digits of minutes");
  if (sc.peek() == ':') {
    ++sc.i;
    sec = sc.digits(2, &n);
    if (sec < 0 || n != 2) return time_error(text, "needs two digits of seconds");
    if (sc.peek() == '.' || sc.peek() == ',') {
      ++sc.i;
      if (sc.digits(9) < 0) return time_error(text, "has a decimal point without digits");
    }
  }
  while (sc.peek() == ' ') ++sc.i;
  if (sc.done()) return Ok{};
  if (!allow_zone) return time_error(text, "has unexpected text after the time");
  const char z = sc.peek();
  zoned = true;
  if (z == 'Z' || z == 'z') {
    ++sc.i;
    offset = 0;
  } else if (z == '+' || z == '-') {
    ++sc.i;
    const std::int64_t oh = sc.digits(2, &n);
    if (oh < 0 || n != 2) return time_error(text, "has a zone offset without HH");
    std::int64_t om = 0;
    if (sc.peek() == ':') ++sc.i;
    if (!sc.done()) {
      om = sc.digits(2, &n);
      if (om < 0 || n != 2) return time_error(text, "has a zone offset without MM");
    }
    if (oh > 18 || om > 59) return time_error(text, "has a zone offset outside -18:00 to +18:00");
    offset = static_cast<int>((z == '-' ? -1 : 1) * (oh * 60 + om));
  } else {
    return time_error(text, "has unexpected text after the time");
  }
  if (!sc.done()) return time_error(text, "has unexpected text after the zone");
  return Ok{};
}

}  // namespace

Result<std::int64_t> parse_datetime(const std::string& raw, const ParseOptions& options) {
  size_t b = raw.find_first_not_of(" \t");
  size_t e = raw.find_last_not_of(" \t");
  if (b == std::string::npos) return Error{"time", std::string("time is empty") + kForms};
  const std::string text = raw.substr(b, e - b + 1);
  Scanner sc{text};
  if (text[0] == '@') {
    sc.i = 1;
    bool neg = false;
    if (sc.peek() == '-') {
      neg = true;
      ++sc.i;
    }
    size_t n = 0;
    const std::int64_t v = sc.digits(12, &n);
    if (v < 0 || !sc.done()) return time_error(text, "is not @ followed by whole seconds");
    return neg ? -v : v;
  }
  size_t n1 = 0;
  const std::int64_t a = sc.digits(4, &n1);
  if (a < 0) return time_error(text, std::string("does not start with a date") + kForms);
  const char sep = sc.peek();
  if (sep != '-' && sep != '/' && sep != '.') {
    return time_error(text, std::string("is not a date") + kForms);
  }
  ++sc.i;
  size_t n2 = 0;
  const std::int64_t bnum = sc.digits(2, &n2);
  if (bnum < 0 || sc.peek() != sep) return time_error(text, std::string("is not a date") + kForms);
  ++sc.i;
  size_t n3 = 0;
  const std::int64_t c = sc.digits(4, &n3);
  if (c < 0) return time_error(text, std::string("is not a date") + kForms);
  std::int64_t y = 0, mo = 0, d = 0, h = 0, mi = 0, sec = 0;
  int offset = options.utc_offset_minutes;
  const bool year_first = n1 == 4;
  if (year_first) {
    if (n3 > 2) return time_error(text, std::string("has a day of more than two digits") + kForms);
    y = a;
    mo = bnum;
    d = c;
  } else {
    if (n3 != 4) return time_error(text, "needs a four-digit year (DD/MM/YYYY or MM/DD/YYYY)");
    y = c;
    DateOrder order = options.order;
    if (order == DateOrder::Unspecified) {
      const bool dmy_ok = bnum >= 1 && bnum <= 12 && a >= 1 &&
                          a <= days_in_month(y, static_cast<unsigned>(bnum));
      const bool mdy_ok = a >= 1 && a <= 12 && bnum >= 1 &&
                          bnum <= days_in_month(y, static_cast<unsigned>(a));
      if (dmy_ok && mdy_ok && a != bnum) {
        return time_error(text, "is ambiguous: day and month could be either way round; choose "
                                "the date order dmy (day/month/year) or mdy (month/day/year)");
      }
      order = dmy_ok ? DateOrder::DayMonthYear : DateOrder::MonthDayYear;
    }
    if (order == DateOrder::DayMonthYear) {
      d = a;
      mo = bnum;
    } else {
      mo = a;
      d = bnum;
    }
  }
  bool zoned = false;
  Status st = parse_time_of_day(sc, text, year_first && sep == '-', h, mi, sec, offset, zoned);
  if (!st) return st.error();
  if (!zoned && options.zone_offset_minutes) {
    auto local = to_seconds(text, y, mo, d, h, mi, sec, 0);
    if (!local) return local.error();
    offset = options.zone_offset_minutes(*local);
  }
  return to_seconds(text, y, mo, d, h, mi, sec, offset);
}

int zone_offset_at_local(std::int64_t local_as_utc_s, const std::function<int(std::int64_t unix_s)>& offset_at_instant) {
  const int guess = offset_at_instant(local_as_utc_s);
  return offset_at_instant(local_as_utc_s - guess * 60LL);
}

namespace {
std::int64_t floor_div(std::int64_t a, std::int64_t b) { return a / b - ((a % b != 0) && ((a < 0) != (b < 0)) ? 1 : 0); }
}  // namespace

std::int64_t local_day_of(std::int64_t unix_s, const std::function<int(std::int64_t unix_s)>& offset_at_instant) {
  return floor_div(unix_s + 60LL * offset_at_instant(unix_s), 86400);
}

std::vector<std::int64_t> local_midnights(std::int64_t from_s, std::int64_t to_s, int step_days,
                                          const std::function<int(std::int64_t unix_s)>& offset_at_instant) {
  std::vector<std::int64_t> out;
  if (step_days < 1 || to_s < from_s) return out;
  // From the local day before from_s's (its midnight may still be at or after from_s when the
  // offset is negative) on, a step at a time.
  std::int64_t day = floor_div(local_day_of(from_s, offset_at_instant) - 1, step_days) * step_days;
  for (;; day += step_days) {
    const std::int64_t local = day * 86400;
    const std::int64_t instant = local - 60LL * zone_offset_at_local(local, offset_at_instant);
    if (instant > to_s) break;
    if (instant >= from_s) out.push_back(instant);
  }
  return out;
}

Result<int> parse_utc_offset(const std::string& raw) {
  const size_t b = raw.find_first_not_of(" \t");
  const size_t e = raw.find_last_not_of(" \t");
  const std::string text = b == std::string::npos ? "" : raw.substr(b, e - b + 1);
  const ranges::Range& r = ranges::kUtcOffsetMinutes;
  auto refuse = [&] {
    return Error{"utc_offset", "utc_offset '" + raw + "' is not a UTC offset; accepted: -12:00 to +14:00, " +
                                   "written like +05:30, -08:00, +0530, +5 or Z"};
  };
  if (text == "Z" || text == "z" || text == "0") return 0;
  Scanner sc{text};
  int sign = 1;
  if (sc.peek() == '+' || sc.peek() == '-') {
    sign = sc.peek() == '-' ? -1 : 1;
    ++sc.i;
  }
  size_t n = 0;
  const std::int64_t first = sc.digits(4, &n);
  if (first < 0) return refuse();
  std::int64_t hours = first, minutes = 0;
  if (n == 4 || n == 3) {
    if (!sc.done()) return refuse();
    hours = first / 100;
    minutes = first % 100;
  } else if (sc.peek() == ':') {
    ++sc.i;
    size_t m = 0;
    minutes = sc.digits(2, &m);
    if (minutes < 0 || m != 2 || !sc.done()) return refuse();
  } else if (!sc.done()) {
    return refuse();
  }
  if (minutes > 59) return refuse();
  const std::int64_t total = sign * (hours * 60 + minutes);
  if (static_cast<double>(total) < r.lo || static_cast<double>(total) > r.hi) return refuse();
  return static_cast<int>(total);
}

DateOrder infer_date_order(const std::vector<std::string>& texts) {
  bool only_dmy = false, only_mdy = false;
  ParseOptions dmy, mdy;
  dmy.order = DateOrder::DayMonthYear;
  mdy.order = DateOrder::MonthDayYear;
  for (const std::string& t : texts) {
    const bool d = parse_datetime(t, dmy).ok();
    const bool m = parse_datetime(t, mdy).ok();
    if (d && !m) only_dmy = true;
    if (m && !d) only_mdy = true;
  }
  if (only_dmy == only_mdy) return DateOrder::Unspecified;
  return only_dmy ? DateOrder::DayMonthYear : DateOrder::MonthDayYear;
}

std::string format_iso8601_utc(std::int64_t seconds) {
  std::int64_t days = seconds / 86400;
  std::int64_t rem = seconds % 86400;
  if (rem < 0) {
    rem += 86400;
    --days;
  }
  const CivilDate c = civil_from_days(days);
  return fmt::format("{:04d}-{:02d}-{:02d}T{:02d}:{:02d}:{:02d}Z", c.year, c.month, c.day,
                     rem / 3600, rem / 60 % 60, rem % 60);
}

std::string format_date_utc(std::int64_t seconds) {
  return format_iso8601_utc(seconds).substr(0, 10);
}

}  // namespace tw::datetime

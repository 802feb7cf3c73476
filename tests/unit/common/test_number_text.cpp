// The one rule for numbers people type (number_text.hpp) and UTC offsets (datetime.hpp).
#include <doctest/doctest.h>

#include "tidewright/common/datetime.hpp"
#include "tidewright/common/number_text.hpp"

using tw::number_text::DecimalMark;
using tw::number_text::read_decimal;

TEST_CASE("number_text: plain decimals, signs and exponents are read") {
  CHECK(*read_decimal("8.2") == doctest::Approx(8.2));
  CHECK(*read_decimal("-3") == -3.0);
  CHECK(*read_decimal("+.5") == 0.5);
  CHECK(*read_decimal("5.") == 5.0);
  CHECK(*read_decimal("1e-3") == doctest::Approx(0.001));
  CHECK(*read_decimal("8,2", DecimalMark::PointOrComma) == doctest::Approx(8.2));
}

TEST_CASE("number_text: hex, inf, nan, spaces, a second mark and a comma where none is allowed are refused") {
  for (const char* bad : {"0x10", "0X1p3", "inf", "-inf", "nan", "NaN", "infinity", "", " 8", "8 ", "8.2.1", "1,2.3",
                          "e5", "1e", "--1", "1e999", "8,2", "abc", "."}) {
    CAPTURE(bad);
    CHECK_FALSE(read_decimal(bad).has_value());
  }
  CHECK_FALSE(read_decimal("8,2,1", DecimalMark::PointOrComma).has_value());
  auto e = tw::number_text::read_decimal_or_error("value", "nan");
  REQUIRE_FALSE(e.ok());
  CHECK(e.error().field == "value");
  CHECK(e.error().message.find("is not a number") != std::string::npos);
}

TEST_CASE("datetime: UTC offsets -12:00 to +14:00 in the ways people write them") {
  using tw::datetime::parse_utc_offset;
  CHECK(*parse_utc_offset("+05:30") == 330);
  CHECK(*parse_utc_offset("-08:00") == -480);
  CHECK(*parse_utc_offset("+0545") == 345);
  CHECK(*parse_utc_offset("-8") == -480);
  CHECK(*parse_utc_offset("Z") == 0);
  CHECK(*parse_utc_offset("+14:00") == 840);
  CHECK(*parse_utc_offset("-12:00") == -720);
  for (const char* bad : {"99999", "+14:01", "-12:30", "15", "+05:60", "abc", "", "+5:3", "60"}) {
    CAPTURE(bad);
    auto r = parse_utc_offset(bad);
    REQUIRE_FALSE(r.ok());
    CHECK(r.error().field == "utc_offset");
    CHECK(r.error().message.find("-12:00 to +14:00") != std::string::npos);
  }
}

TEST_CASE("datetime: a zone callback decides times without a zone; a written zone still wins") {
  tw::datetime::ParseOptions p;
  p.zone_offset_minutes = [](std::int64_t) { return 120; };
  CHECK(*tw::datetime::parse_datetime("2026-07-01 08:00", p) == *tw::datetime::parse_datetime("2026-07-01T06:00Z"));
  CHECK(*tw::datetime::parse_datetime("2026-07-01T08:00Z", p) == *tw::datetime::parse_datetime("2026-07-01T08:00Z"));
}

// Central European time as a platform tells it, instant by instant: +60, +120 from the last
// Sunday of March 01:00Z to the last Sunday of October 01:00Z (EU rule since 1996, Directive
// 2000/84/EC). 2026: 29 March 01:00Z and 25 October 01:00Z.
namespace {
int berlin_offset_2026(std::int64_t unix_s) {
  const std::int64_t summer_from = *tw::datetime::parse_datetime("2026-03-29T01:00Z");
  const std::int64_t summer_to = *tw::datetime::parse_datetime("2026-10-25T01:00Z");
  return unix_s >= summer_from && unix_s < summer_to ? 120 : 60;
}
}  // namespace

TEST_CASE("datetime: the offset at a local time follows daylight saving, date by date") {
  using tw::datetime::parse_datetime;
  tw::datetime::ParseOptions p;
  p.zone_offset_minutes = [](std::int64_t local) { return tw::datetime::zone_offset_at_local(local, berlin_offset_2026); };
  CHECK(*parse_datetime("2026-01-15 08:00", p) == *parse_datetime("2026-01-15T07:00Z"));
  CHECK(*parse_datetime("2026-07-15 08:00", p) == *parse_datetime("2026-07-15T06:00Z"));
  // Either side of the change, even within the hour around it (local 01:59 and 03:00).
  CHECK(*parse_datetime("2026-03-29 01:59", p) == *parse_datetime("2026-03-29T00:59Z"));
  CHECK(*parse_datetime("2026-03-29 03:00", p) == *parse_datetime("2026-03-29T01:00Z"));
  CHECK(*parse_datetime("2026-10-25 01:59", p) == *parse_datetime("2026-10-24T23:59Z"));
  CHECK(*parse_datetime("2026-10-25 03:00", p) == *parse_datetime("2026-10-25T02:00Z"));
  // The hour that does not exist and the one that exists twice: one of the two offsets.
  for (const char* t : {"2026-03-29 02:30", "2026-10-25 02:30"}) {
    CAPTURE(t);
    const std::int64_t local = *parse_datetime(std::string(t) + "Z");
    const int off = tw::datetime::zone_offset_at_local(local, berlin_offset_2026);
    CHECK((off == 60 || off == 120));
  }
}

TEST_CASE("datetime: local dates and midnights take each date's own offset across daylight saving") {
  using tw::datetime::parse_datetime;
  const auto at = [](const char* t) { return *parse_datetime(t); };
  const auto date = [](std::int64_t day) {
    const auto c = tw::datetime::civil_from_days(day);
    return std::to_string(c.month) + "-" + std::to_string(c.day);
  };
  // 22:30Z is 23:30 in winter, 00:30 the next day in summer (the offset of the date, not of today).
  CHECK(date(tw::datetime::local_day_of(at("2026-03-28T22:30Z"), berlin_offset_2026)) == "3-28");
  CHECK(date(tw::datetime::local_day_of(at("2026-03-29T22:30Z"), berlin_offset_2026)) == "3-30");
  CHECK(date(tw::datetime::local_day_of(at("2026-10-25T22:30Z"), berlin_offset_2026)) == "10-25");
  // Midnights from 27 to 31 March: 23:00Z until the change, 22:00Z after it.
  const std::vector<std::int64_t> spring = tw::datetime::local_midnights(at("2026-03-27T12:00Z"), at("2026-03-31T12:00Z"), 1, berlin_offset_2026);
  CHECK(spring == std::vector<std::int64_t>{at("2026-03-27T23:00Z"), at("2026-03-28T23:00Z"), at("2026-03-29T22:00Z"),
                                            at("2026-03-30T22:00Z")});
  // Autumn, every second day (day numbers even): back to 23:00Z after 25 October.
  const std::vector<std::int64_t> autumn = tw::datetime::local_midnights(at("2026-10-22T00:00Z"), at("2026-10-29T00:00Z"), 2, berlin_offset_2026);
  REQUIRE(autumn.size() == 3);
  for (std::int64_t t : autumn) CHECK(tw::datetime::local_day_of(t, berlin_offset_2026) % 2 == 0);
  CHECK(autumn[0] == at("2026-10-23T22:00Z"));  // local 24 October
  CHECK(autumn[1] == at("2026-10-25T23:00Z"));  // 26 October, after the change
  CHECK(autumn[2] == at("2026-10-27T23:00Z"));
  // A zone behind UTC and the bounds themselves: a midnight at from_s and at to_s is kept.
  const auto minus5 = [](std::int64_t) { return -300; };
  CHECK(tw::datetime::local_midnights(at("2026-01-01T05:00Z"), at("2026-01-02T05:00Z"), 1, minus5) ==
        std::vector<std::int64_t>{at("2026-01-01T05:00Z"), at("2026-01-02T05:00Z")});
  CHECK(tw::datetime::local_midnights(at("2026-01-02T00:00Z"), at("2026-01-01T00:00Z"), 1, minus5).empty());
}

TEST_CASE("datetime: a column of dates shows its order when one date can be read only one way") {
  using tw::datetime::DateOrder;
  using tw::datetime::infer_date_order;
  CHECK(infer_date_order({"03/04/2026", "25/03/2026"}) == DateOrder::DayMonthYear);
  CHECK(infer_date_order({"03/04/2026", "03/25/2026"}) == DateOrder::MonthDayYear);
  CHECK(infer_date_order({"03/04/2026", "05/06/2026"}) == DateOrder::Unspecified);
  CHECK(infer_date_order({"25/03/2026", "03/25/2026"}) == DateOrder::Unspecified);
  CHECK(infer_date_order({"2026-03-25"}) == DateOrder::Unspecified);
}

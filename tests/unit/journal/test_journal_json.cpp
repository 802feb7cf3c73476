// Journal file format: exact round trip of random journals, v1 -> v2 migration, clear errors.
#include <doctest/doctest.h>

#include <random>

#include "tidewright/common/datetime.hpp"
#include "tidewright/journal/journal_file.hpp"

using namespace tw::journal;

namespace {

// A random but valid journal; every value is drawn inside its accepted range.
Journal random_journal(std::mt19937_64& rng) {
  auto uni = [&](double lo, double hi) { return std::uniform_real_distribution<double>(lo, hi)(rng); };
  auto pick = [&](int n) { return static_cast<int>(std::uniform_int_distribution<int>(0, n - 1)(rng)); };
  auto maybe = [&](double lo, double hi) -> std::optional<double> {
    if (pick(2)) return uni(lo, hi);
    return std::nullopt;
  };
  Journal j;
  if (pick(2)) j.description = "random journal \"quoted\" \xc3\xa9\n";
  const int n_sys = 1 + pick(4);
  for (int i = 0; i < n_sys; ++i) {
    System s;
    s.name = "System " + std::to_string(i) + (pick(2) ? " \xe2\x80\x94 \\ ," : "");
    s.kind = static_cast<SystemKind>(pick(5));
    if (pick(2)) {
      s.volume_parts = VolumeParts{uni(50, 2000), uni(0, 500), uni(0, 40)};
      s.volume_l = net_volume_l(*s.volume_parts);
    } else {
      s.volume_l = uni(1, 5000);
    }
    s.default_salinity = uni(20, 40);
    s.default_temperature_c = uni(10, 30);
    s.units.alkalinity = static_cast<tw::units::AlkalinityUnit>(pick(4));
    s.units.calcium_magnesium = static_cast<tw::units::ConcentrationUnit>(pick(3));
    s.units.temperature = static_cast<TemperatureUnit>(pick(2));
    s.units.ph_scale = static_cast<tw::carbonate::PhScale>(pick(4));
    s.units.volume = static_cast<tw::units::VolumeUnit>(pick(2));
    s.targets = Targets{maybe(6, 12), maybe(380, 480), maybe(1200, 1450)};
    REQUIRE(add_system(j, s).ok());
  }
  const int n_ev = pick(60);
  for (int i = 0; i < n_ev; ++i) {
    const System& sys = j.systems[static_cast<size_t>(pick(n_sys))];
    Event e;
    e.system_id = sys.id;
    e.time_s = std::uniform_int_distribution<std::int64_t>(1600000000, 1900000000)(rng);
    if (pick(3) == 0) e.time_text = "time as typed " + std::to_string(i);
    switch (pick(6)) {
      case 0: {
        TestResult t;
        const Parameter ps[] = {Parameter::Alkalinity, Parameter::Calcium, Parameter::Magnesium,
                                Parameter::PH, Parameter::Temperature, Parameter::Other};
        t.parameter = ps[pick(6)];
        switch (t.parameter) {
          case Parameter::Alkalinity: t.value = uni(5, 12); t.unit = "dKH"; break;
          case Parameter::Calcium: t.value = uni(350, 480); t.unit = "mg/L"; break;
          case Parameter::Magnesium: t.value = uni(50, 55); t.unit = "mmol/kg"; break;
          case Parameter::PH: t.value = uni(7.6, 8.4); t.unit = "pH";
            t.ph_scale = static_cast<tw::carbonate::PhScale>(pick(4)); break;
          case Parameter::Temperature: t.value = uni(70, 84); t.unit = "F"; break;
          default: t.value = uni(-5, 400); t.unit = "mg/L K"; t.other_name = "potassium";
        }
        if (pick(2)) t.precision = uni(0.01, 0.5);
        if (pick(2)) t.kit = "kit " + std::to_string(pick(9));
        e.data = t;
        break;
      }
      case 1:
        e.data = Dose{pick(2) ? "sodium_carbonate" : "calcium_chloride_dihydrate", uni(0.1, 500),
                      DoseUnit::Millilitres, maybe(10, 300)};
        break;
      case 2:
        e.data = WaterChange{uni(0.1, sys.volume_l), maybe(6, 11), maybe(380, 450),
                             maybe(1200, 1400), maybe(30, 36)};
        break;
      case 3:
        e.data = TopOff{uni(0.1, std::min(50.0, sys.volume_l)),
                        pick(2) ? TopOffKind::Plain : TopOffKind::Limewater, std::nullopt};
        break;
      case 4: {
        DoseSchedule d;
        d.device = "pump " + std::to_string(pick(4));
        d.additive_id = pick(2) ? "sodium_carbonate" : "calcium_chloride_dihydrate";
        d.amount = uni(0.5, 20);
        d.stock_g_per_l = maybe(10, 300);
        if (pick(2)) d.stock_name = "stock " + std::to_string(pick(9));
        d.doses_per_day = 1 + pick(24);
        d.calibration = uni(0.8, 1.2);
        if (pick(2)) d.stop_time_s = e.time_s + 1 + pick(1000000);
        e.data = d;
        break;
      }
      default:
        e.data = Note{"note " + std::to_string(i) + " with \"quotes\", commas\nand lines"};
    }
    if (auto* o = std::get_if<TopOff>(&e.data); o && o->kind == TopOffKind::Limewater && pick(2)) {
      o->limewater_g_per_l = uni(0.5, 1.5);
    }
    auto r = add_event(j, e);
    REQUIRE_MESSAGE(r.ok(), r.error().message);
  }
  return j;
}

}  // namespace

TEST_CASE("journal: JSON round trip is exact for random journals (seeded)") {
  std::mt19937_64 rng(20261201);
  for (int round = 0; round < 200; ++round) {
    const Journal j = random_journal(rng);
    const std::string text = serialize_journal(j);
    int version = 0;
    auto back = parse_journal(text, &version);
    REQUIRE_MESSAGE(back.ok(), back.error().message);
    CHECK(version == kSchemaVersion);
    CHECK(*back == j);
    CHECK(serialize_journal(*back) == text);
  }
}

TEST_CASE("journal: single records round trip (what the browser's database stores per record)") {
  std::mt19937_64 rng(20261204);
  for (int round = 0; round < 50; ++round) {
    const Journal j = random_journal(rng);
    for (const System& s : j.systems) {
      auto back = system_from_json(system_to_json(s));
      REQUIRE_MESSAGE(back.ok(), back.error().message);
      CHECK(*back == s);
    }
    for (const Event& e : j.events) {
      auto back = event_from_json(event_to_json(e));
      REQUIRE_MESSAGE(back.ok(), back.error().message);
      CHECK(*back == e);
    }
  }
  auto bad = event_from_json(nlohmann::json{{"id", 1}, {"system_id", 1}, {"time", "yesterday"}, {"type", "note"}, {"text", "x"}});
  REQUIRE_FALSE(bad.ok());
  CHECK(bad.error().message.find("event") != std::string::npos);
}

TEST_CASE("journal: v1 files are migrated to v2") {
  // Version 1 (first draft format): no unit preferences, "salinity"/"temperature_c", integer
  // "time_s", pH without scale, no next_id.
  const std::string v1 = R"({
    "format": "tidewright-journal", "schema_version": 1,
    "systems": [{"id": 1, "name": "Old reef", "kind": "reef_display", "volume_l": 200,
                 "salinity": 34.5, "temperature_c": 25.0,
                 "targets": {"alkalinity_dkh": 8.5}}],
    "events": [
      {"id": 2, "system_id": 1, "time_s": 1780000000, "type": "test", "parameter": "ph",
       "value": 8.15, "unit": "pH"},
      {"id": 3, "system_id": 1, "time_s": 1779990000, "type": "test", "parameter": "alkalinity",
       "value": 8.2, "unit": "dKH", "precision": 0.2}
    ]})";
  int version = 0;
  auto r = parse_journal(v1, &version);
  REQUIRE_MESSAGE(r.ok(), r.error().message);
  CHECK(version == 1);
  const Journal& j = *r;
  REQUIRE(j.systems.size() == 1);
  CHECK(j.systems[0].default_salinity == 34.5);
  CHECK(j.systems[0].units == UnitPreferences{});
  CHECK(j.systems[0].targets.alkalinity_dkh == 8.5);
  CHECK(j.next_id == 4);
  REQUIRE(j.events.size() == 2);
  CHECK(j.events[0].id == 3);  // sorted by time on load
  CHECK(j.events[1].time_s == 1780000000);
  CHECK(std::get<TestResult>(j.events[1].data).ph_scale == tw::carbonate::PhScale::NBS);
  // Written back as the current version and reread identically.
  const std::string v3 = serialize_journal(j);
  CHECK(v3.find("\"schema_version\": 3") != std::string::npos);
  CHECK(v3.find("\"time\": \"2026-05-28T20:26:40Z\"") != std::string::npos);
  CHECK(*parse_journal(v3) == j);
}

TEST_CASE("journal: a v1 file with a member of the wrong type is refused with its path") {
  // Found by fuzz_journal: the v1 migration read "type" and "parameter" with json::value(),
  // which throws on a number, and the exception ended the program.
  for (const char* member : {R"("parameter": 7)", R"("parameter": null)", R"("parameter": ["ph"])"}) {
    const std::string v1 = std::string(R"({
      "format": "tidewright-journal", "schema_version": 1,
      "systems": [{"id": 1, "name": "Old reef", "kind": "reef_display", "volume_l": 200,
                   "salinity": 34.5, "temperature_c": 25.0}],
      "events": [{"id": 2, "system_id": 1, "time_s": 1780000000, "type": "test", )") +
                           member + R"(, "value": 8.15, "unit": "pH"}]})";
    auto r = parse_journal(v1);
    REQUIRE_FALSE(r.ok());
    CHECK(r.error().field.rfind("events[0].parameter", 0) == 0);
  }
  const std::string typed = R"({
    "format": "tidewright-journal", "schema_version": 1,
    "systems": [{"id": 1, "name": "Old reef", "kind": "reef_display", "volume_l": 200,
                 "salinity": 34.5, "temperature_c": 25.0}],
    "events": [{"id": 2, "system_id": 1, "time_s": 1780000000, "type": 3, "parameter": "ph",
                "value": 8.15, "unit": "pH"}]})";
  auto r = parse_journal(typed);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "events[0].type");
}

TEST_CASE("journal: v2 files are migrated to v3 (schedules added, nothing else changes)") {
  const std::string v2 = R"({
    "format": "tidewright-journal", "schema_version": 2, "next_id": 3,
    "systems": [{"id": 1, "name": "Reef", "kind": "reef_display", "volume_l": 200,
                 "default_salinity": 35, "default_temperature_c": 25,
                 "units": {"alkalinity": "dKH", "calcium_magnesium": "mg/L", "temperature": "C",
                           "ph_scale": "nbs", "volume": "L"}}],
    "events": [{"id": 2, "system_id": 1, "time": "2026-11-01T08:00:00Z", "type": "dose",
                "additive": "sodium_carbonate", "amount": 10, "amount_unit": "mL",
                "stock_g_per_l": 80}]})";
  int version = 0;
  auto r = parse_journal(v2, &version);
  REQUIRE_MESSAGE(r.ok(), r.error().message);
  CHECK(version == 2);
  const auto& d = std::get<Dose>(r->events.at(0).data);
  CHECK(d.mark == ScheduleMark::None);
  CHECK_FALSE(d.schedule_id.has_value());
  CHECK(serialize_journal(*r).find("\"schema_version\": 3") != std::string::npos);
  CHECK(*parse_journal(serialize_journal(*r)) == *r);
}

TEST_CASE("journal: damaged and unknown files give clear errors") {
  auto r = parse_journal("{\n  \"format\": \"tidewright-journal\",\n  \"schema_version\": 2,\n  oops\n}");
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "json");
  CHECK(r.error().message.find("line 4") != std::string::npos);

  r = parse_journal("");
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "json");

  r = parse_journal(R"({"format": "something-else", "schema_version": 2})");
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "format");

  r = parse_journal(R"({"format": "tidewright-journal", "schema_version": 7})");
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "schema_version");
  CHECK(r.error().message.find("newer") != std::string::npos);

  Journal j;
  System s;
  s.name = "A";
  s.volume_l = 100;
  const auto sid = *add_system(j, s);
  TestResult t{Parameter::Alkalinity, "", 8.0, "dKH", {}, {}, ""};
  add_event(j, Event{0, sid, 1780000000, "", t});
  std::string text = serialize_journal(j);
  // Out-of-range value edited by hand: the error names the JSON path and the range.
  std::string bad = text;
  bad.replace(bad.find("\"value\": 8.0"), 12, "\"value\": 40.0");
  r = parse_journal(bad);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "events[0].value");
  CHECK(r.error().message.find("0 to 25 dKH") != std::string::npos);
  // Wrong type
  bad = text;
  bad.replace(bad.find("\"value\": 8.0"), 12, "\"value\": \"8\"");
  r = parse_journal(bad);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "events[0].value");
  // Event pointing to no system
  bad = text;
  bad.replace(bad.find("\"system_id\": 1"), 14, "\"system_id\": 9");
  r = parse_journal(bad);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "events[0].system_id");
  // Duplicate id
  bad = text;
  bad.replace(bad.find("\"id\": 2"), 7, "\"id\": 1");
  r = parse_journal(bad);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "events[0].id");
  // next_id too small
  bad = text;
  bad.replace(bad.find("\"next_id\": 3"), 12, "\"next_id\": 2");
  r = parse_journal(bad);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "next_id");
}

TEST_CASE("journal: date-time parsing (ISO 8601 and day/month/year)") {
  using namespace tw::datetime;
  // Hinnant's days_from_civil check values: 1970-01-01 -> 0, 2000-03-01 -> 11017.
  CHECK(days_from_civil(1970, 1, 1) == 0);
  CHECK(days_from_civil(2000, 3, 1) == 11017);
  for (std::int64_t d = -800000; d < 800000; d += 997) {
    const CivilDate c = civil_from_days(d);
    CHECK(days_from_civil(c.year, c.month, c.day) == d);
  }
  // 2026-12-01T00:00:00Z = 1796083200 s (20788 days x 86400; days from the algorithm above,
  // cross-checked with GNU date -d 2026-12-01Z +%s).
  CHECK(*parse_datetime("2026-12-01") == 1796083200);
  CHECK(*parse_datetime("2026-12-01T08:30:15Z") == 1796083200 + 8 * 3600 + 30 * 60 + 15);
  CHECK(*parse_datetime("2026-12-01 08:30") == 1796083200 + 8 * 3600 + 30 * 60);
  CHECK(*parse_datetime("2026-12-01T09:30:00+01:00") == 1796083200 + 8 * 3600 + 30 * 60);
  CHECK(*parse_datetime("2026-12-01T08:30:00.250-0030") == 1796083200 + 9 * 3600);
  CHECK(*parse_datetime("2026/12/01 08:30") == 1796083200 + 8 * 3600 + 30 * 60);
  CHECK(*parse_datetime("@1796083200") == 1796083200);
  ParseOptions dmy{DateOrder::DayMonthYear, 0};
  ParseOptions mdy{DateOrder::MonthDayYear, 0};
  CHECK(*parse_datetime("01/12/2026", dmy) == 1796083200);
  CHECK(*parse_datetime("12/01/2026", mdy) == 1796083200);
  CHECK(*parse_datetime("01.12.2026 08:30", dmy) == 1796083200 + 8 * 3600 + 30 * 60);
  // Unambiguous without an order: 25 can only be a day.
  CHECK(*parse_datetime("25/12/2026") == *parse_datetime("2026-12-25"));
  CHECK(*parse_datetime("12/25/2026") == *parse_datetime("2026-12-25"));
  CHECK(*parse_datetime("05/05/2026") == *parse_datetime("2026-05-05"));
  // Ambiguous: says to choose.
  auto amb = parse_datetime("01/12/2026");
  REQUIRE_FALSE(amb.ok());
  CHECK(amb.error().message.find("dmy") != std::string::npos);
  // Local offset for texts without a zone: 09:00 at UTC+1 is 08:00Z.
  CHECK(*parse_datetime("2026-12-01 09:00", ParseOptions{DateOrder::Unspecified, 60}) ==
        1796083200 + 8 * 3600);
  CHECK_FALSE(parse_datetime("2026-02-29").ok());  // 2026 is not a leap year
  CHECK(parse_datetime("2028-02-29").ok());
  CHECK_FALSE(parse_datetime("2026-13-01").ok());
  CHECK_FALSE(parse_datetime("2026-12-01T25:00").ok());
  CHECK_FALSE(parse_datetime("yesterday").ok());
  CHECK_FALSE(parse_datetime("31/31/2026", dmy).ok());
  CHECK(format_iso8601_utc(1796083200 + 59) == "2026-12-01T00:00:59Z");
  CHECK(format_date_utc(0) == "1970-01-01");
}

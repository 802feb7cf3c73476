// Journal model: validation with typed errors, editing by id, canonical units.
#include <doctest/doctest.h>

#include "tidewright/common/ranges.hpp"
#include "tidewright/journal/journal.hpp"

using namespace tw::journal;

namespace {

System reef() {
  System s;
  s.name = "Test reef";
  s.volume_l = 380;
  s.targets.alkalinity_dkh = 8.0;
  return s;
}

Event test_event(SystemId sys, std::int64_t t, Parameter p, double v, const std::string& unit) {
  TestResult r;
  r.parameter = p;
  r.value = v;
  r.unit = unit;
  if (p == Parameter::PH) r.ph_scale = tw::carbonate::PhScale::NBS;
  return Event{0, sys, t, "", r};
}

}  // namespace

TEST_CASE("journal: systems are validated and named uniquely") {
  Journal j;
  auto id = add_system(j, reef());
  REQUIRE(id.ok());
  CHECK(*id == 1);
  CHECK(j.next_id == 2);

  System dup = reef();
  dup.name = "TEST REEF";
  auto r = add_system(j, dup);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "name");

  System bad = reef();
  bad.name = "Other";
  bad.volume_l = -5;
  r = add_system(j, bad);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "volume_l");
  CHECK(r.error().message.find("0.1 to") != std::string::npos);

  bad.volume_l = 300;
  bad.volume_parts = VolumeParts{300, 100, 20};  // net 380, does not match 300
  r = add_system(j, bad);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "volume_l");
  bad.volume_l = net_volume_l(*bad.volume_parts);
  CHECK(add_system(j, bad).ok());
  CHECK(j.systems.size() == 2);
}

TEST_CASE("journal: implausible test results are refused with field and range") {
  Journal j;
  const SystemId sys = *add_system(j, reef());
  const Journal before = j;

  // design.md names these as refusals: pH 3, alkalinity 40 dKH; Ca outside 0-1000 mg/L.
  auto r = add_event(j, test_event(sys, 1000, Parameter::PH, 3.0, "pH"));
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "value");
  CHECK(r.error().message.find("6 to 10") != std::string::npos);

  r = add_event(j, test_event(sys, 1000, Parameter::Alkalinity, 40.0, "dKH"));
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().message.find("0 to 25 dKH") != std::string::npos);

  // 40 meq/L = 112 dKH: the range is checked after conversion to dKH.
  r = add_event(j, test_event(sys, 1000, Parameter::Alkalinity, 40.0, "meq/L"));
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "value");

  r = add_event(j, test_event(sys, 1000, Parameter::Calcium, 1200.0, "mg/L"));
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().message.find("0 to 1000 mg/L") != std::string::npos);

  r = add_event(j, test_event(sys, 1000, Parameter::Calcium, 420.0, "ppm"));  // not normalised
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "unit");

  r = add_event(j, test_event(sys, 1000, Parameter::Calcium, 420.0, "dKH"));
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "unit");

  auto no_scale = test_event(sys, 1000, Parameter::PH, 8.1, "pH");
  std::get<TestResult>(no_scale.data).ph_scale.reset();
  r = add_event(j, no_scale);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "ph_scale");

  auto neg_prec = test_event(sys, 1000, Parameter::Alkalinity, 8.0, "dKH");
  std::get<TestResult>(neg_prec.data).precision = -0.1;
  r = add_event(j, neg_prec);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "precision");

  r = add_event(j, test_event(99, 1000, Parameter::Alkalinity, 8.0, "dKH"));
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "system_id");

  r = add_event(j, test_event(sys, -1, Parameter::Alkalinity, 8.0, "dKH"));
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "time");

  CHECK(j == before);  // nothing changed by any refused event
}

TEST_CASE("journal: doses, water changes and top-offs are validated") {
  Journal j;
  const SystemId sys = *add_system(j, reef());
  auto dose = Event{0, sys, 100, "", Dose{"sodium_carbonate", 0.0, DoseUnit::Grams, {}}};
  auto r = add_event(j, dose);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "amount");
  std::get<Dose>(dose.data).amount = 12.5;
  std::get<Dose>(dose.data).stock_g_per_l = 100;  // stock strength only for mL doses
  r = add_event(j, dose);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "stock_g_per_l");
  std::get<Dose>(dose.data).unit = DoseUnit::Millilitres;
  CHECK(add_event(j, dose).ok());

  auto wc = Event{0, sys, 200, "", WaterChange{-10.0, 8.0, 420.0, 1300.0, 35.0}};
  r = add_event(j, wc);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "volume_l");
  std::get<WaterChange>(wc.data).volume_l = 500;  // more than the 380 L system holds
  r = add_event(j, wc);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().message.find("380") != std::string::npos);
  std::get<WaterChange>(wc.data).volume_l = 38;
  std::get<WaterChange>(wc.data).salinity = 50;
  r = add_event(j, wc);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "salinity");
  std::get<WaterChange>(wc.data).salinity = 35;
  CHECK(add_event(j, wc).ok());

  auto top = Event{0, sys, 300, "", TopOff{4.0, TopOffKind::Plain, 1.2}};
  r = add_event(j, top);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "limewater_g_per_l");
  std::get<TopOff>(top.data).kind = TopOffKind::Limewater;
  std::get<TopOff>(top.data).limewater_g_per_l = 5.0;  // above saturation
  r = add_event(j, top);
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "limewater_g_per_l");
  std::get<TopOff>(top.data).limewater_g_per_l.reset();  // saturated
  CHECK(add_event(j, top).ok());

  r = add_event(j, Event{0, sys, 400, "", Note{""}});
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "text");
  // Text must be UTF-8 (the file is JSON text); a stray byte from a foreign spreadsheet is refused.
  r = add_event(j, Event{0, sys, 400, "", Note{"bad \xff byte"}});
  REQUIRE_FALSE(r.ok());
  CHECK(r.error().field == "text");
  CHECK_FALSE(add_event(j, Event{0, sys, 400, "\xc3", Note{"cut-off sequence in time_text"}}).ok());
  CHECK(add_event(j, Event{0, sys, 400, "", Note{"fed frozen mysis \xc3\xa9\xe2\x80\x94"}}).ok());
  CHECK(j.events.size() == 4);
}

TEST_CASE("journal: editing and removing events and systems by id") {
  Journal j;
  const SystemId a = *add_system(j, reef());
  System b_sys = reef();
  b_sys.name = "Frag tank";
  b_sys.volume_l = 100;
  const SystemId b = *add_system(j, b_sys);
  const EventId e1 = *add_event(j, test_event(a, 500, Parameter::Alkalinity, 8.1, "dKH"));
  const EventId e2 = *add_event(j, test_event(a, 100, Parameter::Calcium, 420, "mg/L"));
  const EventId e3 = *add_event(j, Event{0, b, 300, "", WaterChange{50, {}, {}, {}, {}}});
  // sorted by time
  REQUIRE(j.events.size() == 3);
  CHECK(j.events[0].id == e2);
  CHECK(j.events[1].id == e3);
  CHECK(j.events[2].id == e1);

  // Move e1 earlier in time: it is re-sorted.
  Event edit = *find_event(j, e1);
  edit.time_s = 50;
  std::get<TestResult>(edit.data).value = 8.3;
  REQUIRE(update_event(j, edit).ok());
  CHECK(j.events[0].id == e1);
  CHECK(std::get<TestResult>(j.events[0].data).value == 8.3);

  // An invalid edit changes nothing.
  const Journal before = j;
  std::get<TestResult>(edit.data).value = 40;
  CHECK_FALSE(update_event(j, edit).ok());
  edit.id = 999;
  CHECK(update_event(j, edit).error().field == "id");
  CHECK(j == before);

  // Shrinking system b below its logged 50 L water change is refused.
  System smaller = *find_system(j, b);
  smaller.volume_l = 40;
  auto st = update_system(j, smaller);
  REQUIRE_FALSE(st.ok());
  CHECK(st.error().field == "volume_l");
  smaller.volume_l = 60;
  smaller.name = "Frag tank 2";
  CHECK(update_system(j, smaller).ok());
  CHECK(find_system_by_name(j, "frag TANK 2") != nullptr);

  // A system with events is removed only together with them.
  CHECK_FALSE(remove_system(j, b).ok());
  CHECK(remove_system(j, b, true).ok());
  CHECK(j.events.size() == 2);
  CHECK(remove_event(j, e2).ok());
  CHECK_FALSE(remove_event(j, e2).ok());
  CHECK(j.events.size() == 1);

  // Filters
  add_event(j, test_event(a, 1000, Parameter::Calcium, 430, "mg/L"));
  EventFilter f;
  f.parameter = Parameter::Calcium;
  CHECK(select_events(j, f).size() == 1);
  f = EventFilter{};
  f.from_s = 60;
  CHECK(select_events(j, f).size() == 1);
}

TEST_CASE("journal: canonical values convert units") {
  // 1 dKH = 0.35665 meq/L (facts.md 5, ChemLin "Deutscher Haertegrad" with IUPAC weights).
  CHECK(*canonical_value(Parameter::Alkalinity, 0.35665, "meq/L") == doctest::Approx(1.0).epsilon(1e-4));
  // 1 dKH = 17.848 mg/L as CaCO3 (facts.md 5).
  CHECK(*canonical_value(Parameter::Alkalinity, 17.848, "mg/L CaCO3") == doctest::Approx(1.0).epsilon(1e-4));
  // 77 F = 25 C (definition of the Fahrenheit scale).
  CHECK(*canonical_value(Parameter::Temperature, 77.0, "F") == doctest::Approx(25.0));
  TestResult t{Parameter::Temperature, "", 77.0, "F", 0.9, {}, ""};
  CHECK(*canonical_precision(t) == doctest::Approx(0.5));
  // 10.287 mmol/kg Ca at S=35 is 412.1 mg/kg (facts.md 9, Millero et al. 2008); per litre
  // multiply by the density 1.02334 kg/L (facts.md 4).
  CHECK(*canonical_value(Parameter::Calcium, 10.2821, "mmol/kg", 1.02334) ==
        doctest::Approx(412.1 * 1.02334).epsilon(1e-3));
  CHECK(*normalize_unit(Parameter::Calcium, "ppm") == "mg/L");
  CHECK(*normalize_unit(Parameter::Salinity, "ppt") == "psu");
  CHECK_FALSE(normalize_unit(Parameter::PH, "dKH").ok());
}

TEST_CASE("journal: an entry may be dated up to ten minutes after now, not later") {
  const std::int64_t now = 1796083200;  // 2026-12-01T00:00:00Z
  CHECK(check_not_in_future(now - 86400, now));
  CHECK(check_not_in_future(now, now));
  CHECK(check_not_in_future(now + kFutureSlackS, now));
  const tw::Status late = check_not_in_future(now + kFutureSlackS + 1, now);
  REQUIRE_FALSE(late);
  CHECK(late.error().field == "time");
  CHECK(late.error().message.find("2026-12-01T00:10:01Z is in the future") != std::string::npos);
  CHECK(late.error().message.find("10 minutes") != std::string::npos);
}

TEST_CASE("journal: the accepted range in the unit a keeper types") {
  // 0..25 dKH (ranges::kAlkalinityDkh) in meq/L: 25 x 0.35665 = 8.916 (facts.md 5).
  auto alk = accepted_in_unit(Parameter::Alkalinity, "meq/L");
  REQUIRE(alk.ok());
  CHECK(alk->lo == doctest::Approx(0.0));
  CHECK(alk->hi == doctest::Approx(25 * 0.35665).epsilon(1e-4));
  // -2..40 C (EOS-80's validity) in F: 28.4..104 (definition of the Fahrenheit scale).
  auto t = accepted_in_unit(Parameter::Temperature, "F");
  REQUIRE(t.ok());
  CHECK(t->lo == doctest::Approx(28.4));
  CHECK(t->hi == doctest::Approx(104.0));
  // The canonical unit gives the table's range unchanged.
  auto ca = accepted_in_unit(Parameter::Calcium, "mg/L");
  REQUIRE(ca.ok());
  CHECK(ca->hi == doctest::Approx(tw::ranges::kCalciumMgL.hi));
  CHECK_FALSE(accepted_in_unit(Parameter::Alkalinity, "furlongs").ok());
}

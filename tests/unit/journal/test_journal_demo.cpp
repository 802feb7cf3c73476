// The invented demo journal (assets/demo/demo_journal.json) loads, is valid, and is written
// back byte for byte by the serializer (so the app can re-save it without noise).
#include <doctest/doctest.h>

#include <fstream>
#include <sstream>
#include <string>

#include "tidewright/journal/journal_csv.hpp"
#include "tidewright/journal/journal_file.hpp"

using namespace tw::journal;

namespace {
std::string demo_text() {
  std::string here = __FILE__;  // .../tests/unit/<area>/test_journal_demo.cpp
  const std::string root = here.substr(0, here.rfind("/tests/"));
  std::ifstream in(root + "/assets/demo/demo_journal.json", std::ios::binary);
  REQUIRE_MESSAGE(in.good(), "assets/demo/demo_journal.json not found from " << root);
  std::ostringstream s;
  s << in.rdbuf();
  return s.str();
}
}  // namespace

TEST_CASE("journal: the demo file loads") {
  const std::string text = demo_text();
  int version = 0;
  auto r = parse_journal(text, &version);
  REQUIRE_MESSAGE(r.ok(), r.error().message);
  CHECK(version == kSchemaVersion);
  const Journal& j = *r;
  REQUIRE(j.systems.size() == 3);
  CHECK(j.systems[0].name == "Living room reef");
  CHECK(j.systems[0].volume_l == 380.0);
  CHECK(j.systems[0].targets.alkalinity_dkh == 8.0);
  CHECK(j.systems[1].name == "Grow-out rack 1");
  CHECK(j.systems[1].volume_l == 1150.0);
  CHECK(j.systems[2].name == "Larval culture C");
  CHECK(j.systems[2].kind == SystemKind::ShellfishLarvalCulture);
  CHECK(j.description.find("INVENTED") != std::string::npos);
  CHECK(j.events.size() > 800);
  // The reef's pumps run on standing schedules (changed every 14 days), one dose marked missed.
  std::size_t schedules = 0, marked = 0, exportable = 0;
  for (const auto& e : j.events) {
    if (std::holds_alternative<DoseSchedule>(e.data) && e.system_id == 1) ++schedules;
    if (const auto* d = std::get_if<Dose>(&e.data); d && d->mark == ScheduleMark::Missed) ++marked;
    if (csv_exportable(e)) ++exportable;
  }
  CHECK(schedules >= 8);
  CHECK(marked == 1);
  EventFilter alk;
  alk.system_id = 1;
  alk.parameter = Parameter::Alkalinity;
  CHECK(select_events(j, alk).size() > 40);  // ~120 days, every 1-3 days
  CHECK(serialize_journal(j) == text);
  // CSV export of the whole demo re-imports into an empty copy without a rejected row.
  Journal copy = j;
  copy.events.clear();
  auto imp = import_csv(copy, export_csv(j));
  REQUIRE(imp.ok());
  CHECK(imp->rejected.empty());
  CHECK(copy.events.size() == exportable);
}

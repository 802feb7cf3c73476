// Plan text in and out: JSON plan input (fields and errors), CSV rows (RFC 4180), iCalendar
// line folding and alarms, plain text naming the pH scale and the limit sources.
#include <doctest/doctest.h>

#include <algorithm>
#include <string>
#include <vector>

#include "tidewright/common/csv.hpp"
#include "tidewright/plan/plan.hpp"

using namespace tw::plan;

namespace {
const char* kInput = R"({
  "system": {"name": "Test, tank", "volume_l": 200, "salinity": 35, "temperature_c": 25, "alkalinity_dkh": 7.5,
             "calcium_mg_l": 410, "magnesium_mg_l": 1300},
  "demand": {"alkalinity_meq_per_day": 40, "calcium_mg_per_day": 800},
  "additives": [
    {"stock": {"name": "alk", "ingredients": [{"compound": "sodium_carbonate", "grams_per_l": 100}]},
     "doses_per_day": 4, "max_dose": 30},
    {"compound": "calcium_chloride_dihydrate", "device": "hand", "doses_per_day": 1, "max_dose": 20}
  ],
  "limits": {"alkalinity_rise_dkh_per_day": 0.5},
  "horizon_days": 3
})";
}

TEST_CASE("plan: JSON input reads fields, limits and additives; errors name the field") {
  auto in = plan_input_from_json(kInput);
  REQUIRE(in.ok());
  CHECK(in->system.volume_l == 200);
  CHECK(in->deliveries.size() == 2);
  CHECK(in->deliveries[1].manual);  // hand doses get reminders
  CHECK(in->limits.get(LimitId::AlkalinityRisePerDay) == 0.5);
  const std::string sys = R"("system": {"volume_l": 100, "salinity": 35, "temperature_c": 25, "alkalinity_dkh": 8, "calcium_mg_l": 420, "magnesium_mg_l": 1300})";
  auto bad = plan_input_from_json("{" + sys + R"(, "additives": [{"compound": "unobtainium"}]})");
  REQUIRE(!bad.ok());
  CHECK(bad.error().field == "additives[0].compound");
  auto over = plan_input_from_json("{" + sys + R"(, "additives": [{"compound": "sodium_carbonate"}], "limits": {"omega_aragonite_after_dose": 9}})");
  REQUIRE(!over.ok());
  CHECK(over.error().field == "limits.omega_aragonite_after_dose");
  CHECK_FALSE(plan_input_from_json("not json").ok());
}

TEST_CASE("plan: CSV, iCalendar and text exports") {
  auto in = plan_input_from_json(kInput);
  REQUIRE(in.ok());
  auto plan = make_plan(*in);
  REQUIRE(plan.ok());
  auto rows = tw::csv::parse(plan_to_csv(*in, *plan));
  REQUIRE(rows.ok());
  CHECK(rows->size() == plan->doses.size() + 1);
  CHECK(rows->front().cells.front() == "day");
  auto ics = plan_to_icalendar(*in, *plan, "20261201T120000Z", IcsDoses::All);
  REQUIRE(ics.ok());
  std::size_t pos = 0, events = 0, alarms = 0, longest = 0;
  while (pos < ics->size()) {
    const std::size_t end = ics->find("\r\n", pos);
    REQUIRE(end != std::string::npos);  // every line ends in CRLF
    const std::string line = ics->substr(pos, end - pos);
    longest = std::max(longest, line.size());
    events += line == "BEGIN:VEVENT";
    alarms += line == "BEGIN:VALARM";
    pos = end + 2;
  }
  CHECK(longest <= 75);
  CHECK(events == plan->doses.size());
  std::size_t hand = 0;
  for (const auto& d : plan->doses) hand += in->deliveries[d.delivery].manual ? 1 : 0;
  CHECK(alarms == hand);
  CHECK(ics->find("Test\\, tank") != std::string::npos);  // TEXT escaping (RFC 5545 3.3.11)
  CHECK_FALSE(plan_to_icalendar(*in, *plan, "now").ok());
  const std::string text = plan_to_text(*in, *plan);
  CHECK(text.find("TOTAL scale") != std::string::npos);
  CHECK(text.find("Moras") != std::string::npos);
  const std::string json = plan_to_json(*in, *plan);
  CHECK(json.find("\"ph_scale\": \"total\"") != std::string::npos);
}

TEST_CASE("plan: iCalendar of hand doses by default; UIDs differ between systems; folding keeps 75 octets") {
  auto in = plan_input_from_json(kInput);
  REQUIRE(in.ok());
  auto plan = make_plan(*in);
  REQUIRE(plan.ok());
  std::size_t hand = 0;
  for (const auto& d : plan->doses) hand += in->deliveries[d.delivery].manual ? 1 : 0;
  auto count = [](const std::string& text, const std::string& what) {
    std::size_t n = 0;
    for (std::size_t p = text.find(what); p != std::string::npos; p = text.find(what, p + 1)) ++n;
    return n;
  };
  auto hand_only = plan_to_icalendar(*in, *plan, "20261201T120000Z");
  REQUIRE(hand_only.ok());
  CHECK(count(*hand_only, "BEGIN:VEVENT") == hand);
  CHECK(count(*hand_only, "BEGIN:VALARM") == hand);
  CHECK(hand < plan->doses.size());  // the pump's doses are left out
  // Two systems with the same plan: no UID in common.
  PlanInput other = *in;
  other.system.name = "Frag rack";
  auto a = plan_to_icalendar(*in, *plan, "20261201T120000Z", IcsDoses::All);
  auto b = plan_to_icalendar(other, *plan, "20261201T120000Z", IcsDoses::All);
  REQUIRE(a.ok());
  REQUIRE(b.ok());
  auto uids = [](const std::string& text) {
    std::vector<std::string> out;
    for (std::size_t p = text.find("UID:"); p != std::string::npos; p = text.find("UID:", p + 1))
      out.push_back(text.substr(p, text.find("\r\n", p) - p));
    return out;
  };
  const std::vector<std::string> uids_a = uids(*a), uids_b = uids(*b);
  REQUIRE(uids_a.size() == plan->doses.size());
  for (const auto& u : uids_a) CHECK(std::find(uids_b.begin(), uids_b.end(), u) == uids_b.end());
  // A name of two-octet characters (e with acute, C3 A9) at every offset: no line over 75 octets,
  // no character split across a fold.
  for (int pad = 0; pad < 4; ++pad) {
    PlanInput accented = *in;
    accented.system.name = std::string(static_cast<std::size_t>(pad), 'x');
    for (int k = 0; k < 60; ++k) accented.system.name += "\xc3\xa9";
    auto ics = plan_to_icalendar(accented, *plan, "20261201T120000Z");
    REQUIRE(ics.ok());
    std::size_t pos = 0;
    while (pos < ics->size()) {
      const std::size_t end = ics->find("\r\n", pos);
      REQUIRE(end != std::string::npos);
      const std::string line = ics->substr(pos, end - pos);
      CHECK(line.size() <= 75);
      if (!line.empty()) CHECK((static_cast<unsigned char>(line.back()) & 0xE0) != 0xC0);  // no dangling lead octet
      pos = end + 2;
    }
  }
}

// A pump's calibration in the plan (Delivery::calibration): the plan's doses stay what reaches
// the tank, the amount to set on the pump is dose / calibration, the pump's own settings
// (min_dose, max_dose, max_per_day) bound the set amount, and adopting the plan writes the set
// amount and the calibration so the journal assumes the plan's doses.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <string>

#include "tidewright/journal/schedule.hpp"
#include "tidewright/plan/plan.hpp"
#include "tidewright/plan/plan_adopt.hpp"

using namespace tw;
using namespace tw::plan;

namespace {

// A 380 L reef below its alkalinity target, one soda ash pump and one calcium chloride pump.
std::string input_json(double calibration, double max_dose) {
  return R"({"system": {"volume_l": 380, "salinity": 35, "temperature_c": 25.5, "alkalinity_dkh": 7.2,
                        "calcium_mg_l": 410, "magnesium_mg_l": 1320},
             "demand": {"alkalinity_meq_per_day": 60, "calcium_mg_per_day": 1100},
             "additives": [
               {"stock": {"name": "soda ash 80", "ingredients": [{"compound": "sodium_carbonate", "grams_per_l": 80}]},
                "device": "alk doser", "doses_per_day": 8, "max_dose": )" +
         std::to_string(max_dose) + R"(, "calibration": )" + std::to_string(calibration) + R"(},
               {"stock": {"name": "CaCl2 200", "ingredients": [{"compound": "calcium_chloride_dihydrate", "grams_per_l": 200}]},
                "device": "ca doser", "doses_per_day": 8, "max_dose": 40}],
             "horizon_days": 6})";
}

PlanInput read(double calibration, double max_dose = 60) {
  auto in = plan_input_from_json(input_json(calibration, max_dose));
  REQUIRE_MESSAGE(in.ok(), in.error().message);
  return *in;
}

double alkalinity_doses_of_day(const Plan& p, int day) {
  double sum = 0;
  for (const DoseRecord& r : p.doses) {
    if (r.day == day && r.delivery == 0) sum += r.amount;
  }
  return sum;
}

constexpr std::int64_t kDay1 = 1785542400;  // 2026-08-01T00:00:00Z

}  // namespace

TEST_CASE("pump calibration: the doses reaching the tank are the same, the amount to set is dose / calibration") {
  const PlanInput true_pump = read(1.0);
  const PlanInput weak_pump = read(0.9);
  auto a = make_plan(true_pump);
  auto b = make_plan(weak_pump);
  REQUIRE_MESSAGE(a.ok(), a.error().message);
  REQUIRE_MESSAGE(b.ok(), b.error().message);
  REQUIRE(a->doses.size() == b->doses.size());
  REQUIRE(!a->doses.empty());
  for (std::size_t i = 0; i < a->doses.size(); ++i) {
    CAPTURE(i);
    CHECK(b->doses[i].amount == doctest::Approx(a->doses[i].amount));
    const Delivery& d = weak_pump.deliveries[b->doses[i].delivery];
    const double expected_set = b->doses[i].delivery == 0 ? a->doses[i].amount / 0.9 : a->doses[i].amount;
    CHECK(d.set_amount(b->doses[i].amount) == doctest::Approx(expected_set));
  }
  // The independent checker replays what reaches the tank: the same water either way.
  const CheckReport ca = check_plan(true_pump, *a);
  const CheckReport cb = check_plan(weak_pump, *b);
  CHECK(ca.ok());
  CHECK(cb.ok());
  REQUIRE(ca.day_end.size() == cb.day_end.size());
  for (std::size_t k = 0; k < ca.day_end.size(); ++k) {
    CHECK(cb.day_end[k].alkalinity_dkh == doctest::Approx(ca.day_end[k].alkalinity_dkh));
    CHECK(cb.day_end[k].ph_total == doctest::Approx(ca.day_end[k].ph_total));
  }
  // The outputs add what to set; the existing columns keep their meaning.
  const std::string csv = plan_to_csv(weak_pump, *b);
  CHECK(csv.find("omega_aragonite_before_next,amount_set\r\n") != std::string::npos);
  const DoseRecord& first_alk = *std::find_if(b->doses.begin(), b->doses.end(), [](const DoseRecord& r) { return r.delivery == 0; });
  char row_end[64];
  std::snprintf(row_end, sizeof row_end, ",%.3f\r\n", first_alk.amount / 0.9);
  CHECK(csv.find(row_end) != std::string::npos);
  const std::string json = plan_to_json(weak_pump, *b);
  CHECK(json.find("\"amount_set\"") != std::string::npos);
  CHECK(json.find("\"calibration\": 0.9") != std::string::npos);  // in the input it carries
  const std::string text = plan_to_text(weak_pump, *b);
  CHECK(text.find("set on alk doser (mL)") != std::string::npos);
  CHECK(plan_to_text(true_pump, *a).find("set on") == std::string::npos);
}

TEST_CASE("pump calibration: the pump's largest dose bounds the amount set, not what it delivers") {
  // A largest setting of 6 mL holds the ramp back; at calibration 0.9 the pump then gives 5.4 mL.
  const PlanInput weak_pump = read(0.9, 6);
  auto p = make_plan(weak_pump);
  REQUIRE_MESSAGE(p.ok(), p.error().message);
  double largest = 0;
  for (const DoseRecord& r : p->doses) {
    if (r.delivery == 0) largest = std::max(largest, r.amount);
  }
  CHECK(largest <= 6 * 0.9 + 1e-9);
  CHECK(largest >= 6 * 0.9 - 0.01);  // the ramp wants more than the pump gives at its largest setting
  CHECK(weak_pump.deliveries[0].set_amount(largest) <= 6 * (1 + 1e-12));
  CHECK(check_plan(weak_pump, *p).ok());
  // A dose list that sets the pump above its largest setting is caught by the checker.
  std::vector<PlannedDose> doses{{1, p->doses.front().minute, 0, 6.0}};  // 6 mL delivered = 6.67 mL set
  for (const DoseRecord& r : p->doses) {
    if (r.delivery == 0) {
      doses[0].minute = r.minute;
      break;
    }
  }
  const CheckReport bad = check_doses(weak_pump, doses);
  CHECK_FALSE(bad.other.empty());
  CHECK((bad.other.empty() ? std::string() : bad.other.front()).find("outside the pump's") != std::string::npos);
}

TEST_CASE("pump calibration: adopting writes the set amount and the calibration; the journal assumes the plan's doses") {
  const PlanInput in = read(0.9);
  auto p = make_plan(in);
  REQUIRE_MESSAGE(p.ok(), p.error().message);
  journal::Journal j;
  journal::System s;
  s.name = "Reef";
  s.volume_l = 380;
  const journal::SystemId sys = *journal::add_system(j, s);
  auto ids = adopt_plan(j, sys, in, *p, kDay1);
  REQUIRE_MESSAGE(ids.ok(), ids.error().message);
  auto adopted = schedules_from_plan(in, *p, kDay1);
  REQUIRE(adopted.ok());
  bool saw_alkalinity = false;
  for (const AdoptedSchedule& a : *adopted) {
    if (a.delivery != 0) {
      CHECK(a.schedule.calibration == 1.0);
      continue;
    }
    saw_alkalinity = true;
    CHECK(a.schedule.device == "alk doser");
    CHECK(a.schedule.calibration == 0.9);
  }
  CHECK(saw_alkalinity);
  // Day by day, the journal's doses (set x calibration) are the plan's, within half a pump step
  // (0.05 mL) x calibration per dose.
  for (const DaySummary& day : p->days) {
    CAPTURE(day.day);
    const std::int64_t from = kDay1 + static_cast<std::int64_t>(day.day - 1) * 86400;
    double assumed = 0;
    int count = 0;
    for (const journal::ScheduledDose& d : journal::scheduled_doses(j, sys, from, from + 86400 - 1)) {
      if (d.dose.additive_id != "sodium_carbonate") continue;
      assumed += d.dose.amount;
      ++count;
      // Each schedule's set amount is the plan's dose / 0.9, on the 0.1 mL step.
      const double set = std::get<journal::DoseSchedule>(journal::find_event(j, d.schedule_id)->data).amount;
      CHECK(std::abs(set * 10 - std::round(set * 10)) < 1e-9);
    }
    CHECK(std::abs(assumed - alkalinity_doses_of_day(*p, day.day)) <= count * 0.05 * 0.9 + 1e-9);
  }
  // A plan made again later finds the pump by the additive it gives: its name and calibration.
  const auto pump = scheduled_pump_for(j, sys, in.deliveries[0].additive, kDay1 + 3 * 86400);
  REQUIRE(pump.has_value());
  CHECK(pump->device == "alk doser");
  CHECK(pump->calibration == 0.9);
  // Adopted for tomorrow: the pump is known before its first dose too.
  CHECK(scheduled_pump_for(j, sys, in.deliveries[0].additive, kDay1 - 86400).has_value());
  const auto bicarbonate = additives::additive_from_compound(additives::CompoundId::SodiumBicarbonate);
  CHECK_FALSE(scheduled_pump_for(j, sys, bicarbonate, kDay1).has_value());
}

TEST_CASE("pump calibration: out of its range it is refused, naming the field and the range") {
  auto from_file = plan_input_from_json(input_json(2.0, 60));
  REQUIRE_FALSE(from_file.ok());
  CHECK(from_file.error().field == "additives[0].calibration");
  CHECK(from_file.error().message.find("0.5") != std::string::npos);
  CHECK(from_file.error().message.find("1.5") != std::string::npos);
  PlanInput in = read(1.0);
  in.deliveries[1].calibration = 0.3;
  auto p = make_plan(in);
  REQUIRE_FALSE(p.ok());
  CHECK(p.error().field == "additives[1].calibration");
  CHECK(p.error().message.find("0.5") != std::string::npos);
}

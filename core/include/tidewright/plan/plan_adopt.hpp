// Adopting a dose plan: its doses become the system's standing dose schedules in the journal
// (journal/schedule.hpp), so "what I was told to dose" and "what the journal assumes" are the
// same. Each delivery (pump or hand routine) becomes one schedule per run of days with the same
// daily amount; the last one runs until changed. The pumps' earlier schedules stop where the
// plan starts.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "tidewright/common/result.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/plan/plan.hpp"

namespace tw::plan {

struct AdoptedSchedule {
  std::size_t delivery = 0;     // index into PlanInput::deliveries
  std::int64_t start_s = 0;     // the first dose of its run of days
  journal::DoseSchedule schedule;  // stop set when a later run follows
};

// The journal's name for what a delivery gives: catalog compound by the gram, a stock of one
// compound by the mL (with its strength in g/L worked back from its chemistry), or saturated
// limewater by the mL. Errors (field "additive") for products known only by their label or
// stocks of several compounds, which a schedule cannot name.
struct DeliveryRecipe {
  std::string additive_id;
  journal::DoseUnit unit = journal::DoseUnit::Millilitres;
  std::optional<double> stock_g_per_l;
};
Result<DeliveryRecipe> recipe_of(const additives::Additive& additive);

// The pump that a schedule of the system gives this additive with (the same journal additive
// id as recipe_of names, whatever the stock's strength): its name and calibration. The schedule
// running at now_s (the latest started), else the first that starts later (a plan adopted for
// tomorrow); none when every such schedule has stopped. The app's Plan screen takes a pump the
// keeper has not named from here, so a plan adopted again keeps the pump's name and calibration.
struct ScheduledPump {
  std::string device;
  double calibration = 1.0;
  int doses_per_day = 1;      // the schedule's program: doses a day and the amount SET per dose
  double amount = 0;          // (mL or g, journal::DoseSchedule::amount)
  std::optional<double> stock_g_per_l;  // its stock's strength (mL doses)
};
std::optional<ScheduledPump> scheduled_pump_for(const journal::Journal& journal, journal::SystemId system,
                                                const additives::Additive& additive, std::int64_t now_s);

// The plan's doses as schedules. day1_start_s: day 1 of the plan at 00:00 in the keeper's
// time (UTC seconds). Each schedule's amount is what to SET on the pump (the plan's dose /
// the delivery's calibration), rounded to 0.1 mL or 0.01 g (a pump's step), and it carries the
// calibration, so the journal's assumed doses (set x calibration) are the plan's.
Result<std::vector<AdoptedSchedule>> schedules_from_plan(const PlanInput& input, const Plan& plan,
                                                         std::int64_t day1_start_s);

// Writes them into the journal for the system: every schedule of the system running at the
// plan's first dose that has the same device name or gives the same additive stops there, and
// such schedules that start later (runs of a plan adopted before, not begun yet) are removed;
// then the new schedules start. All or nothing. Returns the new schedules' ids.
Result<std::vector<journal::EventId>> adopt_plan(journal::Journal& journal, journal::SystemId system,
                                                 const PlanInput& input, const Plan& plan,
                                                 std::int64_t day1_start_s);

}  // namespace tw::plan

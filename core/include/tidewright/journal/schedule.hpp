// Standing dose schedules of the journal (journal.hpp DoseSchedule): starting, changing and
// stopping them, which ones run at a time, and the doses they gave over a span of time with
// the logged "missed" and "extra" marks applied. No chemistry here: the estimate's journal
// adapter turns each dose into its effect on the water.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "tidewright/common/result.hpp"
#include "tidewright/journal/journal.hpp"

namespace tw::journal {

// Seconds between two doses of a schedule: 86400 / doses_per_day, rounded to the second.
std::int64_t dose_interval_s(const DoseSchedule& schedule);

// The schedule as one logged dose of `amount` (as set) would read, with the pump's
// calibration applied: additive, unit and stock of the schedule, amount x calibration.
Dose delivered_dose(const DoseSchedule& schedule, double amount_as_set);

// One line for lists and logs: "pump 1: 47.5 mL x 2 a day of Sodium carbonate (soda ash),
// stock soda ash 80 g/L, calibration 1.03" (the compound by its catalog name; the strength
// unless the stock's name already says it). Times are the caller's to add (they choose the zone).
std::string schedule_summary(const DoseSchedule& schedule);

// Starts a schedule at start_s (an event of the journal). Returns its id.
Result<EventId> start_schedule(Journal& journal, SystemId system, std::int64_t start_s,
                               DoseSchedule schedule);
// Stops a running schedule at stop_s (after its start, before any later stop). Errors: field
// "id" when it is not a schedule, "stop" for a time outside its span.
Status stop_schedule(Journal& journal, EventId schedule, std::int64_t stop_s);
// Stops the schedule at at_s and starts `changed` in its place at the same moment. Both
// changes or neither. Returns the new schedule's id.
Result<EventId> change_schedule(Journal& journal, EventId schedule, std::int64_t at_s,
                                DoseSchedule changed);

// Schedules of the system running at time_s (started at or before it, not stopped by then).
std::vector<const Event*> schedules_running(const Journal& journal, SystemId system,
                                            std::int64_t time_s);
// Every schedule of the system (running or stopped), in start order.
std::vector<const Event*> schedules_of(const Journal& journal, SystemId system);

// One dose a schedule gave, as the water got it.
struct ScheduledDose {
  std::int64_t time_s = 0;
  EventId schedule_id = 0;
  Dose dose;                 // calibration applied; additive, unit and stock of the schedule
  bool part_missed = false;  // a "missed" mark took off part of it
};
// The doses the system's schedules gave in [from_s, to_s], in time order, with each "missed"
// mark taking its amount off the nearest scheduled dose (within half an interval; a dose
// cannot go below zero). "Extra" marks are logged doses and are not listed here.
std::vector<ScheduledDose> scheduled_doses(const Journal& journal, SystemId system,
                                           std::int64_t from_s, std::int64_t to_s);

}  // namespace tw::journal

// Standing dose schedules (schedule.hpp): editing through the journal's own validated calls,
// and the doses a schedule gave over a span of time with the logged marks applied.
#include "tidewright/journal/schedule.hpp"

#include <algorithm>
#include <cmath>
#include <cstdlib>

#include <fmt/format.h>

#include "tidewright/additives/additives.hpp"
#include "tidewright/common/datetime.hpp"

namespace tw::journal {

std::int64_t dose_interval_s(const DoseSchedule& s) {
  const int n = std::clamp(s.doses_per_day, 1, kMaxDosesPerDay);
  return static_cast<std::int64_t>(std::llround(86400.0 / n));
}

Dose delivered_dose(const DoseSchedule& s, double amount_as_set) {
  return Dose{s.additive_id, amount_as_set * s.calibration, s.unit, s.stock_g_per_l, ScheduleMark::None,
              std::nullopt};
}

std::string schedule_summary(const DoseSchedule& s) {
  std::string recipe;
  if (!s.stock_name.empty()) recipe = s.stock_name;
  // The strength, unless the keeper's own stock name already says it ("soda ash 80 g/L").
  if (s.stock_g_per_l) {
    const std::string strength = fmt::format("{:g} g/L", *s.stock_g_per_l);
    if (recipe.find(strength) == std::string::npos) recipe += (recipe.empty() ? "" : ", ") + strength;
  }
  // The compound by its name in the catalog ("Sodium carbonate (soda ash)"); an id the catalog
  // does not know is shown as it is stored.
  const auto compound = additives::find_compound(s.additive_id);
  const std::string what = compound ? (*compound)->name : s.additive_id;
  std::string out = fmt::format("{}: {:g} {} x {} a day of {}", s.device, s.amount, to_string(s.unit),
                                s.doses_per_day, what);
  if (!recipe.empty()) out += ", stock " + recipe;
  if (s.calibration != 1.0) out += fmt::format(", calibration {:.3g}", s.calibration);
  return out;
}

Result<EventId> start_schedule(Journal& journal, SystemId system, std::int64_t start_s, DoseSchedule schedule) {
  Event e;
  e.system_id = system;
  e.time_s = start_s;
  e.data = std::move(schedule);
  return add_event(journal, std::move(e));
}

Status stop_schedule(Journal& journal, EventId id, std::int64_t stop_s) {
  const Event* found = find_event(journal, id);
  if (!found || !std::holds_alternative<DoseSchedule>(found->data)) {
    return Error{"id", fmt::format("event {} is not a dose schedule", id)};
  }
  Event e = *found;
  auto& s = std::get<DoseSchedule>(e.data);
  if (s.stop_time_s && *s.stop_time_s <= stop_s) {
    return Error{"stop", fmt::format("schedule {} already stopped at {}", id,
                                     datetime::format_iso8601_utc(*s.stop_time_s))};
  }
  s.stop_time_s = stop_s;
  return update_event(journal, e);
}

Result<EventId> change_schedule(Journal& journal, EventId id, std::int64_t at_s, DoseSchedule changed) {
  Journal trial = journal;
  if (Status s = stop_schedule(trial, id, at_s); !s) return s.error();
  const Event* old = find_event(trial, id);
  changed.stop_time_s.reset();
  auto added = start_schedule(trial, old->system_id, at_s, std::move(changed));
  if (!added) return added.error();
  journal = std::move(trial);
  return *added;
}

std::vector<const Event*> schedules_of(const Journal& journal, SystemId system) {
  std::vector<const Event*> out;
  for (const auto& e : journal.events) {
    if (e.system_id == system && std::holds_alternative<DoseSchedule>(e.data)) out.push_back(&e);
  }
  return out;
}

std::vector<const Event*> schedules_running(const Journal& journal, SystemId system, std::int64_t time_s) {
  std::vector<const Event*> out;
  for (const Event* e : schedules_of(journal, system)) {
    const auto& s = std::get<DoseSchedule>(e->data);
    if (e->time_s <= time_s && (!s.stop_time_s || *s.stop_time_s > time_s)) out.push_back(e);
  }
  return out;
}

std::vector<ScheduledDose> scheduled_doses(const Journal& journal, SystemId system, std::int64_t from_s,
                                           std::int64_t to_s) {
  std::vector<ScheduledDose> out;
  for (const Event* e : schedules_of(journal, system)) {
    const auto& s = std::get<DoseSchedule>(e->data);
    const std::int64_t step = dose_interval_s(s);
    const std::int64_t end = std::min(to_s, s.stop_time_s ? *s.stop_time_s - 1 : to_s);
    if (end < e->time_s || end < from_s) continue;
    // Amount as set of each dose from the schedule's start up to `end`; marks adjust them.
    const std::int64_t count = (end - e->time_s) / step + 1;
    std::vector<double> as_set(static_cast<std::size_t>(count), s.amount);
    for (const auto& m : journal.events) {
      const auto* d = std::get_if<Dose>(&m.data);
      if (!d || d->schedule_id != e->id || d->mark != ScheduleMark::Missed) continue;
      const std::int64_t k = (m.time_s - e->time_s + step / 2) / step;  // nearest scheduled dose
      if (k < 0 || k >= count) continue;
      auto& a = as_set[static_cast<std::size_t>(k)];
      a = std::max(0.0, a - d->amount);
    }
    const std::int64_t first = from_s <= e->time_s ? 0 : (from_s - e->time_s + step - 1) / step;
    for (std::int64_t k = first; k < count; ++k) {
      const double a = as_set[static_cast<std::size_t>(k)];
      if (!(a > 0.0)) continue;
      out.push_back(ScheduledDose{e->time_s + k * step, e->id, delivered_dose(s, a), a < s.amount});
    }
  }
  std::stable_sort(out.begin(), out.end(),
                   [](const ScheduledDose& a, const ScheduledDose& b) { return a.time_s < b.time_s; });
  return out;
}

}  // namespace tw::journal

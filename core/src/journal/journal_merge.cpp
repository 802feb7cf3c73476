// merge_journal: the rules are in journal_merge.hpp.
#include "tidewright/journal/journal_merge.hpp"

#include <fmt/format.h>

#include "tidewright/journal/system_name.hpp"

namespace tw::journal {

bool same_system_settings(const System& a, const System& b) {
  System x = a, y = b;
  x.id = y.id = 0;
  x.name = y.name = "";
  return x == y;
}

namespace {

Status merge_event(Journal& out, Event e, const std::map<EventId, EventId>& schedule_of,
                   MergeReport& report, std::map<EventId, EventId>* new_schedules) {
  const EventId file_id = e.id;
  e.system_id = report.system_ids.at(e.system_id);
  if (auto* dose = std::get_if<Dose>(&e.data); dose && dose->schedule_id) {
    auto it = schedule_of.find(*dose->schedule_id);
    if (it == schedule_of.end()) {
      return Error{"schedule_id", fmt::format("entry {} is marked against schedule {}, which the file does not hold",
                                              file_id, *dose->schedule_id)};
    }
    dose->schedule_id = it->second;
  }
  if (const Event* same = find_equal_event(out, e)) {
    if (new_schedules) (*new_schedules)[file_id] = same->id;
    ++report.duplicates_skipped;
    return Ok{};
  }
  e.id = 0;
  auto id = add_event(out, std::move(e));
  if (!id) return Error{id.error().field, fmt::format("entry {} of the file: {}", file_id, id.error().message)};
  if (new_schedules) (*new_schedules)[file_id] = *id;
  ++report.entries_added;
  return Ok{};
}

}  // namespace

Result<MergeReport> merge_journal(Journal& target, const Journal& source) {
  Journal out = target;  // changed only when everything is accepted
  MergeReport report;
  for (const System& s : source.systems) {
    if (const System* here = find_system_by_name(out, trim_system_name(s.name))) {
      report.system_ids[s.id] = here->id;
      ++report.systems_matched;
      if (!same_system_settings(*here, s)) report.settings_kept.push_back(here->name);
      continue;
    }
    System copy = s;
    copy.id = 0;
    auto id = add_system(out, copy);
    if (!id) return Error{id.error().field, "system '" + s.name + "' of the file: " + id.error().message};
    report.system_ids[s.id] = *id;
    ++report.systems_added;
  }
  // Schedules first, so that a marked dose finds its schedule's id here whatever the order.
  std::map<EventId, EventId> schedule_of;
  for (const Event& e : source.events) {
    if (!std::holds_alternative<DoseSchedule>(e.data)) continue;
    if (Status st = merge_event(out, e, schedule_of, report, &schedule_of); !st) return st.error();
  }
  for (const Event& e : source.events) {
    if (std::holds_alternative<DoseSchedule>(e.data)) continue;
    if (Status st = merge_event(out, e, schedule_of, report, nullptr); !st) return st.error();
  }
  target = std::move(out);
  return report;
}

}  // namespace tw::journal

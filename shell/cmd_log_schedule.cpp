// `tidewright log schedule ...`: standing dose schedules of a system's pumps or routines
// (core: journal/schedule.hpp).
//   start   --device --additive --amount --unit [--stock-g-per-l --stock-name] --per-day [--calibration]
//   change  --id N [any of --amount --per-day --calibration --stock-g-per-l --stock-name]
//   stop    --id N
//   missed  --id N [--amount]     a scheduled dose that was not given (nearest to --time)
//   extra   --id N --amount X     the pump gave X on top of its program
//   list    [--system] [--all]    running schedules (all: stopped ones too)
// Every change is checked by the core on the system's journal first, then written to the journal
// database (core/store); a refusal names the option and leaves the journal as it was.
#include <ctime>
#include <iostream>
#include <memory>
#include <optional>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "commands.hpp"
#include "log_common.hpp"
#include "time_zone.hpp"
#include "log_format.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/journal/journal_file.hpp"
#include "journal_access.hpp"
#include "tidewright/journal/schedule.hpp"

namespace tw::shell {
namespace {

using namespace tw::journal;

struct ScheduleOptions {
  const std::string* journal = nullptr;
  const bool* json = nullptr;
  std::string system, time, date_order, device, additive, unit, stock_name;
  std::string utc_offset, time_zone;
  std::int64_t id = 0;
  std::optional<double> amount, stock_g_per_l, calibration;
  std::optional<int> per_day;
  bool all = false;
};

// Core field names as the options that set them.
std::string option_of(const std::string& field) {
  if (field == "amount") return "--amount";
  if (field == "doses_per_day") return "--per-day";
  if (field == "calibration") return "--calibration";
  if (field == "stock_g_per_l") return "--stock-g-per-l";
  if (field == "stock_name") return "--stock-name";
  if (field == "device") return "--device";
  if (field == "additive_id") return "--additive";
  if (field == "amount_unit") return "--unit";
  if (field == "stop" || field == "time") return "--time";
  if (field == "id" || field == "schedule_id") return "--id";
  return field;
}

template <class T>
T or_fail(Result<T> r) {
  if (!r) throw CommandError(option_of(r.error().field) + ": " + r.error().message);
  return std::move(r).value();
}
void or_fail(const Status& s) {
  if (!s) throw CommandError(option_of(s.error().field) + ": " + s.error().message);
}

using Store = store::JournalStore;

std::unique_ptr<Store> open_store(const ScheduleOptions& o, store::Access access) {
  return open_journal_or_fail(*o.journal, access);
}

// The system's journal (its events only) with the schedule `id` in it.
struct ScheduleContext {
  Journal journal;
  Event schedule;
};
ScheduleContext schedule_context(const Store& st, std::int64_t id) {
  auto e = st.event(id);
  if (!e || !std::holds_alternative<DoseSchedule>(e->data)) {
    throw CommandError(fmt::format("--id {}: not a dose schedule of this journal (see `tidewright log schedule list`)", id));
  }
  auto j = st.system_journal(e->system_id);
  if (!j) throw CommandError(j.error().message);
  return {std::move(j).value(), *e};
}

void report(const ScheduleOptions& o, const Store& st, const char* verb, EventId id) {
  const Event e = *st.event(id);
  if (*o.json) {
    std::cout << nlohmann::json{{verb, id}, {"event", event_to_json(e)}}.dump(2) << "\n";
  } else {
    Journal one;
    if (auto sys = st.system(e.system_id)) one.systems = {*sys};
    std::cout << verb << " " << describe_event_line(one, e) << "\n";
  }
}

void run_start(const ScheduleOptions& o) {
  auto st = open_store(o, store::Access::Write);
  const System sys = system_or_fail(*st, o.system);
  if (!o.amount) throw CommandError("--amount is needed");
  if (!o.per_day) throw CommandError("--per-day is needed");
  DoseSchedule s;
  s.device = o.device;
  s.additive_id = o.additive;
  s.amount = *o.amount;
  s.unit = or_fail(dose_unit_from_string(o.unit));
  s.stock_g_per_l = o.stock_g_per_l;
  s.stock_name = o.stock_name;
  s.doses_per_day = *o.per_day;
  s.calibration = o.calibration.value_or(1.0);
  Event e;
  e.system_id = sys.id;
  e.time_s = when_or_now(o.time, o.date_order, o.utc_offset, o.time_zone);
  e.data = s;
  report(o, *st, "started", or_fail(st->add_event(e)));
}

void run_change(const ScheduleOptions& o) {
  auto st = open_store(o, store::Access::Write);
  ScheduleContext c = schedule_context(*st, o.id);
  DoseSchedule s = std::get<DoseSchedule>(c.schedule.data);
  if (!o.amount && !o.per_day && !o.calibration && !o.stock_g_per_l && o.stock_name.empty()) {
    throw CommandError("--amount, --per-day, --calibration, --stock-g-per-l or --stock-name: give what changes");
  }
  if (o.amount) s.amount = *o.amount;
  if (o.per_day) s.doses_per_day = *o.per_day;
  if (o.calibration) s.calibration = *o.calibration;
  if (o.stock_g_per_l) s.stock_g_per_l = *o.stock_g_per_l;
  if (!o.stock_name.empty()) s.stock_name = o.stock_name;
  const std::int64_t at = when_or_now(o.time, o.date_order, o.utc_offset, o.time_zone);
  // Checked whole by the core first, so the store gets either both changes or a refusal.
  const EventId trial_id = or_fail(change_schedule(c.journal, o.id, at, s));
  or_fail(st->update_event(*find_event(c.journal, o.id)));
  Event added = *find_event(c.journal, trial_id);
  added.id = 0;
  report(o, *st, "changed to", or_fail(st->add_event(added)));
}

void run_stop(const ScheduleOptions& o) {
  auto st = open_store(o, store::Access::Write);
  ScheduleContext c = schedule_context(*st, o.id);
  or_fail(stop_schedule(c.journal, o.id, when_or_now(o.time, o.date_order, o.utc_offset, o.time_zone)));
  or_fail(st->update_event(*find_event(c.journal, o.id)));
  report(o, *st, "stopped", o.id);
}

void run_mark(const ScheduleOptions& o, ScheduleMark mark) {
  auto st = open_store(o, store::Access::Write);
  ScheduleContext c = schedule_context(*st, o.id);
  const auto& s = std::get<DoseSchedule>(c.schedule.data);
  if (mark == ScheduleMark::Extra && !o.amount) throw CommandError("--amount is needed: how much the pump gave on top");
  Event e;
  e.system_id = c.schedule.system_id;
  e.time_s = when_or_now(o.time, o.date_order, o.utc_offset, o.time_zone);
  e.data = Dose{s.additive_id, o.amount.value_or(s.amount), s.unit, s.stock_g_per_l, mark, c.schedule.id};
  report(o, *st, "added", or_fail(st->add_event(e)));
}

void run_list(const ScheduleOptions& o) {
  auto st = open_store(o, store::Access::Read);
  std::vector<System> systems;
  if (!o.system.empty()) systems.push_back(system_or_fail(*st, o.system));
  else systems = st->systems();
  const auto now = static_cast<std::int64_t>(std::time(nullptr));
  nlohmann::json arr = nlohmann::json::array();
  int shown = 0;
  for (const System& sys : systems) {
    auto j = st->system_journal(sys.id);
    if (!j) throw CommandError(j.error().message);
    const auto list = o.all ? schedules_of(*j, sys.id) : schedules_running(*j, sys.id, now);
    for (const Event* e : list) {
      ++shown;
      if (*o.json) arr.push_back(event_to_json(*e));
      else std::cout << describe_event_line(*j, *e) << "\n";
    }
  }
  if (*o.json) std::cout << arr.dump(2) << "\n";
  else if (shown == 0) std::cout << (o.all ? "no schedules\n" : "no schedule running (--all lists stopped ones)\n");
}

void add_when(CLI::App* c, ScheduleOptions& o, const char* what) {
  c->add_option("--time", o.time, std::string(what) + ": 2026-11-01T08:00Z, '2026-11-01 08:00' ... (default: now)");
  c->add_option("--date-order", o.date_order, "dmy or mdy, for dates like 03/04/2026");
  c->add_option("--utc-offset", o.utc_offset, kUtcOffsetHelp);
  c->add_option("--time-zone", o.time_zone, kTimeZoneHelp);
}

}  // namespace

void register_log_schedule(CLI::App& log, const std::string* journal_path, const bool* json) {
  auto o = std::make_shared<ScheduleOptions>();
  o->journal = journal_path;
  o->json = json;
  CLI::App* sched = log.add_subcommand("schedule", "Standing dose schedules: a pump or routine dosing N times a day until changed or stopped");
  sched->require_subcommand(1);
  sched->fallthrough();

  CLI::App* start = sched->add_subcommand("start", "Start a schedule (its doses count as logged ones)");
  start->add_option("--system", o->system, "System name or id (may be left out if there is only one)");
  start->add_option("--device", o->device, "The pump or routine, e.g. 'pump 1'")->required();
  start->add_option("--additive", o->additive, "Catalog id, e.g. sodium_carbonate, or limewater")->required();
  start->add_option("--amount", o->amount, "Per dose, as set on the pump")->required();
  start->add_option("--unit", o->unit, "g or mL")->required();
  start->add_option("--stock-g-per-l", o->stock_g_per_l, "For mL of a stock: its strength [g/L of the compound as sold]");
  start->add_option("--stock-name", o->stock_name, "The recipe's name");
  start->add_option("--per-day", o->per_day, "Doses a day, 1 to 288, evenly spaced from --time")->required();
  start->add_option("--calibration", o->calibration, "What the pump delivers per amount set, 0.5 to 1.5 (default 1)");
  add_when(start, *o, "First dose");
  start->callback([o] { run_start(*o); });

  CLI::App* change = sched->add_subcommand("change", "Change a schedule from --time on (the old one stops, a new one starts)");
  change->add_option("--id", o->id, "The schedule's id")->required();
  change->add_option("--amount", o->amount, "New amount per dose");
  change->add_option("--per-day", o->per_day, "New doses a day, 1 to 288");
  change->add_option("--calibration", o->calibration, "New pump calibration, 0.5 to 1.5");
  change->add_option("--stock-g-per-l", o->stock_g_per_l, "New stock strength [g/L]");
  change->add_option("--stock-name", o->stock_name, "New recipe name");
  add_when(change, *o, "From when");
  change->callback([o] { run_change(*o); });

  CLI::App* stop = sched->add_subcommand("stop", "Stop a schedule");
  stop->add_option("--id", o->id, "The schedule's id")->required();
  add_when(stop, *o, "When it stopped");
  stop->callback([o] { run_stop(*o); });

  CLI::App* missed = sched->add_subcommand("missed", "A scheduled dose was not given (the one nearest --time)");
  missed->add_option("--id", o->id, "The schedule's id")->required();
  missed->add_option("--amount", o->amount, "How much of it was not given (default: all of it)");
  add_when(missed, *o, "When it was due");
  missed->callback([o] { run_mark(*o, ScheduleMark::Missed); });

  CLI::App* extra = sched->add_subcommand("extra", "The schedule's pump gave an extra dose");
  extra->add_option("--id", o->id, "The schedule's id")->required();
  extra->add_option("--amount", o->amount, "How much, as set on the pump")->required();
  add_when(extra, *o, "When");
  extra->callback([o] { run_mark(*o, ScheduleMark::Extra); });

  CLI::App* list = sched->add_subcommand("list", "List the schedules running now");
  list->add_option("--system", o->system, "Only this system (name or id)");
  list->add_flag("--all", o->all, "Stopped schedules too");
  list->callback([o] { run_list(*o); });
}

}  // namespace tw::shell

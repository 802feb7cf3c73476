// `tidewright log edit event|system --id N ...` and `tidewright log undo`.
// An edit reads the stored record, changes only the fields given, and stores it through the
// core's checks (the same as `log add`): refused, it prints one line naming the option and the
// rule, and nothing changes. Every add, edit and remove is recorded by the store, and
// `log undo` reverts the last one (store schema version 4).
#include <ctime>
#include <iostream>
#include <memory>
#include <optional>

#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include "backup_finder.hpp"
#include "commands.hpp"
#include "journal_access.hpp"
#include "log_common.hpp"
#include "time_zone.hpp"
#include "log_format.hpp"
#include "tidewright/common/units.hpp"
#include "tidewright/journal/journal_file.hpp"

namespace tw::shell {

using namespace tw::journal;
using Store = store::JournalStore;

namespace {

struct EditOptions {
  const std::string* journal = nullptr;
  const bool* json = nullptr;
  std::int64_t id = 0;
  // event fields
  std::string time, date_order, utc_offset, time_zone, unit, kit, text, volume_unit;
  std::optional<double> value, precision, amount, volume;
  // system fields
  std::string name, kind;
  std::optional<double> salinity, temperature, target_alk, target_ca, target_mg;
};

// The core's field names as the options that set them.
std::string option_of(const std::string& field) {
  if (field == "volume_l") return "--volume";
  if (field == "default_salinity") return "--salinity";
  if (field == "default_temperature_c") return "--temperature";
  if (field == "target alkalinity_dkh") return "--target-alkalinity";
  if (field == "target calcium_mg_l") return "--target-calcium";
  if (field == "target magnesium_mg_l") return "--target-magnesium";
  if (field.empty()) return "--id";
  return "--" + field;
}

void stored_or_fail(const Status& s) {
  if (!s) throw CommandError(option_of(s.error().field) + ": " + s.error().message + " (nothing was changed)");
}
template <class T>
T or_fail(Result<T> r, const char* option) {
  if (!r) throw CommandError(std::string(option) + ": " + r.error().message);
  return std::move(r).value();
}

// An option given for an event type that has no such field.
void refuse_unless(bool fits, const char* option, const Event& e) {
  if (fits) return;
  throw CommandError(fmt::format("{}: event {} is a {}, which has no such field (nothing was changed)", option, e.id,
                                 event_type_name(e.data)));
}

void run_edit_event(const EditOptions& o) {
  auto st = open_journal_or_fail(*o.journal, store::Access::Write);
  auto stored = st->event(o.id);
  if (!stored) throw CommandError(fmt::format("--id: no event with id {} (nothing was changed)", o.id));
  Event e = *stored;
  const System sys = *st->system(e.system_id);
  if (!o.time.empty()) {
    e.time_s = when_or_now(o.time, o.date_order, o.utc_offset, o.time_zone);
    e.time_text = o.time;
  }
  auto* test = std::get_if<TestResult>(&e.data);
  auto* dose = std::get_if<Dose>(&e.data);
  auto* change = std::get_if<WaterChange>(&e.data);
  auto* top = std::get_if<TopOff>(&e.data);
  auto* note = std::get_if<Note>(&e.data);
  if (o.value) refuse_unless(test, "--value", e), test->value = *o.value;
  if (!o.unit.empty()) refuse_unless(test, "--unit", e), test->unit = or_fail(normalize_unit(test->parameter, o.unit), "--unit");
  if (o.precision) refuse_unless(test, "--precision", e), test->precision = *o.precision;
  if (!o.kit.empty()) refuse_unless(test, "--kit", e), test->kit = o.kit;
  if (o.amount) refuse_unless(dose, "--amount", e), dose->amount = *o.amount;
  if (!o.text.empty()) refuse_unless(note, "--text", e), note->text = o.text;
  if (o.volume) {
    refuse_unless(change || top, "--volume", e);
    const units::VolumeUnit u =
        o.volume_unit.empty() ? sys.units.volume : or_fail(units::volume_unit_from_string(o.volume_unit), "--volume-unit");
    (change ? change->volume_l : top->volume_l) = units::volume_to_litres(*o.volume, u);
  }
  if (e == *stored) throw CommandError("nothing to change: give a field to edit, e.g. --value, --time, --text");
  stored_or_fail(st->update_event(e));
  const Event now = *st->event(o.id);
  if (*o.json) {
    std::cout << nlohmann::json{{"edited", o.id}, {"event", event_to_json(now)}}.dump(2) << "\n";
  } else {
    Journal one;
    one.systems = {sys};
    std::cout << "edited " << describe_event_line(one, now) << "\n";
  }
}

void run_edit_system(const EditOptions& o) {
  auto st = open_journal_or_fail(*o.journal, store::Access::Write);
  auto stored = st->system(o.id);
  if (!stored) throw CommandError(fmt::format("--id: no system with id {} (nothing was changed)", o.id));
  System s = *stored;
  if (!o.name.empty()) s.name = o.name;
  if (!o.kind.empty()) s.kind = or_fail(system_kind_from_string(o.kind), "--kind");
  if (!o.volume_unit.empty()) s.units.volume = or_fail(units::volume_unit_from_string(o.volume_unit), "--volume-unit");
  if (o.volume) {
    s.volume_l = units::volume_to_litres(*o.volume, s.units.volume);
    s.volume_parts.reset();  // the net volume given directly replaces the parts it was worked out from
  }
  if (o.salinity) s.default_salinity = *o.salinity;
  if (o.temperature) s.default_temperature_c = units::temperature_to_celsius(*o.temperature, s.units.temperature);
  if (o.target_alk) s.targets.alkalinity_dkh = *o.target_alk;
  if (o.target_ca) s.targets.calcium_mg_l = *o.target_ca;
  if (o.target_mg) s.targets.magnesium_mg_l = *o.target_mg;
  if (s == *stored && o.name.empty()) {
    throw CommandError("nothing to change: give a field to edit, e.g. --name, --volume, --volume-unit");
  }
  stored_or_fail(st->update_system(s));
  const System now = *st->system(o.id);
  if (*o.json) std::cout << nlohmann::json{{"edited", o.id}, {"system", system_to_json(now)}}.dump(2) << "\n";
  else std::cout << "edited system " << now.id << ": " << describe_system_line(now) << "\n";
}

void run_undo(const EditOptions& o) {
  auto st = open_journal_or_fail(*o.journal, store::Access::Write);
  auto done = st->undo_last();
  if (!done) {
    std::string why = done.error().field + ": " + done.error().message;
    // Past a restore: name the copy `log restore` kept, when there is one.
    if (why.find("was a restore") != std::string::npos) {
      if (auto kept = newest_backup_of(st->path())) why += "; the journal as it was before is kept in " + *kept;
    }
    throw CommandError(why + " (nothing was changed)");
  }
  if (*o.json) std::cout << nlohmann::json{{"undone", *done}}.dump() << "\n";
  else std::cout << "undid: " << *done << "\n";
}

}  // namespace

void register_log_edit(CLI::App& log, const std::string* journal_path, const bool* json) {
  auto o = std::make_shared<EditOptions>();
  o->journal = journal_path;
  o->json = json;
  CLI::App* edit = log.add_subcommand("edit", "Change an event's or a system's fields; the same checks as log add, and log undo reverts it");
  edit->require_subcommand(1);

  CLI::App* ev = edit->add_subcommand("event", "Change fields of an event (only those given)");
  ev->add_option("--id", o->id, "Id of the event (log list shows it)")->required();
  ev->add_option("--time", o->time, "New time: 2026-11-01T08:00Z, '2026-11-01 08:00' ...");
  ev->add_option("--date-order", o->date_order, "dmy or mdy, for dates like 03/04/2026");
  ev->add_option("--utc-offset", o->utc_offset, kUtcOffsetHelp);
  ev->add_option("--time-zone", o->time_zone, kTimeZoneHelp);
  ev->add_option("--value", o->value, "Test: new value");
  ev->add_option("--unit", o->unit, "Test: unit of the value");
  ev->add_option("--precision", o->precision, "Test: kit precision, one standard deviation");
  ev->add_option("--kit", o->kit, "Test: kit or meter name");
  ev->add_option("--amount", o->amount, "Dose: amount, in the dose's unit");
  ev->add_option("--volume", o->volume, "Water change or top-off: volume, in --volume-unit");
  ev->add_option("--volume-unit", o->volume_unit, "L or gal (default: the system's)");
  ev->add_option("--text", o->text, "Note: new text");
  ev->callback([o] { run_edit_event(*o); });

  CLI::App* sys = edit->add_subcommand("system", "Change fields of a system (only those given)");
  sys->add_option("--id", o->id, "Id of the system (log systems shows it)")->required();
  sys->add_option("--name", o->name, "New name (trimmed; not a number; no control characters)");
  sys->add_option("--kind", o->kind, "reef_display, coral_grow_out, larval_culture, fish_only, other");
  sys->add_option("--volume", o->volume, "Net water volume, in the system's unit (or --volume-unit)");
  sys->add_option("--volume-unit", o->volume_unit, "L or gal: the system's display unit from now on");
  sys->add_option("--salinity", o->salinity, "Default practical salinity");
  sys->add_option("--temperature", o->temperature, "Default temperature, in the system's temperature unit");
  sys->add_option("--target-alkalinity", o->target_alk, "Target alkalinity [dKH]");
  sys->add_option("--target-calcium", o->target_ca, "Target calcium [mg/L]");
  sys->add_option("--target-magnesium", o->target_mg, "Target magnesium [mg/L]");
  sys->callback([o] { run_edit_system(*o); });

  CLI::App* undo = log.add_subcommand("undo", "Revert the last add, edit or remove (recorded in the journal)");
  undo->callback([o] { run_undo(*o); });
}

}  // namespace tw::shell

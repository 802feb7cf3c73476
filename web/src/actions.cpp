// The app's actions: the only code that changes AppState's saved parts. Each asks the core to
// validate (tw::journal::add_system, add_event, ...), changes nothing when refused, saves the
// store after a change and bumps AppState::revision, so that results recompute.
#include "local_time.hpp"
#include "actions.hpp"

#include "tidewright/common/ranges.hpp"
#include "tidewright/journal/schedule.hpp"

#include <algorithm>
#include <variant>

#include "format.hpp"
#include "platform.hpp"
#include "store.hpp"
#include "tidewright/common/datetime.hpp"

extern const unsigned char tw_demo_journal[];
extern const unsigned long tw_demo_journal_size;

namespace twapp {

namespace jn = tw::journal;

const char* screen_name(Screen s) {
  switch (s) {
    case Screen::Systems: return "systems";
    case Screen::Log: return "log";
    case Screen::Water: return "water";
    case Screen::Demand: return "demand";
    case Screen::Hatchery: return "hatchery";
    case Screen::Mixes: return "mixes";
    case Screen::Plan: return "plan";
    case Screen::Settings: return "settings";
  }
  return "?";
}

std::optional<Screen> screen_from_name(const std::string& name) {
  for (Screen s : kAllScreens)
    if (name == screen_name(s)) return s;
  return std::nullopt;
}

void notify(AppState& app, const std::string& message, bool is_error) {
  app.ui.message = message;
  app.ui.message_is_error = is_error;
  app.ui.message_until_ms = platform::now_ms() + (is_error ? 8000 : 4000);
}

namespace {

void changed(AppState& app) {
  ++app.revision;
  save(app);
}

void adopt(AppState& app, StoredApp stored) {
  app.journal = std::move(stored.journal);
  if (stored.had_app_part) {
    app.settings = stored.settings;
    app.demo_system_ids = stored.demo_system_ids;
    app.current_system = stored.current_system;
    app.dosing_by_system = std::move(stored.dosing_by_system);
    app.round_choice = std::move(stored.round_choice);
  }
  app.ui.dosing.forms_for.reset();  // filled again from what was read (sync_dosing_forms)
  if (!stored.refused.empty()) {
    std::string text = stored.refused.front();
    if (stored.refused.size() > 1) text += " (and " + std::to_string(stored.refused.size() - 1) + " more)";
    notify(app, text, true);
  }
  if (!jn::find_system(app.journal, app.current_system)) {
    app.current_system = app.journal.systems.empty() ? 0 : app.journal.systems.front().id;
  }
  app.water.what_if = false;
  ++app.revision;
}

}  // namespace

void save(AppState& app) {
  std::string error;
  bool reload = false;
  if (platform::store_save(kStoreName, app.store.saved_journal, app.journal, [&app] { return store_to_text(app); },
                           app_part_to_text(app), &reload, &error)) {
    app.store.save_error.clear();
    app.store.saved_journal = app.journal;
    ++app.store.saves;
    if (reload) {  // another copy of the app wrote at the same moment: show what is stored
      if (auto loaded = platform::store_load(kStoreName)) {
        if (auto stored = store_from_text(loaded->text)) {
          adopt(app, std::move(stored).value());
          app.store.saved_journal = app.journal;
        }
      }
    }
  } else {
    app.store.save_error = error;
    notify(app, "Not saved: " + error, true);
  }
}

void apply_store_update(AppState& app, const platform::StoreUpdate& update) {
  using Kind = platform::StoreUpdate::Kind;
  if (update.kind == Kind::Message) {
    if (update.is_error) app.store.save_error = update.text;
    notify(app, update.text, update.is_error);
    return;
  }
  if (update.kind == Kind::AppPart) {
    // Settings changed in another tab (or merged into this tab's own write): take them; the
    // system this tab shows stays its own.
    if (app_parts_agree(update.text, app_part_to_text(app))) return;
    auto part = app_part_from_text(update.text, app.journal);
    if (!part) return;  // the next start reports it
    app.settings = part->settings;
    app.demo_system_ids = part->demo_system_ids;
    app.dosing_by_system = std::move(part->dosing_by_system);
    app.round_choice = std::move(part->round_choice);
    app.ui.dosing.forms_for.reset();  // filled again from the settings just read
    ++app.revision;
    return;
  }
  if (update.kind == Kind::Everything) {
    auto stored = store_from_text(update.text);
    if (!stored) return;  // the next start reports it (and keeps a copy)
    const Settings keep = app.settings;  // this tab's settings stay as they are
    auto keep_dosing = app.dosing_by_system;  // and so do its Plan and Hatchery settings
    auto keep_round = app.round_choice;
    const jn::SystemId current = app.current_system;
    adopt(app, std::move(stored).value());
    app.settings = keep;
    app.dosing_by_system = std::move(keep_dosing);
    app.round_choice = std::move(keep_round);
    if (jn::find_system(app.journal, current)) app.current_system = current;
  } else {
    auto changes = changes_from_text(update.text);
    if (!changes) return;
    jn::apply_changes(app.journal, *changes);
    if (!current_system(app)) app.current_system = app.journal.systems.empty() ? 0 : app.journal.systems.front().id;
    ++app.revision;
  }
  app.store.saved_journal = app.journal;
}

void start_app(AppState& app) {
  // A reload opens the screen the page's address names (platform::location_screen).
  if (auto screen = screen_from_name(platform::location_screen())) app.ui.screen = *screen;
  app.store.loaded = true;
  const auto loaded = platform::store_load(kStoreName);
  if (!loaded) {  // first start: the demo
    load_demo(app, false);
    return;
  }
  const std::string& text = loaded->text;
  auto stored = store_from_text(text);
  if (!stored) {
    // Keep the damaged text beside the store, start empty, and say so plainly.
    const std::string copy = std::string("tidewright-damaged-") + std::to_string(platform::now_unix_seconds()) + ".json";
    std::string error;
    const bool kept = platform::storage_write(copy, text, &error);
    app.store.problem = "Your saved data could not be read (" + stored.error().field + ": " +
                        stored.error().message + (loaded->notice.empty() ? "" : "; " + loaded->notice) + "). " +
                        (kept ? "A copy was kept as " + copy + " in " + platform::storage_location() +
                                    "; the app started empty. If you have a backup or an export, import it in Settings."
                              : "Keeping a copy failed too (" + error + ").");
    ++app.revision;
    return;
  }
  const bool refused = !stored->refused.empty();
  adopt(app, std::move(stored).value());
  if (loaded->first_save_needed) {
    app.store.saved_journal = tw::journal::Journal{};  // write everything once
    save(app);
    if (!loaded->notice.empty()) notify(app, loaded->notice);
  } else {
    app.store.saved_journal = app.journal;
    if (refused) save(app);  // the settings as used (refused values at their defaults) replace the bad ones
  }
}

void go_to(AppState& app, Screen screen) {
  app.ui.screen = screen;
  app.ui.reveal.clear();
  platform::set_location_screen(screen_name(screen));
}

// ---------------------------------------------------------------- systems
const jn::System* current_system(const AppState& app) { return jn::find_system(app.journal, app.current_system); }

jn::System new_system_defaults(const AppState& app) {
  jn::System s;
  s.name = "Tank " + std::to_string(app.journal.systems.size() + 1);
  s.volume_l = 200;
  s.units = app.settings.units;
  return s;
}

bool add_system(AppState& app, jn::System system) {
  system.id = 0;
  auto id = jn::add_system(app.journal, system);
  if (!id) {
    notify(app, id.error().message, true);
    return false;
  }
  app.current_system = *id;
  app.water.what_if = false;
  notify(app, "Added " + system.name);
  changed(app);
  return true;
}

bool update_system(AppState& app, const jn::System& system) {
  auto st = jn::update_system(app.journal, system);
  if (!st) {
    notify(app, st.error().message, true);
    return false;
  }
  notify(app, "Saved " + system.name);
  changed(app);
  return true;
}

bool remove_system(AppState& app, jn::SystemId id) {
  const jn::System* s = jn::find_system(app.journal, id);
  if (!s) return false;
  const std::string name = s->name;
  auto st = jn::remove_system(app.journal, id, true);
  if (!st) {
    notify(app, st.error().message, true);
    return false;
  }
  std::erase(app.demo_system_ids, id);
  app.dosing_by_system.erase(id);
  if (app.current_system == id) app.current_system = app.journal.systems.empty() ? 0 : app.journal.systems.front().id;
  notify(app, "Removed " + name + " and its log");
  changed(app);
  return true;
}

void select_system(AppState& app, jn::SystemId id) {
  if (!jn::find_system(app.journal, id) || id == app.current_system) return;
  app.current_system = id;
  app.water.what_if = false;
  changed(app);
}

// ---------------------------------------------------------------- journal
namespace {

// The core's rule (jn::check_not_in_future), worded in the user's local time.
bool refuse_future(AppState& app, std::int64_t when_s) {
  if (jn::check_not_in_future(when_s, platform::now_unix_seconds())) return false;
  notify(app, "time " + local_time::text(when_s) +
                  " is in the future; accepted: any time up to now", true);
  return true;
}

std::string logged_text(const jn::EventData& data) {
  if (const auto* t = std::get_if<jn::TestResult>(&data)) {
    return std::string(tw::parameter_label(t->parameter)) + " " + fmtx::fixed(t->value, 2) + " " + t->unit;
  }
  if (std::holds_alternative<jn::Dose>(data)) return "the dose";
  if (std::holds_alternative<jn::WaterChange>(data)) return "the water change";
  if (std::holds_alternative<jn::TopOff>(data)) return "the top-off";
  return "the entry";
}

}  // namespace

bool log_event(AppState& app, const jn::EventData& data, std::optional<std::int64_t> when_s) {
  const jn::System* sys = current_system(app);
  if (!sys) {
    notify(app, "Add a system first: every log entry belongs to a system", true);
    return false;
  }
  jn::Event e;
  e.system_id = sys->id;
  e.time_s = when_s.value_or(platform::now_unix_seconds());
  if (refuse_future(app, e.time_s)) return false;
  e.data = data;
  auto id = jn::add_event(app.journal, e);
  if (!id) {
    notify(app, id.error().message, true);
    return false;
  }
  app.water.what_if = false;  // the Water screen follows the new reading
  notify(app, "Logged " + logged_text(data));
  changed(app);
  return true;
}

bool update_logged_event(AppState& app, jn::EventId id, const jn::EventData& data, std::int64_t when_s) {
  const jn::Event* old = jn::find_event(app.journal, id);
  if (!old) {
    notify(app, "That entry is no longer in the log", true);
    return false;
  }
  if (refuse_future(app, when_s)) return false;
  jn::Event e = *old;
  e.time_s = when_s;
  e.data = data;
  auto st = jn::update_event(app.journal, e);
  if (!st) {
    notify(app, st.error().message, true);
    return false;
  }
  app.water.what_if = false;
  notify(app, "Changed " + logged_text(data));
  changed(app);
  return true;
}

bool remove_event(AppState& app, jn::EventId id) {
  auto st = jn::remove_event(app.journal, id);
  if (!st) {
    notify(app, st.error().message, true);
    return false;
  }
  notify(app, "Removed the entry");
  changed(app);
  return true;
}

// ---------------------------------------------------------------- schedules
namespace {
const jn::DoseSchedule* schedule_of(const AppState& app, jn::EventId id) {
  const jn::Event* e = jn::find_event(app.journal, id);
  return e ? std::get_if<jn::DoseSchedule>(&e->data) : nullptr;
}
}  // namespace

bool change_schedule_now(AppState& app, jn::EventId schedule, double amount, int doses_per_day) {
  const jn::DoseSchedule* s = schedule_of(app, schedule);
  if (!s) {
    notify(app, "That schedule is no longer in the log", true);
    return false;
  }
  jn::DoseSchedule changed_schedule = *s;
  changed_schedule.amount = amount;
  changed_schedule.doses_per_day = doses_per_day;
  changed_schedule.stop_time_s.reset();
  jn::Journal next = app.journal;  // both changes or neither
  auto id = jn::change_schedule(next, schedule, platform::now_unix_seconds(), changed_schedule);
  if (!id) {
    notify(app, id.error().message, true);
    return false;
  }
  app.journal = std::move(next);
  notify(app, "Changed from now: " + changed_schedule.device);
  changed(app);
  return true;
}

bool stop_schedule_now(AppState& app, jn::EventId schedule) {
  const jn::DoseSchedule* s = schedule_of(app, schedule);
  if (!s) {
    notify(app, "That schedule is no longer in the log", true);
    return false;
  }
  const std::string device = s->device;
  auto st = jn::stop_schedule(app.journal, schedule, platform::now_unix_seconds());
  if (!st) {
    notify(app, st.error().message, true);
    return false;
  }
  notify(app, "Stopped from now: " + device);
  changed(app);
  return true;
}

bool log_schedule_mark(AppState& app, jn::EventId schedule, jn::ScheduleMark mark) {
  const jn::Event* e = jn::find_event(app.journal, schedule);
  const jn::DoseSchedule* s = schedule_of(app, schedule);
  if (!e || !s) {
    notify(app, "That schedule is no longer in the log", true);
    return false;
  }
  jn::Dose d;
  d.additive_id = s->additive_id;
  d.amount = s->amount;
  d.unit = s->unit;
  d.stock_g_per_l = s->stock_g_per_l;
  d.mark = mark;
  d.schedule_id = schedule;
  jn::Event ev;
  ev.system_id = e->system_id;
  ev.time_s = platform::now_unix_seconds();
  ev.data = d;
  auto id = jn::add_event(app.journal, ev);
  if (!id) {
    notify(app, id.error().message, true);
    return false;
  }
  notify(app, std::string(mark == jn::ScheduleMark::Missed ? "Logged a missed dose of " : "Logged an extra dose of ") +
                  s->device);
  changed(app);
  return true;
}

// ---------------------------------------------------------------- settings
void set_units(AppState& app, const jn::UnitPreferences& units) {
  app.settings.units = units;
  if (const jn::System* s = current_system(app)) {
    jn::System copy = *s;
    copy.units = units;
    if (!jn::update_system(app.journal, copy)) notify(app, "Units could not be stored with the system", true);
  }
  changed(app);
}

void set_look(AppState& app, Look look) {
  app.settings.look = look;
  changed(app);
}

void set_text_size(AppState& app, float text_size) {
  app.settings.text_size = std::clamp(text_size, 0.8f, 1.6f);
  changed(app);
}

bool set_room_co2(AppState& app, double ppm) {
  auto st = tw::ranges::check("room CO2", ppm, tw::ranges::kRoomCo2Ppm);
  if (!st) {
    notify(app, st.error().message, true);
    return false;
  }
  app.settings.room_co2_ppm = ppm;
  changed(app);
  return true;
}

void set_constants_convention(AppState& app, tw::carbonate::ConstantsConvention convention) {
  app.settings.constants_convention = convention;
  changed(app);
}

std::vector<tw::plan::LimitSetting> safety_limit_settings(const Settings& settings) {
  std::vector<tw::plan::LimitSetting> out;
  for (const auto& spec : tw::plan::limit_specs()) {
    const double v = settings.safety_limits[static_cast<std::size_t>(spec.id)];
    if (v != spec.default_value) out.push_back({spec.id, v, false, {}});
  }
  return out;
}

bool set_safety_limit(AppState& app, tw::plan::LimitId id, double value) {
  // The core's rules decide (make_limits); its message names the limit and the range.
  auto checked = tw::plan::make_limits({{id, value, false, {}}});
  if (!checked) {
    notify(app, checked.error().message, true);
    return false;
  }
  app.settings.safety_limits[static_cast<std::size_t>(id)] = value;
  changed(app);
  return true;
}

void reset_safety_limits(AppState& app) {
  app.settings.safety_limits = tw::plan::default_limits().value;
  notify(app, "Safety limits are back to their defaults");
  changed(app);
}

// ---------------------------------------------------------------- water
void set_water_inputs(AppState& app, const WaterInputs& inputs) {
  app.water = inputs;
  app.water.what_if = true;
  app.water.source = "What-if: your own numbers, not saved to the log.";
  ++app.revision;
}

void set_water_precision(AppState& app, const WaterPrecision& precision) {
  app.water_precision = precision;
  ++app.revision;
}

void use_latest_readings(AppState& app) {
  app.water.what_if = false;
  ++app.revision;
}

// ---------------------------------------------------------------- demo, export, import
void load_demo(AppState& app, bool save_now) {
  const std::string text(reinterpret_cast<const char*>(tw_demo_journal), tw_demo_journal_size);
  auto stored = store_from_text(text);
  if (!stored) {
    notify(app, "The demo data could not be read: " + stored.error().message, true);
    return;
  }
  // The invented demo ends on a fixed date; moved forward by whole days so that its last entry
  // is less than a day old, it stays a living tank (levels carried to now, no stale tests) on
  // any date the app is opened. Times of day and every span between entries are kept.
  std::int64_t last_s = 0;
  for (const jn::Event& e : stored->journal.events) last_s = std::max(last_s, e.time_s);
  const std::int64_t now_s = platform::now_unix_seconds();
  const std::int64_t shift_s = last_s > 0 && now_s > last_s ? (now_s - last_s) / 86400 * 86400 : 0;
  for (jn::Event& e : stored->journal.events) {
    e.time_s += shift_s;
    e.time_text.clear();
    if (auto* sch = std::get_if<jn::DoseSchedule>(&e.data); sch && sch->stop_time_s) *sch->stop_time_s += shift_s;
  }
  app.demo_shift_s = shift_s;
  // Demo systems join what is there (ids and names are checked by the core).
  if (app.journal.systems.empty() && app.journal.events.empty()) {
    const Settings keep = app.settings;
    adopt(app, std::move(stored).value());
    app.settings = keep;
    app.demo_system_ids.clear();
    for (const auto& s : app.journal.systems) app.demo_system_ids.push_back(s.id);
    app.current_system = app.journal.systems.empty() ? 0 : app.journal.systems.front().id;
    if (const jn::System* s = current_system(app)) app.settings.units = s->units;
    ++app.revision;
    if (save_now) {
      save(app);
    } else {
      app.store.save_after_first_frame = true;
    }
    return;
  }
  notify(app, "The demo can only be loaded into an empty journal: export and remove your data first", true);
}

bool remove_demo(AppState& app) {
  if (app.demo_system_ids.empty()) return false;
  for (jn::SystemId id : std::vector<jn::SystemId>(app.demo_system_ids)) {
    if (!jn::remove_system(app.journal, id, true)) {
      notify(app, "The demo could not be removed completely", true);
      break;
    }
  }
  app.demo_system_ids.clear();
  if (!current_system(app)) app.current_system = app.journal.systems.empty() ? 0 : app.journal.systems.front().id;
  notify(app, "Demo data removed");
  changed(app);
  return true;
}

void export_all(AppState& app) {
  const std::string name = "tidewright-" + tw::datetime::format_date_utc(platform::now_unix_seconds()) + ".json";
  std::string where;
  if (platform::export_file(name, "application/json", store_to_text(app), &where)) {
    notify(app, "Exported to " + where);
  } else {
    notify(app, "Export failed: " + where, true);
  }
}

void ask_import(AppState&) { platform::request_import(); }

// "Replace everything" of an import, once the keeper confirmed it (actions_import.cpp asks).
bool replace_all_from_text(AppState& app, const std::string& text) {
  auto stored = store_from_text(text);
  if (!stored) {
    notify(app, "Import refused, nothing changed: " + stored.error().field + ": " + stored.error().message, true);
    return false;
  }
  const bool full = stored->had_app_part;
  adopt(app, std::move(stored).value());
  if (!full) app.demo_system_ids.clear();
  app.store.problem.clear();
  notify(app, std::string("Replaced with the file's ") + std::to_string(app.journal.systems.size()) + " systems and " +
                  std::to_string(app.journal.events.size()) + " log entries");
  changed(app);
  return true;
}

}  // namespace twapp

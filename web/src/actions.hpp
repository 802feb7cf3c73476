// Every change to AppState goes through one of these. Each validates with the core, changes
// the state only when valid, saves the store after a change, and marks results stale.
// They return false (and set the banner message) when the core refuses.
#pragma once

#include <cstdint>
#include <optional>
#include <string>

#include "app_state.hpp"
#include "platform.hpp"

namespace twapp {

// Start: load the saved store (or the demo on a first start).
void start_app(AppState& app);

void go_to(AppState& app, Screen screen);
void notify(AppState& app, const std::string& message, bool is_error = false);

// Systems
bool add_system(AppState& app, tw::journal::System system);
bool update_system(AppState& app, const tw::journal::System& system);
bool remove_system(AppState& app, tw::journal::SystemId id);
void select_system(AppState& app, tw::journal::SystemId id);
const tw::journal::System* current_system(const AppState& app);
tw::journal::System new_system_defaults(const AppState& app);

// Journal
// Any event for the current system at when_s (empty = now). Refused (message names the field
// and its range) when the core refuses it or when the time is in the future.
bool log_event(AppState& app, const tw::journal::EventData& data, std::optional<std::int64_t> when_s);
// Replaces what a logged event says and when; its system and id stay.
bool update_logged_event(AppState& app, tw::journal::EventId id, const tw::journal::EventData& data,
                         std::int64_t when_s);
bool remove_event(AppState& app, tw::journal::EventId id);
// Standing schedules (journal/schedule.hpp), from now: a change stops the schedule and starts
// the changed one at the same moment; a stop ends it. A missed or extra dose is logged now as
// a dose marked against the schedule (its amount as set on the pump).
bool change_schedule_now(AppState& app, tw::journal::EventId schedule, double amount, int doses_per_day);
bool stop_schedule_now(AppState& app, tw::journal::EventId schedule);
bool log_schedule_mark(AppState& app, tw::journal::EventId schedule, tw::journal::ScheduleMark mark);

// Settings (units go to the current system too, so the journal and the screen agree)
void set_units(AppState& app, const tw::journal::UnitPreferences& units);
void set_text_size(AppState& app, float text_size);
void set_look(AppState& app, Look look);  // dark or light colours, saved with the settings
bool set_room_co2(AppState& app, double ppm);
void set_constants_convention(AppState& app, tw::carbonate::ConstantsConvention convention);
// A safety limit of the planner: refused (message names the limit and its accepted range)
// below its floor or past its hard ceiling; loosening up to the ceiling is kept and noted.
bool set_safety_limit(AppState& app, tw::plan::LimitId id, double value);
void reset_safety_limits(AppState& app);
// The settings as the planner takes them (every limit that differs from its default).
std::vector<tw::plan::LimitSetting> safety_limit_settings(const Settings& settings);

// Water screen
void set_water_inputs(AppState& app, const WaterInputs& inputs);  // becomes a what-if
// The readings' precisions; the numbers stay as they are (latest readings or a what-if).
void set_water_precision(AppState& app, const WaterPrecision& precision);
void use_latest_readings(AppState& app);

// Demo data, export and import
bool remove_demo(AppState& app);
// save_now false: saved after the first frame instead (a first start).
void load_demo(AppState& app, bool save_now = true);
void export_all(AppState& app);
void ask_import(AppState& app);
// A picked file's text: makes the preview shown in Settings (import_state.hpp); nothing in the
// journal changes until the keeper confirms it (actions_import.cpp).
bool import_text(AppState& app, const std::string& text);
void remake_import_preview(AppState& app);  // after the keeper changed a choice of the preview
// A CSV column read as `meaning` (any text the core's match_csv_column reads, or "skip"; ""
// takes the keeper's choice back); the preview is made again, or the core's refusal shown.
void map_import_column(AppState& app, std::string header, std::string meaning);  // copies: callers pass the preview's own strings
bool confirm_import_add(AppState& app);      // CSV rows, or a Tidewright file merged
bool confirm_import_replace(AppState& app);  // a Tidewright file in place of everything here
void cancel_import(AppState& app);
bool replace_all_from_text(AppState& app, const std::string& text);
// The log as long-form CSV (the command line's `log export` format), of the current system or
// of every system (UiState::csv_export_all).
void export_log_csv(AppState& app);
// Records another tab stored (or the store as a whole after a failed save) come into the
// journal here; nothing is written back.
void apply_store_update(AppState& app, const platform::StoreUpdate& update);

// The Plan and Hatchery forms <-> the current system's saved settings (once a frame, before and
// after drawing): a change to the forms is kept for their system and saved; another current
// system fills them with its own (actions_dosing_saved.cpp).
void sync_dosing_forms(AppState& app);

// Saves the store now (called by the actions above).
void save(AppState& app);

}  // namespace twapp

// AppState: everything the app knows, in one struct. Screens read it and call actions
// (actions.hpp) to change it; nothing else writes to it. No screen keeps data in statics.
//
//   AppState
//     settings      app-wide preferences (saved)
//     journal       systems and events, the core's tw::journal::Journal (saved)
//     current_system, demo_system_ids, dosing_by_system (saved)
//     water         inputs of the Water screen; water_result = core results for them
//     ui            per-session UI state (screen, forms, fonts, widget rectangles)
//     store         how loading and saving went
#pragma once

#include <array>
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/carbonate/measurement_precision.hpp"
#include "tidewright/carbonate/uncertainty.hpp"
#include "tidewright/journal/journal.hpp"
#include "dosing_state.hpp"  // forms and cached results of Demand, Hatchery, Mixes, Plan
#include "farm_state.hpp"    // the Systems screen's farm overview and round of tests
#include "import_state.hpp"   // a picked file waiting for the keeper's confirmation
#include "pick_list_state.hpp"  // scrolling lists: a finger's drag, a list's filter

namespace twapp {

// Screens in tab-bar order. To add one: a value here, a row in kTabs (nav.cpp), and
// void draw_<name>(AppState&) in screen_<name>.cpp declared in screens.hpp.
enum class Screen { Systems, Log, Water, Demand, Plan, Hatchery, Mixes, Settings };
inline constexpr Screen kAllScreens[] = {Screen::Systems, Screen::Log,      Screen::Water, Screen::Demand,
                                         Screen::Plan,    Screen::Hatchery, Screen::Mixes, Screen::Settings};
const char* screen_name(Screen s);  // "systems", "log", "water", "settings" (test interface, page address)
std::optional<Screen> screen_from_name(const std::string& name);

// The app's colours: dark for dim fish rooms (the default), light for bright rooms (theme.hpp).
enum class Look { Dark, Light };

struct Settings {
  tw::journal::UnitPreferences units;  // shown when no system exists; copied to new systems
  float text_size = 1.0f;              // multiplier of the base text size, 0.8 .. 1.6
  Look look = Look::Dark;
  double room_co2_ppm = 800;           // CO2 of the room's air, for the air-equilibrium figures
  // How the Water screen's constants are put on the total scale: as CO2SYS/PyCO2SYS do
  // (default) or as the 2007 Guide prints them (carbonate.hpp, ConstantsConvention).
  tw::carbonate::ConstantsConvention constants_convention = tw::carbonate::ConstantsConvention::ReferencePackages;
  // The planner's safety limits, indexed by tw::plan::LimitId. Each is between its floor and
  // its hard ceiling (tw::plan::make_limits); the app never overrides a hard ceiling.
  std::array<double, tw::plan::kLimitCount> safety_limits = tw::plan::default_limits().value;
  bool operator==(const Settings&) const = default;
};

// Which two carbonate inputs the Water screen solves from.
enum class WaterPair { AlkalinityPH, AlkalinityPCO2, AlkalinityDIC, AlkalinityAir };

struct WaterInputs {
  WaterPair pair = WaterPair::AlkalinityPH;
  double alkalinity_dkh = 8.0;
  double ph = 8.1;
  tw::carbonate::PhScale ph_scale = tw::carbonate::PhScale::NBS;
  double pco2_uatm = 800;
  double dic_umol_kg = 2000;
  double salinity = 35;
  double temperature_c = 25;
  std::optional<double> calcium_mg_l;  // measured (latest logged); absent = from salinity
  // A salt mix's own composition (issue 18), optional: magnesium (latest logged) for the Mg/Ca
  // correction of the constants, off unless chosen; total boron in mg/L of B when measured.
  std::optional<double> magnesium_mg_l;
  std::optional<double> total_boron_mg_l;
  bool mg_ca_correction = false;
  bool what_if = false;  // false: filled from the current system's latest readings
  std::string source;    // where the numbers came from, in words
  bool operator==(const WaterInputs&) const = default;
};

// How precise the Water screen's readings are: one standard deviation each, in canonical units
// (dKH, pH units, psu, C, uatm, umol/kg). Defaults from the core's one table of kit and meter
// precisions (carbonate/measurement_precision.hpp, common practice); pCO2 and DIC have none.
struct WaterPrecision {
  double alkalinity_dkh = typical(tw::journal::Parameter::Alkalinity);
  double ph = typical(tw::journal::Parameter::PH);
  double ph_conversion = tw::carbonate::kPhNbsToTotalUncertainty;  // NBS reading -> total scale
  double salinity = typical(tw::journal::Parameter::Salinity);
  double temperature_c = typical(tw::journal::Parameter::Temperature);
  double pco2_uatm = 0;
  double dic_umol_kg = 0;
  // Of a measured calcium and magnesium (mg/L), and of a measured total boron (a fraction of
  // its value); each counts only when that value is used (uncertainty.hpp).
  double calcium_mg_l = typical(tw::journal::Parameter::Calcium);
  double magnesium_mg_l = typical(tw::journal::Parameter::Magnesium);
  double total_boron_relative = tw::carbonate::kMeasuredBoronRelativeUncertainty;
  bool operator==(const WaterPrecision&) const = default;
  static double typical(tw::journal::Parameter p) { return tw::carbonate::default_precision(p)->typical; }
};

// Fractions of DIC as CO2*, HCO3- and CO3-- across pH (the x axis is on the shown scale).
struct SpeciesCurve {
  std::vector<float> ph, co2, hco3, co3;
};

struct WaterResult {
  std::uint64_t revision = 0;              // key: AppState::revision it was computed at
  bool ok = false;
  std::string error;                       // why there is no result (core's message)
  tw::carbonate::CarbonateState state;     // at the inputs
  std::optional<tw::carbonate::CarbonateState> air;  // same alkalinity, at the room's CO2
  std::string air_error;
  tw::carbonate::CalciumSource calcium;    // where the saturation's calcium came from (core)
  tw::carbonate::BoronSource boron;        // where the total boron came from (core)
  SpeciesCurve curve;
  // Standard uncertainty of each output from the readings' precision (Orr et al. 2018 linear
  // propagation in the core); unset with u_error when it could not be computed.
  std::optional<tw::carbonate::CarbonateOutputs> u;
  std::string u_error;
  std::string omega_main_source;           // the reading that adds most to u(Omega aragonite)
  double density_kg_per_l = 1.02334;
  int computed_count = 0;                  // how many times it was recomputed (tests)
};

}  // namespace twapp

struct ImFont;

namespace twapp {
struct Fonts {
  ImFont* body = nullptr;   // text
  ImFont* bold = nullptr;   // headings, values
  ImFont* big = nullptr;    // the one big number of a screen
  ImFont* small = nullptr;  // tab labels (ASCII only)
};

// A finished text entry (platform text field), waiting for the widget that asked for it; or,
// for a live field, the text typed so far (typing).
struct EntryResult {
  std::string key;
  std::string text;
  bool accepted = false;
  bool typing = false;
};

struct Rect {
  float x = 0, y = 0, w = 0, h = 0;  // device pixels
  bool visible = false;              // inside its window's visible area this frame
  std::string text;                  // a button's label as drawn (tests read it)
};

// The test-result form of the Log screen.
// The Log screen's entry form: one kind of event at a time, new or an edit of a logged one.
enum class LogKind { Test, Dose, WaterChange, TopOff };

struct LogForm {
  LogKind kind = LogKind::Test;
  tw::journal::EventId editing = 0;        // 0 = a new entry; else the event being changed
  std::optional<std::int64_t> when_s;      // empty = now (taken when saved)
  // test result
  tw::journal::Parameter parameter = tw::journal::Parameter::Alkalinity;
  std::string unit;          // empty = the parameter's preferred unit
  std::string value_text;    // as typed
  tw::carbonate::PhScale ph_scale = tw::carbonate::PhScale::NBS;
  // The kit's precision (1 sd) in `unit`: filled with the parameter's typical one whenever the
  // parameter or unit changes (precision_for: "parameter|unit" it was filled for); editable.
  std::optional<double> precision;
  std::string precision_for;
  // dose (compound: index into the Log screen's list of dosable compounds)
  int dose_compound = 0;            // -1: an additive the list does not offer (kept as logged)
  std::string dose_additive_as_logged;
  std::optional<double> dose_amount;
  bool dose_in_ml = true;           // mL of a stock solution, or grams of dry salt
  double dose_stock_g_per_l = 80;   // grams of the compound as sold per litre of stock
  // water change and top-off (volumes in litres; shown in the system's unit)
  std::optional<double> change_volume_l;
  std::optional<double> change_alkalinity_dkh, change_calcium_mg_l, change_magnesium_mg_l, change_salinity;
  std::optional<double> topoff_volume_l;
  bool topoff_limewater = false;
};

// The Log screen's card of standing schedules: the one being changed (its new amount and
// doses a day, as typed) and the one waiting for a second tap to stop.
struct ScheduleEdit {
  tw::journal::EventId changing = 0;
  double amount = 0;
  int doses_per_day = 1;
  tw::journal::EventId confirm_stop = 0;
};

// The system editor of the Systems screen (a copy; saved through actions).
struct SystemForm {
  bool open = false;
  bool is_new = false;
  tw::journal::System system;
  std::string error;
  bool confirm_remove = false;
};

struct UiState {
  Screen screen = Screen::Systems;
  Fonts fonts;
  std::optional<EntryResult> entry;  // consumed by the widget whose key matches
  bool drag_owned = false;     // a widget (chart) owns the current drag: do not scroll
  DragScroll page_scroll;      // the page, dragged with a finger
  // Each screen's own scroll position (ui::page_scroll_memory): a tab opens where it was left.
  std::map<Screen, float> scroll_of_screen;
  Screen page_shows = Screen::Systems;  // the screen the page showed last frame
  int scroll_restore_frames = 0;        // frames left re-applying the restored position
  PickListState switcher;      // the header's list of systems
  float em = 17;               // font size in device pixels this frame
  float pixel_ratio = 1;
  float fonts_built_for = 0;   // scale the font atlas was built for (0 = not yet)
  Look look_applied = Look::Dark;  // the look the style was last applied with
  std::optional<Look> page_look;   // the look the page's HTML parts were last told
  std::map<std::string, Rect> widgets;  // named widgets drawn this frame
  std::string reveal;          // widget to scroll into view on the next frame
  std::string screen_text;     // the text last handed to screen readers (platform::set_screen_text)
  std::string message;         // one-line banner (saved, exported, refused ...)
  bool message_is_error = false;
  double message_until_ms = 0;
  // The room at the page's foot that the message strip had, kept empty after the strip goes
  // while giving it back would move a page scrolled to its end (app.cpp message_room).
  float message_room = 0;
  Screen message_room_screen = Screen::Systems;
  float page_scroll_y = 0, page_scroll_max_y = 0;  // the page's scroll last frame
  LogForm log;
  ScheduleEdit schedule_edit;
  DosingState dosing;  // Demand, Hatchery, Mixes, Plan (dosing_state.hpp)
  SystemForm system_form;
  FarmState farm;     // farm overview and round of tests (farm_state.hpp)
  bool confirm_remove_demo = false;
  ImportPreview import;        // Settings: a picked file, previewed until confirmed or cancelled
  bool csv_export_all = false; // Settings: "Export log as CSV" of every system, or the current one
  tw::journal::EventId confirm_remove_event = 0;  // Log: entry waiting for a second tap
  std::optional<float> chart_probe_ph;  // pH the user touched on the species chart
  std::vector<float> frame_ms;          // CPU time per drawn frame (benchmark)
  int frames_drawn = 0;
  bool first_frame_reported = false;
};

struct StoreStatus {
  bool loaded = false;
  std::string problem;     // e.g. damaged store: what happened and where the copy is
  std::string save_error;  // last failed save
  int saves = 0;
  // The demo of a first start is saved once the first frame is on screen, not before: writing
  // its 900 entries took 0.1 to 0.4 s of a phone's first frame (app_frame saves it at the end
  // of the second frame; the browser shows a frame when the call that drew it returns).
  bool save_after_first_frame = false;
  tw::journal::Journal saved_journal;  // the journal as last saved: a save writes only the difference
};

struct AppState {
  Settings settings;
  tw::journal::Journal journal;
  tw::journal::SystemId current_system = 0;         // 0 = none
  std::vector<tw::journal::SystemId> demo_system_ids;  // systems that came from the demo
  // The Plan and Hatchery settings of each system that has any other than the defaults (saved).
  std::map<tw::journal::SystemId, SystemDosing> dosing_by_system;
  RoundChoice round_choice;  // which systems the round of tests lists (saved)
  std::int64_t demo_shift_s = 0;  // how far the demo's times were moved forward when loaded (whole days)
  WaterInputs water;
  WaterPrecision water_precision;
  WaterResult water_result;
  // Bumped by every action that changes the journal, the settings, the current system or the
  // Water inputs. Every screen's cached result keeps the revision (and the form) it was computed
  // from and is recomputed when its key differs: one pattern for all screens, and no cache holds
  // a copy of the journal as its key.
  std::uint64_t revision = 1;
  UiState ui;
  StoreStatus store;
};

}  // namespace twapp

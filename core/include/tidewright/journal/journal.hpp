// The tank journal: systems (tanks) and the timestamped events logged against them.
//
// Map of this header
//   1. Ids, enums and their names (what goes into files and CSV cells)
//   2. Systems: volume, kind, defaults, unit preferences, targets
//   3. Events: test result, dose, water change, top-off, note, standing dose schedule
//   4. Plausible ranges (named, common practice) and canonical units
//   5. The journal and its editing calls (every change is validated first; a refused change
//      leaves the journal exactly as it was)
//
// The core never reads the clock or touches files: the caller passes times (seconds since the
// Unix epoch, UTC) and reads/writes text through journal_file.hpp.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <variant>
#include <vector>

#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/common/parameter.hpp"
#include "tidewright/common/ranges.hpp"
#include "tidewright/common/result.hpp"
#include "tidewright/common/units.hpp"

namespace tw::journal {

// ---------------------------------------------------------------- 1. Ids, enums, names
using SystemId = std::int64_t;  // > 0; unique within a journal (shared counter with events)
using EventId = std::int64_t;   // > 0

enum class SystemKind { ReefDisplay, CoralGrowOut, ShellfishLarvalCulture, FishOnly, Other };
const char* to_string(SystemKind kind);  // "reef_display", "coral_grow_out", "larval_culture",
                                         // "fish_only", "other"
Result<SystemKind> system_kind_from_string(const std::string& text);

// Temperature units live with the other units (common/units.hpp).
using units::TemperatureUnit;
using units::temperature_unit_from_string;
using units::to_string;

// The parameter of a test: tw::Parameter (common/parameter.hpp), one table of names and units.
using tw::Parameter;

// pH scale names as in files: "total", "sws", "free", "nbs".
const char* ph_scale_name(carbonate::PhScale scale);
Result<carbonate::PhScale> ph_scale_from_name(const std::string& text);

enum class DoseUnit { Grams, Millilitres };
const char* to_string(DoseUnit unit);  // "g", "mL"
Result<DoseUnit> dose_unit_from_string(const std::string& text);

enum class TopOffKind { Plain, Limewater };
const char* to_string(TopOffKind kind);  // "plain", "limewater"
Result<TopOffKind> top_off_kind_from_string(const std::string& text);

// ---------------------------------------------------------------- 2. Systems
struct UnitPreferences {
  units::AlkalinityUnit alkalinity = units::AlkalinityUnit::DKH;
  units::ConcentrationUnit calcium_magnesium = units::ConcentrationUnit::MgPerL;
  TemperatureUnit temperature = TemperatureUnit::Celsius;
  carbonate::PhScale ph_scale = carbonate::PhScale::NBS;  // scale of the user's pH meter
  units::VolumeUnit volume = units::VolumeUnit::Litre;    // display only; stored in litres
  bool operator==(const UnitPreferences&) const = default;
};

struct Targets {
  std::optional<double> alkalinity_dkh;
  std::optional<double> calcium_mg_l;
  std::optional<double> magnesium_mg_l;
  bool operator==(const Targets&) const = default;
};

// How the net volume was worked out, when the user gave the parts.
struct VolumeParts {
  double display_l = 0;
  double sump_l = 0;
  double rock_displacement_l = 0;  // water displaced by rock and sand, subtracted
  bool operator==(const VolumeParts&) const = default;
};
double net_volume_l(const VolumeParts& parts);  // display + sump - rock displacement

struct System {
  SystemId id = 0;  // 0 = "assign one" when adding
  std::string name;  // unique within the journal (case-insensitive), 1..100 characters;
                     // new names follow check_system_name (system_name.hpp)
  SystemKind kind = SystemKind::ReefDisplay;
  double volume_l = 0;  // net water volume
  std::optional<VolumeParts> volume_parts;  // if set, volume_l must equal net_volume_l(parts)
  double default_salinity = 35.0;           // practical salinity
  double default_temperature_c = 25.0;
  UnitPreferences units;
  Targets targets;
  bool operator==(const System&) const = default;
};
// The system's own target of a dosed parameter (canonical unit), unset if it sets none.
std::optional<double> target_of(const System& system, Parameter p);

// ---------------------------------------------------------------- 3. Events
struct TestResult {
  Parameter parameter = Parameter::Alkalinity;
  std::string other_name;  // only for Parameter::Other, e.g. "potassium"
  double value = 0;
  std::string unit;  // normalised spelling, see normalize_unit()
  std::optional<double> precision;  // kit precision, one standard deviation, same unit as value
  std::optional<carbonate::PhScale> ph_scale;  // required for Parameter::PH
  std::string kit;  // optional kit or meter name
  bool operator==(const TestResult&) const = default;
};

// How a logged dose relates to a standing schedule (DoseSchedule below).
//   None:   a dose of its own (by hand, or a pump that has no schedule), counted as logged.
//   Missed: the schedule's dose nearest this time (within half its interval) was not given;
//           the logged amount (as set on the pump) is taken off that scheduled dose.
//   Extra:  the schedule's pump gave this amount (as set) on top of its schedule.
enum class ScheduleMark { None, Missed, Extra };
const char* to_string(ScheduleMark mark);  // "none", "missed", "extra"
Result<ScheduleMark> schedule_mark_from_string(const std::string& text);

struct Dose {
  std::string additive_id;  // catalog id (additives.hpp), e.g. "sodium_carbonate"
  double amount = 0;
  DoseUnit unit = DoseUnit::Grams;
  // For mL doses of a stock solution: grams of the catalog compound as sold (with its water
  // of hydration, e.g. CaCl2.2H2O) per litre of stock.
  std::optional<double> stock_g_per_l;
  // Missed or Extra: the schedule (the event id of a DoseSchedule of the same system, same
  // additive and unit, running at this time). For these the schedule's recipe and pump
  // calibration count; the dose's own additive, unit and strength must match the schedule's.
  ScheduleMark mark = ScheduleMark::None;
  std::optional<EventId> schedule_id;
  bool operator==(const Dose&) const = default;
};

struct WaterChange {
  double volume_l = 0;  // water removed and replaced; at most the system's net volume
  std::optional<double> alkalinity_dkh;  // new water's parameters, when known
  std::optional<double> calcium_mg_l;
  std::optional<double> magnesium_mg_l;
  std::optional<double> salinity;
  bool operator==(const WaterChange&) const = default;
};

struct TopOff {
  double volume_l = 0;
  TopOffKind kind = TopOffKind::Plain;
  // Limewater strength as grams Ca(OH)2 per litre; unset = saturated (see
  // limewater_saturated_g_per_l).
  std::optional<double> limewater_g_per_l;
  bool operator==(const TopOff&) const = default;
};

struct Note {
  std::string text;  // 1..10000 characters
  bool operator==(const Note&) const = default;
};

// A standing dose schedule, logged as an event whose time is its start: a pump or a routine
// gives `amount` (mL of a stock, or g of a compound) doses_per_day times a day, the first at
// the start time and then every 24 h / doses_per_day, until stop_time_s (unset: still
// running). The estimate, the forecast and the plan count each scheduled dose as if it had
// been logged. Changing a schedule stops it and starts a new one at the same moment
// (schedule.hpp), so what the water got in the past stays as it was.
struct DoseSchedule {
  std::string device;             // "pump 1", "evening scoop": 1..60 characters
  std::string additive_id;        // catalog id, as for Dose
  double amount = 0;              // per dose, as set on the pump (mL) or weighed (g)
  DoseUnit unit = DoseUnit::Millilitres;
  std::optional<double> stock_g_per_l;  // the stock's recipe for mL doses, as for Dose
  std::string stock_name;         // the recipe's name, optional (0..60 characters)
  int doses_per_day = 1;          // 1..288
  // Pump calibration: what the pump delivers per amount set (measured into a cylinder), 0.5..1.5.
  double calibration = 1.0;
  std::optional<std::int64_t> stop_time_s;  // after the start; unset = until changed or stopped
  bool operator==(const DoseSchedule&) const = default;
};
inline constexpr int kMaxDosesPerDay = 288;  // every 5 minutes: the finest pump programs

using EventData = std::variant<TestResult, Dose, WaterChange, TopOff, Note, DoseSchedule>;
const char* event_type_name(const EventData& data);  // "test", "dose", "water_change",
                                                     // "top_off", "note", "schedule"

struct Event {
  EventId id = 0;  // 0 = "assign one" when adding
  SystemId system_id = 0;
  std::int64_t time_s = 0;  // seconds since 1970-01-01T00:00:00Z
  std::string time_text;    // the time as the user wrote it (optional, for the record)
  EventData data;
  bool operator==(const Event&) const = default;
};

// ---------------------------------------------------------------- 4. Ranges and units
// The accepted ranges live in tidewright/common/ranges.hpp (one table for every front end).
using Range = ranges::Range;

// Nominal seawater density (S 35, 25 C: 1.02334 kg/L, UNESCO 1983 EOS-80, facts.md 4) used
// only to convert per-kg units for range checks and canonical values when the caller has
// no better density.
inline constexpr double kNominalDensityKgPerL = 1.02334;

// The canonical unit of each parameter is parameter_unit(p) (common/parameter.hpp).

// Accepted unit spellings per parameter, normalised:
//   alkalinity: dKH, meq/L, mg/L CaCO3, umol/kg     calcium, magnesium: mg/L, mmol/kg, umol/kg
//   ph: pH (or empty)   salinity: psu (also "ppt")   specific_gravity: sg (or empty)
//   temperature: C, F   nitrate, phosphate: mg/L (or ppm)   other: any text of 1..20 characters
Result<std::string> normalize_unit(Parameter p, const std::string& unit);

// A value converted to the canonical unit of its parameter. density_kg_per_l converts per-kg
// units (umol/kg, mmol/kg) to per litre.
Result<double> canonical_value(Parameter p, double value, const std::string& unit,
                               double density_kg_per_l = kNominalDensityKgPerL);
Result<double> canonical_value(const TestResult& test,
                               double density_kg_per_l = kNominalDensityKgPerL);
// The kit precision in the canonical unit (scaled like the value); unset if the test has none.
std::optional<double> canonical_precision(const TestResult& test,
                                          double density_kg_per_l = kNominalDensityKgPerL);

// The accepted range of a parameter's value (ranges::of_measurement, canonical unit) in `unit`,
// for a field's bounds and hint (the app's Log screen): 0 to 25 dKH is 0 to 8.916 meq/L.
struct UnitBounds {
  double lo = 0, hi = 0;
};
Result<UnitBounds> accepted_in_unit(Parameter p, const std::string& unit,
                                    double density_kg_per_l = kNominalDensityKgPerL);

// Typical kit precision of each parameter: info_of(p).typical_precision (common/parameter.hpp).

// ---------------------------------------------------------------- 5. The journal
struct Journal {
  std::string description;      // free text about the journal, e.g. "invented demo data"
  std::vector<System> systems;  // in the order they were added
  std::vector<Event> events;    // always sorted by (time_s, id)
  std::int64_t next_id = 1;     // next id to hand out to a system or an event
  bool operator==(const Journal&) const = default;
};

// Checks one system on its own (ranges, name) and against the others in the journal (unique
// name; its id may already be in the journal for an update).
Status validate_system(const Journal& journal, const System& system);
// Checks one event: known system, time range, and the payload's ranges. Errors name the field
// ("value", "volume_l", "additive_id"...) and the accepted range.
Status validate_event(const Journal& journal, const Event& event);
// A new or changed entry may be dated at most kFutureSlackS after now (the clocks of a phone,
// a meter and a computer disagree by minutes) [common practice: our choice]. The caller reads
// the clock; the core never does. Error field "time", times in UTC.
inline constexpr std::int64_t kFutureSlackS = 10 * 60;
Status check_not_in_future(std::int64_t time_s, std::int64_t now_s);

// Adding: id 0 assigns the next id; a non-zero id must be unused. Returns the id.
// A system's name is trimmed and must meet check_system_name (system_name.hpp); so must a
// name changed by update_system (a name left as it was is kept, even from before the rule).
Result<SystemId> add_system(Journal& journal, System system);
Result<EventId> add_event(Journal& journal, Event event);
// Replacing by id (the id must exist).
Status update_system(Journal& journal, const System& system);
Status update_event(Journal& journal, const Event& event);
// Removing by id. A system that still has events is refused unless with_events is true, in
// which case its events go too. A schedule that marked doses refer to is refused.
Status remove_system(Journal& journal, SystemId id, bool with_events = false);
Status remove_event(Journal& journal, EventId id);

const System* find_system(const Journal& journal, SystemId id);
const System* find_system_by_name(const Journal& journal, const std::string& name);  // no case
const Event* find_event(const Journal& journal, EventId id);
// An event already in the journal that says the same as `event`: same system, time and content
// (its id and the time as written aside). The one rule for "already there" of the CSV import
// and the merge of journals (journal_merge.hpp), so a file imported twice adds nothing.
const Event* find_equal_event(const Journal& journal, const Event& event);

// Events of one system in time order; optionally only tests of one parameter and/or within
// [from_s, to_s].
struct EventFilter {
  std::optional<SystemId> system_id;
  std::optional<Parameter> parameter;  // keeps only test results of this parameter
  std::optional<std::int64_t> from_s;
  std::optional<std::int64_t> to_s;
};
std::vector<const Event*> select_events(const Journal& journal, const EventFilter& filter);

}  // namespace tw::journal

// Dose planner with safety limits: from a system's state, targets, daily demand and the user's
// additives and pumps, a day-by-day list of every dose with the water predicted right after it
// and before the next, checked against limits that are each shown with their source.
//
// Map of this header
//   1. Limits: the table of defaults (with sources) and hard ceilings; tightening, overrides
//   2. Inputs: system, targets, demand (plain struct the consumption estimate can fill),
//      deliveries (which pump or hand dose gives each additive), the whole PlanInput
//   3. Output: doses with water states, days, reservoirs, salinity drift, findings
//   4. make_plan (scheduler), check_plan (independent checker), what_if (missed/doubled dose)
//   5. Text in and out: JSON plan input, plan as JSON, CSV (RFC 4180), iCalendar (RFC 5545),
//      plain text for print
//
// Water model (documented choices):
// - Levels are per litre as test kits read them (dKH, mg/L); the carbonate engine works per kg,
//   converted with the seawater density at the system's salinity and temperature.
// - Demand (calcification) is removed evenly over the day: 1 eq alkalinity takes 0.5 mol DIC
//   (CaCO3: 2 eq TA and 1 mol DIC per mol, facts.md 5); calcium and magnesium as entered.
// - Right after a dose: closed system, fully mixed, before gas exchange: alkalinity and DIC of
//   the dose added, pH (TOTAL scale) and Omega aragonite solved from alkalinity + DIC.
// - Between doses: DIC relaxes toward equilibrium with room air (equilibrate_with_air at the
//   current alkalinity) with time constant gas_exchange_hours (default 4 h, chosen here: a
//   well-aerated tank re-equilibrates within hours, from memory: unverified). 0 = full
//   equilibrium before every dose. "Before the next dose" states are after this relaxation.
// - Omega aragonite uses the current calcium, not the seawater ratio.
#pragma once

#include <array>
#include <optional>
#include <string>
#include <vector>

#include "tidewright/additives/additives.hpp"
#include "tidewright/common/result.hpp"

namespace tw::plan {

// ---------------------------------------------------------------- 1. Limits
enum class LimitId {
  AlkalinityRisePerDay,  // dKH per day
  CalciumRisePerDay,     // mg/L per day
  MagnesiumRisePerDay,   // mg/L per day
  PhAfterDose,           // pH, total scale, right after a single dose
  OmegaAragoniteAfterDose,
  AlkalinityCeiling,     // dKH
  CalciumCeiling,        // mg/L
  MagnesiumCeiling,      // mg/L
};
inline constexpr std::size_t kLimitCount = 8;

struct LimitSpec {
  LimitId id;
  const char* key;          // "alkalinity_rise_dkh_per_day", ... (file and command-line name)
  const char* description;  // "largest rise of alkalinity in one day"
  const char* unit;
  double default_value;
  double hard_ceiling;      // loosening past this needs an explicit override
  const char* source;       // "common practice", "Moras et al. 2022 (facts.md 9)", ...
};
const std::array<LimitSpec, kLimitCount>& limit_specs();
const LimitSpec& limit_spec(LimitId id);
Result<LimitId> limit_from_key(const std::string& key);

// A user's setting for one limit. Tightening (below the default) is always accepted; a value
// between the default and the hard ceiling is accepted and noted; past the hard ceiling it
// needs override = true and a reason, and the plan records it.
struct LimitSetting {
  LimitId id;
  double value;
  bool override_hard_ceiling = false;
  std::string reason;
};

struct Limits {
  std::array<double, kLimitCount> value{};  // indexed by LimitId
  std::vector<std::string> record;          // loosened limits and overrides, shown with the plan
  double get(LimitId id) const { return value[static_cast<std::size_t>(id)]; }
};
Limits default_limits();
Result<Limits> make_limits(const std::vector<LimitSetting>& settings);

// ---------------------------------------------------------------- 2. Inputs
struct SystemState {
  std::string name = "system";
  double volume_l = 380;         // water volume, accepted 1..1e6 L
  double salinity = 35;          // practical salinity, accepted 20..42
  double temperature_c = 25.5;   // accepted 10..35 C
  double alkalinity_dkh = 8.0;   // accepted 2..20 dKH
  double calcium_mg_l = 420;     // accepted 200..700 mg/L
  double magnesium_mg_l = 1300;  // accepted 800..2000 mg/L
  std::optional<double> ph_total;  // measured pH on the TOTAL scale (7.0..8.8); absent = in
                                   // equilibrium with room air
  double air_co2_ppm = 424.6;    // room air, accepted 200..5000 ppm (facts.md 10 default)
};

struct Band {
  double target = 0, low = 0, high = 0;  // low <= target <= high
};
struct Targets {
  Band alkalinity_dkh{8.0, 7.5, 8.5};
  Band calcium_mg_l{430, 410, 450};
  Band magnesium_mg_l{1350, 1300, 1400};
};

// Daily demand of the whole system (what the livestock takes up per day), as the consumption
// estimate reports it; enter 0 for a parameter that is not consumed.
struct DailyDemand {
  double alkalinity_meq_per_day = 0;
  double calcium_mg_per_day = 0;
  double magnesium_mg_per_day = 0;
};
// Demand from per-litre rates (dKH/day, mg/L/day) in a volume.
DailyDemand demand_from_per_litre(double alkalinity_dkh_per_day, double calcium_mg_l_per_day,
                                  double magnesium_mg_l_per_day, double volume_l);

struct Delivery {
  additives::Additive additive;
  std::string device = "pump";  // pump or hand, shown in the schedule
  bool manual = false;          // dosed by hand: gets a reminder in iCalendar
  int doses_per_day = 1;        // accepted 1..288, spread evenly over the allowed hours
  double min_dose = 0;          // smallest dose the pump or scoop can give (mL or g)
  double max_dose = 100;        // largest single dose (mL or g)
  double max_per_day = 1e9;     // pump volume per day (mL or g)
  int first_hour = 0;           // allowed hours, first_hour..last_hour inclusive, 0..23
  int last_hour = 23;
  double reservoir = 0;         // volume or mass on hand (mL or g); 0 = not tracked
};

struct PlanInput {
  SystemState system;
  Targets targets;
  DailyDemand demand;
  std::vector<Delivery> deliveries;
  Limits limits = default_limits();
  double evaporation_l_per_day = 0;  // top-off volume, bounds limewater
  int horizon_days = 30;             // accepted 1..365
  double gas_exchange_hours = 4.0;   // accepted 0..72 (0 = full equilibrium between doses)
  double salinity_tolerance = 1.0;   // drift the water change should hold, salinity units
                                     // (chosen here: about a hobby refractometer's reading step)
  std::string start_date = "2026-12-02";  // YYYY-MM-DD, day 1 of the plan (for calendars)
};

// ---------------------------------------------------------------- 3. Output
struct WaterState {
  double alkalinity_dkh = 0, calcium_mg_l = 0, magnesium_mg_l = 0;
  double ph_total = 0;  // TOTAL scale
  double omega_aragonite = 0;
  double dic_umol_kg = 0;
};

struct DoseRecord {
  int day = 1;              // 1-based
  int minute = 0;           // minute of the day, 0..1439
  std::size_t delivery = 0; // index into PlanInput::deliveries
  double amount = 0;        // mL or g
  std::string cap;          // empty, or the limit that made this dose smaller than wanted
  WaterState after;         // right after the dose (closed system, before gas exchange)
  WaterState before_next;   // just before the next dose event (after gas exchange and demand)
};

struct DaySummary {
  int day = 1;
  WaterState start, end;
  std::vector<double> amount_per_delivery;  // total mL or g per delivery that day
  double rise_alkalinity_dkh = 0, rise_calcium_mg_l = 0, rise_magnesium_mg_l = 0;  // peak - start
};

struct ReservoirEmpty {
  std::size_t delivery;
  int day;     // first day whose doses could not all be given
  int minute;
};

struct SalinityDrift {
  double per_day = 0;             // salinity units per day from Na, K, Cl and SO4 left behind
  double over_horizon = 0;
  double water_change_percent_per_week = 0;  // that holds the steady excess at salinity_tolerance
};

struct Plan {
  std::vector<DoseRecord> doses;
  std::vector<DaySummary> days;
  std::array<std::optional<int>, 3> target_day;  // alkalinity, calcium, magnesium: first day ending in band
  std::vector<ReservoirEmpty> reservoirs_empty;
  SalinityDrift salinity;
  std::vector<std::string> findings;  // why a target is not reached safely, what was capped
  std::vector<std::string> cautions;  // for caustic and other hazardous additives
  Limits limits;                      // limits used, with their record of overrides
  WaterState start;
  const char* ph_scale = "total";
};

// ---------------------------------------------------------------- 4. Planning and checking
// Validates the input (errors name the field and the accepted range) and plans. A target that
// cannot be reached safely is not forced: the plan is the safe one that gets closest, and
// `findings` say which limit held it back.
Result<Plan> make_plan(const PlanInput& input);

struct Violation {
  std::size_t dose;   // index into the dose list (or SIZE_MAX for day-level findings)
  int day;
  LimitId limit;
  double value;       // what the water reached
  double allowed;
  std::string message;
};
struct CheckReport {
  std::vector<Violation> violations;
  std::vector<WaterState> after;  // recomputed state right after each dose
  std::vector<WaterState> day_end;  // recomputed state at the end of each day
  double max_ph_total = 0, max_omega_aragonite = 0;
  std::vector<std::string> other;  // pump, reservoir or evaporation limits broken
  bool ok() const { return violations.empty() && other.empty(); }
};
struct PlannedDose {
  int day;
  int minute;
  std::size_t delivery;
  double amount;
};
// Independent checker: replays a dose list from the input's starting state with its own code
// (calling the carbonate engine directly), and reports every limit exceeded.
CheckReport check_doses(const PlanInput& input, const std::vector<PlannedDose>& doses);
CheckReport check_plan(const PlanInput& input, const Plan& plan);

enum class Mishap { Missed, RanTwice };
struct WhatIf {
  std::size_t dose;
  Mishap mishap;
  double alkalinity_dkh_change = 0, calcium_mg_l_change = 0, magnesium_mg_l_change = 0;  // vs plan, end of day
  double ph_total_after = 0, omega_aragonite_after = 0;  // right after the (doubled) dose
  bool within_limits = true;
  std::string summary;
};
// How far one dose missed or given twice moves the water, and whether limits hold.
Result<WhatIf> what_if(const PlanInput& input, const Plan& plan, std::size_t dose, Mishap mishap);
// The largest dose of each delivery, missed and doubled.
std::vector<WhatIf> mishap_summary(const PlanInput& input, const Plan& plan);

// ---------------------------------------------------------------- 5. Text in and out
// JSON plan input (format documented in plan_json.cpp and README): fields as in PlanInput.
Result<PlanInput> plan_input_from_json(const std::string& json_text);
std::string plan_to_json(const PlanInput& input, const Plan& plan);
// RFC 4180 CSV, one row per dose, CRLF line ends, formula-safe cells.
std::string plan_to_csv(const PlanInput& input, const Plan& plan);
// RFC 5545 iCalendar: one VEVENT per dose (manual doses get a VALARM reminder), CRLF, lines
// folded at 75 octets. dtstamp_utc: "YYYYMMDDTHHMMSSZ" (the caller's clock; the core has none).
Result<std::string> plan_to_icalendar(const PlanInput& input, const Plan& plan, const std::string& dtstamp_utc);
// Plain text for print: limits with sources, day table, findings, cautions.
std::string plan_to_text(const PlanInput& input, const Plan& plan);

}  // namespace tw::plan

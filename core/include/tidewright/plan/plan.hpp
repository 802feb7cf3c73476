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
#include <string_view>
#include <vector>

#include "tidewright/additives/additives.hpp"
#include "tidewright/estimate/estimate.hpp"
#include "tidewright/common/result.hpp"

namespace tw::plan {

// ---------------------------------------------------------------- 1. Limits
// Limits on both sides (design.md safety model). Ceilings and largest changes bound how far a
// dose may push the water; floors bound how low the water may be let go. "Any 24 hours" means
// every window of 24 hours, not calendar days. Every predicted state is checked: right after each
// dose and just before the next (the trough). A floor applies from the moment the water is at or
// above it; water that starts below a floor must reach it within the plan's horizon.
enum class LimitId {
  AlkalinityRisePerDay,  // dKH over any 24 hours
  CalciumRisePerDay,     // mg/L over any 24 hours
  MagnesiumRisePerDay,   // mg/L over any 24 hours
  PhAfterDose,           // pH, total scale, right after a single dose
  OmegaAragoniteAfterDose,
  AlkalinityCeiling,     // dKH
  CalciumCeiling,        // mg/L
  MagnesiumCeiling,      // mg/L
  AlkalinityFallPerDay,  // dKH over any 24 hours
  CalciumFallPerDay,     // mg/L over any 24 hours
  MagnesiumFallPerDay,   // mg/L over any 24 hours
  AlkalinityStepPerDose, // dKH from one single dose
  CalciumStepPerDose,    // mg/L from one single dose
  MagnesiumStepPerDose,  // mg/L from one single dose
  AlkalinityFloor,       // dKH
  CalciumFloor,          // mg/L
  MagnesiumFloor,        // mg/L
  PhFloor,               // pH, total scale, at any time
  OmegaAragoniteFloor,   // at any time
};
inline constexpr std::size_t kLimitCount = 19;

// Which way a limit is loosened: an upper bound (ceiling, largest change) by raising it, a
// floor by lowering it.
enum class LimitSide { Upper, Floor };

struct LimitSpec {
  LimitId id;
  const char* key;          // "alkalinity_rise_dkh_per_day", ... (file and command-line name)
  const char* description;  // "largest rise of alkalinity in any 24 hours"
  const char* unit;
  double default_value;
  double hard_bound;        // loosening past this (above an upper bound, below a floor) needs an override
  const char* source;       // "common practice", "Moras et al. 2022 (facts.md 9)", ...
  LimitSide side = LimitSide::Upper;
  double lowest = 0;        // an upper bound must be above this; a floor must be above it too
  double highest = 1e9;     // an upper bound or a floor may not be set above this
  bool loosens(double value) const { return side == LimitSide::Upper ? value > default_value : value < default_value; }
  bool past_hard_bound(double value) const { return side == LimitSide::Upper ? value > hard_bound : value < hard_bound; }
  // " dKH" after a value in a sentence; nothing for a limit with no unit (Omega), nor for pH,
  // whose description already names it ("the lowest pH ... reached 7.65", not "7.65 pH").
  std::string unit_suffix() const {
    return *unit && std::string_view(unit) != "pH" ? std::string(" ") + unit : std::string();
  }
};
const std::array<LimitSpec, kLimitCount>& limit_specs();
const LimitSpec& limit_spec(LimitId id);
// What held a dose back (DoseRecord::cap, a limit key or a pump setting, as the plan file
// writes it) in words for a keeper: "the largest rise of alkalinity in any 24 hours".
std::string cap_in_words(const std::string& capped_by);
// Unknown keys are refused naming the nearest known key.
Result<LimitId> limit_from_key(const std::string& key);

// A user's setting for one limit. Tightening (a lower ceiling, a higher floor) is always
// accepted; loosening up to the hard bound is accepted and noted; past the hard bound it needs
// override = true and a reason, and the plan records it.
struct LimitSetting {
  LimitId id;
  double value;
  bool override_hard_bound = false;
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
  // Accepted ranges: common/ranges.hpp (kSystemVolumeL, kSalinityForCarbonateChemistry,
  // kTemperatureC, the levels' of_measurement, kPh, kRoomCo2Ppm), checked by validate_input.
  std::string name = "system";
  double volume_l = 380;         // water volume, L (a plan input file must give it)
  double salinity = 35;          // practical salinity
  double temperature_c = 25.5;
  double alkalinity_dkh = 8.0;
  double calcium_mg_l = 420;
  double magnesium_mg_l = 1300;
  std::optional<double> ph_total;  // measured pH on the TOTAL scale; absent = in equilibrium
                                   // with room air
  double air_co2_ppm = 424.6;    // room air, ppm (facts.md 10 default)
};

using Band = TargetBand;  // low <= target <= high (common/parameter.hpp)
// Defaults: the parameter table's default targets and bands (8.0 +/- 0.5 dKH, 430 +/- 20 mg/L,
// 1350 +/- 50 mg/L).
struct Targets {
  Band alkalinity_dkh = default_target_band(Parameter::Alkalinity);
  Band calcium_mg_l = default_target_band(Parameter::Calcium);
  Band magnesium_mg_l = default_target_band(Parameter::Magnesium);
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

// One pump (or hand routine) and what it gives. Two kinds of amount:
// - a dose (DoseRecord::amount, the day totals, the reservoir) is what reaches the tank;
// - the pump's own settings (min_dose, max_dose, max_per_day) are amounts SET on the pump, as
//   the keeper types them into its controller; the pump gives setting x calibration.
// So the amount to set for a dose is set_amount(dose) = dose / calibration, and the scheduler
// bounds doses by the delivered_* values below.
struct Delivery {
  additives::Additive additive;
  std::string device = "pump";  // pump or hand, shown in the schedule
  bool manual = false;          // dosed by hand: gets a reminder in iCalendar
  int doses_per_day = 1;        // accepted 1..288, spread evenly over the allowed hours
  double min_dose = 0;          // smallest amount the pump or scoop can be set to (mL or g)
  double max_dose = 100;        // largest single amount set (mL or g)
  double max_per_day = 1e9;     // largest amount set per day (mL or g)
  int first_hour = 0;           // allowed hours, first_hour..last_hour inclusive, 0..23
  int last_hour = 23;
  double reservoir = 0;         // volume or mass on hand (mL or g), drained by what is delivered; 0 = not tracked
  // What the pump delivers per amount set (measured into a cylinder): ranges::kPumpCalibration,
  // the same range as a journal schedule's calibration.
  double calibration = 1.0;

  double set_amount(double delivered) const { return delivered / calibration; }
  double delivered_min_dose() const { return min_dose * calibration; }
  double delivered_max_dose() const { return max_dose * calibration; }
  double delivered_max_per_day() const { return max_per_day * calibration; }
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
  // How sure the starting levels and the demand are (alkalinity, calcium, magnesium), when they
  // come from an estimate (apply_journal_basis fills them; absent = taken as exact). With them
  // the plan puts a 95 % band on every forecast level, pH and Omega, names the day to test again
  // and says what the room kept for the band costs (plan_bands.cpp). The time of the estimate
  // is the plan's start (day 1, 00:00).
  std::array<std::optional<estimate::LevelSpread>, 3> spread;
  // The limits as the keeper set them, before keep_room_for_uncertainty tightened `limits`:
  // the band is checked against these.
  std::optional<Limits> limits_as_set;
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
  std::string cap;          // empty, or the limit (or pump setting) that made this dose smaller than wanted
  WaterState before;        // just before the dose (the trough since the previous one)
  WaterState after;         // right after the dose (closed system, before gas exchange)
  WaterState before_next;   // just before the next dose event (after gas exchange and demand)
};

// One predicted state of the water on the plan's time line (minutes since the start of day 1).
struct Moment {
  double minute = 0;
  WaterState water;
  bool after_dose = false;
};

// A 95 % band (absent when the plan's start is taken as exact).
struct Band95 {
  double low = 0, high = 0;
};

struct DaySummary {
  int day = 1;
  WaterState start, end;
  // 95 % bands at the day's end of alkalinity, calcium, magnesium, pH (total) and Omega
  // aragonite, from the uncertainty of the starting levels and the demand (plan_bands.cpp).
  std::array<std::optional<Band95>, 3> end_band;
  std::optional<Band95> end_ph_band, end_omega_band;
  std::vector<double> amount_per_delivery;  // total mL or g per delivery that day
  // Largest rise and fall over any 24-hour window that ends during this day.
  double rise_alkalinity_dkh = 0, rise_calcium_mg_l = 0, rise_magnesium_mg_l = 0;
  double fall_alkalinity_dkh = 0, fall_calcium_mg_l = 0, fall_magnesium_mg_l = 0;
};

struct ReservoirEmpty {
  std::size_t delivery;
  int day;     // first day whose doses could not all be given
  int minute;
};

// Salinity left behind by dosing (Na, K, Cl, SO4), plan_salinity.cpp. A ramp doses more than
// holding does, so the weekly water change comes from the holding days and the ramp's extra is
// stated once, separately.
struct SalinityDrift {
  double per_day = 0;             // salinity units per day, averaged over the whole horizon
  double over_horizon = 0;
  bool holding_seen = false;      // the plan holds the levels on at least one day after its ramp
  int ramp_days = 0;              // days 1..ramp_days ramp the levels up (0: no ramp)
  double holding_per_day = 0;     // salinity units per day on the holding days (= per_day if none)
  double ramp_extra = 0;          // what the ramp days add above holding_per_day x ramp_days, once
  // Weekly water change (per cent of the volume) that holds the steady excess at the tolerance,
  // from holding_per_day: excess = 7 x holding_per_day / f at steady state.
  double water_change_percent_per_week = 0;
};
// Salinity units that a change of composition leaves in mass_kg of water (g per kg of Na, K,
// Cl, SO4, reference salinity to practical by 35 / 35.16504, Millero et al. 2008).
double salinity_added(const additives::ChemicalChange& added, double mass_kg);
// The drift from the salinity each day of the plan adds (day 1 first), the number of ramp days
// and the tolerance (salinity units, > 0).
SalinityDrift salinity_drift(const std::vector<double>& salinity_per_day, int ramp_days, double tolerance);
// The finding's sentence.
std::string salinity_drift_text(const SalinityDrift& drift, int horizon_days, double tolerance);

// What one parameter's additives can deliver at most per day against what the system consumes.
struct Shortfall {
  std::string parameter;          // "alkalinity", "calcium", "magnesium"
  std::string unit;               // "meq/day", "mg/day"
  double deliverable_per_day = 0; // every pump at its largest setting (limewater: evaporation)
  double consumed_per_day = 0;    // the demand
};

// A target in conflict with the limits at the room's CO2 (plan_targets.cpp): water held at the
// targets and left to settle with the room air (air equilibrium, no dose) already crosses a
// limit. Above a ceiling on pH or saturation after a dose, every dose would be held back; below
// a floor on pH or saturation, the water sits under it whenever it rests. Flagged in the
// verdict with the reason and the target that fits; the exit status stays the verdict's.
struct TargetConflict {
  LimitId limit;                  // the limit crossed at rest at the targets
  double ph_total = 0;            // air equilibrium at the targets (total scale)
  double omega_aragonite = 0;
  double value = 0, allowed = 0;  // the limit's quantity at the targets, and the limit
  // Highest alkalinity target (for a ceiling) or lowest (for a floor) whose air equilibrium
  // fits, at the calcium target; absent when none between the alkalinity floor and ceiling fits.
  std::optional<double> alkalinity_fit_dkh;
  // For saturation: the highest (ceiling) or lowest (floor) calcium target that fits at the
  // alkalinity target (saturation is proportional to calcium); absent for pH, and when it lies
  // outside the calcium floor and ceiling.
  std::optional<double> calcium_fit_mg_l;
  std::string message;            // plain words with the numbers
};

// A dose by hand at the plan's start, of the additive whose first dose comes too late, for water
// that crosses a floor on day 1 before the first dose that could lift it (plan_verdict.cpp).
struct StartDose {
  std::size_t delivery = 0;   // index into PlanInput::deliveries: the same additive, given by hand
  double amount = 0;          // mL or g
  int first_dose_minute = 0;  // the first dose on day 1 that could lift the water
  // True: on top of the plan's doses. False: the delivery's first doses give `amount` less (the
  // dose is moved earlier, the plan's total unchanged).
  bool on_top = false;
  bool keeps_limits = false;  // with it, the plan's doses replayed keep every limit
};
// The plan's verdict: whether the water stays inside every floor and largest fall. A plan that
// cannot hold says so first, in plain words and numbers (cmd_plan exits 3).
struct Verdict {
  bool holds = true;
  std::string headline;            // one sentence, "CANNOT HOLD: ..." or "Holds: ..."
  std::optional<LimitId> first_limit;  // the first floor or fall crossed, and when
  int first_day = 0, first_minute = 0;
  double first_value = 0, first_allowed = 0;
  std::vector<Shortfall> shortfalls;   // parameters whose additives deliver less than the demand
  std::vector<std::string> reasons;    // what is short, in plain words
  std::vector<std::string> fixes;      // which setting would hold it (pump mL/day, stock, doses/day)
  std::optional<StartDose> start_dose;  // the first fix, when a dose by hand at the start is it
  std::vector<TargetConflict> target_conflicts;  // targets the room air puts out of bounds (flags)
};

// When to test again: the first moment a 95 % band (of a level, or of pH or Omega from the
// levels' bands) would reach a limit as the keeper set it, or a level's estimate would grow
// stale (estimate::useful_horizon_days), whichever comes first; test before it.
struct Retest {
  int day = 1, minute = 0;        // test before this moment (day 1-based, minute of the day)
  std::string parameter;          // whose band or estimate sets it
  std::optional<LimitId> limit;   // the limit the band would reach (absent: staleness or plan end)
  std::string message;            // plain words with the date
};
// The room a plan from estimates keeps inside each limit, in standard deviations of the
// estimate behind it. The largest rise and fall a day keep 3 sd of the consumption estimate
// (the three-sigma rule: 99.7 % two-sided); levels, and pH and Omega from them, keep 1.96 sd
// (95 %) of the level estimate, the bands the plan shows. Measured in test_plan_simulation
// (2026-12-05), plans crossing a rise or fall limit on the true water while followed / plans
// saying they cannot hold the water, of about 17,500 plans (1,000 keepers):
//   1.96 sd everywhere: 23 / 141 (0.80 %)
//   3 sd everywhere:     0 / 291 (1.66 %)
//   3 sd for the rates, 1.96 sd for the levels (this):  0 / 189 (1.08 %)
// and of about 87,900 plans (5,000 keepers): 94 / 721 (0.82 %) at 1.96 sd, 6 / 1,022 (1.16 %) here.
// A wider room for the levels only made more plans say they cannot hold: the levels' crossings
// were dips on a plan's first day, before the pump's first dose. The doses changed by under 0.01 %.
constexpr double kRateRoomSd = 3.0;
double level_room_sd();  // estimate::z95()
// That room in words, for a tightened limit: "the 99.7 % band" (a rise or fall a day) or "the
// 95 % band" (a level, pH, Omega): "room for the 99.7 % band of the alkalinity consumption estimate".
const char* room_band(LimitId id);
// What keeping the band inside the limits costs, against the same plan with the limits as set.
struct MarginCost {
  std::vector<std::string> room;     // one line per tightened limit: as set -> planned
  std::array<std::optional<int>, 3> target_day_without_room;  // alkalinity, calcium, magnesium
  std::vector<double> amount_without_room;  // total mL or g per delivery over the horizon
  std::vector<double> amount_with_room;
  std::string effect;                // what it changes in the plan, plain words
  std::string summary;               // plain words: the room and the effect
};
struct PlanUncertainty {
  std::optional<Retest> retest;
  std::optional<MarginCost> cost;    // absent when no limit was tightened
};

struct Plan {
  std::optional<PlanUncertainty> uncertainty;  // when the input carries a spread
  std::vector<DoseRecord> doses;
  std::vector<DaySummary> days;
  std::vector<Moment> timeline;  // every predicted state: each slot, each dose, each day end
  std::array<std::optional<int>, 3> target_day;  // alkalinity, calcium, magnesium: first day ending in band
  std::vector<ReservoirEmpty> reservoirs_empty;
  SalinityDrift salinity;
  Verdict verdict;
  std::vector<std::string> findings;  // why a target is not reached safely, what was capped
  std::vector<std::string> cautions;  // for caustic and other hazardous additives
  Limits limits;                      // limits used, with their record of overrides
  WaterState start;
  const char* ph_scale = "total";
};

// ---------------------------------------------------------------- 4. Planning and checking
// Validates the input (errors name the field and the accepted range) and plans. A target that
// cannot be reached safely is not forced: the plan is the safe one that gets closest, and
// `findings` say which limit held it back. Floors and falls are not forced either: when the
// additives cannot hold the water inside them, `verdict` says so (what is short, from when, and
// what would fix it).
Result<Plan> make_plan(const PlanInput& input);

struct Violation {
  std::size_t dose;   // index into the dose list (or SIZE_MAX for a state between doses)
  int day;
  LimitId limit;
  double value;       // what the water reached (for a rise, fall or step: the change)
  double allowed;
  std::string message;
  int minute = 0;     // minute of the day
};
struct CheckReport {
  std::vector<Violation> violations;  // the first crossing of each limit
  std::array<int, kLimitCount> crossings{};  // how many checked states crossed each limit
  // Closest approach to each limit over every checked state, in the limit's unit (negative =
  // crossed; floors count once they apply); 1e9 when never tested.
  std::array<double, kLimitCount> closest{};
  std::vector<WaterState> after;  // recomputed state right after each dose
  std::vector<WaterState> day_end;  // recomputed state at the end of each day
  double max_ph_total = 0, max_omega_aragonite = 0;
  double min_ph_total = 1e9, min_omega_aragonite = 1e9;
  std::vector<std::string> other;  // pump, reservoir or evaporation limits broken
  bool ok() const { return violations.empty() && other.empty(); }
  // True when every violation is of a floor or a largest fall (what a verdict explains).
  bool only_floors_and_falls() const;
};
struct PlannedDose {
  int day;
  int minute;
  std::size_t delivery;
  double amount;
};
// Independent checker: replays a dose list from the input's starting state with its own code
// (calling the carbonate engine directly, never the scheduler), checks every state (each slot,
// each dose, each day end) against every limit and reports the first crossing of each.
CheckReport check_doses(const PlanInput& input, const std::vector<PlannedDose>& doses);
// The plan's doses as a keeper gives them who follows Verdict::start_dose: that dose by hand at
// 00:00 of day 1, then the plan's doses up to the end of `last_day`; unless the dose is on top,
// the same delivery's first ones that much smaller (a dose left at nothing is dropped).
std::vector<PlannedDose> doses_with_start_dose(const Plan& plan, const StartDose& start, int last_day);
CheckReport check_plan(const PlanInput& input, const Plan& plan);
// True when a limit is a floor or a largest fall.
bool is_floor_or_fall(LimitId id);

enum class Mishap { Missed, RanTwice };
struct WhatIf {
  std::size_t dose;
  Mishap mishap;
  int day = 1, minute = 0;
  double alkalinity_dkh_change = 0, calcium_mg_l_change = 0, magnesium_mg_l_change = 0;  // vs plan, end of day
  double ph_total_after = 0, omega_aragonite_after = 0;  // right after the (doubled) dose
  bool within_limits = true;
  // The limit the water comes closest to (or crosses) after the mishap, and how close: the
  // margin as a share of the limit (negative = crossed).
  std::optional<LimitId> closest_limit;
  double closest_value = 0, closest_allowed = 0, closest_margin = 1e9;
  std::string summary;
};
// How far one dose missed or given twice moves the water, and whether limits hold. The mishap
// is followed to the end of the next day (a keeper's next test); after that the plan goes on
// unchanged, so alkalinity, calcium and magnesium stay shifted by the dose: the rest of the plan
// is checked against floors and ceilings with that shift.
Result<WhatIf> what_if(const PlanInput& input, const Plan& plan, std::size_t dose, Mishap mishap);
// The worst missed dose and the worst doubled dose over EVERY dose of the plan (the one that
// comes closest to, or furthest past, a limit), with how many of them would cross a limit.
struct WorstMishap {
  Mishap mishap;
  std::size_t doses_tried = 0, doses_crossing = 0;
  WhatIf worst;
  std::string summary;
};
std::vector<WorstMishap> mishap_summary(const PlanInput& input, const Plan& plan);

// ---------------------------------------------------------------- 5. Text in and out
// JSON plan input (format documented in plan_json.cpp and README): fields as in PlanInput,
// strict: unknown keys are refused (naming the key and the nearest known one), start_date must
// be a real date, and the water (system.volume_l, salinity, temperature_c, alkalinity_dkh,
// calcium_mg_l, magnesium_mg_l) is required. With `left_to_journal`, a missing one of those is
// not an error but listed there, for the caller to fill from a journal and say so.
Result<PlanInput> plan_input_from_json(const std::string& json_text,
                                       std::vector<std::string>* left_to_journal = nullptr);
// The plan input file that plan_input_from_json reads back to the same input (the water, the
// targets, the demand, every additive as it was described, the limits as the keeper set them,
// the horizon and dates), so a plan made in the app can be made again with `tidewright plan`.
// Error (field "additives[i]") for an additive with no description a file can hold.
Result<std::string> plan_input_to_json(const PlanInput& input);
// The whole plan; "input" is plan_input_to_json's object (absent when it has none).
std::string plan_to_json(const PlanInput& input, const Plan& plan);
// RFC 4180 CSV, one row per dose, CRLF line ends, formula-safe cells.
std::string plan_to_csv(const PlanInput& input, const Plan& plan);
// RFC 5545 iCalendar: one VEVENT per dose given by hand (each with a VALARM reminder), or per
// dose of every device with IcsDoses::All (pumps dose by themselves: no reminder). CRLF, lines
// folded at 75 octets (never inside a UTF-8 sequence). Each UID names the system (a hash of its
// name), the plan's start, the dose and its delivery, so calendars of two systems never share
// one. dtstamp_utc: "YYYYMMDDTHHMMSSZ", a real UTC date-time (the caller's clock; the core has none).
enum class IcsDoses { HandOnly, All };
Result<std::string> plan_to_icalendar(const PlanInput& input, const Plan& plan, const std::string& dtstamp_utc,
                                      IcsDoses doses = IcsDoses::HandOnly);
// Plain text for print: the verdict first, then limits with sources, day table, findings, cautions.
std::string plan_to_text(const PlanInput& input, const Plan& plan);
// The verdict alone: its headline, then (when it cannot hold) what is short and what would fix
// it, then any target in conflict with the limits at the room's CO2.
std::string verdict_to_text(const Plan& plan);

// Targets against the limits at the room's CO2 (plan_targets.cpp): the water at the alkalinity
// and calcium targets, at the system's salinity and temperature, in equilibrium with the room
// air, checked against the pH and saturation ceilings after a dose and the pH and saturation
// floors. make_plan fills Verdict::target_conflicts with it; the app and CLI print its messages.
Result<std::vector<TargetConflict>> check_targets_at_air(const PlanInput& input);

}  // namespace tw::plan

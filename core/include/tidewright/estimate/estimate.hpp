// Consumption estimates: level and daily demand of alkalinity, calcium and magnesium from logged
// tests, with doses, water changes and top-off as known inputs (design.md "Consumption").
//
// Map of this header
//   1. Parameters and internal units
//   2. The plain input: a per-parameter series of events in time order
//   3. Filter options (noise model, prior, outlier rule) and their defaults
//   4. The estimate: Kalman filter + Rauch-Tung-Striebel smoother       (estimate_filter.cpp)
//   5. Reading the estimate: Ca:alkalinity ratio, forecast               (estimate_report.cpp)
//   6. Journal -> series adapter                                         (estimate_series.cpp)
//
// Model (per parameter, one independent filter each):
//   state x = [level, demand per day];  demand > 0 means the water loses that much per day.
//   between events, over dt days:  level <- level - demand*dt + w_level,  demand <- demand + w_demand
//   where demand is a random walk (white-noise rate of change, spectral density q_d) and the
//   level carries a small white noise of its own (q_l) for what the log does not record.
//   known addition:  level <- level + delta                       (dose, limewater top-off)
//   water change:    level <- (1-f) level + f c_new; demand unchanged (the animals still calcify
//                    at the same rate; demand is per litre of the same system volume)
//   test:            z = level + v, v ~ N(0, sigma^2) with sigma the kit's precision.
// Prior: the first test sets the level (variance sigma^2); the demand starts at 0 with a very
// wide sd (default 10x any plausible demand), so it is learned from the tests (a weak, nearly
// diffuse prior).
// Outliers: a test whose normalized innovation |z| = |reading - predicted| / sqrt(predicted
// variance + sigma^2) exceeds outlier_z (default 3.5: a correct reading lands there about once
// in 2,000 tests) is kept, reported with the reason, and left out of the update. Two flagged
// tests in a row on the same side are read as a real, unlogged change in level (a dose or water
// change missing from the log), not a misreading: the second one restarts the level.
//
// Units inside the core's estimate: as test kits read them (common practice):
//   alkalinity dKH, calcium mg/L, magnesium mg/L;  demand in those units per day;  time in days.
#pragma once

#include <cstddef>
#include <cstdint>
#include <optional>
#include <string>
#include <variant>
#include <vector>

#include "tidewright/journal/journal.hpp"
#include "tidewright/common/result.hpp"

namespace tw::estimate {

// ============================================================ 1. Parameters and units
// The dosed parameters of tw::Parameter (common/parameter.hpp: names, units "dKH", "mg/L").
using tw::Parameter;
inline constexpr auto& kAllParameters = kDosedParameters;

// ============================================================ 2. Plain input series
// One test result: value in the parameter's unit, sigma = the kit's precision (1 sd, > 0).
struct Measurement {
  double time_days = 0.0;
  double value = 0.0;
  double sigma = 0.0;
};
// A known instantaneous change of level (dose, limewater): delta in the parameter's unit,
// delta_sd its uncertainty (pump or scoop accuracy; 0 = exact).
struct Addition {
  double time_days = 0.0;
  double delta = 0.0;
  double delta_sd = 0.0;
};
// A water change: fraction_replaced of the volume (0..1) replaced by water at new_water_value.
struct Dilution {
  double time_days = 0.0;
  double fraction_replaced = 0.0;
  double new_water_value = 0.0;
  double new_water_sd = 0.0;  // uncertainty of new_water_value (0 = measured exactly)
};
using SeriesEvent = std::variant<Measurement, Addition, Dilution>;
double time_of(const SeriesEvent& e);

// A span in which doses may have been given that the log does not hold (a keeper who logged
// doses regularly, then stopped logging, with no schedule to say what the pumps do). Over
// such a span the level may have risen by up to about rate_sd_per_day per day (1 sd) more
// than the log says: the filter widens the prediction by rate_sd_per_day x (days of the span
// since the last test), so a test after the gap is judged against that wider band.
struct UnknownDosing {
  double from_days = 0.0;
  double to_days = 0.0;            // use kOpenEnd for "to the end and beyond"
  double rate_sd_per_day = 0.0;    // unit/day, >= 0
  double last_logged_days = 0.0;   // the last logged dose before the span (for messages)
};
inline constexpr double kOpenEnd = 1e9;

// Events must be in time order (equal times are applied in the given order).
struct Series {
  Parameter parameter = Parameter::Alkalinity;
  std::vector<SeriesEvent> events;
  std::vector<UnknownDosing> unknown_dosing;  // in time order, not overlapping
};

// ============================================================ 3. Filter options
struct FilterOptions {
  double demand_noise_sd_per_sqrt_day = 0.0;  // sqrt(q_d): demand random walk, unit/day/sqrt(day)
  double level_noise_sd_per_sqrt_day = 0.0;   // sqrt(q_l): unlogged level wander, unit/sqrt(day)
  double prior_demand = 0.0;                  // unit/day
  double prior_demand_sd = 0.0;               // unit/day; wide = weak prior
  double outlier_z = 3.5;                     // |normalized innovation| above this is flagged
  bool restart_on_two_outliers = true;        // two same-side flags in a row restart the level
  // The newest test is never discarded to protect the model: when it falls outside the band
  // it restarts the level, and the estimate reports the disagreement (Disagreement below).
  bool keep_newest_test = true;
  bool smooth = true;                         // also compute the RTS-smoothed history
};

// Defaults, chosen as follows (a judgement of common practice, not a published figure):
//   demand random walk: 0.03 dKH/day per sqrt(day) for alkalinity, i.e. the demand may drift by
//   about +/-0.16 dKH/day (1 sd) over a month -- about 15 % of a typical 1 dKH/day reef, which
//   follows coral growth and changes in feeding or lighting while a single kit error (0.2 dKH)
//   moves the estimate by only a few hundredths. Calcium uses the same in calcification
//   equivalents (x 7.147 mg/L per dKH, about 0.2 mg/L/day per sqrt(day)); magnesium 0.1.
//   level noise: 0.03 dKH, 0.2 mg/L Ca, 0.5 mg/L Mg per sqrt(day) (well under kit precision).
//   prior demand sd: 10 dKH/day, 100 mg/L/day Ca, 100 mg/L/day Mg (no tank consumes that).
FilterOptions default_filter_options(Parameter p);
Status check_options(const FilterOptions& o);

// ============================================================ 4. The estimate
enum class TestStatus {
  First,        // set the initial level
  Used,         // entered the update
  Flagged,      // outlier: kept in the log, left out of the update
  LevelRestart  // second same-side outlier in a row: read as a real, unlogged level change
};
const char* to_string(TestStatus s);

struct HistoryPoint {  // one per test, in time order
  double time_days = 0.0;
  double reading = 0.0;
  TestStatus status = TestStatus::Used;
  double level = 0.0, level_sd = 0.0;                  // filtered: known at that time
  double demand_per_day = 0.0, demand_sd = 0.0;        // filtered
  double smoothed_demand_per_day = 0.0, smoothed_demand_sd = 0.0;  // RTS: with later tests too
};

struct OutlierFlag {
  double time_days = 0.0;
  double reading = 0.0;
  double expected = 0.0, expected_sd = 0.0;  // predicted reading and its sd (state + kit)
  double z = 0.0;                            // normalized innovation
  std::string reason;                        // plain words
};

// The newest test and the log disagree: what the log alone predicted, by how much the test
// differs, the likely reasons and the question to put to the keeper. Reported (never a
// reason to drop the test) when the test is more than outlier_z sd of the log-only
// prediction (kit precision and the model's drift since the previous test) away.
struct Disagreement {
  double time_days = 0.0;
  double reading = 0.0;
  double expected = 0.0, expected_sd = 0.0;  // from the log alone (no allowance for unlogged dosing)
  double difference = 0.0;                   // reading - expected
  double z = 0.0;                            // difference / expected_sd
  double days_without_logged_dosing = 0.0;   // of the span before the test, 0 if none
  bool beyond_unlogged_allowance = false;    // also outside the band widened for unlogged dosing
  std::string reasons;                       // plain words: likely reasons
  std::string question;                      // plain words: which to trust, and how to tell
};

struct SeriesEstimate {
  Parameter parameter = Parameter::Alkalinity;
  std::size_t tests = 0;        // all tests in the series
  std::size_t tests_used = 0;   // tests that entered the estimate (First/Used/LevelRestart)
  bool demand_known = false;    // at least two used tests at different times
  double time_days = 0.0;       // time of the state below ("now")
  double level = 0.0, level_sd = 0.0;
  double level_demand_cov = 0.0;
  double demand_per_day = 0.0, demand_sd = 0.0;
  double demand_low95 = 0.0, demand_high95 = 0.0;  // demand +/- 1.959964 sd
  std::vector<HistoryPoint> history;
  std::vector<OutlierFlag> outliers;
  std::optional<Disagreement> disagreement;  // of the newest test, when it disagrees with the log
  std::optional<double> last_test_days;      // time of the newest test
  // Dosing the log cannot vouch for at the estimate's time: the rate sd of the open unknown
  // span (0 if none), and the part of level_sd it contributes since the newest test.
  double unknown_dosing_rate_sd = 0.0;
  double unknown_dosing_level_sd = 0.0;
};

// Useful horizon of a test: beyond it the last test says too little about today's level for
// an estimate to be given (it is reported as stale, with its date, instead) [our choice from
// common practice: keepers of calcifying systems test alkalinity about weekly, calcium every
// two weeks, magnesium monthly; the horizon is twice that]: 14, 30 and 60 days.
double useful_horizon_days(Parameter p);
// True when the series has a test and its newest is older than useful_horizon_days at now_days.
bool is_stale(const SeriesEstimate& e, double now_days);

// Runs the filter (and the smoother if options.smooth) over the series. now_days, if given
// and not before the last event, carries the state forward to that time. A series with no
// test gives demand_known = false and no error; errors are for bad input (order, sigma <= 0,
// fraction outside 0..1, non-finite numbers), naming the event index and field.
Result<SeriesEstimate> estimate_series(const Series& series, const FilterOptions& options,
                                       std::optional<double> now_days = std::nullopt);

// ============================================================ 5. Reading the estimate
// Calcification takes 1 mmol Ca per 2 meq alkalinity (Gazeau et al. 2015, MEPS 527, the
// alkalinity-anomaly basis): 20.04 mg/L Ca per meq/L, i.e. 7.147 mg/L Ca per dKH.
double calcium_mg_l_per_dkh_calcification_gazeau2015();

enum class RatioVerdict {
  NotEnoughData,            // either demand unknown (fewer than two usable tests)
  Inconclusive,             // the measured ratio's 95 % interval covers zero, or is wider than
                            // the ratio itself, or there is no ratio (alkalinity demand not
                            // clearly above zero): the data cannot tell
  Consistent,               // Ca demand within the uncertainty of 7.147 x alkalinity demand
  CalciumFasterThanAlkalinity,
  AlkalinityFasterThanCalcium
};
const char* to_string(RatioVerdict v);

struct CalciumAlkalinityReading {
  RatioVerdict verdict = RatioVerdict::NotEnoughData;
  double expected_mg_l_per_dkh = 7.147;
  bool ratio_valid = false;  // alkalinity demand clearly > 0 (its 95 % band above zero)
  double ratio_mg_l_per_dkh = 0.0, ratio_sd = 0.0;  // Ca demand / alk demand, delta method
  double excess_calcium_mg_l_per_day = 0.0;  // Ca demand - 7.147 x alkalinity demand
  double excess_sd = 0.0;                    // from both demands' sd (independent filters)
  std::string reading;                       // plain words, "possible reasons"
};
// The departure counts only when |excess| > 1.96 excess_sd (95 %).
CalciumAlkalinityReading read_calcium_alkalinity(const SeriesEstimate& alkalinity,
                                                 const SeriesEstimate& calcium);
// The same, read at now_days: when either parameter is stale (is_stale), the verdict is
// NotEnoughData and the reading names the stale one with its age, as a demand from tests
// months apart says nothing about today's ratio.
CalciumAlkalinityReading read_calcium_alkalinity(const SeriesEstimate& alkalinity,
                                                 const SeriesEstimate& calcium, double now_days);

// How the uncertainty of an estimated level grows when it is carried forward with known
// dosing: today's level sd, the level-demand covariance, the demand's sd, the filter's process
// noise and any unknown dosing (the same terms forecast_levels uses). The plan reads it to put
// a band on each forecast level.
struct LevelSpread {
  double level_sd = 0.0, level_demand_cov = 0.0, demand_sd = 0.0;
  double demand_noise_q = 0.0, level_noise_q = 0.0;  // per day^3 and per day (filter's q_d, q_l)
  double unknown_rate_sd = 0.0, unknown_level_sd = 0.0;
  // 1 sd of the level `days` (>= 0) after the estimate's time, with the dosing known exactly.
  double sd_after(double days) const;
};
LevelSpread spread_of(const SeriesEstimate& estimate, const FilterOptions& options);
// The two-sided 95 % point of the normal distribution (1.959964), one constant for every band.
double z95();

struct ForecastPoint {
  int day = 0;              // days after the estimate's time
  double time_days = 0.0;
  double level = 0.0, level_sd = 0.0;
  double low95 = 0.0, high95 = 0.0;
};
// Level for days 1..days under a steady daily dose effect (unit/day added by the current
// dosing), with the filter's process noise and any unknown dosing (estimate's
// unknown_dosing_rate_sd) carried forward. days 1..3650. Levels and bands are truncated at
// zero (no water holds a negative concentration).
Result<std::vector<ForecastPoint>> forecast_levels(const SeriesEstimate& estimate,
                                                   double daily_dose_effect_per_day, int days,
                                                   const FilterOptions& options);

// ============================================================ 6. Journal -> series
// One system's journal events as three series (estimate_series.cpp). Time: days since
// 1970-01-01T00:00Z (time_s / 86400). Each event becomes:
//   test of alkalinity/calcium/magnesium -> Measurement in dKH / mg/L, sigma = the test's kit
//     precision, else the table's typical_precision (0.2 dKH, 10 mg/L, 25 mg/L);
//   dose -> Addition to every parameter it changes: amount (g, or mL x stock g/L / 1000) of the
//     catalog compound x its change per mole / system volume (additives::rise_of);
//   limewater top-off -> Addition of volume x strength (g/L Ca(OH)2, saturated 1.50 g/L if
//     unset) of Ca(OH)2: +2 eq alkalinity, +1 Ca per mol, into the system volume (top-off
//     replaces evaporated water, so the volume stays);  plain top-off -> nothing (evaporation
//     concentrated the water and fresh water restores it: no change in concentration);
//   water change -> Dilution, f = change volume / system volume, new water at the logged value;
//     if the new water's value was not logged, the system's target is used with a wide sd
//     (new_water_unknown_sd) and a note; with no target either, the change is left out with
//     a note.
// Events that cannot be turned into chemistry (unknown additive, mL without stock strength)
// are skipped with a note, never fatal.
struct SystemSeries {
  journal::SystemId system_id = 0;
  std::string system_name;
  double volume_l = 0.0;
  double end_days = 0.0;  // the series run to here (options.until_s, else the last event)
  // Per parameter (kAllParameters order): the daily effect of the schedules running at
  // end_days (unit/day), and whether any schedule doses it then.
  double scheduled_per_day[3] = {0.0, 0.0, 0.0};
  bool scheduled[3] = {false, false, false};
  // Doses after the newest test of each parameter that could not be counted (unknown
  // strength, unknown additive): their number, reported with the forecast.
  int uncounted_after_last_test = 0;
  Series alkalinity{Parameter::Alkalinity, {}, {}};
  Series calcium{Parameter::Calcium, {}, {}};
  Series magnesium{Parameter::Magnesium, {}, {}};
  std::vector<std::string> notes;  // skipped or assumed events, plain words
  const Series& of(Parameter p) const;
};

struct JournalSeriesOptions {
  // sd of the new water's value when the target stands in for it [common practice: salt mixes
  // vary by batch]: 0.5 dKH, 20 mg/L Ca, 50 mg/L Mg.
  double new_water_unknown_sd[3] = {0.5, 20.0, 50.0};
  // "Now" (the caller's clock): standing schedules give their doses up to here, and a span
  // without logged dosing runs up to here. Unset: the system's last event.
  std::optional<std::int64_t> until_s;
};
// Standing schedules (journal/schedule.hpp) give Additions at each scheduled dose, with the
// pump's calibration and the logged missed/extra marks, exactly as logged doses would.
// Unknown dosing (Series::unknown_dosing): for each parameter with logged doses, a silence
// longer than max(3 x the usual spacing of its logged doses, 1 day) that no schedule covers
// is a span of unknown dosing from one usual spacing after the last logged dose, with
// rate_sd = the logged rate of the 14 days before the silence [our choice: 1 sd = "the keeper
// kept dosing as before without logging"].

// Errors: field "system" when the id is not in the journal.
Result<SystemSeries> series_from_journal(const journal::Journal& journal, journal::SystemId system,
                                         const JournalSeriesOptions& options = {});

// The window over which logged doses stand for the current dosing when no schedule runs
// (chosen here: a week, the usual rhythm of hand dosing), the app's and `demand`'s default.
inline constexpr double kRecentDosingWindowDays = 7.0;
// Average known addition per day over the window_days before the series' last event (or
// before until_days if given): sum of Addition deltas / window_days. The "current dosing"
// for a forecast when no schedule is given.
double recent_daily_addition(const Series& series, double window_days,
                             std::optional<double> until_days = std::nullopt);

}  // namespace tw::estimate

// The starting state and daily demand of a dose plan taken from a system's journal: volume,
// salinity and temperature (latest tests, else the system's defaults), the estimated level of
// alkalinity, calcium and magnesium at the last test and the estimated demand per day
// (estimate.hpp filter over series_from_journal), each with one line saying where it came from.
// No chemistry here: the journal adapter, the filter and plan::demand_from_per_litre do it.
#pragma once

#include <cstdint>
#include <optional>
#include <string>
#include <vector>

#include "tidewright/estimate/estimate.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/plan/plan.hpp"
#include "tidewright/common/result.hpp"

namespace tw::plan {

// One parameter's estimate (alkalinity dKH, calcium/magnesium mg/L), absent when the journal
// has no usable test of it.
struct JournalLevel {
  double level = 0, level_sd = 0;            // at the last test
  double demand_per_day = 0, demand_sd = 0;  // unit per day, > 0 = the water loses it
  double demand_low95 = 0, demand_high95 = 0;
  bool demand_known = false;                 // two used tests at different times
  std::string last_test_date;                // YYYY-MM-DD (UTC)
  estimate::LevelSpread spread;              // how the level's sd grows from now (plan bands)
};

struct JournalPlanBasis {
  std::string system_name;
  double volume_l = 0;
  double salinity = 35, temperature_c = 25;
  std::optional<JournalLevel> alkalinity_dkh, calcium_mg_l, magnesium_mg_l;
  DailyDemand demand;                // from the known demands (unknown or negative = 0)
  std::vector<std::string> provenance;  // one line per number, plain words
  std::vector<std::string> notes;       // events the adapter skipped or assumed
  std::vector<std::string> flags;       // disagreements between log and test, and stale levels accepted
};

// A system's current conditions from its journal, one rule for every screen and command:
// salinity from the latest salinity or specific-gravity test, whichever is newer (specific
// gravity converted with seawater::salinity_from_specific_gravity), else the system's default;
// temperature from the latest temperature test, else the default. Each with where it came
// from and its age.
struct Condition {
  double value = 0;
  std::optional<std::int64_t> time_s;  // of the test; unset = the system's default
  std::string source;                  // plain words, with the date and age
};
struct CurrentConditions {
  Condition salinity, temperature_c;
};
CurrentConditions current_conditions(const journal::Journal& journal, const journal::System& system,
                                     std::int64_t now_s);

// Errors: field "system" when the id is not in the journal; estimate errors pass through.
// With options.until_s (now), the levels are carried to now with the known inputs (standing
// schedules, logged doses); without it they are read at the last test, as before.
// A level is refused (field "stale", naming the parameter, its last test's date and what to
// test) when its last test is older than estimate::useful_horizon_days, or when dosing since
// that test is not known (no schedule, logged dosing stopped) and could have moved the level
// by more than its kit precision -- unless accept_stale. When the newest test disagreed with
// the log, the level starts from that test and the basis says so (flag_lines).
struct BasisOptions {
  estimate::JournalSeriesOptions series;
  bool accept_stale = false;
};
Result<JournalPlanBasis> plan_basis_from_journal(const journal::Journal& journal, journal::SystemId system,
                                                 const estimate::JournalSeriesOptions& options = {});
Result<JournalPlanBasis> plan_basis_from_journal(const journal::Journal& journal, journal::SystemId system,
                                                 const BasisOptions& options);

// Honest precision: tightens the limits by the uncertainty of the basis's estimates, so a plan
// from estimates does not run the true water over a limit: the largest rise and fall per day
// by kRateRoomSd (3) x the consumption's sd; a level's ceiling and floor by level_room_sd()
// (1.96) x the level's sd
// today; the pH and Omega ceilings after a dose and floors by the band those levels' bands give
// them at the input's water (never by more than a quarter of the room between a floor and its
// ceiling). The band widens as the plan goes on; the plan names the moment to test again
// before it reaches a limit as set (Plan::uncertainty). Sets input.spread and
// input.limits_as_set. One line per tightened limit. Called by apply_journal_basis, which has
// put the basis's levels into input.system.
void keep_room_for_uncertainty(const JournalPlanBasis& basis, PlanInput& input, std::vector<std::string>& lines);

// The basis's water into the input: salinity, temperature, and each parameter's estimated
// level and (when known) demand. A parameter without an estimate keeps the input's level and
// demand, one without a known demand its demand; the returned rows say which, with the values
// kept, for the caller to word.
struct KeptFromInput {
  const char* parameter = "";
  bool no_test = false;  // else: tested, demand unknown
  double level = 0, demand = 0;  // as kept (demand per system per day)
};
std::vector<KeptFromInput> put_basis_water(const JournalPlanBasis& basis, PlanInput& input);

// Overrides the input's system state and demand with the basis (and keeps room in the limits
// for the estimates' uncertainty, keep_room_for_uncertainty; input.spread and
// input.limits_as_set are set so the plan carries bands). A parameter without an
// estimate keeps the input's value (its level, and its demand if the demand is unknown); the
// returned lines say what was kept. Returns the provenance lines to show with the plan.
std::vector<std::string> apply_journal_basis(const JournalPlanBasis& basis, PlanInput& input);

}  // namespace tw::plan

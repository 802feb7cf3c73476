// The starting state and daily demand of a dose plan taken from a system's journal: volume,
// salinity and temperature (latest tests, else the system's defaults), the estimated level of
// alkalinity, calcium and magnesium at the last test and the estimated demand per day
// (estimate.hpp filter over series_from_journal), each with one line saying where it came from.
// No chemistry here: the journal adapter, the filter and plan::demand_from_per_litre do it.
#pragma once

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
};

struct JournalPlanBasis {
  std::string system_name;
  double volume_l = 0;
  double salinity = 35, temperature_c = 25;
  std::optional<JournalLevel> alkalinity_dkh, calcium_mg_l, magnesium_mg_l;
  DailyDemand demand;                // from the known demands (unknown or negative = 0)
  std::vector<std::string> provenance;  // one line per number, plain words
  std::vector<std::string> notes;       // events the adapter skipped or assumed
};

// Errors: field "system" when the id is not in the journal; estimate errors pass through.
Result<JournalPlanBasis> plan_basis_from_journal(const journal::Journal& journal, journal::SystemId system,
                                                 const estimate::JournalSeriesOptions& options = {});

// Overrides the input's system state and demand with the basis. A parameter without an
// estimate keeps the input's value (its level, and its demand if the demand is unknown); the
// returned lines say what was kept. Returns the provenance lines to show with the plan.
std::vector<std::string> apply_journal_basis(const JournalPlanBasis& basis, PlanInput& input);

}  // namespace tw::plan

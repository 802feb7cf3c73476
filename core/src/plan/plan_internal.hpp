// Internal to the planner's .cpp files: input validation shared by make_plan and the exports.
#pragma once

#include "tidewright/plan/plan.hpp"

namespace tw::plan::detail {

// Every field of the input in range; errors name the field ("system.volume_l",
// "deliveries[2].max_dose", ...) and the accepted range.
Status validate_input(const PlanInput& input);

// Minute of the day of slot j (0-based) of n doses spread evenly over first..last hour.
int slot_minute(const Delivery& d, int j);

}  // namespace tw::plan::detail

namespace tw::plan::detail {
// The known key nearest to `word` (edit distance), for "did you mean" in messages.
std::string nearest(const std::string& word, const std::vector<std::string>& known);
}  // namespace tw::plan::detail

namespace tw::plan::detail {
// Reads the plan's time line: each day's largest rise and fall over any 24 hours, and the
// verdict (floors and falls; what is short and what would fix it). plan_verdict.cpp.
void judge(const PlanInput& input, Plan& plan);
}  // namespace tw::plan::detail

namespace tw::plan::detail {
// start_date: a real calendar date YYYY-MM-DD (2026-02-30 is refused), field "start_date".
Status check_start_date(const std::string& date);
}  // namespace tw::plan::detail

namespace tw::plan::detail {
// How pH (total scale) and Omega aragonite move with the alkalinity and calcium levels in water
// that has settled with the room air: a level's uncertainty is days old and gas exchange takes
// hours, so the true water's DIC has followed its true alkalinity. Central differences of the
// carbonate engine (equilibrate_with_air) at the system's salinity, temperature and air.
struct ChemistrySensitivity {
  double ph_per_dkh = 0, omega_per_dkh = 0, omega_per_mg_l_calcium = 0;
};
Result<ChemistrySensitivity> chemistry_sensitivity(const SystemState& system, double alkalinity_dkh,
                                                   double calcium_mg_l);
// Half-widths of pH and Omega, z standard deviations wide, from the levels' standard
// uncertainties (linear propagation, alkalinity and calcium estimates independent: separate
// filters). z: estimate::z95() (95 %), for the bands shown and the room kept.
struct ChemistryHalfWidth {
  double ph = 0, omega = 0;
};
ChemistryHalfWidth chemistry_half_width(const ChemistrySensitivity& s, double alkalinity_sd, double calcium_sd, double z);
// Bands on the plan's days, the day to test again and what the room costs (plan_bands.cpp);
// make_plan calls it when the input carries a spread.
Status add_bands(const PlanInput& input, Plan& plan);
}  // namespace tw::plan::detail

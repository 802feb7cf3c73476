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

// The stocks a keeper's pumps can give in a plan made on a screen (the app's Plan) and how each
// pump's settings start: the magnesium stocks with their starting strengths, the doses a day
// and largest dose of a pump nobody has set, and which stock the journal shows the keeper
// dosing (a schedule, else a dose logged in the last weeks). Rules only; the screen calls them.
#pragma once

#include <cstdint>
#include <optional>
#include <span>

#include "tidewright/additives/additives.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/plan/plan_adopt.hpp"

namespace tw::plan {

// A pump nobody has set and no schedule describes: a few doses a day, at most 50 mL set per
// dose (common practice for hobby dosing pumps; the same values the Plan screen always had).
inline constexpr int kDefaultDosesPerDay = 4;
inline constexpr double kDefaultMaxDoseMl = 50.0;

// Magnesium stocks (grams of the compound as sold per litre of finished stock): common practice
// for hobby magnesium dosing, not a single source. Both are well under saturation at 10-40 C
// (the solubility tables in additives_catalog.cpp; checked in tests/unit/plan/test_plan_stocks.cpp).
inline constexpr double kStarterMagnesiumChlorideGPerL = 200.0;  // MgCl2.6H2O
inline constexpr double kStarterMagnesiumSulfateGPerL = 150.0;   // MgSO4.7H2O

struct PlanStock {
  additives::CompoundId compound;
  double starter_g_per_l = 0;
};
// The magnesium stocks a pump can give, chloride first (sulfate alone builds up sulfate: the
// compound's cautions say so, and a plan with it carries them).
std::span<const PlanStock> magnesium_stocks();

// What a pump's program starts at: its schedule's doses a day, and a largest dose no smaller
// than the amount the schedule sets now (a smaller default would refuse what already runs);
// without a schedule, kDefaultDosesPerDay and kDefaultMaxDoseMl.
struct PumpProgram {
  int doses_per_day = kDefaultDosesPerDay;
  double max_dose = kDefaultMaxDoseMl;  // set on the pump, mL
};
PumpProgram pump_program_from(const std::optional<ScheduledPump>& schedule);

// Which of `compounds` the journal shows the keeper dosing in `system`: the schedule running at
// now_s that gives one of them (the latest started), else the first that starts later (a plan
// adopted for tomorrow), else the newest dose logged by hand or pump (not a schedule's mark) in
// the last kStarterRecentDoseDays. None when there is no such schedule or dose.
struct DosedStock {
  additives::CompoundId compound;
  std::optional<double> stock_g_per_l;  // the schedule's or dose's stock in mL; unset = weighed in grams
  std::optional<ScheduledPump> pump;    // set when a schedule gives it
};
std::optional<DosedStock> dosed_stock_for(const journal::Journal& journal, journal::SystemId system,
                                          std::span<const additives::CompoundId> compounds, std::int64_t now_s);

}  // namespace tw::plan

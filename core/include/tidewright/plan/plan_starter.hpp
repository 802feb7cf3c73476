// A plan input to start from, built from a system's journal, so nobody has to write the plan
// input file by hand (`tidewright plan --starter`). Every number says where it came from:
// the water and the consumption by the core's one rule (plan_basis_from_journal), the targets
// the system's own or the parameter table's, the additives the pumps' running schedules, else
// the stocks dosed in the last weeks, else a starting pair of stocks to be changed.
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "tidewright/common/result.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/plan/plan.hpp"

namespace tw::plan {

// The starting stocks when the journal names none (grams of the compound as sold per litre of
// finished stock): the app's Plan screen offers the same. Common practice for hobby two-part
// dosing, not a single source; both are well below saturation at room temperature
// (facts.md solubility tables).
inline constexpr double kStarterSodaAshGPerL = 80.0;
inline constexpr double kStarterCalciumChlorideGPerL = 200.0;

// How far back logged doses name the additives when no schedule is running.
inline constexpr double kStarterRecentDoseDays = 42.0;

struct StarterInput {
  PlanInput input;
  // One line per choice, plain words: where the water, the targets, the consumption and each
  // additive came from, and what to check before using the file.
  std::vector<std::string> notes;
};

// now_s: the caller's clock (UTC seconds). Day 1 of the plan is the UTC day after now_s.
// Levels whose last test is old are taken anyway (the note says so): `plan --journal` judges
// them again when the plan is made. Errors: field "system" when the id is not in the journal;
// the estimate's errors pass through.
Result<StarterInput> starter_plan_input(const journal::Journal& journal, journal::SystemId system,
                                        std::int64_t now_s);

}  // namespace tw::plan

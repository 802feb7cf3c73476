// The farm overview's computation (farm.cpp) and the round of tests' action (farm_round.cpp).
#pragma once

#include <cstdint>
#include <string>
#include <vector>

#include "app_state.hpp"

namespace twapp {

// Recomputes app.ui.farm.cache when the journal's revision or the hour moved (cheap otherwise).
void refresh_farm(AppState& app);

// "5 h ago", "2 d ago".
std::string farm_age_text(std::int64_t now_s, std::int64_t then_s);
// Row i (kDosedParameters order) of a system: its newest reading in the system's units
// ("8.1 dKH", "no test"), and its daily use as the Demand screen prints it, with the unit
// ("1.06 dKH"; "" if unknown).
std::string farm_level_text(const FarmRow& row, size_t i);
std::string farm_demand_text(const FarmRow& row, size_t i);

// Saves the round of tests typed in app.ui.farm.round: every filled field becomes a test of its
// system at the round's time, all in one change of the journal and one save. The core checks
// each first; on the first refusal nothing is saved and the form's error names the system, the
// field and the accepted range. Empty fields are skipped. Returns how many tests were saved.
int save_round(AppState& app);

// A system is due a test when it has no test of alkalinity, calcium or magnesium, or the newest
// test of one it is tested for is too old to say today's level (estimate::is_stale, the rule
// that marks a level "old" on the overview).
bool due_a_test(const FarmRow& row);

// The systems the round of tests lists, in journal order: app.round_choice's, plus every system
// with a value typed. Due a test needs the overview's rows (refresh_farm builds them over a few
// frames); a system they do not cover yet counts as due.
std::vector<tw::journal::SystemId> round_systems(const AppState& app);

// Adds or takes away a system from the keeper's choice of the round's systems, and saves it.
void toggle_round_system(AppState& app, tw::journal::SystemId id);
void set_round_scope(AppState& app, RoundScope scope);

// A round field's parameter (alkalinity, calcium, magnesium, pH) and the unit it is typed in:
// the system's own (journal spelling, as the Log form logs it).
tw::Parameter round_parameter(int field);
std::string round_unit(const tw::journal::System& sys, int field);

// Widget name of a round field: "round.<system id>.<alk|ca|mg|ph>".
std::string round_field_name(tw::journal::SystemId id, int field);

}  // namespace twapp

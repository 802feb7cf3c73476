// The Plan and Hatchery settings of each system as the saved store keeps them: a member
// "dosing_by_system" of the app part (store.hpp), keyed by system id:
//   "dosing_by_system": { "3": { "plan": { "alkalinity_from": "sodium_carbonate",
//                                           "alkalinity_stock_g_per_l": 120, "alkalinity_doses_per_day": 6,
//                                           "alkalinity_pump_name": "Left doser" (null: not set),
//                                           "alkalinity_pump_calibration": 0.9 (null: not set), ... },
//                                 "hatchery": { "mode": "flow_through", "stock_g_per_l": 120, ... } } }
// Numbers are in the core's units (C, dKH, mg/L, L). Reading checks every value against the
// core's range table (tidewright/common/ranges.hpp) and the kit precision table; a value out
// of range, of the wrong type or an unknown name is refused with a message naming the setting
// and its accepted range, and the setting keeps its default. Systems the journal does not hold
// are dropped. A member missing keeps its default (an older store has none); a store from before
// each pump had its own program ("doses_per_day", "max_dose_ml" for both) gives both its
// stock pumps those values.
#pragma once

#include <map>
#include <string>
#include <vector>

#include <nlohmann/json.hpp>

#include "dosing_state.hpp"
#include "tidewright/journal/journal.hpp"

namespace twapp {

// Only the systems the journal holds.
nlohmann::json dosing_to_json(const std::map<tw::journal::SystemId, SystemDosing>& by_system,
                              const tw::journal::Journal& journal);

// One system's settings: {"plan": {...}, "hatchery": {...}} (also what the test interface shows).
nlohmann::json system_dosing_to_json(const SystemDosing& d);

// refused: one line per refused value ("Plan settings of Reef 2: Alkalinity pump doses per day 999 is
// outside the accepted range 1 to 288; its default is used").
std::map<tw::journal::SystemId, SystemDosing> dosing_from_json(const nlohmann::json& j,
                                                               const tw::journal::Journal& journal,
                                                               std::vector<std::string>* refused);

// The part of the forms that is saved (members that only say what the screen shows and the
// stale-level consent at their defaults).
SystemDosing saved_part(const PlanForm& plan, const HatcheryForm& hatchery);

}  // namespace twapp

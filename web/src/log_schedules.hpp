// The Log screen's card of standing dose schedules (journal/schedule.hpp): the current
// system's running schedules, each with change / stop and a missed or extra dose to log, and
// the ones an adopted plan starts later.
#pragma once

#include <cstdint>
#include <vector>

#include "app_state.hpp"

namespace twapp {

void draw_schedules(AppState& app, const tw::journal::System& sys);
// The system's schedules running at now_s or starting later (an adopted plan's), in start order.
std::vector<const tw::journal::Event*> schedules_now_and_later(const tw::journal::Journal& journal,
                                                               tw::journal::SystemId system, std::int64_t now_s);

}  // namespace twapp

// One function per screen, each in its own file screen_<name>.cpp. A screen draws from
// AppState and changes it only through actions (actions.hpp).
#pragma once

#include "app_state.hpp"

namespace twapp {

void draw_systems(AppState& app);   // screen_systems.cpp
void draw_log(AppState& app);       // screen_log.cpp
void draw_water(AppState& app);     // screen_water.cpp
void draw_settings(AppState& app);  // screen_settings.cpp
void draw_demand(AppState& app);    // screen_demand.cpp
void draw_hatchery(AppState& app);  // screen_hatchery.cpp
void draw_mixes(AppState& app);     // screen_mixes.cpp
void draw_plan(AppState& app);      // screen_plan.cpp

// Views of the Systems screen: the farm overview (screen_farm.cpp) and the round of tests for
// many systems at once (farm_round.cpp).
void draw_farm_overview(AppState& app);
void draw_round(AppState& app);

// The Demand screen's card: a calcium reactor's net daily addition against the estimated
// consumption (demand_reactor.cpp).
void draw_reactor_check(AppState& app);

// The Settings screen's "Your data": exports, import and the preview of a picked file
// (settings_data.cpp).
void draw_settings_data(AppState& app);

// The Plan's stock cards: alkalinity, calcium and magnesium, each with its pump
// (plan_stock_cards.cpp).
void draw_plan_stock_cards(AppState& app, PlanForm& f);

// Carbonate species across pH with this water marked (chart_species.cpp).
void draw_species_chart(AppState& app);

}  // namespace twapp

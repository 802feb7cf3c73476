// Navigation: a bottom tab bar on phones, a rail on the left on wide screens, and the
// header with the quick system switch. The tab table lives in nav.cpp (kTabs).
#pragma once

#include "app_state.hpp"
#include "imgui.h"

namespace twapp {

// Draws the screen of app.ui.screen (dispatch through kTabs).
void draw_current_screen(AppState& app);
// Tabs in a row (horizontal) or a column (vertical) filling the rectangle at pos/size.
void draw_tabs(AppState& app, ImVec2 pos, ImVec2 size, bool vertical);
// Top bar: app name, current system; tapping the system opens the quick switch list.
void draw_header(AppState& app, float height);

}  // namespace twapp

// What the browser tests read: the app's state as JSON and the rectangles of named widgets
// (recorded each frame by ui::record), so a test can tap "tab.water" by name. The browser
// exports are in platform_web.cpp (tw_test_*).
#pragma once

#include <string>

#include "app_state.hpp"

namespace twapp::test_api {

void attach(AppState* app);
// {"screen":"water","systems":[...],"current_system":1,"latest":{...},"water":{...},...}
std::string state_json();
// The whole journal in the JSON file format (journal_file.hpp): what an import added.
std::string journal_json();
// {"name":"tab.water","found":true,"visible":true,"x":..,"y":..,"w":..,"h":..} in CSS pixels
// (device pixels divided by pixel_ratio).
std::string widget_json(const std::string& name, float pixel_ratio);
std::string widgets_json(float pixel_ratio);  // all of this frame's named widgets
void reveal(const std::string& name);         // scroll it into view on the next frame
// {"frames":N,"median_ms":..,"worst_ms":..,"p95_ms":..}
std::string frame_stats_json();
void reset_frame_stats();

}  // namespace twapp::test_api

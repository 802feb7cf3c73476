// The Water screen's numbers: inputs filled from the journal's latest readings, and the
// carbonate state computed by the core when the inputs change (never every frame).
#pragma once

#include "app_state.hpp"

namespace twapp {

// Latest test results of the current system, as canonical values (dKH, pH on its scale, psu, C).
struct LatestReadings {
  std::optional<double> alkalinity_dkh;
  std::optional<double> ph;
  std::optional<tw::carbonate::PhScale> ph_scale;
  std::optional<double> salinity;
  std::optional<double> temperature_c;
  std::optional<double> calcium_mg_l;
  std::optional<double> magnesium_mg_l;
  std::int64_t alkalinity_time_s = 0, ph_time_s = 0, calcium_time_s = 0, magnesium_time_s = 0;
};
LatestReadings latest_readings(const AppState& app);

// Fills app.water from the latest readings (if not a what-if) and recomputes app.water_result
// when app.revision moved since the last result. Cheap to call every frame.
void refresh_water(AppState& app);

}  // namespace twapp

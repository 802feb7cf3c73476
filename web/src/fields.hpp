// Fields that repeat across screens: shown in the user's units, bounded by the core's range
// table (tidewright/common/ranges.hpp), written back in the core's units (C, dKH). A screen
// calls these instead of converting and bounding a temperature or an alkalinity itself.
#pragma once

#include <cstdint>
#include <optional>
#include <string>

#include "app_state.hpp"
#include "tidewright/carbonate/carbonate.hpp"
#include "tidewright/common/ranges.hpp"

namespace twapp::fields {

// The units shown for the current system (the app's own settings when there is none).
tw::journal::UnitPreferences units(const AppState& app);

// A temperature kept in C; shown and typed in `unit`, `range_c` converted with it.
bool temperature(AppState& app, const std::string& name, const char* label, double* celsius,
                 tw::units::TemperatureUnit unit, const tw::ranges::Range& range_c = tw::ranges::kTemperatureC);

// The same, for a temperature that may be left empty ("Tap to enter").
bool optional_temperature(AppState& app, const std::string& name, const char* label, std::optional<double>* celsius,
                          tw::units::TemperatureUnit unit, const tw::ranges::Range& range_c = tw::ranges::kTemperatureC);

// An alkalinity kept in dKH; shown and typed in `unit`.
bool alkalinity(AppState& app, const std::string& name, const char* label, double* dkh,
                tw::units::AlkalinityUnit unit, const tw::ranges::Range& range_dkh = tw::ranges::kAlkalinityDkh);

// The pH scales in the order every screen lists them.
inline constexpr tw::carbonate::PhScale kPhScales[] = {tw::carbonate::PhScale::NBS, tw::carbonate::PhScale::Total,
                                                       tw::carbonate::PhScale::Seawater, tw::carbonate::PhScale::Free};

// The pH scale a reading is on: a choice of kPhScales.
bool ph_scale(AppState& app, const std::string& name, const char* label, tw::carbonate::PhScale* scale);

// When an entry happened: "Now" (empty) or a local date and time typed or stepped back by an
// hour or a day. Widgets <prefix>.when, <prefix>.time, <prefix>.time.hour_earlier / day_earlier.
void when(AppState& app, const std::string& prefix, std::optional<std::int64_t>* when_s);

}  // namespace twapp::fields

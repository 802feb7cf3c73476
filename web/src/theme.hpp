// Look of the app: our own dark palette for dim rooms, the style scaled once by
// (pixel ratio x text size), and the embedded Roboto fonts built at that scale.
#pragma once

#include "app_state.hpp"
#include "imgui.h"

namespace twapp::theme {

// Palette (sRGB). Dark blue-green background, soft off-white text, teal accent; warning and
// error hues kept dim enough not to dazzle in a dark fish room.
inline constexpr ImU32 kBackground = IM_COL32(11, 20, 24, 255);
inline constexpr ImU32 kSurface = IM_COL32(20, 35, 42, 255);
inline constexpr ImU32 kSurfaceHigh = IM_COL32(31, 50, 59, 255);
inline constexpr ImU32 kBorder = IM_COL32(52, 76, 86, 255);
inline constexpr ImU32 kText = IM_COL32(214, 228, 232, 255);
inline constexpr ImU32 kTextDim = IM_COL32(143, 169, 177, 255);
inline constexpr ImU32 kAccent = IM_COL32(79, 194, 176, 255);
inline constexpr ImU32 kAccentDark = IM_COL32(40, 120, 108, 255);
inline constexpr ImU32 kWarning = IM_COL32(224, 176, 79, 255);
inline constexpr ImU32 kError = IM_COL32(232, 122, 106, 255);
// Species on the chart: CO2* amber, HCO3- teal, CO3-- periwinkle.
inline constexpr ImU32 kCo2 = IM_COL32(224, 176, 79, 255);
inline constexpr ImU32 kHco3 = IM_COL32(79, 194, 176, 255);
inline constexpr ImU32 kCo3 = IM_COL32(150, 160, 255, 255);

inline constexpr float kBaseFontPx = 17.0f;  // text size at scale 1 (CSS pixels)

// Builds the font atlas at the given scale (device pixels per CSS pixel x text size) and
// applies the style. Call outside a frame; the renderer's font texture is rebuilt by the caller.
void build(UiState& ui, float scale);

ImVec4 color(ImU32 c);

}  // namespace twapp::theme

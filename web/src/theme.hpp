// Look of the app: a dark or a light palette (Settings), the style scaled once by
// (pixel ratio x text size), and the embedded Roboto fonts built at that scale.
#pragma once

#include <optional>
#include <string>

#include "app_state.hpp"
#include "imgui.h"

namespace twapp::theme {

// The two looks (Settings, app_state.hpp Look): our own dark palette for dim fish rooms, the
// default, and a light one for bright rooms and sunlight. Colours are sRGB. WCAG 2 contrast
// ratios of the light look, computed for these values: text, dim text, accent, warning and
// error at least 4.77:1 on every surface (AA asks 4.5:1); chart lines at least 3.29:1 (3:1
// for graphics); text on the tinted buttons and message strips at least 11:1.
struct Palette {
  ImU32 background, surface, surface_high, border, text, text_dim, accent, accent_dark, warning, error;
  ImU32 co2, hco3, co3;  // species on the charts: CO2* amber, HCO3- teal, CO3-- periwinkle
  // Controls and marks: hovered surfaces, a primary button hovered, a danger button (rest,
  // hovered, pressed), a card's edge, chart grid lines, the two message strips.
  ImU32 hover, primary_hover, danger, danger_hover, danger_active, card_edge, grid, message_ok, message_error;
};
inline constexpr Palette kDarkPalette{
    IM_COL32(11, 20, 24, 255),   IM_COL32(20, 35, 42, 255),    IM_COL32(31, 50, 59, 255),
    IM_COL32(52, 76, 86, 255),   IM_COL32(214, 228, 232, 255), IM_COL32(143, 169, 177, 255),
    IM_COL32(79, 194, 176, 255), IM_COL32(40, 120, 108, 255),  IM_COL32(224, 176, 79, 255),
    IM_COL32(232, 122, 106, 255),
    IM_COL32(224, 176, 79, 255), IM_COL32(79, 194, 176, 255),  IM_COL32(150, 160, 255, 255),
    IM_COL32(42, 66, 77, 255),   IM_COL32(50, 140, 126, 255),  IM_COL32(92, 40, 36, 255),
    IM_COL32(120, 52, 46, 255),  IM_COL32(150, 64, 56, 255),   IM_COL32(38, 58, 67, 255),
    IM_COL32(52, 76, 86, 255),   IM_COL32(28, 92, 84, 255),    IM_COL32(110, 44, 38, 255)};
inline constexpr Palette kLightPalette{
    IM_COL32(240, 244, 243, 255), IM_COL32(255, 255, 255, 255), IM_COL32(222, 231, 232, 255),
    IM_COL32(150, 170, 175, 255), IM_COL32(18, 32, 38, 255),    IM_COL32(70, 90, 97, 255),
    IM_COL32(0, 112, 99, 255),    IM_COL32(168, 222, 212, 255), IM_COL32(140, 86, 0, 255),
    IM_COL32(176, 42, 30, 255),
    IM_COL32(176, 110, 0, 255),   IM_COL32(0, 128, 112, 255),   IM_COL32(70, 80, 200, 255),
    IM_COL32(205, 218, 220, 255), IM_COL32(140, 208, 196, 255), IM_COL32(246, 204, 198, 255),
    IM_COL32(240, 184, 176, 255), IM_COL32(230, 160, 150, 255), IM_COL32(200, 212, 214, 255),
    IM_COL32(150, 170, 175, 255), IM_COL32(196, 234, 226, 255), IM_COL32(250, 210, 204, 255)};

// The palette in use: every drawing reads these (use_look sets them), so no colour is written
// elsewhere. They start as the dark look.
inline ImU32 kBackground = kDarkPalette.background, kSurface = kDarkPalette.surface,
             kSurfaceHigh = kDarkPalette.surface_high, kBorder = kDarkPalette.border, kText = kDarkPalette.text,
             kTextDim = kDarkPalette.text_dim, kAccent = kDarkPalette.accent, kAccentDark = kDarkPalette.accent_dark,
             kWarning = kDarkPalette.warning, kError = kDarkPalette.error;
inline ImU32 kCo2 = kDarkPalette.co2, kHco3 = kDarkPalette.hco3, kCo3 = kDarkPalette.co3;
inline ImU32 kHover = kDarkPalette.hover, kPrimaryHover = kDarkPalette.primary_hover, kDanger = kDarkPalette.danger,
             kDangerHover = kDarkPalette.danger_hover, kDangerActive = kDarkPalette.danger_active,
             kCardEdge = kDarkPalette.card_edge, kGrid = kDarkPalette.grid, kMessageOk = kDarkPalette.message_ok,
             kMessageError = kDarkPalette.message_error;

const char* to_string(Look look);  // "dark", "light" (saved settings)
std::optional<Look> look_from_string(const std::string& text);

// The colour c with alpha a (0..255): grid lines, shaded strips, pills.
ImU32 with_alpha(ImU32 c, int a);

// Sets the colours above to a look's palette (the style is applied by build or apply_look).
void use_look(Look look);

inline constexpr float kBaseFontPx = 17.0f;  // text size at scale 1 (CSS pixels)

// Builds the font atlas at the given scale (device pixels per CSS pixel x text size) and
// applies the style. Call outside a frame; the renderer's font texture is rebuilt by the caller.
void build(UiState& ui, float scale, Look look);
// Applies another look at the current scale (no font rebuild).
void apply_look(Look look, float scale);

ImVec4 color(ImU32 c);

}  // namespace twapp::theme

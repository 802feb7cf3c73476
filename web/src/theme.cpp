// Fonts are embedded C arrays (web/cmake/embed.cmake), never files read at run time.
#include "theme.hpp"

extern const unsigned char tw_font_regular[];
extern const unsigned long tw_font_regular_size;

namespace twapp::theme {

ImVec4 color(ImU32 c) { return ImGui::ColorConvertU32ToFloat4(c); }

ImU32 with_alpha(ImU32 c, int a) { return (c & ~IM_COL32_A_MASK) | (static_cast<ImU32>(a & 0xFF) << IM_COL32_A_SHIFT); }

const char* to_string(Look look) { return look == Look::Light ? "light" : "dark"; }

std::optional<Look> look_from_string(const std::string& text) {
  if (text == "dark") return Look::Dark;
  if (text == "light") return Look::Light;
  return std::nullopt;
}

void use_look(Look look) {
  const Palette& p = look == Look::Light ? kLightPalette : kDarkPalette;
  kBackground = p.background, kSurface = p.surface, kSurfaceHigh = p.surface_high, kBorder = p.border;
  kText = p.text, kTextDim = p.text_dim, kAccent = p.accent, kAccentDark = p.accent_dark;
  kWarning = p.warning, kError = p.error, kCo2 = p.co2, kHco3 = p.hco3, kCo3 = p.co3;
  kHover = p.hover, kPrimaryHover = p.primary_hover, kDanger = p.danger, kDangerHover = p.danger_hover;
  kDangerActive = p.danger_active, kCardEdge = p.card_edge, kGrid = p.grid;
  kMessageOk = p.message_ok, kMessageError = p.message_error;
}

namespace {

// Latin-1, Greek (Omega, mu), dashes and quotes, super- and subscripts (CO₂, CO₃²⁻), minus,
// approximately, less/greater-or-equal. The embedded font holds only these characters: after
// changing a list, run assets/fonts/make_font_subset.py (it reads the lists from here).
const ImWchar kGlyphRanges[] = {0x0020, 0x00FF, 0x0394, 0x0394, 0x03A9, 0x03A9, 0x03B2, 0x03B2, 0x03BC, 0x03BC,
                                0x2009, 0x2026, 0x2070, 0x208E, 0x2212, 0x2212, 0x2248, 0x2248,
                                0x2264, 0x2265, 0};
// The big font only shows numbers and short words.
const ImWchar kBigGlyphRanges[] = {0x0020, 0x007E, 0x03A9, 0x03A9, 0x2212, 0x2212, 0};

ImFont* add_font(const unsigned char* data, unsigned long size, float px, const ImWchar* ranges) {
  ImFontConfig config;
  config.FontDataOwnedByAtlas = false;  // static data: the atlas must not free it
  // Horizontal oversampling sharpens small text on 1x screens; at 2x and more it only costs
  // atlas memory.
  config.OversampleH = px < 30 ? 2 : 1;
  config.OversampleV = 1;
  config.PixelSnapH = true;
  return ImGui::GetIO().Fonts->AddFontFromMemoryTTF(const_cast<unsigned char*>(data),
                                                    static_cast<int>(size), px, &config, ranges);
}

void apply_style(float scale) {
  ImGuiStyle style;  // fresh copy each time: ScaleAllSizes must be applied exactly once
  ImGui::StyleColorsDark(&style);  // every colour the app shows is set below, from the palette
  style.WindowPadding = ImVec2(14, 12);
  style.FramePadding = ImVec2(12, 10);
  style.ItemSpacing = ImVec2(10, 10);
  style.ItemInnerSpacing = ImVec2(8, 6);
  style.TouchExtraPadding = ImVec2(2, 2);
  style.ScrollbarSize = 6;
  style.GrabMinSize = 20;
  style.WindowRounding = 0;
  style.ChildRounding = 10;
  style.FrameRounding = 10;
  style.PopupRounding = 10;
  style.GrabRounding = 10;
  style.ScrollbarRounding = 6;
  style.WindowBorderSize = 0;
  style.FrameBorderSize = 1;
  style.PopupBorderSize = 1;
  ImVec4* c = style.Colors;
  c[ImGuiCol_Text] = color(kText);
  c[ImGuiCol_TextDisabled] = color(kTextDim);
  c[ImGuiCol_WindowBg] = color(kBackground);
  c[ImGuiCol_ChildBg] = ImVec4(0, 0, 0, 0);
  c[ImGuiCol_PopupBg] = color(kSurfaceHigh);
  c[ImGuiCol_Border] = color(kBorder);
  c[ImGuiCol_FrameBg] = color(kSurface);
  c[ImGuiCol_FrameBgHovered] = color(kSurfaceHigh);
  c[ImGuiCol_FrameBgActive] = color(kSurfaceHigh);
  c[ImGuiCol_Button] = color(kSurfaceHigh);
  c[ImGuiCol_ButtonHovered] = color(kHover);
  c[ImGuiCol_ButtonActive] = color(kAccentDark);
  c[ImGuiCol_Header] = color(kSurfaceHigh);
  c[ImGuiCol_HeaderHovered] = color(kHover);
  c[ImGuiCol_HeaderActive] = color(kAccentDark);
  c[ImGuiCol_CheckMark] = color(kAccent);
  c[ImGuiCol_SliderGrab] = color(kAccent);
  c[ImGuiCol_SliderGrabActive] = color(kAccent);
  c[ImGuiCol_Separator] = color(kBorder);
  c[ImGuiCol_ScrollbarBg] = ImVec4(0, 0, 0, 0);
  c[ImGuiCol_ScrollbarGrab] = color(kBorder);
  c[ImGuiCol_NavHighlight] = color(kAccent);
  c[ImGuiCol_TextSelectedBg] = color(kAccentDark);
  c[ImGuiCol_ModalWindowDimBg] = color(with_alpha(kBackground, 150));
  style.ScaleAllSizes(scale);
  ImGui::GetStyle() = style;
}

}  // namespace

void apply_look(Look look, float scale) {
  use_look(look);
  apply_style(scale);
}

void build(UiState& ui, float scale, Look look) {
  ImGuiIO& io = ImGui::GetIO();
  io.Fonts->Clear();
  // The atlas is as tall as its glyphs need, not rounded up to a power of two (WebGL2 and
  // OpenGL 3 take any size): at a phone's 3x that is about half the texture to convert to RGBA
  // and upload at the start.
  io.Fonts->Flags |= ImFontAtlasFlags_NoPowerOfTwoHeight;
  const float px = kBaseFontPx * scale;
  ui.fonts.body = add_font(tw_font_regular, tw_font_regular_size, px, kGlyphRanges);
  // One embedded face (Roboto Regular) keeps the download small, and one atlas entry per size
  // keeps the start fast: "bold" is the body font (headings get the accent colour instead).
  ui.fonts.bold = ui.fonts.body;
  ui.fonts.small = add_font(tw_font_regular, tw_font_regular_size, px * 0.8f, kBigGlyphRanges);
  ui.fonts.big = add_font(tw_font_regular, tw_font_regular_size, px * 1.9f, kBigGlyphRanges);
  io.Fonts->Build();
  io.FontDefault = ui.fonts.body;
  apply_look(look, scale);
  ui.em = px;
  ui.fonts_built_for = scale;
}

}  // namespace twapp::theme

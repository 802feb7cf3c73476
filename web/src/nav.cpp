#include "nav.hpp"

#include <algorithm>
#include <cmath>

#include "actions.hpp"
#include "icons_dosing.hpp"
#include "imgui_internal.h"  // RenderArrow
#include "screens.hpp"
#include "theme.hpp"
#include "pick_list.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

using IconFn = void (*)(ImDrawList*, ImVec2 c, float s, ImU32 col);

// Icons of our own, drawn with lines: s is half the icon size.
void icon_systems(ImDrawList* d, ImVec2 c, float s, ImU32 col) {  // a tank with water in it
  const float t = s * 0.16f;
  d->AddRect(ImVec2(c.x - s, c.y - s * 0.75f), ImVec2(c.x + s, c.y + s * 0.75f), col, s * 0.2f, 0, t);
  for (int i = 0; i < 8; ++i) {
    const float x0 = c.x - s * 0.7f + s * 0.175f * static_cast<float>(i);
    const float y0 = c.y - s * 0.05f + std::sin(static_cast<float>(i) * 1.6f) * s * 0.12f;
    const float y1 = c.y - s * 0.05f + std::sin(static_cast<float>(i + 1) * 1.6f) * s * 0.12f;
    d->AddLine(ImVec2(x0, y0), ImVec2(x0 + s * 0.175f, y1), col, t);
  }
  d->AddLine(ImVec2(c.x - s * 0.6f, c.y + s * 0.4f), ImVec2(c.x + s * 0.6f, c.y + s * 0.4f), col, t);
}
void icon_log(ImDrawList* d, ImVec2 c, float s, ImU32 col) {  // a page with lines and a tick
  const float t = s * 0.16f;
  d->AddRect(ImVec2(c.x - s * 0.75f, c.y - s), ImVec2(c.x + s * 0.75f, c.y + s), col, s * 0.2f, 0, t);
  for (int i = 0; i < 3; ++i) {
    const float y = c.y - s * 0.45f + s * 0.45f * static_cast<float>(i);
    d->AddLine(ImVec2(c.x - s * 0.4f, y), ImVec2(c.x + s * 0.4f, y), col, t);
  }
}
void icon_water(ImDrawList* d, ImVec2 c, float s, ImU32 col) {  // a drop
  const float r = s * 0.62f;
  const ImVec2 base(c.x, c.y + s * 0.3f);
  d->PathArcTo(base, r, 3.14159f * -0.15f, 3.14159f * 1.15f, 20);
  d->PathLineTo(ImVec2(c.x, c.y - s));
  d->PathFillConvex(col);
}
void icon_settings(ImDrawList* d, ImVec2 c, float s, ImU32 col) {  // three sliders
  const float t = s * 0.16f;
  const float knob[3] = {-0.35f, 0.4f, -0.05f};
  for (int i = 0; i < 3; ++i) {
    const float y = c.y - s * 0.7f + s * 0.7f * static_cast<float>(i);
    d->AddLine(ImVec2(c.x - s, y), ImVec2(c.x + s, y), col, t);
    d->AddCircleFilled(ImVec2(c.x + knob[i] * s * 1.6f, y), s * 0.26f, col);
  }
}

struct Tab {
  Screen screen;
  const char* label;
  const char* name;  // widget name for tests: "tab.<screen>"
  IconFn icon;
  void (*draw)(AppState&);
};

// The tab table. Screens that are not built yet are not listed (no placeholders).
const Tab kTabs[] = {
    {Screen::Systems, "Systems", "tab.systems", icon_systems, draw_systems},
    {Screen::Log, "Log", "tab.log", icon_log, draw_log},
    {Screen::Water, "Water", "tab.water", icon_water, draw_water},
    {Screen::Demand, "Demand", "tab.demand", icons::demand, draw_demand},
    {Screen::Plan, "Plan", "tab.plan", icons::plan, draw_plan},
    {Screen::Hatchery, "Hatchery", "tab.hatchery", icons::hatchery, draw_hatchery},
    {Screen::Mixes, "Mixes", "tab.mixes", icons::mixes, draw_mixes},
    {Screen::Settings, "Settings", "tab.settings", icon_settings, draw_settings},
};

}  // namespace

void draw_current_screen(AppState& app) {
  for (const Tab& t : kTabs) {
    if (t.screen == app.ui.screen) {
      t.draw(app);
      return;
    }
  }
  kTabs[0].draw(app);
}

void draw_tabs(AppState& app, ImVec2 pos, ImVec2 size, bool vertical) {
  const float e = ui::em(app);
  ImDrawList* d = ImGui::GetWindowDrawList();
  d->AddRectFilled(pos, ImVec2(pos.x + size.x, pos.y + size.y), theme::kSurface);
  if (vertical) {
    d->AddLine(ImVec2(pos.x + size.x - 1, pos.y), ImVec2(pos.x + size.x - 1, pos.y + size.y), theme::kBorder);
  } else {
    d->AddLine(pos, ImVec2(pos.x + size.x, pos.y), theme::kBorder);
  }
  const int n = static_cast<int>(sizeof kTabs / sizeof kTabs[0]);
  // Down the side (desktop) the tabs share the height when 4.2 em each would not fit (large
  // text on a short screen): the last tab must stay reachable.
  const ImVec2 cell = vertical ? ImVec2(size.x, std::min(4.2f * e, (size.y - e) / static_cast<float>(n)))
                               : ImVec2(size.x / static_cast<float>(n), size.y);
  // All labels use the small font when any of them would not fit its cell (eight tabs on a
  // phone), and are drawn smaller still when even that does not fit (the largest text sizes):
  // labels never run into each other.
  bool small_labels = false;
  ImGui::PushFont(app.ui.fonts.bold);
  for (int i = 0; i < n; ++i) small_labels |= ImGui::CalcTextSize(kTabs[i].label).x > cell.x - 0.3f * e;
  ImGui::PopFont();
  float label_scale = 1.0f;
  if (small_labels) {
    ImGui::PushFont(app.ui.fonts.small);
    float widest = 0;
    for (int i = 0; i < n; ++i) widest = std::max(widest, ImGui::CalcTextSize(kTabs[i].label).x);
    ImGui::PopFont();
    if (widest > cell.x - 0.2f * e) label_scale = (cell.x - 0.2f * e) / widest;
  }
  for (int i = 0; i < n; ++i) {
    const Tab& t = kTabs[i];
    const ImVec2 p = vertical ? ImVec2(pos.x, pos.y + e + cell.y * static_cast<float>(i))
                              : ImVec2(pos.x + cell.x * static_cast<float>(i), pos.y);
    ImGui::SetCursorScreenPos(p);
    ImGui::PushID(t.name);
    const bool pressed = ImGui::InvisibleButton("##tab", cell);
    const bool held = ImGui::IsItemActive();
    ImGui::PopID();
    ui::record(app, t.name);
    if (pressed) go_to(app, t.screen);
    const bool selected = app.ui.screen == t.screen;
    const ImU32 col = selected ? theme::kAccent : theme::kTextDim;
    const ImVec2 icon_c(p.x + cell.x / 2, p.y + cell.y * 0.36f);
    if (selected || held) {
      // A pill behind the icon marks the current screen.
      d->AddRectFilled(ImVec2(icon_c.x - 1.6f * e, icon_c.y - 0.8f * e), ImVec2(icon_c.x + 1.6f * e, icon_c.y + 0.8f * e),
                       selected ? theme::with_alpha(theme::kAccent, 40) : theme::with_alpha(theme::kText, 20), 0.8f * e);
    }
    t.icon(d, icon_c, 0.5f * e, col);
    // Labels shrink to the small font when seven tabs share a phone's width.
    ImGui::PushFont(small_labels ? app.ui.fonts.small : selected ? app.ui.fonts.bold : app.ui.fonts.body);
    const float font_size = ImGui::GetFontSize() * label_scale;
    const float text_w = ImGui::CalcTextSize(t.label).x * label_scale;
    const ImVec2 text_at(p.x + (cell.x - text_w) / 2, p.y + cell.y * 0.62f);
    d->AddText(ImGui::GetFont(), font_size, text_at, col, t.label);
    ui::record_rect(app, std::string(t.name) + ".label", text_at, ImVec2(text_at.x + text_w, text_at.y + font_size));
    ImGui::PopFont();
  }
}

void draw_header(AppState& app, float height) {
  const float e = ui::em(app);
  const ImVec2 p = ImGui::GetCursorScreenPos();
  const float w = ImGui::GetContentRegionAvail().x;
  ImDrawList* d = ImGui::GetWindowDrawList();
  d->AddRectFilled(p, ImVec2(p.x + w, p.y + height), theme::kBackground);
  d->AddLine(ImVec2(p.x, p.y + height - 1), ImVec2(p.x + w, p.y + height - 1), theme::kBorder);
  ImGui::SetCursorScreenPos(ImVec2(p.x + e, p.y + (height - ImGui::GetTextLineHeight()) / 2));
  ImGui::PushFont(app.ui.fonts.bold);
  ImGui::TextUnformatted("Tidewright");
  ImGui::PopFont();
  // Quick switch: the current system's name (cut with an ellipsis when long); tap for the list.
  const auto* sys = current_system(app);
  // The label leaves room on its right for the arrow that says a list opens.
  const std::string more = "    ";
  ImGui::PushFont(app.ui.fonts.bold);
  const std::string name = sys ? sys->name : std::string("No system");
  const float bw = std::min(w * 0.62f, ImGui::CalcTextSize((name + more).c_str()).x + 2 * e);
  const std::string label = ui::fit_text(name, bw - 2 * e - ImGui::CalcTextSize(more.c_str()).x) + more;
  ImGui::PopFont();
  ImGui::SetCursorScreenPos(ImVec2(p.x + w - bw - 0.6f * e, p.y + (height - ui::kTargetEm * e) / 2));
  ImGui::PushFont(app.ui.fonts.bold);
  if (ui::button(app, "header.switch", label.c_str(), bw)) ImGui::OpenPopup("##switch");
  ImGui::PopFont();
  {
    const ImVec2 r = ImGui::GetItemRectMax();
    const float size = ImGui::GetFontSize();
    ImGui::RenderArrow(ImGui::GetWindowDrawList(), ImVec2(r.x - e - 0.6f * size, r.y - ui::kTargetEm * e / 2 - 0.4f * size),
                       theme::kTextDim, ImGuiDir_Down, 0.8f);
  }
  ImGui::SetNextWindowPos(ImVec2(p.x + w - 0.6f * e, p.y + height), ImGuiCond_Always, ImVec2(1, 0));
  // As tall as the room between the header and the tab bar; longer lists scroll (a finger's
  // drag, the wheel or the scroll bar) and open at the current system.
  const float room = ImGui::GetMainViewport()->Pos.y + ImGui::GetMainViewport()->Size.y - (p.y + height) - 5 * e;
  ImGui::SetNextWindowSizeConstraints(ImVec2(std::min(w - 1.2f * e, 16 * e), 0),
                                      ImVec2(w - 1.2f * e, std::max(room, 8 * e)));
  if (ImGui::BeginPopup("##switch")) {
    if (ImGui::IsWindowAppearing()) app.ui.switcher = {};  // opens unfiltered, at the current system
    ui::dim_text("Switch to");
    std::vector<ui::PickEntry> entries;
    for (const auto& s : app.journal.systems) entries.push_back({std::to_string(s.id), s.name, s.id == app.current_system});
    // The box takes what the room leaves after the Find field, its match line and Manage systems.
    const float box = std::max(room, 8 * e) - (app.ui.switcher.filter.empty() ? 4.75f : 6.25f) * ui::kTargetEm * e;
    const int picked = ui::pick_list(app, "switch", "Find a system", app.ui.switcher, entries, box);
    if (picked >= 0) {
      select_system(app, app.journal.systems[static_cast<std::size_t>(picked)].id);
      ImGui::CloseCurrentPopup();
    }
    if (ui::button(app, "switch.manage", "Manage systems", 0, ui::Tone::Quiet)) {
      go_to(app, Screen::Systems);
      ImGui::CloseCurrentPopup();
    }
    ImGui::EndPopup();
  }
  ImGui::SetCursorScreenPos(ImVec2(p.x, p.y + height));
}

}  // namespace twapp

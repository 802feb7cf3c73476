// The frame: (1) platform results (typed text, imported files) into AppState, (2) fonts
// rebuilt when pixel ratio or text size changed, (3) stale core results recomputed,
// (4) the layout: header, the screen in a scrolling column, the message strip, navigation.
#include "app.hpp"

#include <algorithm>
#include <cmath>

#include "actions.hpp"
#include "imgui.h"
#include "imgui_internal.h"  // GImGui->LogBuffer: the frame's text, for screen readers
#include "nav.hpp"
#include "platform.hpp"
#include "theme.hpp"
#include "ui.hpp"
#include "water.hpp"

namespace twapp {

namespace {

// The message of the last action, in a strip at the bottom of the page area. The page above
// it only gets shorter (its content keeps its place), so nothing shifts under a finger and
// nothing is covered when the message comes or goes. Tap it to dismiss it; errors stay 8 s,
// other messages 4 s (actions.cpp).
bool message_showing(AppState& app) {
  if (app.ui.message.empty()) return false;
  if (platform::now_ms() > app.ui.message_until_ms) {
    app.ui.message.clear();
    return false;
  }
  platform::request_frames(2);  // keep drawing so the message goes away on time
  return true;
}

float message_height(const AppState& app, float width) {
  const float e = ui::em(app);
  return std::max(ui::kTargetEm * e, ui::wrapped_height(app.ui.message.c_str(), width - 2 * e) + 1.2f * e);
}

// The height the page leaves at its foot for the message strip. When the strip goes, a page
// scrolled to its end would grow back by the strip's height and ImGui would move its content
// down by as much, under a finger about to tap: the room stays, empty, until giving it back
// moves nothing (the page is scrolled up by at least its height) or the screen changes.
float message_room(AppState& app, float width) {
  UiState& ui = app.ui;
  if (message_showing(app)) {
    ui.message_room = message_height(app, width);
    ui.message_room_screen = ui.screen;
  } else if (ui.message_room > 0) {
    // ImGui keeps a scroll inside the content: giving the room back moves the page when its
    // scroll is past the largest scroll the taller page allows.
    const bool would_move = ui.page_scroll_y > std::max(0.0f, ui.page_scroll_max_y - ui.message_room) + 0.5f;
    if (!would_move || ui.message_room_screen != ui.screen) ui.message_room = 0;
  }
  return ui.message_room;
}

void draw_message(AppState& app, float width, float height) {
  const float e = ui::em(app);
  const ImVec2 pos = ImGui::GetCursorScreenPos();
  ImDrawList* d = ImGui::GetWindowDrawList();
  const ImU32 fill = app.ui.message_is_error ? theme::kMessageError : theme::kMessageOk;
  d->AddRectFilled(pos, ImVec2(pos.x + width, pos.y + height), fill);
  if (ImGui::InvisibleButton("##message_dismiss", ImVec2(width, height))) app.ui.message.clear();
  ui::record(app, "banner");
  const float wrap = width - 2 * e;
  const float text_h = ui::wrapped_height(app.ui.message.c_str(), wrap);
  ui::draw_wrapped(d, ImVec2(pos.x + e, pos.y + (height - text_h) / 2), theme::kText, app.ui.message.c_str(), wrap);
}

void draw_layout(AppState& app) {
  const float e = ui::em(app);
  const ImGuiViewport* vp = ImGui::GetMainViewport();
  ImGui::SetNextWindowPos(vp->Pos);
  ImGui::SetNextWindowSize(vp->Size);
  ImGui::PushStyleVar(ImGuiStyleVar_WindowPadding, ImVec2(0, 0));
  ImGui::PushStyleVar(ImGuiStyleVar_ItemSpacing, ImVec2(0, 0));
  ImGui::Begin("##root", nullptr,
               ImGuiWindowFlags_NoDecoration | ImGuiWindowFlags_NoMove | ImGuiWindowFlags_NoSavedSettings |
                   ImGuiWindowFlags_NoBringToFrontOnFocus | ImGuiWindowFlags_NoScrollWithMouse);
  ImGui::PopStyleVar(2);
  const bool wide = vp->Size.x >= 48 * e;
  const float rail_w = wide ? 7.5f * e : 0;
  const float bar_h = wide ? 0 : 4.0f * e;
  const float header_h = 3.6f * e;
  if (wide) draw_tabs(app, vp->Pos, ImVec2(rail_w, vp->Size.y), true);
  ImGui::SetCursorScreenPos(ImVec2(vp->Pos.x + rail_w, vp->Pos.y));
  ImGui::BeginChild("##main", ImVec2(vp->Size.x - rail_w, vp->Size.y - bar_h), false,
                    ImGuiWindowFlags_NoScrollbar | ImGuiWindowFlags_NoScrollWithMouse);
  draw_header(app, header_h);
  const float main_w = vp->Size.x - rail_w;
  const float room_h = message_room(app, main_w);
  ImGui::PushStyleVar(ImGuiStyleVar_WindowPadding, ImVec2(e, 0.6f * e));
  ImGui::BeginChild("##page", ImVec2(0, -room_h), false, ImGuiWindowFlags_AlwaysUseWindowPadding);
  ImGui::PopStyleVar();
  ui::page_scroll_memory(app);
  ui::column_begin(app, 36);
  ImGui::Dummy(ImVec2(0, 0.1f * e));
  // Everything the screen writes as text is captured by ImGui's own log and handed to screen
  // readers when it changes (text drawn straight into a draw list logs itself with LogText).
  // The log must end inside the window it began in: ImGui ends it at the window's End().
  ImGui::LogToBuffer();
  draw_current_screen(app);
  if (const char* text = GImGui->LogBuffer.c_str(); app.ui.screen_text != text) {
    app.ui.screen_text = text;
    platform::set_screen_text(app.ui.screen_text);
  }
  ImGui::LogFinish();
  ImGui::Dummy(ImVec2(0, 2 * e));  // room below the last control for the thumb
  ui::column_end(app);
  ui::touch_scroll(app);
  app.ui.page_scroll_y = ImGui::GetScrollY();
  app.ui.page_scroll_max_y = ImGui::GetScrollMaxY();
  ImGui::EndChild();
  if (message_showing(app)) draw_message(app, main_w, room_h);
  ImGui::EndChild();
  if (!wide) draw_tabs(app, ImVec2(vp->Pos.x, vp->Pos.y + vp->Size.y - bar_h), ImVec2(vp->Size.x, bar_h), false);
  ImGui::End();
}

}  // namespace

bool app_frame(AppState& app) {
  const double t0 = platform::now_ms();
  if (auto r = platform::poll_text_entry()) app.ui.entry = EntryResult{r->key, r->text, r->accepted, r->typing};
  if (auto text = platform::poll_import()) import_text(app, *text);
  if (auto update = platform::poll_store_update()) apply_store_update(app, *update);
  refresh_water(app);

  platform::begin_frame();
  app.ui.pixel_ratio = platform::pixel_ratio();
  const float scale = app.ui.pixel_ratio * app.settings.text_size;
  if (std::fabs(scale - app.ui.fonts_built_for) > 0.01f) {
    theme::build(app.ui, scale, app.settings.look);
    app.ui.look_applied = app.settings.look;
    platform::reload_fonts_texture();
  } else if (app.ui.look_applied != app.settings.look) {
    theme::apply_look(app.settings.look, scale);
    app.ui.look_applied = app.settings.look;
  }
  if (app.ui.page_look != app.settings.look) {
    platform::set_page_look(app.settings.look == Look::Light);
    app.ui.page_look = app.settings.look;
  }
  ImGui::NewFrame();
  app.ui.widgets.clear();
  sync_dosing_forms(app);
  draw_layout(app);
  sync_dosing_forms(app);
  platform::draw_overlays(app.ui.em);
  app.ui.entry.reset();  // a result nobody claimed this frame is dropped (its screen is gone)
  const double t1 = platform::now_ms();  // UI built: CPU time of our frame without the GPU
  platform::end_frame(ImGui::ColorConvertU32ToFloat4(theme::kBackground).x,
                      ImGui::ColorConvertU32ToFloat4(theme::kBackground).y,
                      ImGui::ColorConvertU32ToFloat4(theme::kBackground).z);
  const double t2 = platform::now_ms();
  (void)t1;
  if (app.ui.frame_ms.size() < 100000) app.ui.frame_ms.push_back(static_cast<float>(t2 - t0));
  ++app.ui.frames_drawn;
  if (!app.ui.first_frame_reported) {
    app.ui.first_frame_reported = true;
    platform::first_frame_drawn();
    // The browser shows this frame only once the call that drew it returns: the demo's first
    // save waits for the next frame instead of holding this one back.
    if (app.store.save_after_first_frame) platform::request_frames(1);
  } else if (app.store.save_after_first_frame) {
    app.store.save_after_first_frame = false;
    save(app);
  }
  return true;
}

}  // namespace twapp

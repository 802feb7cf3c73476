// The one list to pick from (pick_list.hpp).
#include "pick_list.hpp"

#include <algorithm>
#include <cctype>

#include "theme.hpp"
#include "ui.hpp"

namespace twapp::ui {

namespace {

std::string lower(std::string s) {
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

}  // namespace

int pick_list(AppState& app, const std::string& name, const char* find_label, PickListState& state,
              const std::vector<PickEntry>& entries, float max_height) {
  const float e = em(app);
  // The list narrows with each character typed, not only when the text is confirmed.
  if (live_text_field(app, name + ".find", find_label, &state.filter, "part of a name; empty shows all") &&
      state.filter.empty()) {
    state.scroll_to_chosen = true;
  }
  const std::string want = lower(state.filter);
  std::vector<std::size_t> shown;
  for (std::size_t i = 0; i < entries.size(); ++i) {
    if (want.empty() || lower(entries[i].label).find(want) != std::string::npos) shown.push_back(i);
  }
  if (!want.empty()) {
    dim_text((std::to_string(shown.size()) + " of " + std::to_string(entries.size()) + " match \"" + state.filter + "\"").c_str());
    if (button(app, name + ".show_all", "Show all", -1, Tone::Quiet)) {
      state.filter.clear();
      state.scroll_to_chosen = true;
    }
  }
  const ImGuiStyle& style = ImGui::GetStyle();
  const float row = kTargetEm * e + style.ItemSpacing.y;
  const float content = static_cast<float>(std::max<std::size_t>(shown.size(), 1)) * row + style.WindowPadding.y * 2;
  const float height = std::min(content, std::max(max_height, 3 * row));
  int picked = -1;
  ImGui::PushStyleColor(ImGuiCol_ChildBg, theme::kBackground);
  ImGui::BeginChild((name + "##box").c_str(), ImVec2(0, height), true);
  if (shown.empty()) dim_text("Nothing matches; Show all lists every one.");
  const float text_w = ImGui::GetContentRegionAvail().x - 2 * style.FramePadding.x;
  for (std::size_t i : shown) {
    const PickEntry& entry = entries[i];
    if (button(app, name + "." + entry.key, fit_text(entry.label, text_w).c_str(), 0, entry.chosen ? Tone::Primary : Tone::Normal)) {
      picked = static_cast<int>(i);
    }
    if (entry.chosen && state.scroll_to_chosen) ImGui::SetScrollHereY(0.5f);
  }
  state.scroll_to_chosen = false;
  touch_scroll(app, state.scroll);
  // A drag in the box scrolls the box, not the page around it.
  if (state.scroll.scrolling) app.ui.drag_owned = true;
  ImGui::EndChild();
  ImGui::PopStyleColor();
  return picked;
}

}  // namespace twapp::ui

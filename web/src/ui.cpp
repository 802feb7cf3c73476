#include "ui.hpp"

#include <algorithm>
#include <cstring>
#include <cmath>
#include <cstdlib>
#include <utility>
#include <vector>

#include "actions.hpp"
#include "format.hpp"
#include "imgui_internal.h"
#include "platform.hpp"
#include "theme.hpp"

namespace twapp::ui {

float em(const AppState& app) { return app.ui.em; }

void record(AppState& app, const std::string& name) {
  record_rect(app, name, ImGui::GetItemRectMin(), ImGui::GetItemRectMax());
}

void record_rect(AppState& app, const std::string& name, ImVec2 a, ImVec2 b) {
  const ImGuiWindow* w = ImGui::GetCurrentWindow();
  const ImRect clip = w->InnerClipRect;
  Rect r;
  r.x = a.x;
  r.y = a.y;
  r.w = b.x - a.x;
  r.h = b.y - a.y;
  // Visible when its centre is inside the window's visible area and not under a popup.
  const ImVec2 c((a.x + b.x) / 2, (a.y + b.y) / 2);
  r.visible = clip.Contains(c);
  app.ui.widgets[name] = r;
  if (app.ui.reveal == name) {
    ImGui::SetScrollHereY(0.4f);
    app.ui.reveal.clear();
    app.ui.scroll_restore_frames = 0;  // a widget asked to be shown wins over the remembered position
  }
}

bool button(AppState& app, const std::string& name, const char* label, float width, Tone tone) {
  const float e = em(app);
  ImVec2 size(width, kTargetEm * e);
  if (width == 0) size.x = ImGui::GetContentRegionAvail().x;
  if (width < 0) size.x = std::max(ImGui::CalcTextSize(label, nullptr, true).x + 2 * e, kTargetEm * e);
  int colors = 0;
  if (tone == Tone::Primary) {
    ImGui::PushStyleColor(ImGuiCol_Button, theme::kAccentDark);
    ImGui::PushStyleColor(ImGuiCol_ButtonHovered, theme::kPrimaryHover);
    ImGui::PushStyleColor(ImGuiCol_ButtonActive, theme::kAccent);
    colors = 3;
  } else if (tone == Tone::Danger) {
    ImGui::PushStyleColor(ImGuiCol_Button, theme::kDanger);
    ImGui::PushStyleColor(ImGuiCol_ButtonHovered, theme::kDangerHover);
    ImGui::PushStyleColor(ImGuiCol_ButtonActive, theme::kDangerActive);
    colors = 3;
  } else if (tone == Tone::Quiet) {
    ImGui::PushStyleColor(ImGuiCol_Button, IM_COL32(0, 0, 0, 0));
    colors = 1;
  }
  ImGui::PushID(name.c_str());
  const bool pressed = ImGui::Button(label, size);
  ImGui::PopID();
  ImGui::PopStyleColor(colors);
  record(app, name);
  app.ui.widgets[name].text = label;
  return pressed;
}

void heading(AppState& app, const char* text) {
  ImGui::Dummy(ImVec2(0, 0.25f * em(app)));
  ImGui::PushFont(app.ui.fonts.bold);
  ImGui::PushStyleColor(ImGuiCol_Text, theme::kAccent);
  ImGui::TextUnformatted(text);
  ImGui::PopStyleColor();
  ImGui::PopFont();
}

void divider(AppState& app) {
  const ImVec2 p = ImGui::GetCursorScreenPos();
  const float w = ImGui::GetContentRegionAvail().x;
  ImGui::GetWindowDrawList()->AddLine(ImVec2(p.x, p.y + 0.2f * em(app)), ImVec2(p.x + w, p.y + 0.2f * em(app)),
                                      theme::kBorder, std::max(1.0f, 0.06f * em(app)));
  ImGui::Dummy(ImVec2(w, 0.4f * em(app)));
}

namespace {
// Wraps at spaces only. ImGui 1.86's own wrapping may break after a '.' or ',' inside a number
// ("0." at the end of a line, "2 dKH" on the next); here numbers and their units stay whole.
// A word wider than the line is cut where it must. Widths add up exactly (ImGui does not
// kern), so each word is measured once. Lines are spaced like one wrapped text: item spacing
// only after the last.
std::vector<std::pair<const char*, const char*>> wrap_at_spaces(const char* text, float width) {
  width = std::max(1.0f, width);
  const float space = ImGui::CalcTextSize(" ").x;
  std::vector<std::pair<const char*, const char*>> lines;
  const char* p = text;
  for (;;) {  // one paragraph per '\n'
    const char* para_end = std::strchr(p, '\n');
    if (!para_end) para_end = p + std::strlen(p);
    const char* line = nullptr;  // the line being filled: [line, line_end)
    const char* line_end = nullptr;
    float line_w = 0;
    for (const char* w = p; w < para_end;) {
      while (w < para_end && *w == ' ') ++w;
      const char* w_end = w;
      while (w_end < para_end && *w_end != ' ') ++w_end;
      if (w == w_end) break;
      float ww = ImGui::CalcTextSize(w, w_end).x;
      if (line && line_w + space + ww > width) {
        lines.emplace_back(line, line_end);
        line = nullptr;
      }
      while (!line && ww > width) {  // a word longer than a line: cut it where it fills one
        const char* cut = ImGui::GetFont()->CalcWordWrapPositionA(ImGui::GetFontSize() / ImGui::GetFont()->FontSize, w,
                                                                  w_end, width);
        if (cut <= w) cut = w + 1;
        lines.emplace_back(w, cut);
        w = cut;
        ww = ImGui::CalcTextSize(w, w_end).x;
      }
      if (w == w_end) continue;
      if (!line) {
        line = w;
        line_w = ww;
      } else {
        line_w += space + ww;
      }
      line_end = w_end;
      w = w_end;
    }
    if (line) lines.emplace_back(line, line_end);
    else if (para_end == p) lines.emplace_back(p, p);  // an empty paragraph is an empty line
    if (*para_end == '\0') break;
    p = para_end + 1;
  }
  return lines;
}

void text_wrapped_at_spaces(const char* text) {
  const auto lines = wrap_at_spaces(text, ImGui::GetContentRegionAvail().x);
  const ImVec2 spacing = ImGui::GetStyle().ItemSpacing;
  for (size_t i = 0; i < lines.size(); ++i) {
    const bool last = i + 1 == lines.size();
    if (!last) ImGui::PushStyleVar(ImGuiStyleVar_ItemSpacing, ImVec2(spacing.x, 0));
    ImGui::TextUnformatted(lines[i].first, lines[i].second);
    if (!last) ImGui::PopStyleVar();
  }
}
}  // namespace

float wrapped_height(const char* text, float width) {
  return static_cast<float>(wrap_at_spaces(text, width).size()) * ImGui::GetTextLineHeight();
}

void draw_wrapped(ImDrawList* d, ImVec2 pos, ImU32 color, const char* text, float width) {
  for (const auto& [begin, end] : wrap_at_spaces(text, width)) {
    d->AddText(pos, color, begin, end);
    pos.y += ImGui::GetTextLineHeight();
  }
}

void dim_text(const char* text) { colored_wrapped(theme::kTextDim, text); }
void wrapped(const char* text) { text_wrapped_at_spaces(text); }
void colored_wrapped(ImU32 color, const char* text) {
  ImGui::PushStyleColor(ImGuiCol_Text, color);
  text_wrapped_at_spaces(text);
  ImGui::PopStyleColor();
}

void label_value(AppState& app, const char* label, const std::string& value, ImU32 value_color) {
  const float avail = ImGui::GetContentRegionAvail().x;
  const float x0 = ImGui::GetCursorPosX();
  const float label_w = ImGui::CalcTextSize(label).x;
  ImGui::PushStyleColor(ImGuiCol_Text, theme::kTextDim);
  ImGui::TextUnformatted(label);
  ImGui::PopStyleColor();
  ImGui::PushFont(app.ui.fonts.bold);
  const float w = ImGui::CalcTextSize(value.c_str()).x;
  // The value goes right-aligned on the label's line, or on the next line when the two would
  // meet (large text sizes, long labels).
  if (label_w + 0.6f * em(app) + w <= avail) {
    // SameLine(offset) would count from a group's start too (a wide page's second pane).
    ImGui::SameLine();
    ImGui::SetCursorPosX(x0 + avail - w - 1);
  } else {
    ImGui::SetCursorPosX(std::max(x0, x0 + avail - w - 1));
  }
  if (value_color) ImGui::PushStyleColor(ImGuiCol_Text, value_color);
  ImGui::TextUnformatted(value.c_str());
  if (value_color) ImGui::PopStyleColor();
  ImGui::PopFont();
}

bool choice(AppState& app, const std::string& name, const char* label, int* index,
            const char* const* options, int count) {
  const float e = em(app);
  if (label && *label) dim_text(label);
  const float avail = ImGui::GetContentRegionAvail().x;
  const float gap = 0.35f * e;
  // Equal widths when all fit on one line, else as many per row as fit.
  float widest = 0;
  for (int i = 0; i < count; ++i) widest = std::max(widest, ImGui::CalcTextSize(options[i]).x + 1.6f * e);
  int per_row = std::max(1, std::min(count, static_cast<int>((avail + gap) / (widest + gap))));
  const int rows = (count + per_row - 1) / per_row;
  per_row = (count + rows - 1) / rows;  // balance the rows
  const float w = (avail - gap * static_cast<float>(per_row - 1)) / static_cast<float>(per_row);
  bool changed = false;
  ImGui::PushStyleVar(ImGuiStyleVar_ItemSpacing, ImVec2(gap, gap));
  for (int i = 0; i < count; ++i) {
    if (i % per_row != 0) ImGui::SameLine();
    const bool selected = *index == i;
    ImGui::PushStyleColor(ImGuiCol_Button, selected ? theme::kAccentDark : theme::kSurface);
    ImGui::PushStyleColor(ImGuiCol_Border, selected ? theme::kAccent : theme::kBorder);
    if (selected) ImGui::PushFont(app.ui.fonts.bold);
    ImGui::PushID(name.c_str());
    ImGui::PushID(i);
    if (ImGui::Button(options[i], ImVec2(w, kTargetEm * e)) && !selected) {
      *index = i;
      changed = true;
    }
    ImGui::PopID();
    ImGui::PopID();
    if (selected) ImGui::PopFont();
    ImGui::PopStyleColor(2);
    record(app, name + "." + std::to_string(i));
  }
  ImGui::PopStyleVar();
  return changed;
}

namespace {

// Parses what a person types on a phone: "8.2", "8,2", " 8.2 ", "−1".
std::optional<double> parse_number(std::string text) {
  for (char& ch : text) if (ch == ',') ch = '.';
  std::string t;
  for (size_t i = 0; i < text.size(); ++i) {
    if (text.compare(i, 3, "\u2212") == 0) {
      t += '-';
      i += 2;
    } else if (text[i] != ' ') {
      t += text[i];
    }
  }
  if (t.empty()) return std::nullopt;
  char* end = nullptr;
  const double v = std::strtod(t.c_str(), &end);
  if (end != t.c_str() + t.size() || !std::isfinite(v)) return std::nullopt;
  return v;
}

// "0.001 to 100000 mL": the ends as they are, the unit (if any) after them.
std::string range_text(const NumberSpec& s) {
  return fmtx::fixed_exact(s.lo, s.decimals) + " to " + fmtx::fixed_exact(s.hi, s.decimals) +
         (s.unit[0] ? std::string(" ") + s.unit : std::string());
}

std::string range_hint(const NumberSpec& s) { return "Accepted " + range_text(s); }

// The value box: shows the value, opens the platform's text field when tapped, and takes the
// typed text when it comes back. Returns true when a new valid value arrived.
bool value_box(AppState& app, const std::string& name, const NumberSpec& spec, std::optional<double>* value,
               float width) {
  const float e = em(app);
  bool changed = false;
  if (app.ui.entry && app.ui.entry->key == name) {
    const EntryResult r = *app.ui.entry;
    app.ui.entry.reset();
    if (r.accepted) {
      const auto v = parse_number(r.text);
      const std::string field = spec.owner ? std::string(spec.owner) + ": " + spec.label : std::string(spec.label);
      if (!v) {
        notify(app, field + ": \"" + r.text + "\" is not a number", true);
      } else if (*v < spec.lo || *v > spec.hi) {
        const std::string unit = spec.unit[0] ? std::string(" ") + spec.unit : std::string();  // none: no stray space
        notify(app, field + " " + fmtx::fixed_exact(*v, spec.decimals) + unit + " is outside the accepted range " +
                        range_text(spec), true);
      } else {
        *value = *v;
        changed = true;
      }
    }
  }
  const std::string shown = value->has_value() ? fmtx::fixed(**value, spec.decimals) + " " + spec.unit
                                               : std::string("Tap to enter");
  ImGui::PushStyleColor(ImGuiCol_Button, theme::kSurface);
  ImGui::PushStyleColor(ImGuiCol_Text, value->has_value() ? theme::kText : theme::kTextDim);
  ImGui::PushFont(app.ui.fonts.bold);
  ImGui::PushID(name.c_str());
  if (ImGui::Button(shown.c_str(), ImVec2(width, kTargetEm * e))) {
    platform::TextEntryRequest req;
    req.key = name;
    req.label = std::string(spec.label) + (spec.unit[0] ? std::string(" (") + spec.unit + ")" : "");
    req.initial = value->has_value() ? fmtx::fixed(**value, spec.decimals) : "";
    if (req.initial.rfind("\u2212", 0) == 0) req.initial.replace(0, 3, "-");
    req.hint = range_hint(spec);
    req.numeric = true;
    platform::open_text_entry(req);
  }
  ImGui::PopID();
  ImGui::PopFont();
  ImGui::PopStyleColor(2);
  record(app, name);
  return changed;
}

}  // namespace

bool optional_number_field(AppState& app, const std::string& name, const NumberSpec& spec,
                           std::optional<double>* value) {
  const float e = em(app);
  dim_text(spec.label);
  const float avail = ImGui::GetContentRegionAvail().x;
  const float step_w = kTargetEm * e * 1.15f;
  const float gap = ImGui::GetStyle().ItemSpacing.x;
  bool changed = false;
  if (!spec.steppers) return value_box(app, name, spec, value, avail);
  ImGui::PushID(name.c_str());
  ImGui::PushFont(app.ui.fonts.bold);
  const bool minus = ImGui::Button("\u2212", ImVec2(step_w, kTargetEm * e));
  ImGui::PopFont();
  ImGui::PopID();
  record(app, name + ".minus");
  ImGui::SameLine();
  changed |= value_box(app, name, spec, value, avail - 2 * step_w - 2 * gap);
  ImGui::SameLine();
  ImGui::PushID(name.c_str());
  ImGui::PushFont(app.ui.fonts.bold);
  const bool plus = ImGui::Button("+", ImVec2(step_w, kTargetEm * e));
  ImGui::PopFont();
  ImGui::PopID();
  record(app, name + ".plus");
  if ((minus || plus) && value->has_value()) {
    const double q = std::pow(10.0, spec.decimals);
    double v = **value + (plus ? spec.step : -spec.step);
    v = std::round(v * q) / q;  // keep steps on the shown digits
    v = std::clamp(v, spec.lo, spec.hi);
    if (v != **value) {
      *value = v;
      changed = true;
    }
  }
  return changed;
}

bool number_field(AppState& app, const std::string& name, const NumberSpec& spec, double* value) {
  std::optional<double> v = *value;
  const bool changed = optional_number_field(app, name, spec, &v);
  if (changed && v) *value = *v;
  return changed;
}

namespace {
// The text box of text_field and live_text_field: takes the platform field's result meant for
// it, shows the text, opens the field when tapped.
bool text_box(AppState& app, const std::string& name, const char* label, std::string* value, const char* hint,
              bool live) {
  const float e = em(app);
  dim_text(label);
  bool changed = false;
  if (app.ui.entry && app.ui.entry->key == name) {
    const EntryResult r = *app.ui.entry;
    app.ui.entry.reset();
    // A live field takes every text it is sent: typed so far, confirmed, or (cancelled) the one
    // it had when it opened. Otherwise only a confirmed text counts.
    if ((live || r.accepted) && r.text != *value) {
      *value = r.text;
      changed = true;
    }
  }
  ImGui::PushStyleColor(ImGuiCol_Button, theme::kSurface);
  ImGui::PushStyleVar(ImGuiStyleVar_ButtonTextAlign, ImVec2(0.0f, 0.5f));
  ImGui::PushID(name.c_str());
  const std::string shown = value->empty() ? std::string("Tap to enter") : *value;
  if (ImGui::Button(shown.c_str(), ImVec2(ImGui::GetContentRegionAvail().x, kTargetEm * e))) {
    platform::TextEntryRequest req{name, label, *value, hint ? hint : "", false};
    req.live = live;
    platform::open_text_entry(req);
  }
  ImGui::PopID();
  ImGui::PopStyleVar();
  ImGui::PopStyleColor();
  record(app, name);
  platform::draw_text_entry_here(name, e);  // desktop: inside this field's window (a popup stays open)
  app.ui.widgets[name].text = shown;  // what the field shows, for the tests
  return changed;
}
}  // namespace

bool text_field(AppState& app, const std::string& name, const char* label, std::string* value,
                const char* hint) {
  return text_box(app, name, label, value, hint, false);
}

bool live_text_field(AppState& app, const std::string& name, const char* label, std::string* value,
                     const char* hint) {
  return text_box(app, name, label, value, hint, true);
}

// ---------------------------------------------------------------- card and column
namespace {
struct Inset {
  ImVec2 start;
  float old_work_max = 0, old_content_max = 0;
  float page_left = 0;  // the column's window: where its content starts (screen x)
};
// Cards do not nest, columns do not nest: one of each at a time.
Inset g_card;    // NOLINT: widget scratch between begin and end of one card, not app state
Inset g_column;  // NOLINT: same for the column

struct PaneScratch {
  bool split = false;
  float top = 0, left = 0, width = 0, gap = 0;
  float first_bottom = 0;
  float old_work_max = 0, old_content_max = 0;
};
PaneScratch g_panes;  // NOLINT: same for the two panes of a wide page
}  // namespace

void card_begin(AppState& app) {
  const float pad = 0.8f * em(app);
  ImGuiWindow* w = ImGui::GetCurrentWindow();
  w->DrawList->ChannelsSplit(2);
  w->DrawList->ChannelsSetCurrent(1);
  g_card.start = ImGui::GetCursorScreenPos();
  g_card.old_work_max = w->WorkRect.Max.x;
  g_card.old_content_max = w->ContentRegionRect.Max.x;
  w->WorkRect.Max.x -= pad;
  w->ContentRegionRect.Max.x -= pad;
  ImGui::Dummy(ImVec2(0, pad - ImGui::GetStyle().ItemSpacing.y));
  ImGui::Indent(pad);
}

void card_end(AppState& app) {
  const float pad = 0.8f * em(app);
  ImGuiWindow* w = ImGui::GetCurrentWindow();
  ImGui::Unindent(pad);
  w->WorkRect.Max.x = g_card.old_work_max;
  w->ContentRegionRect.Max.x = g_card.old_content_max;
  ImGui::Dummy(ImVec2(0, pad - ImGui::GetStyle().ItemSpacing.y));
  const ImVec2 end(w->WorkRect.Max.x, ImGui::GetCursorScreenPos().y - ImGui::GetStyle().ItemSpacing.y);
  w->DrawList->ChannelsSetCurrent(0);
  w->DrawList->AddRectFilled(g_card.start, end, theme::kSurface, 0.7f * em(app));
  w->DrawList->AddRect(g_card.start, end, theme::kCardEdge, 0.7f * em(app));
  w->DrawList->ChannelsMerge();
  ImGui::Dummy(ImVec2(0, 0.2f * em(app)));
}

void column_begin(AppState& app, float max_em) {
  ImGuiWindow* w = ImGui::GetCurrentWindow();
  const float avail = ImGui::GetContentRegionAvail().x;
  const float width = std::min(avail, max_em * em(app));
  const float left = std::floor((avail - width) / 2);
  g_column.old_work_max = w->WorkRect.Max.x;
  g_column.old_content_max = w->ContentRegionRect.Max.x;
  g_column.start.x = left;
  g_column.page_left = w->DC.CursorPos.x;
  if (left > 0) ImGui::Indent(left);
  w->WorkRect.Max.x = w->DC.CursorPos.x + width;
  w->ContentRegionRect.Max.x = w->DC.CursorPos.x + width;
}

void column_end(AppState&) {
  ImGuiWindow* w = ImGui::GetCurrentWindow();
  if (g_column.start.x > 0) ImGui::Unindent(g_column.start.x);
  w->WorkRect.Max.x = g_column.old_work_max;
  w->ContentRegionRect.Max.x = g_column.old_content_max;
}

// Two panes need room for two readable columns: each at least kPaneMinEm wide. Below that
// (every phone, a narrow window, "Huge" text on a laptop) the panes follow each other.
namespace {
constexpr float kPaneMinEm = 28, kPaneMaxEm = 40, kPaneGapEm = 2;
void set_pane_width(ImGuiWindow* w, float left, float width) {
  w->WorkRect.Max.x = left + width;
  w->ContentRegionRect.Max.x = left + width;
}
}  // namespace

bool panes_begin(AppState& app) {
  ImGuiWindow* w = ImGui::GetCurrentWindow();
  const float e = em(app);
  const float page = g_column.old_content_max - g_column.page_left;
  g_panes = {};
  if (page < 2 * kPaneMinEm * e + kPaneGapEm * e) return false;
  g_panes.split = true;
  g_panes.gap = kPaneGapEm * e;
  g_panes.width = std::floor(std::min((page - g_panes.gap) / 2, kPaneMaxEm * e));
  g_panes.left = std::floor(g_column.page_left + (page - 2 * g_panes.width - g_panes.gap) / 2);
  g_panes.top = w->DC.CursorPos.y;
  g_panes.old_work_max = w->WorkRect.Max.x;
  g_panes.old_content_max = w->ContentRegionRect.Max.x;
  ImGui::SetCursorScreenPos(ImVec2(g_panes.left, g_panes.top));
  ImGui::BeginGroup();
  set_pane_width(w, g_panes.left, g_panes.width);
  return true;
}

void panes_next(AppState&) {
  if (!g_panes.split) return;
  ImGuiWindow* w = ImGui::GetCurrentWindow();
  ImGui::EndGroup();
  g_panes.first_bottom = ImGui::GetItemRectMax().y;
  const float right = g_panes.left + g_panes.width + g_panes.gap;
  ImGui::SetCursorScreenPos(ImVec2(right, g_panes.top));
  ImGui::BeginGroup();
  set_pane_width(w, right, g_panes.width);
}

void panes_end(AppState&) {
  if (!g_panes.split) return;
  ImGuiWindow* w = ImGui::GetCurrentWindow();
  ImGui::EndGroup();
  const float bottom = std::max(g_panes.first_bottom, ImGui::GetItemRectMax().y);
  w->WorkRect.Max.x = g_panes.old_work_max;
  w->ContentRegionRect.Max.x = g_panes.old_content_max;
  ImGui::SetCursorScreenPos(ImVec2(g_column.page_left + g_column.start.x, bottom + ImGui::GetStyle().ItemSpacing.y));
  g_panes = {};
}

// ---------------------------------------------------------------- touch scrolling
void touch_scroll(AppState& app, DragScroll& st) {
  ImGuiIO& io = ImGui::GetIO();
  const float threshold = 0.5f * em(app);
  const bool hovered = ImGui::IsWindowHovered(ImGuiHoveredFlags_ChildWindows |
                                              ImGuiHoveredFlags_AllowWhenBlockedByActiveItem);
  if (io.MouseClicked[0]) {
    // The press itself may arrive with a jump of the pointer (a tap elsewhere): not travel.
    st.travel = 0;
    st.scrolling = false;
    st.fling = 0;
  } else if (io.MouseDown[0] && hovered && !app.ui.drag_owned && !platform::text_entry_open()) {
    st.travel += std::fabs(io.MouseDelta.y) + std::fabs(io.MouseDelta.x);
    if (!st.scrolling && st.travel > threshold && ImGui::GetScrollMaxY() > 0) {
      st.scrolling = true;
      ImGui::ClearActiveID();  // the press is a scroll now, not a tap on what is under it
    }
    if (st.scrolling) {
      ImGui::SetScrollY(ImGui::GetScrollY() - io.MouseDelta.y);
      st.fling = 0.6f * st.fling + 0.4f * io.MouseDelta.y;
    }
  } else if (st.scrolling) {
    st.scrolling = false;  // released: keep gliding a little
  } else if (std::fabs(st.fling) > 0.5f) {
    ImGui::SetScrollY(ImGui::GetScrollY() - st.fling);
    st.fling *= 0.9f;
    platform::request_frames(2);
  }
}

void page_scroll_memory(AppState& app) {
  UiState& ui = app.ui;
  if (ui.screen != ui.page_shows) {
    ui.scroll_of_screen[ui.page_shows] = ImGui::GetScrollY();
    ui.page_shows = ui.screen;
    ui.page_scroll = DragScroll{};  // a glide on one screen does not carry into the next
    // ImGui clamps a scroll to the content of the frame before (the other screen's): the
    // position is applied again on the next frames, once this screen's height is known.
    ui.scroll_restore_frames = 3;
  }
  if (ui.scroll_restore_frames > 0) {
    --ui.scroll_restore_frames;
    if (ui.reveal.empty()) ImGui::SetScrollY(ui.scroll_of_screen[ui.screen]);
    platform::request_frames(1);
  }
}

void touch_scroll(AppState& app) {
  touch_scroll(app, app.ui.page_scroll);
  app.ui.drag_owned = false;
}

std::string fit_text(const std::string& text, float width) {
  if (ImGui::CalcTextSize(text.c_str()).x <= width) return text;
  // Cut at a character boundary (UTF-8): the longest start that fits with the ellipsis.
  std::vector<size_t> cuts;
  for (size_t i = 1; i < text.size(); ++i) {
    if ((static_cast<unsigned char>(text[i]) & 0xC0) != 0x80) cuts.push_back(i);
  }
  const auto with_ellipsis = [&](size_t n) {
    std::string t = text.substr(0, n);
    while (!t.empty() && t.back() == ' ') t.pop_back();
    return t + "\u2026";
  };
  size_t lo = 0, hi = cuts.size();  // cuts[0, lo) fit; the answer is cuts[lo - 1]
  while (lo < hi) {
    const size_t mid = (lo + hi) / 2;
    if (ImGui::CalcTextSize(with_ellipsis(cuts[mid]).c_str()).x <= width) {
      lo = mid + 1;
    } else {
      hi = mid;
    }
  }
  return lo == 0 ? std::string("\u2026") : with_ellipsis(cuts[lo - 1]);
}

}  // namespace twapp::ui

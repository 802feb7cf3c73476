// Widgets made for a thumb: every control is at least 2.75 em tall, sizes are in em, nothing
// depends on hover. Each named widget records its rectangle (tests tap by name) and can be
// scrolled into view by name. Numbers are typed in the platform's text field (a phone's
// decimal keyboard) or nudged with − / + steppers; they are never drag-sliders.
#pragma once

#include <optional>
#include <string>

#include "app_state.hpp"
#include "imgui.h"

namespace twapp::ui {

inline constexpr float kTargetEm = 2.75f;  // minimum height of anything tapped

float em(const AppState& app);

// Records the last item's rectangle under `name` (and scrolls to it if asked to reveal it).
void record(AppState& app, const std::string& name);
// Same for a rectangle drawn inside a widget (a chart's data point): tests can tap it.
void record_rect(AppState& app, const std::string& name, ImVec2 min, ImVec2 max);

enum class Tone { Normal, Primary, Danger, Quiet };
// width 0 = the whole line; < 0 = fit the label.
bool button(AppState& app, const std::string& name, const char* label, float width = 0,
            Tone tone = Tone::Normal);

void heading(AppState& app, const char* text);
void divider(AppState& app);  // a thin line across the current column or card
void dim_text(const char* text);       // wrapped (at spaces only), dimmed
void wrapped(const char* text);        // wrapped
void colored_wrapped(ImU32 color, const char* text);
void label_value(AppState& app, const char* label, const std::string& value, ImU32 value_color = 0);
// The same wrapping (at spaces only, never inside a number) for text drawn straight into a
// draw list: its height at a width, and drawing it with its top-left at pos.
float wrapped_height(const char* text, float width);
void draw_wrapped(ImDrawList* d, ImVec2 pos, ImU32 color, const char* text, float width);

// A row of choices (segmented), wrapping onto more rows when narrow. Returns true on change.
bool choice(AppState& app, const std::string& name, const char* label, int* index,
            const char* const* options, int count);

struct NumberSpec {
  const char* label;    // "Alkalinity"
  const char* unit;     // "dKH" (shown beside the value)
  int decimals = 1;
  double step = 0.1;    // one tap of − or +
  double lo = 0, hi = 1e9;  // accepted range (from the core's ranges)
  bool steppers = true;
  // Whose field it is, named first in a refusal when the label alone is ambiguous (three pump
  // cards each have "Doses per day"): "pump 1 (sodium carbonate, alkalinity)". nullptr: none.
  const char* owner = nullptr;
};
// Value box (tap to type) with − / + beside it. `value` is in the shown unit. Typed text is
// refused with a message naming the field and the accepted range.
bool number_field(AppState& app, const std::string& name, const NumberSpec& spec, double* value);
// Same, but the value may be empty (shows "Tap to enter").
bool optional_number_field(AppState& app, const std::string& name, const NumberSpec& spec,
                           std::optional<double>* value);
bool text_field(AppState& app, const std::string& name, const char* label, std::string* value,
                const char* hint);
// Same, but *value follows the text as it is typed, before it is confirmed (a list's Find
// field filters per keystroke); Cancel puts back what was there when the field opened.
bool live_text_field(AppState& app, const std::string& name, const char* label, std::string* value,
                     const char* hint);

// A rounded panel behind a group of widgets (content is inset by one padding on each side).
void card_begin(AppState& app);
void card_end(AppState& app);

// Limits the content to a readable column (max_em wide, centred) inside the current window.
void column_begin(AppState& app, float max_em);
void column_end(AppState& app);

// A screen in two panes side by side when the page is wide enough (a desktop window), one
// after the other in the column otherwise (a phone), in the same order either way:
//   ui::panes_begin(app); <first pane> ui::panes_next(app); <second pane> ui::panes_end(app);
// panes_begin says whether they are side by side. Every begin needs its end, early returns too.
bool panes_begin(AppState& app);
void panes_next(AppState& app);
void panes_end(AppState& app);

// Drag on a scrolling window scrolls it (with a little momentum); a press that moves more
// than a fraction of an em stops being a tap, so scrolling never edits anything.
// Called at the top of the page window each frame: keeps each screen's scroll position and
// puts it back when its tab is opened again (the page's window is shared by every screen).
void page_scroll_memory(AppState& app);
void touch_scroll(AppState& app);
// The same for another scrolling window (a popup list), with its own state.
void touch_scroll(AppState& app, DragScroll& state);

// `text` cut to fit `width` (device pixels, the current font) with an ellipsis when it does not.
std::string fit_text(const std::string& text, float width);

}  // namespace twapp::ui

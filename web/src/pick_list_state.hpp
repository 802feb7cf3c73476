// What a scrolling list remembers between frames: the finger's drag (ui::touch_scroll) and,
// for a list to pick from (pick_list.hpp), the text it is filtered by.
#pragma once

#include <string>

namespace twapp {

// Scrolling a window by dragging it with a finger (ui::touch_scroll), with a little momentum.
struct DragScroll {
  bool scrolling = false;  // the current press is scrolling the window
  float travel = 0;        // how far the current press has moved, device pixels
  float fling = 0;         // momentum after release, device pixels per frame
};

struct PickListState {
  std::string filter;        // "" = every entry
  DragScroll scroll;
  bool scroll_to_chosen = true;  // the next frame brings the chosen entry into view
};

}  // namespace twapp

// A list to pick one entry from, made for a thumb and for a farm's 30+ systems: a Find field
// (the entries whose label holds the typed text, in any case), then the entries in a box that
// scrolls by a finger's drag or the wheel, the chosen one marked and brought into view, long
// labels cut with an ellipsis. The one list widget of the app: the header's system switcher,
// the import's system for rows without one and its "Read as…" choice of a column's meaning.
#pragma once

#include <string>
#include <vector>

#include "app_state.hpp"

namespace twapp::ui {

struct PickEntry {
  std::string key;    // the entry's widget is named "<list name>.<key>"
  std::string label;  // as shown (cut to fit)
  bool chosen = false;
};

// Draws the Find field (named "<name>.find", labelled find_label) and the box of entries, at
// most max_height tall (device pixels). Returns the index in `entries` of the entry tapped,
// or -1.
int pick_list(AppState& app, const std::string& name, const char* find_label, PickListState& state,
              const std::vector<PickEntry>& entries, float max_height);

}  // namespace twapp::ui

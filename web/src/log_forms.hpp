// The Log screen's entry forms, one per kind of entry (test result, dose, water change,
// top-off). Each draws its fields, builds the core's event from them, and can be filled from
// a logged event to edit it. The screen itself (screen_log.cpp) adds the time, Save and the
// history.
#pragma once

#include <optional>
#include <string>

#include "app_state.hpp"
#include "tidewright/journal/journal.hpp"

namespace twapp::log_forms {

// Draws the fields of f.kind for system `sys`.
void draw(AppState& app, const tw::journal::System& sys, LogForm& f);

// The event the form describes, or nullopt after telling the user what is missing (the core
// checks ranges when the event is added).
std::optional<tw::journal::EventData> build(AppState& app, const tw::journal::System& sys, const LogForm& f);

// Clears the values typed for f.kind (after a save), keeping the kind and the choices.
void clear_values(LogForm& f);

// A form filled from a logged event (for editing it); the time and the id come along.
LogForm from_event(const tw::journal::Event& e);

// One line for the history: "Alkalinity 8.20 dKH", "Dose 12.0 mL sodium carbonate (80 g/L)".
std::string event_text(const tw::journal::Event& e, const tw::journal::UnitPreferences& units);

}  // namespace twapp::log_forms

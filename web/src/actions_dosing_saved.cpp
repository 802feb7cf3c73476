// The Plan and Hatchery forms saved per system: the screens edit the forms in UiState; once a
// frame (before and after drawing) the saved part of the forms is compared with the current
// system's saved settings, kept there and saved when it differs, and the forms are filled
// again when the current system changed. Saving is the store's (actions.cpp save: only the
// app part is written when only a setting changed).
#include "actions.hpp"
#include "dosing_saved.hpp"

namespace twapp {

void sync_dosing_forms(AppState& app) {
  DosingState& d = app.ui.dosing;
  if (d.forms_for && *d.forms_for != 0 && tw::journal::find_system(app.journal, *d.forms_for)) {
    const SystemDosing now = saved_part(d.plan, d.hatchery);
    const auto it = app.dosing_by_system.find(*d.forms_for);
    if (now != (it == app.dosing_by_system.end() ? SystemDosing{} : it->second)) {
      app.dosing_by_system[*d.forms_for] = now;
      save(app);
    }
  }
  if (d.forms_for == app.current_system) return;
  const auto it = app.dosing_by_system.find(app.current_system);
  const SystemDosing saved = it == app.dosing_by_system.end() ? SystemDosing{} : it->second;
  // What the screens show (not saved) stays as it is; the stale-level consent is asked again.
  const PlanForm shown = d.plan;
  d.plan = saved.plan;
  d.plan.show_all_days = shown.show_all_days;
  d.plan.export_index = shown.export_index;
  const bool table = d.hatchery.show_table;
  d.hatchery = saved.hatchery;
  d.hatchery.show_table = table;
  d.forms_for = app.current_system;
}

}  // namespace twapp

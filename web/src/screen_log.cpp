// Log: a test result, dose, water change or top-off for the current system, now or at an
// earlier time; the core checks each entry (tw::journal::add_event / update_event) and the
// Water and Demand screens follow. Below, the system's recent entries, each editable and
// removable; between them the pumps' standing schedules (log_schedules.cpp). The per-kind
// fields are in log_forms.cpp.
#include <string>

#include "local_time.hpp"
#include "actions.hpp"
#include "fields.hpp"
#include "format.hpp"
#include "log_forms.hpp"
#include "log_schedules.hpp"
#include "platform.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace jn = tw::journal;

const char* const kKinds[] = {"Test", "Dose", "Water change", "Top-off"};
const char* const kKindNouns[] = {"test result", "dose", "water change", "top-off"};

void draw_entry_form(AppState& app, const jn::System& sys, LogForm& f) {
  if (f.editing) {
    ui::colored_wrapped(theme::kWarning, ("Changing a logged " + std::string(kKindNouns[static_cast<int>(f.kind)]) + ".").c_str());
  } else {
    int kind = static_cast<int>(f.kind);
    if (ui::choice(app, "log.kind", "What to log", &kind, kKinds, 4)) f.kind = static_cast<LogKind>(kind);
  }
  ui::dim_text(("For " + sys.name + ".").c_str());
  fields::when(app, "log", &f.when_s);
  log_forms::draw(app, sys, f);
  if (f.editing) {
    const float half = (ImGui::GetContentRegionAvail().x - ImGui::GetStyle().ItemSpacing.x) / 2;
    if (ui::button(app, "log.cancel_edit", "Cancel", half)) {
      f = LogForm{};
      return;
    }
    ImGui::SameLine();
    if (ui::button(app, "log.save", "Save changes", half, ui::Tone::Primary)) {
      if (auto data = log_forms::build(app, sys, f)) {
        if (update_logged_event(app, f.editing, *data, *f.when_s)) f = LogForm{};
      }
    }
    return;
  }
  const std::string save = std::string("Save ") + kKindNouns[static_cast<int>(f.kind)];
  if (ui::button(app, "log.save", save.c_str(), 0, ui::Tone::Primary)) {
    if (auto data = log_forms::build(app, sys, f)) {
      if (log_event(app, *data, f.when_s)) {
        log_forms::clear_values(f);
        f.when_s.reset();  // the next entry is "now" again unless the user says otherwise
      }
    }
  }
}

void draw_history(AppState& app, const jn::System& sys) {
  ui::heading(app, "Recent entries");
  jn::EventFilter filter;
  filter.system_id = sys.id;
  auto events = jn::select_events(app.journal, filter);
  if (events.empty()) ui::dim_text("Nothing logged for this system yet.");
  int shown = 0;
  for (auto it = events.rbegin(); it != events.rend() && shown < 30; ++it, ++shown) {
    const jn::Event& ev = **it;
    const std::string id = std::to_string(ev.id);
    ui::card_begin(app);
    ui::dim_text(local_time::text(ev.time_s).c_str());
    ImGui::PushFont(app.ui.fonts.bold);
    ui::wrapped(log_forms::event_text(ev, sys.units).c_str());
    ImGui::PopFont();
    ui::record(app, "log.entry." + id);
    const float half = (ImGui::GetContentRegionAvail().x - ImGui::GetStyle().ItemSpacing.x) / 2;
    if (app.ui.confirm_remove_event == ev.id) {
      if (ui::button(app, "log.keep." + id, "Keep", half)) app.ui.confirm_remove_event = 0;
      ImGui::SameLine();
      if (ui::button(app, "log.remove_confirm." + id, "Remove", half, ui::Tone::Danger)) {
        remove_event(app, ev.id);
        app.ui.confirm_remove_event = 0;
      }
    } else {
      // Schedules change on their own card above; a dose marked against one is removed, not edited.
      const auto* dose = std::get_if<jn::Dose>(&ev.data);
      const bool editable = !std::holds_alternative<jn::Note>(ev.data) && !std::holds_alternative<jn::DoseSchedule>(ev.data) &&
                            !(dose && dose->mark != jn::ScheduleMark::None);
      if (editable && ui::button(app, "log.edit." + id, "Edit\u2026", half, ui::Tone::Quiet)) {
        app.ui.log = log_forms::from_event(ev);
        app.ui.reveal = "log.when";  // back up to the form
      }
      if (editable) ImGui::SameLine();
      if (ui::button(app, "log.remove." + id, "Remove\u2026", half, ui::Tone::Quiet)) app.ui.confirm_remove_event = ev.id;
    }
    ui::card_end(app);
  }
}

}  // namespace

void draw_log(AppState& app) {
  const jn::System* sys = current_system(app);
  if (!sys) {
    ui::heading(app, "Log");
    ui::dim_text("Add a system first (Systems tab): every entry belongs to one system.");
    return;
  }
  LogForm& f = app.ui.log;
  if (f.editing) {  // the entry was removed, or the user switched to another system
    const jn::Event* e = jn::find_event(app.journal, f.editing);
    if (!e || e->system_id != sys->id) f = LogForm{};
  }
  ui::panes_begin(app);  // wide: the form beside the schedules and the recent entries
  ui::heading(app, f.editing ? "Change an entry" : "Log");
  draw_entry_form(app, *sys, f);
  ui::panes_next(app);
  draw_schedules(app, *sys);
  draw_history(app, *sys);
  ui::panes_end(app);
}

}  // namespace twapp

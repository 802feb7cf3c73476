// Standing dose schedules on the Log screen: what the pumps give by themselves (the estimate,
// the forecast and the plan count these doses as logged ones). Each running schedule shows its
// summary and start, and four thumb-sized actions: change its amount or doses a day from now,
// stop it from now (a second tap confirms), log a dose it missed, log an extra dose. Every
// change goes through the actions (actions.hpp), which the core validates.
#include "local_time.hpp"
#include "log_schedules.hpp"

#include <string>

#include "tidewright/common/ranges.hpp"
#include "actions.hpp"
#include "format.hpp"
#include "platform.hpp"
#include "theme.hpp"
#include "tidewright/journal/schedule.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace jn = tw::journal;

void draw_change_form(AppState& app, const jn::DoseSchedule& s, const std::string& id) {
  ScheduleEdit& ed = app.ui.schedule_edit;
  const char* unit = s.unit == jn::DoseUnit::Millilitres ? "mL" : "g";
  ui::number_field(app, "log.schedule.amount." + id, {"Each dose, as set on the pump", unit, 1, 0.5, 0.1, tw::ranges::kDoseAmount.hi},
                   &ed.amount);
  double n = ed.doses_per_day;
  if (ui::number_field(app, "log.schedule.per_day." + id,
                       {"Doses a day", "", 0, 1, 1, static_cast<double>(jn::kMaxDosesPerDay)}, &n)) {
    ed.doses_per_day = static_cast<int>(n);
  }
  const float half = (ImGui::GetContentRegionAvail().x - ImGui::GetStyle().ItemSpacing.x) / 2;
  if (ui::button(app, "log.schedule.cancel." + id, "Cancel", half)) ed = ScheduleEdit{};
  ImGui::SameLine();
  if (ui::button(app, "log.schedule.save." + id, "Change from now", half, ui::Tone::Primary)) {
    if (change_schedule_now(app, ed.changing, ed.amount, ed.doses_per_day)) ed = ScheduleEdit{};
  }
}

void draw_one(AppState& app, const jn::Event& ev) {
  const auto& s = std::get<jn::DoseSchedule>(ev.data);
  const std::string id = std::to_string(ev.id);
  ScheduleEdit& ed = app.ui.schedule_edit;
  ui::card_begin(app);
  ImGui::PushFont(app.ui.fonts.bold);
  ui::wrapped(jn::schedule_summary(s).c_str());
  ImGui::PopFont();
  const std::string until = s.stop_time_s ? ", until " + local_time::text(*s.stop_time_s) + "." : ", until changed or stopped.";
  if (ev.time_s > platform::now_unix_seconds()) {  // adopted from a plan, not begun yet
    ui::dim_text(("From " + local_time::text(ev.time_s) + until).c_str());
    ui::record(app, "log.schedule." + id);
    ui::card_end(app);
    return;
  }
  ui::dim_text(("Since " + local_time::text(ev.time_s) + until).c_str());
  ui::record(app, "log.schedule." + id);
  if (ed.changing == ev.id) {
    draw_change_form(app, s, id);
    ui::card_end(app);
    return;
  }
  const float half = (ImGui::GetContentRegionAvail().x - ImGui::GetStyle().ItemSpacing.x) / 2;
  if (ed.confirm_stop == ev.id) {
    ui::colored_wrapped(theme::kWarning, "Stop this schedule from now? The estimate then counts no more of its doses.");
    if (ui::button(app, "log.schedule.keep." + id, "Keep", half)) ed.confirm_stop = 0;
    ImGui::SameLine();
    if (ui::button(app, "log.schedule.stop_confirm." + id, "Stop", half, ui::Tone::Danger)) {
      stop_schedule_now(app, ev.id);
      ed.confirm_stop = 0;
    }
    ui::card_end(app);
    return;
  }
  if (ui::button(app, "log.schedule.change." + id, "Change\u2026", half, ui::Tone::Quiet)) {
    ed = ScheduleEdit{ev.id, s.amount, s.doses_per_day, 0};
  }
  ImGui::SameLine();
  if (ui::button(app, "log.schedule.stop." + id, "Stop\u2026", half, ui::Tone::Quiet)) ed.confirm_stop = ev.id;
  if (ui::button(app, "log.schedule.missed." + id, "Missed a dose", half)) {
    log_schedule_mark(app, ev.id, jn::ScheduleMark::Missed);
  }
  ImGui::SameLine();
  if (ui::button(app, "log.schedule.extra." + id, "Gave an extra dose", half)) {
    log_schedule_mark(app, ev.id, jn::ScheduleMark::Extra);
  }
  ui::card_end(app);
}

}  // namespace

std::vector<const jn::Event*> schedules_now_and_later(const jn::Journal& journal, jn::SystemId system, std::int64_t now_s) {
  std::vector<const jn::Event*> out;
  for (const jn::Event* e : jn::schedules_of(journal, system)) {
    const auto& s = std::get<jn::DoseSchedule>(e->data);
    if (!s.stop_time_s || *s.stop_time_s > now_s) out.push_back(e);
  }
  return out;
}

void draw_schedules(AppState& app, const jn::System& sys) {
  ui::heading(app, "Pump schedules");
  const auto running = schedules_now_and_later(app.journal, sys.id, platform::now_unix_seconds());
  if (running.empty()) {
    ui::dim_text("No pump runs on a schedule here. Adopt a plan on the Plan screen to set one.");
    ui::record(app, "log.schedules");
    return;
  }
  ui::dim_text("Their doses count as logged: log only a dose a pump missed or gave extra (now, its amount as set). "
               "A schedule from an adopted plan shows here before it begins.");
  ui::record(app, "log.schedules");
  // Copies: an action below adds to the journal's events, which may move them.
  std::vector<jn::Event> shown;
  for (const jn::Event* e : running) shown.push_back(*e);
  for (const jn::Event& e : shown) draw_one(app, e);
}

}  // namespace twapp

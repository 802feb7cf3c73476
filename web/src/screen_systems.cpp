// Systems: three views. Manage: the list (tap to make one current), add, edit volume and
// defaults, remove. Farm: every system's levels, demand, doses due and what needs a look
// (screen_farm.cpp). Round: one round of tests for many systems (farm_round.cpp). The view
// chosen stays for the session, so the Systems tab opens it again in one tap.
#include <string>

#include "actions.hpp"
#include "fields.hpp"
#include "format.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace jn = tw::journal;

const char* const kKinds[] = {"Reef display", "Coral grow-out", "Larval culture", "Fish only", "Other"};
const jn::SystemKind kKindValues[] = {jn::SystemKind::ReefDisplay, jn::SystemKind::CoralGrowOut,
                                      jn::SystemKind::ShellfishLarvalCulture, jn::SystemKind::FishOnly,
                                      jn::SystemKind::Other};

void draw_editor(AppState& app) {
  SystemForm& f = app.ui.system_form;
  jn::System& s = f.system;
  const jn::UnitPreferences& u = s.units;
  ui::card_begin(app);
  ui::heading(app, f.is_new ? "New system" : "Edit system");
  ui::text_field(app, "system.name", "Name", &s.name, "1 to 100 characters, different from your other systems");
  int kind = 0;
  for (int i = 0; i < 5; ++i) if (kKindValues[i] == s.kind) kind = i;
  if (ui::choice(app, "system.kind", "Kind", &kind, kKinds, 5)) s.kind = kKindValues[kind];

  const tw::units::VolumeUnit vu = u.volume;
  double volume = tw::units::volume_from_litres(s.volume_l, vu);
  const double vmax = tw::units::volume_from_litres(tw::ranges::kSystemVolumeL.hi, vu);
  const double vmin = tw::units::volume_from_litres(tw::ranges::kSystemVolumeL.lo, vu);
  if (ui::number_field(app, "system.volume", {"Net water volume", fmtx::volume_unit_text(vu), 1, 10, vmin, vmax}, &volume)) {
    s.volume_l = tw::units::volume_to_litres(volume, vu);
    s.volume_parts.reset();
  }
  ui::number_field(app, "system.salinity", {"Usual salinity", "psu", 1, 0.5, tw::ranges::kSalinity.lo, tw::ranges::kSalinity.hi},
                   &s.default_salinity);
  fields::temperature(app, "system.temperature", "Usual temperature", &s.default_temperature_c, u.temperature);
  const fmtx::UnitShown au = fmtx::alkalinity_shown(u.alkalinity);
  std::optional<double> target;
  if (s.targets.alkalinity_dkh) target = fmtx::alkalinity_from_dkh(*s.targets.alkalinity_dkh, u.alkalinity);
  if (ui::optional_number_field(app, "system.alk_target",
                                {"Alkalinity target", au.unit, au.decimals, au.step,
                                 fmtx::alkalinity_from_dkh(tw::ranges::kAlkalinityDkh.lo, u.alkalinity),
                                 fmtx::alkalinity_from_dkh(tw::ranges::kAlkalinityDkh.hi, u.alkalinity)},
                                &target) && target) {
    s.targets.alkalinity_dkh = fmtx::alkalinity_to_dkh(*target, u.alkalinity);
  }
  ImGui::Dummy(ImVec2(0, 0.3f * ui::em(app)));
  const float half = (ImGui::GetContentRegionAvail().x - ImGui::GetStyle().ItemSpacing.x) / 2;
  if (ui::button(app, "system.cancel", "Cancel", half)) f.open = false;
  ImGui::SameLine();
  if (ui::button(app, "system.save", f.is_new ? "Add system" : "Save", half, ui::Tone::Primary)) {
    if (f.is_new ? add_system(app, s) : update_system(app, s)) f.open = false;
  }
  if (!f.is_new) {
    if (!f.confirm_remove) {
      if (ui::button(app, "system.remove", "Remove this system\u2026", 0, ui::Tone::Quiet)) f.confirm_remove = true;
    } else {
      ui::colored_wrapped(theme::kWarning, "Remove this system and every log entry of it? Export first if you may want them back.");
      if (ui::button(app, "system.remove_keep", "Keep it", half)) f.confirm_remove = false;
      ImGui::SameLine();
      if (ui::button(app, "system.remove_confirm", "Remove", half, ui::Tone::Danger)) {
        if (remove_system(app, s.id)) f.open = false;
      }
    }
  }
  ui::card_end(app);
}

void draw_row(AppState& app, const jn::System& s) {
  const float e = ui::em(app);
  const bool current = s.id == app.current_system;
  const std::string id = std::to_string(s.id);
  const float edit_w = 4.5f * e;
  const float gap = ImGui::GetStyle().ItemSpacing.x;
  const float w = ImGui::GetContentRegionAvail().x - edit_w - gap;
  const ImVec2 p = ImGui::GetCursorScreenPos();
  const float h = 3.6f * e;
  ImGui::PushID(id.c_str());
  const bool tapped = ImGui::InvisibleButton("##row", ImVec2(w, h));
  const bool held = ImGui::IsItemActive();
  ImGui::PopID();
  ui::record(app, "systems.row." + id);
  ImDrawList* d = ImGui::GetWindowDrawList();
  d->AddRectFilled(p, ImVec2(p.x + w, p.y + h), held ? theme::kSurfaceHigh : theme::kSurface, 0.6f * e);
  if (current) {
    d->AddRect(p, ImVec2(p.x + w, p.y + h), theme::kAccent, 0.6f * e, 0, 2.0f * app.ui.pixel_ratio);
  }
  ImGui::PushFont(app.ui.fonts.bold);
  d->PushClipRect(p, ImVec2(p.x + w - 0.5f * e, p.y + h), true);
  // A long name ends in an ellipsis inside the card (ui::fit_text, as the switcher does).
  const std::string name = ui::fit_text(s.name, w - 1.3f * e);
  d->AddText(ImVec2(p.x + 0.8f * e, p.y + 0.45f * e), current ? theme::kAccent : theme::kText, name.c_str());
  ImGui::LogText("\n%s", s.name.c_str());  // drawn into the list: said to screen readers here
  ImGui::PopFont();
  const std::string sub = std::string(fmtx::system_kind_label(s.kind)) + " \u00b7 " +
                          fmtx::volume_text(s.volume_l, s.units.volume) + (current ? " \u00b7 current" : "");
  d->AddText(ImVec2(p.x + 0.8f * e, p.y + 1.85f * e), theme::kTextDim, sub.c_str());
  ImGui::LogText("\n%s\n", sub.c_str());
  d->PopClipRect();
  if (tapped) select_system(app, s.id);
  ImGui::SameLine();
  if (ui::button(app, "systems.edit." + id, "Edit", edit_w)) {
    app.ui.system_form = SystemForm{true, false, s, "", false};
  }
  ImGui::SetCursorScreenPos(ImVec2(p.x, p.y + std::max(h, ui::kTargetEm * e) + 0.5f * e));
  ImGui::Dummy(ImVec2(0, 0));
}

}  // namespace

void draw_systems(AppState& app) {
  if (!app.store.problem.empty()) {
    ui::card_begin(app);
    ui::colored_wrapped(theme::kError, app.store.problem.c_str());
    ui::card_end(app);
  }
  if (app.ui.system_form.open) {
    draw_editor(app);
    return;
  }
  ui::heading(app, "Systems");
  if (!app.journal.systems.empty()) {
    const char* const views[] = {"Manage", "Farm", "Test round"};
    int view = static_cast<int>(app.ui.farm.view);
    if (ui::choice(app, "systems.view", nullptr, &view, views, 3)) app.ui.farm.view = static_cast<SystemsView>(view);
    if (app.ui.farm.view == SystemsView::Overview) {
      draw_farm_overview(app);
      return;
    }
    if (app.ui.farm.view == SystemsView::Round) {
      draw_round(app);
      return;
    }
  }
  if (app.journal.systems.empty()) {
    ui::dim_text("No systems yet. A system is one body of water with its own volume and log: a display tank, a grow-out raceway, a larval culture tank.");
  } else {
    ui::dim_text("Tap a system to make it current. Log, Water, Demand, Plan and the units in Settings work on the current system.");
  }
  for (const auto& s : app.journal.systems) draw_row(app, s);
  if (ui::button(app, "systems.add", "+ Add a system", 0, ui::Tone::Primary)) {
    app.ui.system_form = SystemForm{true, true, new_system_defaults(app), "", false};
  }
  if (!app.demo_system_ids.empty()) {
    ImGui::Dummy(ImVec2(0, 0.5f * ui::em(app)));
    ui::dim_text("Some systems hold invented demo data. Remove them when you start your own log.");
    if (!app.ui.confirm_remove_demo) {
      if (ui::button(app, "systems.remove_demo", "Remove demo data\u2026", 0, ui::Tone::Quiet)) app.ui.confirm_remove_demo = true;
    } else {
      const float half = (ImGui::GetContentRegionAvail().x - ImGui::GetStyle().ItemSpacing.x) / 2;
      if (ui::button(app, "systems.remove_demo_keep", "Keep demo", half)) app.ui.confirm_remove_demo = false;
      ImGui::SameLine();
      if (ui::button(app, "systems.remove_demo_confirm", "Remove demo", half, ui::Tone::Danger)) {
        remove_demo(app);
        app.ui.confirm_remove_demo = false;
      }
    }
  } else if (app.journal.systems.empty()) {
    if (ui::button(app, "systems.load_demo", "Load demo data")) load_demo(app);
  }
}

}  // namespace twapp

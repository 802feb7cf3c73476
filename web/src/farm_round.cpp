// The round of tests (a view of the Systems screen, issue 15): this morning's alkalinity,
// calcium, magnesium and pH of many systems typed on one form, at one time, saved with one tap
// (save_round, actions_farm.cpp). Values are kept as typed until Save, where the core checks
// them all; a refused one is shown beside its field and nothing is saved. The round lists every
// system, those due a test, or the keeper's own choice (RoundChoice, farm_state.hpp).
#include <algorithm>
#include <string>
#include <vector>

#include "actions.hpp"
#include "farm.hpp"
#include "fields.hpp"
#include "format.hpp"
#include "platform.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace jn = tw::journal;

// The unit as the field shows it ("dKH", "mg/L", "NBS scale").
std::string shown_unit_text(const jn::System& sys, int field) {
  const tw::Parameter p = round_parameter(field);
  if (p == tw::Parameter::Alkalinity) return fmtx::alkalinity_shown(sys.units.alkalinity).unit;
  if (p == tw::Parameter::PH) return std::string(fmtx::ph_scale_label(sys.units.ph_scale)) + " scale";
  return round_unit(sys, field);
}

// One value as typed: a box that opens the platform's number field; the text comes back as is.
void draw_field(AppState& app, const jn::System& sys, int field, std::string& text, float width) {
  const std::string name = round_field_name(sys.id, field);
  if (app.ui.entry && app.ui.entry->key == name) {
    if (app.ui.entry->accepted) text = app.ui.entry->text;
    app.ui.entry.reset();
  }
  const float e = ui::em(app);
  const tw::Parameter p = round_parameter(field);
  const std::string unit = shown_unit_text(sys, field);
  // The label goes straight into the draw list: text items in a table row take the row's
  // baseline from the boxes beside them, which put the second label lower than the first.
  const std::string label = std::string(tw::parameter_label(p)) + ", " + unit;
  ImGui::GetWindowDrawList()->AddText(ImGui::GetCursorScreenPos(), theme::kTextDim, label.c_str());
  ImGui::Dummy(ImVec2(width, ImGui::GetTextLineHeight()));
  ImGui::LogText("%s\n", label.c_str());
  const bool refused = app.ui.farm.round.error_field == name;
  ImGui::PushStyleColor(ImGuiCol_Button, theme::kSurface);
  ImGui::PushStyleColor(ImGuiCol_Border, refused ? theme::kError : theme::kBorder);
  ImGui::PushStyleColor(ImGuiCol_Text, text.empty() ? theme::kTextDim : theme::kText);
  ImGui::PushID(name.c_str());
  const std::string shown = text.empty() ? std::string("\u2013") : text + (refused ? "  refused" : "");
  if (ImGui::Button(shown.c_str(), ImVec2(width, ui::kTargetEm * e))) {
    platform::TextEntryRequest req;
    req.key = name;
    req.label = sys.name + ": " + tw::parameter_label(p) + " (" + unit + ")";
    req.initial = text;
    if (auto b = jn::accepted_in_unit(p, round_unit(sys, field))) {
      req.hint = "Accepted " + fmtx::fixed(b->lo, 2) + " to " + fmtx::fixed(b->hi, 2) + " " + unit + "; empty = not tested";
    }
    req.numeric = true;
    platform::open_text_entry(req);
  }
  ImGui::PopID();
  ImGui::PopStyleColor(3);
  ui::record(app, name);
  app.ui.widgets[name].text = text;
}

void draw_system(AppState& app, const jn::System& sys) {
  RoundForm& f = app.ui.farm.round;
  auto& typed = f.typed[sys.id];
  ui::card_begin(app);
  ImGui::PushFont(app.ui.fonts.bold);
  ImGui::TextUnformatted(ui::fit_text(sys.name, ImGui::GetContentRegionAvail().x).c_str());
  ImGui::PopFont();
  ImGui::LogText("\n%s\n", sys.name.c_str());
  // Two fields a row, in table cells so that both labels sit on one line.
  if (ImGui::BeginTable(("##round" + std::to_string(sys.id)).c_str(), 2, ImGuiTableFlags_SizingStretchSame)) {
    for (int k = 0; k < kRoundFields; ++k) {
      ImGui::TableNextColumn();
      draw_field(app, sys, k, typed[static_cast<size_t>(k)], ImGui::GetContentRegionAvail().x);
    }
    ImGui::EndTable();
  }
  if (!f.error.empty() && f.error_field.rfind("round." + std::to_string(sys.id) + ".", 0) == 0) {
    ui::colored_wrapped(theme::kError, f.error.c_str());
  }
  ui::card_end(app);
}

// The keeper's choice of systems: a toggle per system, two a row, chosen ones highlighted.
void draw_chooser(AppState& app) {
  const float e = ui::em(app);
  ui::card_begin(app);
  ui::dim_text("Tap the systems this round covers; the choice is kept for the next round.");
  if (ImGui::BeginTable("##round_choose", 2, ImGuiTableFlags_SizingStretchSame)) {
    for (const jn::System& sys : app.journal.systems) {
      ImGui::TableNextColumn();
      const auto& chosen = app.round_choice.chosen;
      const bool in = std::binary_search(chosen.begin(), chosen.end(), sys.id);
      const float w = ImGui::GetContentRegionAvail().x;
      const std::string label = ui::fit_text(sys.name, w - 1.2f * e);
      ImGui::PushStyleVar(ImGuiStyleVar_ButtonTextAlign, ImVec2(0.0f, 0.5f));
      const std::string name = "round.choose." + std::to_string(sys.id);
      if (ui::button(app, name, label.c_str(), w, in ? ui::Tone::Primary : ui::Tone::Normal)) {
        toggle_round_system(app, sys.id);
      }
      ImGui::PopStyleVar();
      app.ui.widgets[name].text = in ? "chosen" : "";
    }
    ImGui::EndTable();
  }
  if (ui::button(app, "round.choose.done", "Done", 0, ui::Tone::Quiet)) app.ui.farm.round.choosing = false;
  ui::card_end(app);
}

// Which systems the round lists: all, those due a test, or the keeper's choice.
void draw_scope(AppState& app, const std::vector<jn::SystemId>& listed) {
  RoundChoice& rc = app.round_choice;
  RoundForm& f = app.ui.farm.round;
  if (rc.scope == RoundScope::Due) refresh_farm(app);  // the rule needs the overview's rows
  const std::string total = std::to_string(app.journal.systems.size());
  const std::string labels[3] = {"All " + total, "Due a test", "Chosen " + std::to_string(rc.chosen.size())};
  const char* const options[3] = {labels[0].c_str(), labels[1].c_str(), labels[2].c_str()};
  int scope = static_cast<int>(rc.scope);
  if (ui::choice(app, "round.scope", "Systems in this round", &scope, options, 3)) {
    set_round_scope(app, static_cast<RoundScope>(scope));
    f.choosing = rc.scope == RoundScope::Chosen && rc.chosen.empty();  // nothing chosen yet: choose
  }
  std::string says;
  if (rc.scope == RoundScope::Due) {
    says = app.ui.farm.build.active ? "Reading the logs to see which systems are due… "
                                    : "Due: no test yet, or a level too old to say today's. ";
  }
  says += std::to_string(listed.size()) + " of " + total + " listed.";
  size_t typed_only = 0;  // listed only because values are typed for them
  for (jn::SystemId id : listed) {
    const bool by_choice = rc.scope == RoundScope::All ||
                           (rc.scope == RoundScope::Chosen && std::binary_search(rc.chosen.begin(), rc.chosen.end(), id));
    if (!by_choice && rc.scope != RoundScope::Due && f.typed.count(id)) ++typed_only;
  }
  if (typed_only) {
    says += ' ';
    says += std::to_string(typed_only) + " of them only because values are typed for them.";
  }
  ui::dim_text(says.c_str());
  ui::record(app, "round.listed");
  app.ui.widgets["round.listed"].text = says;
  if (rc.scope != RoundScope::Chosen) return;
  if (f.choosing) {
    draw_chooser(app);
  } else if (ui::button(app, "round.choose", "Choose systems…", 0, ui::Tone::Quiet)) {
    f.choosing = true;
  }
}

}  // namespace

void draw_round(AppState& app) {
  RoundForm& f = app.ui.farm.round;
  ui::dim_text("Type this round's results for each system you tested and leave the rest empty. One Save logs them "
               "all at the time below, in each system's own units. Each value is checked as on the Log screen; if "
               "one is refused, nothing is saved until it is put right.");
  fields::when(app, "round", &f.when_s);
  const std::vector<jn::SystemId> listed = round_systems(app);
  draw_scope(app, listed);
  for (jn::SystemId id : listed) {
    if (const jn::System* sys = jn::find_system(app.journal, id)) draw_system(app, *sys);
  }
  if (!f.error.empty()) {
    ui::colored_wrapped(theme::kError, ("Not saved. " + f.error).c_str());
    ui::record(app, "round.error");
    app.ui.widgets["round.error"].text = f.error;
  }
  if (ui::button(app, "round.save", "Save this round", 0, ui::Tone::Primary)) save_round(app);
}

}  // namespace twapp

// The farm overview (a view of the Systems screen, issue 15): every system on one screen, those
// needing a look first and saying why in words, each with its newest alkalinity, calcium and
// magnesium (and their age), the daily use the Demand screen estimates, and the pumps' doses
// still due today. Tapping a system makes it current and opens its Demand or Water screen.
// Every number comes from the cache refresh_farm fills from the core (farm.cpp).
#include <string>

#include "actions.hpp"
#include "farm.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

const char* const kShort[3] = {"Alk", "Ca", "Mg"};

void open_system(AppState& app, tw::journal::SystemId id, Screen screen) {
  select_system(app, id);
  go_to(app, screen);
}

// Text into a recorded widget, for the tests (as buttons keep their labels).
void record_text(AppState& app, const std::string& name, const std::string& text) {
  ui::record(app, name);
  app.ui.widgets[name].text = text;
}

void draw_levels(AppState& app, const FarmRow& row, std::int64_t now_s) {
  const std::string id = std::to_string(row.id);
  if (!ImGui::BeginTable(("##farm" + id).c_str(), 3, ImGuiTableFlags_SizingStretchProp)) return;
  ImGui::TableSetupColumn("", ImGuiTableColumnFlags_WidthStretch, 0.6f);
  ImGui::TableSetupColumn("Newest test", ImGuiTableColumnFlags_WidthStretch, 2.4f);
  ImGui::TableSetupColumn("Uses a day", ImGuiTableColumnFlags_WidthStretch, 1.3f);
  ImGui::TableHeadersRow();
  for (size_t i = 0; i < 3; ++i) {
    const FarmLevel& l = row.levels[i];
    ImGui::TableNextRow();
    ImGui::TableNextColumn();
    ImGui::TextUnformatted(kShort[i]);
    ImGui::TableNextColumn();
    std::string level = farm_level_text(row, i);
    if (l.tested) {
      if (l.side == tw::BandSide::Below) level += " low";
      if (l.side == tw::BandSide::Above) level += " high";
      level += ", " + farm_age_text(now_s, l.latest_s);
      if (l.stale) level += " (old)";
    }
    const bool flag = l.tested && (l.stale || l.side != tw::BandSide::Inside);
    ImGui::PushStyleColor(ImGuiCol_Text, flag ? theme::kWarning : l.tested ? theme::kText : theme::kTextDim);
    ImGui::TextUnformatted(level.c_str());
    ImGui::PopStyleColor();
    record_text(app, "farm.level." + id + "." + std::to_string(i), level);
    ImGui::TableNextColumn();
    const std::string use = farm_demand_text(row, i);
    ImGui::TextUnformatted(use.empty() ? "\u2013" : use.c_str());
    record_text(app, "farm.demand." + id + "." + std::to_string(i), use);
  }
  ImGui::EndTable();
}

void draw_row(AppState& app, const FarmRow& row, std::int64_t now_s) {
  const float e = ui::em(app);
  const std::string id = std::to_string(row.id);
  const bool current = row.id == app.current_system;
  ui::card_begin(app);
  const ImVec2 top = ImGui::GetCursorScreenPos();
  const float water_w = 4.5f * e;
  const float name_w = ImGui::GetContentRegionAvail().x - water_w - ImGui::GetStyle().ItemSpacing.x;
  ImGui::PushFont(app.ui.fonts.bold);
  const std::string name = ui::fit_text(row.name, name_w - 1.6f * e);
  ImGui::PushStyleVar(ImGuiStyleVar_ButtonTextAlign, ImVec2(0.0f, 0.5f));
  if (ui::button(app, "farm.open." + id, name.c_str(), name_w, current ? ui::Tone::Primary : ui::Tone::Normal)) {
    open_system(app, row.id, Screen::Demand);
  }
  ImGui::PopStyleVar();
  ImGui::PopFont();
  ImGui::SameLine();
  if (ui::button(app, "farm.water." + id, "Water", water_w, ui::Tone::Quiet)) open_system(app, row.id, Screen::Water);
  ImGui::LogText("\n%s\n", row.name.c_str());  // the whole name for screen readers
  if (!row.attention.empty()) {
    std::string why = "Needs a look: ";
    for (size_t k = 0; k < row.attention.size(); ++k) why += (k ? "; " : "") + row.attention[k];
    ui::colored_wrapped(theme::kWarning, (why + ".").c_str());
    record_text(app, "farm.attention." + id, why);
  } else {
    ui::dim_text("In band, tests recent.");
  }
  draw_levels(app, row, now_s);
  if (row.due.empty()) {
    ui::dim_text("No pump schedule running.");
  } else {
    for (const FarmDue& d : row.due) {
      const std::string t = "Due today: " + std::to_string(d.doses_left) + (d.doses_left == 1 ? " more dose, " : " more doses, ") + d.what;
      ui::dim_text(t.c_str());
    }
  }
  ui::card_end(app);
  ui::record_rect(app, "farm.row." + id, top, ImGui::GetItemRectMax());
}

}  // namespace

void draw_farm_overview(AppState& app) {
  refresh_farm(app);
  const FarmCache& c = app.ui.farm.cache;
  const FarmBuild& b = app.ui.farm.build;
  // While a build runs (a few frames after a change), its progress takes the summary's place
  // and the rows of the last build stay, so nothing on the page jumps.
  if (b.active) {
    const std::string progress = "Reading the logs: " + std::to_string(b.next) + " of " +
                                 std::to_string(app.journal.systems.size()) + " systems\u2026";
    ui::dim_text(progress.c_str());
    record_text(app, "farm.progress", progress);
    if (!c.valid) return;
  } else {
    const std::string n = std::to_string(c.rows.size());
    const std::string summary =
        c.needing_attention == 0 ? n + " systems, none needing a look. Tap a name for its Demand screen."
                                 : n + " systems; " + std::to_string(c.needing_attention) +
                                       (c.needing_attention == 1 ? " needs a look and is listed first." : " need a look and are listed first.") +
                                       " Tap a name for its Demand screen.";
    ui::dim_text(summary.c_str());
    record_text(app, "farm.summary", summary);
  }
  ui::dim_text("Uses a day: the estimated consumption, as on the Demand screen. Low or high: the newest "
               "test is outside the system's target band; old: too old to say today's level.");
  for (const FarmRow& row : c.rows) draw_row(app, row, c.now_s);
}

}  // namespace twapp

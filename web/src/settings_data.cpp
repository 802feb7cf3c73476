// Settings, "Your data": where it is kept, the exports (everything as JSON, the log as CSV),
// Import file… and the preview of a picked file, which waits for the keeper's confirmation
// (import_state.hpp). Every count and reason shown is the core's (import_csv, merge_journal).
#include <algorithm>
#include <string>
#include <vector>

#include "actions.hpp"
#include "pick_list.hpp"
#include "platform.hpp"
#include "screens.hpp"
#include "theme.hpp"
#include "tidewright/journal/journal_csv_columns.hpp"
#include "ui.hpp"

namespace twapp {

namespace {

namespace jn = tw::journal;
namespace dt = tw::datetime;

constexpr std::size_t kRefusedShown = 5;  // the first refused rows listed; the rest counted

std::string count_of(std::size_t n, const char* one, const char* many) {
  return std::to_string(n) + " " + (n == 1 ? one : many);
}

const char* separator_name(char c) {
  switch (c) {
    case ';': return "semicolon";
    case '\t': return "tab";
    default: return "comma";
  }
}

const char* date_order_text(dt::DateOrder order) {
  switch (order) {
    case dt::DateOrder::DayMonthYear: return "day before month (03/04 is 3 April)";
    case dt::DateOrder::MonthDayYear: return "month before day (03/04 is March 4)";
    case dt::DateOrder::Unspecified: break;
  }
  return "as each date shows (year-month-day, or a day over 12)";
}

float half_width() { return (ImGui::GetContentRegionAvail().x - ImGui::GetStyle().ItemSpacing.x) / 2; }

// The system for rows that name none: the current one unless the keeper picks another from the
// list (a farm has 30+ systems: it scrolls and can be filtered, as the header's switcher).
void draw_csv_system_choice(AppState& app, ImportPreview& p) {
  const auto& systems = app.journal.systems;
  if (systems.size() == 1) {
    ui::label_value(app, "Rows without a system go to", systems.front().name);
    return;
  }
  const jn::System* chosen = jn::find_system(app.journal, p.csv_system);
  ui::dim_text("Rows without a system go to");
  ui::wrapped(chosen ? chosen->name.c_str() : "?");  // a long name wraps: the list below cuts it
  ui::record(app, "import.system");
  std::vector<ui::PickEntry> entries;
  for (const jn::System& s : systems) entries.push_back({std::to_string(s.id), s.name, s.id == p.csv_system});
  const float box = std::min(7 * ui::kTargetEm * ui::em(app), 0.4f * ImGui::GetMainViewport()->Size.y);
  const int picked = ui::pick_list(app, "import.system", "Find a system", p.system_list, entries, box);
  if (picked >= 0 && systems[static_cast<std::size_t>(picked)].id != p.csv_system) {
    p.csv_system = systems[static_cast<std::size_t>(picked)].id;
    remake_import_preview(app);
  }
}

// A column's meaning in plain words: the core's label for it, else as typed.
std::string meaning_label(const std::string& meaning) {
  if (meaning == "skip") return "not read (skipped)";
  for (const jn::CsvColumnMeaning& m : jn::csv_column_meanings()) {
    if (m.meaning == meaning) return m.label;
  }
  return "'" + meaning + "'";
}

// "Read as…" for one column: the core's list of meanings (and skip) to pick from, or a meaning
// typed. True when a choice made the preview again (the report drawn from is then gone).
bool draw_read_as(AppState& app, ImportPreview& p, const std::string& header) {
  if (p.mapping_open != header) {
    // The column's name on the button: two columns' buttons would otherwise look the same.
    const float room = ImGui::GetContentRegionAvail().x - 2 * ImGui::GetStyle().FramePadding.x;
    const std::string label = ui::fit_text("Read '" + header + "' as\u2026", room);
    if (ui::button(app, "import.map." + header, label.c_str(), -1, ui::Tone::Quiet)) {
      p.mapping_open = header;
      p.mapping_typed.clear();
      p.meaning_list = {};
    }
    return false;
  }
  ui::wrapped(("Read column '" + header + "' as").c_str());
  std::vector<ui::PickEntry> entries = {{"skip", "Skip: do not read it", false}};
  for (const jn::CsvColumnMeaning& m : jn::csv_column_meanings()) entries.push_back({m.meaning, m.label, false});
  const float box = std::min(7 * ui::kTargetEm * ui::em(app), 0.4f * ImGui::GetMainViewport()->Size.y);
  const int picked = ui::pick_list(app, "import.meaning", "Find a meaning", p.meaning_list, entries, box);
  if (picked >= 0) {
    map_import_column(app, header, entries[static_cast<std::size_t>(picked)].key);
    return true;
  }
  if (ui::text_field(app, "import.meaning_typed", "Or type what it holds", &p.mapping_typed, "for example calcium mg/L or pH total")) {
    map_import_column(app, header, p.mapping_typed);
    return true;
  }
  if (ui::button(app, "import.map_close", "Leave it as it is", 0, ui::Tone::Quiet)) p.mapping_open.clear();
  return false;
}

// The columns the core did not read, with its reason, and the keeper's own readings.
bool draw_columns(AppState& app, ImportPreview& p, const jn::CsvImportReport& r) {
  if (!p.mapping_error.empty()) {
    ui::colored_wrapped(theme::kWarning, ("Refused: " + p.mapping_error).c_str());
    ui::record(app, "import.mapping_error");
  }
  for (const jn::CsvColumnMapping& m : p.mappings) {
    ui::wrapped(("Column '" + m.header + "' is read as " + meaning_label(m.meaning) + ".").c_str());
    ui::record(app, "import.mapped." + m.header);
    if (draw_read_as(app, p, m.header)) return true;
    if (p.mapping_open != m.header && ui::button(app, "import.unmap." + m.header, "Read it by its name again", -1, ui::Tone::Quiet)) {
      map_import_column(app, m.header, "");
      return true;
    }
  }
  for (const jn::UnusedColumn& c : r.unused_columns) {
    const bool mapped = std::any_of(p.mappings.begin(), p.mappings.end(), [&](const auto& m) { return m.header == c.name; });
    if (mapped) continue;
    ui::dim_text(("Not read: " + c.reason).c_str());  // the core's reason names the column
    if (draw_read_as(app, p, c.name)) return true;
  }
  return false;
}

// Shown when the core could not tell the order of a date like 03/04/2026 (the rows are
// refused for it), and kept once the keeper chose. True when the choice made the preview again
// (the report passed in is then gone).
bool draw_date_order_choice(AppState& app, ImportPreview& p, const jn::CsvImportReport& r) {
  bool ambiguous = false;
  for (const jn::RejectedRow& row : r.rejected) ambiguous |= row.field == "time";
  if (!p.date_order_chosen && !(ambiguous && r.date_order == dt::DateOrder::Unspecified)) return false;
  const char* const orders[] = {"Day first: 03/04 is 3 April", "Month first: 03/04 is March 4"};
  int index = p.date_order == dt::DateOrder::MonthDayYear ? 1 : p.date_order == dt::DateOrder::DayMonthYear ? 0 : -1;
  if (ui::choice(app, "import.date_order", "Dates like 03/04/2026 in this file are", &index, orders, 2)) {
    p.date_order = index == 1 ? dt::DateOrder::MonthDayYear : dt::DateOrder::DayMonthYear;
    p.date_order_chosen = true;
    remake_import_preview(app);
    return true;
  }
  return false;
}

void draw_csv_preview(AppState& app, ImportPreview& p) {
  ui::wrapped("A CSV file of log entries.");
  if (!app.journal.systems.empty()) draw_csv_system_choice(app, p);
  if (!p.error.empty()) {
    ui::colored_wrapped(theme::kError, ("Nothing can be added from this file. " + p.error).c_str());
    ui::record(app, "import.error");
    if (ui::button(app, "import.cancel", "Close")) cancel_import(app);
    return;
  }
  if (draw_date_order_choice(app, p, *p.csv_report)) return;  // remade: shown from the next frame
  const jn::CsvImportReport& r = *p.csv_report;
  ui::label_value(app, "Entries to add", std::to_string(r.added.size()), theme::kAccent);
  ui::label_value(app, "Already in the log (skipped)", std::to_string(r.duplicates_skipped));
  ui::label_value(app, "Rows refused", std::to_string(r.rejected.size()), r.rejected.empty() ? 0 : theme::kWarning);
  ui::record(app, "import.counts");
  for (std::size_t i = 0; i < r.rejected.size() && i < kRefusedShown; ++i) {
    const jn::RejectedRow& row = r.rejected[i];
    ui::colored_wrapped(theme::kWarning, ("Line " + std::to_string(row.line) + ", " + row.field + ": " + row.reason).c_str());
    ui::record(app, "import.refused." + std::to_string(i));
  }
  if (r.rejected.size() > kRefusedShown) {
    ui::dim_text(("and " + count_of(r.rejected.size() - kRefusedShown, "more row", "more rows") + " refused").c_str());
  }
  if (!r.rejected.empty()) ui::dim_text("Refused rows are not added; fix them in the file and import it again (rows already added are skipped).");
  if (draw_columns(app, p, r)) return;  // remade: shown from the next frame
  if (r.blank_rows_skipped) ui::dim_text((count_of(static_cast<std::size_t>(r.blank_rows_skipped), "empty row", "empty rows") + " skipped.").c_str());
  ui::dim_text((std::string("Separator: ") + separator_name(r.delimiter) + ". Dates read " + date_order_text(r.date_order) +
                "; times without a zone are this device's local time on their own date (daylight saving included).").c_str());
  const float half = half_width();
  if (r.added.empty()) {
    ui::dim_text("Nothing new to add.");
    if (ui::button(app, "import.cancel", "Close")) cancel_import(app);
    return;
  }
  const std::string add = "Add " + count_of(r.added.size(), "entry", "entries");
  if (ui::button(app, "import.add", add.c_str(), half, ui::Tone::Primary)) {
    confirm_import_add(app);
    return;
  }
  ImGui::SameLine();
  if (ui::button(app, "import.cancel", "Cancel", half)) cancel_import(app);
}

void draw_journal_preview(AppState& app, ImportPreview& p) {
  if (!p.error.empty()) {
    ui::colored_wrapped(theme::kError, ("This file cannot be read: " + p.error).c_str());
    ui::record(app, "import.error");
    if (ui::button(app, "import.cancel", "Close")) cancel_import(app);
    return;
  }
  ui::wrapped(("A Tidewright file with " + count_of(static_cast<std::size_t>(p.file_systems), "system", "systems") + " and " +
               count_of(static_cast<std::size_t>(p.file_events), "log entry", "log entries") + ".").c_str());
  const std::size_t here_systems = app.journal.systems.size(), here_events = app.journal.events.size();
  if (p.confirm_replace) {
    ui::colored_wrapped(theme::kWarning,
                        (count_of(here_systems, "system", "systems") + " and " + count_of(here_events, "log entry", "log entries") +
                         " here will be replaced by the file's, with the settings the file holds. Export first to keep a copy.").c_str());
    ui::record(app, "import.replace_warning");
    const float half = half_width();
    if (ui::button(app, "import.replace_back", "Back", half)) p.confirm_replace = false;
    ImGui::SameLine();
    if (ui::button(app, "import.replace_confirm", "Replace", half, ui::Tone::Danger)) confirm_import_replace(app);
    return;
  }
  if (p.merge_report) {
    const jn::MergeReport& m = *p.merge_report;
    ui::label_value(app, "New entries", std::to_string(m.entries_added), theme::kAccent);
    ui::label_value(app, "Already here (skipped)", std::to_string(m.duplicates_skipped));
    ui::label_value(app, "New systems", std::to_string(m.systems_added));
    ui::label_value(app, "Systems here of the same name", std::to_string(m.systems_matched));
    ui::record(app, "import.counts");
    for (const std::string& name : m.settings_kept) {
      ui::dim_text((name + ": the file's settings for it differ (volume, units or targets); adding keeps the ones here.").c_str());
    }
    if (ui::button(app, "import.add", "Add to what is here", 0, ui::Tone::Primary)) {
      confirm_import_add(app);
      return;
    }
  } else {
    ui::colored_wrapped(theme::kWarning, ("It cannot be added to what is here: " + p.merge_error).c_str());
    ui::record(app, "import.merge_error");
  }
  if (ui::button(app, "import.replace", "Replace everything\u2026", 0, ui::Tone::Quiet)) p.confirm_replace = true;
  if (ui::button(app, "import.cancel", "Cancel")) cancel_import(app);
}

void draw_import_preview(AppState& app) {
  ImportPreview& p = app.ui.import;
  ui::card_begin(app);
  ImGui::PushFont(app.ui.fonts.bold);
  ui::wrapped("File to import: nothing changes until you confirm");
  ImGui::PopFont();
  ui::record(app, "import.preview");
  if (p.kind == ImportKind::Csv) draw_csv_preview(app, p);
  else draw_journal_preview(app, p);
  ui::card_end(app);
}

}  // namespace

void draw_settings_data(AppState& app) {
  ui::heading(app, "Your data");
  ui::dim_text(("Kept in " + platform::storage_location() + ", saved after every change.").c_str());
  if (!app.store.save_error.empty()) ui::colored_wrapped(theme::kError, ("Last save failed: " + app.store.save_error).c_str());
  const float half = half_width();
  if (ui::button(app, "settings.export", "Export to file", half)) export_all(app);
  ImGui::SameLine();
  if (ui::button(app, "settings.import", "Import file\u2026", half)) ask_import(app);
  ui::dim_text("Export to file keeps everything: systems, log, schedules and settings. Import file takes such a file "
               "or a CSV of log entries (the command line's columns, or a spreadsheet's); it shows what would change "
               "and waits for you: a CSV's rows are added, skipping any already in the log; a Tidewright file can be "
               "added to what is here or replace it.");
  if (app.ui.import.kind != ImportKind::None) draw_import_preview(app);

  const char* const scopes[] = {"This system", "All systems"};
  int scope = app.ui.csv_export_all ? 1 : 0;
  if (ui::choice(app, "settings.csv_scope", "Log as CSV, for a spreadsheet", &scope, scopes, 2)) app.ui.csv_export_all = scope == 1;
  if (ui::button(app, "settings.export_csv", "Export log as CSV")) export_log_csv(app);
  ui::dim_text("Tests, doses, water changes, top-offs and notes, one per row, in the columns of the command line's "
               "log export. Standing pump schedules, and doses marked against them, are kept only in Export to file.");
  if (!app.demo_system_ids.empty()) {
    if (ui::button(app, "settings.remove_demo", "Remove demo data", 0, ui::Tone::Quiet)) remove_demo(app);
  }
}

}  // namespace twapp

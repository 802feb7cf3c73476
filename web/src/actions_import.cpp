// Import with a preview, and the log's CSV export (import_state.hpp says what waits where).
// The kind of a picked file is read from its text, not its name: a Tidewright file is a JSON
// object; anything else is read as CSV. Every preview is made by the core on a copy of the
// journal (import_csv, merge_journal), so what the keeper confirms is exactly what is added.
#include <algorithm>
#include <cctype>
#include <optional>

#include "actions.hpp"
#include "local_time.hpp"
#include "platform.hpp"
#include "store.hpp"
#include "tidewright/common/datetime.hpp"
#include "tidewright/journal/journal_csv.hpp"
#include "tidewright/journal/journal_merge.hpp"

namespace twapp {

namespace jn = tw::journal;

namespace {

ImportKind kind_of_text(const std::string& text) {
  std::size_t i = text.rfind("\xEF\xBB\xBF", 0) == 0 ? 3 : 0;  // a UTF-8 byte order mark
  while (i < text.size() && std::isspace(static_cast<unsigned char>(text[i]))) ++i;
  return i < text.size() && text[i] == '{' ? ImportKind::Journal : ImportKind::Csv;
}

void make_csv_preview(AppState& app) {
  ImportPreview& p = app.ui.import;
  p.merged = app.journal;
  p.csv_report.reset();
  p.error.clear();
  if (!jn::find_system(app.journal, p.csv_system)) p.csv_system = app.current_system;
  // The options `tidewright log import` uses: future rows refused, local times in this zone.
  jn::CsvImportOptions opt;
  opt.time = local_time::parse_options(p.date_order);  // each date's own offset, as the CLI reads it
  if (p.csv_system) opt.default_system = p.csv_system;
  opt.now_s = platform::now_unix_seconds();
  opt.mappings = p.mappings;
  auto report = jn::import_csv(p.merged, p.text, opt);
  if (!report && report.error().field == "column mapping" && !p.mappings.empty()) {
    // The newest choice is refused: say why and make the preview without it.
    p.mapping_error = report.error().message;
    p.mappings.pop_back();
    make_csv_preview(app);
    return;
  }
  if (!report) {
    p.error = report.error().field + ": " + report.error().message;
    p.merged = {};
    return;
  }
  p.csv_report = std::move(report).value();
}

void make_journal_preview(AppState& app) {
  ImportPreview& p = app.ui.import;
  p.merge_report.reset();
  p.error.clear();
  p.merge_error.clear();
  auto stored = store_from_text(p.text);
  if (!stored) {
    p.error = stored.error().field + ": " + stored.error().message;
    return;
  }
  p.file_systems = static_cast<int>(stored->journal.systems.size());
  p.file_events = static_cast<int>(stored->journal.events.size());
  p.merged = app.journal;
  auto report = jn::merge_journal(p.merged, stored->journal);
  if (!report) {
    p.merge_error = report.error().field + ": " + report.error().message;
    p.merged = {};
    return;
  }
  p.merge_report = std::move(report).value();
}

// The preview was made from the journal as it was; another tab may have changed it since.
bool preview_current(AppState& app) {
  if (app.ui.import.made_at_revision == app.revision) return true;
  remake_import_preview(app);
  notify(app, "Your data changed meanwhile: the preview is made again, look before confirming", true);
  return false;
}

void journal_changed(AppState& app) {
  if (!jn::find_system(app.journal, app.current_system)) {
    app.current_system = app.journal.systems.empty() ? 0 : app.journal.systems.front().id;
  }
  ++app.revision;
  save(app);
}

std::string plural(int n, const char* one, const char* many) {
  return std::to_string(n) + " " + (n == 1 ? one : many);
}

}  // namespace

bool import_text(AppState& app, const std::string& text) {
  if (text.empty()) {
    notify(app, "Import: the file is empty or could not be read", true);
    return false;
  }
  ImportPreview p;
  p.kind = kind_of_text(text);
  p.text = text;
  p.csv_system = app.current_system;
  app.ui.import = std::move(p);
  remake_import_preview(app);
  go_to(app, Screen::Settings);
  app.ui.reveal = "import.preview";
  return true;
}

void remake_import_preview(AppState& app) {
  ImportPreview& p = app.ui.import;
  p.confirm_replace = false;
  if (p.kind == ImportKind::Csv) make_csv_preview(app);
  if (p.kind == ImportKind::Journal) make_journal_preview(app);
  p.made_at_revision = app.revision;
}

void map_import_column(AppState& app, std::string header, std::string meaning) {
  ImportPreview& p = app.ui.import;
  if (p.kind != ImportKind::Csv) return;
  const auto old = std::find_if(p.mappings.begin(), p.mappings.end(), [&](const jn::CsvColumnMapping& m) { return m.header == header; });
  const std::optional<jn::CsvColumnMapping> before = old == p.mappings.end() ? std::nullopt : std::optional(*old);
  if (old != p.mappings.end()) p.mappings.erase(old);
  if (!meaning.empty()) p.mappings.push_back({header, meaning});
  p.mapping_error.clear();
  p.mapping_open.clear();
  p.mapping_typed.clear();
  remake_import_preview(app);
  if (!p.mapping_error.empty() && before) {  // refused: the column keeps the reading it had
    p.mappings.push_back(*before);
    remake_import_preview(app);
  }
}

bool confirm_import_add(AppState& app) {
  ImportPreview& p = app.ui.import;
  if (!preview_current(app)) return false;
  std::string message;
  if (p.kind == ImportKind::Csv && p.csv_report && !p.csv_report->added.empty()) {
    message = "Added " + plural(static_cast<int>(p.csv_report->added.size()), "entry", "entries") + " to the log";
    if (p.csv_report->duplicates_skipped) message += "; " + std::to_string(p.csv_report->duplicates_skipped) + " already there";
  } else if (p.kind == ImportKind::Journal && p.merge_report) {
    const jn::MergeReport& m = *p.merge_report;
    // The Plan and Hatchery settings of a system the file brings along come with it.
    if (auto stored = store_from_text(p.text)) {
      for (const auto& [file_id, here_id] : m.system_ids) {
        auto it = stored->dosing_by_system.find(file_id);
        if (it != stored->dosing_by_system.end() && !jn::find_system(app.journal, here_id)) {
          app.dosing_by_system[here_id] = it->second;
        }
      }
    }
    message = "Added " + plural(m.entries_added, "entry", "entries") + " and " + plural(m.systems_added, "system", "systems");
    if (m.duplicates_skipped) message += "; " + std::to_string(m.duplicates_skipped) + " already there";
  } else {
    cancel_import(app);
    return false;
  }
  app.journal = std::move(p.merged);
  app.ui.import = {};
  notify(app, message);
  journal_changed(app);
  return true;
}

bool confirm_import_replace(AppState& app) {
  if (app.ui.import.kind != ImportKind::Journal) return false;
  const std::string text = std::move(app.ui.import.text);
  app.ui.import = {};
  return replace_all_from_text(app, text);
}

void cancel_import(AppState& app) {
  app.ui.import = {};
  notify(app, "Import cancelled: nothing changed");
}

void export_log_csv(AppState& app) {
  jn::EventFilter filter;
  const jn::System* sys = current_system(app);
  if (!app.ui.csv_export_all && sys) filter.system_id = sys->id;
  const std::string name = "tidewright-log-" + tw::datetime::format_date_utc(platform::now_unix_seconds()) + ".csv";
  std::string where;
  if (platform::export_file(name, "text/csv", jn::export_csv(app.journal, filter), &where)) {
    notify(app, "Log exported as CSV to " + where);
  } else {
    notify(app, "Export failed: " + where, true);
  }
}

}  // namespace twapp

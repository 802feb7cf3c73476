// A file picked with "Import file…" waits here, shown as a preview in Settings, until the
// keeper confirms or cancels it: nothing in the journal changes before that.
//   CSV of test results: import_csv on a copy of the journal makes the preview; confirming
//   adopts the copy (one change, one save). The keeper's choices (system for rows without
//   one, date order, a column read as a meaning) make the preview again.
//   A Tidewright file (JSON): "Add to what is here" (merge_journal) or "Replace everything"
//   (asked twice, naming what goes).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "tidewright/common/datetime.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/journal/journal_csv.hpp"
#include "tidewright/journal/journal_merge.hpp"
#include "pick_list_state.hpp"

namespace twapp {

enum class ImportKind { None, Csv, Journal };

struct ImportPreview {
  ImportKind kind = ImportKind::None;
  std::string text;  // the file as read
  // CSV: the keeper's choices, and the preview they give.
  tw::journal::SystemId csv_system = 0;  // for rows without a system cell
  tw::datetime::DateOrder date_order = tw::datetime::DateOrder::Unspecified;
  bool date_order_chosen = false;        // the keeper picked one (the choice stays on screen)
  PickListState system_list;             // the list the system above is picked from
  // The keeper's "Read as…" choices for columns the core did not read by their names, in the
  // order made; the newest goes last (a refused one is taken out again, see mapping_error).
  std::vector<tw::journal::CsvColumnMapping> mappings;
  std::string mapping_open;              // the column whose "Read as…" list is open ("" = none)
  std::string mapping_typed;             // a meaning typed instead of picked
  PickListState meaning_list;
  std::string mapping_error;             // the core's refusal of the last choice, which is not kept
  tw::journal::Journal merged;           // the copy with the file in it (CSV and JSON merge)
  std::optional<tw::journal::CsvImportReport> csv_report;
  std::optional<tw::journal::MergeReport> merge_report;
  std::string error;                     // file-level refusal: nothing can be added
  std::string merge_error;               // JSON: why adding it here is refused (replace may still go)
  // JSON: the file's counts, and the second step of "Replace everything".
  int file_systems = 0, file_events = 0;
  bool confirm_replace = false;
  std::uint64_t made_at_revision = 0;    // the journal's revision the preview was made from
};

}  // namespace twapp

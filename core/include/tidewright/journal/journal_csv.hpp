// Journal <-> spreadsheet CSV (RFC 4180), text in and out. Column names are ours and are
// documented in docs/journal-format.md; headers are matched case-insensitively.
//
// Long form (one event per row):
//   time, system, type, parameter, other_name, value, unit, precision, ph_scale, kit,
//   additive, amount, amount_unit, stock_g_per_l, volume, volume_unit, top_off_kind,
//   limewater_g_per_l, new_alkalinity_dkh, new_calcium_mg_l, new_magnesium_mg_l, new_salinity,
//   note
//   Only "time" is required (and "system" when the journal has several systems and no
//   default is given). "type" (test, dose, water_change, top_off, note) may be left out: a row
//   with a parameter is a test, with an additive a dose, with only a note a note. An empty
//   unit cell takes the system's unit preference (units per row); an empty ph_scale the
//   system's pH scale. A note on a test or dose row is added as its own note event.
// Wide form (one column per parameter, the unit in the column name; units per column):
//   alkalinity_dkh, alkalinity_meq_l, alkalinity_mg_l_caco3, calcium_mg_l, magnesium_mg_l,
//   ph_nbs, ph_total, ph_sws, ph_free, salinity_psu, specific_gravity, temperature_c,
//   temperature_f, nitrate_mg_l, phosphate_mg_l. Every non-empty cell becomes a test result.
//   Wide and long columns may be mixed in one file. Headers are read flexibly
//   (journal_csv_columns.hpp): "Calcium (mg/L)", "Ca_mg_l", "Alkalinity [dKH]", "alk meq/L",
//   "Date", "Notes"; the user may map a column with CsvImportOptions::mappings. Every column
//   that is not read is listed in the report with its reason.
// Spreadsheet habits: the separator (',' ';' TAB) is detected from the header or given;
// numbers may use a decimal comma ("8,2", a quoted cell in a comma file); blank rows and rows
// of bare separators are skipped and counted; a UTF-8 BOM and CRLF line ends are fine.
#pragma once

#include <string>
#include <vector>

#include "tidewright/common/datetime.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/journal/journal_csv_columns.hpp"
#include "tidewright/common/result.hpp"

namespace tw::journal {

struct CsvImportOptions {
  datetime::ParseOptions time;             // date order (dmy/mdy) and local UTC offset or zone
  std::optional<SystemId> default_system;  // for rows without a system cell
  char delimiter = 0;                      // ',' ';' '\t', or 0: detected from the header
  std::vector<CsvColumnMapping> mappings;  // the user's reading of some columns
  // The time now: a row later than this (beyond check_not_in_future's slack) is refused with
  // the same rule as a new entry. Unset: no check (a file of old data is read as it is).
  std::optional<std::int64_t> now_s;
};

struct UnusedColumn {
  std::string name;    // the header cell as written
  std::string reason;  // why it is not read
};

struct RejectedRow {
  int line = 0;       // 1-based line of the CSV text where the row starts
  std::string field;  // column or field at fault, e.g. "time", "value"
  std::string reason; // readable reason naming the accepted range or forms
};

struct CsvImportReport {
  std::vector<EventId> added;       // ids of the new events, in file order
  int duplicates_skipped = 0;       // rows equal to an event already in the journal
  std::vector<RejectedRow> rejected;
  std::vector<UnusedColumn> unused_columns;  // every header cell that is not read, in file order
  int blank_rows_skipped = 0;                // rows with no text in any cell (bare separators)
  char delimiter = ',';                      // the separator used
  // The date order used for dates like 03/04/2026: the one given, or the one the file's own
  // dates show (a 25/03/2026 anywhere makes it day/month/year), or Unspecified.
  datetime::DateOrder date_order = datetime::DateOrder::Unspecified;
};

// Adds every valid row to the journal and reports every other row with its line and reason.
// Nothing already in the journal is changed or removed. A row identical to an existing event
// (same system, time and content) is skipped and counted, so importing a file twice adds
// nothing the second time. A file-level error (no header, no time column, unclosed quote, no
// way to tell the system) is returned as an Error and then nothing is added.
Result<CsvImportReport> import_csv(Journal& journal, const std::string& text,
                                   const CsvImportOptions& options = {});

// Long-form CSV of the selected events (all columns above, times as ISO 8601 UTC, systems by
// name, CRLF line ends). Text cells that a spreadsheet would run as a formula (first character
// = + - @ TAB or CR) get a leading apostrophe; numbers, negative ones included, stay plain
// numbers. import_csv removes such an apostrophe again, so export -> import gives the same
// events.
// Standing schedules and the doses marked against them are not rows of the long form (a
// schedule is not one event at one time): they stay in the JSON journal only, and
// csv_exportable() says which events the CSV leaves out.
std::string export_csv(const Journal& journal, const EventFilter& filter = {});
bool csv_exportable(const Event& event);

// The long-form header used by export_csv.
const std::vector<std::string>& csv_long_columns();

}  // namespace tw::journal

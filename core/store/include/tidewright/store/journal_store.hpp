// The journal in an embedded database (SQLite): the one storage interface of the command line
// and the desktop app. The science (tidewright_core) never includes this; the store uses the
// core's journal model and its validation, so a row in the database is always a record the
// core accepts.
//
// Map of this header
//   1. Opening: a database file, with WAL, a busy timeout and the schema migrated
//   2. Reads: systems, one event, events of a filter streamed in time order
//   3. Changes: each in its own transaction, validated by the core first
//   4. Imports: a whole journal (the JSON format) or CSV, all or nothing
//   5. Exports: JSON and CSV streamed to an output
//   6. Backup, restore and the integrity check
//   7. Small named settings (the app's own part)
//
// The database schema and how to add to it: core/store/src/store_schema.cpp.
#pragma once

#include <cstdint>
#include <functional>
#include <istream>
#include <memory>
#include <optional>
#include <ostream>
#include <string>
#include <vector>

#include "tidewright/common/result.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/journal/journal_csv.hpp"
#include "tidewright/journal/journal_diff.hpp"

struct sqlite3;

namespace tw::store {

// ---------------------------------------------------------------- 1. Opening
struct OpenOptions {
  bool read_only = false;      // never writes; refuses a missing file
  bool create = true;          // create the file (and the schema) if it does not exist
  int busy_timeout_ms = 60000; // how long a writer waits for another writer before giving up
};

// What Database::open returns on a damaged or foreign file: Error{"journal", "... reason"}.
class JournalStore {
 public:
  static Result<std::unique_ptr<JournalStore>> open(const std::string& path, const OpenOptions& options = {});
  ~JournalStore();
  JournalStore(const JournalStore&) = delete;
  JournalStore& operator=(const JournalStore&) = delete;

  const std::string& path() const { return path_; }
  int schema_version() const;

  // ---------------------------------------------------------------- 2. Reads
  std::string description() const;
  std::vector<journal::System> systems() const;  // in id order (the order they were added)
  std::optional<journal::System> system(journal::SystemId id) const;
  std::optional<journal::System> system_by_name(const std::string& name) const;  // no case
  std::optional<journal::Event> event(journal::EventId id) const;
  std::int64_t event_count(const journal::EventFilter& filter = {}) const;

  // Calls visit for each event of the filter in (time, id) order, or newest first with
  // newest_first; at most limit events (0 = all). visit returns false to stop. One row is in
  // memory at a time, whatever the size of the journal.
  struct Query {
    journal::EventFilter filter;
    bool newest_first = false;
    std::int64_t limit = 0;
  };
  Status for_each_event(const Query& query, const std::function<bool(const journal::Event&)>& visit) const;

  // A journal holding one system and all its events: what the estimate and the plan take
  // (estimate::series_from_journal, plan::plan_basis_from_journal). Memory grows with that
  // system's events only.
  Result<journal::Journal> system_journal(journal::SystemId id) const;

  // ---------------------------------------------------------------- 3. Changes
  // Each call is one transaction: validated by the core (journal.hpp) against the stored
  // records, then written, or refused with the core's error and nothing changed.
  Result<journal::SystemId> add_system(const journal::System& system);
  Result<journal::EventId> add_event(const journal::Event& event);
  Status update_system(const journal::System& system);
  Status update_event(const journal::Event& event);
  Status remove_system(journal::SystemId id, bool with_events = false);
  Status remove_event(journal::EventId id);
  Status set_description(const std::string& text);
  // Each add, update and remove above is recorded (schema version 4, table changes) in its
  // own transaction; undo_last puts the journal back as it was before the last one and
  // returns what it undid ("added test 12"). Restores and apply() (the app's saves) are
  // recorded as a stop: undo refuses to reach past them (Error field "undo"). Imports are not
  // recorded; undo refuses to reach past records an import added since the last change.
  Result<std::string> undo_last();

  // Several changes at once (journal_diff.hpp: what an app changed since it last saved), in one
  // transaction, each record validated by the core. A record the change created whose id
  // another program took in the meantime gets the next free id instead: moved_ids says so,
  // and the caller should read the journal again. Removing a system that still has events in
  // the store (someone else's) is refused and nothing is written.
  struct ApplyReport {
    std::vector<std::pair<std::int64_t, std::int64_t>> moved_ids;  // (id in the change, id stored)
  };
  Result<ApplyReport> apply(const journal::JournalChanges& changes);

  // ---------------------------------------------------------------- 4. Imports
  struct ImportReport {
    std::int64_t systems_added = 0;
    std::int64_t events_added = 0;
    std::int64_t duplicates_skipped = 0;  // events already in the journal (same system, time, content)
    std::vector<journal::RejectedRow> rejected;  // CSV rows refused (with line and reason)
    std::vector<journal::UnusedColumn> unused_columns;  // CSV columns not read, with the reason
    std::int64_t blank_rows_skipped = 0;                // CSV rows with no text in any cell
    char delimiter = ',';                               // the CSV separator used
    datetime::DateOrder date_order = datetime::DateOrder::Unspecified;  // as CsvImportReport
    std::vector<journal::Event> would_add;  // a dry run with no WouldAdd: the events that would be stored
  };
  // A dry run given one of these hands it each event it would store, in order, instead of
  // keeping them in would_add: a farm's import is hundreds of thousands of events, and a
  // listing of them is printed as it goes, with memory flat.
  using WouldAdd = std::function<void(const journal::Event&)>;
  // Commit stores the import; DryRun does all the same work and checks in the transaction,
  // fills would_add, and rolls back: nothing is stored.
  enum class ImportMode { Commit, DryRun };
  // A whole journal (parsed and validated by journal_file.hpp) in one transaction. Into an
  // empty database the ids, description and next id are kept exactly (opening an old JSON
  // journal); otherwise systems are matched by name (new ones added) and events get new ids,
  // skipping duplicates. All or nothing.
  Result<ImportReport> import_journal(const journal::Journal& journal, ImportMode mode = ImportMode::Commit,
                                      const WouldAdd& would_add = {});
  // The same from a JSON journal file read one event at a time (journal_stream.hpp), so that
  // memory stays flat whatever its size: the stream must be seekable (a file; it is read twice)
  // or it is read whole. The reader's errors are returned as they are (field and text name
  // the record: "events[12].value: ..."), and nothing is stored. New ids are given in the
  // file's order (import_journal: time order; the same for a file Tidewright wrote).
  Result<ImportReport> import_journal_stream(std::istream& in, ImportMode mode = ImportMode::Commit,
                                             const WouldAdd& would_add = {});
  // CSV (journal_csv.hpp) read from the stream in chunks of rows, in one transaction: the
  // accepted rows are committed together, every refused row is reported with its line. A
  // file-level error (no header, unclosed quote...) adds nothing.
  Result<ImportReport> import_csv(std::istream& in, const journal::CsvImportOptions& options,
                                  ImportMode mode = ImportMode::Commit, const WouldAdd& would_add = {});

  // ---------------------------------------------------------------- 5. Exports
  // The journal in the documented JSON format (docs/journal-format.md), written event by
  // event; parse_journal reads it back to the same journal. A filter keeps the events the CSV
  // export of the same filter keeps (with --system, only that system), plus any schedule a
  // kept dose is marked against, so that the file is still a valid journal.
  Status export_json(std::ostream& out, const journal::EventFilter& filter = {}) const;
  // Long-form CSV of the filter's events (journal_csv.hpp columns), in chunks.
  Status export_csv(std::ostream& out, const journal::EventFilter& filter = {}) const;

  // ---------------------------------------------------------------- 6. Backup, restore, check
  // A consistent copy of the database while others may write (SQLite's online backup), to a
  // new file at target (written beside it under a temporary name, then renamed).
  Status backup_to(const std::string& target) const;
  // Replaces the whole content with a backup (a database made by backup_to, or a JSON journal
  // already parsed), in one transaction: ids kept.
  Status restore_from_database(const std::string& backup_path);
  Status restore_from_journal(const journal::Journal& journal);
  // A JSON journal read one event at a time (as import_journal_stream), in one transaction.
  Status restore_from_journal_stream(std::istream& in);

  struct IntegrityReport {
    bool ok = true;
    std::vector<std::string> problems;  // one line each, plain words
    // Not problems: records from before a newer rule (a system name that reads as an id, has
    // spaces around it or control characters), kept and usable, best renamed.
    std::vector<std::string> notes;
    std::int64_t systems = 0, events = 0;
    int schema_version = 0;
  };
  // SQLite's own page check, the foreign keys, and every record read back and validated by
  // the core, one system at a time.
  IntegrityReport check_integrity() const;

  // ---------------------------------------------------------------- 7. Settings
  std::optional<std::string> setting(const std::string& key) const;
  Status set_setting(const std::string& key, const std::string& value);

  // For tests and the benchmark only: the raw handle.
  sqlite3* handle() const { return db_; }

 private:
  JournalStore(sqlite3* db, std::string path) : db_(db), path_(std::move(path)) {}
  void add_schedule_context(journal::Journal& scratch, const journal::Event& event) const;
  sqlite3* db_ = nullptr;
  std::string path_;
};

// True if the file starts with SQLite's header ("SQLite format 3").
bool is_database_file(const std::string& path);

}  // namespace tw::store

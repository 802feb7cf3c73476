// A JSON journal streamed into the store (journal_stream.hpp: one event at a time, never the
// whole file in memory): an import (import_journal_stream) and a restore
// (restore_from_journal_stream). Each is one write transaction, rolled back on any error, so
// that a refused record (named by its JSON path, "events[5000].value: ...") leaves the
// journal as it was. The semantics are import_journal's and restore_from_journal's
// (store_import.cpp, store_backup.cpp): into an empty database, and for a restore, the ids,
// description and next id are kept; otherwise systems are matched by name and events get new
// ids in the order of the file (a written journal's order: time, then id), duplicates skipped.
#include <algorithm>
#include <map>
#include <optional>

#include <fmt/format.h>

#include "store_changes.hpp"
#include "store_internal.hpp"
#include "store_rows.hpp"
#include "tidewright/journal/journal_stream.hpp"

namespace tw::store {

using namespace tw::journal;
using namespace tw::store::detail;

namespace {

// Writes what the reader hands on, inside the caller's transaction.
class StreamSink {
 public:
  StreamSink(sqlite3* db, JournalStore::ImportReport& report, bool keep_ids, bool list_added,
             JournalStore::WouldAdd would_add = {})
      : db_(db), report_(report), keep_ids_(keep_ids), list_added_(list_added), would_add_(std::move(would_add)),
        insert_(db, event_insert_sql()) {}

  Status head(const JournalHead& head) {
    if (keep_ids_) {
      for (const System& s : head.systems) insert_system(db_, s);
      report_.systems_added = static_cast<std::int64_t>(head.systems.size());
      next_id_ = head.next_id;
      description_ = head.description;
      return Ok{};
    }
    // Merge, as import_journal: systems by name, new ids for everything added, a marked
    // dose pointed at its schedule's new id (store_internal.hpp).
    merge_.emplace(db_);
    merge_->systems(head.systems, report_.systems_added);
    return Ok{};
  }

  Status event(Event&& e, const std::string& path) {
    if (keep_ids_) {
      insert_event(insert_, e);
    } else {
      auto added = merge_->event(std::move(e), insert_, &e);
      if (!added) return Error{path + "." + added.error().field, path + ": " + added.error().message};
      if (!*added) {
        ++report_.duplicates_skipped;
        return Ok{};
      }
    }
    ++report_.events_added;
    if (list_added_) note_would_add(report_, would_add_, std::move(e));
    return Ok{};
  }

  void finish() {
    write_next_id(db_, merge_ ? merge_->next_id() : next_id_);
    if (keep_ids_ && !description_.empty()) write_meta(db_, "description", description_);
  }

 private:
  sqlite3* db_;
  JournalStore::ImportReport& report_;
  bool keep_ids_;
  bool list_added_;
  JournalStore::WouldAdd would_add_;
  Statement insert_;
  std::int64_t next_id_ = 1;  // keeping ids: the file's
  std::string description_;
  std::optional<JournalMerge> merge_;  // merging into a store that holds records
};

// Reads the stream into the sink; an exception from SQLite names the record it was writing.
Status stream_into(const std::string& store_path, std::istream& in, StreamSink& sink) {
  std::string at = "the journal's systems";
  auto guard = [&](auto&& write) -> Status {
    try {
      return write();
    } catch (const std::exception& ex) {
      return Error{"journal", store_path + ": " + at + ": " + ex.what()};
    }
  };
  Status st = read_journal_stream(
      in, [&](const JournalHead& head) { return guard([&] { return sink.head(head); }); },
      [&](Event&& e, const std::string& path) {
        at = path;
        return guard([&] { return sink.event(std::move(e), path); });
      });
  if (!st) return st;
  sink.finish();
  return Ok{};
}

}  // namespace

Result<JournalStore::ImportReport> JournalStore::import_journal_stream(std::istream& in, ImportMode mode,
                                                                      const WouldAdd& would_add) {
  const bool dry = mode == ImportMode::DryRun;
  return guarded(path_, [&]() -> Result<ImportReport> {
    WriteTransaction tx(db_);
    ImportReport report;
    StreamSink sink(db_, report, database_empty(db_), dry, would_add);
    if (Status st = stream_into(path_, in, sink); !st) return st.error();  // rolled back
    if (!dry) tx.commit();
    return report;
  });
}

Status JournalStore::restore_from_journal_stream(std::istream& in) {
  return guarded(path_, [&]() -> Status {
    WriteTransaction tx(db_);
    clear_all(db_);
    ImportReport report;
    StreamSink sink(db_, report, true, false);
    if (Status st = stream_into(path_, in, sink); !st) return st;  // rolled back
    log_bulk(db_, "a restore from a JSON journal");
    tx.commit();
    return Ok{};
  });
}

}  // namespace tw::store

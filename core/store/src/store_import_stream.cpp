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
  StreamSink(sqlite3* db, JournalStore::ImportReport& report, bool keep_ids, bool list_added)
      : db_(db), report_(report), keep_ids_(keep_ids), list_added_(list_added), insert_(db, event_insert_sql()) {}

  Status head(const JournalHead& head) {
    if (keep_ids_) {
      for (const System& s : head.systems) insert_system(db_, s);
      report_.systems_added = static_cast<std::int64_t>(head.systems.size());
      next_id_ = head.next_id;
      description_ = head.description;
      return Ok{};
    }
    // Merge, as import_journal: systems by name, new ids for everything added.
    scratch_.systems = all_systems(db_);
    next_id_ = read_next_id(db_);
    for (const System& s : head.systems) {
      auto same = std::find_if(scratch_.systems.begin(), scratch_.systems.end(),
                               [&](const System& t) { return lower_ascii(t.name) == lower_ascii(s.name); });
      if (same != scratch_.systems.end()) {
        system_of_[s.id] = same->id;
        continue;
      }
      System copy = s;
      copy.id = next_id_++;
      insert_system(db_, copy);
      scratch_.systems.push_back(copy);
      system_of_[s.id] = copy.id;
      ++report_.systems_added;
    }
    return Ok{};
  }

  Status event(Event&& e, const std::string& path) {
    if (keep_ids_) {
      insert_event(insert_, e);
    } else {
      e.system_id = system_of_.at(e.system_id);  // the reader checked it names a system of the file
      if (has_equal_event(db_, e)) {
        ++report_.duplicates_skipped;
        return Ok{};
      }
      e.id = next_id_;
      // As import_journal: checked against the stored systems (a marked dose's schedule is not
      // carried over, so such a dose is refused here as it is there).
      Status ok = validate_event(scratch_, e);
      if (!ok) return Error{path + "." + ok.error().field, path + ": " + ok.error().message};
      insert_event(insert_, e);
      ++next_id_;
    }
    ++report_.events_added;
    if (list_added_) report_.would_add.push_back(std::move(e));
    return Ok{};
  }

  void finish() {
    write_next_id(db_, next_id_);
    if (keep_ids_ && !description_.empty()) write_meta(db_, "description", description_);
  }

 private:
  sqlite3* db_;
  JournalStore::ImportReport& report_;
  bool keep_ids_;
  bool list_added_;
  Statement insert_;
  std::int64_t next_id_ = 1;
  std::string description_;
  Journal scratch_;  // the stored systems (merge)
  std::map<SystemId, SystemId> system_of_;  // the file's system id -> the stored one (merge)
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

Result<JournalStore::ImportReport> JournalStore::import_journal_stream(std::istream& in, ImportMode mode) {
  const bool dry = mode == ImportMode::DryRun;
  return guarded(path_, [&]() -> Result<ImportReport> {
    WriteTransaction tx(db_);
    ImportReport report;
    StreamSink sink(db_, report, database_empty(db_), dry);
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

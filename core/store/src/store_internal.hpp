// Shared between the store's source files (private to core/store).
#pragma once

#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "sqlite_util.hpp"
#include "tidewright/journal/journal.hpp"
#include "tidewright/store/journal_store.hpp"

namespace tw::store::detail {

// Runs body; a StoreFailure (or a std::exception from a library) becomes
// Error{"journal", "<path>: <reason>"}.
template <class F>
auto guarded(const std::string& path, F&& body) -> decltype(body()) {
  try {
    return body();
  } catch (const std::exception& e) {
    return Error{"journal", path + ": " + e.what()};
  }
}

std::int64_t read_next_id(sqlite3* db);
void write_next_id(sqlite3* db, std::int64_t next_id);
std::string read_meta(sqlite3* db, const std::string& key, const std::string& fallback = "");
void write_meta(sqlite3* db, const std::string& key, const std::string& value);

// Every system, in id order.
std::vector<journal::System> all_systems(sqlite3* db);

// "WHERE ..." and its bindings for a filter; binds from parameter 1.
struct WhereClause {
  std::string sql;
  void bind(Statement& st) const;
  journal::EventFilter filter;
};
WhereClause where_of(const journal::EventFilter& filter);

// ASCII lower case (system names are matched without case).
std::string lower_ascii(std::string s);
// Whether the database holds no system and no event.
bool database_empty(sqlite3* db);

// The id of a stored event equal in content (same system, time and payload), if any.
std::optional<journal::EventId> equal_event_id(sqlite3* db, const journal::Event& e);
inline bool has_equal_event(sqlite3* db, const journal::Event& e) { return equal_event_id(db, e).has_value(); }

// A journal merged into a store that already holds records (import into a non-empty store):
// its systems matched by name or added, its events given new ids. A dose marked against a
// schedule names the schedule by the file's id: the schedule's new id (or the id of the equal
// schedule already stored) is remembered, so the dose points at it, and the schedules merged
// so far stay in `scratch` for the core's validation.
class JournalMerge {
 public:
  explicit JournalMerge(sqlite3* db);
  // The file's systems: matched by name (no case) or added with a new id.
  void systems(const std::vector<journal::System>& from_file, std::int64_t& systems_added);
  // One event of the file (its id and system are the file's). Returns false for a duplicate of
  // a stored event (skipped), true when stored; an Error from the core's validation.
  Result<bool> event(journal::Event e, Statement& insert, journal::Event* stored = nullptr);
  std::int64_t next_id() const { return next_id_; }

 private:
  sqlite3* db_;
  journal::Journal scratch_;  // the stored systems and the schedules merged so far
  std::map<journal::SystemId, journal::SystemId> system_of_;
  std::map<journal::EventId, journal::EventId> schedule_of_;  // the file's id -> stored id
  std::int64_t next_id_;
};

// Deletes every system, event and the description; resets next_id (inside a transaction).
void clear_all(sqlite3* db);
// Inserts a validated journal with its ids kept (inside a transaction).
void insert_journal_keeping_ids(sqlite3* db, const journal::Journal& j);

// A dry run's event that would be stored: to the caller's listener, or kept in the report.
inline void note_would_add(JournalStore::ImportReport& report, const JournalStore::WouldAdd& listener, journal::Event e) {
  if (listener) listener(e);
  else report.would_add.push_back(std::move(e));
}

}  // namespace tw::store::detail

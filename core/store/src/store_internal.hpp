// Shared between the store's source files (private to core/store).
#pragma once

#include <string>

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

// Whether an event equal in content (same system, time and payload) is already stored.
bool has_equal_event(sqlite3* db, const journal::Event& e);

// Deletes every system, event and the description; resets next_id (inside a transaction).
void clear_all(sqlite3* db);
// Inserts a validated journal with its ids kept (inside a transaction).
void insert_journal_keeping_ids(sqlite3* db, const journal::Journal& j);

}  // namespace tw::store::detail

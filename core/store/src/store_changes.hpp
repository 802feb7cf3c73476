// The change log behind `log undo` (schema version 4, table changes): written in the same
// transaction as each change, read back by JournalStore::undo_last (store_changes.cpp).
#pragma once

#include <string>

#include "sqlite_util.hpp"
#include "tidewright/journal/journal.hpp"

namespace tw::store::detail {

void log_added(sqlite3* db, const journal::System& added);
void log_added(sqlite3* db, const journal::Event& added);
void log_edited(sqlite3* db, const journal::System& before);
void log_edited(sqlite3* db, const journal::Event& before);
// A removed system with the events removed with it.
void log_removed(sqlite3* db, const journal::System& before, const std::vector<journal::Event>& events);
void log_removed(sqlite3* db, const journal::Event& before);
// An import, restore or app save: undo does not reach past it.
void log_bulk(sqlite3* db, const std::string& summary);

}  // namespace tw::store::detail

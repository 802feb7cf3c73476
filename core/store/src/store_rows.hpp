// Systems and events <-> table rows (private to core/store). The column lists here are the
// only place that knows the order of columns in the queries.
#pragma once

#include <string>

#include "sqlite_util.hpp"
#include "tidewright/journal/journal.hpp"

namespace tw::store::detail {

// "id, name, kind, ..." for SELECT, in the order read_system expects.
extern const char* const kSystemColumns;
extern const char* const kEventColumns;

// INSERT OR REPLACE-free inserts: a new row with the record's id (which must be set).
void insert_system(sqlite3* db, const journal::System& s);
void update_system_row(sqlite3* db, const journal::System& s);
void insert_event(Statement& insert, const journal::Event& e);  // insert from event_insert_sql()
const char* event_insert_sql();
void update_event_row(sqlite3* db, const journal::Event& e);

// The row at the statement's current position (columns as kSystemColumns / kEventColumns
// from column 0). A row whose names the core does not know throws StoreFailure naming the id.
journal::System read_system(const Statement& row);
journal::Event read_event(const Statement& row);

}  // namespace tw::store::detail

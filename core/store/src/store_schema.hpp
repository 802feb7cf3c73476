// The database schema of the journal store and its migrations (see store_schema.cpp).
#pragma once

#include <sqlite3.h>

namespace tw::store::detail {

// The newest schema version this build knows.
int latest_schema_version();

// The version recorded in the database (0 for an empty file).
int read_schema_version(sqlite3* db);

// Brings the database to latest_schema_version() in one write transaction (each missing
// migration in order). A database newer than this build is refused (StoreFailure), never
// guessed at.
void migrate(sqlite3* db);

}  // namespace tw::store::detail

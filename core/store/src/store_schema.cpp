// The store's schema, as a list of migrations. Version N is the database after migrations
// 1..N; the table schema_version records each one applied.
//
// To add to the schema (a table for dose schedules, a column, an index): append a
// Migration{N + 1, "..."} to kMigrations below with the SQL that turns version N into N + 1,
// never edit an applied one. Every database opened by a newer build is migrated in one
// transaction on opening; an older build refuses a newer database with a clear message. Then
// read and write the new rows in store_rows.cpp / journal_store.cpp, include them in the JSON
// export and import (store_export.cpp, store_import.cpp), and add a test in
// tests/unit/store/.
//
// The CHECK constraints mirror the core's validation (journal.hpp, section 4: ranges, names,
// which fields each event type has). They are never stricter than the core: the core checks
// first and refuses with the field and range; the constraints are a second line that keeps
// a damaged program or a hand-edit with the sqlite3 shell from storing what the core would
// refuse. (Units of test values vary, so value ranges stay with the core.)
#include "store_schema.hpp"

#include <string>

#include "sqlite_util.hpp"

namespace tw::store::detail {
namespace {

struct Migration {
  int version;
  const char* sql;
};

// Version 1: systems, events, meta (next id, description, app settings).
constexpr const char* kSchemaV1 = R"SQL(
CREATE TABLE meta (
  key   TEXT PRIMARY KEY,
  value TEXT NOT NULL
) WITHOUT ROWID;

CREATE TABLE systems (
  id                     INTEGER PRIMARY KEY CHECK (id > 0),
  name                   TEXT NOT NULL COLLATE NOCASE UNIQUE CHECK (length(name) BETWEEN 1 AND 100),
  kind                   TEXT NOT NULL CHECK (kind IN ('reef_display', 'coral_grow_out', 'larval_culture', 'fish_only', 'other')),
  volume_l               REAL NOT NULL CHECK (volume_l BETWEEN 0.1 AND 1e7),
  display_l              REAL CHECK (display_l BETWEEN 0 AND 1e7),
  sump_l                 REAL CHECK (sump_l BETWEEN 0 AND 1e7),
  rock_displacement_l    REAL CHECK (rock_displacement_l >= 0),
  default_salinity       REAL NOT NULL CHECK (default_salinity BETWEEN 0 AND 45),
  default_temperature_c  REAL NOT NULL CHECK (default_temperature_c BETWEEN -2 AND 40),
  alkalinity_unit        TEXT NOT NULL,
  calcium_magnesium_unit TEXT NOT NULL,
  temperature_unit       TEXT NOT NULL CHECK (temperature_unit IN ('C', 'F')),
  ph_scale               TEXT NOT NULL CHECK (ph_scale IN ('total', 'sws', 'free', 'nbs')),
  volume_unit            TEXT NOT NULL,
  target_alkalinity_dkh  REAL CHECK (target_alkalinity_dkh BETWEEN 0 AND 25),
  target_calcium_mg_l    REAL CHECK (target_calcium_mg_l BETWEEN 0 AND 1000),
  target_magnesium_mg_l  REAL CHECK (target_magnesium_mg_l BETWEEN 0 AND 2500),
  CHECK ((display_l IS NULL) = (sump_l IS NULL) AND (sump_l IS NULL) = (rock_displacement_l IS NULL))
);

CREATE TABLE events (
  id                 INTEGER PRIMARY KEY CHECK (id > 0),
  system_id          INTEGER NOT NULL REFERENCES systems (id) ON DELETE RESTRICT,
  time_s             INTEGER NOT NULL CHECK (time_s BETWEEN 0 AND 7258118400),
  time_text          TEXT CHECK (length(time_text) <= 100),
  type               TEXT NOT NULL CHECK (type IN ('test', 'dose', 'water_change', 'top_off', 'note')),
  -- test result
  parameter          TEXT CHECK (parameter IN ('alkalinity', 'calcium', 'magnesium', 'ph', 'salinity',
                                               'specific_gravity', 'temperature', 'nitrate', 'phosphate', 'other')),
  other_name         TEXT,
  value              REAL,
  unit               TEXT,
  precision          REAL CHECK (precision > 0),
  ph_scale           TEXT CHECK (ph_scale IN ('total', 'sws', 'free', 'nbs')),
  kit                TEXT,
  -- dose
  additive           TEXT CHECK (length(additive) >= 1),
  amount             REAL CHECK (amount > 0 AND amount <= 1e6),
  amount_unit        TEXT CHECK (amount_unit IN ('g', 'mL')),
  stock_g_per_l      REAL CHECK (stock_g_per_l > 0 AND stock_g_per_l <= 1500),
  -- water change and top-off
  volume_l           REAL CHECK (volume_l > 0 AND volume_l <= 1e7),
  new_alkalinity_dkh REAL CHECK (new_alkalinity_dkh BETWEEN 0 AND 25),
  new_calcium_mg_l   REAL CHECK (new_calcium_mg_l BETWEEN 0 AND 1000),
  new_magnesium_mg_l REAL CHECK (new_magnesium_mg_l BETWEEN 0 AND 2500),
  new_salinity       REAL CHECK (new_salinity BETWEEN 0 AND 45),
  top_off_kind       TEXT CHECK (top_off_kind IN ('plain', 'limewater')),
  limewater_g_per_l  REAL CHECK (limewater_g_per_l > 0 AND limewater_g_per_l <= 1.9),
  -- note
  note               TEXT CHECK (length(note) BETWEEN 1 AND 10000),
  -- which fields each type has
  CHECK ((type = 'test') = (parameter IS NOT NULL AND value IS NOT NULL AND unit IS NOT NULL)),
  CHECK (parameter IS NOT 'ph' OR ph_scale IS NOT NULL),
  CHECK ((type = 'dose') = (additive IS NOT NULL AND amount IS NOT NULL AND amount_unit IS NOT NULL)),
  CHECK ((type IN ('water_change', 'top_off')) = (volume_l IS NOT NULL)),
  CHECK ((type = 'top_off') = (top_off_kind IS NOT NULL)),
  CHECK ((type = 'note') = (note IS NOT NULL))
);

-- The queries of the screens and commands: one system's events in time order (log list
-- --system, demand, plan, the app's Log), one system's tests of one parameter (charts,
-- list --parameter), everything in time order (export, list).
CREATE INDEX events_by_system_time ON events (system_id, time_s, id);
CREATE INDEX events_by_system_parameter_time ON events (system_id, parameter, time_s) WHERE parameter IS NOT NULL;
CREATE INDEX events_by_time ON events (time_s, id);

INSERT INTO meta (key, value) VALUES ('next_id', '1');
)SQL";

// Version 2: standing dose schedules (journal.hpp DoseSchedule, events of type 'schedule')
// and a dose's mark against one. SQLite cannot change a table's CHECKs in place, so the events
// table is rebuilt with the new columns and copied over (the documented 12-step way:
// https://www.sqlite.org/lang_altertable.html, "Making Other Kinds Of Table Schema Changes").
constexpr const char* kSchemaV2 = R"SQL(
CREATE TABLE events_v2 (
  id                 INTEGER PRIMARY KEY CHECK (id > 0),
  system_id          INTEGER NOT NULL REFERENCES systems (id) ON DELETE RESTRICT,
  time_s             INTEGER NOT NULL CHECK (time_s BETWEEN 0 AND 7258118400),
  time_text          TEXT CHECK (length(time_text) <= 100),
  type               TEXT NOT NULL CHECK (type IN ('test', 'dose', 'water_change', 'top_off', 'note', 'schedule')),
  parameter          TEXT CHECK (parameter IN ('alkalinity', 'calcium', 'magnesium', 'ph', 'salinity',
                                               'specific_gravity', 'temperature', 'nitrate', 'phosphate', 'other')),
  other_name         TEXT,
  value              REAL,
  unit               TEXT,
  precision          REAL CHECK (precision > 0),
  ph_scale           TEXT CHECK (ph_scale IN ('total', 'sws', 'free', 'nbs')),
  kit                TEXT,
  additive           TEXT CHECK (length(additive) >= 1),
  amount             REAL CHECK (amount > 0 AND amount <= 1e6),
  amount_unit        TEXT CHECK (amount_unit IN ('g', 'mL')),
  stock_g_per_l      REAL CHECK (stock_g_per_l > 0 AND stock_g_per_l <= 1500),
  volume_l           REAL CHECK (volume_l > 0 AND volume_l <= 1e7),
  new_alkalinity_dkh REAL CHECK (new_alkalinity_dkh BETWEEN 0 AND 25),
  new_calcium_mg_l   REAL CHECK (new_calcium_mg_l BETWEEN 0 AND 1000),
  new_magnesium_mg_l REAL CHECK (new_magnesium_mg_l BETWEEN 0 AND 2500),
  new_salinity       REAL CHECK (new_salinity BETWEEN 0 AND 45),
  top_off_kind       TEXT CHECK (top_off_kind IN ('plain', 'limewater')),
  limewater_g_per_l  REAL CHECK (limewater_g_per_l > 0 AND limewater_g_per_l <= 1.9),
  note               TEXT CHECK (length(note) BETWEEN 1 AND 10000),
  -- a dose marked against a schedule
  mark               TEXT CHECK (mark IN ('missed', 'extra')),
  schedule_id        INTEGER,
  -- a schedule
  device             TEXT CHECK (length(device) BETWEEN 1 AND 60),
  stock_name         TEXT CHECK (length(stock_name) <= 60),
  doses_per_day      INTEGER CHECK (doses_per_day BETWEEN 1 AND 288),
  calibration        REAL CHECK (calibration BETWEEN 0.5 AND 1.5),
  stop_s             INTEGER CHECK (stop_s > time_s),
  CHECK ((type = 'test') = (parameter IS NOT NULL AND value IS NOT NULL AND unit IS NOT NULL)),
  CHECK (parameter IS NOT 'ph' OR ph_scale IS NOT NULL),
  CHECK ((type IN ('dose', 'schedule')) = (additive IS NOT NULL AND amount IS NOT NULL AND amount_unit IS NOT NULL)),
  CHECK ((type IN ('water_change', 'top_off')) = (volume_l IS NOT NULL)),
  CHECK ((type = 'top_off') = (top_off_kind IS NOT NULL)),
  CHECK ((type = 'note') = (note IS NOT NULL)),
  CHECK ((type = 'schedule') = (device IS NOT NULL AND doses_per_day IS NOT NULL AND calibration IS NOT NULL)),
  CHECK ((mark IS NULL) = (schedule_id IS NULL) AND (mark IS NULL OR type = 'dose'))
);
INSERT INTO events_v2 (id, system_id, time_s, time_text, type, parameter, other_name, value, unit, precision,
                       ph_scale, kit, additive, amount, amount_unit, stock_g_per_l, volume_l, new_alkalinity_dkh,
                       new_calcium_mg_l, new_magnesium_mg_l, new_salinity, top_off_kind, limewater_g_per_l, note)
  SELECT id, system_id, time_s, time_text, type, parameter, other_name, value, unit, precision,
         ph_scale, kit, additive, amount, amount_unit, stock_g_per_l, volume_l, new_alkalinity_dkh,
         new_calcium_mg_l, new_magnesium_mg_l, new_salinity, top_off_kind, limewater_g_per_l, note FROM events;
DROP TABLE events;
ALTER TABLE events_v2 RENAME TO events;
CREATE INDEX events_by_system_time ON events (system_id, time_s, id);
CREATE INDEX events_by_system_parameter_time ON events (system_id, parameter, time_s) WHERE parameter IS NOT NULL;
CREATE INDEX events_by_time ON events (time_s, id);
CREATE INDEX events_by_schedule ON events (schedule_id) WHERE schedule_id IS NOT NULL;
)SQL";

// Version 3: the events table clustered by system and time (WITHOUT ROWID, primary key
// system_id, time_s, id). Every screen and command reads one system's events in time order
// (demand, plan, list --system, the app's Log); in a rowid table those rows were spread over
// the whole file, one or two per page among the other systems' (a farm logs every system
// every day), so reading one system of a 30-system farm read nearly every page of a 100 MB
// file. Clustered, they sit together on about 1/30 of the pages. The id stays unique through
// its own index (lookups, updates and removals by id, and the links of marked doses).
// The rows are copied in the new key's order, so the new table is written sequentially.
// Same 12-step rebuild as version 2; the columns and CHECKs are unchanged.
constexpr const char* kSchemaV3 = R"SQL(
CREATE TABLE events_v3 (
  id                 INTEGER NOT NULL CHECK (id > 0),
  system_id          INTEGER NOT NULL REFERENCES systems (id) ON DELETE RESTRICT,
  time_s             INTEGER NOT NULL CHECK (time_s BETWEEN 0 AND 7258118400),
  time_text          TEXT CHECK (length(time_text) <= 100),
  type               TEXT NOT NULL CHECK (type IN ('test', 'dose', 'water_change', 'top_off', 'note', 'schedule')),
  parameter          TEXT CHECK (parameter IN ('alkalinity', 'calcium', 'magnesium', 'ph', 'salinity',
                                               'specific_gravity', 'temperature', 'nitrate', 'phosphate', 'other')),
  other_name         TEXT,
  value              REAL,
  unit               TEXT,
  precision          REAL CHECK (precision > 0),
  ph_scale           TEXT CHECK (ph_scale IN ('total', 'sws', 'free', 'nbs')),
  kit                TEXT,
  additive           TEXT CHECK (length(additive) >= 1),
  amount             REAL CHECK (amount > 0 AND amount <= 1e6),
  amount_unit        TEXT CHECK (amount_unit IN ('g', 'mL')),
  stock_g_per_l      REAL CHECK (stock_g_per_l > 0 AND stock_g_per_l <= 1500),
  volume_l           REAL CHECK (volume_l > 0 AND volume_l <= 1e7),
  new_alkalinity_dkh REAL CHECK (new_alkalinity_dkh BETWEEN 0 AND 25),
  new_calcium_mg_l   REAL CHECK (new_calcium_mg_l BETWEEN 0 AND 1000),
  new_magnesium_mg_l REAL CHECK (new_magnesium_mg_l BETWEEN 0 AND 2500),
  new_salinity       REAL CHECK (new_salinity BETWEEN 0 AND 45),
  top_off_kind       TEXT CHECK (top_off_kind IN ('plain', 'limewater')),
  limewater_g_per_l  REAL CHECK (limewater_g_per_l > 0 AND limewater_g_per_l <= 1.9),
  note               TEXT CHECK (length(note) BETWEEN 1 AND 10000),
  mark               TEXT CHECK (mark IN ('missed', 'extra')),
  schedule_id        INTEGER,
  device             TEXT CHECK (length(device) BETWEEN 1 AND 60),
  stock_name         TEXT CHECK (length(stock_name) <= 60),
  doses_per_day      INTEGER CHECK (doses_per_day BETWEEN 1 AND 288),
  calibration        REAL CHECK (calibration BETWEEN 0.5 AND 1.5),
  stop_s             INTEGER CHECK (stop_s > time_s),
  PRIMARY KEY (system_id, time_s, id),
  CHECK ((type = 'test') = (parameter IS NOT NULL AND value IS NOT NULL AND unit IS NOT NULL)),
  CHECK (parameter IS NOT 'ph' OR ph_scale IS NOT NULL),
  CHECK ((type IN ('dose', 'schedule')) = (additive IS NOT NULL AND amount IS NOT NULL AND amount_unit IS NOT NULL)),
  CHECK ((type IN ('water_change', 'top_off')) = (volume_l IS NOT NULL)),
  CHECK ((type = 'top_off') = (top_off_kind IS NOT NULL)),
  CHECK ((type = 'note') = (note IS NOT NULL)),
  CHECK ((type = 'schedule') = (device IS NOT NULL AND doses_per_day IS NOT NULL AND calibration IS NOT NULL)),
  CHECK ((mark IS NULL) = (schedule_id IS NULL) AND (mark IS NULL OR type = 'dose'))
) WITHOUT ROWID;
INSERT INTO events_v3 (id, system_id, time_s, time_text, type, parameter, other_name, value, unit, precision,
                       ph_scale, kit, additive, amount, amount_unit, stock_g_per_l, volume_l, new_alkalinity_dkh,
                       new_calcium_mg_l, new_magnesium_mg_l, new_salinity, top_off_kind, limewater_g_per_l, note,
                       mark, schedule_id, device, stock_name, doses_per_day, calibration, stop_s)
  SELECT id, system_id, time_s, time_text, type, parameter, other_name, value, unit, precision,
         ph_scale, kit, additive, amount, amount_unit, stock_g_per_l, volume_l, new_alkalinity_dkh,
         new_calcium_mg_l, new_magnesium_mg_l, new_salinity, top_off_kind, limewater_g_per_l, note,
         mark, schedule_id, device, stock_name, doses_per_day, calibration, stop_s
  FROM events ORDER BY system_id, time_s, id;
DROP TABLE events;
ALTER TABLE events_v3 RENAME TO events;
CREATE UNIQUE INDEX events_by_id ON events (id);
CREATE INDEX events_by_system_parameter_time ON events (system_id, parameter, time_s) WHERE parameter IS NOT NULL;
CREATE INDEX events_by_time ON events (time_s, id);
CREATE INDEX events_by_schedule ON events (schedule_id) WHERE schedule_id IS NOT NULL;
)SQL";

// Version 4: the change log, so that `log undo` can revert the last change (add, edit or
// remove of one system or event). `before` is the record as it was, in the journal file's
// JSON (system_to_json / event_to_json); a removed system carries its events too. A 'bulk'
// row (an import, a restore, the app's save) marks where undo stops. Existing databases
// start with an empty log. next_id is the journal's next id right after the change: a record
// with an id from there on was added by something that is not logged (an import), and undo
// refuses rather than skip past it.
constexpr const char* kSchemaV4 = R"SQL(
CREATE TABLE changes (
  seq       INTEGER PRIMARY KEY AUTOINCREMENT,
  action    TEXT NOT NULL CHECK (action IN ('add', 'edit', 'remove', 'bulk')),
  record    TEXT CHECK (record IN ('system', 'event')),
  record_id INTEGER,
  before    TEXT,
  summary   TEXT NOT NULL,
  next_id   INTEGER NOT NULL,
  CHECK ((action = 'bulk') = (record IS NULL)),
  CHECK ((action IN ('edit', 'remove')) = (before IS NOT NULL))
);
)SQL";

const Migration kMigrations[] = {
    {1, kSchemaV1},
    {2, kSchemaV2},
    {3, kSchemaV3},
    {4, kSchemaV4},
};

}  // namespace

int latest_schema_version() { return kMigrations[std::size(kMigrations) - 1].version; }

int read_schema_version(sqlite3* db) {
  Statement has(db, "SELECT 1 FROM sqlite_schema WHERE type = 'table' AND name = 'schema_version'");
  if (!has.step()) return 0;
  Statement v(db, "SELECT coalesce(max(version), 0) FROM schema_version");
  v.step();
  return static_cast<int>(v.integer(0));
}

void migrate(sqlite3* db) {
  // Read without a lock first: the common case (already current) takes no write lock.
  const int seen = read_schema_version(db);
  if (seen > latest_schema_version()) {
    throw StoreFailure("the journal database has schema version " + std::to_string(seen) +
                       ", newer than this program knows (up to " +
                       std::to_string(latest_schema_version()) + "); update Tidewright to open it");
  }
  if (seen == latest_schema_version()) return;
  WriteTransaction tx(db);
  exec(db,
       "CREATE TABLE IF NOT EXISTS schema_version ("
       " version INTEGER PRIMARY KEY CHECK (version > 0),"
       " applied_at TEXT NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%SZ', 'now')))");
  const int current = read_schema_version(db);  // again, under the lock: another process may have migrated
  for (const Migration& m : kMigrations) {
    if (m.version <= current) continue;
    exec(db, m.sql);
    Statement rec(db, "INSERT INTO schema_version (version) VALUES (?)");
    rec.bind(1, static_cast<std::int64_t>(m.version)).run();
  }
  tx.commit();
}

}  // namespace tw::store::detail

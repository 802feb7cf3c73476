PRAGMA foreign_keys=OFF;
BEGIN TRANSACTION;
CREATE TABLE schema_version ( version INTEGER PRIMARY KEY CHECK (version > 0), applied_at TEXT NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%SZ', 'now')));
INSERT INTO schema_version VALUES(1,'2026-12-04T10:06:19Z');
INSERT INTO schema_version VALUES(2,'2026-12-04T10:06:19Z');
CREATE TABLE meta (
  key   TEXT PRIMARY KEY,
  value TEXT NOT NULL
) WITHOUT ROWID;
INSERT INTO meta VALUES('description','invented test data, stored by a build with schema version 2');
INSERT INTO meta VALUES('next_id','943');
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
INSERT INTO systems VALUES(1,'Living room reef','reef_display',380.0,300.0,110.0,30.0,35.0,25.499999999999999999,'dKH','mg/L','C','nbs','L',8.0,430.0,1320.0);
INSERT INTO systems VALUES(2,'Grow-out rack 1','coral_grow_out',1150.0,NULL,NULL,NULL,35.0,25.0,'dKH','mg/L','C','nbs','L',8.5,440.0,1350.0);
INSERT INTO systems VALUES(3,'Larval culture C','larval_culture',500.0,NULL,NULL,NULL,32.0,20.0,'dKH','mg/L','C','total','L',7.0,NULL,NULL);
CREATE TABLE IF NOT EXISTS "events" (
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
INSERT INTO events VALUES(6,1,1785573000,NULL,'top_off',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,3.2000000000000001776,NULL,NULL,NULL,NULL,'plain',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(7,1,1785659400,NULL,'top_off',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,3.2000000000000001776,NULL,NULL,NULL,NULL,'plain',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(9,1,1785745800,NULL,'top_off',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,3.2000000000000001776,NULL,NULL,NULL,NULL,'plain',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(31,1,1786771800,NULL,'note',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,'pumps set to 100 mL/day carbonate and 40 mL/day calcium',NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(148,1,1790402400,NULL,'schedule',NULL,NULL,NULL,NULL,NULL,NULL,NULL,'sodium_carbonate',47.5,'mL',80.0,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,'pump 1','soda ash 80 g/L',2,1.0,1791612000);
INSERT INTO events VALUES(156,1,1790793600,NULL,'dose',NULL,NULL,NULL,NULL,NULL,NULL,NULL,'sodium_carbonate',47.5,'mL',80.0,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,'missed',148,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(319,2,1785542400,NULL,'schedule',NULL,NULL,NULL,NULL,NULL,NULL,NULL,'sodium_carbonate',53.799999999999997156,'mL',120.0,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,'alkalinity pump','soda ash 120 g/L',4,1.0,1787270400);
INSERT INTO events VALUES(327,2,1785835800,NULL,'dose',NULL,NULL,NULL,NULL,NULL,NULL,NULL,'magnesium_chloride_hexahydrate',160.0,'g',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(354,2,1787270340,NULL,'note',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,'alkalinity pump set to 225 mL/day',NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(549,3,1785567600,NULL,'water_change',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,400.0,6.080000000000000071,390.0,1200.0,32.0,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(550,3,1785569400,NULL,'dose',NULL,NULL,NULL,NULL,NULL,NULL,NULL,'sodium_carbonate',9.0,'g',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(551,3,1785571200,NULL,'note',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,'new larval batch stocked after drain-down',NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(552,3,1785586800,NULL,'test','alkalinity',NULL,7.2000000000000001776,'dKH',0.14999999999999999444,NULL,'lab titration',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(553,3,1785587100,NULL,'test','ph',NULL,7.9400000000000003907,'pH',0.010000000000000000208,'total','spectrophotometric',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(554,3,1785587700,NULL,'test','temperature',NULL,20.199999999999999288,'C',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(560,3,1785826800,NULL,'water_change',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,400.0,6.1600000000000001421,390.0,1200.0,32.0,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(561,3,1785828600,NULL,'dose',NULL,NULL,NULL,NULL,NULL,NULL,NULL,'sodium_carbonate',9.3000000000000007105,'g',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL);
INSERT INTO events VALUES(570,3,1786086000,NULL,'water_change',NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,400.0,6.080000000000000071,390.0,1200.0,32.0,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL,NULL);
CREATE INDEX events_by_system_time ON events (system_id, time_s, id);
CREATE INDEX events_by_system_parameter_time ON events (system_id, parameter, time_s) WHERE parameter IS NOT NULL;
CREATE INDEX events_by_time ON events (time_s, id);
CREATE INDEX events_by_schedule ON events (schedule_id) WHERE schedule_id IS NOT NULL;
COMMIT;

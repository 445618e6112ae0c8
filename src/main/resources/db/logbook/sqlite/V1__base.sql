-- Logbook schema 1 (SQLite): the base tables. Identical to the statements of the hand-rolled migration 1
-- (org.outstage.logbook.Migrations), which made the logbooks that Flyway now baselines at version 3.
CREATE TABLE units (id INTEGER PRIMARY KEY, name TEXT NOT NULL UNIQUE, serial TEXT, topology TEXT, notes TEXT,
    rated_power_watts REAL, rated_load_ohms REAL);
CREATE TABLE sessions (id INTEGER PRIMARY KEY, unit_id INTEGER NOT NULL REFERENCES units(id),
    kind TEXT NOT NULL CHECK (kind IN ('bias-adjustment','verification','evaluation')),
    started_at TEXT NOT NULL, ended_at TEXT, notes TEXT NOT NULL DEFAULT '');
CREATE TABLE captures (sha256 TEXT PRIMARY KEY CHECK (length(sha256) = 64), file_name TEXT NOT NULL,
    size_bytes INTEGER NOT NULL, added_at TEXT NOT NULL);
CREATE TABLE measurements (id INTEGER PRIMARY KEY, session_id INTEGER NOT NULL REFERENCES sessions(id),
    capture_sha256 TEXT REFERENCES captures(sha256), capture_name TEXT, channel INTEGER NOT NULL,
    measured_at TEXT NOT NULL, program_version TEXT NOT NULL, settings_json TEXT NOT NULL,
    defaulted_json TEXT NOT NULL, measurement_json TEXT NOT NULL,
    fundamental_hz REAL NOT NULL, fundamental_rms REAL NOT NULL, unit TEXT NOT NULL,
    thd_ratio REAL NOT NULL, thdn_ratio REAL NOT NULL, residual_rms REAL, power_watts REAL, load_ohms REAL,
    gain_at_zero REAL, crossover_verdict TEXT, clip_asymmetry_ratio REAL);
CREATE TABLE bias_steps (id INTEGER PRIMARY KEY, session_id INTEGER NOT NULL REFERENCES sessions(id),
    seq INTEGER NOT NULL, taken_at TEXT NOT NULL, reading_value REAL NOT NULL,
    reading_unit TEXT NOT NULL CHECK (reading_unit IN ('mV','mA')), heatsink_c REAL, ambient_c REAL,
    channel INTEGER NOT NULL, measurement_id INTEGER UNIQUE REFERENCES measurements(id),
    UNIQUE (session_id, seq));
CREATE INDEX measurements_by_session ON measurements(session_id);
PRAGMA application_id = 1330992211;
PRAGMA user_version = 1;

package org.outstage.logbook;

import java.util.List;

/**
 * The hand-rolled migrations 1..3 that made SQLite logbooks before the schema moved to Flyway
 * ({@link FlywayMigrations}, {@code db/logbook/*}). Frozen: kept to bring a logbook of version 1 or 2 to 3, where
 * Flyway baselines it, and for tests that build such an old file. Migration {@code i} (1-based) takes a logbook
 * from {@code PRAGMA user_version} {@code i-1} to {@code i}. New migrations go to Flyway, never here.
 */
final class Migrations {
    private Migrations() {}

    /** "OUTS" in ASCII: marks the file as an Outstage logbook ({@code PRAGMA application_id}). */
    static final int APPLICATION_ID = 0x4F555453;

    static final List<List<String>> STEPS = List.of(
            // 1: the base schema
            List.of(
                    "CREATE TABLE units (id INTEGER PRIMARY KEY, name TEXT NOT NULL UNIQUE, serial TEXT, topology TEXT, notes TEXT,"
                            + " rated_power_watts REAL, rated_load_ohms REAL)",
                    "CREATE TABLE sessions (id INTEGER PRIMARY KEY, unit_id INTEGER NOT NULL REFERENCES units(id),"
                            + " kind TEXT NOT NULL CHECK (kind IN ('bias-adjustment','verification','evaluation')),"
                            + " started_at TEXT NOT NULL, ended_at TEXT, notes TEXT NOT NULL DEFAULT '')",
                    "CREATE TABLE captures (sha256 TEXT PRIMARY KEY CHECK (length(sha256) = 64), file_name TEXT NOT NULL,"
                            + " size_bytes INTEGER NOT NULL, added_at TEXT NOT NULL)",
                    "CREATE TABLE measurements (id INTEGER PRIMARY KEY, session_id INTEGER NOT NULL REFERENCES sessions(id),"
                            + " capture_sha256 TEXT REFERENCES captures(sha256), capture_name TEXT, channel INTEGER NOT NULL,"
                            + " measured_at TEXT NOT NULL, program_version TEXT NOT NULL, settings_json TEXT NOT NULL,"
                            + " defaulted_json TEXT NOT NULL, measurement_json TEXT NOT NULL,"
                            + " fundamental_hz REAL NOT NULL, fundamental_rms REAL NOT NULL, unit TEXT NOT NULL,"
                            + " thd_ratio REAL NOT NULL, thdn_ratio REAL NOT NULL, residual_rms REAL, power_watts REAL, load_ohms REAL,"
                            + " gain_at_zero REAL, crossover_verdict TEXT, clip_asymmetry_ratio REAL)",
                    "CREATE TABLE bias_steps (id INTEGER PRIMARY KEY, session_id INTEGER NOT NULL REFERENCES sessions(id),"
                            + " seq INTEGER NOT NULL, taken_at TEXT NOT NULL, reading_value REAL NOT NULL,"
                            + " reading_unit TEXT NOT NULL CHECK (reading_unit IN ('mV','mA')), heatsink_c REAL, ambient_c REAL,"
                            + " channel INTEGER NOT NULL, measurement_id INTEGER UNIQUE REFERENCES measurements(id),"
                            + " UNIQUE (session_id, seq))",
                    "CREATE INDEX measurements_by_session ON measurements(session_id)"),
            // 2: sessions listed by unit and time
            List.of("CREATE INDEX sessions_by_unit ON sessions(unit_id, started_at)"),
            // 3: the ratio the crossover verdict reads (gain at zero against the large-current asymptote), taken from the
            //    stored measurement where it has it
            List.of("ALTER TABLE measurements ADD COLUMN crossover_ratio REAL",
                    "UPDATE measurements SET crossover_ratio = json_extract(measurement_json, '$.crossover.verdict_ratio')"
                            + " WHERE json_valid(measurement_json)"));

    /** The newest schema version (Flyway's), which {@code PRAGMA user_version} of an SQLite logbook also carries. */
    static int latest() { return FlywayMigrations.LATEST; }
}

-- Logbook schema 2 (SQLite): sessions listed by unit and time.
CREATE INDEX sessions_by_unit ON sessions(unit_id, started_at);
PRAGMA user_version = 2;

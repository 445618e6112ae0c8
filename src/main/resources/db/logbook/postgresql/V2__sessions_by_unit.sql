-- Logbook schema 2 (PostgreSQL): sessions listed by unit and time.
CREATE INDEX sessions_by_unit ON sessions(unit_id, started_at);

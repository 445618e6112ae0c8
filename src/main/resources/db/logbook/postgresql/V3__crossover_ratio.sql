-- Logbook schema 3 (PostgreSQL): the ratio the crossover verdict reads. A PostgreSQL logbook starts at Flyway's
-- version 1, so there are no older rows to fill from their JSON (SQLite's V3 does that for old files).
ALTER TABLE measurements ADD COLUMN crossover_ratio DOUBLE PRECISION;

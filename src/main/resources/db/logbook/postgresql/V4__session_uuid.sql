-- Logbook schema 4 (PostgreSQL): the stable session id (as in SQLite), and the capture store itself: in a shared
-- logbook the captures live in the database, keyed by SHA-256 and written once, so a bench without a shared folder
-- loses nothing. Audio does not compress: EXTERNAL storage skips the attempt and lets reads fetch slices.
ALTER TABLE sessions ADD COLUMN uuid TEXT;
UPDATE sessions SET uuid = gen_random_uuid()::text WHERE uuid IS NULL;
CREATE UNIQUE INDEX sessions_by_uuid ON sessions(uuid);
CREATE TABLE capture_blobs (sha256 TEXT PRIMARY KEY CHECK (length(sha256) = 64), size_bytes BIGINT NOT NULL, content BYTEA NOT NULL);
ALTER TABLE capture_blobs ALTER COLUMN content SET STORAGE EXTERNAL;

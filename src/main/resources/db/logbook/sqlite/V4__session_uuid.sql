-- Logbook schema 4 (SQLite): a stable id for each session, made at its start, so that `logbook push` can copy a
-- session into a shared logbook once and only once. Old sessions get a random version-4 UUID here.
ALTER TABLE sessions ADD COLUMN uuid TEXT;
UPDATE sessions SET uuid = lower(hex(randomblob(4)) || '-' || hex(randomblob(2)) || '-4' || substr(hex(randomblob(2)), 2) || '-'
    || substr('89ab', 1 + (abs(random()) % 4), 1) || substr(hex(randomblob(2)), 2) || '-' || hex(randomblob(6)))
    WHERE uuid IS NULL;
CREATE UNIQUE INDEX sessions_by_uuid ON sessions(uuid);
PRAGMA user_version = 4;

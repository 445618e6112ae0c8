package org.outstage.logbook;

import java.io.InputStream;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.SQLException;
import java.util.Optional;

/**
 * What differs between the two stores behind {@link Logbook}: how a connection is had and a transaction run
 * (and retried), how a session row is locked for a new step, and where captures live. The SQL of the
 * logbook itself is shared and lives in {@link Logbook}.
 */
interface Engine extends AutoCloseable {
    interface Work<T> {
        T run(Connection c) throws SQLException;
    }

    /** The location, for messages. */
    String display();

    /** Runs {@code work} in one write transaction, committed before this returns. */
    <T> T write(Work<T> work);

    /** Runs {@code work} on a consistent read. */
    <T> T read(Work<T> work);

    /**
     * Locks the session row for the rest of the write transaction, so that concurrent writers of one session
     * take step numbers one after another. SQLite's write transactions are already exclusive.
     */
    void lockSession(Connection c, long sessionId) throws SQLException;

    /** Stores a capture by its SHA-256 (written once), streaming it; returns its reference. */
    CaptureRef storeCapture(Path file);

    /** The stored bytes of a capture, streamed, when the store has them. */
    Optional<InputStream> openCapture(CaptureRef ref);

    /** Which of these SHA-256 hashes the store already holds. */
    java.util.Set<String> presentCaptures(java.util.Collection<String> sha256s);

    /**
     * Stores captures read from another store (each checked against its hash while streaming; one transaction on a
     * server). A capture whose source has no bytes is left out. Returns the hashes stored.
     */
    java.util.Set<String> storeCaptures(java.util.List<CaptureRef> refs, java.util.function.Function<CaptureRef, Optional<InputStream>> source);

    /** The highest schema version applied. */
    int schemaVersion();

    /** A structural check of the store ("ok" when sound). */
    String integrityCheck();

    @Override
    void close();
}

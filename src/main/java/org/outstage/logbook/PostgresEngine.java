package org.outstage.logbook;

import com.zaxxer.hikari.HikariConfig;
import com.zaxxer.hikari.HikariDataSource;
import com.zaxxer.hikari.pool.HikariPool;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.DigestInputStream;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.sql.Connection;
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.HexFormat;
import java.util.Optional;

/**
 * A shop of benches: one PostgreSQL database, reached through a small HikariCP pool. Each write is one
 * transaction (READ COMMITTED, {@code synchronous_commit = on} for every connection, so a commit is on the
 * server's disk before it returns). A new step locks its session row ({@code SELECT … FOR UPDATE}), so benches
 * writing one session take step numbers in turn. Deadlocks, serialization failures and unique-key races (two
 * benches adding the same unit) are retried; a lost connection is retried only when the transaction had not
 * yet been sent for commit (then nothing was written), otherwise reported.
 *
 * <p>Captures live in the database ({@code capture_blobs}, bytea keyed by SHA-256, written once), streamed in on
 * write and read back in slices, so no capture is held whole in memory.
 */
final class PostgresEngine implements Engine {
    /** How long a write waits for a connection (the server down, the pool busy) before reporting. */
    static final long CONNECT_TIMEOUT_MS = Long.getLong("outstage.logbook.connectTimeoutMs", 10_000);
    private static final long RETRY_BUDGET_MS = 30_000;
    /** Slice read from a stored capture at a time. */
    static final int READ_SLICE_BYTES = 1 << 20;

    private final LogbookLocation.Server where;
    private final HikariDataSource ds;

    private PostgresEngine(LogbookLocation.Server where, HikariDataSource ds) {
        this.where = where;
        this.ds = ds;
    }

    static PostgresEngine open(LogbookLocation.Server where) {
        HikariConfig cfg = new HikariConfig();
        cfg.setJdbcUrl(where.jdbcUrl());
        cfg.setUsername(where.user());
        String pw = System.getenv("PGPASSWORD");
        if (pw != null && !pw.isEmpty()) cfg.setPassword(pw); // else pgjdbc reads ~/.pgpass (or $PGPASSFILE)
        cfg.setPoolName("outstage-logbook");
        cfg.setMaximumPoolSize(4);
        cfg.setMinimumIdle(0);
        cfg.setConnectionTimeout(Math.max(250, CONNECT_TIMEOUT_MS));
        cfg.setValidationTimeout(Math.max(250, Math.min(CONNECT_TIMEOUT_MS, 3_000)));
        // one attempt at opening: a refused connection or login is reported at once; a slow one waits for the driver's
        // connect and login timeouts below
        cfg.setInitializationFailTimeout(1);
        cfg.setAutoCommit(true);
        cfg.setConnectionInitSql("SET synchronous_commit = on");
        cfg.addDataSourceProperty("ApplicationName", "outstage");
        cfg.addDataSourceProperty("connectTimeout", Long.toString(Math.max(1, CONNECT_TIMEOUT_MS / 1000)));
        cfg.addDataSourceProperty("loginTimeout", Long.toString(Math.max(1, CONNECT_TIMEOUT_MS / 1000)));
        cfg.addDataSourceProperty("socketTimeout", "120");
        cfg.addDataSourceProperty("tcpKeepAlive", "true");
        HikariDataSource ds;
        try {
            ds = new HikariDataSource(cfg);
        } catch (HikariPool.PoolInitializationException e) {
            throw unavailable(where, e, false);
        } catch (RuntimeException e) {
            throw new LogbookUnavailableException("cannot open the logbook " + where.display() + ": " + rootMessage(e), e);
        }
        PostgresEngine engine = new PostgresEngine(where, ds);
        try {
            engine.migrate();
        } catch (RuntimeException e) {
            ds.close();
            throw e;
        }
        return engine;
    }

    @Override
    public String display() { return where.display(); }

    // ---------------------------------------------------------------- schema

    private void migrate() {
        int v = read(PostgresEngine::flywayVersion);
        if (v > FlywayMigrations.LATEST) {
            throw new NotALogbookException(where.display() + " was written by a newer Outstage (logbook schema " + v
                    + ", this program knows up to " + FlywayMigrations.LATEST + "); it was left untouched");
        }
        if (v == FlywayMigrations.LATEST) return;
        if (v < 0) {
            int tables = read(c -> {
                try (Statement s = c.createStatement();
                     ResultSet rs = s.executeQuery("SELECT count(*) FROM information_schema.tables WHERE table_schema = current_schema()")) {
                    rs.next();
                    return rs.getInt(1);
                }
            });
            if (tables > 0) {
                throw new NotALogbookException(where.display() + " holds tables of another program, not an Outstage logbook;"
                        + " it was left untouched (give an empty database)");
            }
        }
        try {
            FlywayMigrations.migratePostgres(ds);
        } catch (LogbookException e) {
            SQLException sql = sqlCause(e);
            if (sql != null && isConnectionLoss(sql)) throw unavailable(where, e, false);
            throw e;
        }
    }

    /** The highest successful Flyway version, or -1 when the database has no history table. */
    private static int flywayVersion(Connection c) throws SQLException {
        try (Statement s = c.createStatement();
             ResultSet rs = s.executeQuery("SELECT to_regclass('" + FlywayMigrations.HISTORY_TABLE + "') IS NOT NULL")) {
            rs.next();
            if (!rs.getBoolean(1)) return -1;
        }
        try (Statement s = c.createStatement();
             ResultSet rs = s.executeQuery("SELECT version FROM " + FlywayMigrations.HISTORY_TABLE
                     + " WHERE success AND version IS NOT NULL ORDER BY installed_rank DESC LIMIT 1")) {
            if (!rs.next()) return 0;
            try {
                return Integer.parseInt(rs.getString(1).strip());
            } catch (NumberFormatException e) {
                return Integer.MAX_VALUE;
            }
        }
    }

    @Override
    public int schemaVersion() {
        return read(PostgresEngine::flywayVersion);
    }

    /** No file to check: the server keeps its pages checksummed or not; we check that the schema is whole. */
    @Override
    public String integrityCheck() {
        return read(c -> {
            try (Statement s = c.createStatement(); ResultSet rs = s.executeQuery(
                    "SELECT count(*) FROM bias_steps b LEFT JOIN measurements m ON m.id = b.measurement_id"
                            + " WHERE b.measurement_id IS NOT NULL AND m.id IS NULL")) {
                rs.next();
                return rs.getInt(1) == 0 ? "ok" : rs.getInt(1) + " steps point at missing measurements";
            }
        });
    }

    @Override
    public void lockSession(Connection c, long sessionId) throws SQLException {
        try (PreparedStatement q = c.prepareStatement("SELECT id FROM sessions WHERE id = ? FOR UPDATE")) {
            q.setLong(1, sessionId);
            q.executeQuery().close();
        }
    }

    // ---------------------------------------------------------------- captures

    /**
     * Hashes the file (one streamed pass), then, unless the store already has that hash, streams it into
     * {@code capture_blobs} in its own transaction ({@code ON CONFLICT DO NOTHING}: two benches storing the same
     * capture at once store it once). The step that refers to it is written afterwards; a capture whose step was
     * never written is harmless, never referenced.
     */
    @Override
    public CaptureRef storeCapture(Path file) {
        String sha;
        long size;
        try {
            MessageDigest md = MessageDigest.getInstance("SHA-256");
            try (InputStream in = new DigestInputStream(Files.newInputStream(file), md)) {
                size = in.transferTo(java.io.OutputStream.nullOutputStream());
            }
            sha = HexFormat.of().formatHex(md.digest());
        } catch (IOException e) {
            throw new LogbookException("cannot read capture " + file + ": " + e.getMessage(), e);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 missing from the JDK", e);
        }
        final String hash = sha;
        final long bytes = size;
        boolean have = read(c -> hasBlob(c, hash));
        if (!have) {
            write(c -> {
                // No flush of its own: the step that names this capture commits after it with synchronous_commit = on,
                // and that flush takes the write-ahead log past this transaction too. A crash in between can lose
                // only a capture that no step refers to.
                try (Statement s = c.createStatement()) {
                    s.execute("SET LOCAL synchronous_commit = off");
                }
                try (PreparedStatement ins = c.prepareStatement(
                        "INSERT INTO capture_blobs(sha256, size_bytes, content) VALUES (?,?,?) ON CONFLICT (sha256) DO NOTHING");
                     InputStream in = Files.newInputStream(file)) {
                    ins.setString(1, hash);
                    ins.setLong(2, bytes);
                    ins.setBinaryStream(3, in, bytes);
                    ins.executeUpdate();
                } catch (IOException e) {
                    throw new SQLException("cannot read capture " + file + ": " + e.getMessage(), e);
                }
                return null;
            });
        }
        return new CaptureRef(hash, file.getFileName().toString(), bytes);
    }

    @Override
    public java.util.Set<String> presentCaptures(java.util.Collection<String> sha256s) {
        if (sha256s.isEmpty()) return new java.util.HashSet<>();
        return read(c -> {
            java.util.Set<String> out = new java.util.HashSet<>();
            try (PreparedStatement q = c.prepareStatement("SELECT sha256 FROM capture_blobs WHERE sha256 = ANY (?)")) {
                q.setArray(1, c.createArrayOf("text", sha256s.toArray()));
                try (ResultSet rs = q.executeQuery()) {
                    while (rs.next()) out.add(rs.getString(1));
                }
            }
            return out;
        });
    }

    /** One transaction for the batch; each capture streamed in and its hash checked before the commit. */
    @Override
    public java.util.Set<String> storeCaptures(java.util.List<CaptureRef> refs,
                                               java.util.function.Function<CaptureRef, Optional<InputStream>> source) {
        return write(c -> {
            try (Statement s = c.createStatement()) {
                s.execute("SET LOCAL synchronous_commit = off"); // as in storeCapture: the rows that name them commit after, flushed
            }
            java.util.Set<String> stored = new java.util.HashSet<>();
            try (PreparedStatement ins = c.prepareStatement(
                    "INSERT INTO capture_blobs(sha256, size_bytes, content) VALUES (?,?,?) ON CONFLICT (sha256) DO NOTHING")) {
                for (CaptureRef ref : refs) {
                    Optional<InputStream> in = source.apply(ref);
                    if (in.isEmpty()) continue;
                    MessageDigest md = MessageDigest.getInstance("SHA-256");
                    try (InputStream s = new DigestInputStream(in.get(), md)) {
                        ins.setString(1, ref.sha256());
                        ins.setLong(2, ref.sizeBytes());
                        ins.setBinaryStream(3, s, ref.sizeBytes());
                        ins.executeUpdate();
                    }
                    String got = HexFormat.of().formatHex(md.digest());
                    if (!got.equals(ref.sha256())) {
                        throw new SQLException("capture " + ref.fileName() + " read with SHA-256 " + got + ", not " + ref.sha256()
                                + "; nothing of this batch was stored");
                    }
                    stored.add(ref.sha256());
                }
            } catch (IOException e) {
                throw new SQLException("cannot read a capture to push: " + e.getMessage(), e);
            } catch (NoSuchAlgorithmException e) {
                throw new IllegalStateException("SHA-256 missing from the JDK", e);
            }
            return stored;
        });
    }

    private static boolean hasBlob(Connection c, String sha) throws SQLException {
        try (PreparedStatement q = c.prepareStatement("SELECT 1 FROM capture_blobs WHERE sha256 = ?")) {
            q.setString(1, sha);
            try (ResultSet rs = q.executeQuery()) {
                return rs.next();
            }
        }
    }

    @Override
    public Optional<InputStream> openCapture(CaptureRef ref) {
        Long size = read(c -> {
            try (PreparedStatement q = c.prepareStatement("SELECT size_bytes FROM capture_blobs WHERE sha256 = ?")) {
                q.setString(1, ref.sha256());
                try (ResultSet rs = q.executeQuery()) {
                    return rs.next() ? rs.getLong(1) : null;
                }
            }
        });
        return size == null ? Optional.empty() : Optional.of(new SliceStream(ref.sha256(), size));
    }

    /** Reads a stored capture a slice at a time ({@code substring} of the bytea), one query per slice. */
    private final class SliceStream extends InputStream {
        private final String sha;
        private final long size;
        private long pos;
        private byte[] buf = new byte[0];
        private int at;

        SliceStream(String sha, long size) {
            this.sha = sha;
            this.size = size;
        }

        private boolean fill() {
            if (at < buf.length) return true;
            if (pos >= size) return false;
            long from = pos;
            buf = PostgresEngine.this.read(c -> {
                try (PreparedStatement q = c.prepareStatement("SELECT substring(content FROM CAST(? AS integer) FOR ?) FROM capture_blobs WHERE sha256 = ?")) {
                    q.setLong(1, from + 1);
                    q.setInt(2, READ_SLICE_BYTES);
                    q.setString(3, sha);
                    try (ResultSet rs = q.executeQuery()) {
                        if (!rs.next()) throw new SQLException("capture " + sha + " vanished from the store");
                        return rs.getBytes(1);
                    }
                }
            });
            at = 0;
            pos += buf.length;
            return buf.length > 0;
        }

        @Override
        public int read() {
            return fill() ? buf[at++] & 0xff : -1;
        }

        @Override
        public int read(byte[] b, int off, int len) {
            if (len == 0) return 0;
            if (!fill()) return -1;
            int n = Math.min(len, buf.length - at);
            System.arraycopy(buf, at, b, off, n);
            at += n;
            return n;
        }
    }

    // ---------------------------------------------------------------- transactions

    @Override
    public <T> T write(Work<T> work) {
        return run(work, true);
    }

    @Override
    public <T> T read(Work<T> work) {
        return run(work, false);
    }

    private <T> T run(Work<T> work, boolean write) {
        long start = System.nanoTime();
        long sleepMs = 10;
        while (true) {
            boolean commitSent = false;
            Connection c;
            try {
                c = ds.getConnection();
            } catch (SQLException e) {
                throw unavailable(where, e, false);
            }
            try {
                try {
                    c.setAutoCommit(false);
                    if (!write) c.setReadOnly(true);
                    T r = work.run(c);
                    commitSent = true;
                    c.commit();
                    return r;
                } catch (SQLException | RuntimeException e) {
                    if (!commitSent) {
                        try {
                            c.rollback();
                        } catch (SQLException ignored) {
                            // the connection is gone: the server rolls the transaction back
                        }
                    }
                    throw e;
                } finally {
                    try {
                        if (!write) c.setReadOnly(false);
                        c.setAutoCommit(true);
                    } catch (SQLException ignored) {
                        // a broken connection: Hikari evicts it
                    }
                    c.close();
                }
            } catch (SQLException e) {
                long elapsedMs = (System.nanoTime() - start) / 1_000_000;
                boolean lost = isConnectionLoss(e);
                if (lost && commitSent && write) throw unavailable(where, e, true);
                boolean retry = elapsedMs < RETRY_BUDGET_MS && (lost ? elapsedMs < CONNECT_TIMEOUT_MS : isTransient(e));
                if (!retry) {
                    if (lost) throw unavailable(where, e, false);
                    throw new LogbookException("logbook " + where.display() + ": " + LogbookException.oneLine(e.getMessage()), e);
                }
                try {
                    Thread.sleep(sleepMs);
                } catch (InterruptedException ie) {
                    Thread.currentThread().interrupt();
                    throw new LogbookException("logbook " + where.display() + ": interrupted", e);
                }
                sleepMs = Math.min(sleepMs * 2, 200);
            }
        }
    }

    /** Serialization failure, deadlock, or a unique key taken by a concurrent transaction: try again. */
    static boolean isTransient(SQLException e) {
        String st = String.valueOf(e.getSQLState());
        return st.equals("40001") || st.equals("40P01") || st.equals("23505");
    }

    /** Connection exceptions (class 08), the server shutting down or starting (57P01..57P03), or no state at all from I/O. */
    static boolean isConnectionLoss(SQLException e) {
        for (Throwable t = e; t != null; t = t.getCause()) {
            if (t instanceof SQLException s) {
                String st = s.getSQLState();
                if (st != null && (st.startsWith("08") || st.equals("57P01") || st.equals("57P02") || st.equals("57P03"))) return true;
            }
            if (t instanceof java.io.IOException) return true;
        }
        return false;
    }

    private static SQLException sqlCause(Throwable e) {
        for (Throwable t = e; t != null; t = t.getCause()) if (t instanceof SQLException s) return s;
        return null;
    }

    static LogbookUnavailableException unavailable(LogbookLocation.Server where, Throwable e, boolean duringCommit) {
        String why = rootMessage(e);
        SQLException sql = sqlCause(e);
        String st = sql == null ? null : sql.getSQLState();
        String what;
        if ("28P01".equals(st) || "28000".equals(st)) what = "the server refused the login of " + where.user();
        else if ("3D000".equals(st)) what = "the server has no database " + where.database();
        else what = "cannot reach the logbook server " + where.hostPort();
        String tail = duringCommit ? "; the connection was lost while committing, so the last write may or may not be saved (check with session show)"
                : "; nothing was written";
        return new LogbookUnavailableException(what + " (" + why + ")" + tail, e);
    }

    static String rootMessage(Throwable e) {
        Throwable t = e;
        String msg = null;
        while (t != null) {
            if (t.getMessage() != null && !t.getMessage().isBlank()) msg = t.getMessage();
            if (t.getCause() == null || t.getCause() == t) break;
            t = t.getCause();
        }
        return LogbookException.oneLine(msg == null ? e.getClass().getSimpleName() : msg);
    }

    @Override
    public void close() {
        ds.close();
    }
}

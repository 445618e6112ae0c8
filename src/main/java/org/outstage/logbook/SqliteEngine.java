package org.outstage.logbook;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.channels.FileChannel;
import java.nio.channels.FileLock;
import java.nio.charset.StandardCharsets;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.security.DigestInputStream;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.sql.Connection;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.HexFormat;
import java.util.Optional;
import org.sqlite.SQLiteConfig;
import org.sqlite.SQLiteOpenMode;

/**
 * One bench: an SQLite file (WAL, synchronous=FULL, foreign keys on, 10 s busy timeout plus retries) and, beside
 * it, a content-addressed folder of captures. A file that is not an Outstage logbook is refused, never written.
 * Write transactions are {@code BEGIN IMMEDIATE}: one writer at a time, so step numbers cannot collide.
 */
final class SqliteEngine implements Engine {
    static final int BUSY_TIMEOUT_MS = 10_000;
    private static final long RETRY_BUDGET_MS = 60_000;
    private static final byte[] SQLITE_MAGIC = "SQLite format 3\0".getBytes(StandardCharsets.US_ASCII);

    private final Path path;
    private final Path capturesDir;
    private final Connection conn;

    private SqliteEngine(Path path, Connection conn) {
        this.path = path;
        this.conn = conn;
        this.capturesDir = capturesDirOf(path);
    }

    static Path capturesDirOf(Path path) {
        String name = path.getFileName().toString();
        int dot = name.lastIndexOf('.');
        return path.resolveSibling((dot > 0 ? name.substring(0, dot) : name) + ".captures");
    }

    static SqliteEngine open(Path path) {
        Path p = path.toAbsolutePath().normalize();
        try {
            if (Files.exists(p)) checkIsOurs(p);
            else if (p.getParent() != null) Files.createDirectories(p.getParent());
            Connection c = connect(p, false);
            SqliteEngine e = new SqliteEngine(p, c);
            try {
                Files.createDirectories(e.capturesDir);
                e.migrate();
            } catch (RuntimeException | IOException ex) {
                c.close();
                throw ex;
            }
            return e;
        } catch (IOException e) {
            throw new LogbookException("logbook " + p + ": " + e.getMessage(), e);
        } catch (SQLException e) {
            throw new LogbookException("logbook " + p + ": " + e.getMessage(), e);
        }
    }

    Path path() { return path; }

    Path capturesDir() { return capturesDir; }

    @Override
    public String display() { return path.toString(); }

    private static Connection connect(Path p, boolean readOnly) throws SQLException {
        SQLiteConfig cfg = new SQLiteConfig();
        cfg.setBusyTimeout(BUSY_TIMEOUT_MS);
        if (readOnly) {
            cfg.setReadOnly(true);
            cfg.setOpenMode(SQLiteOpenMode.READONLY);
        } else {
            cfg.enforceForeignKeys(true);
            cfg.setSynchronous(SQLiteConfig.SynchronousMode.FULL);
        }
        Connection c = cfg.createConnection("jdbc:sqlite:" + p);
        if (!readOnly) {
            try (Statement s = c.createStatement()) {
                withRetry(() -> {
                    try (ResultSet rs = s.executeQuery("PRAGMA journal_mode=WAL")) {
                        rs.next();
                    }
                    return null;
                });
            }
        }
        return c;
    }

    /** Refuses anything but an empty file, an empty SQLite database, or one of our logbooks of a known version. */
    private static void checkIsOurs(Path p) throws IOException, SQLException {
        long size = Files.size(p);
        if (size == 0) return;
        byte[] head = new byte[SQLITE_MAGIC.length];
        try (InputStream in = Files.newInputStream(p)) {
            int n = in.readNBytes(head, 0, head.length);
            if (n < head.length || !java.util.Arrays.equals(head, SQLITE_MAGIC)) {
                throw new NotALogbookException(p + " is not an Outstage logbook (not an SQLite database); it was left untouched");
            }
        }
        try (Connection c = connect(p, true); Statement s = c.createStatement()) {
            int app = intPragma(s, "application_id");
            int version = intPragma(s, "user_version");
            int tables;
            try (ResultSet rs = s.executeQuery("SELECT count(*) FROM sqlite_master")) {
                rs.next();
                tables = rs.getInt(1);
            }
            if (app == Migrations.APPLICATION_ID) {
                if (version > FlywayMigrations.LATEST) {
                    throw new NotALogbookException(p + " was written by a newer Outstage (logbook schema " + version
                            + ", this program knows up to " + FlywayMigrations.LATEST + "); it was left untouched");
                }
                return;
            }
            if (app != 0) {
                throw new NotALogbookException(p + " is an SQLite database of another application (application_id "
                        + Integer.toHexString(app) + "), not an Outstage logbook; it was left untouched");
            }
            if (tables > 0) {
                throw new NotALogbookException(p + " is an SQLite database with tables of another program, not an Outstage logbook;"
                        + " it was left untouched");
            }
        }
    }

    static int intPragma(Statement s, String name) throws SQLException {
        try (ResultSet rs = s.executeQuery("PRAGMA " + name)) {
            return rs.next() ? rs.getInt(1) : 0;
        }
    }

    /** application_id, user_version, and whether Flyway's history table is there. */
    private record State(int app, int version, boolean flyway) {}

    private State state() {
        return read(c -> {
            try (Statement s = c.createStatement()) {
                boolean fw;
                try (ResultSet rs = s.executeQuery("SELECT count(*) FROM sqlite_master WHERE type = 'table' AND name = '"
                        + FlywayMigrations.HISTORY_TABLE + "'")) {
                    rs.next();
                    fw = rs.getInt(1) > 0;
                }
                return new State(intPragma(s, "application_id"), intPragma(s, "user_version"), fw);
            }
        });
    }

    /**
     * Brings the schema to {@link FlywayMigrations#LATEST}. Up to date: nothing loaded, nothing written. Made by the
     * hand-rolled migrations (no Flyway history): brought to 3 by them, then baselined at 3 and migrated by Flyway.
     * New: migrated by Flyway from 1. Processes opening one new file at once take turns (a lock file in the captures
     * folder), since Flyway does not lock an SQLite database.
     */
    private void migrate() throws IOException {
        State st = state();
        if (st.app() == Migrations.APPLICATION_ID && st.flyway() && st.version() >= FlywayMigrations.LATEST) return;
        // file locks are per process: threads of this process take turns on a lock object first
        Object inProcess = MIGRATING.computeIfAbsent(path, k -> new Object());
        synchronized (inProcess) {
            migrateLocked();
        }
    }

    private static final java.util.concurrent.ConcurrentHashMap<Path, Object> MIGRATING = new java.util.concurrent.ConcurrentHashMap<>();

    private void migrateLocked() throws IOException {
        State st;
        try (FileChannel ch = FileChannel.open(capturesDir.resolve(".migrating.lock"), StandardOpenOption.CREATE, StandardOpenOption.WRITE);
             FileLock lock = ch.lock()) {
            st = state();
            if (st.app() == Migrations.APPLICATION_ID && st.flyway() && st.version() >= FlywayMigrations.LATEST) return;
            int baseline = 0;
            if (st.app() == Migrations.APPLICATION_ID && !st.flyway() && st.version() > 0) {
                migrateLegacyTo(Migrations.STEPS.size());
                baseline = Migrations.STEPS.size();
            }
            FlywayMigrations.migrateSqlite("jdbc:sqlite:" + path, baseline);
        }
    }

    /** The hand-rolled migrations, kept for logbooks made before Flyway (and for tests that build such a file). */
    void migrateLegacyTo(int target) {
        write(c -> {
            try (Statement s = c.createStatement()) {
                int app = intPragma(s, "application_id");
                int v = intPragma(s, "user_version");
                if (app != Migrations.APPLICATION_ID && app != 0) throw new NotALogbookException(path + ": application id changed under us");
                for (int i = v; i < target; i++) {
                    for (String sql : Migrations.STEPS.get(i)) s.executeUpdate(sql);
                }
                if (v < target) s.executeUpdate("PRAGMA user_version = " + target);
                if (app == 0) s.executeUpdate("PRAGMA application_id = " + Migrations.APPLICATION_ID);
            }
            return null;
        });
    }

    @Override
    public int schemaVersion() {
        return read(c -> {
            try (Statement s = c.createStatement()) {
                return intPragma(s, "user_version");
            }
        });
    }

    @Override
    public String integrityCheck() {
        return read(c -> {
            try (Statement s = c.createStatement(); ResultSet rs = s.executeQuery("PRAGMA integrity_check")) {
                StringBuilder sb = new StringBuilder();
                while (rs.next()) sb.append(sb.length() == 0 ? "" : "; ").append(rs.getString(1));
                return sb.toString();
            }
        });
    }

    @Override
    public void lockSession(Connection c, long sessionId) {
        // BEGIN IMMEDIATE already holds the only write lock of the file
    }

    // ---------------------------------------------------------------- captures

    /**
     * Copies a capture file into the content-addressed folder (temp file in that folder, fsync, atomic
     * rename), unless a file of the same SHA-256 is already there. The database row is written with the
     * measurement that refers to it. Safe to call from several processes at once.
     */
    @Override
    public CaptureRef storeCapture(Path file) {
        Path tmp = null;
        try {
            Files.createDirectories(capturesDir);
            tmp = Files.createTempFile(capturesDir, ".incoming-", ".tmp");
            MessageDigest md = MessageDigest.getInstance("SHA-256");
            long size;
            try (InputStream in = new DigestInputStream(Files.newInputStream(file), md);
                 FileChannel ch = FileChannel.open(tmp, StandardOpenOption.WRITE, StandardOpenOption.TRUNCATE_EXISTING);
                 OutputStream out = java.nio.channels.Channels.newOutputStream(ch)) {
                size = in.transferTo(out);
                out.flush();
                ch.force(true);
            }
            String sha = HexFormat.of().formatHex(md.digest());
            Path target = storedPath(sha, file.getFileName().toString());
            if (Files.exists(target)) {
                Files.delete(tmp);
            } else {
                try {
                    Files.move(tmp, target, StandardCopyOption.ATOMIC_MOVE);
                } catch (AtomicMoveNotSupportedException e) {
                    throw new LogbookException("cannot rename atomically in " + capturesDir + ": " + e.getMessage(), e);
                }
                syncDirectory(capturesDir);
            }
            tmp = null;
            return new CaptureRef(sha, file.getFileName().toString(), size);
        } catch (IOException e) {
            throw new LogbookException("cannot store capture " + file + " in " + capturesDir + ": " + e.getMessage(), e);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 missing from the JDK", e);
        } finally {
            if (tmp != null) {
                try {
                    Files.deleteIfExists(tmp);
                } catch (IOException ignored) {
                    // a stray temp file is harmless: it is never referenced
                }
            }
        }
    }

    @Override
    public java.util.Set<String> presentCaptures(java.util.Collection<String> sha256s) {
        java.util.Set<String> out = new java.util.HashSet<>();
        try (var files = Files.list(capturesDir)) {
            java.util.Set<String> wanted = new java.util.HashSet<>(sha256s);
            files.forEach(f -> {
                String n = f.getFileName().toString();
                String sha = n.length() >= 64 ? n.substring(0, 64) : "";
                if (wanted.contains(sha)) out.add(sha);
            });
        } catch (IOException e) {
            throw new LogbookException("cannot list " + capturesDir + ": " + e.getMessage(), e);
        }
        return out;
    }

    @Override
    public java.util.Set<String> storeCaptures(java.util.List<CaptureRef> refs,
                                               java.util.function.Function<CaptureRef, Optional<InputStream>> source) {
        java.util.Set<String> stored = new java.util.HashSet<>();
        for (CaptureRef ref : refs) {
            Optional<InputStream> in = source.apply(ref);
            if (in.isEmpty()) continue;
            Path dirTmp = null;
            try (InputStream s = in.get()) {
                dirTmp = Files.createTempDirectory(capturesDir, ".push-");
                Path tmp = dirTmp.resolve(ref.fileName().replaceAll("[/\\\\]", "_"));
                Files.copy(s, tmp);
                CaptureRef got = storeCapture(tmp);
                if (!got.sha256().equals(ref.sha256())) {
                    throw new LogbookException("capture " + ref.fileName() + " read back with SHA-256 " + got.sha256() + ", not " + ref.sha256());
                }
                stored.add(ref.sha256());
            } catch (IOException e) {
                throw new LogbookException("cannot copy capture " + ref.sha256() + " into " + capturesDir + ": " + e.getMessage(), e);
            } finally {
                if (dirTmp != null) {
                    try (var left = Files.list(dirTmp)) {
                        for (Path f : left.toList()) Files.deleteIfExists(f);
                        Files.deleteIfExists(dirTmp);
                    } catch (IOException ignored) {
                        // a stray temp folder is never referenced
                    }
                }
            }
        }
        return stored;
    }

    /** The stored copy of a capture, when it is in the folder. */
    Optional<Path> capturePath(CaptureRef ref) {
        Path p = storedPath(ref.sha256(), ref.fileName());
        return Files.isRegularFile(p) ? Optional.of(p) : Optional.empty();
    }

    @Override
    public Optional<InputStream> openCapture(CaptureRef ref) {
        Optional<Path> p = capturePath(ref);
        if (p.isEmpty()) return Optional.empty();
        try {
            return Optional.of(Files.newInputStream(p.get()));
        } catch (IOException e) {
            throw new LogbookException("cannot read stored capture " + p.get() + ": " + e.getMessage(), e);
        }
    }

    private Path storedPath(String sha, String originalName) {
        int dot = originalName.lastIndexOf('.');
        String ext = dot > 0 ? originalName.substring(dot).toLowerCase(java.util.Locale.ROOT) : "";
        if (!ext.matches("\\.[a-z0-9]{1,8}")) ext = "";
        return capturesDir.resolve(sha + ext);
    }

    private static void syncDirectory(Path dir) {
        try (FileChannel ch = FileChannel.open(dir, StandardOpenOption.READ)) {
            ch.force(true);
        } catch (IOException ignored) {
            // some file systems cannot open a directory for sync; the rename itself is still atomic
        }
    }

    // ---------------------------------------------------------------- transactions

    @Override
    public <T> T write(Work<T> work) {
        try {
            return withRetry(() -> {
                try (Statement s = conn.createStatement()) {
                    s.execute("BEGIN IMMEDIATE");
                }
                boolean done = false;
                try {
                    T r = work.run(conn);
                    try (Statement s = conn.createStatement()) {
                        s.execute("COMMIT");
                    }
                    done = true;
                    return r;
                } finally {
                    if (!done) {
                        try (Statement s = conn.createStatement()) {
                            s.execute("ROLLBACK");
                        } catch (SQLException ignored) {
                            // no transaction left to roll back
                        }
                    }
                }
            });
        } catch (SQLException e) {
            throw new LogbookException("logbook " + path + ": " + e.getMessage(), e);
        }
    }

    @Override
    public <T> T read(Work<T> work) {
        try {
            return withRetry(() -> work.run(conn));
        } catch (SQLException e) {
            throw new LogbookException("logbook " + path + ": " + e.getMessage(), e);
        }
    }

    interface SqlCall<T> {
        T call() throws SQLException;
    }

    /** SQLITE_BUSY (5) and SQLITE_LOCKED (6), with or without extended codes. */
    static boolean isBusy(SQLException e) {
        int code = e.getErrorCode() & 0xff;
        return code == 5 || code == 6 || String.valueOf(e.getMessage()).contains("SQLITE_BUSY");
    }

    private static <T> T withRetry(SqlCall<T> call) throws SQLException {
        long start = System.nanoTime();
        long sleepMs = 20;
        while (true) {
            try {
                return call.call();
            } catch (SQLException e) {
                long elapsedMs = (System.nanoTime() - start) / 1_000_000;
                if (!isBusy(e) || elapsedMs > RETRY_BUDGET_MS) {
                    if (isBusy(e)) throw new SQLException("still busy after " + elapsedMs / 1000 + " s: another program holds the logbook", e);
                    throw e;
                }
                try {
                    Thread.sleep(sleepMs);
                } catch (InterruptedException ie) {
                    Thread.currentThread().interrupt();
                    throw e;
                }
                sleepMs = Math.min(sleepMs * 2, 500);
            }
        }
    }

    @Override
    public void close() {
        try {
            conn.close();
        } catch (SQLException e) {
            throw new LogbookException("closing logbook " + path + ": " + e.getMessage(), e);
        }
    }
}

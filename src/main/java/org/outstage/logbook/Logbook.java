package org.outstage.logbook;

import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.channels.FileChannel;
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
import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.sql.Types;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.Set;
import org.outstage.json.Json;
import org.outstage.verify.KeyFigures;
import org.sqlite.SQLiteConfig;
import org.sqlite.SQLiteOpenMode;

/**
 * The bench logbook: one SQLite file (WAL, foreign keys on, 10 s busy timeout plus retries, schema
 * migrated forward on open) and, beside it, a content-addressed folder of the captures it refers to.
 * A file that is not an Outstage logbook is refused and never written to.
 *
 * <p>Every write is one transaction ({@code BEGIN IMMEDIATE} … {@code COMMIT}, synchronous=FULL): a step
 * is either all there after {@link #addBiasStep} returns or not there at all, even if the process is
 * killed. Instances are thread-safe (methods are synchronized on the one connection); separate instances,
 * threads or processes may write the same file at once.
 */
public final class Logbook implements AutoCloseable {
    /** Environment variable that names the logbook file when no {@code --logbook} is given. */
    public static final String ENV = "OUTSTAGE_LOGBOOK";
    static final int BUSY_TIMEOUT_MS = 10_000;
    private static final long RETRY_BUDGET_MS = 60_000;
    private static final byte[] SQLITE_MAGIC = "SQLite format 3\0".getBytes(StandardCharsets.US_ASCII);

    private final Path path;
    private final Path capturesDir;
    private final Connection conn;

    private Logbook(Path path, Connection conn) {
        this.path = path;
        this.conn = conn;
        String name = path.getFileName().toString();
        int dot = name.lastIndexOf('.');
        this.capturesDir = path.resolveSibling((dot > 0 ? name.substring(0, dot) : name) + ".captures");
    }

    /**
     * The default logbook file: {@code $OUTSTAGE_LOGBOOK} if set, else {@code $XDG_DATA_HOME/outstage/logbook.db},
     * else {@code ~/.local/share/outstage/logbook.db}.
     */
    public static Path defaultPath(Map<String, String> env, Path home) {
        String explicit = env.get(ENV);
        if (explicit != null && !explicit.isBlank()) return Path.of(explicit);
        String xdg = env.get("XDG_DATA_HOME");
        Path base = xdg != null && !xdg.isBlank() ? Path.of(xdg) : home.resolve(".local").resolve("share");
        return base.resolve("outstage").resolve("logbook.db");
    }

    /** Opens (creating if absent) the logbook at {@code path}, migrating its schema forward. */
    public static Logbook open(Path path) {
        Path p = path.toAbsolutePath().normalize();
        try {
            if (Files.exists(p)) checkIsOurs(p);
            else if (p.getParent() != null) Files.createDirectories(p.getParent());
            Connection c = connect(p, false);
            Logbook lb = new Logbook(p, c);
            try {
                lb.migrate();
                Files.createDirectories(lb.capturesDir);
            } catch (RuntimeException | IOException e) {
                c.close();
                throw e;
            }
            return lb;
        } catch (IOException e) {
            throw new LogbookException("logbook " + p + ": " + e.getMessage(), e);
        } catch (SQLException e) {
            throw new LogbookException("logbook " + p + ": " + e.getMessage(), e);
        }
    }

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
                withRetry(p, () -> {
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
                if (version > Migrations.latest()) {
                    throw new NotALogbookException(p + " was written by a newer Outstage (logbook schema " + version
                            + ", this program knows up to " + Migrations.latest() + "); it was left untouched");
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

    private static int intPragma(Statement s, String name) throws SQLException {
        try (ResultSet rs = s.executeQuery("PRAGMA " + name)) {
            return rs.next() ? rs.getInt(1) : 0;
        }
    }

    private void migrate() throws SQLException {
        migrateTo(Migrations.latest());
    }

    /** Applies migrations up to {@code target} (tests use a lower target to build an old logbook). */
    void migrateTo(int target) {
        boolean current = read(c -> {
            try (Statement s = c.createStatement()) {
                return intPragma(s, "application_id") == Migrations.APPLICATION_ID && intPragma(s, "user_version") >= target;
            }
        });
        if (current) return;
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

    public Path path() { return path; }

    /** The folder holding the stored captures, named by SHA-256. */
    public Path capturesDir() { return capturesDir; }

    public synchronized int schemaVersion() {
        return read(c -> {
            try (Statement s = c.createStatement()) {
                return intPragma(s, "user_version");
            }
        });
    }

    // ---------------------------------------------------------------- units and sessions

    /** Adds the unit if no unit of that name exists; returns the id of the unit of that name. */
    public synchronized long ensureUnit(UnitUnderTest unit) {
        return write(c -> unitId(c, unit));
    }

    private static long unitId(Connection c, UnitUnderTest unit) throws SQLException {
        try (PreparedStatement q = c.prepareStatement("SELECT id FROM units WHERE name = ?")) {
            q.setString(1, unit.name());
            try (ResultSet rs = q.executeQuery()) {
                if (rs.next()) return rs.getLong(1);
            }
        }
        try (PreparedStatement ins = c.prepareStatement(
                "INSERT INTO units(name, serial, topology, notes, rated_power_watts, rated_load_ohms) VALUES (?,?,?,?,?,?)",
                Statement.RETURN_GENERATED_KEYS)) {
            ins.setString(1, unit.name());
            setText(ins, 2, unit.serial());
            setText(ins, 3, unit.topology());
            setText(ins, 4, unit.notes());
            setReal(ins, 5, unit.ratedPowerWatts());
            setReal(ins, 6, unit.ratedLoadOhms());
            ins.executeUpdate();
            return generatedKey(ins);
        }
    }

    public synchronized Optional<UnitUnderTest> unit(String name) {
        return read(c -> {
            try (PreparedStatement q = c.prepareStatement(
                    "SELECT name, serial, topology, notes, rated_power_watts, rated_load_ohms FROM units WHERE name = ?")) {
                q.setString(1, name);
                try (ResultSet rs = q.executeQuery()) {
                    if (!rs.next()) return Optional.empty();
                    return Optional.of(new UnitUnderTest(rs.getString(1), text(rs, 2), text(rs, 3), text(rs, 4), real(rs, 5), real(rs, 6)));
                }
            }
        });
    }

    /** Starts a session for the unit (added with only its name if new); returns the session id. */
    public synchronized long startSession(UnitUnderTest unit, SessionKind kind, Instant startedAt, String notes) {
        return write(c -> {
            long unitId = unitId(c, unit);
            try (PreparedStatement ins = c.prepareStatement("INSERT INTO sessions(unit_id, kind, started_at, notes) VALUES (?,?,?,?)",
                    Statement.RETURN_GENERATED_KEYS)) {
                ins.setLong(1, unitId);
                ins.setString(2, kind.label());
                ins.setString(3, startedAt.toString());
                ins.setString(4, notes == null ? "" : notes);
                ins.executeUpdate();
                return generatedKey(ins);
            }
        });
    }

    /** Marks the session ended. Ending an ended session is refused. */
    public synchronized void endSession(long sessionId, Instant endedAt) {
        write(c -> {
            Session s = requireSession(c, sessionId);
            if (!s.open()) throw new IllegalArgumentException("session " + sessionId + " already ended at " + s.endedAt().get());
            try (PreparedStatement u = c.prepareStatement("UPDATE sessions SET ended_at = ? WHERE id = ?")) {
                u.setString(1, endedAt.toString());
                u.setLong(2, sessionId);
                u.executeUpdate();
            }
            return null;
        });
    }

    public synchronized Optional<Session> session(long sessionId) {
        return read(c -> findSession(c, sessionId));
    }

    /** Every session, oldest first. */
    public synchronized List<Session> sessions() {
        return read(c -> {
            List<Session> out = new ArrayList<>();
            try (Statement s = c.createStatement();
                 ResultSet rs = s.executeQuery(SESSION_SELECT + " ORDER BY s.id")) {
                while (rs.next()) out.add(session(rs));
            }
            return out;
        });
    }

    private static final String SESSION_SELECT =
            "SELECT s.id, u.name, s.kind, s.started_at, s.ended_at, s.notes FROM sessions s JOIN units u ON u.id = s.unit_id";

    private static Optional<Session> findSession(Connection c, long id) throws SQLException {
        try (PreparedStatement q = c.prepareStatement(SESSION_SELECT + " WHERE s.id = ?")) {
            q.setLong(1, id);
            try (ResultSet rs = q.executeQuery()) {
                return rs.next() ? Optional.of(session(rs)) : Optional.empty();
            }
        }
    }

    private Session requireSession(Connection c, long id) throws SQLException {
        return findSession(c, id).orElseThrow(() -> new IllegalArgumentException("no session " + id + " in logbook " + path));
    }

    private static Session session(ResultSet rs) throws SQLException {
        String ended = rs.getString(5);
        return new Session(rs.getLong(1), rs.getString(2), SessionKind.parse(rs.getString(3)), Instant.parse(rs.getString(4)),
                ended == null ? Optional.empty() : Optional.of(Instant.parse(ended)), rs.getString(6));
    }

    // ---------------------------------------------------------------- captures

    /**
     * Copies a capture file into the content-addressed folder (temp file in that folder, fsync, atomic
     * rename), unless a file of the same SHA-256 is already there. The database row is written with the
     * measurement that refers to it. Safe to call from several processes at once.
     */
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

    /** The stored copy of a capture, when it is in the folder. */
    public Optional<Path> capturePath(CaptureRef ref) {
        Path p = storedPath(ref.sha256(), ref.fileName());
        return Files.isRegularFile(p) ? Optional.of(p) : Optional.empty();
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

    // ---------------------------------------------------------------- measurements and steps

    /** Adds a measurement to a session (verification and evaluation sessions); returns its id. */
    public synchronized long addMeasurement(long sessionId, MeasurementRecord m) {
        return write(c -> {
            requireOpen(c, sessionId);
            return insertMeasurement(c, sessionId, m);
        });
    }

    /**
     * Adds a bias step (with its measurement, if any) in one transaction and returns it with its
     * sequence number. When this returns, the step is committed.
     */
    public synchronized BiasStep addBiasStep(long sessionId, BiasStep draft) {
        Objects.requireNonNull(draft, "draft");
        return write(c -> {
            requireOpen(c, sessionId);
            Long mid = draft.measurement().isPresent() ? insertMeasurement(c, sessionId, draft.measurement().get()) : null;
            int seq;
            try (PreparedStatement q = c.prepareStatement("SELECT coalesce(max(seq), 0) + 1 FROM bias_steps WHERE session_id = ?")) {
                q.setLong(1, sessionId);
                try (ResultSet rs = q.executeQuery()) {
                    rs.next();
                    seq = rs.getInt(1);
                }
            }
            insertStep(c, sessionId, seq, draft, mid);
            return draft.withSeq(seq);
        });
    }

    private static void insertStep(Connection c, long sessionId, int seq, BiasStep draft, Long mid) throws SQLException {
        try (PreparedStatement ins = c.prepareStatement("INSERT INTO bias_steps(session_id, seq, taken_at, reading_value, reading_unit,"
                + " heatsink_c, ambient_c, channel, measurement_id) VALUES (?,?,?,?,?,?,?,?,?)")) {
            ins.setLong(1, sessionId);
            ins.setInt(2, seq);
            ins.setString(3, draft.takenAt().toString());
            ins.setDouble(4, draft.reading().value());
            ins.setString(5, draft.reading().unit().symbol());
            setReal(ins, 6, draft.heatsinkCelsius());
            setReal(ins, 7, draft.ambientCelsius());
            ins.setInt(8, draft.channel());
            if (mid == null) ins.setNull(9, Types.INTEGER);
            else ins.setLong(9, mid);
            ins.executeUpdate();
        }
    }

    private void requireOpen(Connection c, long sessionId) throws SQLException {
        Session s = requireSession(c, sessionId);
        if (!s.open()) throw new IllegalArgumentException("session " + sessionId + " ended at " + s.endedAt().get() + "; start a new one");
    }

    private static long insertMeasurement(Connection c, long sessionId, MeasurementRecord m) throws SQLException {
        if (m.capture().isPresent()) {
            CaptureRef ref = m.capture().get();
            try (PreparedStatement ins = c.prepareStatement(
                    "INSERT OR IGNORE INTO captures(sha256, file_name, size_bytes, added_at) VALUES (?,?,?,?)")) {
                ins.setString(1, ref.sha256());
                ins.setString(2, ref.fileName());
                ins.setLong(3, ref.sizeBytes());
                ins.setString(4, m.measuredAt().toString());
                ins.executeUpdate();
            }
        }
        KeyFigures f = m.figures();
        try (PreparedStatement ins = c.prepareStatement("INSERT INTO measurements(session_id, capture_sha256, capture_name, channel,"
                + " measured_at, program_version, settings_json, defaulted_json, measurement_json, fundamental_hz, fundamental_rms, unit,"
                + " thd_ratio, thdn_ratio, residual_rms, power_watts, load_ohms, gain_at_zero, crossover_verdict, clip_asymmetry_ratio,"
                + " crossover_ratio) VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?)", Statement.RETURN_GENERATED_KEYS)) {
            ins.setLong(1, sessionId);
            setText(ins, 2, m.capture().map(CaptureRef::sha256));
            setText(ins, 3, m.capture().map(CaptureRef::fileName));
            ins.setInt(4, m.channel());
            ins.setString(5, m.measuredAt().toString());
            ins.setString(6, m.programVersion());
            ins.setString(7, Json.write(m.settings()));
            ins.setString(8, Json.write(new ArrayList<>(m.defaulted())));
            ins.setString(9, m.measurementJson());
            ins.setDouble(10, f.fundamentalHz());
            ins.setDouble(11, f.fundamentalRms());
            ins.setString(12, f.unit());
            ins.setDouble(13, f.thdRatio());
            ins.setDouble(14, f.thdNRatio());
            setReal(ins, 15, f.residualRms());
            setReal(ins, 16, f.powerWatts());
            setReal(ins, 17, f.loadOhms());
            setReal(ins, 18, f.gainAtZero());
            setText(ins, 19, f.crossoverVerdict());
            setReal(ins, 20, f.clipAsymmetryRatio());
            setReal(ins, 21, f.crossoverRatio());
            ins.executeUpdate();
            return generatedKey(ins);
        }
    }

    private static final String MEASUREMENT_COLUMNS = "m.channel, m.capture_sha256, m.capture_name, c.size_bytes, m.measured_at,"
            + " m.program_version, m.settings_json, m.defaulted_json, m.measurement_json, m.fundamental_hz, m.fundamental_rms, m.unit,"
            + " m.thd_ratio, m.thdn_ratio, m.residual_rms, m.power_watts, m.load_ohms, m.gain_at_zero, m.crossover_verdict,"
            + " m.clip_asymmetry_ratio, m.crossover_ratio";

    /** Reads the 21 measurement columns starting at column {@code k}. */
    @SuppressWarnings("unchecked")
    private static MeasurementRecord measurement(ResultSet rs, int k) throws SQLException {
        int channel = rs.getInt(k);
        String sha = rs.getString(k + 1);
        Optional<CaptureRef> cap = sha == null ? Optional.empty()
                : Optional.of(new CaptureRef(sha, rs.getString(k + 2), rs.getLong(k + 3)));
        Map<String, String> settings = new LinkedHashMap<>();
        for (Map.Entry<String, Object> e : ((Map<String, Object>) Json.parse(rs.getString(k + 6))).entrySet()) {
            settings.put(e.getKey(), String.valueOf(e.getValue()));
        }
        Set<String> defaulted = new LinkedHashSet<>();
        for (Object o : (List<Object>) Json.parse(rs.getString(k + 7))) defaulted.add(String.valueOf(o));
        KeyFigures f = new KeyFigures(rs.getDouble(k + 9), rs.getDouble(k + 10), rs.getString(k + 11), rs.getDouble(k + 12),
                rs.getDouble(k + 13), real(rs, k + 14), real(rs, k + 15), real(rs, k + 16), real(rs, k + 17), text(rs, k + 18),
                real(rs, k + 19), real(rs, k + 20));
        return new MeasurementRecord(channel, cap, Instant.parse(rs.getString(k + 4)), rs.getString(k + 5), settings, defaulted,
                rs.getString(k + 8), f);
    }

    /** The steps of a session in order, each with its measurement. */
    public synchronized List<BiasStep> biasSteps(long sessionId) {
        return read(c -> {
            requireSession(c, sessionId);
            List<BiasStep> out = new ArrayList<>();
            try (PreparedStatement q = c.prepareStatement("SELECT b.seq, b.taken_at, b.reading_value, b.reading_unit, b.heatsink_c,"
                    + " b.ambient_c, b.channel, b.measurement_id, " + MEASUREMENT_COLUMNS + " FROM bias_steps b"
                    + " LEFT JOIN measurements m ON m.id = b.measurement_id LEFT JOIN captures c ON c.sha256 = m.capture_sha256"
                    + " WHERE b.session_id = ? ORDER BY b.seq")) {
                q.setLong(1, sessionId);
                try (ResultSet rs = q.executeQuery()) {
                    while (rs.next()) {
                        rs.getLong(8);
                        Optional<MeasurementRecord> m = rs.wasNull() ? Optional.empty() : Optional.of(measurement(rs, 9));
                        out.add(new BiasStep(rs.getInt(1), Instant.parse(rs.getString(2)),
                                new BiasReading(rs.getDouble(3), BiasReading.Unit.parse(rs.getString(4))), real(rs, 5), real(rs, 6),
                                rs.getInt(7), m));
                    }
                }
            }
            return out;
        });
    }

    /**
     * The steps of a session as a light series (reading, temperatures, key figures; no measurement JSON or
     * settings): what a chart, the advice and the drift read. One indexed query.
     */
    public synchronized List<StepPoint> stepSeries(long sessionId) {
        return read(c -> {
            requireSession(c, sessionId);
            List<StepPoint> out = new ArrayList<>();
            try (PreparedStatement q = c.prepareStatement("SELECT b.seq, b.taken_at, b.reading_value, b.reading_unit, b.heatsink_c,"
                    + " b.ambient_c, b.channel, m.id, m.fundamental_hz, m.fundamental_rms, m.unit, m.thd_ratio, m.thdn_ratio, m.residual_rms,"
                    + " m.power_watts, m.load_ohms, m.gain_at_zero, m.crossover_verdict, m.clip_asymmetry_ratio, m.crossover_ratio FROM bias_steps b"
                    + " LEFT JOIN measurements m ON m.id = b.measurement_id WHERE b.session_id = ? ORDER BY b.seq")) {
                q.setLong(1, sessionId);
                try (ResultSet rs = q.executeQuery()) {
                    while (rs.next()) {
                        rs.getLong(8);
                        Optional<KeyFigures> f = rs.wasNull() ? Optional.empty() : Optional.of(new KeyFigures(rs.getDouble(9), rs.getDouble(10),
                                rs.getString(11), rs.getDouble(12), rs.getDouble(13), real(rs, 14), real(rs, 15), real(rs, 16), real(rs, 17),
                                text(rs, 18), real(rs, 19), real(rs, 20)));
                        out.add(new StepPoint(rs.getInt(1), Instant.parse(rs.getString(2)),
                                new BiasReading(rs.getDouble(3), BiasReading.Unit.parse(rs.getString(4))), real(rs, 5), real(rs, 6),
                                rs.getInt(7), f));
                    }
                }
            }
            return out;
        });
    }

    /** The measurements of a session that are not part of a bias step, in the order they were added. */
    public synchronized List<MeasurementRecord> measurements(long sessionId) {
        return read(c -> {
            requireSession(c, sessionId);
            List<MeasurementRecord> out = new ArrayList<>();
            try (PreparedStatement q = c.prepareStatement("SELECT " + MEASUREMENT_COLUMNS + " FROM measurements m"
                    + " LEFT JOIN captures c ON c.sha256 = m.capture_sha256"
                    + " WHERE m.session_id = ? AND NOT EXISTS (SELECT 1 FROM bias_steps b WHERE b.measurement_id = m.id) ORDER BY m.id")) {
                q.setLong(1, sessionId);
                try (ResultSet rs = q.executeQuery()) {
                    while (rs.next()) out.add(measurement(rs, 1));
                }
            }
            return out;
        });
    }

    /** The whole session: unit, session, steps and the measurements outside steps. */
    public synchronized SessionData sessionData(long sessionId) {
        Session s = session(sessionId).orElseThrow(() -> new IllegalArgumentException("no session " + sessionId + " in logbook " + path));
        UnitUnderTest u = unit(s.unitName()).orElseThrow();
        return new SessionData(u, s, biasSteps(sessionId), measurements(sessionId));
    }

    /**
     * Adds a session read from an export, in one transaction: the unit (if no unit of that name exists),
     * the session with its times and notes, the steps with their sequence numbers, the measurements.
     * Returns the new session's id.
     */
    public synchronized long importSession(SessionData data) {
        return write(c -> {
            long unitId = unitId(c, data.unit());
            long sid;
            Session s = data.session();
            try (PreparedStatement ins = c.prepareStatement("INSERT INTO sessions(unit_id, kind, started_at, ended_at, notes) VALUES (?,?,?,?,?)",
                    Statement.RETURN_GENERATED_KEYS)) {
                ins.setLong(1, unitId);
                ins.setString(2, s.kind().label());
                ins.setString(3, s.startedAt().toString());
                setText(ins, 4, s.endedAt().map(Instant::toString));
                ins.setString(5, s.notes());
                ins.executeUpdate();
                sid = generatedKey(ins);
            }
            for (BiasStep step : data.steps()) {
                Long mid = step.measurement().isPresent() ? insertMeasurement(c, sid, step.measurement().get()) : null;
                insertStep(c, sid, step.seq(), step, mid);
            }
            for (MeasurementRecord m : data.measurements()) insertMeasurement(c, sid, m);
            return sid;
        });
    }

    /** {@code PRAGMA integrity_check} result ("ok" when the file is sound). */
    public synchronized String integrityCheck() {
        return read(c -> {
            try (Statement s = c.createStatement(); ResultSet rs = s.executeQuery("PRAGMA integrity_check")) {
                StringBuilder sb = new StringBuilder();
                while (rs.next()) sb.append(sb.length() == 0 ? "" : "; ").append(rs.getString(1));
                return sb.toString();
            }
        });
    }

    @Override
    public synchronized void close() {
        try {
            conn.close();
        } catch (SQLException e) {
            throw new LogbookException("closing logbook " + path + ": " + e.getMessage(), e);
        }
    }

    // ---------------------------------------------------------------- transactions

    interface Work<T> {
        T run(Connection c) throws SQLException;
    }

    /** Runs {@code work} in one write transaction, retrying while another writer holds the lock. */
    <T> T write(Work<T> work) {
        try {
            return withRetry(path, () -> {
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

    <T> T read(Work<T> work) {
        try {
            return withRetry(path, () -> work.run(conn));
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

    private static <T> T withRetry(Path path, SqlCall<T> call) throws SQLException {
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

    // ---------------------------------------------------------------- column helpers

    private static long generatedKey(PreparedStatement ins) throws SQLException {
        try (ResultSet keys = ins.getGeneratedKeys()) {
            if (!keys.next()) throw new SQLException("no row id returned");
            return keys.getLong(1);
        }
    }

    private static void setText(PreparedStatement p, int i, Optional<String> v) throws SQLException {
        if (v.isPresent()) p.setString(i, v.get());
        else p.setNull(i, Types.VARCHAR);
    }

    private static void setReal(PreparedStatement p, int i, OptionalDouble v) throws SQLException {
        if (v.isPresent()) p.setDouble(i, v.getAsDouble());
        else p.setNull(i, Types.REAL);
    }

    private static Optional<String> text(ResultSet rs, int i) throws SQLException {
        return Optional.ofNullable(rs.getString(i));
    }

    private static OptionalDouble real(ResultSet rs, int i) throws SQLException {
        double v = rs.getDouble(i);
        return rs.wasNull() ? OptionalDouble.empty() : OptionalDouble.of(v);
    }
}

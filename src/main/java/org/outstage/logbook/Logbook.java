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
import java.util.UUID;
import org.outstage.json.JsonText;
import org.outstage.verify.KeyFigures;
import org.sqlite.SQLiteConfig;
import org.sqlite.SQLiteOpenMode;

/**
 * The bench logbook, one interface over two engines: an SQLite file on one bench ({@link SqliteEngine}: WAL,
 * synchronous=FULL, captures in a content-addressed folder beside it) or a PostgreSQL database shared by a
 * shop ({@link PostgresEngine}: pooled connections, captures in the database). Both carry the same schema,
 * migrated forward on open by Flyway ({@link FlywayMigrations}); a store that is not an Outstage logbook is
 * refused and never written to.
 *
 * <p>Every write is one transaction: a step is either all there after {@link #addBiasStep} returns or not there
 * at all, even if the process is killed or the server goes away. Step numbers are contiguous per session, however
 * many writers (threads, processes, benches) add steps at once. Instances are thread-safe.
 */
public final class Logbook implements AutoCloseable {
    /** Environment variable that names the logbook (a file or a {@code postgresql://} URL) when no {@code --logbook} is given. */
    public static final String ENV = "OUTSTAGE_LOGBOOK";
    static final int BUSY_TIMEOUT_MS = SqliteEngine.BUSY_TIMEOUT_MS;

    private final Engine engine;

    private Logbook(Engine engine) {
        this.engine = engine;
    }

    /**
     * The default logbook: {@code $OUTSTAGE_LOGBOOK} if set (a file or a server URL), else
     * {@code $XDG_DATA_HOME/outstage/logbook.db}, else {@code ~/.local/share/outstage/logbook.db}.
     */
    public static String defaultLocation(Map<String, String> env, Path home) {
        String explicit = env.get(ENV);
        if (explicit != null && !explicit.isBlank()) return explicit;
        return defaultPath(Map.of(), home, env.get("XDG_DATA_HOME")).toString();
    }

    /**
     * The default logbook file: {@code $OUTSTAGE_LOGBOOK} if set, else {@code $XDG_DATA_HOME/outstage/logbook.db},
     * else {@code ~/.local/share/outstage/logbook.db}.
     */
    public static Path defaultPath(Map<String, String> env, Path home) {
        String explicit = env.get(ENV);
        if (explicit != null && !explicit.isBlank()) return Path.of(explicit);
        return defaultPath(env, home, env.get("XDG_DATA_HOME"));
    }

    private static Path defaultPath(Map<String, String> env, Path home, String xdg) {
        Path base = xdg != null && !xdg.isBlank() ? Path.of(xdg) : home.resolve(".local").resolve("share");
        return base.resolve("outstage").resolve("logbook.db");
    }

    /** Opens (creating if absent) the SQLite logbook at {@code path}, migrating its schema forward. */
    public static Logbook open(Path path) {
        return new Logbook(SqliteEngine.open(path));
    }

    /**
     * Opens the logbook at {@code location}: a {@code postgresql://USER@HOST:PORT/DATABASE} URL (password from
     * {@code $PGPASSWORD} or {@code ~/.pgpass}) or a file path. A malformed URL is an {@link IllegalArgumentException};
     * a server that cannot be reached or refuses the login is a {@link LogbookUnavailableException}.
     */
    public static Logbook open(String location) {
        LogbookLocation loc = LogbookLocation.parse(location);
        if (loc instanceof LogbookLocation.Server server) return new Logbook(PostgresEngine.open(server));
        return open(((LogbookLocation.File) loc).path());
    }

    /** True when {@code location} names a server rather than a file. */
    public static boolean isServerLocation(String location) {
        return LogbookLocation.isServer(location);
    }

    /** Where the logbook is, for messages: the file, or the server URL (never a password). */
    public String display() { return engine.display(); }

    /** True for a shared (PostgreSQL) logbook. */
    public boolean isShared() { return engine instanceof PostgresEngine; }

    /** The logbook file (an SQLite logbook only). */
    public Path path() {
        if (engine instanceof SqliteEngine e) return e.path();
        throw new IllegalStateException("logbook " + engine.display() + " is a server, not a file");
    }

    /** The folder holding the stored captures, named by SHA-256 (an SQLite logbook only). */
    public Path capturesDir() {
        if (engine instanceof SqliteEngine e) return e.capturesDir();
        throw new IllegalStateException("logbook " + engine.display() + " keeps its captures in the database");
    }

    /** Applies the hand-rolled migrations up to {@code target} (tests use it to build a pre-Flyway logbook). */
    void migrateLegacyTo(int target) {
        ((SqliteEngine) engine).migrateLegacyTo(target);
    }

    public synchronized int schemaVersion() {
        return engine.schemaVersion();
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
                ID_COLUMN)) {
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
            try (PreparedStatement ins = c.prepareStatement("INSERT INTO sessions(unit_id, kind, started_at, notes, uuid) VALUES (?,?,?,?,?)",
                    ID_COLUMN)) {
                ins.setLong(1, unitId);
                ins.setString(2, kind.label());
                ins.setString(3, startedAt.toString());
                ins.setString(4, notes == null ? "" : notes);
                ins.setString(5, UUID.randomUUID().toString());
                ins.executeUpdate();
                return generatedKey(ins);
            }
        });
    }

    /** Marks the session ended. Ending an ended session is refused. */
    public synchronized void endSession(long sessionId, Instant endedAt) {
        write(c -> {
            engine.lockSession(c, sessionId);
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
        return findSession(c, id).orElseThrow(() -> new IllegalArgumentException("no session " + id + " in logbook " + engine.display()));
    }

    private static Session session(ResultSet rs) throws SQLException {
        String ended = rs.getString(5);
        return new Session(rs.getLong(1), rs.getString(2), SessionKind.parse(rs.getString(3)), Instant.parse(rs.getString(4)),
                ended == null ? Optional.empty() : Optional.of(Instant.parse(ended)), rs.getString(6));
    }

    // ---------------------------------------------------------------- captures

    /**
     * Stores a capture by its SHA-256 (once per content): in the folder beside an SQLite logbook (temp file, fsync,
     * atomic rename), in the database of a shared one (streamed). The row that names it is written with the
     * measurement that refers to it. Safe to call from several processes at once.
     */
    public CaptureRef storeCapture(Path file) {
        return engine.storeCapture(file);
    }

    /** The stored copy of a capture as a file (an SQLite logbook; empty for a shared one or when missing). */
    public Optional<Path> capturePath(CaptureRef ref) {
        return engine instanceof SqliteEngine e ? e.capturePath(ref) : Optional.empty();
    }

    /** The stored bytes of a capture, streamed (either engine), when the store has them. The caller closes it. */
    public Optional<InputStream> openCapture(CaptureRef ref) {
        return engine.openCapture(ref);
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
            engine.lockSession(c, sessionId);
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

    private static final String INSERT_STEP = "INSERT INTO bias_steps(session_id, seq, taken_at, reading_value, reading_unit,"
            + " heatsink_c, ambient_c, channel, measurement_id) VALUES (?,?,?,?,?,?,?,?,?)";

    private static void insertStep(Connection c, long sessionId, int seq, BiasStep draft, Long mid) throws SQLException {
        try (PreparedStatement ins = c.prepareStatement(INSERT_STEP)) {
            bindStep(ins, sessionId, seq, draft, mid);
            ins.executeUpdate();
        }
    }

    private static void bindStep(PreparedStatement ins, long sessionId, int seq, BiasStep draft, Long mid) throws SQLException {
        {
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
        }
    }

    private void requireOpen(Connection c, long sessionId) throws SQLException {
        Session s = requireSession(c, sessionId);
        if (!s.open()) throw new IllegalArgumentException("session " + sessionId + " ended at " + s.endedAt().get() + "; start a new one");
    }

    private static final String INSERT_CAPTURE_ROW =
            "INSERT INTO captures(sha256, file_name, size_bytes, added_at) VALUES (?,?,?,?) ON CONFLICT (sha256) DO NOTHING";
    private static final String INSERT_MEASUREMENT = "INSERT INTO measurements(session_id, capture_sha256, capture_name, channel,"
            + " measured_at, program_version, settings_json, defaulted_json, measurement_json, fundamental_hz, fundamental_rms, unit,"
            + " thd_ratio, thdn_ratio, residual_rms, power_watts, load_ohms, gain_at_zero, crossover_verdict, clip_asymmetry_ratio,"
            + " crossover_ratio) VALUES (?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?,?)";

    private static void bindCaptureRow(PreparedStatement ins, CaptureRef ref, Instant at) throws SQLException {
        ins.setString(1, ref.sha256());
        ins.setString(2, ref.fileName());
        ins.setLong(3, ref.sizeBytes());
        ins.setString(4, at.toString());
    }

    private static long insertMeasurement(Connection c, long sessionId, MeasurementRecord m) throws SQLException {
        if (m.capture().isPresent()) {
            try (PreparedStatement ins = c.prepareStatement(INSERT_CAPTURE_ROW)) {
                bindCaptureRow(ins, m.capture().get(), m.measuredAt());
                ins.executeUpdate();
            }
        }
        try (PreparedStatement ins = c.prepareStatement(INSERT_MEASUREMENT, ID_COLUMN)) {
            bindMeasurement(ins, sessionId, m);
            ins.executeUpdate();
            return generatedKey(ins);
        }
    }

    /**
     * Inserts many measurements: the capture rows once each, then the measurements. On a server as one batch (the
     * driver sends them without waiting for each answer, and returns the ids in order); on SQLite one by one (local
     * calls, no round trips to save). Returns the ids in the order given.
     */
    private List<Long> insertMeasurements(Connection c, long sessionId, List<MeasurementRecord> ms) throws SQLException {
        Map<String, MeasurementRecord> firstByCapture = new LinkedHashMap<>();
        for (MeasurementRecord m : ms) m.capture().ifPresent(r -> firstByCapture.putIfAbsent(r.sha256(), m));
        if (!firstByCapture.isEmpty()) {
            try (PreparedStatement ins = c.prepareStatement(INSERT_CAPTURE_ROW)) {
                for (MeasurementRecord m : firstByCapture.values()) {
                    bindCaptureRow(ins, m.capture().get(), m.measuredAt());
                    ins.addBatch();
                }
                ins.executeBatch();
            }
        }
        List<Long> ids = new ArrayList<>(ms.size());
        try (PreparedStatement ins = c.prepareStatement(INSERT_MEASUREMENT, ID_COLUMN)) {
            if (!isShared()) {
                for (MeasurementRecord m : ms) {
                    bindMeasurement(ins, sessionId, m);
                    ins.executeUpdate();
                    ids.add(generatedKey(ins));
                }
                return ids;
            }
            for (MeasurementRecord m : ms) {
                bindMeasurement(ins, sessionId, m);
                ins.addBatch();
            }
            if (ms.isEmpty()) return ids;
            ins.executeBatch();
            try (ResultSet keys = ins.getGeneratedKeys()) {
                while (keys.next()) ids.add(keys.getLong(1));
            }
        }
        if (ids.size() != ms.size()) throw new SQLException("the server returned " + ids.size() + " ids for " + ms.size() + " measurements");
        return ids;
    }

    private static void bindMeasurement(PreparedStatement ins, long sessionId, MeasurementRecord m) throws SQLException {
        KeyFigures f = m.figures();
        ins.setLong(1, sessionId);
        setText(ins, 2, m.capture().map(CaptureRef::sha256));
        setText(ins, 3, m.capture().map(CaptureRef::fileName));
        ins.setInt(4, m.channel());
        ins.setString(5, m.measuredAt().toString());
        ins.setString(6, m.programVersion());
        ins.setString(7, JsonText.write(m.settings()));
        ins.setString(8, JsonText.write(new ArrayList<>(m.defaulted())));
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
        for (Map.Entry<String, Object> e : ((Map<String, Object>) JsonText.parse(rs.getString(k + 6))).entrySet()) {
            settings.put(e.getKey(), String.valueOf(e.getValue()));
        }
        Set<String> defaulted = new LinkedHashSet<>();
        for (Object o : (List<Object>) JsonText.parse(rs.getString(k + 7))) defaulted.add(String.valueOf(o));
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
        Session s = session(sessionId).orElseThrow(() -> new IllegalArgumentException("no session " + sessionId + " in logbook " + engine.display()));
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
            try (PreparedStatement ins = c.prepareStatement("INSERT INTO sessions(unit_id, kind, started_at, ended_at, notes, uuid)"
                    + " VALUES (?,?,?,?,?,?)", ID_COLUMN)) {
                ins.setLong(1, unitId);
                ins.setString(2, s.kind().label());
                ins.setString(3, s.startedAt().toString());
                setText(ins, 4, s.endedAt().map(Instant::toString));
                ins.setString(5, s.notes());
                ins.setString(6, UUID.randomUUID().toString());
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

    /** The stable id of a session (a UUID made at its start; backfilled for sessions older than schema 4). */
    public synchronized String sessionUuid(long sessionId) {
        return read(c -> {
            try (PreparedStatement q = c.prepareStatement("SELECT uuid FROM sessions WHERE id = ?")) {
                q.setLong(1, sessionId);
                try (ResultSet rs = q.executeQuery()) {
                    if (!rs.next()) throw new IllegalArgumentException("no session " + sessionId + " in logbook " + engine.display());
                    return rs.getString(1);
                }
            }
        });
    }

    /** Captures stored per transaction while pushing (and at most this many bytes). */
    static final int PUSH_CAPTURE_BATCH = 256;
    static final long PUSH_CAPTURE_BATCH_BYTES = 64L << 20;

    /**
     * Copies this logbook's units, sessions, steps, measurements and captures into {@code target} (typically a
     * bench's SQLite file into the shop's server). Idempotent: a session is known by its UUID, a step by its number in
     * the session, a capture by its SHA-256; pushing twice copies nothing the second time, and pushing a session
     * again after more steps copies only the new steps (and its end, if it ended since). Measurements outside steps
     * are copied in their order, those beyond the count the target already has. Each session's rows are one
     * transaction in the target; its captures go first (so a step never names a capture the target lacks, unless the
     * source lacked it too).
     */
    public PushResult pushTo(Logbook target) {
        Objects.requireNonNull(target, "target");
        if (target == this) throw new IllegalArgumentException("cannot push a logbook into itself");
        int sessionsAdded = 0;
        int sessionsUpdated = 0;
        int steps = 0;
        int measurements = 0;
        int captures = 0;
        int missing = 0;
        List<Session> all = sessions();
        for (Session s : all) {
            String uuid = sessionUuid(s.id());
            SessionData d = sessionData(s.id());
            Map<String, CaptureRef> refs = new LinkedHashMap<>();
            for (BiasStep b : d.steps()) b.measurement().flatMap(MeasurementRecord::capture).ifPresent(r -> refs.putIfAbsent(r.sha256(), r));
            for (MeasurementRecord m : d.measurements()) m.capture().ifPresent(r -> refs.putIfAbsent(r.sha256(), r));
            Set<String> have = target.engine.presentCaptures(refs.keySet());
            List<CaptureRef> batch = new ArrayList<>();
            long batchBytes = 0;
            for (CaptureRef r : refs.values()) {
                if (have.contains(r.sha256())) continue;
                batch.add(r);
                batchBytes += r.sizeBytes();
                if (batch.size() >= PUSH_CAPTURE_BATCH || batchBytes >= PUSH_CAPTURE_BATCH_BYTES) {
                    int n = target.engine.storeCaptures(batch, engine::openCapture).size();
                    captures += n;
                    missing += batch.size() - n;
                    batch = new ArrayList<>();
                    batchBytes = 0;
                }
            }
            if (!batch.isEmpty()) {
                int n = target.engine.storeCaptures(batch, engine::openCapture).size();
                captures += n;
                missing += batch.size() - n;
            }
            int[] r = target.mergeSession(uuid, d);
            if (r[0] == 1) sessionsAdded++;
            else if (r[0] == 2) sessionsUpdated++;
            steps += r[1];
            measurements += r[2];
        }
        return new PushResult(all.size(), sessionsAdded, sessionsUpdated, steps, measurements, captures, missing);
    }

    /** Merges one pushed session in one transaction: {0 unchanged | 1 added | 2 updated, steps added, measurements added}. */
    private synchronized int[] mergeSession(String uuid, SessionData d) {
        return write(c -> {
            Long sid = null;
            try (PreparedStatement q = c.prepareStatement("SELECT id, ended_at FROM sessions WHERE uuid = ?")) {
                q.setString(1, uuid);
                try (ResultSet rs = q.executeQuery()) {
                    if (rs.next()) sid = rs.getLong(1);
                }
            }
            int state = 0;
            Session s = d.session();
            if (sid == null) {
                long unitId = unitId(c, d.unit());
                try (PreparedStatement ins = c.prepareStatement("INSERT INTO sessions(unit_id, kind, started_at, ended_at, notes, uuid)"
                        + " VALUES (?,?,?,?,?,?)", ID_COLUMN)) {
                    ins.setLong(1, unitId);
                    ins.setString(2, s.kind().label());
                    ins.setString(3, s.startedAt().toString());
                    setText(ins, 4, s.endedAt().map(Instant::toString));
                    ins.setString(5, s.notes());
                    ins.setString(6, uuid);
                    ins.executeUpdate();
                    sid = generatedKey(ins);
                }
                state = 1;
            } else {
                engine.lockSession(c, sid);
                if (s.endedAt().isPresent()) {
                    try (PreparedStatement u = c.prepareStatement("UPDATE sessions SET ended_at = ? WHERE id = ? AND ended_at IS NULL")) {
                        u.setString(1, s.endedAt().get().toString());
                        u.setLong(2, sid);
                        if (u.executeUpdate() > 0) state = 2;
                    }
                }
            }
            Set<Integer> seqs = new java.util.HashSet<>();
            int outside = 0;
            if (state != 1) {
                try (PreparedStatement q = c.prepareStatement("SELECT seq FROM bias_steps WHERE session_id = ?")) {
                    q.setLong(1, sid);
                    try (ResultSet rs = q.executeQuery()) {
                        while (rs.next()) seqs.add(rs.getInt(1));
                    }
                }
                try (PreparedStatement q = c.prepareStatement("SELECT count(*) FROM measurements m WHERE m.session_id = ?"
                        + " AND NOT EXISTS (SELECT 1 FROM bias_steps b WHERE b.measurement_id = m.id)")) {
                    q.setLong(1, sid);
                    try (ResultSet rs = q.executeQuery()) {
                        rs.next();
                        outside = rs.getInt(1);
                    }
                }
            }
            List<BiasStep> fresh = new ArrayList<>();
            for (BiasStep step : d.steps()) if (!seqs.contains(step.seq())) fresh.add(step);
            List<MeasurementRecord> stepMeasurements = new ArrayList<>();
            for (BiasStep step : fresh) step.measurement().ifPresent(stepMeasurements::add);
            List<Long> mids = insertMeasurements(c, sid, stepMeasurements);
            try (PreparedStatement ins = c.prepareStatement(INSERT_STEP)) {
                int k = 0;
                for (BiasStep step : fresh) {
                    Long mid = step.measurement().isPresent() ? mids.get(k++) : null;
                    bindStep(ins, sid, step.seq(), step, mid);
                    ins.addBatch();
                }
                if (!fresh.isEmpty()) ins.executeBatch();
            }
            int steps = fresh.size();
            List<MeasurementRecord> rest = d.measurements().subList(Math.min(outside, d.measurements().size()), d.measurements().size());
            insertMeasurements(c, sid, rest);
            int ms = rest.size();
            if (state == 0 && (steps > 0 || ms > 0)) state = 2;
            return new int[] {state, steps, ms};
        });
    }

    /** A structural check: SQLite's {@code PRAGMA integrity_check}, or the shared schema's links ("ok" when sound). */
    public synchronized String integrityCheck() {
        return engine.integrityCheck();
    }

    @Override
    public synchronized void close() {
        engine.close();
    }

    // ---------------------------------------------------------------- transactions

    interface Work<T> extends Engine.Work<T> {}

    /** Runs {@code work} in one write transaction (retried by the engine while another writer holds a lock). */
    <T> T write(Work<T> work) {
        return engine.write(work);
    }

    <T> T read(Work<T> work) {
        return engine.read(work);
    }

    // ---------------------------------------------------------------- column helpers

    /** The generated key asked for by name: PostgreSQL then returns the id alone, not the whole row. */
    private static final String[] ID_COLUMN = {"id"};

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

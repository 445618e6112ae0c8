package org.outstage.logbook;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/** The logbook's contract; the cases with an engine parameter run on SQLite and on PostgreSQL ({@link TestLogbooks}). */
class LogbookTest {
    @TempDir Path dir;

    @ParameterizedTest(name = "{0}")
    @MethodSource("org.outstage.logbook.TestLogbooks#engines")
    void stepsAndMeasurements_roundTripThroughTheStore_equal(String engine) {
        Random rnd = new Random(42);
        String db = TestLogbooks.newLogbook(engine, dir, "lb");
        List<BiasStep> written = new ArrayList<>();
        List<MeasurementRecord> extra = new ArrayList<>();
        long id;
        try (Logbook lb = TestLogbooks.open(db)) {
            id = lb.startSession(Fixtures.unit(), SessionKind.BIAS_ADJUSTMENT, Fixtures.T0, "first try");
            for (int i = 0; i < 12; i++) written.add(lb.addBiasStep(id, Fixtures.step(rnd, i, Optional.empty())));
            for (int i = 0; i < 3; i++) {
                MeasurementRecord m = Fixtures.measurement(rnd, Optional.empty(), Fixtures.T0.plusSeconds(1000 + i));
                lb.addMeasurement(id, m);
                extra.add(m);
            }
        }
        try (Logbook lb = TestLogbooks.open(db)) {
            assertEquals(written, lb.biasSteps(id));
            assertEquals(StepPoint.of(written), lb.stepSeries(id), "the light series carries the same figures");
            assertEquals(extra, lb.measurements(id));
            assertEquals(Fixtures.unit(), lb.unit("DA-60 #7").orElseThrow());
            Session s = lb.session(id).orElseThrow();
            assertEquals(SessionKind.BIAS_ADJUSTMENT, s.kind());
            assertEquals(Fixtures.T0, s.startedAt());
            assertTrue(s.open());
            for (int i = 0; i < written.size(); i++) assertEquals(i + 1, written.get(i).seq());
        }
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("org.outstage.logbook.TestLogbooks#engines")
    void storedCapture_isContentAddressed_andSurvivesTheOriginal(String engine) throws Exception {
        Path original = dir.resolve("take_bias-20mV.wav");
        byte[] bytes = new byte[5000];
        new Random(7).nextBytes(bytes);
        Files.write(original, bytes);
        try (Logbook lb = TestLogbooks.open(TestLogbooks.newLogbook(engine, dir, "cap"))) {
            CaptureRef ref = lb.storeCapture(original);
            // oracle: the JDK's SHA-256 of the same bytes
            assertEquals(HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(bytes)), ref.sha256());
            assertEquals(5000, ref.sizeBytes());
            Files.delete(original);
            try (var in = lb.openCapture(ref).orElseThrow()) {
                assertArrayEquals(bytes, in.readAllBytes());
            }
            Path again = dir.resolve("renamed.wav");
            Files.write(again, bytes);
            assertEquals(ref.sha256(), lb.storeCapture(again).sha256(), "same content gives the same hash");
            if (!lb.isShared()) {
                assertArrayEquals(bytes, Files.readAllBytes(lb.capturePath(ref).orElseThrow()));
                try (var files = Files.list(lb.capturesDir()).filter(f -> !f.getFileName().toString().equals(".migrating.lock"))) {
                    assertEquals(1, files.count(), "no temp files left, one copy per content");
                }
            } else {
                assertEquals(Integer.valueOf(1), lb.<Integer>read(c -> {
                    try (Statement s = c.createStatement(); ResultSet rs = s.executeQuery("SELECT count(*) FROM capture_blobs")) {
                        rs.next();
                        return rs.getInt(1);
                    }
                }), "one copy per content");
            }
        }
    }

    /** A capture larger than one read slice comes back whole, byte for byte, through the slices. */
    @ParameterizedTest(name = "{0}")
    @MethodSource("org.outstage.logbook.TestLogbooks#engines")
    void largeCapture_streamsBackWhole(String engine) throws Exception {
        Path original = dir.resolve("long.wav");
        byte[] bytes = new byte[PostgresEngine.READ_SLICE_BYTES * 2 + 12345];
        new Random(11).nextBytes(bytes);
        Files.write(original, bytes);
        try (Logbook lb = TestLogbooks.open(TestLogbooks.newLogbook(engine, dir, "big"))) {
            CaptureRef ref = lb.storeCapture(original);
            assertEquals(bytes.length, ref.sizeBytes());
            try (var in = lb.openCapture(ref).orElseThrow()) {
                assertArrayEquals(bytes, in.readAllBytes());
            }
            assertTrue(lb.openCapture(new CaptureRef("0".repeat(64), "x.wav", 1)).isEmpty(), "an unknown hash is not there");
        }
    }

    @Test
    void textFile_isRefused_andLeftUntouched() throws Exception {
        Path f = dir.resolve("notes.db");
        Files.writeString(f, "not a database at all\n");
        byte[] before = Files.readAllBytes(f);
        NotALogbookException e = assertThrows(NotALogbookException.class, () -> Logbook.open(f));
        assertTrue(e.getMessage().contains(f.toString()) && e.getMessage().contains("not an SQLite database"), e.getMessage());
        assertArrayEquals(before, Files.readAllBytes(f));
        assertTrue(Files.notExists(dir.resolve("notes.db-wal")));
    }

    @Test
    void foreignSqliteDatabase_isRefused_andLeftUntouched() throws Exception {
        Path f = dir.resolve("other.sqlite");
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + f); Statement s = c.createStatement()) {
            s.executeUpdate("CREATE TABLE recipes (id INTEGER PRIMARY KEY, name TEXT)");
        }
        byte[] before = Files.readAllBytes(f);
        NotALogbookException e = assertThrows(NotALogbookException.class, () -> Logbook.open(f));
        assertTrue(e.getMessage().contains("tables of another program"), e.getMessage());
        assertArrayEquals(before, Files.readAllBytes(f));

        Path g = dir.resolve("app.sqlite");
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + g); Statement s = c.createStatement()) {
            s.executeUpdate("PRAGMA application_id = 1234");
        }
        e = assertThrows(NotALogbookException.class, () -> Logbook.open(g));
        assertTrue(e.getMessage().contains("another application"), e.getMessage());
    }

    @Test
    void newerSchema_isRefused() throws Exception {
        Path f = dir.resolve("future.db");
        Logbook.open(f).close();
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + f); Statement s = c.createStatement()) {
            s.executeUpdate("PRAGMA user_version = " + (Migrations.latest() + 1));
        }
        NotALogbookException e = assertThrows(NotALogbookException.class, () -> Logbook.open(f));
        assertTrue(e.getMessage().contains("newer Outstage"), e.getMessage());
    }

    @Test
    void oldSchema_isMigratedForward_keepingRows() throws Exception {
        Path f = dir.resolve("old.db");
        long id;
        // build a version-1 logbook: open applies everything, so start from an empty file and stop at 1
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + f); Statement s = c.createStatement()) {
            for (String sql : Migrations.STEPS.get(0)) s.executeUpdate(sql);
            s.executeUpdate("PRAGMA user_version = 1");
            s.executeUpdate("PRAGMA application_id = " + Migrations.APPLICATION_ID);
            s.executeUpdate("INSERT INTO units(name) VALUES ('DA-60 #1')");
            s.executeUpdate("INSERT INTO sessions(unit_id, kind, started_at) VALUES (1, 'evaluation', '2026-01-01T00:00:00Z')");
        }
        try (Logbook lb = Logbook.open(f)) {
            assertEquals(Migrations.latest(), lb.schemaVersion());
            id = lb.sessions().get(0).id();
            assertEquals("DA-60 #1", lb.session(id).orElseThrow().unitName());
        }
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + f); Statement s = c.createStatement();
             ResultSet rs = s.executeQuery("SELECT count(*) FROM sqlite_master WHERE name = 'sessions_by_unit'")) {
            rs.next();
            assertEquals(1, rs.getInt(1), "migration 2 applied");
        }
    }

    /** Migration 3 adds the verdict's crossover ratio and fills it from the stored measurement JSON where it is there. */
    @Test
    void schemaTwo_gainsCrossoverRatioFromStoredMeasurements() throws Exception {
        Path f = dir.resolve("v2.db");
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + f); Statement s = c.createStatement()) {
            for (int v = 0; v < 2; v++) for (String sql : Migrations.STEPS.get(v)) s.executeUpdate(sql);
            s.executeUpdate("PRAGMA user_version = 2");
            s.executeUpdate("PRAGMA application_id = " + Migrations.APPLICATION_ID);
            s.executeUpdate("INSERT INTO units(name) VALUES ('DA-60 #2')");
            s.executeUpdate("INSERT INTO sessions(unit_id, kind, started_at) VALUES (1, 'bias-adjustment', '2026-01-01T00:00:00Z')");
            String common = "INSERT INTO measurements(session_id, channel, measured_at, program_version, settings_json, defaulted_json,"
                    + " measurement_json, fundamental_hz, fundamental_rms, unit, thd_ratio, thdn_ratio, gain_at_zero) VALUES"
                    + " (1, 1, '2026-01-01T00:00:01Z', 'outstage 0.1.0', '{}', '[]', ";
            s.executeUpdate(common + "'{\"crossover\": {\"gain_at_zero\": 1.0041, \"verdict_ratio\": 1.0008}}', 997, 6.3, 'V', 3e-4, 3e-4, 1.0041)");
            s.executeUpdate(common + "'{\"crossover\": {\"gain_at_zero\": 0.95}}', 997, 6.3, 'V', 3e-4, 3e-4, 0.95)");
            s.executeUpdate("INSERT INTO bias_steps(session_id, seq, taken_at, reading_value, reading_unit, channel, measurement_id)"
                    + " VALUES (1, 1, '2026-01-01T00:00:01Z', 26, 'mV', 1, 1), (1, 2, '2026-01-01T00:00:02Z', 3, 'mV', 1, 2)");
        }
        try (Logbook lb = Logbook.open(f)) {
            assertEquals(Migrations.latest(), lb.schemaVersion());
            List<StepPoint> pts = lb.stepSeries(1);
            assertEquals(1.0008, pts.get(0).figures().orElseThrow().crossoverRatio().getAsDouble(), 0);
            assertEquals(1.0008, pts.get(0).figures().orElseThrow().crossoverReading().getAsDouble(), 0);
            assertTrue(pts.get(1).figures().orElseThrow().crossoverRatio().isEmpty(), "no ratio in that measurement's JSON");
            assertEquals(0.95, pts.get(1).figures().orElseThrow().crossoverReading().getAsDouble(), 0, "falls back to gain at zero");
        }
    }

    @Test
    void pragmas_walForeignKeysApplicationId() throws Exception {
        Path f = dir.resolve("p.db");
        Logbook.open(f).close();
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + f); Statement s = c.createStatement()) {
            try (ResultSet rs = s.executeQuery("PRAGMA journal_mode")) {
                rs.next();
                assertEquals("wal", rs.getString(1));
            }
            try (ResultSet rs = s.executeQuery("PRAGMA application_id")) {
                rs.next();
                assertEquals(0x4F555453, rs.getInt(1));
            }
        }
        try (Logbook lb = Logbook.open(f)) {
            // foreign keys are enforced: a step in a session that does not exist is refused
            assertThrows(IllegalArgumentException.class, () -> lb.addBiasStep(99, Fixtures.step(new Random(1), 0, Optional.empty())));
            assertThrows(LogbookException.class, () -> lb.write(c -> {
                try (Statement s = c.createStatement()) {
                    return s.executeUpdate("INSERT INTO sessions(unit_id, kind, started_at) VALUES (77, 'evaluation', 'x')");
                }
            }));
        }
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("org.outstage.logbook.TestLogbooks#engines")
    void endedSession_refusesNewSteps(String engine) {
        try (Logbook lb = TestLogbooks.open(TestLogbooks.newLogbook(engine, dir, "e"))) {
            long id = lb.startSession(UnitUnderTest.named("DA-60 #2"), SessionKind.BIAS_ADJUSTMENT, Fixtures.T0, "");
            lb.endSession(id, Fixtures.T0.plusSeconds(60));
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> lb.addBiasStep(id, Fixtures.step(new Random(3), 0, Optional.empty())));
            assertTrue(e.getMessage().contains("ended"), e.getMessage());
        }
    }

    /**
     * Issue 10: a kill -9 cannot see a missing fsync (the page cache survives it), so the settings that make a
     * commit reach the disk are asserted directly. SQLite: WAL with synchronous=FULL (2) on the writing connection
     * (WAL + NORMAL may lose the last commits on power loss: sqlite.org/pragma.html#pragma_synchronous). PostgreSQL:
     * fsync on, synchronous_commit on for our sessions, full_page_writes on (postgresql.org/docs/15/runtime-config-wal.html).
     */
    @ParameterizedTest(name = "{0}")
    @MethodSource("org.outstage.logbook.TestLogbooks#engines")
    void durabilitySettings_makeACommitReachTheDisk(String engine) {
        try (Logbook lb = TestLogbooks.open(TestLogbooks.newLogbook(engine, dir, "sync"))) {
            lb.startSession(UnitUnderTest.named("DA-60 #3"), SessionKind.EVALUATION, Fixtures.T0, "");
            if (!lb.isShared()) {
                assertEquals("wal", setting(lb, "PRAGMA journal_mode"));
                assertEquals("2", setting(lb, "PRAGMA synchronous"), "synchronous=FULL");
            } else {
                assertEquals("on", setting(lb, "SHOW fsync"));
                assertEquals("on", setting(lb, "SHOW synchronous_commit"));
                assertEquals("on", setting(lb, "SHOW full_page_writes"));
            }
        }
    }

    private static String setting(Logbook lb, String sql) {
        return lb.read(c -> {
            try (Statement s = c.createStatement(); ResultSet rs = s.executeQuery(sql)) {
                rs.next();
                return rs.getString(1).toLowerCase(java.util.Locale.ROOT);
            }
        });
    }

    /**
     * A logbook made by the hand-rolled migrations (schema 3, no Flyway history; built here with their SQL, which
     * {@link Migrations} keeps frozen) opens: Flyway baselines it at 3 and adds 4, giving old sessions a stable id.
     */
    @Test
    void logbookMadeBeforeFlyway_isBaselinedAndMigrated_sessionsGetUuids() throws Exception {
        Path f = dir.resolve("v3.db");
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + f); Statement s = c.createStatement()) {
            for (int v = 0; v < 3; v++) for (String sql : Migrations.STEPS.get(v)) s.executeUpdate(sql);
            s.executeUpdate("PRAGMA user_version = 3");
            s.executeUpdate("PRAGMA application_id = " + Migrations.APPLICATION_ID);
            s.executeUpdate("INSERT INTO units(name) VALUES ('DA-60 #4')");
            s.executeUpdate("INSERT INTO sessions(unit_id, kind, started_at) VALUES (1, 'evaluation', '2026-01-01T00:00:00Z')");
            s.executeUpdate("INSERT INTO sessions(unit_id, kind, started_at) VALUES (1, 'evaluation', '2026-01-02T00:00:00Z')");
        }
        try (Logbook lb = Logbook.open(f)) {
            assertEquals(4, lb.schemaVersion());
            assertEquals(2, lb.sessions().size());
        }
        try (Connection c = DriverManager.getConnection("jdbc:sqlite:" + f); Statement s = c.createStatement()) {
            try (ResultSet rs = s.executeQuery("SELECT count(DISTINCT uuid), min(length(uuid)), sum(uuid LIKE '________-____-4___-____-____________')"
                    + " FROM sessions")) {
                rs.next();
                assertEquals(2, rs.getInt(1), "each old session has its own id");
                assertEquals(36, rs.getInt(2));
                assertEquals(2, rs.getInt(3), "version-4 UUID layout");
            }
            try (ResultSet rs = s.executeQuery("SELECT group_concat(version || ':' || type, ' ') FROM flyway_schema_history ORDER BY installed_rank")) {
                rs.next();
                assertEquals("3:BASELINE 4:SQL", rs.getString(1));
            }
        }
    }

    @Test
    void defaultPath_followsEnvironment() {
        Path home = Path.of("/home/bench");
        assertEquals(Path.of("/x/lb.db"), Logbook.defaultPath(Map.of("OUTSTAGE_LOGBOOK", "/x/lb.db"), home));
        assertEquals(Path.of("/data/outstage/logbook.db"), Logbook.defaultPath(Map.of("XDG_DATA_HOME", "/data"), home));
        assertEquals(Path.of("/home/bench/.local/share/outstage/logbook.db"), Logbook.defaultPath(Map.of(), home));
    }
}

package org.outstage.logbook;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Random;
import java.util.Set;
import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicBoolean;
import org.junit.jupiter.api.Assertions;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Crash and concurrency checks, on both engines: a killed writer loses nothing it reported saved; many writers
 * (threads or processes) lose no rows and take contiguous step numbers.
 */
class NothingLostTest {
    @TempDir Path dir;

    static ProcessBuilder writer(Path scratch, String location, long session, long seed, String... more) {
        List<String> cmd = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                // a CI machine running eight JVMs on two cores can take seconds to open a connection (scram login)
                "-Xshare:auto", "-XX:TieredStopAtLevel=1", "-Xmx128m", "-Doutstage.logbook.connectTimeoutMs=30000", "-cp", System.getProperty("java.class.path"),
                KillWriterMain.class.getName(), location, scratch.toString(), Long.toString(session), Long.toString(seed)));
        cmd.addAll(List.of(more));
        return new ProcessBuilder(cmd);
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("org.outstage.logbook.TestLogbooks#engines")
    void writerKilledAtRandomMoments_everyReportedStepIsThere_andStoreIsSound(String engine) throws Exception {
        String db = TestLogbooks.newLogbook(engine, dir, "kill");
        long session;
        try (Logbook lb = TestLogbooks.open(db)) {
            session = lb.startSession(UnitUnderTest.named("DA-60 #9"), SessionKind.BIAS_ADJUSTMENT, Fixtures.T0, "");
        }
        Random delays = new Random(20261201L);
        Map<Integer, String> reported = new ConcurrentHashMap<>();
        int rounds = 20;
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(25);
        int done = 0;
        for (int round = 0; round < rounds && System.nanoTime() < deadline; round++, done++) {
            Process p = writer(dir, db, session, round).redirectError(ProcessBuilder.Redirect.DISCARD).start();
            BufferedReader out = new BufferedReader(new InputStreamReader(p.getInputStream(), StandardCharsets.UTF_8));
            // wait for the first save, then let it run a seeded random while more before the kill
            String line = out.readLine();
            assertTrue(line != null && line.startsWith("saved "), "writer started: " + line);
            record(reported, line);
            long killAt = System.nanoTime() + TimeUnit.MILLISECONDS.toNanos(20 + delays.nextInt(400));
            Thread reader = new Thread(() -> {
                try {
                    String l;
                    while ((l = out.readLine()) != null) record(reported, l);
                } catch (Exception ignored) {
                    // stream closed by the kill
                }
            });
            reader.start();
            while (System.nanoTime() < killAt) Thread.sleep(5);
            p.destroyForcibly(); // SIGKILL on Linux: no shutdown hooks, no cleanup
            p.waitFor(10, TimeUnit.SECONDS);
            reader.join(5000);
        }
        assertTrue(done >= 5, "at least five kill rounds ran, got " + done);
        try (Logbook lb = TestLogbooks.open(db)) {
            assertEquals("ok", lb.integrityCheck());
            List<BiasStep> steps = lb.biasSteps(session);
            Set<Integer> seqs = new HashSet<>();
            for (BiasStep s : steps) seqs.add(s.seq());
            for (Map.Entry<Integer, String> e : reported.entrySet()) {
                assertTrue(seqs.contains(e.getKey()), "step " + e.getKey() + " was reported saved but is missing");
                BiasStep s = steps.stream().filter(x -> x.seq() == e.getKey()).findFirst().orElseThrow();
                if (s.measurement().isPresent()) {
                    CaptureRef ref = s.measurement().get().capture().orElseThrow();
                    assertEquals(e.getValue(), ref.sha256());
                    byte[] stored;
                    try (InputStream in = lb.openCapture(ref).orElseThrow(() -> new AssertionError("capture of step " + e.getKey() + " missing"))) {
                        stored = in.readAllBytes();
                    }
                    assertEquals(ref.sha256(), HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(stored)));
                    assertEquals(ref.sizeBytes(), stored.length);
                }
            }
            assertTrue(reported.size() >= done, "each round saved at least one step");
            // sequence numbers are contiguous: no half-written step took a number
            for (int i = 0; i < steps.size(); i++) assertEquals(i + 1, steps.get(i).seq());
        }
    }

    private static void record(Map<Integer, String> reported, String line) {
        String[] parts = line.split(" ");
        if (parts.length == 3 && parts[0].equals("saved")) reported.put(Integer.parseInt(parts[1]), parts[2]);
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("org.outstage.logbook.TestLogbooks#engines")
    void threeWriterThreadsOnTwoSessions_noLostRows_noLockedError(String engine) throws Exception {
        String db = TestLogbooks.newLogbook(engine, dir, "two");
        long s1;
        long s2;
        try (Logbook lb = TestLogbooks.open(db)) {
            s1 = lb.startSession(UnitUnderTest.named("DA-60 L"), SessionKind.BIAS_ADJUSTMENT, Fixtures.T0, "");
            s2 = lb.startSession(UnitUnderTest.named("DA-60 R"), SessionKind.BIAS_ADJUSTMENT, Fixtures.T0, "");
        }
        int n = 150;
        List<Throwable> errors = java.util.Collections.synchronizedList(new ArrayList<>());
        long[] targets = {s1, s2, s1};
        List<Thread> threads = new ArrayList<>();
        for (int t = 0; t < targets.length; t++) {
            long sid = targets[t];
            int seed = t;
            threads.add(new Thread(() -> {
                Random rnd = new Random(seed);
                try (Logbook lb = Logbook.open(db)) { // its own connection (or pool)
                    for (int i = 0; i < n; i++) lb.addBiasStep(sid, Fixtures.step(rnd, i, Optional.empty()));
                    // two benches adding the same new unit at once: one unit, no error
                    lb.ensureUnit(UnitUnderTest.named("DA-60 shared"));
                } catch (Throwable e) {
                    errors.add(e);
                }
            }));
        }
        threads.forEach(Thread::start);
        for (Thread t : threads) t.join();
        assertEquals(List.of(), errors);
        try (Logbook lb = TestLogbooks.open(db)) {
            assertEquals(2 * n, lb.biasSteps(s1).size());
            assertEquals(n, lb.biasSteps(s2).size());
            List<BiasStep> steps = lb.biasSteps(s1);
            for (int i = 0; i < steps.size(); i++) assertEquals(i + 1, steps.get(i).seq());
            assertEquals("ok", lb.integrityCheck());
        }
    }

    /**
     * Eight writer processes add 500 steps each to one session. The steps are plain readings (no capture, no
     * measurement): what is under test is the contention for step numbers, not the bytes.
     */
    @ParameterizedTest(name = "{0}")
    @MethodSource("org.outstage.logbook.TestLogbooks#engines")
    void eightWriterProcessesOnOneSession_noLostOrDuplicatedRows_contiguousSteps(String engine) throws Exception {
        String db = TestLogbooks.newLogbook(engine, dir, "procs");
        long sid;
        try (Logbook lb = TestLogbooks.open(db)) {
            sid = lb.startSession(UnitUnderTest.named("DA-60 P"), SessionKind.BIAS_ADJUSTMENT, Fixtures.T0, "");
        }
        int writers = 8;
        int n = 500;
        List<Process> ps = new ArrayList<>();
        List<Path> errs = new ArrayList<>();
        List<Path> outs = new ArrayList<>();
        for (int k = 0; k < writers; k++) {
            Path err = dir.resolve("err" + k + ".txt");
            Path out = dir.resolve("out" + k + ".txt");
            errs.add(err);
            outs.add(out);
            ps.add(writer(dir, db, sid, 100 + k, Integer.toString(n), "light").redirectOutput(out.toFile()).redirectError(err.toFile()).start());
        }
        for (int k = 0; k < ps.size(); k++) {
            Process p = ps.get(k);
            assertTrue(p.waitFor(300, TimeUnit.SECONDS), "writer finished");
            assertEquals(0, p.exitValue(), "writer " + k + ": " + Files.readString(errs.get(k)));
        }
        for (Path e : errs) assertEquals("", Files.readString(e), "nothing on stderr (no 'database is locked', no serialization error)");
        Set<Integer> reported = new HashSet<>();
        for (Path o : outs) {
            List<String> lines = Files.readAllLines(o);
            assertEquals(n, lines.size());
            for (String l : lines) assertTrue(reported.add(Integer.parseInt(l.split(" ")[1])), "step number handed out twice: " + l);
        }
        try (Logbook lb = TestLogbooks.open(db)) {
            List<StepPoint> steps = lb.stepSeries(sid);
            assertEquals(writers * n, steps.size());
            for (int i = 0; i < steps.size(); i++) assertEquals(i + 1, steps.get(i).seq());
            assertEquals("ok", lb.integrityCheck());
        }
    }

    /** Runs {@code tools/test-postgres ACTION} (from {@code $OUTSTAGE_TEST_PG_SCRIPT}, exported by its start). */
    private static void server(String action) throws Exception {
        String script = System.getenv("OUTSTAGE_TEST_PG_SCRIPT");
        if (script == null || script.isBlank()) {
            if ("true".equals(System.getenv("CI"))) Assertions.fail("CI=true and $OUTSTAGE_TEST_PG_SCRIPT is not set: the restart test cannot run");
            Assumptions.abort("$OUTSTAGE_TEST_PG_SCRIPT is not set (eval \"$(tools/test-postgres start)\")");
        }
        Process p = new ProcessBuilder(script, action).redirectErrorStream(true).redirectOutput(ProcessBuilder.Redirect.DISCARD).start();
        assertTrue(p.waitFor(120, TimeUnit.SECONDS), "tools/test-postgres " + action + " finished");
        assertEquals(0, p.exitValue(), "tools/test-postgres " + action);
    }

    /**
     * The server restarts in the middle of a session, with a writer running: every step reported saved is there,
     * none is half-written (numbers stay contiguous). While the server is down a step is refused with a one-line
     * message that says nothing was written; after it is back the same logbook object goes on.
     */
    @Test
    void serverRestartMidSession_failureReported_noHalfStep_sessionGoesOn() throws Exception {
        TestLogbooks.requireServer();
        String db = TestLogbooks.newLogbook(TestLogbooks.POSTGRES, dir, "restart");
        try (Logbook lb = TestLogbooks.open(db)) {
            long sid = lb.startSession(UnitUnderTest.named("DA-60 #R"), SessionKind.BIAS_ADJUSTMENT, Fixtures.T0, "");
            Random rnd = new Random(5);
            Set<Integer> saved = java.util.concurrent.ConcurrentHashMap.newKeySet();
            for (int i = 0; i < 3; i++) saved.add(lb.addBiasStep(sid, Fixtures.step(rnd, i, Optional.empty())).seq());
            AtomicBoolean stop = new AtomicBoolean();
            List<Throwable> unexpected = java.util.Collections.synchronizedList(new ArrayList<>());
            List<String> reported = java.util.Collections.synchronizedList(new ArrayList<>());
            Thread w = new Thread(() -> {
                Random r = new Random(6);
                for (int i = 0; !stop.get(); i++) {
                    try {
                        saved.add(lb.addBiasStep(sid, Fixtures.lightStep(r, i)).seq());
                    } catch (LogbookUnavailableException e) {
                        reported.add(e.getMessage());
                    } catch (Throwable e) {
                        unexpected.add(e);
                    }
                }
            });
            w.start();
            Thread.sleep(300);
            server("restart");
            Thread.sleep(500);
            stop.set(true);
            w.join(60_000);
            assertEquals(List.of(), unexpected, "only LogbookUnavailableException while the server restarts");
            for (String m : reported) assertEquals(1, m.lines().count(), m);

            server("halt");
            LogbookUnavailableException down;
            try {
                down = Assertions.assertThrows(LogbookUnavailableException.class,
                        () -> lb.addBiasStep(sid, Fixtures.step(new Random(7), 0, Optional.empty())));
            } finally {
                server("resume");
            }
            assertTrue(down.getMessage().contains("cannot reach the logbook server") && down.getMessage().contains("nothing was written"),
                    down.getMessage());
            assertEquals(1, down.getMessage().lines().count());

            BiasStep next = lb.addBiasStep(sid, Fixtures.step(new Random(8), 1, Optional.empty()));
            List<StepPoint> steps = lb.stepSeries(sid);
            for (int i = 0; i < steps.size(); i++) assertEquals(i + 1, steps.get(i).seq(), "contiguous after the restart");
            Set<Integer> there = new HashSet<>();
            for (StepPoint p : steps) there.add(p.seq());
            assertTrue(there.containsAll(saved), "every step reported saved is there");
            assertEquals(steps.size(), next.seq(), "the session went on after the restart");
            assertTrue(saved.size() > 3, "the writer saved steps around the restart");
        }
    }
}

package org.outstage.logbook;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.BufferedReader;
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
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Crash and concurrency checks: a killed writer loses nothing it reported saved; two writers lose no rows. */
class NothingLostTest {
    @TempDir Path dir;

    @Test
    void writerKilledAtRandomMoments_everyReportedStepIsThere_andFileIsSound() throws Exception {
        Path db = dir.resolve("kill.db");
        long session;
        try (Logbook lb = Logbook.open(db)) {
            session = lb.startSession(UnitUnderTest.named("DA-60 #9"), SessionKind.BIAS_ADJUSTMENT, Fixtures.T0, "");
        }
        Random delays = new Random(20261201L);
        Map<Integer, String> reported = new ConcurrentHashMap<>();
        int rounds = 20;
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(25);
        int done = 0;
        for (int round = 0; round < rounds && System.nanoTime() < deadline; round++, done++) {
            Process p = new ProcessBuilder(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                    "-Xshare:auto", "-XX:TieredStopAtLevel=1", "-cp", System.getProperty("java.class.path"),
                    KillWriterMain.class.getName(), db.toString(), Long.toString(session), Long.toString(round))
                    .redirectError(ProcessBuilder.Redirect.DISCARD).start();
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
        try (Logbook lb = Logbook.open(db)) {
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
                    Path stored = lb.capturePath(ref).orElseThrow(() -> new AssertionError("capture of step " + e.getKey() + " missing"));
                    assertEquals(ref.sha256(), HexFormat.of().formatHex(MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(stored))));
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

    @Test
    void twoWritersOnOneFile_noLostRows_noLockedError() throws Exception {
        Path db = dir.resolve("two.db");
        long s1;
        long s2;
        try (Logbook lb = Logbook.open(db)) {
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
                try (Logbook lb = Logbook.open(db)) { // its own connection
                    for (int i = 0; i < n; i++) lb.addBiasStep(sid, Fixtures.step(rnd, i, Optional.empty()));
                } catch (Throwable e) {
                    errors.add(e);
                }
            }));
        }
        threads.forEach(Thread::start);
        for (Thread t : threads) t.join();
        assertEquals(List.of(), errors);
        try (Logbook lb = Logbook.open(db)) {
            assertEquals(2 * n, lb.biasSteps(s1).size());
            assertEquals(n, lb.biasSteps(s2).size());
            List<BiasStep> steps = lb.biasSteps(s1);
            for (int i = 0; i < steps.size(); i++) assertEquals(i + 1, steps.get(i).seq());
            assertEquals("ok", lb.integrityCheck());
        }
    }

    @Test
    void twoWriterProcessesOnOneSession_noLostRows_noLockedError() throws Exception {
        Path db = dir.resolve("procs.db");
        long sid;
        try (Logbook lb = Logbook.open(db)) {
            sid = lb.startSession(UnitUnderTest.named("DA-60 P"), SessionKind.BIAS_ADJUSTMENT, Fixtures.T0, "");
        }
        int n = 40;
        List<Process> ps = new ArrayList<>();
        List<Path> errs = new ArrayList<>();
        for (int k = 0; k < 2; k++) {
            Path err = dir.resolve("err" + k + ".txt");
            errs.add(err);
            ps.add(new ProcessBuilder(Path.of(System.getProperty("java.home"), "bin", "java").toString(), "-XX:TieredStopAtLevel=1",
                    "-cp", System.getProperty("java.class.path"), KillWriterMain.class.getName(), db.toString(), Long.toString(sid),
                    Long.toString(100 + k), Integer.toString(n))
                    .redirectOutput(ProcessBuilder.Redirect.DISCARD).redirectError(err.toFile()).start());
        }
        for (Process p : ps) {
            assertTrue(p.waitFor(60, TimeUnit.SECONDS), "writer finished");
            assertEquals(0, p.exitValue());
        }
        for (Path e : errs) assertEquals("", Files.readString(e), "nothing on stderr (no 'database is locked')");
        try (Logbook lb = Logbook.open(db)) {
            List<BiasStep> steps = lb.biasSteps(sid);
            assertEquals(2 * n, steps.size());
            for (int i = 0; i < steps.size(); i++) assertEquals(i + 1, steps.get(i).seq());
            assertEquals("ok", lb.integrityCheck());
        }
    }
}

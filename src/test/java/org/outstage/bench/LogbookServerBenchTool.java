package org.outstage.bench;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Collections;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.Set;
import java.util.stream.Stream;
import org.outstage.capture.WavWriter;
import org.outstage.logbook.BiasReading;
import org.outstage.logbook.BiasStep;
import org.outstage.logbook.CaptureRef;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.MeasurementRecord;
import org.outstage.logbook.PushResult;
import org.outstage.logbook.Session;
import org.outstage.logbook.SessionData;
import org.outstage.logbook.SessionKind;
import org.outstage.logbook.UnitUnderTest;
import org.outstage.verify.KeyFigures;

/**
 * Shared-logbook speed runner (issue 14 targets), run by {@code tools/bench-logbook}; wall-clock figures of a whole
 * operation, not a unit test.
 * <ul>
 * <li>{@code commit LOCATION [WRITERS=8] [STEPS=40]}: WRITERS threads, each with its own logbook connection and
 * session, each commit a bias step with its own 2 s capture (48 kHz, 24-bit mono WAV, 288 kB, stored) and a
 * measurement; prints p50 / p95 / max of store + commit. Target: p95 under 50 ms with 8 writers on a local server.</li>
 * <li>{@code push URL [STEPS=10000] [CAPTURES=1000]}: builds an SQLite logbook of one session of STEPS steps, each
 * with a measurement, referring to CAPTURES distinct 2 s captures, and times {@code logbook push} of it into URL
 * (a fresh database) and a second, idempotent push. Target: under 30 s for 10,000 steps.</li>
 * </ul>
 */
public final class LogbookServerBenchTool {
    private LogbookServerBenchTool() {}

    public static void main(String[] args) throws Exception {
        Path dir = Files.createTempDirectory("logbook-server-bench");
        try {
            if (args[0].equals("commit")) commit(dir, args[1], args.length > 2 ? Integer.parseInt(args[2]) : 8, args.length > 3 ? Integer.parseInt(args[3]) : 40);
            else if (args[0].equals("push")) push(dir, args[1], args.length > 2 ? Integer.parseInt(args[2]) : 10_000, args.length > 3 ? Integer.parseInt(args[3]) : 1000);
            else throw new IllegalArgumentException("commit LOCATION [WRITERS] [STEPS] | push URL [STEPS] [CAPTURES]");
        } finally {
            try (Stream<Path> s = Files.walk(dir)) {
                for (Path p : s.sorted(Comparator.reverseOrder()).toList()) Files.deleteIfExists(p);
            }
        }
    }

    /** 2 s at 48 kHz, 24-bit: a 997 Hz sine with a small crossover bump; {@code variant} makes each file's bytes differ. */
    static byte[] capture(Path dir, int variant) throws Exception {
        int fs = 48_000;
        double[] x = new double[2 * fs];
        for (int i = 0; i < x.length; i++) {
            double s = 0.5 * Math.sin(2 * Math.PI * 997 * i / fs + variant * 1e-3);
            x[i] = s - 0.004 * 0.025 * Math.tanh(s / 0.025);
        }
        Path p = dir.resolve("proto-" + variant + ".wav");
        WavWriter.write(p, fs, WavWriter.Encoding.PCM_24, false, x);
        byte[] b = Files.readAllBytes(p);
        Files.delete(p);
        return b;
    }

    static MeasurementRecord measurement(Optional<CaptureRef> cap, Instant at, int i) {
        KeyFigures f = KeyFigures.basic(997.0, 2.83, "V", 3e-4 + i * 1e-9, 3.2e-4).withPower(1.0, 8.0).withCrossover(0.998, "near-optimal");
        StringBuilder json = new StringBuilder("{\"harmonics\": [");
        for (int h = 2; h < 60; h++) json.append(h > 2 ? ", " : "").append("{\"n\": ").append(h).append(", \"db\": -").append(60 + h).append(".25}");
        json.append("]}");
        return new MeasurementRecord(1, cap, at, "outstage 0.1.0", Map.of("bandwidth", "20-20000", "harmonics", "10", "load", "8.0"),
                Set.of("harmonics"), json.toString(), f);
    }

    static void commit(Path dir, String location, int writers, int steps) throws Exception {
        byte[] proto = capture(dir, 0);
        List<Double> ms = Collections.synchronizedList(new ArrayList<>());
        List<Throwable> errors = Collections.synchronizedList(new ArrayList<>());
        List<Thread> threads = new ArrayList<>();
        long wall0 = System.nanoTime();
        for (int w = 0; w < writers; w++) {
            int id = w;
            threads.add(new Thread(() -> {
                try (Logbook lb = Logbook.open(location)) {
                    long sid = lb.startSession(UnitUnderTest.named("bench " + id), SessionKind.BIAS_ADJUSTMENT, Instant.now(), "speed run");
                    Path wdir = Files.createDirectories(dir.resolve("w" + id));
                    for (int i = 0; i < steps + 3; i++) {
                        byte[] b = proto.clone();
                        long tag = ((long) id << 32) | i;
                        for (int k = 0; k < 8; k++) b[b.length - 1 - k] = (byte) (tag >>> (8 * k)); // distinct content, same size
                        Path f = wdir.resolve("take_" + i + ".wav");
                        Files.write(f, b);
                        Instant at = Instant.now();
                        long t0 = System.nanoTime();
                        CaptureRef ref = lb.storeCapture(f);
                        lb.addBiasStep(sid, BiasStep.draft(at, BiasReading.millivolts(10 + i), OptionalDouble.of(30), OptionalDouble.empty(), 1,
                                Optional.of(measurement(Optional.of(ref), at, i))));
                        double d = (System.nanoTime() - t0) / 1e6;
                        if (i >= 3) ms.add(d); // the first steps warm the connection and the JIT
                        Files.delete(f);
                    }
                } catch (Throwable e) {
                    errors.add(e);
                }
            }));
        }
        threads.forEach(Thread::start);
        for (Thread t : threads) t.join();
        double wall = (System.nanoTime() - wall0) / 1e9;
        if (!errors.isEmpty()) throw new IllegalStateException("writer failed", errors.get(0));
        double[] a = ms.stream().mapToDouble(Double::doubleValue).sorted().toArray();
        System.out.printf("commit: %s, %d writers x %d steps (2 s capture, %d bytes, each stored): p50 %.1f ms, p95 %.1f ms, max %.1f ms;"
                        + " %.1f steps/s overall (%.1f s)%n", location.startsWith("postgres") ? "PostgreSQL" : "SQLite", writers, steps,
                proto.length, pct(a, 50), pct(a, 95), a[a.length - 1], a.length / wall, wall);
    }

    static double pct(double[] sorted, double p) {
        int i = (int) Math.ceil(p / 100 * sorted.length) - 1;
        return sorted[Math.max(0, Math.min(sorted.length - 1, i))];
    }

    static void push(Path dir, String url, int steps, int captures) throws Exception {
        Path db = dir.resolve("bench.db");
        long t0 = System.nanoTime();
        List<CaptureRef> refs = new ArrayList<>();
        byte[] proto = capture(dir, 0);
        try (Logbook lb = Logbook.open(db)) {
            for (int c = 0; c < captures; c++) {
                byte[] b = proto.clone();
                for (int k = 0; k < 4; k++) b[b.length - 1 - k] = (byte) (c >>> (8 * k));
                Path f = dir.resolve("take_" + c + ".wav");
                Files.write(f, b);
                refs.add(lb.storeCapture(f));
                Files.delete(f);
            }
            Instant start = Instant.parse("2026-03-14T09:00:00Z");
            List<BiasStep> list = new ArrayList<>();
            for (int i = 0; i < steps; i++) {
                Instant at = start.plusSeconds(10L * i);
                Optional<CaptureRef> cap = captures == 0 ? Optional.empty() : Optional.of(refs.get(i % captures));
                list.add(new BiasStep(i + 1, at, BiasReading.millivolts(5 + (i % 500) * 0.1), OptionalDouble.of(25 + (i % 300) * 0.1),
                        OptionalDouble.of(22), 1, Optional.of(measurement(cap, at, i))));
            }
            Session s = new Session(0, "DA-60 push", SessionKind.BIAS_ADJUSTMENT, start, Optional.empty(), "push run");
            lb.importSession(new SessionData(UnitUnderTest.named("DA-60 push"), s, list, List.of()));
        }
        System.out.printf("push: built an SQLite logbook of %d steps and %d captures (%d bytes each) in %.1f s%n", steps, captures, proto.length,
                (System.nanoTime() - t0) / 1e9);
        try (Logbook src = Logbook.open(db); Logbook dst = Logbook.open(url)) {
            for (int round = 1; round <= 2; round++) {
                long t1 = System.nanoTime();
                PushResult r = src.pushTo(dst);
                System.out.printf("push %d to %s: %.1f s (%s)%n", round, dst.display(), (System.nanoTime() - t1) / 1e9, r);
            }
        }
    }
}

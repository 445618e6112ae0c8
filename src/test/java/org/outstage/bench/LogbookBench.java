package org.outstage.bench;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.io.Writer;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Comparator;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.TearDown;
import org.outstage.capture.WavWriter;
import org.outstage.cli.OutstageCommand;
import org.outstage.logbook.BiasAdvice;
import org.outstage.logbook.BiasAdvisor;
import org.outstage.logbook.BiasReading;
import org.outstage.logbook.BiasStep;
import org.outstage.logbook.Logbook;
import org.outstage.logbook.MeasurementRecord;
import org.outstage.logbook.Session;
import org.outstage.logbook.SessionData;
import org.outstage.logbook.SessionKind;
import org.outstage.logbook.UnitUnderTest;

/**
 * Logbook targets (brief): adding a step (analysis + write) for a 2 s capture under 200 ms; a logbook of
 * 10,000 steps opens and reads the series of a session in under 1 s.
 * Run: {@code tools/jmh LogbookBench} (or {@code mvn -B -o -Pbench verify -Djmh.include=LogbookBench}).
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class LogbookBench {
    private Path dir;
    private Path wav;
    private Path addDb;
    private String addSession;
    private Path bigDb;
    private long bigSession;

    @Setup(Level.Trial)
    public void setUp() throws Exception {
        // JLargeArrays' default pool has non-daemon threads that keep a forked JVM alive (toolchain.md P7)
        pl.edu.icm.jlargearrays.ConcurrencyUtils.setThreadPool(java.util.concurrent.Executors.newCachedThreadPool(r -> {
            Thread t = new Thread(r, "fft");
            t.setDaemon(true);
            return t;
        }));
        dir = Files.createTempDirectory("logbook-bench");
        // 2 s, 48 kHz, 24-bit: a 997 Hz sine at 0.5 FS with a small crossover bump and a -60 dBc third harmonic
        int fs = 48_000;
        double[] x = new double[2 * fs];
        for (int i = 0; i < x.length; i++) {
            double s = 0.5 * Math.sin(2 * Math.PI * 997 * i / fs);
            x[i] = s - 0.004 * 0.025 * Math.tanh(s / 0.025) + 1e-3 * 0.5 * Math.sin(3 * 2 * Math.PI * 997 * i / fs);
        }
        wav = dir.resolve("take_bias-20mV.wav");
        WavWriter.write(wav, fs, WavWriter.Encoding.PCM_24, false, x);
        addDb = dir.resolve("add.db");
        addSession = run("session", "start", "--unit", "DA-60 bench", "--logbook", addDb.toString()).trim();

        // one real measurement, then a 10,000-step session made of copies of it
        Path one = dir.resolve("one.db");
        String sid = run("session", "start", "--unit", "DA-60 bench", "--logbook", one.toString()).trim();
        run("session", "add", sid, "--bias-mv", "20", "--fs-volts", "40", "--load", "8", "--logbook", one.toString(), wav.toString());
        MeasurementRecord m;
        try (Logbook lb = Logbook.open(one)) {
            m = lb.biasSteps(Long.parseLong(sid)).get(0).measurement().orElseThrow();
        }
        List<BiasStep> steps = new ArrayList<>();
        Instant t0 = Instant.parse("2026-03-14T09:00:00Z");
        for (int i = 0; i < 10_000; i++) {
            steps.add(new BiasStep(i + 1, t0.plusSeconds(10L * i), BiasReading.millivolts(5 + (i % 500) * 0.1),
                    OptionalDouble.of(25 + (i % 300) * 0.1), OptionalDouble.of(22), 1, Optional.of(m)));
        }
        bigDb = dir.resolve("big.db");
        try (Logbook lb = Logbook.open(bigDb)) {
            Session s = new Session(0, "DA-60 bench", SessionKind.BIAS_ADJUSTMENT, t0, Optional.empty(), "10k steps");
            bigSession = lb.importSession(new SessionData(UnitUnderTest.named("DA-60 bench"), s, steps, List.of()));
        }
    }

    private static String run(String... args) {
        StringWriter out = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(out), new PrintWriter(Writer.nullWriter())).execute(args);
        if (code != 0) throw new IllegalStateException("exit " + code + " for " + String.join(" ", args));
        return out.toString();
    }

    /** The whole {@code session add} command: open the logbook, read and analyse the 2 s WAV, store it, commit the step, advise. */
    @Benchmark
    public String addStep() {
        return run("session", "add", addSession, "--bias-mv", "20", "--fs-volts", "40", "--load", "8", "--logbook", addDb.toString(),
                wav.toString());
    }

    /** Open the 10,000-step logbook, read the session's series (what a chart draws) and the advice. */
    @Benchmark
    public BiasAdvice openAndChart10k() {
        try (Logbook lb = Logbook.open(bigDb)) {
            return BiasAdvisor.recommendFromSeries(lb.stepSeries(bigSession));
        }
    }

    @TearDown(Level.Trial)
    public void tearDown() throws Exception {
        try (Stream<Path> s = Files.walk(dir)) {
            for (Path p : s.sorted(Comparator.reverseOrder()).toList()) Files.deleteIfExists(p);
        }
    }

    /** Quick manual timing without JMH. */
    public static void main(String[] args) throws Exception {
        LogbookBench b = new LogbookBench();
        b.setUp();
        for (int r = 0; r < 10; r++) {
            long t0 = System.nanoTime();
            b.addStep();
            long t1 = System.nanoTime();
            b.openAndChart10k();
            long t2 = System.nanoTime();
            System.out.printf("run %d: add step %.1f ms, open+chart 10k %.1f ms%n", r, (t1 - t0) / 1e6, (t2 - t1) / 1e6);
        }
        b.tearDown();
    }
}

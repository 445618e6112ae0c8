package org.outstage.live;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.DataInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalInt;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.stage.BiasVerdict;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.audio.JavaSoundBackend;
import org.outstage.audio.LineFormat;
import org.outstage.audio.SampleFormat;
import org.outstage.stimulus.Generator;
import org.outstage.stimulus.Stimulus;

/**
 * A device under test in software (toolchain notes, "A virtual soundcard for tests"): a stimulus thread plays a
 * 997 Hz sine into the {@code dut} null sink; the DUT thread reads {@code dut.monitor}, applies the stage model's
 * transfer curve at a set bias ({@link DutCurve}) and plays the result into {@code bench}; a {@link LiveSession}
 * captures {@code bench.monitor} (the default input). The readout must give the bias's crossover verdict and follow
 * a bias change within two blocks. PulseAudio's own clients (pacat, parec) carry the streams to the named sinks.
 */
class DeviceUnderTestLiveTest {
    private static final int RATE = 96_000;
    private final List<Process> processes = new ArrayList<>();
    private volatile boolean running = true;
    private volatile DutCurve curve;

    @BeforeEach
    void soundcard() { Soundcard.require(); }

    @AfterEach
    void stopAll() {
        running = false;
        for (Process p : processes) p.destroyForcibly();
    }

    private Process pa(String... cmd) throws IOException {
        Process p = new ProcessBuilder(cmd).redirectError(ProcessBuilder.Redirect.DISCARD).start();
        processes.add(p);
        return p;
    }

    private static String[] stream(String tool, String device) {
        return new String[] {tool, "--device=" + device, "--format=float32le", "--rate=" + RATE, "--channels=1", "--raw", "--latency-msec=100"};
    }

    private Thread daemon(String name, Runnable r) {
        Thread t = new Thread(() -> {
            try {
                r.run();
            } catch (RuntimeException e) {
                if (running) throw e;
            }
        }, name);
        t.setDaemon(true);
        t.start();
        return t;
    }

    private void startStimulusAndDut() throws IOException {
        Process toDut = pa(stream("pacat", "dut"));
        Process fromDut = pa(stream("parec", "dut.monitor"));
        Process toBench = pa(stream("pacat", "bench"));
        // −6 dBFS: 10 V peak into the model stage (DutCurve.VOLTS_PER_FS = 20), well inside its rails.
        Generator g = Generator.of(new Stimulus.Sine(997), RATE, -6, 1, true);
        daemon("stimulus", () -> pump(g, toDut.getOutputStream()));
        daemon("dut", () -> transform(fromDut.getInputStream(), toBench.getOutputStream()));
    }

    private void pump(Generator g, OutputStream out) {
        double[] x = new double[960];
        ByteBuffer b = ByteBuffer.allocate(960 * 4).order(ByteOrder.LITTLE_ENDIAN);
        try {
            while (running) {
                g.fill(x, 0, x.length);
                b.clear();
                for (double v : x) b.putFloat((float) v);
                out.write(b.array());
            }
        } catch (IOException e) {
            if (running) throw new java.io.UncheckedIOException(e);
        }
    }

    private void transform(InputStream in, OutputStream out) {
        byte[] buf = new byte[960 * 4];
        try (DataInputStream d = new DataInputStream(in)) {
            while (running) {
                d.readFully(buf);
                ByteBuffer b = ByteBuffer.wrap(buf).order(ByteOrder.LITTLE_ENDIAN);
                DutCurve c = curve;
                for (int i = 0; i < buf.length; i += 4) b.putFloat(i, (float) c.apply(b.getFloat(i)));
                out.write(buf);
            }
        } catch (IOException e) {
            if (running) throw new java.io.UncheckedIOException(e);
        }
    }

    private static BiasVerdict verdict(LiveResult r) {
        return r.measurements().get(0).stage() instanceof StageDiagnosis.Measured m ? m.crossover().verdict() : BiasVerdict.UNCLEAR;
    }

    @Test
    void liveReadout_givesTheBiasVerdict_andFollowsABiasChangeWithinTwoBlocks() throws Exception {
        curve = new DutCurve(0.001); // 1 mV: far below Oliver's ≈26 mV (docs/references.md §7): crossover notch
        startStimulusAndDut();
        LiveSettings s = LiveSettings.defaults()
                .withFormat(new LineFormat(RATE, SampleFormat.PCM_24, 2), SampleFormat.PCM_24)
                .withAnalysis(AnalysisSettings.defaults(), OptionalInt.of(1), OptionalInt.empty())
                .withBlocks(1.0, 1.0).withStimulus(Optional.empty(), -20, false);
        List<LiveResult> results = new CopyOnWriteArrayList<>();
        LiveSession session = new LiveSession(new JavaSoundBackend(), s, results::add).stopAfter(9);
        session.start();
        long end = System.nanoTime() + 20_000_000_000L;
        while (results.size() < 4 && System.nanoTime() < end) Thread.sleep(50);
        long switchedAfter = results.get(results.size() - 1).block(); // the newest analysed block when the bias changes
        curve = new DutCurve(DutCurve.OLIVER_VQ_VOLTS);
        assertTrue(session.awaitEnd(30, TimeUnit.SECONDS));
        List<String> seen = new ArrayList<>();
        for (LiveResult r : results)
            seen.add(String.format(java.util.Locale.ROOT, "%d:%s(THD+N %.1f dB)", r.block(), verdict(r).label(), r.measurements().get(0).thdN().db())
                    + (r.droppedFrames() > 0 ? "(lost " + r.droppedFrames() + ")" : ""));
        System.out.println("switched after block " + switchedAfter + ": " + seen);
        // Before the change: underbiased (blocks 1..switchedAfter; block 0 may start before the DUT's stream).
        long under = results.stream().filter(r -> r.block() >= 1 && r.block() <= switchedAfter && verdict(r) == BiasVerdict.UNDERBIASED).count();
        assertTrue(under >= switchedAfter - 1 && under >= 1, "underbiased before the change: " + seen);
        // After: the block being captured at the change, plus the one after it for the streams' latency, may be
        // mixed; the next one must read near-optimal ("within two blocks"), and no later block may read underbiased.
        // A later block may read "unclear" when the busy machine starved the pacat/parec streams and left a gap in
        // the DUT's output (no verdict rather than a guess, CrossoverMetrics); those are allowed but printed.
        long firstNear = results.stream().filter(r -> r.block() > switchedAfter && verdict(r) == BiasVerdict.NEAR_OPTIMAL)
                .mapToLong(LiveResult::block).min().orElse(Long.MAX_VALUE);
        assertTrue(firstNear <= switchedAfter + 3, "near-optimal within two blocks of the change: " + seen);
        for (LiveResult r : results)
            if (r.block() >= switchedAfter + 3) assertTrue(verdict(r) != BiasVerdict.UNDERBIASED, "block " + r.block() + " of " + seen);
    }
}

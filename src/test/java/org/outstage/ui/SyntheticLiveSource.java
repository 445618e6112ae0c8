package org.outstage.ui;

import java.util.List;
import java.util.Optional;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicReference;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.stage.PushPullTruth;
import org.outstage.analysis.stage.StageFixtures;
import org.outstage.capture.Capture;
import org.outstage.capture.SampleUnit;
import org.outstage.live.LiveListener;
import org.outstage.live.LiveResult;
import org.outstage.live.LiveSession;
import org.outstage.live.LiveSettings;

/**
 * A synthetic block series for the Live view, fed through the same {@link LiveListener} as a real
 * {@link LiveSession}: an invented class-AB stage whose bias trimmer turns up while it plays. The stage is the
 * complementary emitter-follower pair of exponential devices of the measurement-truth tests
 * ({@link PushPullTruth}: Re 0.22 Ω, 8 Ω load), its quiescent voltage across each emitter resistor rising from
 * 0.5 mV (deep crossover) to 30 mV (past the optimum, the onset of gm-doubling) over {@code turnSeconds}. Each block is
 * 0.5 s of a 997 Hz sine at the settings' level (dBFS peak of a 40 V full scale) with seeded noise, analysed by
 * {@link LiveSession#measure} (the live package's analysis). Blocks come {@code periodMillis} apart in wall time;
 * their time stamps are 0.5 s apart (input time). Used by the tests and the screenshot tool (no sound device there).
 */
final class SyntheticLiveSource implements LiveSource {
    static final double RATE_HZ = 48_000, BLOCK_SECONDS = 0.5, DEVICE_FULL_SCALE_VOLTS = 40;
    /** 997 Hz (AES17 practice): not locked to the sample rate, so the samples cover the crossing. */
    static final double TONE_HZ = 997;
    private final long periodMillis;
    private final double turnSeconds;
    private final int maxBlocks;
    final AtomicBoolean running = new AtomicBoolean();
    final AtomicReference<LiveSettings> startedWith = new AtomicReference<>();
    volatile int starts;

    SyntheticLiveSource(long periodMillis, double turnSeconds, int maxBlocks) {
        this.periodMillis = periodMillis;
        this.turnSeconds = turnSeconds;
        this.maxBlocks = maxBlocks;
    }

    @Override public List<String> inputDevices() { return List.of("synthetic bench (no sound device: generated blocks)"); }
    @Override public String noDeviceReason() { return ""; }

    /** One block: the invented stage at time {@code t} (s), in full-scale units. */
    static double[] block(double levelDbfs, double t, double turnSeconds, long seed) {
        double a = Math.pow(10, levelDbfs / 20) * DEVICE_FULL_SCALE_VOLTS;   // drive peak, volts
        double turned = (1 - Math.exp(-3 * Math.min(t, turnSeconds) / turnSeconds)) / (1 - Math.exp(-3));
        StageFixtures.Pair stage = PushPullTruth.biasedAt(0.0005 + (0.030 - 0.0005) * turned);
        int n = (int) (RATE_HZ * BLOCK_SECONDS);
        double[] y = PushPullTruth.drive(stage, n, RATE_HZ, TONE_HZ, a, 2 * Math.PI * TONE_HZ * t - Math.PI / 2);
        java.util.Random r = new java.util.Random(seed);
        for (int i = 0; i < n; i++) y[i] = y[i] / DEVICE_FULL_SCALE_VOLTS + 2e-6 * r.nextGaussian();
        return y;
    }

    @Override
    public Running start(LiveSettings settings, LiveListener listener) {
        startedWith.set(settings);
        starts++;
        running.set(true);
        AtomicReference<LiveResult> last = new AtomicReference<>();
        double level = settings.levelDbfs();
        AtomicReference<Double> levelNow = new AtomicReference<>(level);
        Thread th = new Thread(() -> {
            listener.onStarted(inputDevices().get(0), "synthetic", 0);
            for (int b = 0; b < maxBlocks && running.get(); b++) {
                double t = b * BLOCK_SECONDS;
                Capture c = Capture.inMemory("live block " + b, RATE_HZ, SampleUnit.FULL_SCALE, block(levelNow.get(), t, turnSeconds, 100 + b));
                if (settings.fullScaleVolts().isPresent()) c = c.calibrated(settings.fullScaleVolts().getAsDouble(), SampleUnit.VOLTS);
                List<Measurement> m = LiveSession.measure(c, settings);
                LiveResult r = new LiveResult(b, t + BLOCK_SECONDS, 0, 0, 0, m, c, 0, 0);
                last.set(r);
                if (!running.get()) break;
                listener.onBlock(r);
                try { Thread.sleep(periodMillis); } catch (InterruptedException e) { return; }
            }
        }, "synthetic-live");
        th.setDaemon(true);
        th.start();
        return new Running() {
            @Override public void stop() { running.set(false); }
            @Override public void setLevelDbfs(double l) { levelNow.set(l); }
            @Override public Optional<LiveResult> last() { return Optional.ofNullable(last.get()); }
        };
    }
}

package org.outstage.ui;

import java.util.List;
import java.util.Optional;
import java.util.concurrent.atomic.AtomicBoolean;
import java.util.concurrent.atomic.AtomicReference;
import org.outstage.analysis.Measurement;
import org.outstage.capture.Capture;
import org.outstage.capture.SampleUnit;
import org.outstage.live.LiveListener;
import org.outstage.live.LiveResult;
import org.outstage.live.LiveSession;
import org.outstage.live.LiveSettings;

/**
 * A synthetic block series for the Live view, fed through the same {@link LiveListener} as a real
 * {@link LiveSession}: an invented class-AB stage whose bias trimmer turns up while it plays. Each block is 0.5 s
 * of a 1 kHz sine at the settings' level (dBFS peak) through a crossover dead band that narrows from 30 mV to
 * about 1 mV (in full-scale units × 40 V) over {@code turnSeconds}, with seeded noise, and is analysed by
 * {@link LiveSession#measure} (the live package's analysis). Blocks come {@code periodMillis} apart in wall time;
 * their time stamps are 0.5 s apart (input time). Used by the tests and the screenshot tool (no sound device there).
 */
final class SyntheticLiveSource implements LiveSource {
    static final double RATE_HZ = 48_000, BLOCK_SECONDS = 0.5, DEVICE_FULL_SCALE_VOLTS = 40;
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
        double a = Math.pow(10, levelDbfs / 20);
        double dead = (0.030 * Math.exp(-3 * Math.min(t, turnSeconds) / turnSeconds) + 0.001) / DEVICE_FULL_SCALE_VOLTS;
        int n = (int) (RATE_HZ * BLOCK_SECONDS);
        double[] x = new double[n];
        java.util.Random r = new java.util.Random(seed);
        for (int i = 0; i < n; i++) {
            double s = a * Math.sin(2 * Math.PI * 1000 * (t + i / RATE_HZ));
            x[i] = s - dead * Math.tanh(s / dead) + 2e-6 * r.nextGaussian();
        }
        return x;
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

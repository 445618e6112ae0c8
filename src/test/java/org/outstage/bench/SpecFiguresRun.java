package org.outstage.bench;

import java.util.Locale;
import org.outstage.analysis.Band;
import org.outstage.analysis.FrequencyResponse;
import org.outstage.analysis.SweepResponse;

/**
 * Speed runner for issue 12 (not a unit test; surefire skips *Run): a 10 s, 96 kHz exponential sweep (2 Hz–46 kHz)
 * with a reference channel through {@link SweepResponse}, timed warm (after 5 runs), median of 15.
 * Run: {@code java -cp target/classes:target/test-classes:$(deps) org.outstage.bench.SpecFiguresRun}.
 */
public final class SpecFiguresRun {
    public static void main(String[] args) {
        double fs = 96000, t = 10;
        int n = (int) (fs * t);
        double l = Math.log(46000 / 2.0);
        double[] x = new double[n], y = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = 0.5 * Math.sin(2 * Math.PI * 2 * t / l * (Math.exp(i / fs * l / t) - 1));
            y[i] = x[i] + 0.01 * x[i] * x[i];
        }
        long[] ms = new long[15];
        for (int r = 0; r < 5; r++) SweepResponse.measure(y, x, fs, true, Band.AUDIO_20_20K);
        FrequencyResponse last = null;
        for (int r = 0; r < ms.length; r++) {
            long t0 = System.nanoTime();
            last = SweepResponse.measure(y, x, fs, true, Band.AUDIO_20_20K);
            ms[r] = (System.nanoTime() - t0) / 1_000_000;
        }
        java.util.Arrays.sort(ms);
        System.out.printf(Locale.ROOT, "10 s 96 kHz sweep: median %d ms, min %d ms, max %d ms (%d points, %d THD points)%n",
                ms[ms.length / 2], ms[0], ms[ms.length - 1], last.points().size(), last.thdVsFrequency().size());
    }
}

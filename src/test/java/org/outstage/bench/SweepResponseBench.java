package org.outstage.bench;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.outstage.analysis.Band;
import org.outstage.analysis.FrequencyResponse;
import org.outstage.analysis.SweepResponse;

/**
 * Issue 12 target: a 10 s, 96 kHz exponential sweep (2 Hz–46 kHz) with a reference channel through
 * {@link SweepResponse#measure}, warm, under 300 ms. The record is the one {@link SpecFiguresRun} times
 * (y = x + 0.01·x², so the THD-against-frequency path runs too).
 * Run: {@code tools/jmh SweepResponseBench}, or without the exec plugin
 * {@code java -cp target/test-classes:target/classes:$(deps) org.openjdk.jmh.Main -f 1 -wi 3 -i 5 -w 2s -r 2s SweepResponseBench}.
 * Figures: docs/methods.md §7e.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class SweepResponseBench {
    private double[] x;
    private double[] y;

    @Setup
    public void setUp() {
        double fs = 96000, t = 10;
        int n = (int) (fs * t);
        double l = Math.log(46000 / 2.0);
        x = new double[n];
        y = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = 0.5 * Math.sin(2 * Math.PI * 2 * t / l * (Math.exp(i / fs * l / t) - 1));
            y[i] = x[i] + 0.01 * x[i] * x[i];
        }
    }

    @Benchmark
    public FrequencyResponse measure() {
        return SweepResponse.measure(y, x, 96000, true, Band.AUDIO_20_20K);
    }
}

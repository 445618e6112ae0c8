package org.outstage.bench;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Measurement;
import org.outstage.capture.Capture;
import org.outstage.capture.SampleUnit;

/**
 * Warm in-process analysis of a 10 s, 96 kHz, 24-bit-quantised mono capture of a 997 Hz sine at −1 dBFS
 * with a −80 dBc third harmonic. Target: under 100 ms per analysis (brief).
 * Run: {@code mvn -B -o -Pbench verify -Djmh.include=AnalyzerBench}, or, where the exec plugin is not in the
 * local repository, {@code java -cp target/test-classes:target/classes:<jmh-core, jopt-simple, JTransforms,
 * JLargeArrays, commons-math3 jars> org.openjdk.jmh.Main -f 1 -wi 3 -i 5 -w 1s -r 1s AnalyzerBench}.
 *
 * <p>Measured 2026-12-01 on the shared 2-core build machine (load average about 7, JDK 17, -Xmx256m,
 * 1 fork, 3 × 1 s warm-up, 5 × 1 s): 67.6 ± 3.0 ms per analysis, stage diagnosis included.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class AnalyzerBench {
    private Capture capture;

    @Setup
    public void setUp() {
        capture = Capture.inMemory("bench-10s-96k-24bit", 96000, SampleUnit.FULL_SCALE, record());
    }

    public static double[] record() {
        double fs = 96000, f = 997, a = Math.pow(10, -1 / 20.0), h3 = Math.pow(10, -80 / 20.0);
        double q = Math.pow(2, 23);
        double[] y = new double[(int) (10 * fs)];
        for (int i = 0; i < y.length; i++) {
            double t = 2 * Math.PI * f * i / fs;
            y[i] = Math.rint((a * Math.sin(t) + a * h3 * Math.sin(3 * t)) * q) / q;
        }
        return y;
    }

    @Benchmark
    public Measurement analyze() {
        return Analyzer.analyze(capture, 0, AnalysisSettings.DEFAULT);
    }

    /** Quick manual timing without JMH: {@code java -cp ... org.outstage.bench.AnalyzerBench}. */
    public static void main(String[] args) {
        AnalyzerBench b = new AnalyzerBench();
        b.setUp();
        Measurement m = null;
        for (int r = 0; r < 15; r++) {
            long t0 = System.nanoTime();
            m = b.analyze();
            System.out.printf("run %d: %.1f ms%n", r, (System.nanoTime() - t0) / 1e6);
        }
        System.out.println(m.fundamental() + " H3 " + m.harmonics().get(1).dbc() + " dBc, THD+N " + m.thdN().db() + " dB, floor " + m.floor());
    }
}

package org.outstage.bench;

import java.util.Random;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.SineFitter;
import org.outstage.analysis.stage.StageAnalyzer;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.analysis.stage.StageSettings;

/**
 * Warm in-process stage diagnosis (signal checks, residual, transfer curve, clipping, crossover) of a 10 s,
 * 96 kHz capture: a 997 Hz, 20 V peak sine through a ±50 mV dead zone (a crossover notch), white noise 100 dB
 * below the signal and 24-bit rounding over ±40 V. The sine fit is done once in setup (the diagnosis takes it
 * as input). Target: under 100 ms per diagnosis (brief).
 * Run: {@code mvn -B -o -Pbench verify -Djmh.include=StageBench}.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class StageBench {
    static final double FS = 96000;
    private double[] samples;
    private SineFit fit;
    private double[] reference;
    private SineFit fitRef;

    @Setup
    public void setUp() {
        int n = (int) (10 * FS);
        samples = new double[n];
        reference = new double[n];
        Random rnd = new Random(42);
        double q = 40 / Math.pow(2, 23), noise = 20 / Math.sqrt(2) * 1e-5;
        for (int i = 0; i < n; i++) {
            double v = 20 * Math.cos(2 * Math.PI * 997 * i / FS + 0.3);
            double dz = Math.abs(v) <= 0.05 ? 0 : v - Math.copySign(0.05, v);
            samples[i] = Math.rint((dz + noise * rnd.nextGaussian()) / q) * q;
            reference[i] = Math.cos(2 * Math.PI * 997 * (i + 0.37) / FS + 0.3);
        }
        fit = SineFitter.fit(samples, FS);
        fitRef = fit;
    }

    @Benchmark
    public StageDiagnosis diagnose() {
        return StageAnalyzer.diagnose(samples, FS, fit, StageSettings.defaults());
    }

    @Benchmark
    public StageDiagnosis diagnoseWithReference() {
        return StageAnalyzer.diagnose(samples, reference, FS, fitRef, StageSettings.defaults());
    }

    /** Quick manual timing without JMH. */
    public static void main(String[] args) {
        StageBench b = new StageBench();
        b.setUp();
        StageDiagnosis d = null;
        for (int r = 0; r < 15; r++) {
            long t0 = System.nanoTime();
            d = b.diagnose();
            long t1 = System.nanoTime();
            b.diagnoseWithReference();
            System.out.printf("run %d: %.1f ms, with reference %.1f ms%n", r, (t1 - t0) / 1e6, (System.nanoTime() - t1) / 1e6);
        }
        System.out.println(d);
    }
}

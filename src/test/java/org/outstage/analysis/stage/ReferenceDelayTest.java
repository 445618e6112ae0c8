package org.outstage.analysis.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.SineFitter;

/**
 * Reference-channel delay beyond a quarter period. The generator channel is a 997 Hz sine plus broadband generator
 * noise (a seeded sum of 300 sinusoids at random frequencies, so it can be delayed exactly by evaluating it at t − D);
 * the output is the Oliver-biased exponential pair driven by that signal delayed by D, plus its own seeded noise.
 * Oracle: the delay D and the sign put into the capture (construction).
 */
class ReferenceDelayTest {
    static final double FS = 48000, F = 997, T = FS / F; // period in samples
    static final int N = 24000;                          // 0.5 s

    /** Generator signal at sample times i − delay: 5·cos(2πF t + 0.2) + noise of RMS 5e-4 (−80 dB re the tone's RMS·√2). */
    static double[] generator(double delaySamples, long seed) {
        Random rnd = new Random(seed);
        int k = 300;
        double[] w = new double[k], ph = new double[k];
        for (int j = 0; j < k; j++) {
            w[j] = 2 * Math.PI * (30 + rnd.nextDouble() * (0.45 * FS - 30)) / FS;
            ph[j] = 2 * Math.PI * rnd.nextDouble();
        }
        double amp = 5e-4 * Math.sqrt(2.0 / k);
        double[] x = new double[N];
        for (int i = 0; i < N; i++) {
            double t = i - delaySamples;
            double v = 5 * Math.cos(2 * Math.PI * F * t / FS + 0.2);
            for (int j = 0; j < k; j++) v += amp * Math.cos(w[j] * t + ph[j]);
            x[i] = v;
        }
        return x;
    }

    /** Output = sign·pair(g·generator(t − D)) + amplifier noise (RMS 1e-4 V), 24-bit over ±40 V. */
    static double[] output(double delaySamples, int sign, long seed) {
        StageFixtures.Pair pair = StageFixtures.Pair.of(StageFixtures.oliverAmps());
        double[] g = generator(delaySamples, seed);
        double[] y = new double[N];
        for (int i = 0; i < N; i++) y[i] = sign * pair.out(3.2 * g[i]);
        return StageFixtures.quantise(StageFixtures.noisy(y, 1e-4, seed + 1), 40, 24);
    }

    static ReferenceAlignment align(double delaySamples, int sign, long seed) {
        double[] ref = StageFixtures.quantise(generator(0, seed), 10, 24);
        double[] out = output(delaySamples, sign, seed);
        return StageAnalyzer.align(out, ref, FS, SineFitter.fit(out, FS));
    }

    @Test
    void delayBeyondQuarterPeriod_readAsDelayNotInversion() {
        for (double frac : new double[] {0.3, 0.7, 1.3}) {
            double d = frac * T;
            ReferenceAlignment al = align(d, +1, 40 + (long) (10 * frac));
            assertTrue(al.resolvedByCorrelation(), "broadband evidence at " + frac + " T: " + al);
            assertFalse(al.inverting(), frac + " T must not read as inverting: " + al);
            assertEquals(d, al.delaySamples(), 0.01, frac + " T (construction)");
            assertEquals(d, al.correlationDelaySamples(), 0.25, "broadband peak at " + frac + " T (construction)");
            assertEquals(3.2 * 0.9731, al.gain(), 0.01 * 3.2, "gain ≈ g·RL/(RL + Re) at Oliver bias (docs/references.md §7)");
        }
    }

    @Test
    void invertingAmplifierWithShortDelay_stillReadsInverting() {
        for (double d : new double[] {0.37, 0.2 * T}) {
            ReferenceAlignment al = align(d, -1, 77);
            assertTrue(al.resolvedByCorrelation(), al.toString());
            assertTrue(al.inverting(), "inverting at delay " + d + ": " + al);
            assertEquals(d, al.delaySamples(), 0.01, "construction");
        }
    }

    /** The X-Y diagnosis with a 0.7 T delay: aligned onto the output, no hysteresis, gain at zero of the Oliver pair. */
    @Test
    void delayedReference_diagnosisAlignsAndReadsTheStage() {
        double d = 0.7 * T;
        double[] ref = StageFixtures.quantise(generator(0, 5), 10, 24);
        double[] out = output(d, +1, 5);
        SineFit fit = SineFitter.fit(out, FS);
        StageDiagnosis.Measured m = assertInstanceOf(StageDiagnosis.Measured.class,
                StageAnalyzer.diagnose(out, ref, FS, fit, StageSettings.defaults()));
        assertEquals(d, m.reference().orElseThrow().delaySamples(), 0.01);
        assertFalse(m.transfer().hysteresis().detected(), m.transfer().hysteresis().toString());
        StageFixtures.Pair pair = StageFixtures.Pair.of(StageFixtures.oliverAmps());
        // truth: implicit differentiation of the pair (docs/references.md §7); σ covers noise and resolution
        double truth = PushPullTruth.gainAtZero(pair, 3.2 * 5);
        assertEquals(truth, m.crossover().gainAtZero(), 3 * m.crossover().gainAtZeroStdError() + 1e-3);
    }

    /** A purely periodic capture carries no evidence beyond the phase: the ±90° reading is kept and said so. */
    @Test
    void purelyPeriodicCapture_noCorrelationEvidence_phaseRuleKept() {
        double[] ref = StageFixtures.drive(N, FS, F, 1, 0.2, v -> v);
        double[] out = StageFixtures.drive(N, FS, F, 1, 0.2 - 2 * Math.PI * 0.7, v -> 3 * v); // delayed by 0.7 T
        ReferenceAlignment al = StageAnalyzer.align(out, ref, FS, SineFitter.fit(out, FS));
        assertFalse(al.resolvedByCorrelation(), al.toString());
        // 0.7 T of a steady sine is indistinguishable from inversion plus 0.2 T
        assertTrue(al.inverting());
        assertEquals(0.2 * T, al.delaySamples(), 1e-6);
    }
}

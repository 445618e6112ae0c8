package org.outstage.analysis.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import java.util.function.DoubleUnaryOperator;
import org.junit.jupiter.api.Test;

class AdaptiveSlopeTest {
    /** x = sin of seeded uniform phases (the ideal output of a tone sampled at unrelated instants), y = law(x) + noise. */
    static double[][] samples(int n, DoubleUnaryOperator law, double noise, long seed) {
        Random rnd = new Random(seed);
        double[] x = new double[n], y = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = Math.sin(2 * Math.PI * rnd.nextDouble());
            y[i] = law.applyAsDouble(x[i]) + noise * rnd.nextGaussian();
        }
        return new double[][] {x, y};
    }

    /** A cubic is fitted exactly by a local cubic: slope at 0 is the linear coefficient (calculus), every window agrees. */
    @Test
    void cubicLaw_slopeExact_widestWindowKept() {
        double[][] s = samples(200_000, v -> 0.9 * v + 0.3 * v * v - 0.2 * v * v * v, 0, 1);
        AdaptiveSlope.Estimate e = AdaptiveSlope.at(s[0], s[1], 0, 0.1, 1e-9).orElseThrow();
        assertEquals(0.9, e.slope(), 1e-9);
        assertEquals(0.1, e.bandwidth(), 1e-12, "all windows agree: the widest is kept");
    }

    /**
     * Narrow notch y = x·(1 − 0.5·exp(−x²/2w²)), w = 0.005: dy/dx at 0 = 0.5 exactly (calculus). A fixed window of
     * ±0.1 would read nearly 1; the adaptive window shrinks to the notch and its σ covers the error.
     */
    @Test
    void narrowNotch_windowShrinks_slopeWithinThreeSigma() {
        double w = 0.005;
        double[][] s = samples(400_000, v -> v * (1 - 0.5 * Math.exp(-v * v / (2 * w * w))), 1e-6, 2);
        AdaptiveSlope.Estimate e = AdaptiveSlope.at(s[0], s[1], 0, 0.1, 1e-6).orElseThrow();
        double se = Math.sqrt(e.totalVariance());
        assertEquals(0.5, e.slope(), Math.max(3 * se, 1e-9), "σ " + se + " window " + e.bandwidth());
        assertTrue(e.bandwidth() < 5 * w, "window " + e.bandwidth() + " against a notch of width " + w);
        assertTrue(Math.abs(e.slope() - 0.5) < 0.02, "issue 10 target 0.02");
    }

    /** The value of d = y − x: a cubic is fitted exactly (calculus: d(0.03) = 0.3·0.03² − 0.2·0.03³ − 0.1·0.03). */
    @Test
    void valueAt_cubicLaw_valueExact_widestWindowKept() {
        double[][] s = samples(200_000, v -> 0.9 * v + 0.3 * v * v - 0.2 * v * v * v, 0, 3);
        AdaptiveSlope.ValueEstimate e = AdaptiveSlope.valueAt(s[0], s[1], 0.03, 0.1, 1e-9).orElseThrow();
        double x0 = 0.03;
        assertEquals(0.3 * x0 * x0 - 0.2 * x0 * x0 * x0 - 0.1 * x0, e.value(), 1e-12);
        assertEquals(0.1, e.bandwidth(), 1e-12, "all windows agree: the widest is kept");
    }

    /**
     * Narrow dip y = x − 0.01·exp(−x²/2w²), w = 0.005: d(0) = −0.01 exactly. A cubic over a fixed window of ±0.1 cannot
     * follow a dip 20 times narrower; the window chosen on the value shrinks to the dip and its σ covers the error.
     */
    @Test
    void valueAt_narrowDip_windowShrinks_valueWithinThreeSigma() {
        double w = 0.005;
        double[][] s = samples(400_000, v -> v - 0.01 * Math.exp(-v * v / (2 * w * w)), 1e-6, 4);
        AdaptiveSlope.ValueEstimate e = AdaptiveSlope.valueAt(s[0], s[1], 0, 0.1, 1e-6).orElseThrow();
        double se = Math.sqrt(e.totalVariance());
        assertEquals(-0.01, e.value(), Math.max(3 * se, 1e-9), "σ " + se + " window " + e.bandwidth());
        assertTrue(e.bandwidth() < 5 * w, "window " + e.bandwidth() + " against a dip of width " + w);
        assertTrue(Math.abs(e.value() + 0.01) < 1e-4, "error " + (e.value() + 0.01));
    }

    /** Too few distinct samples near the point: no estimate rather than a guess. */
    @Test
    void tooFewSamples_empty() {
        double[] x = {0.5, 0.6, 0.7}, y = {0.5, 0.6, 0.7};
        assertTrue(AdaptiveSlope.at(x, y, 0, 0.1, 1e-6).isEmpty());
    }
}

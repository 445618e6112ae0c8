package org.outstage.analysis.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.SineFitter;

class StageAnalyzerTest {
    static final double FS = 48000, F = 997;
    static final int N = 96000; // 2 s

    static StageDiagnosis.Measured measured(double[] y) {
        SineFit fit = SineFitter.fit(y, FS);
        StageDiagnosis d = StageAnalyzer.diagnose(y, FS, fit, StageSettings.defaults());
        if (d instanceof StageDiagnosis.NotMeasured nm) throw new AssertionError("not measured: " + nm.reason());
        return (StageDiagnosis.Measured) d;
    }

    /**
     * Dead zone ±d: output = input − clip(input, ±d), so its fundamental is A − b1(clip at d) with b1 from
     * docs/references.md §6.2. Against the ideal (that fundamental), the largest deviation is at the notch edge:
     * d·b1dz/A; the gain is 0 inside |x| &lt; d·b1dz/A, so the notch is 2·d·b1dz/A wide.
     */
    @Test
    void deadZone_notchWidthAndDepthMatchClosedForm_verdictUnderbiased() {
        double a = 10, d = 0.5;
        double[] y = StageFixtures.drive(N, FS, F, a, 0.4, v -> StageFixtures.deadZone(v, d));
        double th = Math.asin(d / a);
        double b1dz = a - (2 * a / Math.PI) * (th + Math.sin(th) * Math.cos(th)); // §6.2
        StageDiagnosis.Measured m = measured(y);
        assertEquals(b1dz, m.transfer().peakVolts(), 1e-6 * a, "fundamental of a dead zone (§6.2 complement)");
        CrossoverMetrics c = m.crossover();
        assertEquals(BiasVerdict.UNDERBIASED, c.verdict(), c.explanation());
        assertEquals(0, c.incrementalGainAtZero(), 0.02);
        double depth = d * b1dz / a;
        double bin = 2 * b1dz / 256;
        assertEquals(depth, c.notchDepthVolts(), bin, "notch depth within one bin width");
        // width: the smoothing window (±4 bins) blurs each edge by at most its half width plus one bin
        assertEquals(2 * depth, c.notchWidthVolts(), 2 * 5 * bin, "notch width within the smoothing resolution");
        assertTrue(c.nearZeroResidualShare() > 3 * c.nearZeroTimeShare(), "residual energy concentrates at the crossings");
        assertFalse(m.clipping().detected());
        assertFalse(m.transfer().hysteresis().detected());
    }

    /** gain_at_zero of the exponential-law pair against its small-signal analysis (docs/references.md §7). */
    @Test
    void exponentialPair_gainAtZeroMatchesSmallSignalAnalysis() {
        double a = 18;
        for (double mult : new double[] {0.5, 1.0, 2.0}) {
            StageFixtures.Pair pair = StageFixtures.Pair.of(mult * StageFixtures.oliverAmps());
            double[] y = StageFixtures.drive(N, FS, F, a, 0.1, pair::out);
            StageDiagnosis.Measured m = measured(y);
            double truth = pair.gainAtZeroRatio(a);
            assertEquals(truth, m.crossover().gainAtZero(), 2e-4 * truth, "Iq = " + mult + "× Oliver");
            BiasVerdict expected = mult < 1 ? BiasVerdict.UNDERBIASED : mult > 1 ? BiasVerdict.OVERBIASED : BiasVerdict.NEAR_OPTIMAL;
            assertEquals(expected, m.crossover().verdict(), m.crossover().explanation());
        }
    }

    /**
     * Level independence of the verdict. At Oliver's condition (Iq·Re = VT; Oliver, HP Journal 1971, from memory —
     * docs/references.md §7) the small-signal gain at zero, RL/(RL + (Re + VT/Iq)/2), equals the large-current asymptote
     * RL/(RL + Re) exactly, at every level. The stated gain_at_zero (against the outer-swing mean) reads higher at
     * lower levels, where VT/I still adds over the outer swing; the verdict's ratio against the asymptote must not.
     */
    @Test
    void oliverBiasedPair_verdictRatioIsOneAtEveryLevel_whileGainAtZeroDrifts() {
        StageFixtures.Pair pair = StageFixtures.Pair.of(StageFixtures.oliverAmps());
        double asymptote = 8.0 / (8.0 + 0.22);                       // RL/(RL + Re)
        double atZero = 8.0 / (8.0 + (0.22 + StageFixtures.VT_300K / StageFixtures.oliverAmps()) / 2);
        assertEquals(1.0, atZero / asymptote, 1e-12, "Oliver's condition in closed form");
        double previousDefined = Double.NaN;
        for (double a : new double[] {30, 18, 9}) {                 // about 56 W, 20 W and 5 W into 8 ohm
            double[] y = StageFixtures.drive(N, FS, F, a, 0.3, pair::out);
            StageDiagnosis.Measured m = measured(y);
            // the one-device law 1/g = a + b/|v| neglects the idle device's current at half the swing: at 9 V peak
            // (4.8× Iq there) that leaves 0.07 %; the bound is a third of the ±0.3 % near-optimal band
            assertEquals(1.0, m.crossover().verdictRatio(), 1e-3, "peak " + a + " V: " + m.crossover().explanation());
            assertTrue(Math.abs(m.crossover().verdictRatio() - 1) < 0.25 * Math.abs(m.crossover().gainAtZero() - 1),
                    "the asymptote removes most of the level error: " + m.crossover().verdictRatio() + " vs " + m.crossover().gainAtZero());
            assertEquals(BiasVerdict.NEAR_OPTIMAL, m.crossover().verdict(), m.crossover().explanation());
            if (!Double.isNaN(previousDefined)) assertTrue(m.crossover().gainAtZero() > previousDefined, "the stated ratio rises as the level falls");
            previousDefined = m.crossover().gainAtZero();
        }
        assertTrue(previousDefined > 1.003, "at 9 V peak the stated ratio alone would read gm-doubling: " + previousDefined);
    }

    /**
     * Target: gain_at_zero within 1 % of truth at 24-bit quantisation (±40 V full scale) with white noise
     * 100 dB below the signal RMS (Oliver-biased pair, 20 V peak drive).
     */
    @Test
    void exponentialPair_24bitNoiseMinus100dB_gainAtZeroWithinOnePercent() {
        double a = 20;
        StageFixtures.Pair pair = StageFixtures.Pair.of(StageFixtures.oliverAmps());
        double[] clean = StageFixtures.drive(N, FS, F, a, 1.0, pair::out);
        double sigRms = a * pair.gainAtZero() / Math.sqrt(2);
        double[] y = StageFixtures.quantise(StageFixtures.noisy(clean, sigRms * 1e-5, 7), 40, 24);
        StageDiagnosis.Measured m = measured(y);
        double truth = pair.gainAtZeroRatio(a);
        assertEquals(truth, m.crossover().gainAtZero(), 0.01 * truth);
        assertTrue(m.crossover().gainAtZeroStdError() < 0.01, "σ " + m.crossover().gainAtZeroStdError());
    }

    /** gm-doubling bump y = x·(1 + ε·exp(−x²/2w²)): dy/dx at 0 is 1 + ε exactly (calculus). */
    @Test
    void gmDoublingBump_gainAtZeroAboveOneByKnownAmount() {
        double a = 10, eps = 0.01, w = 1.0;
        java.util.function.DoubleUnaryOperator law = v -> v * (1 + eps * Math.exp(-v * v / (2 * w * w)));
        double[] y = StageFixtures.drive(N, FS, F, a, 0.2, law);
        StageDiagnosis.Measured m = measured(y);
        double outer = ((law.applyAsDouble(0.9 * a) - law.applyAsDouble(0.5 * a)) * 2) / (0.8 * a);
        double truth = (1 + eps) / outer;
        assertEquals(truth, m.crossover().gainAtZero(), 2e-4);
        assertEquals(BiasVerdict.OVERBIASED, m.crossover().verdict());
    }

    /** Symmetric hard clip at ±0.7A (docs/references.md §6.2): levels, fundamental, time on each rail. */
    @Test
    void symmetricHardClip_levelsAndFundamentalMatchFourierSeries() {
        double a = 10, l = 7;
        double[] y = StageFixtures.drive(N, FS, F, a, 0.3, v -> StageFixtures.clip(v, -l, l));
        SineFit fit = SineFitter.fit(y, FS);
        assertEquals(0.811880 * a, fit.amplitudePeak(), 1e-5 * a, "b1 at L/A = 0.7, §6.2 table");
        StageDiagnosis.Measured m = measured(y);
        ClippingMetrics c = m.clipping();
        assertTrue(c.detected());
        assertEquals(l, c.positive().orElseThrow().levelVolts(), 0.005 * l);
        assertEquals(-l, c.negative().orElseThrow().levelVolts(), 0.005 * l);
        assertEquals(0, c.asymmetryPercent().orElseThrow(), 0.05);
        assertEquals(ClippingMetrics.FirstSide.BOTH, c.clipsFirst());
        double th = Math.asin(l / a);
        assertEquals((Math.PI - 2 * th) / (2 * Math.PI), c.positive().get().fractionOfCycle(), 0.002, "time above L of a sine");
        assertEquals(ClipSide.Knee.HARD, c.positive().get().knee());
        assertEquals(0, c.positive().get().recoveryTimeSeconds(), 1.0 / FS);
        // onset: the ideal (fundamental b1·cos) reaches the rail when the drive reaches L, i.e. at b1·L/A
        assertEquals(fit.amplitudePeak() * l / a, c.positive().get().onsetIdealVolts(), 0.01 * l);
        assertEquals(BiasVerdict.UNCLEAR, m.crossover().verdict(), "clipping reaches the outer swing");
    }

    /** Two-sided asymmetric clip at +0.8A / −0.9A: asymmetry = 100·(8 − 9)/8.5 (definition), positive first. */
    @Test
    void asymmetricClip_asymmetryPercentExactFromLevels() {
        double a = 10;
        double[] y = StageFixtures.quantise(StageFixtures.drive(N, FS, F, a, 0.3, v -> StageFixtures.clip(v, -9, 8)), 40, 24);
        ClippingMetrics c = measured(y).clipping();
        assertEquals(8, c.positive().orElseThrow().levelVolts(), 0.005 * 8);
        assertEquals(-9, c.negative().orElseThrow().levelVolts(), 0.005 * 9);
        assertEquals(100 * (8 - 9) / 8.5, c.asymmetryPercent().orElseThrow(), 0.05);
        assertEquals(ClippingMetrics.FirstSide.POSITIVE, c.clipsFirst());
    }

    /** One-sided clip at +0.7A (docs/references.md §6.3): fit DC and fundamental, only the positive side clips. */
    @Test
    void oneSidedClip_fitMatchesSection63_andOnlyPositiveClips() {
        double a = 1;
        double[] y = StageFixtures.drive(N, FS, F, a, 0.3, v -> Math.min(v, 0.7));
        SineFit fit = SineFitter.fit(y, FS);
        assertEquals(-0.050090, fit.dcOffset(), 2e-5, "§6.3 DC at L = 0.7A");
        assertEquals(0.905940, fit.amplitudePeak(), 2e-5, "§6.3 fundamental at L = 0.7A");
        ClippingMetrics c = measured(y).clipping();
        assertEquals(0.7, c.positive().orElseThrow().levelVolts(), 0.0035);
        assertTrue(c.negative().isEmpty());
        assertTrue(c.asymmetryPercent().isEmpty());
        assertEquals(ClippingMetrics.FirstSide.POSITIVE, c.clipsFirst());
    }

    /** tanh soft clip has a soft knee; a hard clip of the same level a hard one. */
    @Test
    void tanhSoftClip_kneeSoft_hardClipKneeHard() {
        double a = 10, l = 6;
        double[] soft = StageFixtures.drive(N, FS, F, a, 0.3, v -> l * Math.tanh(2 * v / l));
        double[] hard = StageFixtures.drive(N, FS, F, a, 0.3, v -> StageFixtures.clip(v, -l, l));
        ClippingMetrics s = measured(soft).clipping(), h = measured(hard).clipping();
        assertTrue(s.detected());
        assertEquals(ClipSide.Knee.SOFT, s.positive().orElseThrow().knee());
        assertEquals(ClipSide.Knee.HARD, h.positive().orElseThrow().knee());
    }

    /**
     * Rail sticking: the output stays on the rail 12 samples after a static clipper would leave it (197 Hz, so
     * the waveform is back on its static track before it falls to 20 % of the level, where the reference
     * instant is taken).
     */
    @Test
    void railSticking_recoveryTimeMatchesHold() {
        double a = 10, l = 8, f = 197;
        int hold = 12;
        double[] y = StageFixtures.drive(N, FS, f, a, 0.3, v -> StageFixtures.clip(v, -l, l));
        for (int i = 1; i < N; i++) {
            if (y[i - 1] == l && y[i] < l) { // leaving the positive rail: stay 'hold' samples longer
                for (int k = 0; k < hold && i + k < N; k++) y[i + k] = l;
                i += hold;
            }
        }
        ClippingMetrics c = measured(y).clipping();
        assertEquals(hold / FS, c.positive().orElseThrow().recoveryTimeSeconds(), 1.0 / FS);
        assertEquals(0, c.negative().orElseThrow().recoveryTimeSeconds(), 1.0 / FS);
    }

    /** Backlash y = x + δ·sign(dx/dt): a memory loop → hysteresis detected, verdict unclear. */
    @Test
    void backlash_hysteresisDetected_verdictUnclear() {
        double a = 10, delta = 0.01;
        double[] y = new double[N];
        for (int i = 0; i < N; i++) {
            double ph = 2 * Math.PI * F * i / FS + 0.3;
            y[i] = a * Math.cos(ph) + (Math.sin(ph) < 0 ? delta : -delta);
        }
        StageDiagnosis.Measured m = measured(StageFixtures.noisy(y, 1e-4, 3));
        assertTrue(m.transfer().hysteresis().detected());
        // the fitted fundamental absorbs part of the loop (its quadrature component), so the seen difference
        // is between a tenth of and at most the full 2δ
        double seen = m.transfer().hysteresis().maxDifferenceVolts();
        assertTrue(seen > 0.2 * delta && seen < 2.2 * delta, "max rising-falling difference " + seen);
        assertEquals(BiasVerdict.UNCLEAR, m.crossover().verdict());
    }

    /**
     * Noise ladder on a 0.5×-Oliver pair (truth gain_at_zero about 0.989): quiet captures give a verdict,
     * loud ones (−20 dB) say unclear. The standard error grows with the noise and covers the truth.
     */
    @Test
    void noiseLadder_verdictBecomesUnclearAsNoiseRises() {
        double a = 18;
        StageFixtures.Pair pair = StageFixtures.Pair.of(0.5 * StageFixtures.oliverAmps());
        double[] clean = StageFixtures.drive(N, FS, F, a, 0.7, pair::out);
        double sig = a / Math.sqrt(2);
        double truth = pair.gainAtZeroRatio(a);
        double prevSe = 0;
        BiasVerdict[] got = new BiasVerdict[5];
        double[] levelsDb = {-100, -80, -60, -40, -20};
        for (int k = 0; k < levelsDb.length; k++) {
            double[] y = StageFixtures.noisy(clean, sig * Math.pow(10, levelsDb[k] / 20), 11 + k);
            CrossoverMetrics c = measured(y).crossover();
            got[k] = c.verdict();
            // the propagated σ is honest: truth within 3.5σ (plus the 1e-4 smoothing bias) at every level
            assertEquals(truth, c.gainAtZero(), 3.5 * c.gainAtZeroStdError() + 1e-4, levelsDb[k] + " dB");
            assertTrue(c.gainAtZeroStdError() > prevSe, "σ grows with noise at " + levelsDb[k] + " dB");
            prevSe = c.gainAtZeroStdError();
        }
        assertEquals(BiasVerdict.UNDERBIASED, got[0]);
        assertEquals(BiasVerdict.UNDERBIASED, got[1]);
        assertEquals(BiasVerdict.UNCLEAR, got[4], "at −20 dB the band straddles the thresholds");
    }

    /** Reference channel: output = g·ref(t − 0.37 samples) exactly (analytic sine), delay back to 0.01 sample. */
    @Test
    void referenceChannel_fractionalDelayRecovered() {
        double f = 997, g = 3.2, dly = 0.37;
        double[] ref = new double[N], out = new double[N];
        StageFixtures.Pair pair = StageFixtures.Pair.of(StageFixtures.oliverAmps());
        for (int i = 0; i < N; i++) {
            ref[i] = 5 * Math.cos(2 * Math.PI * f * i / FS + 0.2);
            out[i] = pair.out(g * 5 * Math.cos(2 * Math.PI * f * (i - dly) / FS + 0.2));
        }
        SineFit fit = SineFitter.fit(out, FS);
        ReferenceAlignment al = StageAnalyzer.align(out, ref, FS, fit);
        assertEquals(dly, al.delaySamples(), 0.01);
        assertEquals(dly / FS, al.delaySeconds(), 0.01 / FS);
        StageDiagnosis d = StageAnalyzer.diagnose(out, ref, FS, fit, StageSettings.defaults());
        StageDiagnosis.Measured m = assertInstanceOf(StageDiagnosis.Measured.class, d);
        assertTrue(m.reference().isPresent());
        assertTrue(m.transfer().fromReference());
        assertFalse(m.transfer().hysteresis().detected(), m.transfer().hysteresis().toString());
        // the X-Y gain at zero is the pair's small-signal gain divided by its fundamental gain (ideal = g·ref)
        double truth = pair.gainAtZeroRatio(g * 5);
        assertEquals(truth, m.crossover().gainAtZero(), 5e-4);
    }

    /** Inverting output: the phase difference beyond ±90° is read as a negative gain, not a half-period delay. */
    @Test
    void referenceChannel_invertingOutput_negativeGain() {
        double[] ref = StageFixtures.drive(N, FS, F, 1, 0.2, v -> v);
        double[] out = StageFixtures.drive(N, FS, F, 1, 0.2, v -> -20 * v);
        ReferenceAlignment al = StageAnalyzer.align(out, ref, FS, SineFitter.fit(out, FS));
        assertEquals(-20, al.gain(), 1e-6);
        assertEquals(0, al.delaySamples(), 1e-6);
        assertTrue(al.inverting());
    }

    /** Usable-sine check reaches the diagnosis: silence gives a reason, not figures. */
    @Test
    void silence_notMeasuredWithReason() {
        double[] y = new double[N];
        StageDiagnosis d = StageAnalyzer.diagnose(y, FS, new SineFit(F, 0, 0, 0, 0, 0, true), StageSettings.defaults());
        assertTrue(assertInstanceOf(StageDiagnosis.NotMeasured.class, d).reason().startsWith("silence"));
    }
}

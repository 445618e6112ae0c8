package org.outstage.analysis.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.SineFitter;

/**
 * Measurement truth of the crossover figures over a bias ladder from class B to class A. The oracle is the exact
 * incremental gain of the exponential-law emitter-follower pair by implicit differentiation ({@link PushPullTruth},
 * test code; docs/references.md §7), never the project's model or analysis.
 *
 * <p>Captures: 0.5 s of 997 Hz (AES17 practice: not locked to the rate), 24-bit rounding over ±40 V full scale,
 * output peaks at 10 % and 90 % of full scale, 48 and 96 kHz, quiescent voltage per emitter resistor Vq = Iq·Re from
 * 0 (class B) to 150 mV (about 6× Oliver's 26 mV; Oliver, HP Journal Feb 1971, via docs/references.md §7).
 */
class MeasurementTruthTest {
    static final double FULL_SCALE = 40, F = 997, SECONDS = 0.5;
    static final double[] VQ = {0, 0.5e-3, 1e-3, 2e-3, 5e-3, 10e-3, 26e-3, 50e-3, 100e-3, 150e-3};
    static final double[] LEVELS = {0.1, 0.9};
    static final double[] RATES = {48000, 96000};
    /** One step of a 24-bit capture over ±FULL_SCALE. */
    static final double LSB24 = 2 * FULL_SCALE / (1 << 24);

    private static final Map<String, double[]> CLEAN = new HashMap<>();

    /** Drive peak for an output peak of level·full scale (the pair's large-signal gain is about RL/(RL + Re)). */
    static double drive(double level) { return level * FULL_SCALE * (8.22 / 8.0); }

    /** The noiseless output of the pair biased at vq, shared by the tests of this class (generation is the slow part). */
    static synchronized double[] clean(double fs, double level, double vq) {
        return CLEAN.computeIfAbsent(fs + "/" + level + "/" + vq, k -> {
            return PushPullTruth.drive(PushPullTruth.biasedAt(vq), (int) (SECONDS * fs), fs, F, drive(level), 0.3);
        });
    }

    private static final Map<String, double[]> DEPTH = new HashMap<>();

    /** Truth of notch_depth ({@link PushPullTruth#notchDepth}), cached per bias and level (it does not depend on the rate). */
    static synchronized double depthTruth(double level, double vq) {
        return DEPTH.computeIfAbsent(level + "/" + vq, k -> PushPullTruth.notchDepth(PushPullTruth.biasedAt(vq), drive(level)))[0];
    }

    static CrossoverMetrics crossover(double[] y, double fs) {
        SineFit fit = SineFitter.fit(y, fs);
        StageDiagnosis d = StageAnalyzer.diagnose(y, fs, fit, StageSettings.defaults());
        assertTrue(d instanceof StageDiagnosis.Measured, d.toString());
        return ((StageDiagnosis.Measured) d).crossover();
    }

    /** Truth of the verdict ratio for the reference the analysis reports using (asymptote or outer mean gain). */
    static double verdictTruth(CrossoverMetrics c, StageFixtures.Pair p, double a) {
        return Double.isNaN(c.asymptoticGain()) ? PushPullTruth.gainAtZero(p, a) : PushPullTruth.asymptoticRatio(p, a);
    }

    /**
     * 1 kHz at 48 kHz repeats 48 sample phases (fs/f = 48 exactly, by construction), so no sample lies within about
     * ±0.6 V of zero at 29 V peak while the notch of Vq = 0.5 mV is some 20 mV wide: the crossing is not observed, and
     * the verdict must say so rather than read the fallback's figure.
     */
    @Test
    void toneLockedToSampleRate_crossingNotCovered_verdictUnclearWithReason() {
        StageFixtures.Pair p = PushPullTruth.biasedAt(0.5e-3);
        double[] y = StageFixtures.quantise(StageFixtures.noisy(PushPullTruth.drive(p, 48000, 48000, 1000, 29 * 8.22 / 8, 0.3),
                FULL_SCALE * 1e-6, 9), FULL_SCALE, 24);
        CrossoverMetrics c = crossover(y, 48000);
        assertEquals(BiasVerdict.UNCLEAR, c.verdict(), c.explanation());
        assertTrue(c.explanation().contains("distinct phases"), c.explanation());
    }

    /**
     * The same locked tone with a sample exactly at each zero crossing (phase −90°: the sine starts at zero) leaves
     * the nearest other samples some 3.8 V (2π/48 of the peak) away: one drive value in the crossing, which must not
     * pass for an observed crossing either (it read a gain at zero of 0.0000 ± 4e-7 against a truth near 0.6).
     */
    @Test
    void toneLockedToSampleRate_sampleAtZero_verdictUnclearWithReason() {
        StageFixtures.Pair p = PushPullTruth.biasedAt(0.5e-3);
        double[] y = StageFixtures.quantise(StageFixtures.noisy(PushPullTruth.drive(p, 48000, 48000, 1000, 29 * 8.22 / 8, -Math.PI / 2),
                FULL_SCALE * 1e-6, 9), FULL_SCALE, 24);
        CrossoverMetrics c = crossover(y, 48000);
        assertEquals(BiasVerdict.UNCLEAR, c.verdict(), c.explanation());
        assertTrue(c.explanation().contains("distinct phases"), c.explanation());
    }

    /**
     * Tones locked to the sample rate (1 kHz at 48 kHz) over six sample phases, three biases and two levels: the samples
     * near zero never cover the crossing, so the crossover figures are not given (analysis.Plausibility, which every
     * face reads) and the explanation quotes no figure. The premise, against the truth (implicit differentiation): the
     * gain at zero the engine reads between the sample values misses the truth by more than three of its stated
     * standard errors in a third of these records or more (at 0.9 of full scale the nearest samples lie 4.7 V from zero
     * and a notch of a few volts hides between them: 0.98 read against 0.75 at Vq = 1 mV), so no uncertainty stated
     * for that reading could be trusted.
     */
    @Test
    void toneLockedToSampleRate_overPhasesBiasesAndLevels_crossoverNotGiven_readingBetweenSamplesMissesTheTruth() {
        double fs = 48000;
        int cases = 0, misses = 0;
        long seed = 500;
        for (double level : new double[] {0.1, 0.9})
            for (double vq : new double[] {1e-3, 5e-3, 26e-3})
                for (int k = 0; k < 6; k++) {
                    StageFixtures.Pair p = PushPullTruth.biasedAt(vq);
                    double a = drive(level), phase = 2 * Math.PI * (1000 / fs) * k / 6 + 0.01;
                    double[] y = StageFixtures.quantise(StageFixtures.noisy(PushPullTruth.drive(p, (int) (SECONDS * fs), fs, 1000, a, phase),
                            FULL_SCALE * 1e-6, seed++), FULL_SCALE, 24);
                    org.outstage.analysis.Measurement m = org.outstage.analysis.Analyzer.analyze(y, fs, org.outstage.capture.SampleUnit.VOLTS);
                    String at = String.format("level %.1f, Vq %.0f mV, phase %d/6", level, vq * 1e3, k);
                    assertTrue(m.stage() instanceof StageDiagnosis.Measured, at + ": " + m.stage());
                    CrossoverMetrics c = ((StageDiagnosis.Measured) m.stage()).crossover();
                    assertTrue(!c.resolution().crossingObserved(), at);
                    assertTrue(!org.outstage.analysis.Plausibility.crossoverGiven(m), at);
                    assertTrue(org.outstage.analysis.Plausibility.crossoverNotGiven(m).orElse("").contains("do not cover the crossing"), at);
                    assertEquals(BiasVerdict.UNCLEAR, c.verdict(), at);
                    assertTrue(!c.explanation().contains("±"), at + ": " + c.explanation());
                    cases++;
                    if (Math.abs(c.gainAtZero() - PushPullTruth.gainAtZero(p, a)) > 3 * c.gainAtZeroStdError()) misses++;
                }
        assertEquals(36, cases);
        assertTrue(misses >= cases / 3, "the reading between samples missed the truth by > 3 SE in only " + misses + " of " + cases);
    }

    /** The record generator and the fixture's per-point solver solve the same equations: they must agree. */
    @Test
    void recordGenerator_agreesWithPointSolver() {
        for (double vq : new double[] {0, 2e-3, 26e-3, 150e-3}) {
            StageFixtures.Pair p = PushPullTruth.biasedAt(vq);
            double[] y = PushPullTruth.drive(p, 200, 48000, F, 37, 0.3);
            for (int i = 0; i < 200; i += 7)
                assertEquals(p.out(37 * Math.cos(2 * Math.PI * F * i / 48000 + 0.3)), y[i], 1e-12 * 37, "Vq " + vq + " sample " + i);
        }
    }

    /**
     * Target (issue 10 item 1): gain_at_zero and the verdict ratio within 0.02 of the truth from class B to class A, at
     * 48 and 96 kHz and at 10 % and 90 % of full scale, with 24-bit rounding and white noise 120 dB below full scale;
     * the notch width within one bin; the notch depth (issue 10: "notch_depth … follow[s] the same rule") within 3 stated
     * σ or one 24-bit step, against the depth of the exact curve (PushPullTruth.notchDepth, its best line computed there).
     */
    @Test
    void biasLadder_gainAtZeroNotchWidthAndDepthMatchImplicitDifferentiationTruth() {
        List<String> failures = new ArrayList<>();
        double worst = 0, worstDepth = 0, worstDepthSigmas = 0, worstDepthSe = 0;
        long seed = 100;
        StringBuilder perSeries = new StringBuilder();
        for (double fs : RATES)
            for (double level : LEVELS) {
                double worstHere = 0;
                for (double vq : VQ) {
                    StageFixtures.Pair p = PushPullTruth.biasedAt(vq);
                    double a = drive(level);
                    double[] y = StageFixtures.quantise(StageFixtures.noisy(clean(fs, level, vq), FULL_SCALE * 1e-6, seed++), FULL_SCALE, 24);
                    CrossoverMetrics c = crossover(y, fs);
                    double truth = PushPullTruth.gainAtZero(p, a);      // implicit differentiation, docs/references.md §7
                    double err = Math.abs(c.gainAtZero() - truth);
                    double vErr = Math.abs(c.verdictRatio() - verdictTruth(c, p, a));
                    worst = Math.max(worst, Math.max(err, vErr));
                    worstHere = Math.max(worstHere, Math.max(err, vErr));
                    if (err > 0.02 || vErr > 0.02)
                        failures.add(String.format("fs %.0f level %.1f Vq %.1f mV: truth %.4f got %.4f, verdict ratio error %.4f",
                                fs, level, vq * 1e3, truth, c.gainAtZero(), vErr));
                    // notch width (1 % tolerance, docs/diagnosis.md §5) within one bin of the 256-bin grid or 3 stated σ:
                    // the edges are located by the same adaptive slope (the binned ±4-bin window alone blurs each edge by
                    // up to 5 bins); where |gain − 1| crosses the tolerance slowly the edge is noise-limited and σ says so
                    double nw = PushPullTruth.notchWidth(p, a, 0.01), bin = 2 * a / 256;
                    double nwSe = c.resolution().notchWidthStdErrorVolts();
                    // notch depth (largest |deviation from the best line| within ±50 % of peak) against the exact curve
                    // (PushPullTruth.notchDepth): within 3 stated σ, or one 24-bit step of the full scale
                    double nd = depthTruth(level, vq), ndSe = c.resolution().notchDepthStdErrorVolts();
                    double ndErr = c.notchDepthVolts() - nd;
                    worstDepth = Math.max(worstDepth, Math.abs(ndErr));
                    worstDepthSigmas = Math.max(worstDepthSigmas, Math.abs(ndErr) / ndSe);
                    worstDepthSe = Math.max(worstDepthSe, ndSe / nd);
                    if (Math.abs(ndErr) > Math.max(3 * ndSe, LSB24))
                        failures.add(String.format("fs %.0f level %.1f Vq %.1f mV: notch depth truth %.6f got %.6f ± %.1e",
                                fs, level, vq * 1e3, nd, c.notchDepthVolts(), ndSe));
                    if (Math.abs(c.notchWidthVolts() - nw) > Math.max(bin, 3 * nwSe))
                        failures.add(String.format("fs %.0f level %.1f Vq %.1f mV: notch width truth %.4f got %.4f ± %.4f (bin %.4f)",
                                fs, level, vq * 1e3, nw, c.notchWidthVolts(), nwSe, bin));
                }
                perSeries.append(String.format(" %.0f kHz at %.0f %%: %.1e;", fs / 1000, 100 * level, worstHere));
            }
        System.out.println("ladder worst |error| of gain_at_zero and verdict ratio:" + perSeries);
        System.out.printf("ladder notch_depth: worst |error| %.1e V, worst |error|/σ %.2f, largest σ/depth %.1e%n", worstDepth,
                worstDepthSigmas, worstDepthSe);
        assertTrue(failures.isEmpty(), "worst " + worst + "; " + failures);
    }

    /**
     * Target (issue 10 item 2): the stated standard errors cover the error, noise and resolution bias alike:
     * |error| ≤ 3·SE in at least 90 % of a seeded series (bias ladder × levels × rates × three noise levels, each
     * capture its own noise seed). Under a normal model 3σ covers 99.7 %; 90 % leaves room for the bias estimate
     * being itself an estimate (a choice made here, per the issue).
     */
    @Test
    void coverage_gainAtZeroVerdictRatioAndNotchDepthWithinThreeStdErrorsInNinetyPercent() {
        double[] noiseFs = {1e-7, 1e-6, 1e-5};   // white noise RMS re full scale: −140, −120, −100 dB
        int cases = 0, coveredG = 0, coveredV = 0, coveredD = 0;
        long seed = 1000;
        StringBuilder misses = new StringBuilder();
        for (double fs : RATES)
            for (double level : LEVELS)
                for (double vq : VQ)
                    for (double nz : noiseFs) {
                        StageFixtures.Pair p = PushPullTruth.biasedAt(vq);
                        double a = drive(level);
                        double[] y = StageFixtures.quantise(StageFixtures.noisy(clean(fs, level, vq), FULL_SCALE * nz, seed++), FULL_SCALE, 24);
                        CrossoverMetrics c = crossover(y, fs);
                        // 997 Hz is not locked to either rate: every record covers its crossing
                        assertTrue(c.resolution().crossingObserved(), "crossing observed at fs " + fs + ", level " + level + ", Vq " + vq);
                        double eG = c.gainAtZero() - PushPullTruth.gainAtZero(p, a);
                        double eV = c.verdictRatio() - verdictTruth(c, p, a);
                        cases++;
                        if (Math.abs(eG) <= 3 * c.gainAtZeroStdError()) coveredG++;
                        else misses.append(String.format("%n g0 fs %.0f lvl %.1f Vq %.1f mV noise %.0e: err %.2e se %.2e", fs, level, vq * 1e3, nz, eG, c.gainAtZeroStdError()));
                        double eD = c.notchDepthVolts() - depthTruth(level, vq), sD = c.resolution().notchDepthStdErrorVolts();
                        if (Math.abs(eD) <= 3 * sD) coveredD++;
                        else misses.append(String.format("%n nd fs %.0f lvl %.1f Vq %.1f mV noise %.0e: err %.2e se %.2e", fs, level, vq * 1e3, nz, eD, sD));
                        if (Math.abs(eV) <= 3 * c.verdictRatioStdError()) coveredV++;
                        else misses.append(String.format("%n vr fs %.0f lvl %.1f Vq %.1f mV noise %.0e: err %.2e se %.2e", fs, level, vq * 1e3, nz, eV, c.verdictRatioStdError()));
                    }
        assertEquals(120, cases);
        System.out.printf("coverage: gain_at_zero %d/%d, verdict_ratio %d/%d, notch_depth %d/%d%s%n", coveredG, cases, coveredV, cases,
                coveredD, cases, misses);
        assertTrue(coveredG >= 0.9 * cases, "gain_at_zero covered in " + coveredG + "/" + cases + misses);
        assertTrue(coveredV >= 0.9 * cases, "verdict_ratio covered in " + coveredV + "/" + cases + misses);
        assertTrue(coveredD >= 0.9 * cases, "notch_depth covered in " + coveredD + "/" + cases + misses);
    }
}

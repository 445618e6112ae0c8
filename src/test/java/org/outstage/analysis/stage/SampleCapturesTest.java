package org.outstage.analysis.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.SineFitter;
import org.outstage.capture.Capture;
import org.outstage.capture.CaptureOptions;
import org.outstage.capture.CaptureReader;

/**
 * The invented DA-60 bench session in sample-captures/ (made by tools/GenerateSampleCaptures.java) read back
 * through the capture readers and diagnosed. Truths come from the generator's physics: the same exponential-law
 * pair ({@link StageFixtures.Pair}; the output does not depend on Is once Iq is set), driver limits +32.3 V /
 * −33.0 V, 20 µs of positive rail sticking, a 7.7 µs amplifier delay on the stereo file.
 */
class SampleCapturesTest {
    static final Path DIR = Path.of("sample-captures");

    static StageDiagnosis.Measured diagnose(String file) throws Exception {
        Path p = DIR.resolve(file);
        CaptureOptions o = file.endsWith(".wav") ? CaptureOptions.none().withFullScaleVolts(40) : CaptureOptions.none();
        Capture c = CaptureReader.open(p, o);
        double[] y = c.readChannel(c.channelCount() - 1);
        SineFit fit = SineFitter.fit(y, c.sampleRateHz());
        StageDiagnosis d = c.channelCount() == 2
                ? StageAnalyzer.diagnose(y, c.readChannel(0), c.sampleRateHz(), fit, StageSettings.defaults())
                : StageAnalyzer.diagnose(y, c.sampleRateHz(), fit, StageSettings.defaults());
        return assertInstanceOf(StageDiagnosis.Measured.class, d, file);
    }

    @Test
    void biasSeries_verdictsFollowQuiescentVoltage() throws Exception {
        assertEquals(BiasVerdict.UNDERBIASED, diagnose("da60-bias-03mV-40W.wav").crossover().verdict());
        assertEquals(BiasVerdict.NEAR_OPTIMAL, diagnose("da60-bias-26mV-40W.wav").crossover().verdict());
        assertEquals(BiasVerdict.OVERBIASED, diagnose("da60-bias-90mV-40W.wav").crossover().verdict());
    }

    /** 26 mV across 0.22 Ω at 40 W: truth gain_at_zero from the pair's small-signal analysis (docs/references.md §7). */
    @Test
    void bias26mV_gainAtZeroMatchesPairTruth() throws Exception {
        StageFixtures.Pair pair = StageFixtures.Pair.of(0.026 / 0.22);
        CrossoverMetrics c = diagnose("da60-bias-26mV-40W.wav").crossover();
        double drive = Math.sqrt(2 * 40 * 8.0);
        for (int k = 0; k < 6; k++) drive *= Math.sqrt(2 * 40 * 8.0) / pair.out(drive);
        assertEquals(pair.gainAtZeroRatio(drive), c.gainAtZero(), 0.001);
    }

    @Test
    void level70W_clipsPositiveFirstWithStickingAndLevelsFromTheRails() throws Exception {
        StageFixtures.Pair pair = StageFixtures.Pair.of(0.026 / 0.22);
        ClippingMetrics c = diagnose("da60-level-070W.wav").clipping();
        assertTrue(c.detected());
        double pos = pair.out(32.3), neg = pair.out(-33.0);
        assertEquals(pos, c.positive().orElseThrow().levelVolts(), 0.005 * pos);
        assertEquals(neg, c.negative().orElseThrow().levelVolts(), 0.005 * Math.abs(neg));
        assertEquals(ClippingMetrics.FirstSide.POSITIVE, c.clipsFirst());
        assertEquals(100 * (pos - Math.abs(neg)) / ((pos + Math.abs(neg)) / 2), c.asymmetryPercent().orElseThrow(), 0.1);
        assertEquals(20e-6, c.positive().get().recoveryTimeSeconds(), 1 / 48000.0);
        assertEquals(0, c.negative().get().recoveryTimeSeconds(), 1 / 48000.0);
    }

    /**
     * Scope export: 8-bit codes of 0.3125 V, so each level is within half a code of the rail. The flat top is the
     * top code, which the rising waveform enters about (rail − code edge)/slope ≈ 0.28 V / 75 V/ms ≈ 3.7 µs before
     * it reaches the rail, while the sticking output leaves it in one jump; the recovery therefore reads about
     * 16 µs for the true 20 µs (resolution: one code's crossing time).
     */
    @Test
    void scopeCsv_clipLevelsWithinHalfACode() throws Exception {
        StageFixtures.Pair pair = StageFixtures.Pair.of(0.026 / 0.22);
        ClippingMetrics c = diagnose("da60-scope-70W-clipping.csv").clipping();
        double halfCode = 80.0 / 256 / 2 + 1e-3;
        assertEquals(pair.out(32.3), c.positive().orElseThrow().levelVolts(), halfCode);
        assertEquals(pair.out(-33.0), c.negative().orElseThrow().levelVolts(), halfCode);
        assertEquals(20e-6 - 3.7e-6, c.positive().get().recoveryTimeSeconds(), 1.5e-6);
    }

    @Test
    void stereoFile_delayRecoveredAndNotchSeen() throws Exception {
        StageDiagnosis.Measured m = diagnose("da60-xy-gen-ch1-amp-ch2-10mV-20W.wav");
        ReferenceAlignment al = m.reference().orElseThrow();
        assertEquals(7.7e-6 * 48000, al.delaySamples(), 0.01);
        assertEquals(BiasVerdict.UNDERBIASED, m.crossover().verdict());
    }

    @Test
    void levelSeries_lowLevelUnclear_midLevelsNearOptimal() throws Exception {
        assertEquals(BiasVerdict.UNCLEAR, diagnose("da60-level-001W.wav").crossover().verdict());
        for (String f : new String[] {"da60-level-020W.wav", "da60-level-040W.wav", "da60-level-055W.wav"})
            assertEquals(BiasVerdict.NEAR_OPTIMAL, diagnose(f).crossover().verdict(), f);
    }
}

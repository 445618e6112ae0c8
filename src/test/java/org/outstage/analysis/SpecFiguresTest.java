package org.outstage.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.Test;
import org.outstage.capture.Capture;
import org.outstage.capture.SampleUnit;

/**
 * Intermodulation, noise with hum, crosstalk and output impedance against oracles from outside the project:
 * closed-form two-tone products of a polynomial (docs/references.md §3, derived again below), the white-noise
 * band integral with the IEC 61672-1 Annex E curve integrated here (docs/references.md §1.1, §13), a divider of
 * known source impedance (§13).
 */
class SpecFiguresTest {

    /** y = x + a2·x² + a3·x³ of x = A1·cos(ω1 t) + A2·cos(ω2 t), quantised to 24 bits. */
    static double[] twoTonePolynomial(double fs, int n, double f1, double a1, double f2, double a2amp, double c2, double c3) {
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            double t = i / fs;
            double x = a1 * Math.cos(2 * Math.PI * f1 * t) + a2amp * Math.cos(2 * Math.PI * f2 * t + 0.3);
            y[i] = x + c2 * x * x + c3 * x * x * x;
        }
        return Signals.quantise(y, 24);
    }

    /*
     * Trigonometric expansion (docs/references.md §3, re-derived): x² = ½A1² + ½A2² + ½A1²cos2ω1 + ½A2²cos2ω2
     *   + A1A2[cos(ω2−ω1) + cos(ω2+ω1)], so each of f2 ± f1 has amplitude a2·A1·A2.
     * x³ ⊃ 3A1²A2·cos²ω1·cosω2 = (3/2)A1²A2·cosω2 + (3/4)A1²A2[cos(ω2−2ω1) + cos(ω2+2ω1)]
     *   and 3A1A2²·cosω1·cos²ω2 = (3/2)A1A2²·cosω1 + (3/4)A1A2²[cos(2ω2−ω1) + cos(2ω2+ω1)];
     *   A2³cos³ω2 = (3/4)A2³cosω2 + ¼A2³cos3ω2, likewise for A1.
     * So U(f2) = A2 + a3[(3/4)A2³ + (3/2)A1²A2], U(f1) = A1 + a3[(3/4)A1³ + (3/2)A1A2²],
     *   U(f2 ± 2f1) = (3/4)a3A1²A2, U(2f1 − f2) = (3/4)a3A1²A2, U(2f2 − f1) = (3/4)a3A1A2².
     */
    @Test
    void smpte60And7k_fourToOne_imdMatchesTrigonometricExpansion() {
        double fs = 48000, a1 = 0.6, a2 = 0.15, c2 = 0.005, c3 = 0.01;
        double[] y = twoTonePolynomial(fs, 96000, 60, a1, 7000, a2, c2, c3);
        Measurement m = Analyzer.analyze(Capture.inMemory("smpte", fs, SampleUnit.FULL_SCALE, y), 0, AnalysisSettings.DEFAULT, SpecConditions.AUTO);
        assertTrue(m.imd().isPresent(), "two tones at 4:1 are recognised as an SMPTE-type test");
        Intermodulation imd = m.imd().get();
        double u2 = a2 + c3 * (0.75 * a2 * a2 * a2 + 1.5 * a1 * a1 * a2);
        double d2 = 2 * c2 * a1 * a2 / u2;
        double d3 = 2 * 0.75 * c3 * a1 * a1 * a2 / u2;
        double truth = Math.hypot(d2, d3);   // d4 = d5 = 0 for a cubic
        assertEquals(Intermodulation.Method.MODULATION, imd.method());
        assertEquals(60, imd.f1Hz(), 0.05);
        assertEquals(7000, imd.f2Hz(), 0.05);
        assertEquals(a1 / a2, imd.ratio(), 0.01 * a1 / a2 + 0.1);   // ratio of the lines includes a3's share of U(f1), U(f2)
        assertEquals(d2, imd.order(2), 0.01 * d2, "d2 (SMPTE RP120 convention, §3 expansion)");
        assertEquals(d3, imd.order(3), 0.01 * d3, "d3");
        assertEquals(truth, imd.imdRatio(), 0.01 * truth, "IMD within 1 % of the closed form at 24 bits");
        assertTrue(imd.stimulusFromCapture());
    }

    @Test
    void dinVariant250And8k_forcedSmpte_matchesExpansion() {
        double fs = 48000, a1 = 0.6, a2 = 0.15, c2 = 0.002, c3 = 0.004;
        double[] y = twoTonePolynomial(fs, 48000, 250, a1, 8000, a2, c2, c3);
        Measurement m = Analyzer.analyze(Capture.inMemory("din", fs, SampleUnit.FULL_SCALE, y), 0, AnalysisSettings.DEFAULT,
                SpecConditions.AUTO.withStimulus(StimulusKind.SMPTE));
        Intermodulation imd = m.imd().orElseThrow();
        double u2 = a2 + c3 * (0.75 * a2 * a2 * a2 + 1.5 * a1 * a1 * a2);
        double truth = Math.hypot(2 * c2 * a1 * a2 / u2, 2 * 0.75 * c3 * a1 * a1 * a2 / u2);
        assertEquals(truth, imd.imdRatio(), 0.01 * truth, "DIN 250 Hz + 8 kHz, §3 expansion");
        assertTrue(!imd.stimulusFromCapture());
    }

    @Test
    void twinTone19And20k_differenceFrequencyMatchesExpansion() {
        double fs = 96000, a1 = 0.35, a2 = 0.35, c2 = 0.01, c3 = 0.02;
        double[] y = twoTonePolynomial(fs, 96000, 19000, a1, 20000, a2, c2, c3);
        Measurement m = Analyzer.analyze(Capture.inMemory("twin", fs, SampleUnit.FULL_SCALE, y), 0, AnalysisSettings.DEFAULT, SpecConditions.AUTO);
        Intermodulation imd = m.imd().orElseThrow();
        assertEquals(Intermodulation.Method.DIFFERENCE_FREQUENCY, imd.method());
        double u1 = a1 + c3 * (0.75 * a1 * a1 * a1 + 1.5 * a1 * a2 * a2);
        double u2 = a2 + c3 * (0.75 * a2 * a2 * a2 + 1.5 * a1 * a1 * a2);
        double ref = u1 + u2;
        double d2 = c2 * a1 * a2 / ref;                                              // f2 − f1
        double d3 = (0.75 * c3 * a1 * a1 * a2 + 0.75 * c3 * a1 * a2 * a2) / ref;     // 2f1 − f2, 2f2 − f1
        assertEquals(d2, imd.order(2), 0.01 * d2, "d2 = U(f2−f1)/(U(f1)+U(f2)), §3 expansion");
        assertEquals(d3, imd.order(3), 0.01 * d3, "d3");
        double truth = Math.hypot(d2, d3);
        assertEquals(truth, imd.imdRatio(), 0.01 * truth, "IMD within 1 % at 24 bits");
    }

    @Test
    void singleSine_hasNoIntermodulation() {
        double fs = 48000;
        double[] y = Signals.harmonicSeries(fs, 48000, 1000, 0, new double[] {0, 0.5, 0.001}, new double[3]);
        Measurement m = Analyzer.analyze(Capture.inMemory("sine", fs, SampleUnit.FULL_SCALE, y), 0, AnalysisSettings.DEFAULT, SpecConditions.AUTO);
        assertTrue(m.measured());
        assertTrue(m.imd().isEmpty() && m.noise().isEmpty() && m.crosstalk().isEmpty());
    }

    // ------------------------------------------------------------------ noise

    /** IEC 61672-1:2013 Annex E, A(f) as a linear gain normalised at 1 kHz, from the design constants (§1.1). */
    static double annexEGain(double f) {
        double fr = 1000, fl = Math.pow(10, 1.5), fh = Math.pow(10, 3.9), fa = Math.pow(10, 2.45), d = Math.sqrt(0.5);
        double b = (1 / (1 - d)) * (fr * fr + fl * fl * fh * fh / (fr * fr) - d * (fl * fl + fh * fh));
        double c = fl * fl * fh * fh;
        double f1 = Math.sqrt((-b - Math.sqrt(b * b - 4 * c)) / 2), f4 = Math.sqrt((-b + Math.sqrt(b * b - 4 * c)) / 2);
        double f2 = (3 - Math.sqrt(5)) / 2 * fa, f3 = (3 + Math.sqrt(5)) / 2 * fa;
        java.util.function.DoubleUnaryOperator raw = x -> f4 * f4 * Math.pow(x, 4)
                / ((x * x + f1 * f1) * Math.sqrt(x * x + f2 * f2) * Math.sqrt(x * x + f3 * f3) * (x * x + f4 * f4));
        return raw.applyAsDouble(f) / raw.applyAsDouble(1000);
    }

    static double[] gaussian(long seed, int n, double sigma) {
        Random r = new Random(seed);
        double[] y = new double[n];
        for (int i = 0; i < n; i++) y[i] = sigma * r.nextGaussian();
        return y;
    }

    @Test
    void whiteNoise_bandAndAWeightedRms_matchBandIntegral() {
        double fs = 48000, sigma = 1e-4;
        double[] y = gaussian(12, 480000, sigma);
        Capture c = Capture.inMemory("noise", fs, SampleUnit.VOLTS, y);
        Measurement m = Analyzer.analyze(c, 0, AnalysisSettings.DEFAULT.withLoadOhms(8),
                SpecConditions.AUTO.withStimulus(StimulusKind.NONE).withRatedPowerWatts(60));
        NoiseFigures nf = m.noise().orElseThrow();
        // §13: σ·√((f_hi − f_lo)/(f_s/2)) in a brick-wall band
        double truth = sigma * Math.sqrt((20000 - 20) / (fs / 2));
        // §13: σ·√(∫ A(f)² df/(f_s/2)), A from Annex E, midpoint rule with 0.5 Hz steps
        double integral = 0;
        for (double f = 20.25; f < 20000; f += 0.5) { double g = annexEGain(f); integral += g * g * 0.5; }
        double truthA = sigma * Math.sqrt(integral / (fs / 2));
        assertEquals(0, 20 * Math.log10(nf.rms() / truth), 0.1, "unweighted noise within 0.1 dB");
        assertEquals(0, 20 * Math.log10(nf.rmsA() / truthA), 0.1, "A-weighted noise within 0.1 dB (IEC 61672-1 Annex E)");
        // S/N against 1 W and 60 W into 8 Ω (common practice, §13): 20·lg(√(P·R)/noise)
        assertEquals(20 * Math.log10(Math.sqrt(8) / truth), nf.snrRe1WDb().getAsDouble(), 0.1);
        assertEquals(20 * Math.log10(Math.sqrt(480) / truthA), nf.snrReRatedADb().getAsDouble(), 0.1);
        assertTrue(nf.hum().isEmpty(), "white noise has no hum lines");
    }

    /**
     * An uncalibrated capture (full-scale units) whose strongest line is hum at 7e-6 FS under white noise is a noise
     * capture with stimulus auto, as it is in volts (Analyzer.NOISE_TONE_LIMIT_FULL_SCALE): noise figures, the hum line,
     * and the band rms of the noise within 0.1 dB of σ·√(band/(fs/2)) plus the hum's power (§13). A test tone at
     * 1e-3 FS (−57 dBFS) on the same noise stays a tone: distortion figures, no noise figures.
     */
    @Test
    void uncalibratedHumAndNoise_isANoiseCapture_aQuietTestToneIsNot() {
        double fs = 48000, sigma = 3e-6, hum = 1e-5;   // hum peak: 7.1e-6 FS rms
        double[] y = gaussian(21, 96000, sigma);
        for (int i = 0; i < y.length; i++) y[i] += hum * Math.sin(2 * Math.PI * 50 * i / fs);
        Measurement m = Analyzer.analyze(Capture.inMemory("shorted", fs, SampleUnit.FULL_SCALE, y), 0, AnalysisSettings.DEFAULT, SpecConditions.AUTO);
        NoiseFigures nf = m.noise().orElseThrow(() -> new AssertionError("no noise figures: " + m.fundamental()));
        double truth = Math.sqrt(sigma * sigma * (20000 - 20) / (fs / 2) + hum * hum / 2);
        assertEquals(0, 20 * Math.log10(nf.rms() / truth), 0.1, "band rms of noise and hum within 0.1 dB");
        assertEquals(50, nf.hum().get(0).frequencyHz(), 0.05);

        double[] t = gaussian(22, 96000, sigma);
        for (int i = 0; i < t.length; i++) t[i] += 1e-3 * Math.sqrt(2) * Math.sin(2 * Math.PI * 997 * i / fs);
        Measurement tone = Analyzer.analyze(Capture.inMemory("quiet tone", fs, SampleUnit.FULL_SCALE, t), 0, AnalysisSettings.DEFAULT, SpecConditions.AUTO);
        assertTrue(tone.measured() && tone.noise().isEmpty(), "a −57 dBFS test tone is a tone");
        assertEquals(997, tone.fundamental().frequencyHz(), 0.01);
    }

    @Test
    void hum_at49Point9HzAndRippleHarmonic_foundWithTheirLevels() {
        double fs = 48000;
        double[] y = gaussian(7, 480000, 1e-4);
        for (int i = 0; i < y.length; i++) {
            double t = i / fs;
            y[i] += 200e-6 * Math.sqrt(2) * Math.sin(2 * Math.PI * 49.9 * t) + 100e-6 * Math.sqrt(2) * Math.sin(2 * Math.PI * 2 * 49.9 * t + 1);
        }
        Measurement m = Analyzer.analyze(Capture.inMemory("hum", fs, SampleUnit.VOLTS, y), 0, AnalysisSettings.DEFAULT, SpecConditions.AUTO);
        NoiseFigures nf = m.noise().orElseThrow(() -> new AssertionError("a 200 µV capture is a noise capture (below 10 mV)"));
        assertEquals(49.9, nf.mainsHz().getAsDouble(), 0.05, "mains found from the data, not assumed 50 Hz");
        assertEquals(1, nf.hum().get(0).harmonic());
        assertEquals(200e-6, nf.hum().get(0).rms(), 2e-6, "hum line rms (sine of rms V reads V)");
        assertEquals(2, nf.hum().get(1).harmonic());
        assertEquals(100e-6, nf.hum().get(1).rms(), 1e-6);
        double truth = Math.sqrt(1e-8 * (20000 - 20) / 24000 + 200e-6 * 200e-6 + 100e-6 * 100e-6);
        assertEquals(0, 20 * Math.log10(nf.rms() / truth), 0.1, "band rms counts hum (Parseval)");
    }

    // ------------------------------------------------------------------ crosstalk

    @Test
    void crosstalkAtMinus80dB_underBroadbandNoise_readsTheLine() {
        double fs = 48000;
        int n = 480000;
        double[] driven = new double[n];
        double[] other = gaussian(3, n, 1e-3);   // noise 20 dB above the leaked tone, in rms
        for (int i = 0; i < n; i++) {
            double s = Math.sqrt(2) * Math.sin(2 * Math.PI * 1000 * i / fs);
            driven[i] = s;
            other[i] += 1e-4 * s;   // −80 dB (definition, §13: 20·lg(V_undriven/V_driven))
        }
        Capture c = Capture.inMemory("xtalk", fs, SampleUnit.VOLTS, driven, other);
        Measurement m = Analyzer.analyze(c, 1, AnalysisSettings.DEFAULT, SpecConditions.AUTO.withDrivenChannel(1));
        Crosstalk x = m.crosstalk().orElseThrow();
        assertEquals(1, x.fromChannel());
        assertEquals(1000, x.frequencyHz(), 0.05);
        assertEquals(-80, x.db(), 0.1);
        assertTrue(x.resolved());
        assertTrue(Analyzer.analyze(c, 0, AnalysisSettings.DEFAULT, SpecConditions.AUTO.withDrivenChannel(1)).crosstalk().isEmpty(),
                "the driven channel has no crosstalk figure");
    }

    // ------------------------------------------------------------------ output impedance

    @Test
    void sourceOf50Milliohms_into8Ohms_readsItsImpedanceAndDampingFactor() {
        double fs = 48000, z = 0.05, r = 8, v = 2.0;
        double[] open = Signals.harmonicSeries(fs, 48000, 1000, 0, new double[] {0, v * Math.sqrt(2)}, new double[2]);
        double[] loaded = gaussian(5, 48000, 1e-5);
        double vl = v * r / (r + z);   // voltage divider, §13
        for (int i = 0; i < loaded.length; i++) loaded[i] += vl * Math.sqrt(2) * Math.cos(2 * Math.PI * 1000 * i / fs);
        Measurement mo = Analyzer.analyze(open, fs, SampleUnit.VOLTS);
        Measurement ml = Analyzer.analyze(loaded, fs, SampleUnit.VOLTS);
        OutputImpedance zo = OutputImpedance.of(r, mo, ml);
        assertEquals(z, zo.zOutOhms(), 0.01 * z, "Z_out = R_L(V_open/V_loaded − 1)");
        assertEquals(r / z, zo.dampingFactor(), 0.01 * r / z, "DF = R_L/Z_out");
        assertEquals(1000, zo.frequencyHz(), 0.01);
    }

    @Test
    void outputImpedance_workedExample() {
        OutputImpedance z = OutputImpedance.of(8, 1000, 2.000, 1.996);
        assertEquals(8 * (2 / 1.996 - 1), z.zOutOhms(), 1e-12);   // arithmetic of the definition
        assertEquals(499, z.dampingFactor(), 1e-9);
    }
}

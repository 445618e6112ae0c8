package org.outstage.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.outstage.capture.SampleUnit;

class AnalyzerTest {

    /** Worked example of the Analyzer Javadoc: a 2 V rms sine reads 2.0 V rms; P = V²/R = 0.5 W into 8 Ω. */
    @Test
    void javadocExample_twoVoltSineReadsTwoVoltsRms() {
        double fs = 48000;
        double[] y = new double[48000];
        for (int i = 0; i < y.length; i++) y[i] = 2 * Math.sqrt(2) * Math.sin(2 * Math.PI * 1000 * i / fs);
        Measurement m = Analyzer.analyze(y, fs, SampleUnit.VOLTS, AnalysisSettings.DEFAULT.withLoadOhms(8));
        assertTrue(m.measured(), m.notMeasuredReason().orElse(""));
        assertEquals(2.0, m.fundamental().rms(), 1e-9);
        assertEquals(1000, m.fundamental().frequencyHz(), 1e-9);
        assertEquals(0.5, m.powerWatts().orElseThrow().fundamentalWatts(), 1e-9);
        assertEquals(2.0, m.totalRms(), 1e-9);
        assertTrue(m.thd().db() < -160, "THD " + m.thd().db());
        assertEquals("V", m.unit());
        assertEquals(1, m.channel());
    }

    /** Sum of squares of the Fourier-series amplitudes for orders 2..N, divided by the fundamental's. */
    private static double partialThd(double[] amp, int maxOrder) {
        double s = 0;
        for (int k = 2; k <= maxOrder && k < amp.length; k++) s += amp[k] * amp[k];
        return Math.sqrt(s) / amp[1];
    }

    /**
     * Band-limited square, triangle and sawtooth waves (Fourier series, docs/references.md §6.1: square 4/(nπ) odd n,
     * triangle 8/(π²n²) odd n alternating, sawtooth 2/(nπ) all n; THD_F of the infinite series 0.483426,
     * 0.121153, 0.803078). Harmonics up to 40 are synthesised; THD over H2…H10 must equal the partial sum.
     */
    private static void checkWave(double[] amp, double[] phase, double infiniteThd) {
        double fs = 96000, f = 997.3;
        double[] y = Signals.harmonicSeries(fs, 96000, f, 0, amp, phase);
        Measurement m = Analyzer.analyze(y, fs, SampleUnit.FULL_SCALE);
        assertTrue(m.measured(), m.notMeasuredReason().orElse(""));
        double expected = partialThd(amp, 10);
        assertEquals(expected, m.thd().ratio(), expected * 1e-6);
        // the series used is the one whose infinite sum the reference quotes
        assertEquals(infiniteThd, seriesThd(amp, phase), 2e-6);
    }

    /** THD_F of the series continued to 2·10^6 terms with the same amplitude law (checks the oracle itself). */
    private static double seriesThd(double[] amp, double[] phase) {
        // amplitude law recovered from the first terms: a_k·k^p constant over the non-zero odd/even pattern
        double s = 0;
        boolean odd = amp[2] == 0;
        double p = Math.log(amp[1] / amp[3]) / Math.log(3);
        for (int k = 2; k <= 2_000_000; k++) {
            if (odd && k % 2 == 0) continue;
            double a = amp[1] / Math.pow(k, p);
            s += a * a;
        }
        return Math.sqrt(s) / amp[1];
    }

    @Test
    void squareWave_thdMatchesFourierSeries() {
        double[] a = new double[41], p = new double[41];
        for (int k = 1; k <= 40; k += 2) { a[k] = 4 / (Math.PI * k); p[k] = -Math.PI / 2; }
        checkWave(a, p, 0.483426);
    }

    @Test
    void triangleWave_thdMatchesFourierSeries() {
        double[] a = new double[41], p = new double[41];
        for (int k = 1; k <= 40; k += 2) { a[k] = 8 / (Math.PI * Math.PI * k * k); p[k] = ((k / 2) % 2 == 0) ? -Math.PI / 2 : Math.PI / 2; }
        checkWave(a, p, 0.121153);
    }

    @Test
    void sawtoothWave_thdMatchesFourierSeries() {
        double[] a = new double[41], p = new double[41];
        for (int k = 1; k <= 40; k++) { a[k] = 2 / (Math.PI * k); p[k] = (k % 2 == 1) ? -Math.PI / 2 : Math.PI / 2; }
        checkWave(a, p, 0.803078);
    }

    /**
     * y = x + a2·x² + a3·x³ with x = A·cos ωt (Chebyshev identities, docs/references.md §6.4):
     * DC = a2A²/2, H1 = A + ¾a3A³, H2 = a2A²/2, H3 = a3A³/4.
     */
    @Test
    void polynomial_harmonicsMatchChebyshevExpansion() {
        double fs = 48000, f = 1001.7, amp = 0.8, a2 = 0.01, a3 = 0.004;
        double[] y = new double[96000];
        for (int i = 0; i < y.length; i++) {
            double x = amp * Math.cos(2 * Math.PI * f * i / fs);
            y[i] = x + a2 * x * x + a3 * x * x * x;
        }
        Measurement m = Analyzer.analyze(y, fs, SampleUnit.VOLTS);
        double h1 = amp + 0.75 * a3 * amp * amp * amp, h2 = a2 * amp * amp / 2, h3 = a3 * amp * amp * amp / 4;
        assertEquals(a2 * amp * amp / 2, m.dcOffset(), 1e-9);
        assertEquals(h1 / Math.sqrt(2), m.fundamental().rms(), 1e-9);
        List<Measurement.Harmonic> h = m.harmonics();
        assertEquals(2, h.get(0).order());
        assertEquals(h2 / Math.sqrt(2), h.get(0).rms(), 1e-9);
        assertEquals(h3 / Math.sqrt(2), h.get(1).rms(), 1e-9);
        assertEquals(h2 / h1, h.get(0).ratio(), 1e-9);
        // cosine input, positive coefficients: both harmonics are in phase with the fundamental (φ_k − kφ_1 = 0)
        assertEquals(0, h.get(0).phaseDeg(), 1e-4);
        assertEquals(0, h.get(1).phaseDeg(), 1e-4);
        assertTrue(h.get(2).dbc() < -200, "H4 " + h.get(2).dbc());
    }

    /**
     * Harmonic accuracy on a non-coherent double-precision record: H2 −120 dBc within 0.01 dB,
     * H3 −150 dBc within 1 dB; the fundamental within 1e-4 Hz on a 2.5 s record (brief's targets).
     */
    @Test
    void deepHarmonics_levelsWithinTargets() {
        double fs = 96000, f = 997.13;
        double[] a = new double[6], p = new double[6];
        a[1] = 1; a[2] = Levels.dbToRatio(-120); a[3] = Levels.dbToRatio(-150); a[5] = Levels.dbToRatio(-100);
        p[2] = 0.4; p[3] = -1.1; p[5] = 2.0; p[1] = 0.25;
        double[] y = Signals.harmonicSeries(fs, (int) (2.5 * fs), f, 0.001, a, p);
        Measurement m = Analyzer.analyze(y, fs, SampleUnit.FULL_SCALE);
        assertEquals(Measurement.Method.WINDOWED_SPECTRUM, m.method());
        assertEquals(f, m.fundamental().frequencyHz(), 1e-4);
        assertEquals(-120, m.harmonics().get(0).dbc(), 0.01);
        assertEquals(-150, m.harmonics().get(1).dbc(), 1.0);
        assertEquals(-100, m.harmonics().get(3).dbc(), 0.01);
        // phase convention: φ_k − k·φ_1 (p[2] − 2·p[1] = −0.1 rad)
        assertEquals(Math.toDegrees(p[2] - 2 * p[1]), m.harmonics().get(0).phaseDeg(), 0.1);
        assertEquals(Math.toDegrees(p[5] - 5 * p[1]), m.harmonics().get(3).phaseDeg(), 0.01);
    }

    /** Two-cycle scope record with a known H3 (−40 dBc, phase 30°): the multi-harmonic fit path. */
    @Test
    void twoCycleScopeRecord_knownThirdHarmonic() {
        double fs = 1e6, f = 1000;
        double[] a = new double[4], p = new double[4];
        a[1] = 10; a[3] = 0.1; p[1] = 0.3; p[3] = 3 * 0.3 + Math.toRadians(30);
        double[] y = Signals.harmonicSeries(fs, 2000, f, 0.05, a, p);
        Measurement m = Analyzer.analyze(y, fs, SampleUnit.VOLTS);
        assertTrue(m.measured(), m.notMeasuredReason().orElse(""));
        assertEquals(Measurement.Method.MULTI_HARMONIC_FIT, m.method());
        assertEquals(f, m.fundamental().frequencyHz(), 1e-6);
        assertEquals(10 / Math.sqrt(2), m.fundamental().rms(), 1e-9);
        assertEquals(0.01, m.harmonics().get(1).ratio(), 1e-9);
        assertEquals(30, m.harmonics().get(1).phaseDeg(), 1e-5);
        assertEquals(0.01, m.thd().ratio(), 1e-9);
        assertEquals(0.05, m.dcOffset(), 1e-9);
    }

    /**
     * Ideal quantisation of a full-scale sine (Kester MT-001; IEEE 1241): noise q²/12 white over 0…fs/2, so
     * SINAD = 10·lg((A²/2)/(q²/12)) (= 6.02N + 1.76 dB at A = full scale) and ENOB ≈ N, in the Nyquist band.
     * 997 Hz is non-coherent with 48 kHz (AES17 practice), which keeps the error white.
     */
    private static void checkQuantised(int bits) {
        // 997.13 Hz rather than 997 Hz: at 48 kHz a 997 Hz tone repeats every 48000 samples, which turns the
        // quantisation error into a comb of lines 1 Hz apart (white in total power, not per bin).
        double fs = 48000, f = 997.13;
        double amp = 1 - Math.pow(2, -(bits - 1));     // just below full scale, no clipping
        double[] x = new double[(int) (4 * fs)];
        for (int i = 0; i < x.length; i++) x[i] = amp * Math.sin(2 * Math.PI * f * i / fs + 0.1);
        double[] y = Signals.quantise(x, bits);
        double q = 2 / Math.pow(2, bits);
        double sinadExpected = 10 * Math.log10((amp * amp / 2) / (q * q / 12));
        Measurement m = Analyzer.analyze(y, fs, SampleUnit.FULL_SCALE, AnalysisSettings.DEFAULT.withBand(Band.NYQUIST).withBitDepth(bits));
        assertEquals(sinadExpected, m.sinadDb(), 0.2);
        assertEquals(-sinadExpected, m.thdN().db(), 0.2);
        // ENOB = (SINAD − 10·lg 1.5)/(20·lg 2) with the exact constants 1.7609 dB and 6.0206 dB/bit (Kester MT-001;
        // docs/references.md §4, constants COMPUTED). Checked against the measured SINAD to 1e-9 bit, so a 6.0 or 6.03
        // dB/bit slip (0.055 and 0.025 bit off at 16 bits, 0.08 and 0.04 at 24) fails, and against the ideal N within
        // the SINAD tolerance of 0.2 dB (0.033 bit) plus the amplitude's 2^−(N−1) shortfall from full scale.
        assertEquals((m.sinadDb() - 10 * Math.log10(1.5)) / (20 * Math.log10(2)), m.enob(), 1e-9);
        double idealEnob = bits + Math.log(amp) / Math.log(2);
        assertEquals(idealEnob, m.enob(), 0.2 / (20 * Math.log10(2)));
        assertEquals(Math.max(m.floor().quantisationRatio(), m.floor().measuredNoiseRatio()), m.floor().ratio(), 0);
        assertTrue(m.thdN().atFloor());
        // the measured noise floor agrees with the ideal one (the noise is the quantisation noise)
        assertEquals(m.floor().quantisationRatio(), m.floor().measuredNoiseRatio(), m.floor().quantisationRatio() * 0.05);
        // in the 20 Hz–20 kHz band the noise falls by 10·lg((fs/2)/BW) (process gain, MT-001)
        Measurement b = Analyzer.analyze(y, fs, SampleUnit.FULL_SCALE, AnalysisSettings.DEFAULT);
        double gain = 10 * Math.log10((fs / 2) / (20000 - 20));
        assertEquals(sinadExpected + gain, b.sinadDb(), 0.2);
    }

    @Test
    void quantised16Bit_sinadMatchesIdealQuantisationNoise() { checkQuantised(16); }

    @Test
    void quantised24Bit_sinadMatchesIdealQuantisationNoise() { checkQuantised(24); }

    @Test
    void silence_isNotMeasured() {
        Measurement m = Analyzer.analyze(new double[48000], 48000, SampleUnit.VOLTS);
        assertFalse(m.measured());
        assertTrue(m.notMeasuredReason().get().contains("silence"), m.notMeasuredReason().get());
        assertTrue(Double.isNaN(m.thd().ratio()));
        assertTrue(m.harmonics().isEmpty());
    }

    @Test
    void dcOnly_isNotMeasured() {
        double[] y = new double[48000];
        java.util.Arrays.fill(y, 0.3);
        Measurement m = Analyzer.analyze(y, 48000, SampleUnit.VOLTS);
        assertTrue(m.notMeasuredReason().orElse("").contains("DC only"));
    }

    /**
     * A tone of 5e-5 on a DC of 1 passes the analysis's own silence rule but not the stage's DC rule, which reads the
     * level figures the analysis took (SignalCheck.Level): its reason, numbers included, is the one the signal check
     * gives when it takes them itself.
     */
    @Test
    void smallToneOnLargeDc_stageRefusedWithTheCheckOwnReason() {
        double fs = 48000;
        double[] y = new double[48000];
        for (int i = 0; i < y.length; i++) y[i] = 1.0 + 5e-5 * Math.sin(2 * Math.PI * 997 * i / fs);
        Measurement m = Analyzer.analyze(y, fs, SampleUnit.VOLTS);
        String own = org.outstage.analysis.stage.SignalCheck.check(y, fs, SineFitter.fit(y, fs)).orElse("");
        assertTrue(own.startsWith("DC only"), own);
        assertTrue(m.stage() instanceof org.outstage.analysis.stage.StageDiagnosis.NotMeasured, String.valueOf(m.stage()));
        assertEquals(own, ((org.outstage.analysis.stage.StageDiagnosis.NotMeasured) m.stage()).reason());
    }

    @Test
    void oneCycle_isNotMeasured() {
        double fs = 100000;
        double[] y = new double[100];   // one cycle of 1 kHz
        for (int i = 0; i < y.length; i++) y[i] = Math.sin(2 * Math.PI * 1000 * i / fs);
        Measurement m = Analyzer.analyze(y, fs, SampleUnit.VOLTS);
        assertTrue(m.notMeasuredReason().orElse("").contains("too short"), m.notMeasuredReason().orElse("measured"));
    }

    @Test
    void nonFiniteSample_isNotMeasured() {
        double[] y = new double[4800];
        for (int i = 0; i < y.length; i++) y[i] = Math.sin(2 * Math.PI * 1000 * i / 48000.0);
        y[100] = Double.NaN;
        assertTrue(Analyzer.analyze(y, 48000, SampleUnit.VOLTS).notMeasuredReason().orElse("").contains("not finite"));
    }

    @Test
    void whiteNoise_hasNoClearLine() {
        java.util.Random rnd = new java.util.Random(7);
        double[] y = new double[96000];
        for (int i = 0; i < y.length; i++) y[i] = rnd.nextGaussian();
        Measurement m = Analyzer.analyze(y, 48000, SampleUnit.VOLTS);
        assertTrue(m.notMeasuredReason().orElse("").contains("no clear"), m.notMeasuredReason().orElse("measured"));
    }

    /**
     * Short record with noise: two cycles, H3 at −40 dBc and white noise σ = 1e-3 (seeded), Nyquist band.
     * THD+N² = (H3² + σ²)/(total) by Parseval (docs/references.md §11); the fit absorbs only 2N+1 of 20000
     * degrees of freedom. Tolerance 0.1 dB: the noise power of 20000 samples scatters by about 1 %.
     */
    @Test
    void twoCycleRecordWithNoise_thdNMatchesParseval() {
        double fs = 1e6, f = 100, sigma = 1e-3;
        java.util.Random rnd = new java.util.Random(3);
        double[] a = new double[4], p = new double[4];
        a[1] = 1; a[3] = 0.01; p[3] = 0.5;
        double[] y = Signals.harmonicSeries(fs, 20000, f, 0, a, p);
        for (int i = 0; i < y.length; i++) y[i] += sigma * rnd.nextGaussian();
        Measurement m = Analyzer.analyze(y, fs, SampleUnit.VOLTS, AnalysisSettings.DEFAULT.withBand(Band.NYQUIST));
        assertEquals(Measurement.Method.MULTI_HARMONIC_FIT, m.method());
        double nd = 0.01 * 0.01 / 2 + sigma * sigma;
        assertEquals(10 * Math.log10(nd / (0.5 + nd)), m.thdN().db(), 0.1);
        assertEquals(-40, m.harmonics().get(1).dbc(), 0.1);
        // the floor is the noise: σ relative to the fundamental rms, within 10 %
        assertEquals(sigma / Math.sqrt(0.5), m.floor().measuredNoiseRatio(), 0.1 * sigma / Math.sqrt(0.5));
    }
}

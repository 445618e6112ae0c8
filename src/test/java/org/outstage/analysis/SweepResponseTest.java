package org.outstage.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * Frequency response from an exponential sweep (Farina 2000, AES preprint 5093; docs/references.md §13) against a
 * digital Butterworth band-pass designed here: second-order analog prototypes mapped by the bilinear transform
 * with pre-warping, so the digital magnitude is exactly −3.01 dB at each design frequency. The oracle is the
 * filter's own frequency response H(e^{jω}) = B(e^{−jω})/A(e^{−jω}), evaluated from its coefficients.
 */
class SweepResponseTest {
    static final double FS = 96000;

    /** Biquad coefficients {b0, b1, b2, a1, a2} (a0 = 1): bilinear transform of 1/(s² + √2 s + 1), pre-warped to fc. */
    static double[] butterworth(double fc, boolean highPass) {
        double k = Math.tan(Math.PI * fc / FS);
        double norm = 1 / (1 + Math.sqrt(2) * k + k * k);
        double a1 = 2 * (k * k - 1) * norm, a2 = (1 - Math.sqrt(2) * k + k * k) * norm;
        if (highPass) return new double[] {norm, -2 * norm, norm, a1, a2};
        double b0 = k * k * norm;
        return new double[] {b0, 2 * b0, b0, a1, a2};
    }

    static double[] filter(double[] c, double[] x) {
        double[] y = new double[x.length];
        double x1 = 0, x2 = 0, y1 = 0, y2 = 0;
        for (int i = 0; i < x.length; i++) {
            double v = c[0] * x[i] + c[1] * x1 + c[2] * x2 - c[3] * y1 - c[4] * y2;
            x2 = x1; x1 = x[i]; y2 = y1; y1 = v;
            y[i] = v;
        }
        return y;
    }

    /** Complex H(e^{jω}) of a biquad at f: {re, im}. */
    static double[] response(double[] c, double f) {
        double w = 2 * Math.PI * f / FS;
        double nr = c[0] + c[1] * Math.cos(w) + c[2] * Math.cos(2 * w), ni = -c[1] * Math.sin(w) - c[2] * Math.sin(2 * w);
        double dr = 1 + c[3] * Math.cos(w) + c[4] * Math.cos(2 * w), di = -c[3] * Math.sin(w) - c[4] * Math.sin(2 * w);
        double d = dr * dr + di * di;
        return new double[] {(nr * dr + ni * di) / d, (ni * dr - nr * di) / d};
    }

    static final double[] HP = butterworth(10, true), LP = butterworth(30000, false);

    static double oracleDb(double f) {
        double[] a = response(HP, f), b = response(LP, f);
        return 10 * Math.log10((a[0] * a[0] + a[1] * a[1]) * (b[0] * b[0] + b[1] * b[1]));
    }

    static double oraclePhaseDeg(double f) {
        double[] a = response(HP, f), b = response(LP, f);
        return Math.toDegrees(Math.atan2(a[1], a[0]) + Math.atan2(b[1], b[0]));
    }

    /** x(t) = sin(2π·f1·T/L·(e^{t·L/T} − 1)), L = ln(f2/f1) (§13). */
    static double[] sweep(double f1, double f2, double seconds, double amplitude) {
        int n = (int) Math.round(seconds * FS);
        double l = Math.log(f2 / f1);
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            double t = i / FS;
            x[i] = amplitude * Math.sin(2 * Math.PI * f1 * seconds / l * (Math.exp(t * l / seconds) - 1));
        }
        return x;
    }

    /** Bisection on the oracle for the frequency where the gain is 10·lg(½) below the gain at 1 kHz. */
    static double oracleMinus3(double lo, double hi) {
        double target = oracleDb(1000) - 10 * Math.log10(2);
        boolean rising = oracleDb(hi) > oracleDb(lo);
        for (int i = 0; i < 200; i++) {
            double m = Math.sqrt(lo * hi);
            if ((oracleDb(m) < target) == rising) lo = m; else hi = m;
        }
        return Math.sqrt(lo * hi);
    }

    @Test
    void butterworthBandPass_sweepWithReference_matchesAnalyticMagnitudeAndPhase() {
        double[] x = sweep(2, 46000, 10, 0.5);
        double[] y = filter(LP, filter(HP, x));
        FrequencyResponse r = SweepResponse.measure(y, x, FS, true, Band.AUDIO_20_20K);
        double worst = 0, worstPhase = 0;
        for (FrequencyResponse.Point p : r.points()) {
            if (p.frequencyHz() < 20 || p.frequencyHz() > 20000) continue;
            worst = Math.max(worst, Math.abs(p.gainDb() - oracleDb(p.frequencyHz())));
            worstPhase = Math.max(worstPhase, Math.abs(Analyzer.wrapDeg(p.phaseDeg() - oraclePhaseDeg(p.frequencyHz()))));
        }
        assertTrue(worst <= 0.05, "gain within 0.05 dB of the analytic magnitude in 20 Hz–20 kHz (worst " + worst + " dB)");
        assertTrue(worstPhase <= 1, "phase within 1° (worst " + worstPhase + "°)");
        double low = oracleMinus3(3, 100), high = oracleMinus3(5000, 45000);
        assertEquals(low, r.minus3dbLowHz().getAsDouble(), 0.01 * low, "−3 dB low point within 1 %");
        assertEquals(high, r.minus3dbHighHz().getAsDouble(), 0.01 * high, "−3 dB high point within 1 %");
        assertEquals(10, low, 0.1, "pre-warped bilinear design: −3 dB at the design frequency (re 1 kHz, nearly)");
        // deviation in 20 Hz–20 kHz re 1 kHz, from the oracle on a fine grid
        double min = 0, max = 0;
        for (double f = 20; f <= 20000; f *= 1.001) { double g = oracleDb(f) - oracleDb(1000); min = Math.min(min, g); max = Math.max(max, g); }
        assertEquals(min, r.deviationMinDb(), 0.05);
        assertEquals(max, r.deviationMaxDb(), 0.05);
    }

    @Test
    void secondOrderNonlinearity_thdVsFrequencyReadsHalfA2TimesAmplitude() {
        // y = x + a2·x²: a sine of amplitude A gives a 2nd harmonic of a2·A²/2, THD_F = a2·A/2 (§6.4 Chebyshev identity)
        double a = 0.5, a2 = 0.02;
        double[] x = sweep(20, 20000, 10, a);
        double[] y = new double[x.length];
        for (int i = 0; i < x.length; i++) y[i] = x[i] + a2 * x[i] * x[i];
        FrequencyResponse r = SweepResponse.measure(y, x, FS, true, Band.AUDIO_20_20K);
        assertFalse(r.thdVsFrequency().isEmpty());
        int checked = 0;
        for (FrequencyResponse.ThdPoint p : r.thdVsFrequency()) {
            if (p.frequencyHz() < 100 || p.frequencyHz() > 5000) continue;
            assertEquals(a2 * a / 2, p.thdRatio(), 0.05 * a2 * a / 2, "THD at " + p.frequencyHz() + " Hz");
            checked++;
        }
        assertTrue(checked > 50);
    }

    @Test
    void notASweep_isRefused() {
        double[] x = new double[96000];
        for (int i = 0; i < x.length; i++) x[i] = Math.sin(2 * Math.PI * 1000 * i / FS);
        try {
            SweepResponse.measure(x, x, FS, true, Band.AUDIO_20_20K);
            throw new AssertionError("a single tone must be refused");
        } catch (IllegalArgumentException e) {
            assertTrue(e.getMessage().contains("sweep"), e.getMessage());
        }
    }
}

package org.outstage.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.jtransforms.fft.DoubleFFT_1D;
import org.junit.jupiter.api.Test;

/**
 * Output impedance against frequency from two sweeps (docs/methods.md §7f): a source Z_s = R0 + jωL0 into
 * R_L = 8 Ω, the divider applied here in the frequency domain so the oracle does not share the code under test.
 */
public class ImpedanceVsFrequencyTest {
    static final double FS = 96000, F1 = 20, F2 = 20000, T = 4, RL = 8, R0 = 0.05, L0 = 5e-6;

    /** Farina's exponential sweep x(t) = sin(2π·f1·L·(e^{t/L} − 1)), L = T/ln(f2/f1), 10 ms raised-cosine fades. */
    public static double[] sweep(double fs, double f1, double f2, double seconds, double amplitude) {
        int n = (int) Math.round(seconds * fs);
        double l = seconds / Math.log(f2 / f1);
        int fade = (int) (0.01 * fs);
        double[] x = new double[n];
        for (int i = 0; i < n; i++) {
            double t = i / fs;
            double w = 1;
            if (i < fade) w = 0.5 - 0.5 * Math.cos(Math.PI * i / fade);
            else if (i >= n - fade) w = 0.5 - 0.5 * Math.cos(Math.PI * (n - 1 - i) / fade);
            x[i] = amplitude * w * Math.sin(2 * Math.PI * f1 * l * (Math.exp(t / l) - 1));
        }
        return x;
    }

    /** y = x through R_L/(R_L + R0 + jωL0): FFT of the zero-padded signal (power of two), multiply, inverse. */
    public static double[] divider(double[] x, double fs, double rl, double r0, double l0) {
        int m = Integer.highestOneBit(x.length) << 2;
        double[] z = new double[2 * m];
        for (int i = 0; i < x.length; i++) z[2 * i] = x[i];
        DoubleFFT_1D fft = new DoubleFFT_1D(m);
        fft.complexForward(z);
        for (int k = 0; k < m; k++) {
            double f = (k <= m / 2 ? k : k - m) * fs / m;            // signed: the negative half gets the conjugate
            double dr = rl + r0, di = 2 * Math.PI * f * l0;          // R_L + Z_s
            double den = dr * dr + di * di, hr = rl * dr / den, hi = -rl * di / den;
            double a = z[2 * k], b = z[2 * k + 1];
            z[2 * k] = a * hr - b * hi;
            z[2 * k + 1] = a * hi + b * hr;
        }
        fft.complexInverse(z, true);
        double[] y = new double[x.length];
        for (int i = 0; i < y.length; i++) y[i] = z[2 * i];
        return y;
    }

    static double zsMag(double f) { return Math.hypot(R0, 2 * Math.PI * f * L0); }

    static double zsPhaseDeg(double f) { return Math.toDegrees(Math.atan2(2 * Math.PI * f * L0, R0)); }

    static OutputImpedance.VersusFrequency run(boolean swap) {
        double[] ref = sweep(FS, F1, F2, T, 0.5);
        double[] open = new double[ref.length];
        for (int i = 0; i < ref.length; i++) open[i] = 1.6 * ref[i];
        double[] loaded = divider(open, FS, RL, R0, L0);
        FrequencyResponse ho = SweepResponse.measure(open, ref, FS, true, Band.AUDIO_20_20K);
        FrequencyResponse hl = SweepResponse.measure(loaded, ref, FS, true, Band.AUDIO_20_20K);
        return swap ? OutputImpedance.againstFrequency(hl, ho, RL) : OutputImpedance.againstFrequency(ho, hl, RL);
    }

    @Test
    void inductiveSource_readsItsMagnitudeAndPhase() {
        OutputImpedance.VersusFrequency z = run(false);
        assertTrue(z.points().size() <= OutputImpedance.MAX_POINTS && z.points().size() > 50, "points: " + z.points().size());
        double worstRel = 0, worstDeg = 0, atRel = 0, atDeg = 0;
        int checked = 0;
        for (OutputImpedance.Point p : z.points()) {
            double f = p.frequencyHz();
            assertTrue(f >= 20 * (1 - 1e-9) && f <= 20000 * (1 + 1e-9), "outside 20 Hz-20 kHz: " + f);
            if (f < 50 || f > 15000) continue;
            checked++;
            double rel = Math.abs(p.zOutOhms() / zsMag(f) - 1), deg = Math.abs(p.zOutPhaseDeg() - zsPhaseDeg(f));
            if (rel > worstRel) { worstRel = rel; atRel = f; }
            if (deg > worstDeg) { worstDeg = deg; atDeg = f; }
        }
        System.out.printf("ImpedanceVsFrequencyTest: %d points 50 Hz-15 kHz, worst |Z| error %.3f %% at %.0f Hz, worst phase error %.3f deg at %.0f Hz%n",
                checked, 100 * worstRel, atRel, worstDeg, atDeg);
        assertTrue(checked > 50);
        assertTrue(worstRel < 0.02, "worst |Z| error " + worstRel + " at " + atRel + " Hz");
        assertTrue(worstDeg < 2, "worst phase error " + worstDeg + " deg at " + atDeg + " Hz");
        OutputImpedance.Point k = z.nearest(1000);
        assertEquals(1000, k.frequencyHz(), 1000 * 0.03);
        double df = RL / zsMag(k.frequencyHz());
        assertEquals(df, k.dampingFactor(), 0.02 * df, "DF = R_L/|Z_s| at 1 kHz");
    }

    @Test
    void interpolation_isLinearInLogFrequency_andUnwrapsPhase() {
        var pts = java.util.List.of(new FrequencyResponse.Point(100, 0, 0, 170), new FrequencyResponse.Point(400, 6, 6, -170));
        double[] g = OutputImpedance.interpolate(pts, 200);
        assertEquals(3, g[0], 1e-12);
        assertEquals(180, Math.abs(g[1]), 1e-9, "170° to −170° passes through 180°, not 0°");
    }
}

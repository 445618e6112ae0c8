package org.outstage.stimulus;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.OptionalDouble;
import org.apache.commons.math3.complex.Complex;
import org.apache.commons.math3.transform.DftNormalization;
import org.apache.commons.math3.transform.FastFourierTransformer;
import org.apache.commons.math3.transform.TransformType;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Measurement;
import org.outstage.capture.SampleUnit;
import org.junit.jupiter.api.Test;

/**
 * The generator checked against Commons Math's FFT (an independent transform) with a Kaiser window of β = 20,
 * whose sidelobes lie near −190 dB (Kaiser and Schafer 1980: sidelobe attenuation ≈ β/0.1102 + 8.7 dB), and against
 * the project's analyzer.
 */
class GeneratorTest {
    private static final double FS = 96_000;
    private static final int N = 1 << 18;

    @Test
    void sine_doubleAndFloatOutput_spursAndNoiseBelowMinus150Dbc() {
        // 997 Hz: not a submultiple of common rates (AES17 practice, docs/references.md §2), so the increment is not dyadic.
        Generator g = Generator.of(new Stimulus.Sine(997), FS, -20, 1, false);
        g.render(5_000_000); // run 52 s first: the phase must not degrade with time (range reduction)
        double[] x = g.render(N);
        Lines d = lines(x, 997);
        // Requirement of issue 9: spurs and noise below −150 dBc. Spur = largest bin outside the main lobe; noise = their sum.
        assertTrue(d.maxSpurDbc < -150, "double output: largest spur " + d.maxSpurDbc + " dBc");
        assertTrue(d.totalOtherDbc < -150, "double output: total outside the tone " + d.totalOtherDbc + " dBc");
        double[] f = new double[N];
        for (int i = 0; i < N; i++) f[i] = (float) x[i];
        Lines fl = lines(f, 997);
        assertTrue(fl.maxSpurDbc < -150, "float output: largest spur " + fl.maxSpurDbc + " dBc");
        // The float32 rounding noise is near −150 dBc in total (24-bit mantissa); the issue asks for the spurs of float
        // output, so only the spurs are asserted there, the total is reported.
        System.out.println("sine 997 Hz: double spur " + d.maxSpurDbc + " dBc, noise " + d.totalOtherDbc + " dBc; float spur " + fl.maxSpurDbc
                + " dBc, noise " + fl.totalOtherDbc + " dBc");
    }

    @Test
    void sine_level_isPeakDbfs_byAnalyzerAndByFft() {
        Generator g = Generator.of(new Stimulus.Sine(997), FS, -20, 1, false);
        double[] x = g.render(N);
        double amplitude = Math.pow(10, -20 / 20.0);
        // A sine of peak A has rms A/√2 (textbook; docs/references.md §2 dBFS definition).
        Measurement m = Analyzer.analyze(x, FS, SampleUnit.FULL_SCALE);
        assertEquals(997.0, m.fundamental().frequencyHz(), 1e-6);
        assertEquals(amplitude / Math.sqrt(2), m.fundamental().rms(), 1e-9 * amplitude);
        assertTrue(m.thdN().db() < -120, "analyzer THD+N of the double output " + m.thdN().db() + " dB");
        // FFT: the window-weighted line amplitude 2|X|/Σw (docs/references.md §11, FFT amplitude scaling), summed over
        // the main lobe in power, equals A.
        assertEquals(amplitude, lines(x, 997).toneAmplitude, 1e-6 * amplitude);
    }

    @Test
    void twin_twoEqualLines_peakWithinLevel() {
        Generator g = Generator.of(new Stimulus.Twin(1000, 1300), FS, -20, 1, false);
        double[] x = g.render(N);
        double a1 = lines(x, 1000).toneAmplitude;
        double a2 = lines(x, 1300).toneAmplitude;
        double amplitude = Math.pow(10, -20 / 20.0);
        // Each tone carries half the peak level, so the sum never exceeds it (definition in Stimulus.Twin).
        assertEquals(amplitude / 2, a1, 1e-6 * amplitude);
        assertEquals(amplitude / 2, a2, 1e-6 * amplitude);
        assertTrue(peak(x) <= amplitude * (1 + 1e-12));
    }

    @Test
    void smpte_lowToHighIsFourToOne() {
        Generator g = Generator.of(new Stimulus.Smpte(60, 7000), FS, -20, 1, false);
        double[] x = g.render(N);
        double low = lines(x, 60).toneAmplitude;
        double high = lines(x, 7000).toneAmplitude;
        // SMPTE RP120 practice: 4:1 amplitude, 20·lg 4 = 12.041 dB (docs/references.md §11 decibel identities: 2 × 6.0206).
        assertEquals(12.0412, 20 * Math.log10(low / high), 1e-3);
    }

    @Test
    void sweep_zeroCrossings_matchFarinaPhase() {
        double t = 2.0;
        Generator g = Generator.of(new Stimulus.Sweep(20, 20000, OptionalDouble.empty()), FS, -20, t, false);
        SweepParameters p = g.sweepParameters().orElseThrow();
        // L = T/ln(f2/f1) (Farina 2000; docs/references.md §13).
        assertEquals(t / Math.log(1000), p.rateSeconds(), 1e-12);
        double[] x = g.render((int) (t * FS));
        // Total phase of the sweep: f1·L·(f2/f1 − 1) cycles = L·(f2 − f1); two zero crossings per cycle.
        double cycles = p.rateSeconds() * (20000 - 20);
        int crossings = 0;
        for (int i = 1; i < x.length; i++) if ((x[i - 1] < 0) != (x[i] < 0) && x[i] != 0 && x[i - 1] != 0) crossings++;
        assertEquals(2 * cycles, crossings, 6, "zero crossings of the sweep");
        // The local frequency at mid-sweep: count crossings over 10 ms around t = T/2 and compare with f1·exp(t/L).
        int mid = (int) (t / 2 * FS);
        int span = (int) (0.01 * FS);
        int c = 0;
        for (int i = mid - span / 2 + 1; i < mid + span / 2; i++) if ((x[i - 1] < 0) != (x[i] < 0)) c++;
        double expected = p.frequencyAtHz(t / 2) * 0.01 * 2;
        assertEquals(expected, c, 2, "crossings in 10 ms at mid-sweep (" + p.frequencyAtHz(t / 2) + " Hz)");
        // Fades: starts and ends at zero.
        assertEquals(0.0, x[0], 1e-15);
        assertTrue(Math.abs(x[x.length - 1]) < 1e-3 * Math.pow(10, -1.0));
    }

    @Test
    void burst_onCyclesThenExactSilence() {
        double f = 1000;
        Generator g = Generator.of(new Stimulus.Burst(f, 3, 5), FS, -20, 1, false);
        double[] x = g.render((int) (8 / f * FS) * 2); // two periods of 8 cycles
        int period = (int) Math.round(8 / f * FS);
        int on = (int) Math.round(3 / f * FS);
        for (int i = on + 1; i < period; i++) assertEquals(0.0, x[i], 0.0, "off part sample " + i);
        int crossings = 0;
        for (int i = 1; i < on; i++) if ((x[i - 1] < 0) != (x[i] < 0)) crossings++;
        // Three whole cycles starting at zero phase: 5 interior sign changes (common practice for tone bursts).
        assertEquals(5, crossings);
        assertEquals(0.0, x[period], 1e-9, "second burst starts at zero phase");
        assertTrue(x[period + 5] > 0);
    }

    @Test
    void silence_isZero() {
        double[] x = Generator.of(new Stimulus.Silence(), FS, -20, 1, false).render(1000);
        for (double v : x) assertEquals(0.0, v, 0.0);
    }

    @Test
    void levelAboveSafeStart_isRefusedUnlessAllowed() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> Generator.of(new Stimulus.Sine(1000), FS, -10, 1, false));
        assertTrue(e.getMessage().contains("--allow-loud"), e.getMessage());
        Generator.of(new Stimulus.Sine(1000), FS, -10, 1, true);
        assertThrows(IllegalArgumentException.class, () -> Generator.of(new Stimulus.Sine(1000), FS, 1, 1, true));
        assertThrows(IllegalArgumentException.class, () -> Generator.of(new Stimulus.Sine(50_000), FS, -30, 1, false));
    }

    @Test
    void levelChange_rampsOverAtLeast50Ms() {
        Generator g = Generator.of(new Stimulus.Sine(997), FS, -20, 1, false);
        g.render(1000);
        g.rampTo(-40, 0, false);
        double[] x = g.render((int) FS / 10);
        double before = Math.pow(10, -1.0);
        double after = Math.pow(10, -2.0);
        // Peak envelope in 5 ms slices must fall gradually: at 25 ms about half way, at 50 ms at the target.
        double mid = peak(java.util.Arrays.copyOfRange(x, (int) (0.024 * FS), (int) (0.026 * FS)));
        assertTrue(mid > after * 1.2 && mid < before * 0.9, "peak at 25 ms " + mid);
        double end = peak(java.util.Arrays.copyOfRange(x, (int) (0.051 * FS), x.length));
        assertEquals(after, end, after * 1e-3);
        // Fade-in from silence: first sample zero, level reached after 50 ms.
        Generator h = Generator.of(new Stimulus.Sine(997), FS, -20, 1, false).fadeIn(0);
        double[] y = h.render((int) FS / 10);
        assertTrue(peak(java.util.Arrays.copyOfRange(y, 0, (int) (0.01 * FS))) < before * 0.25);
        assertEquals(before, peak(java.util.Arrays.copyOfRange(y, (int) (0.051 * FS), y.length)), before * 1e-3);
        h.fadeOut();
        h.render((int) (0.06 * FS));
        assertTrue(h.isSilent());
    }

    @Test
    void dither_isTriangularOverOneLsbEachSide() {
        Dither d = new Dither(42);
        int bits = 16;
        double q = Dither.lsb(bits);
        assertEquals(1.0 / 32768, q, 0);
        int n = 200_000;
        double sum = 0, sum2 = 0, max = 0;
        int centre = 0;
        for (int i = 0; i < n; i++) {
            double v = d.next(bits) / q;
            sum += v;
            sum2 += v * v;
            max = Math.max(max, Math.abs(v));
            if (Math.abs(v) < 0.5) centre++;
        }
        // TPDF over ±1 LSB: mean 0, variance 1/6 LSB² (sum of two uniform variances 1/12), P(|v| < ½) = 3/4
        // (Vanderkooy and Lipshitz 1987; textbook probability).
        assertEquals(0, sum / n, 0.005);
        assertEquals(1.0 / 6, sum2 / n, 0.003);
        assertTrue(max <= 1.0);
        assertEquals(0.75, centre / (double) n, 0.005);
    }

    @Test
    void parse_readsEveryFormAndRefusesNonsense() {
        assertEquals(new Stimulus.Sine(997), Stimulus.parse("sine:997"));
        assertEquals(new Stimulus.Twin(19000, 20000), Stimulus.parse("twin:19k,20k"));
        assertEquals(new Stimulus.Smpte(60, 7000), Stimulus.parse("smpte:60,7000"));
        assertEquals(new Stimulus.Sweep(20, 20000, OptionalDouble.empty()), Stimulus.parse("sweep:20-20k"));
        assertEquals(new Stimulus.Sweep(20, 20000, OptionalDouble.of(2)), Stimulus.parse("sweep:20-20000,2"));
        assertEquals(new Stimulus.Burst(1000, 3, 5), Stimulus.parse("burst:1000,3,5"));
        assertEquals(new Stimulus.Silence(), Stimulus.parse("silence"));
        for (String s : new String[] {"sine:997", "twin:1000,1300", "smpte:60,7000", "sweep:20-20000", "burst:1000,3,5", "silence"})
            assertEquals(s, Stimulus.parse(s).spec());
        for (String bad : new String[] {"", "sine", "sine:x", "sine:-5", "twin:1000", "smpte:7000,60", "sweep:20", "burst:1k,0,5", "saw:100"}) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> Stimulus.parse(bad), bad);
            assertTrue(e.getMessage().length() > 10, e.getMessage());
        }
    }

    private static double peak(double[] x) {
        double m = 0;
        for (double v : x) m = Math.max(m, Math.abs(v));
        return m;
    }

    private record Lines(double toneAmplitude, double maxSpurDbc, double totalOtherDbc) {}

    /** Kaiser (β = 20) windowed spectrum through Commons Math; tone = main lobe around {@code hz}. */
    private static Lines lines(double[] x, double hz) {
        int n = x.length;
        double beta = 20;
        double[] w = new double[n];
        double i0b = besselI0(beta);
        double sumW = 0;
        for (int i = 0; i < n; i++) {
            double r = 2.0 * i / n - 1;
            w[i] = besselI0(beta * Math.sqrt(Math.max(0, 1 - r * r))) / i0b;
            sumW += w[i];
        }
        double[] y = new double[n];
        for (int i = 0; i < n; i++) y[i] = x[i] * w[i];
        Complex[] c = new FastFourierTransformer(DftNormalization.STANDARD).transform(y, TransformType.FORWARD);
        double binHz = FS / n;
        int k0 = (int) Math.round(hz / binHz);
        int lobe = 12; // Kaiser β = 20 main lobe half-width ≈ √(1 + (β/π)²) ≈ 6.4 bins; doubled for margin
        double tone = 0, other = 0, maxOther = 0;
        for (int k = 1; k < n / 2; k++) {
            double a = 2 * c[k].abs() / sumW;
            double p = a * a;
            if (Math.abs(k - k0) <= lobe) tone += p;
            else {
                other += p;
                maxOther = Math.max(maxOther, p);
            }
        }
        // Power summed over the main lobe: Σ|W|² / |ΣW|² = ENBW in bins (docs/references.md §11), so divide by it.
        double enbw = 0;
        for (double v : w) enbw += v * v;
        enbw = enbw * n / (sumW * sumW);
        double amp = Math.sqrt(tone / enbw);
        return new Lines(amp, 10 * Math.log10(maxOther / (amp * amp) + 1e-300), 10 * Math.log10(other / enbw / (amp * amp) + 1e-300));
    }

    private static double besselI0(double x) {
        double sum = 1, term = 1, q = x * x / 4;
        for (int k = 1; k < 200; k++) {
            term *= q / ((double) k * k);
            sum += term;
            if (term < 1e-17 * sum) break;
        }
        return sum;
    }
}

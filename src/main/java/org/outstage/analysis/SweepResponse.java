package org.outstage.analysis;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.OptionalDouble;
import org.jtransforms.fft.DoubleFFT_1D;
import org.outstage.Require;

/**
 * Frequency response and THD against frequency from an exponential sine sweep, after A. Farina, "Simultaneous
 * measurement of impulse response and distortion with a swept-sine technique", AES 108th Convention (2000),
 * preprint 5093 (docs/references.md §13).
 *
 * <p>Method: the output is deconvolved by the stimulus in the frequency domain, {@code H = Y·X* / (|X|² + ε)}
 * (the H1 estimator; ε = 10⁻⁶ of the in-band level of |X|²·f, so bins outside the sweep give 0 instead of
 * noise over nothing). With an exponential sweep x(t) = sin(2π·f1·T/L·(e^{t·L/T} − 1)), L = ln(f2/f1), the
 * impulse response of the N-th harmonic lands Δt_N = T·ln(N)/L before the linear one, so a time window around
 * t = 0 keeps the linear response and windows around −Δt_N keep the harmonic responses: the N-th harmonic of
 * an input at f reads |H_N(N·f)| relative to the input level (the harmonic's own sweep moves at the same rate
 * in log frequency, so its spectral density matches the stimulus's at N·f). THD_F(f) = √(Σ_N |H_N(N·f)|²)/|H_1(f)|.
 *
 * <p>Assumptions: the stimulus (a captured reference channel or the generated sweep aligned to the capture) is
 * an exponential sweep of constant amplitude; the system's impulse response is shorter than half the spacing
 * Δt_2 = T·ln2/L (0.5 s for 10 s over 20 Hz–20 kHz); gain points are power averages over ±1/48 octave, phases
 * the value at the nearest bin.
 *
 * <p>Worked example (replayed in {@code SweepResponseTest}): a 10 s, 96 kHz sweep from 2 Hz to 46 kHz through
 * a second-order Butterworth band-pass (10 Hz, 30 kHz, bilinear) reads its −3 dB points at 10 Hz and 30 kHz.
 */
public final class SweepResponse {
    private SweepResponse() {}

    /** Halved power, 10·lg(1/2). */
    static final double MINUS_3DB = -10 * Math.log10(2);
    static final int MAX_ORDER = 5;

    /**
     * The one rule (verify, impedance and the workbench) for taking a capture with a generator channel for a sweep: the
     * stimulus is stated as a sweep, or, with no stated stimulus, the analysis found no single tone. The two-tone and
     * noise figures the analysis may then also read do not count (a sweep's moving spectrum can pass for two tones, and
     * a capture whose generator channel carries a signal is not a noise capture): whether it is a sweep is
     * {@link #measure}'s to say, and it refuses what is not one (less than two octaves swept).
     */
    public static boolean sweepCandidate(Measurement m, StimulusKind stated) {
        return stated == StimulusKind.SWEEP || (stated == StimulusKind.AUTO && !m.measured());
    }

    /**
     * Measures the response of {@code output} to {@code stimulus} (same sample rate, same length or not).
     *
     * @param fromReference whether the stimulus is a captured reference (reported in the result)
     * @param deviationBand band over which the deviation is reported (e.g. 20 Hz–20 kHz)
     * @throws IllegalArgumentException when the stimulus carries no sweep
     */
    public static FrequencyResponse measure(double[] output, double[] stimulus, double sampleRateHz, boolean fromReference, Band deviationBand) {
        return measure(output, stimulus, sampleRateHz, fromReference, deviationBand, false);
    }

    /**
     * As {@link #measure(double[], double[], double, boolean, Band)}; with {@code align}, the stimulus is the known
     * generated sweep rather than a captured reference: where the sweep starts in the capture is found by
     * cross-correlation (the peak of the deconvolved impulse response, which is the cross-correlation with the
     * inverse filter) and the responses are taken relative to it, so the phase excludes that delay (and with it
     * any latency of the amplifier and the soundcard).
     */
    public static FrequencyResponse measure(double[] output, double[] stimulus, double sampleRateHz, boolean fromReference, Band deviationBand,
                                            boolean align) {
        Require.notNull("output", output);
        Require.notNull("stimulus", stimulus);
        Require.positive("sampleRateHz", sampleRateHz);
        double fs = sampleRateHz;
        int n = Math.max(output.length, stimulus.length);
        if (n < 1024) throw new IllegalArgumentException("sweep record too short: " + n + " samples (at least 1024)");
        int nfft = Integer.highestOneBit(n) << 2;   // ≥ 2n: linear, not circular, deconvolution
        double[] x = Arrays.copyOf(stimulus, nfft);
        double[] y = Arrays.copyOf(output, nfft);
        DoubleFFT_1D fft = Fft.of(nfft);
        fft.realForward(x);
        fft.realForward(y);
        int half = nfft / 2;
        double binW = fs / nfft;
        // the swept band: where |X|²·k (flat for an exponential sweep) is within 3 dB of its in-band level
        // (w = |X|²·k is recomputed where needed rather than stored, and h serves as scratch for the median:
        // each 2^21-point array less is 16 MB less to allocate and collect)
        double wMax = 0;
        for (int k = 1; k < half; k++) wMax = Math.max(wMax, (x[2 * k] * x[2 * k] + x[2 * k + 1] * x[2 * k + 1]) * k);
        if (!(wMax > 0)) throw new IllegalArgumentException("the stimulus is silent");
        double[] h = new double[nfft];
        int ns = 0;
        for (int k = 1; k < half; k++) {
            double wk = (x[2 * k] * x[2 * k] + x[2 * k + 1] * x[2 * k + 1]) * k;
            if (wk > 1e-3 * wMax) h[ns++] = wk;
        }
        double level = Stats.median(h, ns);
        int kLo = -1, kHi = -1;
        for (int k = 1; k < half; k++)
            if ((x[2 * k] * x[2 * k] + x[2 * k + 1] * x[2 * k + 1]) * k >= 0.5 * level) { if (kLo < 0) kLo = k; kHi = k; }
        double fLo = kLo * binW, fHi = kHi * binW;
        if (!(fHi > 4 * fLo)) throw new IllegalArgumentException("the stimulus is not a sweep of at least two octaves (found "
                + Levels.formatHz(fLo) + "–" + Levels.formatHz(fHi) + ")");
        double eps = 1e-6 * level;
        // a raised-cosine taper in log frequency over the first third and the last sixth of an octave of the swept
        // band: the impulse responses then decay fast instead of ringing for seconds at the band's sharp edges
        // (which would leak into the harmonic windows); the reported band starts where the taper is 1
        double tLo = fLo * Math.pow(2, 2.0 / 3), tHi = fHi / Math.pow(2, 1.0 / 6);
        double[] hp = highPassTable(half, binW, tLo);
        h[0] = 0;
        h[1] = 0;
        for (int k = 1; k < half; k++) {
            double f = k * binW;
            double g = f <= fLo || f >= fHi ? 0
                    : f > tHi ? 0.5 * (1 - Math.cos(Math.PI * Math.log(fHi / f) / Math.log(fHi / tHi))) : 1;
            if (g == 0) { h[2 * k] = 0; h[2 * k + 1] = 0; continue; }
            double xr = x[2 * k], xi = x[2 * k + 1], yr = y[2 * k], yi = y[2 * k + 1];
            double d = xr * xr + xi * xi + eps / k;
            double hr = g * (yr * xr + yi * xi) / d, hi = g * (yi * xr - yr * xi) / d;
            double cr = hp[2 * k], ci = hp[2 * k + 1];
            h[2 * k] = hr * cr - hi * ci;
            h[2 * k + 1] = hr * ci + hi * cr;
        }
        fft.realInverse(h, true);
        if (align) {
            int p = 0;
            for (int i = 1; i < nfft; i++) if (Math.abs(h[i]) > Math.abs(h[p])) p = i;
            double[] r = y;   // the output's spectrum is no longer needed: its array takes the rotated response
            System.arraycopy(h, p, r, 0, nfft - p);
            System.arraycopy(h, 0, r, nfft - p, p);
            h = r;
        }
        // sweep duration from the stimulus envelope (constant amplitude while it sweeps)
        double peak = 0;
        for (double v : stimulus) peak = Math.max(peak, Math.abs(v));
        int first = 0, last = stimulus.length - 1;
        while (first < last && Math.abs(stimulus[first]) < 0.1 * peak) first++;
        while (last > first && Math.abs(stimulus[last]) < 0.1 * peak) last--;
        double tSweep = (last - first + 1) / fs;
        double lnRatio = Math.log(fHi / fLo);
        double[] dt = new double[MAX_ORDER + 2];
        for (int m = 1; m <= MAX_ORDER + 1; m++) dt[m] = tSweep * Math.log(m) / lnRatio;

        // linear response: from −Δt_2/2 (faded in over its first half) to +nfft/2
        int pre = (int) Math.min(nfft / 4, Math.floor(dt[2] / 2 * fs));
        double[] lin = x;   // the stimulus's spectrum is no longer needed
        System.arraycopy(h, 0, lin, 0, half);
        Arrays.fill(lin, half, nfft - pre, 0);
        for (int i = 1; i <= pre; i++) {
            double t = (double) (i - 1) / pre;  // 0 at −1 sample, 1 at −pre
            double g = t < 0.5 ? 1 : 0.5 * (1 + Math.cos(Math.PI * (t - 0.5) / 0.5));
            lin[nfft - i] = h[nfft - i] * g;
        }
        fft.realForward(lin);
        undoHighPass(lin, hp);

        double lo = tLo * 1.02, hi = tHi / 1.02;
        List<FrequencyResponse.Point> raw = new ArrayList<>();
        double step = Math.pow(2, 1.0 / 24);
        double ref1k = 1000 >= lo && 1000 <= hi ? gainDbAt(lin, 1000, binW, half) : gainDbAt(lin, Math.sqrt(lo * hi), binW, half);
        for (double f = lo; f <= hi * (1 + 1e-9); f *= step) {
            double g = gainDbAt(lin, f, binW, half);
            raw.add(new FrequencyResponse.Point(f, g, g - ref1k, phaseDegAt(lin, f, binW, half)));
        }
        double fRef = 1000 >= lo && 1000 <= hi ? 1000 : Math.sqrt(lo * hi);
        OptionalDouble low = crossing(lin, raw, fRef, ref1k + MINUS_3DB, binW, half, true);
        OptionalDouble high = crossing(lin, raw, fRef, ref1k + MINUS_3DB, binW, half, false);
        double dLo = Math.max(deviationBand.lowHz(), lo), dHi = Math.min(deviationBand.effectiveHighHz(fs), hi);
        double dMin = Double.POSITIVE_INFINITY, dMax = Double.NEGATIVE_INFINITY;
        for (FrequencyResponse.Point p : raw) {
            if (p.frequencyHz() < dLo || p.frequencyHz() > dHi) continue;
            dMin = Math.min(dMin, p.gainRe1kHzDb());
            dMax = Math.max(dMax, p.gainRe1kHzDb());
        }
        if (dMin > dMax) { dMin = Double.NaN; dMax = Double.NaN; }

        // harmonic responses N = 2…5: windows between the midpoints to the neighbouring responses
        List<FrequencyResponse.ThdPoint> thd = new ArrayList<>();
        int orders = 0;
        double[][] hn = new double[MAX_ORDER + 1][];
        for (int m = 2; m <= MAX_ORDER; m++) {
            double from = -(dt[m] + dt[m + 1]) / 2, to = -(dt[m] + dt[m - 1]) / 2;
            int i0 = (int) Math.ceil(from * fs), i1 = (int) Math.floor(to * fs);
            if (-i0 >= nfft / 2 || i1 - i0 < 16) break;
            int centre = (int) Math.round(-dt[m] * fs);
            // a shorter transform (four times the window, at least 2^14) is enough for ±1/48-octave points
            int len = Math.min(nfft, Math.max(1 << 14, Integer.highestOneBit(i1 - i0 + 1) << 3));
            double[] seg = new double[len];
            int fade = Math.max(1, (i1 - i0) / 8);   // half-Hann edges over an eighth of the window each side
            for (int i = i0; i <= i1; i++) {
                int e = Math.min(i - i0, i1 - i);
                double g = e >= fade ? 1 : 0.5 * (1 - Math.cos(Math.PI * e / fade));
                seg[Math.floorMod(i - centre, len)] = g * h[Math.floorMod(i, nfft)];
            }
            Fft.of(len).realForward(seg);
            undoHighPass(seg, highPassTable(len / 2, fs / len, tLo));
            hn[m] = seg;
            orders = m;
        }
        if (orders >= 2) {
            for (FrequencyResponse.Point p : raw) {
                double f = p.frequencyHz();
                if (2 * f > hi) break;
                double g1 = Math.pow(10, p.gainDb() / 10 * 0.5);
                double s = 0;
                for (int m = 2; m <= orders; m++) {
                    if (m * f > hi) break;
                    double gm = Math.pow(10, gainDbAt(hn[m], m * f, fs / hn[m].length, hn[m].length / 2) / 20);
                    s += gm * gm;
                }
                thd.add(new FrequencyResponse.ThdPoint(f, Math.sqrt(s) / g1));
            }
        }
        return new FrequencyResponse(raw, ref1k, low, high, dLo, dHi, dMin, dMax, thd, fLo, fHi, tSweep, fromReference);
    }

    /**
     * A fourth-order Butterworth high-pass at {@code fcHz} (two analog biquads, Q = 0.5412 and 1.3066), complex gain at
     * {@code fHz}. The deconvolved response is multiplied by it before the time windows and divided by it after:
     * being causal and minimum-phase, it moves the ringing of the swept band's low edge to positive times, where the
     * linear window keeps it, instead of letting it spread before t = 0 into the window's cut (the low edge of an
     * exponential sweep is sharp in Hz, so its ringing lasts seconds).
     */
    static double[] highPass(double fHz, double fcHz) {
        double w = fHz / fcHz;
        double re = 1, im = 0;
        for (double q : new double[] {0.541196100146197, 1.306562964876377}) {
            // s²/(s² + s/Q + 1) at s = jw: −w² / (1 − w² + j·w/Q)
            double nr = -w * w, dr = 1 - w * w, di = w / q;
            double dd = dr * dr + di * di;
            double br = nr * dr / dd, bi = -nr * di / dd;
            double r2 = re * br - im * bi, i2 = re * bi + im * br;
            re = r2;
            im = i2;
        }
        return new double[] {re, im};
    }

    /** {@link #highPass} at bins 0…half−1 of width {@code binW}, interleaved re, im. */
    static double[] highPassTable(int half, double binW, double fcHz) {
        double[] t = new double[2 * half];
        double q1 = 1 / 0.541196100146197, q2 = 1 / 1.306562964876377;
        for (int k = 1; k < half; k++) {
            double w = k * binW / fcHz, w2 = w * w, dr = 1 - w2;
            // (−w²)²/((dr + j·w/Q1)(dr + j·w/Q2)), the same as highPass(f, fc)
            double pr = dr * dr - w2 * q1 * q2, pi = dr * w * (q1 + q2);
            double d = pr * pr + pi * pi, n = w2 * w2;
            t[2 * k] = n * pr / d;
            t[2 * k + 1] = -n * pi / d;
        }
        return t;
    }

    static void undoHighPass(double[] spec, double[] table) {
        for (int k = 1; k < spec.length / 2; k++) {
            double c0 = table[2 * k], c1 = table[2 * k + 1];
            double d = c0 * c0 + c1 * c1;
            if (d < 1e-20) { spec[2 * k] = 0; spec[2 * k + 1] = 0; continue; }
            double r = spec[2 * k], i = spec[2 * k + 1];
            spec[2 * k] = (r * c0 + i * c1) / d;
            spec[2 * k + 1] = (i * c0 - r * c1) / d;
        }
    }

    /** 20·lg of the rms of |H| over ±1/48 octave around f (at least the nearest bin). */
    static double gainDbAt(double[] spec, double f, double binW, int half) {
        double r = Math.pow(2, 1.0 / 48);
        int k0 = Math.max(1, (int) Math.ceil(f / r / binW)), k1 = Math.min(half - 1, (int) Math.floor(f * r / binW));
        if (k1 < k0) { k0 = k1 = Math.max(1, Math.min(half - 1, (int) Math.round(f / binW))); }
        double s = 0;
        for (int k = k0; k <= k1; k++) s += spec[2 * k] * spec[2 * k] + spec[2 * k + 1] * spec[2 * k + 1];
        return 10 * Math.log10(Math.max(s / (k1 - k0 + 1), 1e-300));
    }

    static double phaseDegAt(double[] spec, double f, double binW, int half) {
        int k = Math.max(1, Math.min(half - 1, (int) Math.round(f / binW)));
        return Analyzer.wrapDeg(Math.toDegrees(Math.atan2(spec[2 * k + 1], spec[2 * k])));
    }

    /** Where the gain crosses {@code target} nearest to fRef going down (low) or up (high); bisection between grid points. */
    static OptionalDouble crossing(double[] lin, List<FrequencyResponse.Point> pts, double fRef, double target, double binW, int half, boolean low) {
        int ref = 0;
        for (int i = 0; i < pts.size(); i++) if (Math.abs(Math.log(pts.get(i).frequencyHz() / fRef)) < Math.abs(Math.log(pts.get(ref).frequencyHz() / fRef))) ref = i;
        int dir = low ? -1 : 1;
        for (int i = ref; i + dir >= 0 && i + dir < pts.size(); i += dir) {
            FrequencyResponse.Point a = pts.get(i), b = pts.get(i + dir);
            if (a.gainDb() >= target && b.gainDb() < target) {
                double fa = a.frequencyHz(), fb = b.frequencyHz();
                for (int it = 0; it < 40; it++) {
                    double fm = Math.sqrt(fa * fb);
                    if (gainDbAt(lin, fm, binW, half) >= target) fa = fm; else fb = fm;
                }
                return OptionalDouble.of(Math.sqrt(fa * fb));
            }
        }
        return OptionalDouble.empty();
    }
}

package org.outstage.analysis;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Cosine-sum analysis windows, periodic ("DFT-even") form:
 * {@code w[n] = Σ_k (−1)^k a_k cos(2πkn/N)}, n = 0…N−1. The coefficients are cited beside each constant.
 * The main lobe of a window with K coefficients ends at ±K bins (its first zero), so a spectral line's
 * power is the sum of the bins within K bins of it.
 */
public enum Window {
    /** Hann: 0.5, 0.5. Harris, "On the use of windows for harmonic analysis with the DFT", Proc. IEEE 66(1), 1978. PSLL −31.5 dB. */
    HANN(new double[] {0.5, 0.5}),
    /** 4-term Blackman-Harris, −92 dB: Harris 1978, table 1 (also CMSIS-DSP arm_blackman_harris_92db). Not enough range for −150 dBc lines. */
    BLACKMAN_HARRIS_4(new double[] {0.35875, 0.48829, 0.14128, 0.01168}),
    /**
     * 7-term Blackman-Harris, sidelobes −180 dB: Solomon, "The use of DFT windows in signal-to-noise ratio and
     * harmonic distortion computations", IEEE Trans. Instrum. Meas. 43(2), 1994 (coefficients as transcribed in
     * docs/references.md §5.2). The default window for harmonic analysis.
     */
    BLACKMAN_HARRIS_7(new double[] {0.271051400693424, 0.433297939234485, 0.218122999543110, 0.065925446388031,
            0.010811742098371, 0.000776584825226, 0.000013887217352}),
    /** HFT90D flat-top, −90.2 dB: Heinzel, Rüdiger, Schilling, "Spectrum and spectral density estimation by the DFT", MPI Hannover, 2002, §D (a0 = 1 normalisation). */
    HFT90D(new double[] {1, 1.942604, 1.340318, 0.440811, 0.043097}),
    /** HFT248D flat-top, −248.4 dB: Heinzel et al. 2002, §D (a0 = 1 normalisation). */
    HFT248D(new double[] {1, 1.985844164102, 1.791176438506, 1.282075284005, 0.667777530266, 0.240160796576,
            0.056656381764, 0.008134974479, 0.000624544650, 0.000019808998, 0.000000132974});

    private final double[] a;

    Window(double[] a) { this.a = a; }

    /** The coefficients a_0, a_1, … as published. */
    public double[] coefficients() { return a.clone(); }

    /** Half-width of the main lobe in bins (the first zero): the number of coefficients. */
    public int mainLobeHalfWidthBins() { return a.length; }

    /** Value of the periodic window of length {@code n} at sample {@code i}. */
    public double value(int i, int n) {
        double s = 0;
        double sign = 1;
        for (int k = 0; k < a.length; k++) {
            s += sign * a[k] * Math.cos(2 * Math.PI * k * (double) i / n);
            sign = -sign;
        }
        return s;
    }

    /**
     * The periodic window of length {@code n}. The returned array is shared by a small cache and must not
     * be modified (package-private for that reason).
     */
    double[] samples(int n) {
        Key key = new Key(this, n);
        synchronized (CACHE) {
            double[] w = CACHE.get(key);
            if (w != null) return w;
        }
        double[] w = new double[n];
        // The periodic window is symmetric, w[n − i] = w[i]: the first half (and the middle) is computed, the rest
        // mirrored. cos(kθ) by the Chebyshev recurrence from cos θ, θ = 2πi/n (error ~1e-15, far below the −180 dB
        // sidelobes).
        for (int i = 0; i <= n / 2; i++) {
            double c1 = Math.cos(2 * Math.PI * (double) i / n);
            double ckm1 = 1, ck = c1, s = a[0];
            double sign = -1;
            for (int k = 1; k < a.length; k++) {
                s += sign * a[k] * ck;
                double next = 2 * c1 * ck - ckm1;
                ckm1 = ck;
                ck = next;
                sign = -sign;
            }
            w[i] = s;
        }
        for (int i = n / 2 + 1; i < n; i++) w[i] = w[n - i];
        synchronized (CACHE) {
            CACHE.put(key, w);
            cached += n;
            var it = CACHE.entrySet().iterator();
            while (cached > CACHE_SAMPLES && CACHE.size() > 1) {
                cached -= it.next().getValue().length;
                it.remove();
            }
        }
        return w;
    }

    /**
     * Writes {@code (x[i] − offset)·w[i]} for i = 0…out.length−1 into {@code out}, w the periodic window of length
     * {@code out.length} (kept in a small cache, so repeated use on one length costs no trigonometry).
     */
    public void applyCentred(double[] x, double offset, double[] out) {
        if (x.length < out.length) throw new IllegalArgumentException("x.length=" + x.length + " must be at least out.length=" + out.length);
        double[] w = samples(out.length);
        for (int i = 0; i < out.length; i++) out[i] = (x[i] - offset) * w[i];
    }

    /** Coherent gain Σw/N (a0 for these windows). */
    public double coherentGain(int n) {
        double[] w = samples(n);
        double s = 0;
        for (double v : w) s += v;
        return s / n;
    }

    /** Equivalent noise bandwidth in bins, N·Σw²/(Σw)² (Harris 1978, eq. 15). */
    public double enbwBins(int n) {
        double[] w = samples(n);
        double s = 0, s2 = 0;
        for (double v : w) { s += v; s2 += v * v; }
        return n * s2 / (s * s);
    }

    private record Key(Window window, int n) {
        // written out: a record's generated equals and hashCode link through method handles on first use, which
        // cost a cold command-line run about 10 ms on its critical path (docs/performance.md)
        @Override public boolean equals(Object o) { return o instanceof Key k && k.window == window && k.n == n; }
        @Override public int hashCode() { return 31 * window.hashCode() + n; }
    }

    /**
     * Samples the cache holds at most, over all its windows (least recently used dropped first): 2^22 doubles, 32 MB;
     * enough for the windows of one analysis (the fit's, the spectrum's, the two Hann windows of the peak searches).
     */
    private static final long CACHE_SAMPLES = 1L << 22;
    private static long cached;   // samples in CACHE, guarded by CACHE
    private static final Map<Key, double[]> CACHE = new LinkedHashMap<>(8, 0.75f, true);
}

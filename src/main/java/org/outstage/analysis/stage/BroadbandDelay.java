package org.outstage.analysis.stage;

import java.util.Arrays;
import java.util.Optional;
import org.jtransforms.fft.DoubleFFT_1D;
import org.outstage.analysis.Fft;

/**
 * Delay of the output behind the reference channel read from what is not periodic in the two channels (the
 * generator's broadband noise, which the amplifier passes on), to resolve what the fundamental's phase cannot: a
 * steady sine delayed by a whole period, or by half a period and inverted, looks the same.
 *
 * <p>Method: both channels go through the comb x(t) − x(t − T) (T the fitted period, fractional delay by
 * {@link FractionalDelay}), which removes the tone and all its harmonics; the cross-correlation of the combed
 * channels (by FFT, zero-padded, i.e. linear correlation; C. H. Knapp, G. C. Carter, "The generalized correlation
 * method for estimation of time delay", IEEE Trans. ASSP 24(4), 1976, with unit weighting) then peaks at the
 * broadband delay D with the sign of the gain, with side peaks of half its size and opposite sign at D ± T (the comb's
 * own autocorrelation). The peak is refined to a fraction of a sample by a parabola through it and its two
 * neighbours. It counts as evidence only when it stands {@link #MIN_SIGNIFICANCE} robust standard deviations (median
 * |c| / 0.6745 over the searched lags) above the correlation floor; a purely periodic capture gives none.
 *
 * <p>Assumptions: the generator's noise reaches the output above the amplifier's own noise over the first
 * {@link #MAX_SEGMENT} samples; the delay is shorter than a quarter of that segment. Pure and thread-safe.
 */
final class BroadbandDelay {
    /** Samples used (from the start of the record): a correlation gain of √65536 = 256, 0.68 s at 96 kHz. */
    static final int MAX_SEGMENT = 1 << 16;
    /** Peak over the robust standard deviation of the correlation that counts as evidence (a choice made here). */
    static final double MIN_SIGNIFICANCE = 8;

    private BroadbandDelay() {}

    /**
     * @param lagSamples   delay of the output behind the reference (fractional samples)
     * @param sign         sign of the correlation at the peak: +1 in phase, −1 inverted
     * @param significance peak over the robust standard deviation of the correlation
     */
    record Peak(double lagSamples, int sign, double significance) {}

    /** The broadband peak, or empty when the record is too short or the peak does not stand out. */
    static Optional<Peak> find(double[] output, double[] reference, double periodSamples) {
        int n = Math.min(output.length, MAX_SEGMENT);
        int skip = (int) Math.ceil(periodSamples) + FractionalDelay.HALF_WIDTH + 1;
        int len = n - skip - FractionalDelay.HALF_WIDTH;
        if (len < 256) return Optional.empty();
        double[] a = comb(output, n, periodSamples, skip, len), b = comb(reference, n, periodSamples, skip, len);
        int m = Integer.highestOneBit(2 * len - 1) << 1;
        double[] fa = Arrays.copyOf(a, m), fb = Arrays.copyOf(b, m);
        DoubleFFT_1D fft = Fft.of(m);
        fft.realForward(fa);
        fft.realForward(fb);
        // fa ← fa·conj(fb) in JTransforms' packed real format: [Re0, Re(m/2), Re1, Im1, Re2, Im2, ...]
        fa[0] *= fb[0];
        fa[1] *= fb[1];
        for (int k = 2; k < m; k += 2) {
            double ar = fa[k], ai = fa[k + 1], br = fb[k], bi = fb[k + 1];
            fa[k] = ar * br + ai * bi;
            fa[k + 1] = ai * br - ar * bi;
        }
        fft.realInverse(fa, true);
        // fa[τ] = Σ a[k + τ]·b[k] (τ ≥ 0 at fa[τ], τ < 0 at fa[m + τ])
        int maxLag = len / 4;
        double[] c = new double[2 * maxLag + 1];
        for (int t = -maxLag; t <= maxLag; t++) c[t + maxLag] = fa[t >= 0 ? t : m + t];
        int best = 0;
        for (int i = 1; i < c.length; i++) if (Math.abs(c[i]) > Math.abs(c[best])) best = i;
        double[] abs = new double[c.length];
        for (int i = 0; i < c.length; i++) abs[i] = Math.abs(c[i]);
        Arrays.sort(abs);
        double sigma = abs[abs.length / 2] / 0.6745;
        double significance = sigma > 0 ? Math.abs(c[best]) / sigma : 0;
        if (!(significance >= MIN_SIGNIFICANCE) || best == 0 || best == c.length - 1) return Optional.empty();
        int sign = c[best] > 0 ? 1 : -1;
        double ym = sign * c[best - 1], y0 = sign * c[best], yp = sign * c[best + 1];
        double den = ym - 2 * y0 + yp;
        double frac = den < 0 ? 0.5 * (ym - yp) / den : 0;
        return Optional.of(new Peak(best - maxLag + frac, sign, significance));
    }

    /** x(k) − x(k − P) for k in [skip, skip + len), DC removed by the comb itself. */
    private static double[] comb(double[] x, int n, double period, int skip, int len) {
        double[] seg = Arrays.copyOf(x, n);
        double[] late = FractionalDelay.delay(seg, 0, period);
        double[] out = new double[len];
        for (int i = 0; i < len; i++) out[i] = seg[skip + i] - late[skip + i];
        return out;
    }
}

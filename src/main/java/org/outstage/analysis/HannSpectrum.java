package org.outstage.analysis;

import org.outstage.Require;

/**
 * The Hann-windowed FFT of the first {@code n} samples of a record less their mean (JTransforms {@code realForward}
 * layout), made once and read by both the coarse peak search of the sine fit ({@link SineFitter}) and the signal
 * check of the stage diagnosis ({@code stage.SignalCheck}) when they look at the same samples (a record of 2^16 to
 * 2^17 samples: 1.4 to 2.7 s at 48 kHz). Immutable; its readers compute from it exactly what they computed from
 * their own transform before.
 */
public final class HannSpectrum {
    private final double[] transform;
    private final int length;

    private HannSpectrum(double[] transform, int length) {
        this.transform = transform;
        this.length = length;
    }

    /** The spectrum of {@code x[0..n)}: its mean removed, the periodic Hann window of length n applied. */
    public static HannSpectrum of(double[] x, int n) {
        Require.atLeast("n", n, 2);
        Require.that(n <= x.length, "n=" + n + " must be at most x.length=" + x.length);
        double mean = 0;
        for (int i = 0; i < n; i++) mean += x[i];
        mean /= n;
        double[] buf = new double[n];
        Window.HANN.applyCentred(x, mean, buf);
        Fft.of(n).realForward(buf);
        return new HannSpectrum(buf, n);
    }

    /** The number of samples transformed. */
    public int length() { return length; }

    /** |X[k]|² for 1 ≤ k &lt; n/2. */
    public double power(int k) {
        return transform[2 * k] * transform[2 * k] + transform[2 * k + 1] * transform[2 * k + 1];
    }

    /** |X[n/2]| (the Nyquist bin, for even n; the last complex bin for odd n). */
    double lastMagnitude() {
        int bins = length / 2;
        return length % 2 == 0 ? Math.abs(transform[1]) : Math.sqrt(transform[2 * bins] * transform[2 * bins] + transform[1] * transform[1]);
    }
}

package org.outstage.model;

/** Radix-2 complex FFT (Cooley and Tukey, Math. Comp. 19, 1965) for one real record; package-private helper. */
final class Fft {
    private Fft() {}

    /** Single-sided amplitudes A_h (peak) of a real record of power-of-two length N, h = 0 … N/2−1 (A_0 is the mean). */
    static double[] amplitudes(double[] x) {
        int n = x.length;
        if (Integer.bitCount(n) != 1) throw new IllegalArgumentException("length=" + n + " must be a power of two");
        double[] re = x.clone(), im = new double[n];
        for (int i = 1, j = 0; i < n; i++) {
            int bit = n >> 1;
            for (; (j & bit) != 0; bit >>= 1) j ^= bit;
            j ^= bit;
            if (i < j) { double t = re[i]; re[i] = re[j]; re[j] = t; }
        }
        for (int len = 2; len <= n; len <<= 1) {
            double ang = -2 * Math.PI / len;
            int half = len / 2;
            for (int k = 0; k < half; k++) {
                double wr = Math.cos(ang * k), wi = Math.sin(ang * k);
                for (int i = k; i < n; i += len) {
                    int j = i + half;
                    double tr = re[j] * wr - im[j] * wi, ti = re[j] * wi + im[j] * wr;
                    re[j] = re[i] - tr; im[j] = im[i] - ti;
                    re[i] += tr; im[i] += ti;
                }
            }
        }
        double[] a = new double[n / 2];
        a[0] = Math.abs(re[0]) / n;
        for (int h = 1; h < n / 2; h++) a[h] = 2 * Math.hypot(re[h], im[h]) / n;
        return a;
    }
}

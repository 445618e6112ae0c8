package org.outstage.analysis;

/** Synthetic test records (double precision) built from explicit sums of cosines. */
final class Signals {
    private Signals() {}

    /** {@code Σ_k amp[k]·cos(2π·k·f·t + phase[k])} plus dc, k = 1…amp.length−1 (amp[0] unused). */
    static double[] harmonicSeries(double fs, int n, double f, double dc, double[] amp, double[] phase) {
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            double t = i / fs;
            double v = dc;
            for (int k = 1; k < amp.length; k++) if (amp[k] != 0) v += amp[k] * Math.cos(2 * Math.PI * k * f * t + phase[k]);
            y[i] = v;
        }
        return y;
    }

    /** Quantises to a signed N-bit grid of full scale ±1: round(x·2^(N−1))/2^(N−1). */
    static double[] quantise(double[] x, int bits) {
        double q = Math.pow(2, bits - 1);
        double[] y = new double[x.length];
        for (int i = 0; i < x.length; i++) y[i] = Math.rint(x[i] * q) / q;
        return y;
    }
}

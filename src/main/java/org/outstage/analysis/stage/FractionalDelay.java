package org.outstage.analysis.stage;

/**
 * Band-limited fractional delay by a Kaiser-windowed sinc interpolator (T. I. Laakso et al., "Splitting the
 * unit delay", IEEE Signal Processing Magazine 13(1), 1996, §III windowed-sinc design; Kaiser window with
 * β = 9, 2·16 taps, coefficients normalised to unit DC gain). Samples within {@link #HALF_WIDTH} of either end
 * are not fully supported and are left at what the truncated kernel gives; callers drop them.
 */
final class FractionalDelay {
    static final int HALF_WIDTH = 16;
    private static final double BETA = 9;

    private FractionalDelay() {}

    /** u[k] = x(k − delaySamples) − dc. */
    static double[] delay(double[] x, double dc, double delaySamples) {
        int n = x.length;
        double fl = Math.floor(-delaySamples);
        int shift = (int) fl;          // t = k - D = k + shift + mu
        double mu = -delaySamples - fl; // in [0, 1)
        int taps = 2 * HALF_WIDTH;
        double[] h = new double[taps];
        double sum = 0;
        for (int j = 0; j < taps; j++) {
            int off = j - HALF_WIDTH + 1;  // sample index i0 + off, off in [-H+1, H]
            double tau = mu - off;
            double sinc = tau == 0 ? 1 : Math.sin(Math.PI * tau) / (Math.PI * tau);
            double r = tau / HALF_WIDTH;
            double win = Math.abs(r) >= 1 ? 0 : besselI0(BETA * Math.sqrt(1 - r * r)) / besselI0(BETA);
            h[j] = sinc * win;
            sum += h[j];
        }
        for (int j = 0; j < taps; j++) h[j] /= sum;
        double[] u = new double[n];
        for (int k = 0; k < n; k++) {
            int i0 = k + shift;
            double acc = 0;
            int jFrom = Math.max(0, -(i0 - HALF_WIDTH + 1)), jTo = Math.min(taps, n - (i0 - HALF_WIDTH + 1));
            for (int j = jFrom; j < jTo; j++) acc += h[j] * (x[i0 - HALF_WIDTH + 1 + j] - dc);
            u[k] = acc;
        }
        return u;
    }

    /** Modified Bessel function of the first kind, order 0, by its power series. */
    static double besselI0(double x) {
        double sum = 1, term = 1, q = x * x / 4;
        for (int k = 1; k < 60; k++) {
            term *= q / ((double) k * k);
            sum += term;
            if (term < 1e-17 * sum) break;
        }
        return sum;
    }
}

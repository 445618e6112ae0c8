package org.outstage.analysis.stage;

/**
 * Zero-phase band limiting by forward–backward filtering (forward–backward filtering as in
 * F. Gustafsson, "Determining the initial states in forward-backward filtering", IEEE Trans. Signal Processing
 * 44(4), 1996, and scipy.signal.filtfilt):
 * a 2nd-order Butterworth section (bilinear transform with pre-warping, R. Bristow-Johnson "Audio EQ
 * Cookbook", Q = 1/√2) run forwards then backwards, so the magnitude is squared (4th-order slopes, −6 dB at
 * the corner) and the phase cancels. Ends are extended by odd reflection and the state starts at the
 * steady state for the first value, which keeps edge transients small. Package-private, stateless.
 */
final class ZeroPhaseFilter {
    private ZeroPhaseFilter() {}

    static double[] apply(double[] x, double fs, double highPassHz, double lowPassHz) {
        double[] y = x.clone();
        if (highPassHz > 0) y = filtfilt(y, coefficients(fs, highPassHz, true), padFor(fs, highPassHz, y.length));
        if (lowPassHz > 0 && lowPassHz < fs / 2) y = filtfilt(y, coefficients(fs, lowPassHz, false), padFor(fs, lowPassHz, y.length));
        return y;
    }

    private static int padFor(double fs, double fc, int n) {
        return (int) Math.min(n - 1, Math.ceil(6 * fs / (2 * Math.PI * fc)) + 6);
    }

    /** {b0, b1, b2, a1, a2} normalised by a0. */
    static double[] coefficients(double fs, double fc, boolean highPass) {
        double w0 = 2 * Math.PI * fc / fs, cos = Math.cos(w0), alpha = Math.sin(w0) / (2 / Math.sqrt(2));
        double a0 = 1 + alpha;
        double b0, b1, b2;
        if (highPass) { b0 = (1 + cos) / 2; b1 = -(1 + cos); b2 = (1 + cos) / 2; }
        else { b0 = (1 - cos) / 2; b1 = 1 - cos; b2 = (1 - cos) / 2; }
        return new double[] {b0 / a0, b1 / a0, b2 / a0, -2 * cos / a0, (1 - alpha) / a0};
    }

    private static double[] filtfilt(double[] x, double[] c, int pad) {
        int n = x.length;
        double[] e = new double[n + 2 * pad];
        for (int i = 0; i < pad; i++) e[i] = 2 * x[0] - x[pad - i];
        System.arraycopy(x, 0, e, pad, n);
        for (int i = 0; i < pad; i++) e[pad + n + i] = 2 * x[n - 1] - x[n - 2 - i];
        run(e, c, false);
        run(e, c, true);
        double[] y = new double[n];
        System.arraycopy(e, pad, y, 0, n);
        return y;
    }

    /** Transposed direct form II in place, started at the steady state for the first input value. */
    private static void run(double[] e, double[] c, boolean backwards) {
        int n = e.length;
        double b0 = c[0], b1 = c[1], b2 = c[2], a1 = c[3], a2 = c[4];
        double first = backwards ? e[n - 1] : e[0];
        double dcGain = (b0 + b1 + b2) / (1 + a1 + a2);
        double yss = dcGain * first;
        double z2 = b2 * first - a2 * yss;
        double z1 = b1 * first - a1 * yss + z2; // equals yss - b0*first at the steady state
        for (int k = 0; k < n; k++) {
            int i = backwards ? n - 1 - k : k;
            double xi = e[i];
            double yi = b0 * xi + z1;
            z1 = b1 * xi - a1 * yi + z2;
            z2 = b2 * xi - a2 * yi;
            e[i] = yi;
        }
    }
}

package org.outstage.model;

/** Linear interpolation on an increasing abscissa; package-private helper. */
final class Interp {
    private Interp() {}

    /** y at x0 by linear interpolation in (x, y); x increasing; held constant beyond the ends. */
    static double at(double[] x, double[] y, double x0) {
        int n = x.length;
        if (x0 <= x[0]) return y[0];
        if (x0 >= x[n - 1]) return y[n - 1];
        int lo = 0, hi = n - 1;
        while (hi - lo > 1) {
            int mid = (lo + hi) >>> 1;
            if (x[mid] <= x0) lo = mid; else hi = mid;
        }
        double t = (x0 - x[lo]) / (x[hi] - x[lo]);
        return y[lo] + t * (y[hi] - y[lo]);
    }
}

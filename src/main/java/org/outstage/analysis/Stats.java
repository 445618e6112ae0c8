package org.outstage.analysis;

/** Small order statistics (median, k-th smallest) shared by the analysis and the stage diagnosis. */
public final class Stats {
    private Stats() {}

    /** Median of the first {@code n} values (the array is reordered). Quickselect, O(n) expected. */
    public static double median(double[] a, int n) {
        if (n <= 0) return Double.NaN;
        double hi = select(a, 0, n - 1, n / 2);
        if (n % 2 == 1) return hi;
        double lo = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < n / 2; i++) lo = Math.max(lo, a[i]);
        return (lo + hi) / 2;
    }

    /** k-th smallest value (0-based) of {@code a} by quickselect (Hoare), reordering {@code a}. */
    public static double select(double[] a, int k) {
        return select(a, 0, a.length - 1, k);
    }

    private static double select(double[] a, int left, int right, int k) {
        while (left < right) {
            double pivot = a[(left + right) >>> 1];
            int i = left, j = right;
            while (i <= j) {
                while (a[i] < pivot) i++;
                while (a[j] > pivot) j--;
                if (i <= j) { double t = a[i]; a[i] = a[j]; a[j] = t; i++; j--; }
            }
            if (k <= j) right = j;
            else if (k >= i) left = i;
            else return a[k];
        }
        return a[k];
    }

    /**
     * Factor from the median to the mean of a bin's power averaged over {@code blocks} spectra of Gaussian
     * noise (a χ² variable with 2·blocks degrees of freedom): exactly 1/ln 2 for one block, the
     * Wilson–Hilferty approximation 1/(1 − 1/(9·blocks))³ above (overlap between blocks is ignored).
     */
    static double medianToMean(int blocks) {
        if (blocks <= 1) return 1 / Math.log(2);
        double v = 1 - 1.0 / (9 * blocks);
        return 1 / (v * v * v);
    }
}

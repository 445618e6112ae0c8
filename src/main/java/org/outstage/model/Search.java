package org.outstage.model;

import java.util.function.DoubleUnaryOperator;

/** One-dimensional minimisation: a coarse scan, then golden-section search (Kiefer 1953) in the best cell. */
final class Search {
    private Search() {}

    private static final double INV_PHI = (Math.sqrt(5) - 1) / 2;

    /** Returns {x, f(x)} minimising f over [lo, hi]: scan {@code cells}+1 points, then golden section to tolerance. */
    static double[] scanThenGolden(DoubleUnaryOperator f, double lo, double hi, int cells, double tolerance) {
        double bestX = lo, bestF = Double.POSITIVE_INFINITY;
        int bestK = 0;
        for (int k = 0; k <= cells; k++) {
            double x = lo + (hi - lo) * k / cells;
            double fx = f.applyAsDouble(x);
            if (fx < bestF) { bestF = fx; bestX = x; bestK = k; }
        }
        double a = lo + (hi - lo) * Math.max(0, bestK - 1) / cells;
        double b = lo + (hi - lo) * Math.min(cells, bestK + 1) / cells;
        double c = b - INV_PHI * (b - a), d = a + INV_PHI * (b - a);
        double fc = f.applyAsDouble(c), fd = f.applyAsDouble(d);
        while (b - a > tolerance) {
            if (fc <= fd) { b = d; d = c; fd = fc; c = b - INV_PHI * (b - a); fc = f.applyAsDouble(c); }
            else { a = c; c = d; fc = fd; d = a + INV_PHI * (b - a); fd = f.applyAsDouble(d); }
        }
        double x = fc <= fd ? c : d, fx = Math.min(fc, fd);
        if (bestF < fx) return new double[] {bestX, bestF};
        return new double[] {x, fx};
    }
}

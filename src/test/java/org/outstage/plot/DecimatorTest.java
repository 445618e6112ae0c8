package org.outstage.plot;

import static org.junit.jupiter.api.Assertions.*;

import java.util.Random;
import org.junit.jupiter.api.Test;

/** Exact checks of the min/max column reduction (style.md §15); the oracle is a brute-force scan per column. */
class DecimatorTest {

    private static double[] ramp(int n) {
        double[] x = new double[n];
        for (int i = 0; i < n; i++) x[i] = i;
        return x;
    }

    @Test
    void fewPoints_returnedUnchanged() {
        double[] x = {0, 1, 2, 3, 4};
        double[] y = {5, -1, Double.NaN, 2, 7};
        Decimator.Result r = Decimator.minMax(x, y, 0, 4, 10, Axis.Scale.LINEAR);
        assertArrayEquals(x, r.x());
        assertArrayEquals(y, r.y());
    }

    @Test
    void singleSampleSpike_keptWithExactValue() {
        int n = 1_000_000;
        double[] x = ramp(n), y = new double[n];
        y[123_457] = 3.25;      // one-sample spike
        y[876_543] = -2.5;      // one-sample dip
        Decimator.Result r = Decimator.minMax(x, y, 0, n - 1, 800, Axis.Scale.LINEAR);
        assertTrue(r.size() <= 2 * 800 + 2, "size " + r.size());
        boolean spike = false, dip = false;
        for (int i = 0; i < r.size(); i++) {
            if (r.y()[i] == 3.25 && r.x()[i] == 123_457) spike = true;
            if (r.y()[i] == -2.5 && r.x()[i] == 876_543) dip = true;
        }
        assertTrue(spike && dip);
    }

    @Test
    void eachColumn_keepsItsBruteForceMinAndMax() {
        int n = 10_000, cols = 37;
        Random rnd = new Random(42);
        double[] x = ramp(n), y = new double[n];
        for (int i = 0; i < n; i++) y[i] = rnd.nextGaussian();
        Decimator.Result r = Decimator.minMax(x, y, 0, n - 1, cols, Axis.Scale.LINEAR);
        double perUnit = cols / (double) (n - 1);
        for (int c = 0; c < cols; c++) {
            double mn = Double.POSITIVE_INFINITY, mx = Double.NEGATIVE_INFINITY;
            for (int i = 0; i < n; i++) {
                int ci = Math.min(cols - 1, (int) Math.floor(i * perUnit));
                if (ci == c) { mn = Math.min(mn, y[i]); mx = Math.max(mx, y[i]); }
            }
            double rmn = Double.POSITIVE_INFINITY, rmx = Double.NEGATIVE_INFINITY;
            int count = 0;
            for (int k = 0; k < r.size(); k++) {
                int ck = Math.min(cols - 1, (int) Math.floor(r.x()[k] * perUnit));
                if (ck == c) { rmn = Math.min(rmn, r.y()[k]); rmx = Math.max(rmx, r.y()[k]); count++; }
            }
            assertEquals(mn, rmn, 0.0, "min of column " + c);
            assertEquals(mx, rmx, 0.0, "max of column " + c);
            assertEquals(2, count, "points in column " + c);
        }
        for (int k = 1; k < r.size(); k++) assertTrue(r.x()[k] > r.x()[k - 1], "x order kept");
    }

    @Test
    void gap_staysAGapAndNoColumnBridgesIt() {
        int n = 100_000;
        double[] x = ramp(n), y = new double[n];
        for (int i = 0; i < n; i++) y[i] = Math.sin(i * 0.01);
        for (int i = 50_000; i < 50_010; i++) y[i] = Double.NaN;
        Decimator.Result r = Decimator.minMax(x, y, 0, n - 1, 100, Axis.Scale.LINEAR);
        int nans = 0, at = -1;
        for (int k = 0; k < r.size(); k++) if (Double.isNaN(r.y()[k])) { nans++; at = k; }
        assertEquals(1, nans);
        assertTrue(r.x()[at - 1] < 50_000 && r.x()[at + 1] >= 50_010, "points on either side of the gap");
    }

    @Test
    void zoomedRange_keepsOnePointOutsideEachEdge() {
        int n = 100_000;
        double[] x = ramp(n), y = new double[n];
        for (int i = 0; i < n; i++) y[i] = i % 7;
        Decimator.Result r = Decimator.minMax(x, y, 1000.5, 5000.5, 50, Axis.Scale.LINEAR);
        assertEquals(1000, r.x()[0], 0.0);
        assertEquals(5001, r.x()[r.size() - 1], 0.0);
        for (int k = 1; k < r.size() - 1; k++) assertTrue(r.x()[k] >= 1001 && r.x()[k] <= 5000);
    }

    @Test
    void logAxis_columnsEqualInLogAndNonPositiveSkipped() {
        int n = 20_001;
        double[] x = new double[n], y = new double[n];
        for (int i = 0; i < n; i++) { x[i] = i; y[i] = -i; }  // x = 0 is not drawable on a log axis
        Decimator.Result r = Decimator.minMax(x, y, 1, 20_000, 4, Axis.Scale.LOG10);
        // 4 log columns over [1, 20000]: boundaries at 20000^(k/4) = 11.9, 141.4, 1681.8
        // each column keeps its first (max y) and last (min y) sample.
        double[] expectX = {0, 1, 11, 12, 141, 142, 1681, 1682, 20_000};
        assertArrayEquals(expectX, r.x());
    }
}

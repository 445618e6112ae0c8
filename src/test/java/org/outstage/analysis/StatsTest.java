package org.outstage.analysis;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Random;
import org.junit.jupiter.api.Test;

class StatsTest {
    @Test
    void median_ofOddAndEvenCounts() {
        assertEquals(3, Stats.median(new double[] {5, 1, 3, 4, 2}, 5), 0);
        assertEquals(2.5, Stats.median(new double[] {4, 1, 3, 2}, 4), 0);
        assertEquals(7, Stats.median(new double[] {7, 7, 7, 1, 9, 9, 7}, 7), 0);
        // only the first n entries count
        assertEquals(2, Stats.median(new double[] {3, 1, 2, 100, 100}, 3), 0);
    }

    @Test
    void median_matchesSortOnRandomData() {
        Random rnd = new Random(9);
        for (int trial = 0; trial < 50; trial++) {
            int n = 1 + rnd.nextInt(500);
            double[] a = new double[n];
            for (int i = 0; i < n; i++) a[i] = rnd.nextInt(20);   // many ties
            double[] sorted = a.clone();
            java.util.Arrays.sort(sorted);
            double expected = n % 2 == 1 ? sorted[n / 2] : (sorted[n / 2 - 1] + sorted[n / 2]) / 2;
            assertEquals(expected, Stats.median(a, n), 0);
        }
    }

    /**
     * Median-to-mean factor of an averaged periodogram bin (χ² with 2·blocks degrees of freedom, mean 2·blocks):
     * exact 1/ln 2 for one block; χ²(8) median 7.3441 (standard χ² tables) gives 8/7.3441 = 1.0893 for 4 blocks.
     */
    @Test
    void medianToMean_matchesChiSquareMedians() {
        assertEquals(1 / Math.log(2), Stats.medianToMean(1), 1e-15);
        assertEquals(8 / 7.3441, Stats.medianToMean(4), 0.002);
    }
}

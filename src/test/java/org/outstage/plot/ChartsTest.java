package org.outstage.plot;

import static org.junit.jupiter.api.Assertions.*;

import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.TransferCurve;

class ChartsTest {

    @Test
    void waveform_fitSeriesIsTheFittedCosineAtEachSample() {
        double fs = 48_000;
        SineFit fit = new SineFit(1000, 2.0, 0.3, 0.01, 0, 3, true);
        double[] x = new double[480];
        ChartSpec c = Charts.waveform("w", x, fs, 0, "V", Optional.of(fit));
        Series s = c.series().get(1);
        assertEquals(Series.Role.FIT, s.role());
        for (int i = 0; i < x.length; i += 37) {
            double t = i / fs;   // y = A·cos(2πft+φ)+dc (SineFit definition)
            assertEquals(2.0 * Math.cos(2 * Math.PI * 1000 * t + 0.3) + 0.01, s.yAt(i), 1e-12);
            assertEquals(t, s.xAt(i), 1e-15);
        }
        assertEquals("Time (s)", c.xAxis().title());
        // first four cycles of 1 kHz shown at first (the record is 10 ms)
        assertEquals(4e-3, c.xRange().max(), 1e-15);
        assertEquals("Output (V)", c.yAxis().title());
    }

    @Test
    void residualChart_titleStatesMagnification() {
        double fs = 10_000;
        double[] r = new double[1000];
        r[500] = 0.004;
        // peak ratio 1/0.004 = 250 -> rounded down to 200
        assertTrue(Charts.residual("Residual", r, fs, 0, "V", 1.0, 50).title().endsWith("(magnified ×200)"));
    }

    @Test
    void gainDeviation_ofCubicCurve_matchesDerivative() {
        // out = v + a·v³ on [-1, 1]: g = 1 + 3a·v², end-to-end slope = 1 + a (calculus)
        double a = -0.05;
        int n = 201;
        double[] in = new double[n], out = new double[n], g = new double[n];
        for (int i = 0; i < n; i++) { in[i] = -1 + 2.0 * i / (n - 1); out[i] = in[i] + a * Math.pow(in[i], 3); g[i] = 1 + 3 * a * in[i] * in[i]; }
        double[][] d = Charts.gainDeviationPercent(new TransferCurve(in, out, g, "V"));
        assertEquals(100 * (1 / (1 + a) - 1), d[1][100], 1e-9);         // at v = 0
        assertEquals(100 * ((1 + 3 * a) / (1 + a) - 1), d[1][n - 1], 1e-9); // at v = 1
        assertArrayEquals(out, d[0]);
    }

    @Test
    void harmonicProfile_splitsOddAndEvenOrders() {
        ChartSpec c = Charts.harmonicProfile("h", new int[] {2, 3, 4, 5, 6, 7}, new double[] {-60, -70, -80, -75, Double.NaN, -90});
        Series odd = c.series().get(0), even = c.series().get(1);
        assertArrayEquals(new double[] {3, 5, 7}, odd.x());
        assertArrayEquals(new double[] {-70, -75, -90}, odd.y());
        assertArrayEquals(new double[] {2, 4}, even.x());
        assertNotEquals(odd.role(), even.role());
        assertTrue(c.yRange().min() <= -90);
    }

    @Test
    void spectrum_hasBandFloorAndMarkers() {
        double[] f = {0, 10, 100, 1000, 2000, 3000, 24_000};
        double[] l = {-200, -130, -120, 0, -80, -90, -140};
        ChartSpec c = Charts.spectrum("s", f, l, "dB re fundamental",
                Charts.harmonicMarkers(new int[] {2, 3}, new double[] {2000, 3000}, new double[] {-80, -90}),
                Optional.of(new Range(20, 20_000)), OptionalDouble.of(-125));
        assertEquals(Axis.Scale.LOG10, c.xAxis().scale());
        assertEquals(List.of("H2", "H3"), c.markers().stream().map(Marker::label).toList());
        assertEquals(-125, c.lines().get(0).y());
        assertEquals(20, c.bands().get(0).fromX());
        assertEquals("Level (dB re fundamental)", c.yAxis().title());
    }

    @Test
    void levelSweep_showsPercentAndOnePercentLine() {
        ChartSpec c = Charts.levelSweep("sweep", new double[] {1, 10, 50}, new double[] {0.0005, 0.001, 0.02},
                new double[] {0.0008, 0.0012, 0.021}, 0.01);
        assertEquals(0.05, c.series().get(0).yAt(0), 1e-15);
        assertEquals(2.1, c.series().get(1).yAt(2), 1e-12);
        assertEquals(1.0, c.lines().get(0).y(), 0);
        assertEquals("1 % limit", c.lines().get(0).label());
        assertEquals(Axis.Scale.LOG10, c.yAxis().scale());
    }
}

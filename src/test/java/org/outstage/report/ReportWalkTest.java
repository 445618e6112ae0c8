package org.outstage.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Instant;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.outstage.plot.Axis;
import org.outstage.plot.Charts;
import org.outstage.plot.Range;
import org.outstage.plot.Series;
import org.outstage.plot.Ticks;

/** Issue 11, finding 13: what the reports draw and stamp. */
class ReportWalkTest {
    @Test
    void finding13_markersUnitTicksAndReadableTimestamps() {
        // THD-against-power lines carry a marker at each capture (a POINTS twin with the same data)
        var c = Charts.levelSweep("sweep", new double[] {1, 10, 50}, new double[] {0.0005, 0.001, 0.02}, new double[] {0.0008, 0.0012, 0.021}, 0.01);
        long points = c.series().stream().filter(s -> s.style() == Series.Style.POINTS).count();
        assertEquals(2, points);
        String svg = SvgRenderer.render(c, 760, 420);
        assertEquals(6, svg.split("<circle", -1).length - 1, "3 THD + 3 THD+N markers");

        // time axes: 0 to 2 ms in seconds reads "0.5 ms", never the bare "0.5m"
        List<Ticks.Tick> t = Ticks.of(new Range(0, 0.002), Axis.Scale.LINEAR, 5, "s");
        assertTrue(t.stream().anyMatch(k -> k.label().equals("0.5 ms")), t.toString());
        assertFalse(t.stream().anyMatch(k -> k.label().endsWith("m")), t.toString());

        // time stamps: to the second, UTC, no fraction
        assertEquals("2026-12-04 09:26:02 UTC", HtmlReport.when(Instant.parse("2026-12-04T09:26:02.123456789Z")));
    }

    @Test
    void finding13_harmonicsBelowNoiseApartAndCrowdedMarkersKeepTheirLabel() {
        // H3 resolved, H5 not above the noise: H5 is no bar, it is a point in its own "<" series
        var c = Charts.harmonicProfile("h", new int[] {3, 5}, new double[] {-40, -110}, new boolean[] {true, false});
        var below = c.series().stream().filter(s -> s.name().startsWith("<")).findFirst().orElseThrow();
        assertEquals(Series.Style.POINTS, below.style());
        assertEquals(5, below.xAt(0));
        assertTrue(c.series().stream().filter(s -> s.style() == Series.Style.BARS)
                .allMatch(s -> java.util.Arrays.stream(s.x()).noneMatch(x -> x == 5)), "H5 drawn as a bar");

        // H8 and H9 of 997 Hz lie 11 px apart on a log axis at the same level: both keep their labels
        double[] f = new double[2000], l = new double[2000];
        for (int i = 0; i < f.length; i++) { f[i] = 20 + i * 12; l[i] = -120; }
        var spec = Charts.spectrum("s", f, l, "dBV", Charts.harmonicMarkers(new int[] {8, 9}, new double[] {7976, 8973}, new double[] {-90, -90}),
                java.util.Optional.empty(), java.util.OptionalDouble.empty());
        String svg = SvgRenderer.render(spec, 760, 420);
        assertTrue(svg.contains(">H8</text>") && svg.contains(">H9</text>"), "both harmonic labels");
    }

    @Test
    void finding13_legendDoesNotCoverTheMarkers() {
        // THD rising steeply with power: the curve runs into the top-right corner, where the legend used to sit
        double[] p = {1, 2, 5, 10, 20, 40, 60, 70, 80, 90, 100};
        double[] thd = {0.0006, 0.0004, 0.0003, 0.0003, 0.0003, 0.0003, 0.04, 0.06, 0.08, 0.09, 0.1};
        double[] thdN = {0.0007, 0.0005, 0.0004, 0.0004, 0.0004, 0.0004, 0.041, 0.061, 0.081, 0.091, 0.1};
        String svg = SvgRenderer.render(Charts.levelSweep("s", p, thd, thdN, 0.01), 760, 420);
        java.util.regex.Matcher box = java.util.regex.Pattern.compile(
                "<g><rect x=\"([0-9.]+)\" y=\"([0-9.]+)\" width=\"([0-9.]+)\" height=\"([0-9.]+)\" fill=\"#ffffff\"").matcher(svg);
        assertTrue(box.find(), "legend box");
        double bx = Double.parseDouble(box.group(1)), by = Double.parseDouble(box.group(2));
        double bw = Double.parseDouble(box.group(3)), bh = Double.parseDouble(box.group(4));
        java.util.regex.Matcher c = java.util.regex.Pattern.compile("<circle cx=\"([0-9.]+)\" cy=\"([0-9.]+)\"").matcher(svg);
        int n = 0;
        while (c.find()) {
            double x = Double.parseDouble(c.group(1)), y = Double.parseDouble(c.group(2));
            assertFalse(x >= bx && x <= bx + bw && y >= by && y <= by + bh, "marker at " + x + "," + y + " under the legend");
            n++;
        }
        assertEquals(22, n);
    }
}

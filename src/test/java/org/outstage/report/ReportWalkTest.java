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
}

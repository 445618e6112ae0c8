package org.outstage.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.outstage.logbook.BiasAdvice;
import org.outstage.logbook.BiasAdvisor;
import org.outstage.logbook.BiasReading;
import org.outstage.logbook.BiasStep;
import org.outstage.logbook.MeasurementRecord;
import org.outstage.logbook.StepPoint;
import org.outstage.plot.ChartSpec;
import org.outstage.plot.Series;
import org.outstage.verify.KeyFigures;

/** Issue 11 finding 7: the session chart shows the ratio the advice uses, and the shaded range ends where its line crosses the band's limits. */
class BiasSessionChartTest {
    static BiasStep step(double mv, double gainAtZero, double ratio, Instant at) {
        KeyFigures f = KeyFigures.basic(997, 14.1, "V", 1e-3, 1.1e-3).withCrossover(gainAtZero, "x").withCrossoverRatio(ratio);
        MeasurementRecord m = new MeasurementRecord(1, Optional.empty(), at, "outstage test", Map.of(), Set.of(), "{}", f);
        return new BiasStep(0, at, BiasReading.millivolts(mv), OptionalDouble.empty(), OptionalDouble.empty(), 1, Optional.of(m));
    }

    /** The drawn line's y at x, by linear interpolation between its own points (what the renderer draws). */
    static double yAt(Series s, double x) {
        double[] xs = s.x(), ys = s.y();
        for (int i = 1; i < xs.length; i++)
            if (x <= xs[i]) return ys[i - 1] + (ys[i] - ys[i - 1]) * (x - xs[i - 1]) / (xs[i] - xs[i - 1]);
        return ys[ys.length - 1];
    }

    @Test
    void finding7_recommendedBandEndsWhereTheDrawnRatioCrossesTheLimits() {
        // The DA-60 session's ratios (docs/logbook.md): 3, 26, 90 mV read 0.9208, 1.0001, 1.0097 (gain at zero 0.9222,
        // 1.0016, 1.0111 against the outer swing: the chart must not draw these).
        Instant t = Instant.parse("2026-12-01T10:00:00Z");
        List<BiasStep> steps = new ArrayList<>(List.of(step(3, 0.9222, 0.9208, t), step(26, 1.0016, 1.0001, t.plusSeconds(60)),
                step(90, 1.0111, 1.0097, t.plusSeconds(120))));
        BiasAdvice a = BiasAdvisor.recommend(steps);
        ChartSpec c = ReportCharts.biasSessionCharts(StepPoint.of(steps), a, BiasAdvisor.DEFAULT_TOLERANCE).get(0);
        Series s = c.series().get(0);
        // the series holds the crossover ratio at the steps (the figure the advice quotes), not gain_at_zero
        assertEquals(0.9208, yAt(s, 3), 1e-12);
        assertEquals(1.0097, yAt(s, 90), 1e-12);
        double lo = c.bands().get(0).fromX(), hi = c.bands().get(0).toX();
        assertEquals(a.low().getAsDouble(), lo, 0);
        assertEquals(a.high().getAsDouble(), hi, 0);
        // the shading's ends sit on the drawn line's crossings of 1 − band and 1 + band, to the drawing's own resolution
        // (64 straight segments per step interval approximate the interpolant, error below 1e-5 here; 2e-5 in ratio is far below a pixel)
        assertEquals(1 - BiasAdvisor.DEFAULT_TOLERANCE, yAt(s, lo), 2e-5, "low end at " + lo);
        assertEquals(1 + BiasAdvisor.DEFAULT_TOLERANCE, yAt(s, hi), 2e-5, "high end at " + hi);
        assertTrue(c.title().startsWith("Crossover ratio"), c.title());
    }
}

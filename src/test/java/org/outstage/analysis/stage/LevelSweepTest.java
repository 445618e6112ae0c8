package org.outstage.analysis.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;

class LevelSweepTest {
    static LevelPoint pt(String file, double watts, double thd) {
        return new LevelPoint(file, 997, 8, "divider 1:20", 40, watts, thd, thd * 1.1);
    }

    /** Worked example: (1 W, 0.1 %) and (100 W, 10 %) lie on THD ∝ P; log-log interpolation gives 10 W at 1 %. */
    @Test
    void twoPoints_powerLaw_interpolationExact() {
        LevelSweepResult r = LevelSweep.analyze(List.of(pt("b.wav", 100, 0.1), pt("a.wav", 1, 0.001)));
        assertEquals("a.wav", r.points().get(0).fileName(), "sorted by power");
        assertEquals(10, r.atOnePercent().powerWatts().orElseThrow(), 1e-9);
        assertTrue(r.atTenPercent().powerWatts().isPresent());
        assertEquals(100, r.atTenPercent().powerWatts().getAsDouble(), 1e-9);
    }

    /**
     * Synthetic series with a known law THD(P) = 0.0004 + 0.001·(P/50)^8 (a floor plus a steep rise into
     * clipping); truth solved by bisection; seven points 1–70 W as in a bench session. Target: within 2 %.
     */
    @Test
    void syntheticLaw_powerAtOnePercentWithinTwoPercentOfTruth() {
        java.util.function.DoubleUnaryOperator thd = p -> 0.0004 + 0.001 * Math.pow(p / 50, 8);
        double[] watts = {1, 5, 20, 40, 55, 62, 70};
        List<LevelPoint> pts = new ArrayList<>();
        for (double w : watts) pts.add(pt(String.format("level-%03.0fW.wav", w), w, thd.applyAsDouble(w)));
        double lo = 1, hi = 200;
        for (int i = 0; i < 200; i++) { double mid = 0.5 * (lo + hi); if (thd.applyAsDouble(mid) < 0.01) lo = mid; else hi = mid; }
        double truth = lo;
        LevelSweepResult r = LevelSweep.analyze(pts);
        assertEquals(truth, r.atOnePercent().powerWatts().orElseThrow(), 0.02 * truth);
        assertTrue(r.atTenPercent().powerWatts().isEmpty());
        assertTrue(r.atTenPercent().message().startsWith("THD never reached 10 %"), r.atTenPercent().message());
    }

    @Test
    void mixedLoad_refusedNamingTheFile() {
        List<LevelPoint> pts = List.of(pt("a.wav", 1, 0.001),
                new LevelPoint("c-4ohm.wav", 997, 4, "divider 1:20", 40, 10, 0.002, 0.003));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> LevelSweep.analyze(pts));
        assertEquals("c-4ohm.wav: load 4 ohm differs from 8 ohm in a.wav", e.getMessage());
    }

    @Test
    void mixedFrequencyAndCalibration_refusedNamingTheFile() {
        IllegalArgumentException f = assertThrows(IllegalArgumentException.class, () -> LevelSweep.analyze(List.of(pt("a.wav", 1, 0.001),
                new LevelPoint("d.wav", 1100, 8, "divider 1:20", 40, 10, 0.002, 0.003))));
        assertTrue(f.getMessage().startsWith("d.wav: frequency 1100 Hz"), f.getMessage());
        IllegalArgumentException c = assertThrows(IllegalArgumentException.class, () -> LevelSweep.analyze(List.of(pt("a.wav", 1, 0.001),
                new LevelPoint("e.wav", 997, 8, "divider 1:10", 20, 10, 0.002, 0.003))));
        assertTrue(c.getMessage().startsWith("e.wav: calibration 'divider 1:10'"), c.getMessage());
    }

    @Test
    void neverReached_messageNamesMaximum() {
        LevelSweepResult r = LevelSweep.analyze(List.of(pt("a.wav", 1, 0.001), pt("b.wav", 48.1, 0.0042), pt("c.wav", 20, 0.002)));
        assertTrue(r.atOnePercent().powerWatts().isEmpty());
        assertEquals("THD never reached 1 % (max 0.42 % at 48.1 W)", r.atOnePercent().message());
    }

    @Test
    void alreadyAboveAtLowest_messageSaysBelowSeries() {
        LevelSweepResult r = LevelSweep.analyze(List.of(pt("a.wav", 1, 0.02), pt("b.wav", 5, 0.2)));
        assertTrue(r.atOnePercent().powerWatts().isEmpty());
        assertTrue(r.atOnePercent().message().startsWith("THD is already 2 % at the lowest level (1 W, a.wav)"), r.atOnePercent().message());
    }
}

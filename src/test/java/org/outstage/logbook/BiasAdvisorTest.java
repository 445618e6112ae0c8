package org.outstage.logbook;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.outstage.verify.KeyFigures;

class BiasAdvisorTest {
    // Emitter-follower output stage, small-signal model (docs/references.md §7, Oliver 1971): at idle both halves
    // conduct, Zout = (re + RE)/2 with re = VT/Iq; at large signal one half, Zout = RE. Gain at zero relative to
    // the large-signal gain: g0 = (RL + RE) / (RL + (re + RE)/2). With Vq = Iq*RE, re = VT*RE/Vq; g0 = 1 at Vq = VT.
    static final double VT_MV = 25.852; // kT/q at 300 K (docs/references.md §7, COMPUTED from exact 2019 SI constants)
    static final double RE = 0.22;
    static final double RL = 8.0;

    static double g0(double vqMv) {
        double re = VT_MV * RE / vqMv;
        return (RL + RE) / (RL + (re + RE) / 2);
    }

    /** Vq (mV) where g0 = 1 + delta, solved from the same model. */
    static double vqAt(double delta) {
        double re = 2 * (RL + RE) / (1 + delta) - 2 * RL - RE;
        return VT_MV * RE / re;
    }

    static BiasStep step(double mv, double g0, Instant at, double heatsink) {
        KeyFigures f = KeyFigures.basic(1000, 2.83, "V", 1e-3, 1.2e-3).withCrossover(g0, "x");
        MeasurementRecord m = new MeasurementRecord(1, Optional.empty(), at, "outstage test", Map.of(), Set.of(), "{}", f);
        return new BiasStep(0, at, BiasReading.millivolts(mv), OptionalDouble.of(heatsink), OptionalDouble.empty(), 1, Optional.of(m));
    }

    static List<BiasStep> sweep(double fromMv, double toMv, double stepMv) {
        List<BiasStep> out = new ArrayList<>();
        Instant t = Fixtures.T0;
        for (double mv = fromMv; mv <= toMv + 1e-9; mv += stepMv) {
            out.add(step(mv, g0(mv), t, 30));
            t = t.plusSeconds(60);
        }
        return out;
    }

    @Test
    void emitterFollowerModel_rangeMatchesAnalyticBand_andBestIsOliverOptimum() {
        BiasAdvice a = BiasAdvisor.recommend(sweep(5, 60, 2.5), 0.005);
        // Oliver: the flattest crossover at Vq = VT; linear interpolation between 2.5 mV steps costs < 0.5 mV here
        assertEquals(VT_MV, a.best().getAsDouble(), 0.5);
        assertEquals(vqAt(-0.005), a.low().getAsDouble(), 0.5);
        assertEquals(vqAt(+0.005), a.high().getAsDouble(), 0.5);
        // last step 60 mV lies above the band
        assertEquals(BiasAdvice.Direction.LESS, a.direction());
        assertTrue(a.warnings().stream().anyMatch(w -> w.contains("gm-doubling")), a.warnings().toString());
        assertTrue(a.text().contains("less bias"), a.text());
    }

    /**
     * At a modest level the stated gain_at_zero reads high by a level-dependent offset (docs/diagnosis.md); the
     * steps then also carry the verdict's level-corrected ratio, and the advice must follow that ratio, not the
     * offset figure: the Oliver optimum stays at VT.
     */
    @Test
    void stepsWithCrossoverRatio_adviceFollowsTheLevelCorrectedRatio() {
        List<BiasStep> steps = new ArrayList<>();
        Instant t = Fixtures.T0;
        for (double mv = 5; mv <= 60 + 1e-9; mv += 2.5) {
            double truth = g0(mv);
            KeyFigures f = KeyFigures.basic(1000, 2.83, "V", 1e-3, 1.2e-3).withCrossover(truth + 0.004, "x").withCrossoverRatio(truth);
            MeasurementRecord m = new MeasurementRecord(1, Optional.empty(), t, "outstage test", Map.of(), Set.of(), "{}", f);
            steps.add(new BiasStep(0, t, BiasReading.millivolts(mv), OptionalDouble.of(30), OptionalDouble.empty(), 1, Optional.of(m)));
            t = t.plusSeconds(60);
        }
        BiasAdvice a = BiasAdvisor.recommend(steps, 0.005);
        assertEquals(VT_MV, a.best().getAsDouble(), 0.5, "Oliver: flattest at Vq = VT");
        assertEquals(vqAt(-0.005), a.low().getAsDouble(), 0.5);
    }

    @Test
    void allStepsUnderBiased_saysMore_withoutRange() {
        BiasAdvice a = BiasAdvisor.recommend(sweep(2, 10, 2), 0.005);
        assertTrue(a.low().isEmpty() && a.high().isEmpty());
        assertEquals(BiasAdvice.Direction.MORE, a.direction());
        assertTrue(a.warnings().stream().noneMatch(w -> w.contains("gm-doubling")));
    }

    @Test
    void lastStepInsideBand_saysHere() {
        List<BiasStep> steps = sweep(10, 40, 5);
        steps.add(step(26, g0(26), Fixtures.T0.plusSeconds(9999), 35));
        BiasAdvice a = BiasAdvisor.recommend(steps);
        assertEquals(BiasAdvice.Direction.HERE, a.direction());
    }

    @Test
    void noCrossoverFigures_isUnknown() {
        BiasStep plain = new BiasStep(0, Fixtures.T0, BiasReading.millivolts(20), OptionalDouble.empty(), OptionalDouble.empty(), 1,
                Optional.empty());
        assertEquals(BiasAdvice.Direction.UNKNOWN, BiasAdvisor.recommend(List.of(plain)).direction());
    }

    @Test
    void exponentialWarmUp_settles_andChangeMatchesClosedForm() {
        // I(t) = 100 (1 - 0.5 e^{-t/60}) mA read every 30 s for 20 min; over the last 5 min the change is
        // I(1200) - I(900) (monotonic), relative to the mean of the readings in the window.
        List<BiasStep> steps = new ArrayList<>();
        double sum = 0;
        int count = 0;
        for (int s = 0; s <= 1200; s += 30) {
            double i = 100 * (1 - 0.5 * Math.exp(-s / 60.0));
            steps.add(new BiasStep(0, Fixtures.T0.plusSeconds(s), BiasReading.milliamps(i), OptionalDouble.of(25 + 20 * (1 - Math.exp(-s / 60.0))),
                    OptionalDouble.empty(), 1, Optional.empty()));
            if (s >= 900) {
                sum += i;
                count++;
            }
        }
        double expected = 100 * 0.5 * (Math.exp(-900 / 60.0) - Math.exp(-1200 / 60.0)) / (sum / count);
        DriftReport r = DriftAnalysis.analyze(steps, DriftAnalysis.Quantity.READING);
        assertTrue(r.settled(), r.text());
        assertEquals(expected, r.changeRatio().getAsDouble(), 1e-12 + 1e-9 * expected);
        assertTrue(!r.runawayRisk());
    }

    @Test
    void readingRisingWithTemperature_warnsOfRunaway_withExactSlope() {
        // reading = 20 + 0.3 (T - 25) mV while the heatsink warms from 25 to 60 °C: least squares recovers 0.3 exactly
        List<BiasStep> steps = new ArrayList<>();
        for (int k = 0; k <= 14; k++) {
            double temp = 25 + 2.5 * k;
            steps.add(new BiasStep(0, Fixtures.T0.plusSeconds(60L * k), BiasReading.millivolts(20 + 0.3 * (temp - 25)),
                    OptionalDouble.of(temp), OptionalDouble.empty(), 1, Optional.empty()));
        }
        DriftReport r = DriftAnalysis.analyze(steps, DriftAnalysis.Quantity.READING, Duration.ofMinutes(5), 0.02);
        assertTrue(r.runawayRisk(), r.text());
        assertTrue(!r.settled());
        assertEquals(0.3, r.slopePerCelsius().getAsDouble(), 1e-9);
    }
}

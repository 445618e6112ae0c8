package org.outstage.model;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.outstage.analysis.TransferCurve;

/** Solver behaviour (convergence, budget, failure) and the two tiers of parameter checks. */
class SolverAndParametersTest {
    static final SolverSettings S = SolverSettings.defaults();

    @ParameterizedTest
    @ValueSource(strings = {"pair", "darlington", "cfp", "quasi"})
    void solverConverges_fromDeepClassBToHeavyClassA_withinIterationBudget(String topology) {
        StageParameters.Builder b = StageParameters.builder().topology(topology);
        for (Bias bias : List.of(new Bias.GeneratorVolts(0), new Bias.GeneratorVolts(-0.5), new Bias.EmitterDropVolts(1e-4),
                new Bias.EmitterDropVolts(0.02), new Bias.EmitterDropVolts(0.3), new Bias.QuiescentAmps(2.0))) {
            StageModel m = StageModel.of(b.bias(bias).build(), S);
            ModelCurve c = m.transferCurve(-40, 40, 2001);
            TransferCurve t = c.curve();
            double[] out = t.outputVolts();
            for (int i = 1; i < out.length; i++) assertTrue(out[i] >= out[i - 1] - 1e-9, "output must not fall, " + bias + " at " + i);
            // Iteration count must not creep up: measured about 2 per point with the predictor; budget 3.5.
            assertTrue(c.report().iterationsPerPoint() < 3.5, topology + " " + bias + ": " + c.report());
            assertEquals(0, c.report().sourceStepping(), c.report().toString());
        }
    }

    @Test
    void biasConversions_roundTrip() {
        StageParameters p = StageParameters.builder().topology("darlington").bias(new Bias.EmitterDropVolts(0.015)).build();
        StageModel byVq = StageModel.of(p, S);
        assertEquals(0.015, byVq.vqVolts(), 1e-12);
        StageModel byVolts = byVq.withBias(new Bias.GeneratorVolts(byVq.biasVolts()));
        assertEquals(0.015, byVolts.vqVolts(), 1e-10);
        StageModel byAmps = byVq.withBias(new Bias.QuiescentAmps(0.015 / 0.22));
        assertEquals(byVq.biasVolts(), byAmps.biasVolts(), 1e-10);
        assertEquals(0.015 / 0.22, byAmps.quiescentAmps(), 1e-10);
    }

    @Test
    void exhaustedBudget_failsClearlyWithInputAndLastOperatingPoint() {
        SolverSettings starved = new SolverSettings(1e-15, 1, 1e-3, 0);
        SolverFailureException e = assertThrows(SolverFailureException.class,
                () -> StageModel.of(StageParameters.builder().topology("darlington").bias(new Bias.GeneratorVolts(2.7)).build(), starved));
        assertTrue(e.getMessage().startsWith("no operating point at Vin = 0.00000 V after Newton"), e.getMessage());
        assertEquals(0, e.inputVolts());
        assertTrue(e.lastGoodNodeVolts().containsKey("out"));
    }

    @Test
    void fallbackLadder_rescuesAStepTooLongForOneNewton() {
        // With a 10-iteration budget and tiny junction steps a single Newton cannot cross a 5 V input step,
        // so the solver must split the step (ladder rung 2) and still agree with the default settings.
        SolverSettings tight = new SolverSettings(1e-9, 10, 0.05, 8);
        StageParameters p = StageParameters.builder().topology("darlington").build();
        StageModel m = StageModel.of(p, tight);
        ModelCurve c = m.transferCurve(-20, 20, 9);
        assertTrue(c.report().subdividedSteps() > 0 || c.report().gminStepping() > 0, c.report().toString());
        TransferCurve ref = StageModel.of(p, S).transferCurve(-20, 20, 9).curve();
        for (int i = 0; i < 9; i++) assertEquals(ref.outputVolts()[i], c.curve().outputVolts()[i], 1e-8);
    }

    @Test
    void impossibleParameters_refusedNamingParameterValueAndRule() {
        assertEquals("re=-0.1 must be > 0", assertThrows(IllegalArgumentException.class,
                () -> StageParameters.builder().emitterOhms(-0.1).build()).getMessage());
        assertEquals("beta_output=0.0 must be > 0", assertThrows(IllegalArgumentException.class,
                () -> StageParameters.builder().betaOutput(0).build()).getMessage());
        assertEquals("is_driver=-1.0E-14 must be > 0", assertThrows(IllegalArgumentException.class,
                () -> StageParameters.builder().isDriverAmps(-1e-14).build()).getMessage());
        assertEquals("n=0.0 must be > 0", assertThrows(IllegalArgumentException.class,
                () -> StageParameters.builder().emissionCoefficient(0).build()).getMessage());
        assertTrue(assertThrows(IllegalArgumentException.class, () -> StageParameters.builder().railVolts(1).build())
                .getMessage().startsWith("rails=1.0 must exceed 1.7 V"));
        assertTrue(assertThrows(IllegalArgumentException.class, () -> StageParameters.builder().topology("triple").build())
                .getMessage().startsWith("topology=triple must be one of"));
        assertTrue(assertThrows(IllegalArgumentException.class,
                () -> StageModel.of(StageParameters.builder().railVolts(3).bias(new Bias.EmitterDropVolts(5)).build(), S))
                .getMessage().contains("must be reachable with a bias source inside the rails"));
    }

    @Test
    void unusualParameters_acceptedWithWarnings_andDefaultsRemembered() {
        StageParameters p = StageParameters.builder().emitterOhms(3).betaOutput(5).build();
        assertTrue(p.warnings().stream().anyMatch(w -> w.startsWith("re=3 ohm is outside")), p.warnings().toString());
        assertTrue(p.warnings().stream().anyMatch(w -> w.startsWith("beta_output=5 is outside")), p.warnings().toString());
        assertFalse(p.isDefaulted("re"));
        assertTrue(p.isDefaulted("load"));
        assertTrue(p.parameters().stream().filter(q -> q.name().equals("load")).findFirst().orElseThrow().defaulted());
        StageModel classB = StageModel.of(StageParameters.builder().bias(new Bias.GeneratorVolts(0)).build(), S);
        assertTrue(classB.warnings().stream().anyMatch(w -> w.contains("deep class B")), classB.warnings().toString());
    }
}

package org.outstage.live;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.stage.BiasVerdict;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.capture.SampleUnit;
import org.outstage.stimulus.Generator;
import org.outstage.stimulus.Stimulus;

/** Without a soundcard: the software device under test gives the verdicts the live test expects. */
class DutCurveProbeTest {
    static BiasVerdict verdictOf(DutCurve c, double levelDbfs) {
        double[] x = Generator.of(new Stimulus.Sine(997), 96_000, levelDbfs, 1, true).render(96_000);
        for (int i = 0; i < x.length; i++) x[i] = Math.rint(c.apply(x[i]) * 8388608) / 8388608; // 24-bit line
        Measurement m = Analyzer.analyze(x, 96_000, SampleUnit.FULL_SCALE);
        System.out.println("Vq " + c.vqVolts * 1000 + " mV: " + m.stage());
        return ((StageDiagnosis.Measured) m.stage()).crossover().verdict();
    }

    @Test
    void tinyBias_isUnderbiased_andModelOptimum_isNearOptimal() {
        // Oliver (1971), docs/references.md §7: optimum near VT ≈ 26 mV across each emitter resistor of an
        // emitter follower (PARTIAL there); 1 mV is far below it.
        assertEquals(BiasVerdict.UNDERBIASED, verdictOf(new DutCurve(0.001), -6));
        assertEquals(BiasVerdict.NEAR_OPTIMAL, verdictOf(new DutCurve(DutCurve.OLIVER_VQ_VOLTS), -6));
    }
}

package org.outstage.ui;

import static org.junit.jupiter.api.Assertions.*;

import java.util.HashMap;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.outstage.analysis.TransferCurve;
import org.outstage.model.Bias;
import org.outstage.model.SolverSettings;
import org.outstage.model.StageModel;
import org.outstage.model.StageParameters;

/** The transfer view's adapter returns exactly the model package's curve for the same description. */
class ModelStageAdapterTest {
    private static Map<String, Double> defaults(ModelStageAdapter a, String topology) {
        Map<String, Double> v = new HashMap<>();
        for (StageModelAdapter.Parameter p : a.parameters(topology)) v.put(p.key(), p.defaultValue());
        return v;
    }

    @Test
    void cfpPrediction_equalsStageModelCurve() {
        ModelStageAdapter a = new ModelStageAdapter();
        Map<String, Double> v = defaults(a, "cfp");
        v.put("vq_mv", 5.0);
        v.put("span_v", 20.0);
        TransferCurve got = a.predict("cfp", v);
        StageParameters p = StageParameters.builder().topology("cfp").bias(new Bias.EmitterDropVolts(0.005))
                .emitterOhms(0.22).loadOhms(8).railVolts(35).betaOutput(60).betaDriver(150).temperatureCelsius(25).build();
        TransferCurve want = StageModel.of(p, SolverSettings.defaults()).transferCurve(-20 / 0.97, 20 / 0.97, ModelStageAdapter.POINTS).curve();
        assertEquals(want, got);
    }

    @Test
    void impossibleValue_isAnIllegalArgumentWithTheParameterNamed() {
        ModelStageAdapter a = new ModelStageAdapter();
        Map<String, Double> v = defaults(a, "pair");
        v.put("re", -0.1);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> a.predict("pair", v));
        assertTrue(e.getMessage().startsWith("re=-0.1"), e.getMessage());
    }
}

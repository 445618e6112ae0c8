package org.outstage.live;

import org.outstage.analysis.TransferCurve;
import org.outstage.model.Bias;
import org.outstage.model.SolverSettings;
import org.outstage.model.StageModel;
import org.outstage.model.StageParameters;

/**
 * A software device under test: the project's stage model (default "pair" emitter-follower output stage, 0.22 Ω
 * emitter resistors, 8 Ω load) at a set bias, as a static transfer curve, mapping full-scale samples through volts:
 * input x FS drives {@code x·VOLTS_PER_FS} volts, and the output in volts is divided by the same factor.
 */
final class DutCurve {
    static final double VOLTS_PER_FS = 20;
    private final double[] vin;
    private final double[] vout;
    final double vqVolts;

    DutCurve(double vqVolts) {
        this.vqVolts = vqVolts;
        StageParameters p = StageParameters.builder().bias(new Bias.EmitterDropVolts(vqVolts)).build();
        TransferCurve c = StageModel.of(p, SolverSettings.defaults()).transferCurve(-VOLTS_PER_FS, VOLTS_PER_FS, 4001).curve();
        vin = c.inputVolts();
        vout = c.outputVolts();
    }

    /** Oliver's optimum for an emitter follower: Vq ≈ VT ≈ 26 mV across each emitter resistor (docs/references.md §7, PARTIAL). */
    static final double OLIVER_VQ_VOLTS = 0.026;

    /** The output (FS) for an input sample (FS), by linear interpolation of the curve. */
    double apply(double xFs) {
        double v = Math.max(vin[0], Math.min(vin[vin.length - 1], xFs * VOLTS_PER_FS));
        double pos = (v - vin[0]) / (vin[vin.length - 1] - vin[0]) * (vin.length - 1);
        int i = Math.min(vin.length - 2, (int) pos);
        double t = pos - i;
        return (vout[i] * (1 - t) + vout[i + 1] * t) / VOLTS_PER_FS;
    }
}

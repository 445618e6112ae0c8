package org.outstage.live;

import java.util.Arrays;
import java.util.List;
import org.outstage.analysis.Measurement;
import org.outstage.capture.SampleUnit;

/**
 * Full-scale volts from a meter reading. With a steady tone playing, the user reads the rms volts at the amplifier
 * output on a meter; the same tone, captured uncalibrated, has an rms of {@code r} in full-scale units (1.0 = the
 * digital peak). Since a capture value x stands for {@code x·V_FS} volts, {@code V_FS = V_meter / r}
 * (a sine of peak A has rms A/√2 on both sides, so no crest factor enters: docs/references.md §2).
 *
 * <p>The tone's rms is the fitted fundamental's (IEEE 1057 sine fit): a true-rms meter reads the total, which differs
 * from the fundamental by less than 0.005 % when THD+N is below −80 dB; the median over several blocks keeps one
 * disturbed block out.
 */
public final class MeterCalibration {
    private MeterCalibration() {}

    /**
     * The result.
     *
     * @param fullScaleVolts   peak volts that reach digital full scale
     * @param toneRmsFullScale the tone's rms in full-scale units (median over the blocks)
     * @param meterRmsVolts    the meter reading
     * @param blocks           blocks used
     */
    public record Result(double fullScaleVolts, double toneRmsFullScale, double meterRmsVolts, int blocks) {}

    /** {@code V_FS = meterRmsVolts / toneRmsFullScale}. */
    public static double fullScaleVolts(double meterRmsVolts, double toneRmsFullScale) {
        if (!(meterRmsVolts > 0 && Double.isFinite(meterRmsVolts))) throw new IllegalArgumentException("meter reading " + meterRmsVolts + " V must be a positive number");
        if (!(toneRmsFullScale > 0 && Double.isFinite(toneRmsFullScale)))
            throw new IllegalArgumentException("captured tone rms " + toneRmsFullScale + " (full scale) must be positive: is a tone playing?");
        return meterRmsVolts / toneRmsFullScale;
    }

    /**
     * Calibration from uncalibrated measurements of one channel (full-scale units), one per block.
     *
     * @throws IllegalArgumentException when a measurement is in volts, not measured, or there is none
     */
    public static Result fromMeasurements(List<Measurement> measurements, double meterRmsVolts) {
        if (measurements.isEmpty()) throw new IllegalArgumentException("no block was measured: is a tone reaching the input?");
        double[] rms = new double[measurements.size()];
        for (int i = 0; i < rms.length; i++) {
            Measurement m = measurements.get(i);
            if (!m.unit().equals(SampleUnit.FULL_SCALE.symbol()))
                throw new IllegalArgumentException("calibration needs an uncalibrated capture (unit " + m.unit() + " given)");
            if (!m.measured()) throw new IllegalArgumentException("block " + i + " not measured: " + m.notMeasuredReason().orElse("?"));
            rms[i] = m.fundamental().rms();
        }
        Arrays.sort(rms);
        double med = rms.length % 2 == 1 ? rms[rms.length / 2] : 0.5 * (rms[rms.length / 2 - 1] + rms[rms.length / 2]);
        return new Result(fullScaleVolts(meterRmsVolts, med), med, meterRmsVolts, rms.length);
    }
}

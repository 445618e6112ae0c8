package org.outstage.capture;

import java.util.OptionalDouble;

/**
 * How to turn a capture file's numbers into volts.
 *
 * @param fullScaleVolts peak volts at the amplifier output that reach digital full scale (divider included);
 *                       a WAV read with it has unit {@link SampleUnit#VOLTS} and scale V ({@code --fs-volts}).
 *                       A scope CSV is already in volts: it is ignored there, with a warning.
 * @param probeFactor    multiplies scope-CSV values ({@code --probe}), for an export that did not apply the
 *                       probe ratio. Ignored for WAV, with a warning.
 * @param sampleRateHz   for a scope CSV without a time column or sample interval ({@code --sample-rate}).
 *                       When the file states its own rate (WAV header, CSV time column or interval) the two
 *                       must agree within 0.1 %, otherwise reading fails: a silent override would shift every
 *                       frequency, and a silent disagreement hides a wrong file.
 */
public record CaptureOptions(OptionalDouble fullScaleVolts, OptionalDouble probeFactor, OptionalDouble sampleRateHz) {
    /** Relative tolerance between a stated rate and {@link #sampleRateHz}. */
    public static final double RATE_TOLERANCE = 1e-3;

    public CaptureOptions {
        fullScaleVolts = checked("fullScaleVolts", fullScaleVolts);
        probeFactor = checked("probeFactor", probeFactor);
        sampleRateHz = checked("sampleRateHz", sampleRateHz);
    }

    /** No calibration, no rate. */
    public static CaptureOptions none() {
        return new CaptureOptions(OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty());
    }

    public CaptureOptions withFullScaleVolts(double volts) { return new CaptureOptions(OptionalDouble.of(volts), probeFactor, sampleRateHz); }
    public CaptureOptions withProbeFactor(double factor) { return new CaptureOptions(fullScaleVolts, OptionalDouble.of(factor), sampleRateHz); }
    public CaptureOptions withSampleRateHz(double hz) { return new CaptureOptions(fullScaleVolts, probeFactor, OptionalDouble.of(hz)); }

    private static OptionalDouble checked(String name, OptionalDouble value) {
        if (value == null) return OptionalDouble.empty();
        if (value.isPresent()) {
            double v = value.getAsDouble();
            if (!(v > 0) || !Double.isFinite(v)) throw new IllegalArgumentException(name + "=" + v + " must be > 0");
        }
        return value;
    }
}

package org.outstage.ui;

import java.util.OptionalDouble;

/**
 * Per-capture calibration entered in the capture list: full-scale volts (soundcard WAV, divider included),
 * probe ratio (scope CSV that did not apply it), the load the amplifier drove, and the sample rate of a scope CSV
 * without a time column (from the calibration notes only).
 */
public record Calibration(OptionalDouble fullScaleVolts, OptionalDouble probeRatio, OptionalDouble loadOhms, OptionalDouble sampleRateHz) {
    public static final Calibration NONE = new Calibration(OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty());

    public Calibration {
        check("fullScaleVolts", fullScaleVolts);
        check("probeRatio", probeRatio);
        check("loadOhms", loadOhms);
        check("sampleRateHz", sampleRateHz);
    }

    /** A calibration without a sample rate (the file's own). */
    public Calibration(OptionalDouble fullScaleVolts, OptionalDouble probeRatio, OptionalDouble loadOhms) {
        this(fullScaleVolts, probeRatio, loadOhms, OptionalDouble.empty());
    }

    /** The calibration a folder's notes ({@code bench.txt}) give one capture. */
    static Calibration of(org.outstage.capture.BenchManifest.Entry notes) {
        org.outstage.capture.CaptureOptions o = notes.captureOptions();
        return new Calibration(o.fullScaleVolts(), o.probeFactor(), notes.loadOhms(), o.sampleRateHz());
    }

    private static void check(String name, OptionalDouble v) {
        if (v == null) throw new IllegalArgumentException(name + " must not be null");
        if (v.isPresent() && !(v.getAsDouble() > 0 && Double.isFinite(v.getAsDouble())))
            throw new IllegalArgumentException(name + "=" + v.getAsDouble() + " must be > 0");
    }

    /** Parses a field: empty text is "not given"; anything else must be a positive number. */
    static OptionalDouble parseField(String name, String text) {
        String t = text == null ? "" : text.trim().replace(',', '.');
        if (t.isEmpty()) return OptionalDouble.empty();
        double v;
        try {
            v = Double.parseDouble(t);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException(name + " '" + text.trim() + "' is not a number");
        }
        if (!(v > 0) || !Double.isFinite(v)) throw new IllegalArgumentException(name + " " + text.trim() + " must be > 0");
        return OptionalDouble.of(v);
    }
}

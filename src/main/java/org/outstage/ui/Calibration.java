package org.outstage.ui;

import java.util.OptionalDouble;

/**
 * Per-capture calibration entered in the capture list: full-scale volts (soundcard WAV, divider included),
 * probe ratio (scope CSV that did not apply it) and the load the amplifier drove.
 */
public record Calibration(OptionalDouble fullScaleVolts, OptionalDouble probeRatio, OptionalDouble loadOhms) {
    public static final Calibration NONE = new Calibration(OptionalDouble.empty(), OptionalDouble.empty(), OptionalDouble.empty());

    public Calibration {
        check("fullScaleVolts", fullScaleVolts);
        check("probeRatio", probeRatio);
        check("loadOhms", loadOhms);
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

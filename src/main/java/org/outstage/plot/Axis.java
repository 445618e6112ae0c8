package org.outstage.plot;

import java.util.Objects;
import java.util.Optional;

/**
 * One axis of a chart: what is plotted, in which unit, on which scale, and optionally a fixed range
 * (otherwise the renderer fits the data).
 *
 * @param label what the axis shows ("Frequency", "Level")
 * @param unit  unit text shown beside the label ("Hz", "dBV", "V", "%"); empty for a plain number
 * @param scale how values map to distance
 * @param range fixed range in data units, or empty to fit the data
 */
public record Axis(String label, String unit, Scale scale, Optional<Range> range) {
    public Axis {
        Objects.requireNonNull(label, "label");
        Objects.requireNonNull(unit, "unit");
        Objects.requireNonNull(scale, "scale");
        Objects.requireNonNull(range, "range");
        if (scale == Scale.LOG10 && range.isPresent())
            org.outstage.Require.that(range.get().min() > 0, "a LOG10 axis range must be > 0, got " + range.get());
    }

    /** How data values map to distance along the axis. */
    public enum Scale {
        /** Distance proportional to the value. */
        LINEAR,
        /** Distance proportional to log10 of the value; only positive values are drawn, grid on decades. */
        LOG10,
        /** Values are already levels in dB; drawn linearly, ticks on round dB steps. */
        DB
    }

    public static Axis linear(String label, String unit) { return new Axis(label, unit, Scale.LINEAR, Optional.empty()); }
    public static Axis log(String label, String unit) { return new Axis(label, unit, Scale.LOG10, Optional.empty()); }
    public static Axis db(String label, String unit) { return new Axis(label, unit, Scale.DB, Optional.empty()); }

    public Axis withRange(double min, double max) { return new Axis(label, unit, scale, Optional.of(new Range(min, max))); }

    /** "Frequency (Hz)", or just the label when there is no unit. */
    public String title() { return unit.isEmpty() ? label : label + " (" + unit + ")"; }
}

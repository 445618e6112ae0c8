package org.outstage.plot;

import org.outstage.Require;

/** A closed interval of data values with {@code min < max}. */
public record Range(double min, double max) {
    public Range {
        Require.finite("min", min);
        Require.finite("max", max);
        Require.that(max > min, "range max=" + max + " must be > min=" + min);
    }

    public double span() { return max - min; }
    public boolean contains(double v) { return v >= min && v <= max; }
}

package org.outstage.plot;

import java.util.Arrays;
import java.util.Objects;
import org.outstage.Require;

/**
 * One data series. {@code x} and {@code y} have equal length; a NaN in either marks a gap (the line is
 * broken there, nothing is drawn for that point). Arrays are copied in and out.
 *
 * @param name  legend text
 * @param x     x values in the x axis unit
 * @param y     y values in the y axis unit
 * @param style how the points are drawn
 * @param role  what the data is; renderers pick colour and dash from it
 */
public record Series(String name, double[] x, double[] y, Style style, Role role) {
    public Series {
        Objects.requireNonNull(name, "name");
        Require.notNull("x", x);
        Require.notNull("y", y);
        Require.that(x.length == y.length, "series '" + name + "': x has " + x.length + " values, y has " + y.length);
        Objects.requireNonNull(style, "style");
        Objects.requireNonNull(role, "role");
        x = x.clone();
        y = y.clone();
    }

    /** How a series is drawn. */
    public enum Style {
        /** Straight segments between consecutive points. */
        LINE,
        /** A vertical bar from the axis floor to each value. */
        BARS,
        /** A dot at each point, no lines. */
        POINTS,
        /** Horizontal then vertical segments (sample-and-hold look). */
        STEP
    }

    /** What the data is; decides colour and dash, and lets a reader tell measurement from prediction. */
    public enum Role {
        /** Data measured from a capture. */
        MEASURED,
        /** A second measured quantity in the same chart (for example the even harmonics beside the odd ones). */
        MEASURED_ALT,
        /** A model's prediction. */
        MODEL,
        /** A fitted curve (for example the fitted fundamental). */
        FIT,
        /** What is left after removing a fit. */
        RESIDUAL,
        /** A limit or target. */
        LIMIT
    }

    public int size() { return x.length; }

    @Override public double[] x() { return x.clone(); }
    @Override public double[] y() { return y.clone(); }

    /** The x value at index i without copying the array. */
    public double xAt(int i) { return x[i]; }
    /** The y value at index i without copying the array. */
    public double yAt(int i) { return y[i]; }

    /** Direct read-only view for renderers in this package. */
    double[] xRaw() { return x; }
    double[] yRaw() { return y; }

    @Override
    public boolean equals(Object o) {
        return o instanceof Series s && name.equals(s.name) && style == s.style && role == s.role
                && Arrays.equals(x, s.x) && Arrays.equals(y, s.y);
    }

    @Override
    public int hashCode() { return Objects.hash(name, style, role, Arrays.hashCode(x), Arrays.hashCode(y)); }

    @Override
    public String toString() { return "Series[" + name + ", " + x.length + " points, " + style + ", " + role + "]"; }
}

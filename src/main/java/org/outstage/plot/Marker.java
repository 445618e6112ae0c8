package org.outstage.plot;

import java.util.Objects;
import org.outstage.Require;

/** A labelled point, such as a harmonic ("H3") on a spectrum. Coordinates are in axis units. */
public record Marker(double x, double y, String label) {
    public Marker {
        Require.finite("x", x);
        Require.finite("y", y);
        Objects.requireNonNull(label, "label");
    }
}

package org.outstage.plot;

import java.util.Objects;
import org.outstage.Require;

/** A shaded span of the x axis, such as the measurement band on a spectrum. */
public record Band(double fromX, double toX, String label) {
    public Band {
        Require.finite("fromX", fromX);
        Require.finite("toX", toX);
        Require.that(toX > fromX, "band toX=" + toX + " must be > fromX=" + fromX);
        Objects.requireNonNull(label, "label");
    }
}

package org.outstage.plot;

import java.util.Objects;
import org.outstage.Require;

/** A labelled horizontal line at {@code y} (axis units): a limit such as 1 % THD, or a noise floor. */
public record HorizontalLine(double y, String label, Series.Role role) {
    public HorizontalLine {
        Require.finite("y", y);
        Objects.requireNonNull(label, "label");
        Objects.requireNonNull(role, "role");
    }
}

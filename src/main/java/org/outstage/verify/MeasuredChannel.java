package org.outstage.verify;

import java.util.Objects;
import org.outstage.Require;

/** The figures of one channel of one capture, as handed to the {@link Verifier}. */
public record MeasuredChannel(String captureName, int channel, KeyFigures figures) {
    public MeasuredChannel {
        Objects.requireNonNull(captureName, "captureName");
        Require.positive("channel", channel);
        Objects.requireNonNull(figures, "figures");
    }
}

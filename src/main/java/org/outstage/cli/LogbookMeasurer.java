package org.outstage.cli;

import java.nio.file.Path;
import java.util.List;
import java.util.Objects;
import org.outstage.verify.KeyFigures;

/**
 * Turns a capture file and the analyze options into what the logbook stores: the key figures and the
 * full measurement as JSON text. The logbook commands depend only on this, not on the analysis internals.
 */
public interface LogbookMeasurer {
    /** One measured channel. */
    record Measured(int channel, int channelCount, KeyFigures figures, String measurementJson, List<String> warnings) {
        public Measured {
            Objects.requireNonNull(figures, "figures");
            Objects.requireNonNull(measurementJson, "measurementJson");
            warnings = List.copyOf(warnings);
        }
    }

    /**
     * Measures the channel chosen in {@code options}. Bad input (unreadable file, no signal) throws
     * {@link BadInputException} or {@link IllegalArgumentException} with a one-line message naming the file.
     */
    Measured measure(Path capture, LogbookAnalyzeOptions options);
}

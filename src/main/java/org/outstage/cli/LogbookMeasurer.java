package org.outstage.cli;

import java.nio.file.Path;
import java.util.List;
import java.util.Objects;
import java.util.OptionalInt;
import org.outstage.verify.KeyFigures;

/**
 * Turns a capture file and the analyze options into what the logbook stores: the key figures and the
 * full measurement as JSON text. The logbook commands depend only on this, not on the analysis internals.
 */
public interface LogbookMeasurer {
    /** One measured channel (1-based) of a capture with {@code channelCount} channels. */
    record Measured(int channel, int channelCount, KeyFigures figures, String measurementJson, List<String> warnings,
                    java.util.Optional<org.outstage.analysis.Measurement> measurement) {
        public Measured {
            Objects.requireNonNull(figures, "figures");
            Objects.requireNonNull(measurementJson, "measurementJson");
            warnings = List.copyOf(warnings);
            Objects.requireNonNull(measurement, "measurement");
        }

        /** Without the full measurement (a measurer that only has the figures). */
        public Measured(int channel, int channelCount, KeyFigures figures, String measurementJson, List<String> warnings) {
            this(channel, channelCount, figures, measurementJson, warnings, java.util.Optional.empty());
        }
    }

    /**
     * Measures {@code channel} of the capture, or every channel when it is empty (a channel that cannot be
     * measured is then left out with a warning). Bad input (unreadable file, no signal on the chosen channel)
     * throws {@link BadInputException} or {@link IllegalArgumentException} with one line naming the file.
     */
    List<Measured> measure(Path capture, AnalyzeOptions options, OptionalInt channel);
}

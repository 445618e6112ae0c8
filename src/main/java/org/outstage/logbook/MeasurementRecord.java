package org.outstage.logbook;

import java.time.Instant;
import java.util.Collections;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;
import org.outstage.Require;
import org.outstage.verify.KeyFigures;

/**
 * One measurement with its provenance (style.md §16): the full measurement as JSON text (as the caller
 * serialised it), the indexed key figures, every setting that produced it and which of those were
 * defaulted, the capture it came from, and the program version.
 *
 * @param channel         1-based channel of the capture that was measured
 * @param capture         the stored capture, when there was a file
 * @param measuredAt      when the measurement was made
 * @param programVersion  e.g. "outstage 0.1.0"
 * @param settings        setting name → value as text (sorted)
 * @param defaulted       names of the settings that were not given and took their default
 * @param measurementJson the full measurement, JSON text
 * @param figures         the indexed figures
 */
public record MeasurementRecord(int channel, Optional<CaptureRef> capture, Instant measuredAt, String programVersion,
                                Map<String, String> settings, Set<String> defaulted, String measurementJson, KeyFigures figures) {
    public MeasurementRecord {
        Require.positive("channel", channel);
        Objects.requireNonNull(capture, "capture");
        Objects.requireNonNull(measuredAt, "measuredAt");
        Objects.requireNonNull(programVersion, "programVersion");
        settings = Collections.unmodifiableSortedMap(new TreeMap<>(Objects.requireNonNull(settings, "settings")));
        defaulted = Collections.unmodifiableSortedSet(new TreeSet<>(Objects.requireNonNull(defaulted, "defaulted")));
        Objects.requireNonNull(measurementJson, "measurementJson");
        Objects.requireNonNull(figures, "figures");
        for (String d : defaulted) Require.that(settings.containsKey(d), "defaulted setting '" + d + "' is not among the settings");
    }
}

package org.outstage.logbook;

import java.time.Instant;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;
import org.outstage.verify.KeyFigures;

/**
 * One step as a point of the session's series: the reading, the temperatures and the key figures, without
 * the full measurement JSON or the settings. What charts, the advice and the drift need, read from the
 * indexed columns only ({@link Logbook#stepSeries}).
 */
public record StepPoint(int seq, Instant takenAt, BiasReading reading, OptionalDouble heatsinkCelsius, OptionalDouble ambientCelsius,
                        int channel, Optional<KeyFigures> figures) {
    public StepPoint {
        Objects.requireNonNull(takenAt, "takenAt");
        Objects.requireNonNull(reading, "reading");
        Objects.requireNonNull(heatsinkCelsius, "heatsinkCelsius");
        Objects.requireNonNull(ambientCelsius, "ambientCelsius");
        Objects.requireNonNull(figures, "figures");
    }

    public static StepPoint of(BiasStep s) {
        return new StepPoint(s.seq(), s.takenAt(), s.reading(), s.heatsinkCelsius(), s.ambientCelsius(), s.channel(),
                s.measurement().map(MeasurementRecord::figures));
    }

    public static java.util.List<StepPoint> of(java.util.List<BiasStep> steps) {
        return steps.stream().map(StepPoint::of).toList();
    }
}

package org.outstage.logbook;

import java.time.Instant;
import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;
import org.outstage.Require;

/**
 * One step of a bias session: the reading at a time, the temperatures, the channel, and (usually) the
 * capture taken at that setting with its measurement. A step without a measurement is a plain reading
 * (drift logging at a constant setting).
 *
 * @param seq 1-based order within the session, assigned by the logbook (0 in a draft)
 */
public record BiasStep(int seq, Instant takenAt, BiasReading reading, OptionalDouble heatsinkCelsius, OptionalDouble ambientCelsius,
                       int channel, Optional<MeasurementRecord> measurement) {
    public BiasStep {
        Require.that(seq >= 0, "seq=" + seq + " must be >= 0");
        Objects.requireNonNull(takenAt, "takenAt");
        Objects.requireNonNull(reading, "reading");
        Objects.requireNonNull(heatsinkCelsius, "heatsinkCelsius");
        Objects.requireNonNull(ambientCelsius, "ambientCelsius");
        heatsinkCelsius.ifPresent(v -> Require.inRange("heatsinkCelsius", v, -60, 300));
        ambientCelsius.ifPresent(v -> Require.inRange("ambientCelsius", v, -60, 100));
        Require.positive("channel", channel);
        Objects.requireNonNull(measurement, "measurement");
    }

    /** A step to hand to {@link Logbook#addBiasStep}; the logbook gives it its sequence number. */
    public static BiasStep draft(Instant takenAt, BiasReading reading, OptionalDouble heatsinkCelsius, OptionalDouble ambientCelsius,
                                 int channel, Optional<MeasurementRecord> measurement) {
        return new BiasStep(0, takenAt, reading, heatsinkCelsius, ambientCelsius, channel, measurement);
    }

    BiasStep withSeq(int s) {
        return new BiasStep(s, takenAt, reading, heatsinkCelsius, ambientCelsius, channel, measurement);
    }
}

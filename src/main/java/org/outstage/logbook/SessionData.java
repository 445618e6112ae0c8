package org.outstage.logbook;

import java.util.List;
import java.util.Objects;

/** Everything the logbook holds about one session: the unit, the session, its steps and its other measurements. */
public record SessionData(UnitUnderTest unit, Session session, List<BiasStep> steps, List<MeasurementRecord> measurements) {
    public SessionData {
        Objects.requireNonNull(unit, "unit");
        Objects.requireNonNull(session, "session");
        steps = List.copyOf(steps);
        measurements = List.copyOf(measurements);
    }
}

package org.outstage.logbook;

import java.util.Objects;
import java.util.Optional;
import java.util.OptionalDouble;
import org.outstage.Require;

/** An amplifier on the bench. The name is its key in the logbook. */
public record UnitUnderTest(String name, Optional<String> serial, Optional<String> topology, Optional<String> notes,
                            OptionalDouble ratedPowerWatts, OptionalDouble ratedLoadOhms) {
    public UnitUnderTest {
        Objects.requireNonNull(name, "name");
        Require.that(!name.isBlank(), "unit name must not be blank");
        Objects.requireNonNull(serial, "serial");
        Objects.requireNonNull(topology, "topology");
        Objects.requireNonNull(notes, "notes");
        Objects.requireNonNull(ratedPowerWatts, "ratedPowerWatts");
        Objects.requireNonNull(ratedLoadOhms, "ratedLoadOhms");
        ratedPowerWatts.ifPresent(v -> Require.positive("ratedPowerWatts", v));
        ratedLoadOhms.ifPresent(v -> Require.positive("ratedLoadOhms", v));
    }

    public static UnitUnderTest named(String name) {
        return new UnitUnderTest(name, Optional.empty(), Optional.empty(), Optional.empty(), OptionalDouble.empty(), OptionalDouble.empty());
    }
}

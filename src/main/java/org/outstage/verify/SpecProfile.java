package org.outstage.verify;

import java.util.List;
import java.util.Objects;
import java.util.OptionalDouble;

/**
 * A specification to verify an amplifier against (read by {@link SpecParser}; format in docs/spec-format.md).
 *
 * @param source              the file it came from
 * @param name                the amplifier or profile name
 * @param ratedPowerWatts     rated power, when stated
 * @param ratedLoadOhms       rated load, when stated
 * @param frequencyTolerance  a capture matches a frequency condition within this fraction (default 0.05)
 * @param powerTolerance      a capture matches a power condition within this fraction (default 0.10)
 * @param limits              the limits in file order
 */
public record SpecProfile(String source, String name, OptionalDouble ratedPowerWatts, OptionalDouble ratedLoadOhms,
                          double frequencyTolerance, double powerTolerance, List<Limit> limits) {
    public SpecProfile {
        Objects.requireNonNull(source, "source");
        Objects.requireNonNull(name, "name");
        Objects.requireNonNull(ratedPowerWatts, "ratedPowerWatts");
        Objects.requireNonNull(ratedLoadOhms, "ratedLoadOhms");
        limits = List.copyOf(limits);
    }
}

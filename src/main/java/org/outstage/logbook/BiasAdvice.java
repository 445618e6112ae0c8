package org.outstage.logbook;

import java.util.List;
import java.util.Objects;
import java.util.OptionalDouble;

/**
 * What a bias session recommends.
 *
 * @param low, high    the recommended reading range (both empty when the steps never reached it)
 * @param unit         unit of the readings the range is in
 * @param best         the reading where the crossover deviation |gain_at_zero − 1| is smallest
 * @param direction    what to do from the last step: more, less, here, or unknown
 * @param text         one sentence for the bench
 * @param warnings     e.g. steps that pass into gm-doubling, readings in another unit that were left out
 */
public record BiasAdvice(OptionalDouble low, OptionalDouble high, BiasReading.Unit unit, OptionalDouble best, Direction direction,
                         String text, List<String> warnings) {
    /** From the last step taken: turn the bias up, down, leave it, or not enough data. */
    public enum Direction { MORE, LESS, HERE, UNKNOWN }

    public BiasAdvice {
        Objects.requireNonNull(low, "low");
        Objects.requireNonNull(high, "high");
        Objects.requireNonNull(unit, "unit");
        Objects.requireNonNull(best, "best");
        Objects.requireNonNull(direction, "direction");
        Objects.requireNonNull(text, "text");
        warnings = List.copyOf(warnings);
    }
}

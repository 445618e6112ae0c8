package org.outstage.logbook;

import java.util.List;
import java.util.Objects;
import java.util.OptionalDouble;

/**
 * How a quantity moved at a constant setting.
 *
 * @param settled           true when over the last window the quantity changed by less than the tolerance
 * @param changeRatio       (max − min) / mean over the last window (empty when the steps do not cover a full window)
 * @param slopePerCelsius   least-squares slope of the quantity against heatsink temperature (empty without temperatures)
 * @param runawayRisk       true when the quantity keeps rising with the temperature and has not settled
 * @param text              one sentence for the bench
 */
public record DriftReport(boolean settled, OptionalDouble changeRatio, OptionalDouble slopePerCelsius, boolean runawayRisk, String text,
                          List<String> warnings) {
    public DriftReport {
        Objects.requireNonNull(changeRatio, "changeRatio");
        Objects.requireNonNull(slopePerCelsius, "slopePerCelsius");
        Objects.requireNonNull(text, "text");
        warnings = List.copyOf(warnings);
    }
}

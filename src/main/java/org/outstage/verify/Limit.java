package org.outstage.verify;

import java.util.Objects;
import java.util.OptionalDouble;

/**
 * One line of a spec profile: a quantity, a bound and the conditions under which it holds.
 *
 * @param line          line number in the spec file (for messages)
 * @param quantity      what is bounded
 * @param atMost        true for {@code <=}, false for {@code >=}
 * @param bound         the bound in SI units or as a fraction (0.0005 for 0.05 %)
 * @param displayUnit   the unit the spec wrote: "%", "dB", "W", "V", "mV", "µV"
 * @param frequencyHz   test frequency condition
 * @param powerWatts    output power condition (already resolved when the spec said "rated power")
 * @param loadOhms      load condition
 * @param thdThreshold  for {@link Quantity#POWER}: the THD at which power is read (fraction)
 * @param text          the line as written
 * @param qualifier     a word condition: the IMD method ("smpte", "difference-frequency") or the S/N weighting
 *                      ("a-weighted", "unweighted"); empty when none
 */
public record Limit(int line, Quantity quantity, boolean atMost, double bound, String displayUnit, OptionalDouble frequencyHz,
                    OptionalDouble powerWatts, OptionalDouble loadOhms, OptionalDouble thdThreshold, String text, String qualifier) {
    public Limit(int line, Quantity quantity, boolean atMost, double bound, String displayUnit, OptionalDouble frequencyHz,
                 OptionalDouble powerWatts, OptionalDouble loadOhms, OptionalDouble thdThreshold, String text) {
        this(line, quantity, atMost, bound, displayUnit, frequencyHz, powerWatts, loadOhms, thdThreshold, text, "");
    }

    public Limit {
        Objects.requireNonNull(qualifier, "qualifier");
        Objects.requireNonNull(quantity, "quantity");
        Objects.requireNonNull(displayUnit, "displayUnit");
        Objects.requireNonNull(frequencyHz, "frequencyHz");
        Objects.requireNonNull(powerWatts, "powerWatts");
        Objects.requireNonNull(loadOhms, "loadOhms");
        Objects.requireNonNull(thdThreshold, "thdThreshold");
        Objects.requireNonNull(text, "text");
    }

    /** A value in SI/fraction shown in the unit the spec used. */
    public double toDisplay(double si) {
        return switch (displayUnit) {
            case "%" -> si * 100;
            case "dB" -> quantity == Quantity.BALANCE || quantity == Quantity.SNR || quantity == Quantity.CROSSTALK
                    || quantity == Quantity.RESPONSE_DEVIATION ? si : 20 * Math.log10(si);
            case "kHz" -> si / 1000;
            case "mV" -> si * 1e3;
            case "µV" -> si * 1e6;
            default -> si;
        };
    }

    public double boundDisplay() { return toDisplay(bound); }

    /** True when {@code measured} (SI/fraction) meets the bound. */
    public boolean passes(double measured) { return atMost ? measured <= bound : measured >= bound; }

    /** Headroom in display units: positive when the limit is met. */
    public double marginDisplay(double measured) {
        double m = toDisplay(measured);
        double b = boundDisplay();
        return atMost ? b - m : m - b;
    }
}

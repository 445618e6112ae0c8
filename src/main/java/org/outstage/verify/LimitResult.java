package org.outstage.verify;

import java.util.Objects;
import java.util.OptionalDouble;

/**
 * One limit checked.
 *
 * @param measured  the measured value in SI units or as a fraction (empty when not measured)
 * @param margin    headroom in the limit's display unit, positive when met (empty when not measured)
 * @param evidence  which capture(s) and channel(s) gave the value, or why there was none
 */
public record LimitResult(Limit limit, Verdict verdict, OptionalDouble measured, OptionalDouble margin, String evidence) {
    public LimitResult {
        Objects.requireNonNull(limit, "limit");
        Objects.requireNonNull(verdict, "verdict");
        Objects.requireNonNull(measured, "measured");
        Objects.requireNonNull(margin, "margin");
        Objects.requireNonNull(evidence, "evidence");
    }
}

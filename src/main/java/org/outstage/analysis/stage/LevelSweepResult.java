package org.outstage.analysis.stage;

import java.util.List;

/**
 * A level series read as a whole.
 *
 * @param points       the points sorted by power (ascending)
 * @param atOnePercent power at 1 % THD
 * @param atTenPercent power at 10 % THD
 */
public record LevelSweepResult(List<LevelPoint> points, RatedPower atOnePercent, RatedPower atTenPercent) {
    public LevelSweepResult { points = List.copyOf(points); }
}

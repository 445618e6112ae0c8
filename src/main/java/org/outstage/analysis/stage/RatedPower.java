package org.outstage.analysis.stage;

import java.util.OptionalDouble;

/**
 * Distortion-limited output power at a THD limit (IEC 60268-3 notion of rated distortion-limited output).
 *
 * @param thdLimitRatio THD limit as a fraction (0.01 = 1 %)
 * @param powerWatts    the interpolated power, empty when the series does not bracket the limit
 * @param message       one sentence: the figure and the points it came from, or why there is none
 */
public record RatedPower(double thdLimitRatio, OptionalDouble powerWatts, String message) {}

package org.outstage.analysis.stage;

import org.outstage.Require;

/**
 * One capture of a level series: where it came from, its conditions and its figures.
 *
 * @param fileName         capture file (named in messages)
 * @param frequencyHz      test frequency
 * @param loadOhms         load resistance
 * @param calibrationLabel calibration name (e.g. "divider 1:20")
 * @param fullScaleVolts   volts at digital full scale, or 0 for a capture already in volts
 * @param powerWatts       output power V_rms²/R
 * @param thdRatio         THD as a fraction (0.01 = 1 %)
 * @param thdNRatio        THD+N as a fraction
 */
public record LevelPoint(String fileName, double frequencyHz, double loadOhms, String calibrationLabel,
                         double fullScaleVolts, double powerWatts, double thdRatio, double thdNRatio) {
    public LevelPoint {
        Require.notNull("fileName", fileName);
        Require.positive("frequencyHz", frequencyHz);
        Require.positive("loadOhms", loadOhms);
        Require.notNull("calibrationLabel", calibrationLabel);
        Require.nonNegative("fullScaleVolts", fullScaleVolts);
        Require.positive("powerWatts", powerWatts);
        Require.positive("thdRatio", thdRatio);
        Require.positive("thdNRatio", thdNRatio);
    }
}

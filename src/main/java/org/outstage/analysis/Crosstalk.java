package org.outstage.analysis;

import org.outstage.Require;

/**
 * Crosstalk into an undriven channel (channel separation is its negative in dB): the driven tone's level in
 * this channel relative to its level in the driven channel, at the tone's frequency, 20·lg(V_undriven/V_driven)
 * (common practice; IEC 60268-3 defines the measurement, text not seen). Levels are spectral lines (power over
 * the window's main lobe, noise under the line subtracted), so broadband noise in the undriven channel does not
 * count.
 *
 * @param fromChannel the driven channel (1-based)
 * @param frequencyHz the driven tone
 * @param ratio       V_undriven / V_driven
 * @param resolved    whether the line in this channel stands at least 10 dB above the noise in its own bins;
 *                    when false the ratio is an upper bound
 */
public record Crosstalk(int fromChannel, double frequencyHz, double ratio, boolean resolved) {
    public Crosstalk {
        Require.positive("fromChannel", fromChannel);
        Require.positive("frequencyHz", frequencyHz);
        Require.nonNegative("ratio", ratio);
    }

    public double db() { return Levels.ratioToDb(ratio); }
}

package org.outstage.analysis;

import java.util.List;
import java.util.OptionalDouble;
import org.outstage.Require;

/**
 * Frequency response (gain and phase) and THD against frequency of one channel, measured from an exponential
 * sine sweep ({@link SweepResponse}).
 *
 * @param points           gain and phase on a 1/24-octave grid across the swept band (edges trimmed)
 * @param gainAt1kHzDb     the gain at 1 kHz (or at the band's geometric centre when 1 kHz is not swept): the
 *                         reference of {@code minus3dbLowHz}, {@code minus3dbHighHz} and the deviation
 * @param minus3dbLowHz    the highest frequency below 1 kHz where the power gain has halved (−3.01 dB re 1 kHz);
 *                         empty when the gain does not fall that far within the swept band
 * @param minus3dbHighHz   the lowest frequency above 1 kHz where it has halved; empty likewise
 * @param deviationLowHz   lower edge of the deviation band (20 Hz, or the swept band's edge if higher)
 * @param deviationHighHz  upper edge (20 kHz, or the swept band's edge if lower)
 * @param deviationMinDb   the lowest gain re 1 kHz in the deviation band
 * @param deviationMaxDb   the highest gain re 1 kHz in the deviation band
 * @param thdVsFrequency   THD_F against the fundamental's frequency, from the harmonic impulse responses (orders
 *                         2…5); empty when the sweep is too short to separate them
 * @param sweepLowHz       lower edge of the swept band found in the stimulus spectrum
 * @param sweepHighHz      upper edge
 * @param sweepSeconds     duration of the sweep found in the stimulus
 * @param fromReference    true when the stimulus is a captured reference channel (the gain is channel over
 *                         reference), false when it is the known generated sweep
 */
public record FrequencyResponse(List<Point> points, double gainAt1kHzDb, OptionalDouble minus3dbLowHz, OptionalDouble minus3dbHighHz,
                                double deviationLowHz, double deviationHighHz, double deviationMinDb, double deviationMaxDb,
                                List<ThdPoint> thdVsFrequency, double sweepLowHz, double sweepHighHz, double sweepSeconds,
                                boolean fromReference) {
    public FrequencyResponse {
        points = List.copyOf(points);
        thdVsFrequency = List.copyOf(thdVsFrequency);
        Require.notNull("minus3dbLowHz", minus3dbLowHz);
        Require.notNull("minus3dbHighHz", minus3dbHighHz);
    }

    /**
     * One point of the response.
     *
     * @param frequencyHz  frequency
     * @param gainDb       20·lg|H|, absolute (with a reference: channel over reference)
     * @param gainRe1kHzDb gain relative to the gain at 1 kHz
     * @param phaseDeg     arg H in degrees, wrapped to (−180, 180]
     */
    public record Point(double frequencyHz, double gainDb, double gainRe1kHzDb, double phaseDeg) {}

    /**
     * THD at one fundamental frequency.
     *
     * @param frequencyHz the fundamental
     * @param thdRatio    √(Σ_N |H_N(N·f)|²)/|H_1(f)|, N = 2…5 (THD_F)
     */
    public record ThdPoint(double frequencyHz, double thdRatio) {
        public double percent() { return Levels.ratioToPercent(thdRatio); }
    }
}

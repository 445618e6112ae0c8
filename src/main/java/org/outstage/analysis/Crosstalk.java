package org.outstage.analysis;

import java.util.ArrayList;
import java.util.List;
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
 * @param points      crosstalk against frequency when the driven channel carries an exponential sweep (else empty):
 *                    20·lg(|H_undriven(f)|/|H_driven(f)|) with both responses taken against the driven channel, which
 *                    is |H(f)| of the undriven channel with the driven one as the stimulus (Farina 2000, the method
 *                    of {@link SweepResponse}; docs/references.md §13); 20 Hz–20 kHz, at most 200, log spaced
 */
public record Crosstalk(int fromChannel, double frequencyHz, double ratio, boolean resolved, List<Point> points) {
    /** One point of crosstalk against frequency, in dB (20·lg of the amplitude ratio). */
    public record Point(double frequencyHz, double db) {}

    /** From one tone: no points. */
    public Crosstalk(int fromChannel, double frequencyHz, double ratio, boolean resolved) {
        this(fromChannel, frequencyHz, ratio, resolved, List.of());
    }

    /**
     * From the response of the undriven channel with the driven channel's sweep as the stimulus: the points within
     * 20 Hz–20 kHz (thinned to at most 200, log spaced), and the single figure at the point nearest 1 kHz.
     *
     * @throws IllegalArgumentException when the response has no point within 20 Hz–20 kHz
     */
    public static Crosstalk fromSweep(int fromChannel, FrequencyResponse undrivenAgainstDriven) {
        List<Point> all = new ArrayList<>();
        for (FrequencyResponse.Point p : undrivenAgainstDriven.points())
            if (p.frequencyHz() >= 20 * (1 - 1e-9) && p.frequencyHz() <= 20000 * (1 + 1e-9)) all.add(new Point(p.frequencyHz(), p.gainDb()));
        if (all.isEmpty()) throw new IllegalArgumentException("no response point within 20 Hz-20 kHz");
        List<Point> pts = all;
        if (all.size() > 200) {
            pts = new ArrayList<>();
            double lo = Math.log(all.get(0).frequencyHz()), hi = Math.log(all.get(all.size() - 1).frequencyHz());
            int j = 0, last = -1;
            for (int k = 0; k < 200; k++) {
                double t = lo + (hi - lo) * k / 199;
                while (j < all.size() - 1 && Math.abs(Math.log(all.get(j + 1).frequencyHz()) - t) <= Math.abs(Math.log(all.get(j).frequencyHz()) - t)) j++;
                if (j != last) { pts.add(all.get(j)); last = j; }
            }
        }
        Point k = pts.get(0);
        for (Point p : pts) if (Math.abs(Math.log(p.frequencyHz() / 1000)) < Math.abs(Math.log(k.frequencyHz() / 1000))) k = p;
        return new Crosstalk(fromChannel, k.frequencyHz(), Math.pow(10, k.db() / 20), true, pts);
    }

    public Crosstalk {
        points = List.copyOf(points);
        Require.positive("fromChannel", fromChannel);
        Require.positive("frequencyHz", frequencyHz);
        Require.nonNegative("ratio", ratio);
    }

    public double db() { return Levels.ratioToDb(ratio); }
}

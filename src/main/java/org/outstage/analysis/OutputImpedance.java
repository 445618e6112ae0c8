package org.outstage.analysis;

import java.util.ArrayList;
import java.util.List;
import org.outstage.Require;

/**
 * Output impedance and damping factor from the same drive captured open-circuit and into a known load
 * (voltage divider: V_loaded = V_open·R_L/(R_L + Z_out), so Z_out = R_L·(V_open/V_loaded − 1)); the damping
 * factor DF = R_L/Z_out (common practice: quoted into 8 Ω at a stated frequency, docs/references.md §13).
 * Assumes the source is linear at this level and Z_out is resistive at the test frequency (a reactive Z_out
 * reads as its magnitude-projection |V_open/V_loaded| − 1).
 *
 * <p>Worked example (replayed in {@code OutputImpedanceTest}): 2.000 V open, 1.996 V into 8 Ω gives
 * Z_out = 8·(2/1.996 − 1) = 16.03 mΩ and DF = 499.
 *
 * @param loadOhms      the load of the loaded capture
 * @param frequencyHz   the test frequency (the loaded capture's fundamental)
 * @param openRms       fundamental rms open-circuit
 * @param loadedRms     fundamental rms into the load
 * @param zOutOhms      output impedance
 * @param dampingFactor R_L/Z_out (infinite when the two levels are equal)
 */
public record OutputImpedance(double loadOhms, double frequencyHz, double openRms, double loadedRms, double zOutOhms, double dampingFactor) {
    public OutputImpedance {
        Require.positive("loadOhms", loadOhms);
        Require.positive("openRms", openRms);
        Require.positive("loadedRms", loadedRms);
    }

    /**
     * From two fundamental levels.
     *
     * @throws IllegalArgumentException when a level is not positive
     */
    public static OutputImpedance of(double loadOhms, double frequencyHz, double openRms, double loadedRms) {
        Require.positive("loadOhms", loadOhms);
        Require.positive("openRms", openRms);
        Require.positive("loadedRms", loadedRms);
        double z = loadOhms * (openRms / loadedRms - 1);
        return new OutputImpedance(loadOhms, frequencyHz, openRms, loadedRms, z, loadOhms / z);
    }

    /** From two measurements of the same channel (open, loaded); their fundamentals must agree within 1 %. */
    public static OutputImpedance of(double loadOhms, Measurement open, Measurement loaded) {
        if (!open.measured()) throw new IllegalArgumentException("open-circuit capture: " + open.notMeasuredReason().get());
        if (!loaded.measured()) throw new IllegalArgumentException("loaded capture: " + loaded.notMeasuredReason().get());
        double fo = open.fundamental().frequencyHz(), fl = loaded.fundamental().frequencyHz();
        if (Math.abs(fo - fl) > 0.01 * fl)
            throw new IllegalArgumentException("the open-circuit tone " + Levels.formatHz(fo) + " and the loaded tone " + Levels.formatHz(fl)
                    + " differ by more than 1 %: capture the same drive twice");
        if (!open.unit().equals(loaded.unit()))
            throw new IllegalArgumentException("the two captures have different units (" + open.unit() + ", " + loaded.unit() + ")");
        return of(loadOhms, fl, open.fundamental().rms(), loaded.fundamental().rms());
    }

    /**
     * One point of {@link #againstFrequency}: |Z_out|, its phase, and the damping factor R_L/|Z_out|.
     *
     * @param frequencyHz          the frequency (of the open-circuit response's grid)
     * @param zOutOhms             |Z_out(f)|
     * @param zOutPhaseDeg         arg Z_out(f) (positive: inductive)
     * @param dampingFactor        R_L/|Z_out(f)|
     */
    public record Point(double frequencyHz, double zOutOhms, double zOutPhaseDeg, double dampingFactor) {}

    /**
     * Output impedance against frequency.
     *
     * @param loadOhms the load of the loaded sweep
     * @param points   20 Hz–20 kHz, at most {@link #MAX_POINTS}, log spaced
     */
    public record VersusFrequency(double loadOhms, List<Point> points) {
        public VersusFrequency {
            Require.positive("loadOhms", loadOhms);
            points = List.copyOf(points);
            if (points.isEmpty()) throw new IllegalArgumentException("no response point within 20 Hz-20 kHz");
        }

        /** The point nearest {@code frequencyHz} in log frequency. */
        public Point nearest(double frequencyHz) {
            Point best = points.get(0);
            for (Point p : points)
                if (Math.abs(Math.log(p.frequencyHz() / frequencyHz)) < Math.abs(Math.log(best.frequencyHz() / frequencyHz))) best = p;
            return best;
        }
    }

    /** At most this many points in {@link VersusFrequency#points()}. */
    public static final int MAX_POINTS = 200;

    /**
     * Complex output impedance against frequency from the same exponential sweep captured open-circuit and into
     * R_L, each capture's response H(f) measured against its own generator channel (Farina 2000, the method of
     * {@link SweepResponse}; docs/references.md §13). The voltage divider of the single-tone method, in complex
     * form: H_loaded = H_open·R_L/(R_L + Z_out), so Z_out(f) = R_L·(H_open(f)/H_loaded(f) − 1), with
     * H = 10^(gain/20)·e^{j·phase}; a reactive Z_out (the inductance of an output coil, the cable) then reads with
     * its phase instead of as a magnitude projection. The loaded response is brought onto the open one's frequency
     * grid by linear interpolation of gain (dB) and phase (unwrapped between neighbours) in log frequency. Points
     * are kept from 20 Hz to 20 kHz and thinned to at most {@link #MAX_POINTS}, log spaced. Pure.
     *
     * <p>Check (replayed in {@code ImpedanceVsFrequencyTest}): a source of 0.05 Ω + j·ω·5 µH into 8 Ω reads
     * √(R0² + (ωL0)²) within 2 % and its phase within 2° from 50 Hz to 15 kHz.
     *
     * @throws IllegalArgumentException when no point lies within 20 Hz–20 kHz or the load is not positive
     */
    public static VersusFrequency againstFrequency(FrequencyResponse open, FrequencyResponse loaded, double loadOhms) {
        Require.notNull("open", open);
        Require.notNull("loaded", loaded);
        Require.positive("loadOhms", loadOhms);
        List<FrequencyResponse.Point> lp = loaded.points();
        if (lp.isEmpty()) throw new IllegalArgumentException("the loaded response has no points");
        List<Point> all = new ArrayList<>();
        for (FrequencyResponse.Point o : open.points()) {
            double f = o.frequencyHz();
            if (f < 20 * (1 - 1e-9) || f > 20000 * (1 + 1e-9)) continue;
            double[] gp = interpolate(lp, f);
            if (gp == null) continue;
            double ratio = Math.pow(10, (o.gainDb() - gp[0]) / 20);          // |H_open/H_loaded|
            double dphi = Math.toRadians(o.phaseDeg() - gp[1]);
            double re = loadOhms * (ratio * Math.cos(dphi) - 1), im = loadOhms * ratio * Math.sin(dphi);
            double mag = Math.hypot(re, im);
            all.add(new Point(f, mag, Math.toDegrees(Math.atan2(im, re)), loadOhms / mag));
        }
        return new VersusFrequency(loadOhms, thin(all));
    }

    /** Gain (dB) and phase (degrees) of {@code pts} at {@code f}, linear in log f; null outside the grid. */
    static double[] interpolate(List<FrequencyResponse.Point> pts, double f) {
        int n = pts.size();
        if (f < pts.get(0).frequencyHz() * (1 - 1e-9) || f > pts.get(n - 1).frequencyHz() * (1 + 1e-9)) return null;
        int hi = 0;
        while (hi < n - 1 && pts.get(hi).frequencyHz() < f) hi++;
        FrequencyResponse.Point b = pts.get(hi);
        if (hi == 0 || Math.abs(b.frequencyHz() - f) <= 1e-9 * f) return new double[] {b.gainDb(), b.phaseDeg()};
        FrequencyResponse.Point a = pts.get(hi - 1);
        double t = Math.log(f / a.frequencyHz()) / Math.log(b.frequencyHz() / a.frequencyHz());
        double dp = b.phaseDeg() - a.phaseDeg();
        dp -= 360 * Math.rint(dp / 360);                                        // the shorter way round
        return new double[] {a.gainDb() + t * (b.gainDb() - a.gainDb()), a.phaseDeg() + t * dp};
    }

    /** At most {@link #MAX_POINTS}: the point nearest each of MAX_POINTS log-spaced frequencies, each kept once. */
    static List<Point> thin(List<Point> all) {
        if (all.size() <= MAX_POINTS) return all;
        double lo = Math.log(all.get(0).frequencyHz()), hi = Math.log(all.get(all.size() - 1).frequencyHz());
        List<Point> out = new ArrayList<>();
        int j = 0, last = -1;
        for (int k = 0; k < MAX_POINTS; k++) {
            double target = lo + (hi - lo) * k / (MAX_POINTS - 1);
            while (j < all.size() - 1 && Math.abs(Math.log(all.get(j + 1).frequencyHz()) - target) <= Math.abs(Math.log(all.get(j).frequencyHz()) - target)) j++;
            if (j != last) { out.add(all.get(j)); last = j; }
        }
        return out;
    }
}

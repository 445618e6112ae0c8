package org.outstage.analysis.stage;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import org.outstage.Require;

/**
 * Level series and distortion-limited output power. The rated distortion-limited output power is the power
 * at which THD reaches a stated limit (IEC 60268-3; 1 % and 10 % are given here). Between the two points that
 * bracket the limit (the first crossing from below, points sorted by power) the THD is interpolated linearly in
 * log(power)–log(THD): near clipping THD rises as a steep power law of the level, which is a straight line on
 * those axes, so the interpolation is exact for a power law and much closer than a linear one otherwise.
 *
 * <p>A series must be one experiment: the same load, the same calibration (label and full-scale volts within
 * 1e-6 relative) and the same frequency within 1 % (a tolerance chosen here: it accepts 997 Hz against
 * 1 kHz and fitted frequencies that scatter, and refuses an octave or a 10 % step). A point that differs is
 * refused with its file named.
 *
 * <p>Worked example (replayed in {@code LevelSweepTest}): points (1 W, 0.1 %) and (100 W, 10 %) give 10 W at 1 %.
 */
public final class LevelSweep {
    static final double FREQUENCY_TOLERANCE = 0.01;

    private LevelSweep() {}

    /** Sorts the points by power and finds the power at 1 % and 10 % THD. */
    public static LevelSweepResult analyze(List<LevelPoint> points) {
        Require.notNull("points", points);
        Require.that(!points.isEmpty(), "a level series needs at least one point, got none");
        LevelPoint first = points.get(0);
        for (LevelPoint p : points) {
            Require.notNull("point", p);
            if (Math.abs(p.frequencyHz() - first.frequencyHz()) > FREQUENCY_TOLERANCE * first.frequencyHz())
                throw new IllegalArgumentException(p.fileName() + ": frequency " + num6(p.frequencyHz()) + " Hz differs from "
                        + num6(first.frequencyHz()) + " Hz in " + first.fileName() + " (tolerance 1 %)");
            if (p.loadOhms() != first.loadOhms())
                throw new IllegalArgumentException(p.fileName() + ": load " + num6(p.loadOhms()) + " ohm differs from "
                        + num6(first.loadOhms()) + " ohm in " + first.fileName());
            if (!p.calibrationLabel().equals(first.calibrationLabel())
                    || Math.abs(p.fullScaleVolts() - first.fullScaleVolts()) > 1e-6 * Math.max(Math.abs(first.fullScaleVolts()), 1e-12))
                throw new IllegalArgumentException(p.fileName() + ": calibration '" + p.calibrationLabel() + "' (" + num6(p.fullScaleVolts())
                        + " V full scale) differs from '" + first.calibrationLabel() + "' (" + num6(first.fullScaleVolts()) + " V) in " + first.fileName());
        }
        List<LevelPoint> sorted = new ArrayList<>(points);
        sorted.sort(Comparator.comparingDouble(LevelPoint::powerWatts));
        return new LevelSweepResult(sorted, ratedPower(sorted, 0.01), ratedPower(sorted, 0.10));
    }

    /** Power at which THD first reaches {@code thdLimitRatio}, from points sorted by power. */
    public static RatedPower ratedPower(List<LevelPoint> sortedByPower, double thdLimitRatio) {
        Require.inRange("thdLimitRatio", thdLimitRatio, 1e-7, 1);
        Require.that(!sortedByPower.isEmpty(), "a level series needs at least one point, got none");
        String lim = pct(thdLimitRatio);
        LevelPoint lowest = sortedByPower.get(0);
        if (lowest.thdRatio() >= thdLimitRatio)
            return new RatedPower(thdLimitRatio, OptionalDouble.empty(), String.format(Locale.ROOT,
                    "THD is already %s at the lowest level (%s W, %s): the %s point lies below the series",
                    pct(lowest.thdRatio()), num(lowest.powerWatts()), lowest.fileName(), lim));
        for (int i = 0; i + 1 < sortedByPower.size(); i++) {
            LevelPoint a = sortedByPower.get(i), b = sortedByPower.get(i + 1);
            if (a.thdRatio() < thdLimitRatio && b.thdRatio() >= thdLimitRatio) {
                double la = Math.log(a.thdRatio()), lb = Math.log(b.thdRatio());
                double pa = Math.log(a.powerWatts()), pb = Math.log(b.powerWatts());
                double p = Math.exp(pa + (Math.log(thdLimitRatio) - la) * (pb - pa) / (lb - la));
                return new RatedPower(thdLimitRatio, OptionalDouble.of(p), String.format(Locale.ROOT,
                        "THD reaches %s at %s W (log-log interpolation between %s W in %s and %s W in %s)",
                        lim, num(p), num(a.powerWatts()), a.fileName(), num(b.powerWatts()), b.fileName()));
            }
        }
        LevelPoint worst = sortedByPower.get(0);
        for (LevelPoint p : sortedByPower) if (p.thdRatio() > worst.thdRatio()) worst = p;
        return new RatedPower(thdLimitRatio, OptionalDouble.empty(), String.format(Locale.ROOT,
                "THD never reached %s (max %s at %s W)", lim, pct(worst.thdRatio()), num(worst.powerWatts())));
    }

    private static String pct(double ratio) {
        return trim(String.format(Locale.ROOT, "%.3g", 100 * ratio)) + " %";
    }

    private static String num6(double v) {
        return trim(String.format(Locale.ROOT, "%.6g", v));
    }

    private static String num(double v) {
        return trim(String.format(Locale.ROOT, "%.3g", v));
    }

    private static String trim(String s) {
        if (s.contains("e") || !s.contains(".")) return s;
        s = s.replaceAll("0+$", "");
        return s.endsWith(".") ? s.substring(0, s.length() - 1) : s;
    }
}

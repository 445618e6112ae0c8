package org.outstage.logbook;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import org.outstage.Require;

/**
 * Drift of the quiescent reading (or of gain at zero) at a constant bias setting, against time and heatsink
 * temperature. As the devices warm, V_BE falls by about 2 mV/°C per junction (Sedra and Smith) and at a
 * fixed bias voltage the quiescent current rises; if the rise feeds more heating it runs away (domain.md).
 *
 * <p>Definitions (ours, stated so that the answer can be checked):
 * <ul>
 * <li><b>settled</b>: the steps span at least one window (default 5 min), the last window holds at least three
 *     steps, and within it (max − min) / mean ≤ tolerance (default 2 %);</li>
 * <li><b>runaway risk</b>: not settled, the least-squares slope against heatsink temperature is positive, and the
 *     last three steps rise in both reading and temperature.</li>
 * </ul>
 */
public final class DriftAnalysis {
    public static final Duration DEFAULT_WINDOW = Duration.ofMinutes(5);
    public static final double DEFAULT_TOLERANCE = 0.02;

    /** Which figure to follow. */
    public enum Quantity { READING, GAIN_AT_ZERO }

    private DriftAnalysis() {}

    public static DriftReport analyze(List<BiasStep> steps, Quantity q) {
        return analyzeSeries(StepPoint.of(steps), q, DEFAULT_WINDOW, DEFAULT_TOLERANCE);
    }

    public static DriftReport analyze(List<BiasStep> steps, Quantity q, Duration window, double tolerance) {
        return analyzeSeries(StepPoint.of(steps), q, window, tolerance);
    }

    /** The same on the light series of {@link Logbook#stepSeries}. */
    public static DriftReport analyzeSeries(List<StepPoint> steps, Quantity q) {
        return analyzeSeries(steps, q, DEFAULT_WINDOW, DEFAULT_TOLERANCE);
    }

    public static DriftReport analyzeSeries(List<StepPoint> steps, Quantity q, Duration window, double tolerance) {
        Require.that(!window.isNegative() && !window.isZero(), "window=" + window + " must be > 0");
        Require.positive("tolerance", tolerance);
        List<Instant> t = new ArrayList<>();
        List<Double> v = new ArrayList<>();
        List<Double> temp = new ArrayList<>();
        for (StepPoint s : steps) {
            OptionalDouble x = value(s, q);
            if (x.isEmpty()) continue;
            t.add(s.takenAt());
            v.add(x.getAsDouble());
            temp.add(s.heatsinkCelsius().isPresent() ? s.heatsinkCelsius().getAsDouble() : Double.NaN);
        }
        List<String> warnings = new ArrayList<>();
        String what = q == Quantity.READING ? "the reading" : "gain at zero";
        if (v.size() < 2) {
            return new DriftReport(false, OptionalDouble.empty(), OptionalDouble.empty(), false,
                    "not enough steps to judge drift (" + v.size() + ")", warnings);
        }
        Instant last = t.get(t.size() - 1);
        Instant from = last.minus(window);
        OptionalDouble change = OptionalDouble.empty();
        boolean settled = false;
        if (!t.get(0).isAfter(from)) {
            double min = Double.POSITIVE_INFINITY;
            double max = Double.NEGATIVE_INFINITY;
            double sum = 0;
            int count = 0;
            for (int i = 0; i < v.size(); i++) {
                if (t.get(i).isBefore(from)) continue;
                min = Math.min(min, v.get(i));
                max = Math.max(max, v.get(i));
                sum += v.get(i);
                count++;
            }
            double mean = sum / count;
            if (count >= 3 && mean != 0) {
                change = OptionalDouble.of((max - min) / Math.abs(mean));
                settled = change.getAsDouble() <= tolerance;
            }
        }
        // slope against heatsink temperature (least squares over steps that have one)
        OptionalDouble slope = OptionalDouble.empty();
        double sx = 0;
        double sy = 0;
        double sxx = 0;
        double sxy = 0;
        int m = 0;
        for (int i = 0; i < v.size(); i++) {
            double x = temp.get(i);
            if (Double.isNaN(x)) continue;
            sx += x;
            sy += v.get(i);
            sxx += x * x;
            sxy += x * v.get(i);
            m++;
        }
        double den = m * sxx - sx * sx;
        if (m >= 2 && den > 1e-12) slope = OptionalDouble.of((m * sxy - sx * sy) / den);
        boolean rising = false;
        int n = v.size();
        if (n >= 3) {
            rising = v.get(n - 3) < v.get(n - 2) && v.get(n - 2) < v.get(n - 1)
                    && temp.get(n - 3) < temp.get(n - 2) && temp.get(n - 2) < temp.get(n - 1);
        }
        boolean runaway = !settled && slope.isPresent() && slope.getAsDouble() > 0 && rising;
        String minutes = String.format(Locale.ROOT, "%.0f min", window.toSeconds() / 60.0);
        String text;
        if (runaway) {
            text = String.format(Locale.ROOT, "%s keeps rising with the heatsink temperature (%+.3g per °C): thermal runaway risk;"
                    + " lower the bias and check the thermal tracking", what, slope.getAsDouble());
            warnings.add("thermal runaway risk");
        } else if (settled) {
            text = String.format(Locale.ROOT, "settled: %s changed %.2f %% over the last %s", what, change.getAsDouble() * 100, minutes);
        } else if (change.isPresent()) {
            text = String.format(Locale.ROOT, "still moving: %s changed %.2f %% over the last %s (settled means under %.1f %%)",
                    what, change.getAsDouble() * 100, minutes, tolerance * 100);
        } else {
            text = "not settled yet: the steps do not yet cover " + minutes + " with three readings";
        }
        return new DriftReport(settled, change, slope, runaway, text, warnings);
    }

    private static OptionalDouble value(StepPoint s, Quantity q) {
        if (q == Quantity.READING) return OptionalDouble.of(s.reading().value());
        return s.figures().isPresent() ? s.figures().get().crossoverReading() : OptionalDouble.empty();
    }
}

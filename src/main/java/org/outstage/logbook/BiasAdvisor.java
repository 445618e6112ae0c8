package org.outstage.logbook;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;
import java.util.TreeMap;
import org.outstage.Require;
import org.outstage.verify.KeyFigures;

/**
 * Recommends a bias range from the steps of a session.
 *
 * <p>Criterion: the crossover deviation {@code |g0 − 1|}, where {@code g0} is the incremental gain at zero
 * output relative to the large-signal gain: the ratio the step's crossover verdict read
 * ({@link KeyFigures#crossoverReading()}: against the large-current asymptote when the outer gain still rises at
 * the capture's level, else the {@code gain_at_zero} figure). Oliver (HP Journal, Feb 1971)
 * sets the optimum class-AB bias where the small-signal gain at crossover equals the large-signal gain,
 * i.e. {@code g0 = 1}; below it the gain dips (crossover notch), above it rises (gm-doubling). The criterion
 * flattens the gain; it does not promise minimum THD at every level (docs/references.md §7).
 *
 * <p>Method (ours): readings are sorted, equal readings averaged, and {@code g0} is interpolated linearly
 * between steps. The recommended range is the stretch of readings where {@code |g0 − 1| ≤ tolerance}
 * that contains the smallest deviation. Default tolerance 0.003, the near-optimal band of the crossover verdict
 * ({@code org.outstage.analysis.stage.CrossoverMetrics}): for an emitter-follower pair it spans roughly 0.8× to 1.3×
 * the Oliver current (derivation in that class), so the advice and the per-capture verdict agree.
 */
public final class BiasAdvisor {
    /** Default near-optimal band for |g0 − 1|. */
    public static final double DEFAULT_TOLERANCE = 0.003;

    private BiasAdvisor() {}

    public static BiasAdvice recommend(List<BiasStep> steps) {
        return recommendFromSeries(StepPoint.of(steps), DEFAULT_TOLERANCE);
    }

    public static BiasAdvice recommend(List<BiasStep> steps, double tolerance) {
        return recommendFromSeries(StepPoint.of(steps), tolerance);
    }

    /** The same on the light series of {@link Logbook#stepSeries}. */
    public static BiasAdvice recommendFromSeries(List<StepPoint> steps) {
        return recommendFromSeries(steps, DEFAULT_TOLERANCE);
    }

    public static BiasAdvice recommendFromSeries(List<StepPoint> steps, double tolerance) {
        Require.positive("tolerance", tolerance);
        List<String> warnings = new ArrayList<>();
        BiasReading.Unit unit = steps.isEmpty() ? BiasReading.Unit.MILLIVOLTS : steps.get(steps.size() - 1).reading().unit();
        // mean g0 per reading value, in the unit of the last step
        Map<Double, double[]> sums = new TreeMap<>();
        int otherUnit = 0;
        double lastReading = Double.NaN;
        for (StepPoint s : steps) {
            if (s.reading().unit() != unit) {
                otherUnit++;
                continue;
            }
            // the ratio the step's verdict read (level-corrected, docs/diagnosis.md), so advice and verdict agree
            OptionalDouble g = s.figures().isPresent() ? s.figures().get().crossoverReading() : OptionalDouble.empty();
            if (g.isEmpty()) continue;
            double[] acc = sums.computeIfAbsent(s.reading().value(), k -> new double[2]);
            acc[0] += g.getAsDouble();
            acc[1]++;
            lastReading = s.reading().value();
        }
        if (otherUnit > 0) warnings.add(otherUnit + " step(s) read in another unit than " + unit.symbol() + " were left out");
        String u = unit.symbol();
        if (sums.isEmpty()) {
            return new BiasAdvice(OptionalDouble.empty(), OptionalDouble.empty(), unit, OptionalDouble.empty(), BiasAdvice.Direction.UNKNOWN,
                    "no step has a crossover figure (gain at zero) yet: add a capture at the present setting", warnings);
        }
        int n = sums.size();
        double[] b = new double[n];
        double[] d = new double[n];
        int k = 0;
        for (Map.Entry<Double, double[]> e : sums.entrySet()) {
            b[k] = e.getKey();
            d[k] = e.getValue()[0] / e.getValue()[1] - 1;
            k++;
        }
        // gm-doubling warning: the first reading from which g0 stays above the band
        for (int i = 0; i < n; i++) {
            if (d[i] > tolerance) {
                warnings.add(String.format(Locale.ROOT, "steps from %s %s pass into gm-doubling (gain at zero %.2f %% above the"
                        + " large-signal gain): more bias there only adds dissipation", fmt(b[i]), u, d[i] * 100));
                break;
            }
        }
        // intervals where |d| <= tol, on the piecewise-linear interpolant
        List<double[]> intervals = new ArrayList<>();
        if (n == 1) {
            if (Math.abs(d[0]) <= tolerance) intervals.add(new double[] {b[0], b[0]});
        }
        for (int i = 0; i + 1 < n; i++) {
            double[] iv = inBand(b[i], d[i], b[i + 1], d[i + 1], tolerance);
            if (iv == null) continue;
            if (!intervals.isEmpty() && Math.abs(intervals.get(intervals.size() - 1)[1] - iv[0]) < 1e-12) {
                intervals.get(intervals.size() - 1)[1] = iv[1];
            } else {
                intervals.add(iv);
            }
        }
        // best point: zero crossing of d or the node of least |d|
        double best = b[0];
        double bestDev = Math.abs(d[0]);
        for (int i = 0; i < n; i++) {
            if (Math.abs(d[i]) < bestDev) {
                bestDev = Math.abs(d[i]);
                best = b[i];
            }
            if (i + 1 < n && d[i] * d[i + 1] < 0) {
                best = b[i] + (b[i + 1] - b[i]) * (-d[i]) / (d[i + 1] - d[i]);
                bestDev = 0;
            }
        }
        if (intervals.isEmpty()) {
            boolean allLow = d[n - 1] < 0 && d[0] < 0;
            String text = allLow
                    ? String.format(Locale.ROOT, "every step is under-biased (crossover notch, gain at zero %.2f %% low at %s %s): more bias,"
                    + " in small steps, watching the temperature", -d[n - 1] * 100, fmt(b[n - 1]), u)
                    : String.format(Locale.ROOT, "every step is over-biased (gm-doubling, gain at zero %.2f %% high at %s %s): less bias",
                    d[0] * 100, fmt(b[0]), u);
            return new BiasAdvice(OptionalDouble.empty(), OptionalDouble.empty(), unit, OptionalDouble.of(best),
                    allLow ? BiasAdvice.Direction.MORE : BiasAdvice.Direction.LESS, text, warnings);
        }
        double[] chosen = intervals.get(0);
        for (double[] iv : intervals) {
            if (best >= iv[0] - 1e-12 && best <= iv[1] + 1e-12) chosen = iv;
        }
        if (intervals.size() > 1) warnings.add("the gain at zero enters the near-optimal band more than once: the readings are noisy;"
                + " repeat the steps near " + fmt(best) + " " + u);
        if (chosen[0] <= b[0] && n > 1) warnings.add("the range may extend below the lowest step (" + fmt(b[0]) + " " + u + ")");
        if (chosen[1] >= b[n - 1] && n > 1) warnings.add("the range may extend above the highest step (" + fmt(b[n - 1]) + " " + u + ")");
        BiasAdvice.Direction dir = lastReading < chosen[0] ? BiasAdvice.Direction.MORE
                : lastReading > chosen[1] ? BiasAdvice.Direction.LESS : BiasAdvice.Direction.HERE;
        String where = switch (dir) {
            case MORE -> "the last step (" + fmt(lastReading) + " " + u + ") is below it: more bias";
            case LESS -> "the last step (" + fmt(lastReading) + " " + u + ") is above it: less bias";
            default -> "the last step (" + fmt(lastReading) + " " + u + ") is in it: here";
        };
        String text = String.format(Locale.ROOT, "set the bias between %s and %s %s (flattest crossover near %s %s); %s",
                fmt(chosen[0]), fmt(chosen[1]), u, fmt(best), u, where);
        return new BiasAdvice(OptionalDouble.of(chosen[0]), OptionalDouble.of(chosen[1]), unit, OptionalDouble.of(best), dir, text, warnings);
    }

    /** The part of [b0, b1] where the line through (b0, d0), (b1, d1) stays within ±tol, or null. */
    static double[] inBand(double b0, double d0, double b1, double d1, double tol) {
        double lo = b0;
        double hi = b1;
        double slope = (d1 - d0) / (b1 - b0);
        if (slope == 0) return Math.abs(d0) <= tol ? new double[] {b0, b1} : null;
        double atMinus = b0 + (-tol - d0) / slope;
        double atPlus = b0 + (tol - d0) / slope;
        double from = Math.min(atMinus, atPlus);
        double to = Math.max(atMinus, atPlus);
        lo = Math.max(lo, from);
        hi = Math.min(hi, to);
        return lo <= hi ? new double[] {lo, hi} : null;
    }

    static String fmt(double v) {
        return String.format(Locale.ROOT, "%.1f", v);
    }
}

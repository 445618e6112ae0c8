package org.outstage.logbook;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.OptionalDouble;
import java.util.TreeMap;
import org.outstage.Require;
import org.outstage.analysis.stage.BiasCriterion;
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
 * <p>Method: readings are sorted, equal readings averaged, and the range is computed by
 * {@link BiasCriterion#recommend} (the one definition and band of the optimum, shared with the per-capture verdict
 * and the bias fit): the stretch of readings where {@code |r − 1| ≤ tolerance}, r interpolated linearly in
 * ln(reading) between steps, that contains the best point. Default tolerance {@link BiasCriterion#BAND}.
 */
public final class BiasAdvisor {
    /** Default near-optimal band for |g0 − 1|. */
    public static final double DEFAULT_TOLERANCE = BiasCriterion.BAND;

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
        double[] r = new double[n];
        int k = 0;
        for (Map.Entry<Double, double[]> e : sums.entrySet()) {
            b[k] = e.getKey();
            r[k] = e.getValue()[0] / e.getValue()[1];
            k++;
        }
        // the one definition and band of the optimum (analysis.stage.BiasCriterion), as the verdict and fit use it
        BiasCriterion.Recommendation rec = BiasCriterion.recommend(b, r, tolerance);
        double best = rec.best();
        if (rec.gmDoublingFrom().isPresent()) {
            int i = rec.gmDoublingFrom().getAsInt();
            warnings.add(String.format(Locale.ROOT, "steps from %s %s pass into gm-doubling (%s, %s): more bias there only adds dissipation",
                    fmt(b[i]), u, BiasCriterion.ratioPhrase(r[i]), BiasCriterion.deviationPhrase(r[i])));
        }
        if (rec.low().isEmpty()) {
            boolean allLow = rec.allLow();
            int at = allLow ? n - 1 : 0;
            String text = allLow
                    ? String.format(Locale.ROOT, "every step is under-biased (crossover notch: %s at %s %s, %s): more bias,"
                    + " in small steps, watching the temperature", BiasCriterion.ratioPhrase(r[at]), fmt(b[at]), u, BiasCriterion.deviationPhrase(r[at]))
                    : String.format(Locale.ROOT, "every step is over-biased (gm-doubling: %s at %s %s, %s): less bias",
                    BiasCriterion.ratioPhrase(r[at]), fmt(b[at]), u, BiasCriterion.deviationPhrase(r[at]));
            return new BiasAdvice(OptionalDouble.empty(), OptionalDouble.empty(), unit, OptionalDouble.of(best),
                    allLow ? BiasAdvice.Direction.MORE : BiasAdvice.Direction.LESS, text, warnings);
        }
        double lo = rec.low().getAsDouble(), hi = rec.high().getAsDouble();
        if (rec.intervals() > 1) warnings.add("the crossover ratio enters the near-optimal band more than once: the readings are noisy;"
                + " repeat the steps near " + fmt(best) + " " + u);
        if (lo <= b[0] && n > 1) warnings.add("the range may extend below the lowest step (" + fmt(b[0]) + " " + u + ")");
        if (hi >= b[n - 1] && n > 1) warnings.add("the range may extend above the highest step (" + fmt(b[n - 1]) + " " + u + ")");
        BiasAdvice.Direction dir = lastReading < lo ? BiasAdvice.Direction.MORE
                : lastReading > hi ? BiasAdvice.Direction.LESS : BiasAdvice.Direction.HERE;
        String where = switch (dir) {
            case MORE -> "the last step (" + fmt(lastReading) + " " + u + ") is below it: more bias";
            case LESS -> "the last step (" + fmt(lastReading) + " " + u + ") is above it: less bias";
            default -> "the last step (" + fmt(lastReading) + " " + u + ") is in it: here";
        };
        String text = String.format(Locale.ROOT, "set the bias between %s and %s %s (crossover ratio 1, Oliver's optimum, near %s %s); %s",
                fmt(lo), fmt(hi), u, fmt(best), u, where);
        return new BiasAdvice(OptionalDouble.of(lo), OptionalDouble.of(hi), unit, OptionalDouble.of(best), dir, text, warnings);
    }

    static String fmt(double v) {
        return String.format(Locale.ROOT, "%.1f", v);
    }
}

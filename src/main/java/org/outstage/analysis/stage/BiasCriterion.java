package org.outstage.analysis.stage;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import org.outstage.Require;

/**
 * The one definition of the optimum class-AB bias, and its one uncertainty band, used by every face that advises on
 * bias: the per-capture verdict ({@link CrossoverMetrics}, {@code analyze}, workbench, report), the bias fit
 * ({@code fit}, through the model), and the session advice ({@code logbook.BiasAdvisor}, {@code session}).
 *
 * <p><b>Definition</b> (Oliver, "Distortion in complementary-pair class-B amplifiers", Hewlett-Packard Journal,
 * Feb 1971; docs/references.md §7): the optimum bias is the one at which the incremental gain at zero output equals the
 * large-current gain, i.e. the <em>crossover ratio</em> r = g(0)/g∞ equals 1. g∞ is the large-current asymptote of the
 * gain when the outer swing's gain still rises at the capture's level (1/g = a + b/|v|, {@link #asymptoteCoefficient}),
 * otherwise the mean gain over 50–90 % of peak. For an emitter follower this puts Iq·Re ≈ VT across each emitter
 * resistor. Below 1 the gain dips at the crossing (notch), above 1 it rises (gm-doubling).
 *
 * <p><b>Band</b> (ours, docs/diagnosis.md §5): near-optimal when |r − 1| ≤ {@value #BAND} (±0.3 %), with coverage
 * factor k = {@value #COVERAGE} on the reading's standard uncertainty. For an emitter-follower pair the band spans about
 * 0.8× to 1.3× the Oliver current. A range of bias readings is the stretch where |r − 1| ≤ band, interpolated between
 * readings linearly in ln(reading) (r is close to linear in ln Iq near the optimum: docs/diagnosis.md, table of r∞).
 *
 * <p>Other criteria exist and are named as what they are, never offered as bias advice: the model's flattest gain over
 * a level (docs/model.md), or a THD minimum at one level (which moves with level, docs/references.md §7).
 */
public final class BiasCriterion {
    /** Half width of the near-optimal band of the crossover ratio around 1 (0.003 = ±0.3 %). */
    public static final double BAND = 0.003;
    /** Coverage factor on the reading's standard uncertainty. */
    public static final double COVERAGE = 2.0;
    /** One line naming the definition, for reports and help. */
    public static final String DEFINITION = "Oliver (HP Journal, Feb 1971): gain at zero equal to the large-current gain, crossover ratio 1, "
            + "near-optimal within ±0.3 %";

    private BiasCriterion() {}

    /**
     * The verdict of one reading r with standard uncertainty σ: underbiased if r + kσ &lt; 1 − band; overbiased if
     * r − kσ &gt; 1 + band; near-optimal if |r − 1| + kσ ≤ band; otherwise unclear.
     */
    public static BiasVerdict classify(double ratio, double sigma, double band, double k) {
        if (!Double.isFinite(ratio) || !(sigma >= 0)) return BiasVerdict.UNCLEAR;
        if (ratio + k * sigma < 1 - band) return BiasVerdict.UNDERBIASED;
        if (ratio - k * sigma > 1 + band) return BiasVerdict.OVERBIASED;
        if (Math.abs(ratio - 1) + k * sigma <= band) return BiasVerdict.NEAR_OPTIMAL;
        return BiasVerdict.UNCLEAR;
    }

    /** {@link #classify(double, double, double, double)} with the default band and coverage. */
    public static BiasVerdict classify(double ratio, double sigma) { return classify(ratio, sigma, BAND, COVERAGE); }

    /**
     * The coefficient a of 1/g = a + b/|v| through the gains g1 at |v1| and g2 at |v2| (one device conducting, exponential
     * law: 1/g = (RL + Re)/RL + VT/|v|); 1/a is the large-current asymptote and g(0)·a the crossover ratio against it.
     */
    public static double asymptoteCoefficient(double v1, double g1, double v2, double g2) {
        return (v2 / g2 - v1 / g1) / (v2 - v1);
    }

    /** The crossover ratio as one phrase with its name, e.g. "crossover ratio 0.9208 (gain at zero / large-current gain)". */
    public static String ratioPhrase(double ratio) {
        return String.format(Locale.ROOT, "crossover ratio %.4f (gain at zero / large-current gain)", ratio);
    }

    /** How far r is from 1, as a phrase: "7.92 % low", "0.97 % high". */
    public static String deviationPhrase(double ratio) {
        double d = ratio - 1;
        return String.format(Locale.ROOT, "%.2f %% %s", Math.abs(d) * 100, d < 0 ? "low" : "high");
    }

    /**
     * The recommended range from a series of (reading, ratio) pairs (bias settings in any unit, ascending, distinct).
     *
     * @param low, high        the stretch where |r − 1| ≤ band that contains the best point (empty when none)
     * @param best             where r crosses 1 (interpolated), or the reading of least |r − 1|
     * @param intervals        how many separate stretches are in the band (more than one: noisy readings)
     * @param gmDoublingFrom   index of the first reading with r − 1 &gt; band, if any
     * @param allLow           no stretch in the band and every reading below it
     */
    public record Recommendation(OptionalDouble low, OptionalDouble high, double best, int intervals, OptionalInt gmDoublingFrom, boolean allLow) {}

    /** As {@link #recommend(double[], double[], double)} with the default band. */
    public static Recommendation recommend(double[] readings, double[] ratios) { return recommend(readings, ratios, BAND); }

    /**
     * Finds the range of readings where |r − 1| ≤ band, interpolating r between readings linearly in ln(reading) when
     * every reading is positive (linearly otherwise).
     */
    public static Recommendation recommend(double[] readings, double[] ratios, double band) {
        Require.notNull("readings", readings);
        Require.notNull("ratios", ratios);
        Require.that(readings.length == ratios.length && readings.length > 0,
                "readings and ratios must have the same, non-zero length (" + readings.length + ", " + ratios.length + ")");
        Require.positive("band", band);
        int n = readings.length;
        for (int i = 1; i < n; i++) Require.that(readings[i] > readings[i - 1], "readings must ascend: " + readings[i - 1] + ", " + readings[i]);
        boolean log = true;
        for (double b : readings) log &= b > 0;
        double[] x = new double[n], d = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = log ? Math.log(readings[i]) : readings[i];
            d[i] = ratios[i] - 1;
        }
        OptionalInt gm = OptionalInt.empty();
        for (int i = 0; i < n; i++) if (d[i] > band) { gm = OptionalInt.of(i); break; }
        List<double[]> iv = new ArrayList<>();
        if (n == 1 && Math.abs(d[0]) <= band) iv.add(new double[] {x[0], x[0]});
        for (int i = 0; i + 1 < n; i++) {
            double[] s = inBand(x[i], d[i], x[i + 1], d[i + 1], band);
            if (s == null) continue;
            if (!iv.isEmpty() && Math.abs(iv.get(iv.size() - 1)[1] - s[0]) < 1e-12) iv.get(iv.size() - 1)[1] = s[1];
            else iv.add(s);
        }
        double best = x[0], bestDev = Math.abs(d[0]);
        for (int i = 0; i < n; i++) {
            if (Math.abs(d[i]) < bestDev) { bestDev = Math.abs(d[i]); best = x[i]; }
            if (i + 1 < n && d[i] * d[i + 1] < 0) { best = x[i] + (x[i + 1] - x[i]) * (-d[i]) / (d[i + 1] - d[i]); bestDev = 0; }
        }
        double bestReading = log ? Math.exp(best) : best;
        if (iv.isEmpty()) return new Recommendation(OptionalDouble.empty(), OptionalDouble.empty(), bestReading, 0, gm, d[n - 1] < 0 && d[0] < 0);
        double[] chosen = iv.get(0);
        for (double[] s : iv) if (best >= s[0] - 1e-12 && best <= s[1] + 1e-12) chosen = s;
        double lo = log ? Math.exp(chosen[0]) : chosen[0], hi = log ? Math.exp(chosen[1]) : chosen[1];
        // exp(ln b) may differ from b in the last bit: keep readings exact at the ends
        for (double b : readings) {
            if (Math.abs(lo - b) <= 1e-12 * Math.abs(b)) lo = b;
            if (Math.abs(hi - b) <= 1e-12 * Math.abs(b)) hi = b;
        }
        return new Recommendation(OptionalDouble.of(lo), OptionalDouble.of(hi), bestReading, iv.size(), gm, false);
    }

    /** The part of [x0, x1] where the line through (x0, d0), (x1, d1) stays within ±band, or null. */
    static double[] inBand(double x0, double d0, double x1, double d1, double band) {
        double slope = (d1 - d0) / (x1 - x0);
        if (slope == 0) return Math.abs(d0) <= band ? new double[] {x0, x1} : null;
        double atMinus = x0 + (-band - d0) / slope, atPlus = x0 + (band - d0) / slope;
        double lo = Math.max(x0, Math.min(atMinus, atPlus)), hi = Math.min(x1, Math.max(atMinus, atPlus));
        return lo <= hi ? new double[] {lo, hi} : null;
    }
}

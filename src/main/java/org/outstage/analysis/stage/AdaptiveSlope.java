package org.outstage.analysis.stage;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;

/**
 * Incremental gain dy/dx at one point of the transfer curve from the raw samples (no bins), by local cubic
 * regression with a data-driven bandwidth.
 *
 * <p>Method:
 * <ol>
 *   <li>Local polynomial regression (Fan &amp; Gijbels, <i>Local Polynomial Modelling and Its Applications</i>,
 *       Chapman &amp; Hall 1996, ch. 3): ordinary least squares of d = y − x on 1, t, t², t³ with t = x − x0, using
 *       every sample with |t| ≤ h (uniform kernel). The slope at x0 is 1 + the coefficient of t. A cubic keeps the
 *       slope unbiased for gain curves up to quadratic in t; the leading slope bias grows as h⁴.</li>
 *   <li>Bandwidths on a ladder h_k = hMax·2^(−k/2) down to the smallest that holds {@link #MIN_SAMPLES}
 *       samples (how fine the phase coverage of the record allows). Each estimate carries its noise variance
 *       σ_k² = s²·[(XᵀX)⁻¹]₁₁ with s² = RSS/(n − 4), but not below the noise of single samples measured over the
 *       whole curve (a window of 16 samples estimates its own scatter poorly).</li>
 *   <li>Bandwidth choice by Lepski's method (O. V. Lepski, E. Mammen, V. G. Spokoiny, "Optimal spatial
 *       adaptation to inhomogeneous smoothness", Annals of Statistics 25(3), 1997): the widest h whose estimate
 *       agrees with every narrower one within {@link #LEPSKI_KAPPA}·σ of the narrower one. A narrow notch makes
 *       the wide estimates disagree with the narrow ones, so the bandwidth shrinks to the notch's scale; a smooth
 *       curve keeps the widest window and its small variance.</li>
 *   <li>Resolution bias: with bias ∝ h⁴, the estimates at h and h/√2 differ by ¾ of the bias at h, so the bias is
 *       read as (4/3)·|ŝ(h) − ŝ(h/√2)| (Richardson's extrapolation argument; the factor follows the actual ratio
 *       when a rung is skipped because it holds no new sample); at the narrowest rung, where no finer estimate
 *       exists, as |ŝ(√2·h) − ŝ(h)|/3. It is reported apart and added to the noise variance in
 *       quadrature, so the stated uncertainty covers resolution as well as noise.</li>
 * </ol>
 * Assumptions: the curve is static near x0 (no hysteresis; rising and falling samples are pooled); the noise is
 * roughly constant across the window. Pure and thread-safe.
 */
final class AdaptiveSlope {
    /** Fewest samples for one local cubic fit (4 parameters and 12 degrees of freedom for the noise). */
    static final int MIN_SAMPLES = 16;
    /**
     * Lepski threshold, in standard errors of the narrower estimate (a choice made here: with some 15 nested rungs
     * and dozens of evaluations per diagnosis, 3σ still let chance disagreements of the narrowest windows stop the
     * search; 4σ did not on the bias ladder of MeasurementTruthTest).
     */
    static final double LEPSKI_KAPPA = 4.0;
    private static final int RUNGS = 48;
    private static final int P = 4;

    private AdaptiveSlope() {}

    /**
     * One slope estimate.
     *
     * @param slope          dy/dx at x0
     * @param noiseVariance  variance of {@code slope} from the sample scatter
     * @param biasAbs        estimated resolution bias (absolute)
     * @param bandwidth      half width h of the chosen window (units of x)
     * @param samples        samples inside the chosen window
     * @param value          fitted y − x at x0
     */
    record Estimate(double slope, double noiseVariance, double biasAbs, double bandwidth, int samples, double value) {
        /** Noise variance plus the squared resolution bias. */
        double totalVariance() { return noiseVariance + biasAbs * biasAbs; }
    }

    /**
     * One value estimate of d = y − x at x0 ({@link #valueAt}), the bandwidth chosen on the value.
     *
     * @param value          fitted y − x at x0
     * @param noiseVariance  variance of {@code value} from the sample scatter
     * @param biasAbs        estimated resolution bias of {@code value} (absolute)
     * @param bandwidth      half width h of the chosen window (units of x)
     * @param slope          dy/dx at x0 from the same window
     */
    record ValueEstimate(double value, double noiseVariance, double biasAbs, double bandwidth, double slope) {
        /** Noise variance plus the squared resolution bias. */
        double totalVariance() { return noiseVariance + biasAbs * biasAbs; }
    }

    /** A single rung: slope of d, its noise variance, value of d and its noise variance, sample count, bandwidth. */
    private record Rung(double slope, double var, double value, double valueVar, int n, double h) {
        double est(boolean onValue) { return onValue ? value : slope; }
        double estVar(boolean onValue) { return onValue ? valueVar : var; }
    }

    /**
     * Slope dy/dx at {@code x0} using samples with |x − x0| ≤ {@code hMax}, {@code noiseRms} the scatter of single
     * samples about the curve (a floor for each window's own estimate); empty when fewer than two rungs hold
     * {@link #MIN_SAMPLES} samples spread over the four quarters of the window with a well-conditioned design.
     */
    static Optional<Estimate> at(double[] x, double[] y, double x0, double hMax, double noiseRms) {
        return ladder(x, y, x0, hMax, noiseRms, false).map(c -> new Estimate(1 + c.rung.slope, c.rung.var, c.bias, c.rung.h, c.rung.n, c.rung.value));
    }

    /**
     * Value of d = y − x at {@code x0} by the same ladder of local cubic fits, with Lepski's choice and the resolution
     * bias read on the value instead of the slope (a cubic's value on a symmetric window is exact for curves up to
     * cubic, so its bias also grows as h⁴); empty under the same conditions as {@link #at}.
     */
    static Optional<ValueEstimate> valueAt(double[] x, double[] y, double x0, double hMax, double noiseRms) {
        return ladder(x, y, x0, hMax, noiseRms, true).map(c -> new ValueEstimate(c.rung.value, c.rung.valueVar, c.bias, c.rung.h, 1 + c.rung.slope));
    }

    /** The chosen rung and its resolution bias on the estimated quantity. */
    private record Choice(Rung rung, double bias) {}

    private static Optional<Choice> ladder(double[] x, double[] y, double x0, double hMax, double noiseRms, boolean onValue) {
        // moments per shell: shell s holds hMax·2^(−(s+1)/2) < |t| ≤ hMax·2^(−s/2); u = t/hMax
        double[][] s = new double[RUNGS][2 * P - 1];
        double[][] r = new double[RUNGS][P];
        double[] dd = new double[RUNGS];
        int[] cnt = new int[RUNGS], pos = new int[RUNGS];
        double inv = 1 / hMax;
        for (int i = 0; i < x.length; i++) {
            double t = x[i] - x0;
            double at = Math.abs(t);
            if (at > hMax) continue;
            // floor(2·log2(hMax/|t|)) = the binary exponent of (hMax/|t|)² (exact, no logarithm)
            double q = hMax / at;
            int sh = at > 0 && q < 1e150 ? Math.getExponent(q * q) : RUNGS - 1;
            if (sh >= RUNGS) sh = RUNGS - 1;
            double u = t * inv, d = y[i] - x[i], uk = 1;
            double[] sm = s[sh], rm = r[sh];
            for (int k = 0; k < 2 * P - 1; k++) {
                sm[k] += uk;
                if (k < P) rm[k] += uk * d;
                uk *= u;
            }
            dd[sh] += d * d;
            cnt[sh]++;
            if (t > 0) pos[sh]++;
        }
        // cumulate from the innermost shell outwards; solve at every rung with enough samples
        double[] cs = new double[2 * P - 1], cr = new double[P];
        double cd = 0;
        int cn = 0;
        List<Rung> rungs = new ArrayList<>(); // ordered by increasing bandwidth
        for (int k = RUNGS - 1; k >= 0; k--) {
            for (int j = 0; j < 2 * P - 1; j++) cs[j] += s[k][j];
            for (int j = 0; j < P; j++) cr[j] += r[k][j];
            cd += dd[k];
            cn += cnt[k];
            if (cn < MIN_SAMPLES || cnt[k] == 0 && !rungs.isEmpty() || !spread(cnt, pos, k)) continue;
            Rung g = solve(cs, cr, cd, cn, hMax * Math.pow(2, -k / 2.0), hMax, noiseRms);
            if (g != null) rungs.add(g);
        }
        if (rungs.size() < 2) return Optional.empty();
        int chosen = 0;
        for (int i = 1; i < rungs.size(); i++) {
            boolean ok = true;
            for (int j = 0; j < i && ok; j++)
                ok = Math.abs(rungs.get(i).est(onValue) - rungs.get(j).est(onValue)) <= LEPSKI_KAPPA * Math.sqrt(rungs.get(j).estVar(onValue));
            if (!ok) break;
            chosen = i;
        }
        Rung c = rungs.get(chosen);
        // bias ∝ h⁴: with ρ the ratio of the bandwidths, the difference of two rungs is (1 − ρ⁻⁴) of the wider's bias
        double bias;
        if (chosen > 0) {
            Rung f = rungs.get(chosen - 1);
            bias = Math.abs(c.est(onValue) - f.est(onValue)) / (1 - Math.pow(f.h / c.h, 4));
        } else {
            Rung w = rungs.get(1);
            bias = Math.abs(w.est(onValue) - c.est(onValue)) / (Math.pow(w.h / c.h, 4) - 1);
        }
        return Optional.of(new Choice(c, bias));
    }

    /**
     * True when rung k has samples in each quarter of its window, [−h, −h/2), [−h/2, 0], (0, h/2], (h/2, h] (shells k
     * and k + 1 hold h/2 &lt; |t| ≤ h): a cubic needs support across the window, and a tone locked to the sample rate
     * (1 kHz at 48 kHz: 48 phases) leaves only a few clusters of x that would make the fit extrapolate.
     */
    private static boolean spread(int[] cnt, int[] pos, int k) {
        int outerPos = 0, outerNeg = 0, innerPos = 0, innerNeg = 0;
        for (int j = k; j < cnt.length; j++) {
            if (j <= k + 1) { outerPos += pos[j]; outerNeg += cnt[j] - pos[j]; }
            else { innerPos += pos[j]; innerNeg += cnt[j] - pos[j]; }
        }
        return outerPos > 0 && outerNeg > 0 && innerPos > 0 && innerNeg > 0;
    }

    /** Least squares on the moments of u = t/hMax, rescaled to v = t/h for conditioning; null when singular. */
    private static Rung solve(double[] sMom, double[] rMom, double sdd, int n, double h, double hMax, double noiseRms) {
        double c = hMax / h; // v = u·c
        double[] mom = new double[2 * P - 1];
        double[] rhs = new double[P];
        double ck = 1;
        for (int k = 0; k < 2 * P - 1; k++) {
            mom[k] = sMom[k] * ck;
            if (k < P) rhs[k] = rMom[k] * ck;
            ck *= c;
        }
        double[][] m = new double[P][2 * P];
        for (int i = 0; i < P; i++) {
            for (int j = 0; j < P; j++) m[i][j] = mom[i + j];
            m[i][P + i] = 1;
        }
        double scale = mom[0];
        for (int col = 0; col < P; col++) {
            int piv = col;
            for (int i = col + 1; i < P; i++) if (Math.abs(m[i][col]) > Math.abs(m[piv][col])) piv = i;
            double[] tmp = m[col]; m[col] = m[piv]; m[piv] = tmp;
            double d = m[col][col];
            if (!(Math.abs(d) > 1e-9 * scale)) return null; // too few distinct x values (tone locked to the rate)
            for (int k = 0; k < 2 * P; k++) m[col][k] /= d;
            for (int i = 0; i < P; i++) {
                if (i == col) continue;
                double f = m[i][col];
                if (f != 0) for (int k = 0; k < 2 * P; k++) m[i][k] -= f * m[col][k];
            }
        }
        double[] beta = new double[P];
        double fitted = 0;
        for (int i = 0; i < P; i++) {
            for (int k = 0; k < P; k++) beta[i] += m[i][P + k] * rhs[k];
            fitted += beta[i] * rhs[i];
        }
        double rss = Math.max(sdd - fitted, 0);
        double s2 = Math.max(rss / (n - P), noiseRms * noiseRms);
        double slope = beta[1] / h;
        double var = s2 * Math.max(m[1][P + 1], 0) / (h * h);
        return new Rung(slope, var, beta[0], s2 * Math.max(m[0][P], 0), n, h);
    }
}

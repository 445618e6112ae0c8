package org.outstage.analysis.stage;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.outstage.analysis.TransferCurve;

/**
 * Binning, smoothing, line, hysteresis, clipping and crossover metrics on one pair of arrays:
 * {@code x} = ideal output (zero mean, spanning about ±peak) and {@code y} = measured output. Package-private
 * workhorse of {@link StageAnalyzer}; stateless.
 */
final class TransferEngine {
    /** Largest fall of the gain from 50 % to 90 % of peak accepted for a large-signal reference (0.05 %). */
    static final double OUTER_FALL_LIMIT = 5e-4;

    private TransferEngine() {}

    /** What the engine returns to the analyzer. */
    record Result(MeasuredTransfer transfer, ClippingMetrics clipping, CrossoverMetrics crossover) {}

    /** Local quadratic fit result: value a and slope b at x0 with their variances. */
    record Local(double value, double slope, double valueVar, double slopeVar) {}

    /** Per-side clipping result plus the ideal level below which the curve is unaffected by it. */
    private record SideResult(Optional<ClipSide> side, double unaffectedIdealVolts) {}

    static Result analyze(double[] x, boolean[] rising, double[] y, double peak, double sampleRateHz,
                          StageSettings s, boolean fromReference, double nearZeroResidualShare, double nearZeroTimeShare,
                          String unit) {
        return analyze(x, rising, y, peak, sampleRateHz, s, fromReference, nearZeroResidualShare, nearZeroTimeShare, unit,
                quantisationStep(y));
    }

    /**
     * Smallest positive step between distinct values of (up to 8192 evenly spread) samples: the resolution of
     * an integer-coded capture (8-bit scope: range/256), or a tiny number for a continuous one.
     */
    static double quantisationStep(double[] y) {
        int n = y.length, take = Math.min(n, 8192);
        double[] v = new double[take];
        for (int i = 0; i < take; i++) v[i] = y[(int) ((long) i * n / take)];
        Arrays.sort(v);
        double range = v[take - 1] - v[0], q = Double.POSITIVE_INFINITY;
        for (int i = 1; i < take; i++) {
            double d = v[i] - v[i - 1];
            if (d > 1e-9 * range && d < q) q = d;
        }
        return Double.isFinite(q) ? q : 0;
    }

    static Result analyze(double[] x, boolean[] rising, double[] y, double peak, double sampleRateHz,
                          StageSettings s, boolean fromReference, double nearZeroResidualShare, double nearZeroTimeShare,
                          String unit, double quantStep) {
        int nb = s.binCount();
        int n = x.length;
        double width = 2 * peak / nb;
        double scale = nb / (2 * peak);
        // accumulators: index dir*nb + bin; x centred on the bin centre, d = y - x
        long[] cnt = new long[2 * nb];
        double[] sx = new double[2 * nb], sd = new double[2 * nb], sxx = new double[2 * nb], sxd = new double[2 * nb],
                sdd = new double[2 * nb];
        for (int i = 0; i < n; i++) {
            double xi = x[i];
            int b = (int) ((xi + peak) * scale);
            if (b < 0) b = 0;
            else if (b >= nb) b = nb - 1;
            double xc = xi - (-peak + (b + 0.5) * width);
            double d = y[i] - xi;
            int k = rising[i] ? b : nb + b;
            cnt[k]++;
            sx[k] += xc;
            sd[k] += d;
            sxx[k] += xc * xc;
            sxd[k] += xc * d;
            sdd[k] += d * d;
        }
        // direction-separated statistics (for noise and hysteresis)
        BinStat[] dir = new BinStat[2 * nb];
        for (int k = 0; k < 2 * nb; k++)
            dir[k] = BinStat.of(cnt[k], sx[k], sd[k], sxx[k], sxd[k], sdd[k], -peak + ((k % nb) + 0.5) * width);
        List<BinStat> kept = new ArrayList<>();
        for (int b = 0; b < nb; b++) {
            int f = nb + b;
            BinStat c = BinStat.of(cnt[b] + cnt[f], sx[b] + sx[f], sd[b] + sd[f], sxx[b] + sxx[f], sxd[b] + sxd[f],
                    sdd[b] + sdd[f], -peak + (b + 0.5) * width);
            if (c.n >= 3) kept.add(c);
        }
        if (kept.size() < 4 * s.smoothingHalfWidthBins() + 4)
            throw new IllegalArgumentException("only " + kept.size() + " of " + nb
                    + " transfer-curve bins hold 3 or more samples: the record is too short or its tone is locked to the sample rate");
        int m = kept.size();
        double[] xs = new double[m], ds = new double[m], se = new double[m];
        int[] counts = new int[m];
        double seFloor = 1e-12 * peak;
        for (int i = 0; i < m; i++) {
            BinStat c = kept.get(i);
            xs[i] = c.xMean;
            ds[i] = c.dMean;
            se[i] = Math.max(c.seMean, seFloor);
            counts[i] = (int) c.n;
        }
        // strictly increasing guard (degenerate equal means are merged away by nudging)
        for (int i = 1; i < m; i++) if (!(xs[i] > xs[i - 1])) xs[i] = Math.nextUp(xs[i - 1]);
        double noise = medianScatter(dir);
        double[] w = new double[m];
        for (int i = 0; i < m; i++) w[i] = 1 / (se[i] * se[i]);

        int h = s.smoothingHalfWidthBins();
        double[] gain = new double[m], gainVar = new double[m];
        for (int i = 0; i < m; i++) {
            int lo = Math.max(0, Math.min(i - h, m - 2 * h - 1));
            Local l = local(xs, ds, w, lo, lo + 2 * h + 1, xs[i]);
            gain[i] = 1 + l.slope;
            gainVar[i] = l.slopeVar;
        }
        double[] ys = new double[m];
        for (int i = 0; i < m; i++) ys[i] = xs[i] + ds[i];

        double centralGain = lineFit(xs, ys, counts, -0.5 * peak, 0.5 * peak)[0];

        // clipping
        double noiseTol = Math.max(4 * noise, 1e-3 * peak);
        SideResult pos = clipSide(+1, x, y, xs, ys, gain, centralGain, peak, width, h, noiseTol, sampleRateHz);
        SideResult neg = clipSide(-1, x, y, xs, ys, gain, centralGain, peak, width, h, noiseTol, sampleRateHz);
        ClippingMetrics clipping = clippingMetrics(pos, neg, noiseTol);

        // line over the unclipped range, outer gain
        double upPos = Math.min(0.9 * peak, 0.97 * pos.unaffectedIdealVolts);
        double upNeg = Math.min(0.9 * peak, 0.97 * neg.unaffectedIdealVolts);
        boolean outerClipped = upPos < 0.75 * peak || upNeg < 0.75 * peak;
        upPos = Math.max(upPos, 0.6 * peak);
        upNeg = Math.max(upNeg, 0.6 * peak);
        double lineLo = -Math.min(peak, neg.unaffectedIdealVolts), lineHi = Math.min(peak, pos.unaffectedIdealVolts);
        double[] line = lineFit(xs, ys, counts, lineLo, lineHi);
        Local p9 = resolved(xs, ds, w, h, upPos), p5 = resolved(xs, ds, w, h, 0.5 * peak);
        Local n5 = resolved(xs, ds, w, h, -0.5 * peak), n9 = resolved(xs, ds, w, h, -upNeg);
        double span = (upPos - 0.5 * peak) + (upNeg - 0.5 * peak);
        double outer = ((upPos + p9.value) - (0.5 * peak + p5.value) + (-0.5 * peak + n5.value) - (-upNeg + n9.value)) / span;
        double outerVar = (p9.valueVar + p5.valueVar + n5.valueVar + n9.valueVar) / (span * span);

        double[] dev = new double[m], ng = new double[m], ngSe = new double[m];
        for (int i = 0; i < m; i++) {
            dev[i] = ys[i] - (line[0] * xs[i] + line[1]);
            ng[i] = gain[i] / outer;
            ngSe[i] = Math.sqrt(gainVar[i] / (outer * outer) + ng[i] * ng[i] * outerVar / (outer * outer));
        }
        Hysteresis hyst = hysteresis(dir, nb, peak);
        TransferCurve curve = new TransferCurve(xs, ys, gain, unit);
        MeasuredTransfer transfer = new MeasuredTransfer(curve, counts, se, dev, ng, ngSe, peak, line[0], line[1], outer,
                noise, hyst, fromReference);

        // crossover: the gain at zero from the raw samples with a data-driven window (AdaptiveSlope); the binned,
        // ±h-bin fit smears a notch narrower than its window upwards
        double hMax = (h + 0.5) * width;
        // a tone locked to the sample rate (1 kHz at 48 kHz: 48 phases) puts its samples near zero on a few values only,
        // one of them possibly exactly at zero: then no window sees the crossing, whatever its samples say
        Optional<AdaptiveSlope.Estimate> a0 = largestGapWithin(x, hMax) > MAX_GAP_NEAR_ZERO * hMax ? Optional.empty()
                : AdaptiveSlope.at(x, y, 0, hMax, noise);
        double g0, g0NoiseVar, g0Bias, g0Window;
        if (a0.isPresent()) {
            g0 = a0.get().slope();
            g0NoiseVar = a0.get().noiseVariance();
            g0Bias = a0.get().biasAbs();
            g0Window = a0.get().bandwidth();
        } else {
            Local z = localAt(xs, ds, w, h, 0), z2 = localAt(xs, ds, w, Math.min(2 * h, (m - 1) / 2), 0);
            g0 = 1 + z.slope;
            g0NoiseVar = z.slopeVar;
            // the samples near zero do not cover a window (too short a record, or a tone locked to the sample rate):
            // the kept bins may lie far apart, so no asymptotic rate is assumed; the whole change from h to 2h bins
            // is taken as the resolution bias
            g0Bias = Math.abs(z2.slope - z.slope);
            g0Window = hMax;
        }
        double g0Var = g0NoiseVar + g0Bias * g0Bias;
        double r = g0 / outer;
        double rSe = Math.sqrt(g0Var / (outer * outer) + r * r * outerVar / (outer * outer));
        double[] notch = notchWidth(x, y, xs, ng, r, outer, s.notchGainTolerance(), hMax, noise);
        double notchWidth = notch[0];
        double[] notchDepth = notchDepth(x, rising, y, xs, dev, line, lineLo, lineHi, peak, width, hMax, noise);
        double depth = notchDepth[0];
        // flatness of the outer swing: past the crossover region one device carries the load and its gain rises
        // slowly with current (re = VT/I falls), so g(0.9P) >= g(0.5P); a falling gain means the "outer" swing is
        // still in the crossover region (level too low for a large-signal reference)
        double gIn = 0.5 * ((1 + p5.slope) + (1 + n5.slope)), gOut = 0.5 * ((1 + p9.slope) + (1 + n9.slope));
        double flat = gOut / gIn - 1;
        double flatSe = 0.5 * Math.sqrt(p5.slopeVar + n5.slopeVar + p9.slopeVar + n9.slopeVar) / Math.abs(gIn);
        boolean outerFalling = flat + s.verdictSigmas() * flatSe < -OUTER_FALL_LIMIT;
        // large-current asymptote: with one device carrying the load, g(v) = RL/(RL + Re + VT·RL/|v|) (exponential law),
        // so 1/g = a + b/|v| and the gain tends to 1/a as the current grows. At a modest level the outer swing has not
        // reached it (VT/I still adds), and g(0)/outer reads high; the verdict uses g(0)·a instead when the outer gain
        // rises measurably (b > 0 beyond the noise). At Oliver's condition g(0) equals that asymptote exactly.
        double v1 = 0.5 * peak, v2 = 0.5 * (upPos + upNeg);
        double a = BiasCriterion.asymptoteCoefficient(v1, gIn, v2, gOut);
        double gInVar = 0.25 * (p5.slopeVar + n5.slopeVar), gOutVar = 0.25 * (p9.slopeVar + n9.slopeVar);
        double aVar = (Math.pow(v2 / (gOut * gOut), 2) * gOutVar + Math.pow(v1 / (gIn * gIn), 2) * gInVar) / ((v2 - v1) * (v2 - v1));
        boolean outerRising = flat - s.verdictSigmas() * flatSe > 0 && a > 0;
        double rInf = outerRising ? g0 * a : r;
        double rInfSe = outerRising ? Math.sqrt(g0Var * a * a + g0 * g0 * aVar) : rSe;
        CrossoverMetrics crossover = verdict(r, rSe, outerRising ? 1 / a : Double.NaN, rInf, rInfSe, g0, outer, notchWidth, depth, peak,
                nearZeroResidualShare, nearZeroTimeShare, hyst, outerClipped, outerFalling ? flat : Double.NaN,
                quantStep > (2 * h + 1) * width / 8 ? quantStep : 0, a0.isEmpty(), s,
                new CrossoverMetrics.Resolution(g0Window, Math.sqrt(g0NoiseVar) / Math.abs(outer), g0Bias / Math.abs(outer), notch[1],
                        notchDepth[1], a0.isPresent()));
        return new Result(transfer, clipping, crossover);
    }

    /**
     * The largest empty stretch of the drive within the crossover window ±h, as a fraction of h, beyond which the
     * crossing counts as not observed (the samples then sit in a few clusters, e.g. a tone locked to the sample rate).
     */
    static final double MAX_GAP_NEAR_ZERO = 0.25;

    /** The largest interval of [−h, h] holding no value of x (the window's edges count as values). */
    static double largestGapWithin(double[] x, double h) {
        int k = 0;
        for (double v : x) if (Math.abs(v) <= h) k++;
        double[] near = new double[k + 2];
        near[0] = -h;
        near[1] = h;
        k = 2;
        for (double v : x) if (Math.abs(v) <= h) near[k++] = v;
        Arrays.sort(near);
        double gap = 0;
        for (int i = 1; i < near.length; i++) gap = Math.max(gap, near[i] - near[i - 1]);
        return gap;
    }

    // ---------------------------------------------------------------- bins

    /** Statistics of one bin: means, and the standard error of the mean after removing the in-bin line. */
    static final class BinStat {
        final long n;
        final double xMean, dMean, seMean, scatter, inBinSlope;

        private BinStat(long n, double xMean, double dMean, double seMean, double scatter, double inBinSlope) {
            this.n = n; this.xMean = xMean; this.dMean = dMean; this.seMean = seMean; this.scatter = scatter; this.inBinSlope = inBinSlope;
        }

        static BinStat of(long n, double sx, double sd, double sxx, double sxd, double sdd, double centre) {
            if (n < 3) return new BinStat(n, centre, 0, Double.NaN, Double.NaN, 0);
            double sxxC = sxx - sx * sx / n, sxdC = sxd - sx * sd / n, sddC = sdd - sd * sd / n;
            double rss;
            long dof;
            double slope = 0;
            if (sxxC > 1e-300 * n) {
                slope = sxdC / sxxC;
                rss = sddC - sxdC * slope;
                dof = n - 2;
            } else {
                rss = sddC;
                dof = n - 1;
            }
            double var = Math.max(rss, 0) / dof;
            double sc = Math.sqrt(var);
            return new BinStat(n, centre + sx / n, sd / n, sc / Math.sqrt(n), sc, slope);
        }

        /** Mean deviation evaluated at ideal {@code at} using the in-bin slope. */
        double dAt(double at) { return dMean + inBinSlope * (at - xMean); }
    }

    private static double medianScatter(BinStat[] dir) {
        double[] v = Arrays.stream(dir).filter(b -> b.n >= 3 && Double.isFinite(b.scatter)).mapToDouble(b -> b.scatter).sorted().toArray();
        if (v.length == 0) return 0;
        return v.length % 2 == 1 ? v[v.length / 2] : 0.5 * (v[v.length / 2 - 1] + v[v.length / 2]);
    }

    // ---------------------------------------------------------------- local fits

    /**
     * Weighted cubic fit of d over points [from, to) in t = x − x0; value and slope at x0 with variances.
     * A cubic (rather than the quadratic of the classic Savitzky–Golay smoother) keeps the slope unbiased
     * when the gain itself curves (a gm-doubling bump): on a symmetric window the slope of a degree-3 fit
     * is exact for gain curves up to quadratic in x.
     */
    static Local local(double[] xs, double[] ds, double[] w, int from, int to, double x0) {
        double sc = Math.max(Math.abs(xs[to - 1] - x0), Math.abs(xs[from] - x0));
        if (!(sc > 0)) sc = 1;
        final int p = 4;
        double[] mom = new double[2 * p - 1];
        double[] rhs = new double[p];
        for (int i = from; i < to; i++) {
            double t = (xs[i] - x0) / sc, wi = w[i], tk = wi;
            for (int k = 0; k < 2 * p - 1; k++) {
                if (k < p) rhs[k] += tk * ds[i];
                mom[k] += tk;
                tk *= t;
            }
        }
        double[][] m = new double[p][2 * p];
        for (int r = 0; r < p; r++) {
            for (int c = 0; c < p; c++) m[r][c] = mom[r + c];
            m[r][p + r] = 1;
        }
        // Gauss-Jordan with partial pivoting: [M | I] -> [I | M^-1]
        for (int c = 0; c < p; c++) {
            int piv = c;
            for (int r = c + 1; r < p; r++) if (Math.abs(m[r][c]) > Math.abs(m[piv][c])) piv = r;
            double[] tmp = m[c]; m[c] = m[piv]; m[piv] = tmp;
            double d = m[c][c];
            for (int k = 0; k < 2 * p; k++) m[c][k] /= d;
            for (int r = 0; r < p; r++) {
                if (r == c) continue;
                double f = m[r][c];
                if (f != 0) for (int k = 0; k < 2 * p; k++) m[r][k] -= f * m[c][k];
            }
        }
        double a = 0, b = 0;
        for (int k = 0; k < p; k++) { a += m[0][p + k] * rhs[k]; b += m[1][p + k] * rhs[k]; }
        return new Local(a, b / sc, Math.max(m[0][p], 0), Math.max(m[1][p + 1], 0) / (sc * sc));
    }

    /** Local fit on the 2h+1 kept bins nearest to {@code x0}. */
    static Local localAt(double[] xs, double[] ds, double[] w, int h, double x0) {
        int m = xs.length;
        int j = Arrays.binarySearch(xs, x0);
        if (j < 0) j = -j - 1;
        if (j > 0 && (j == m || Math.abs(xs[j - 1] - x0) < Math.abs(xs[j] - x0))) j--;
        int lo = Math.max(0, Math.min(j - h, m - 2 * h - 1));
        return local(xs, ds, w, lo, lo + 2 * h + 1, x0);
    }

    /**
     * {@link #localAt} with its resolution bias added to the variances: a cubic's value and slope carry a bias
     * ∝ h⁴ on a smooth curve, so the fit over 2h bins differs from the one over h by 15 times the bias at h
     * (Richardson's extrapolation argument).
     */
    static Local resolved(double[] xs, double[] ds, double[] w, int h, double x0) {
        Local l = localAt(xs, ds, w, h, x0);
        int h2 = Math.min(2 * h, (xs.length - 1) / 2);
        if (h2 <= h) return l;
        Local l2 = localAt(xs, ds, w, h2, x0);
        double f = Math.pow((double) h2 / h, 4) - 1;
        double bv = (l2.value - l.value) / f, bs = (l2.slope - l.slope) / f;
        return new Local(l.value, l.slope, l.valueVar + bv * bv, l.slopeVar + bs * bs);
    }

    /** Count-weighted least-squares line y = a·x + b over bins with lo ≤ x ≤ hi; returns {a, b}. */
    static double[] lineFit(double[] xs, double[] ys, int[] counts, double lo, double hi) {
        double sw = 0, sx = 0, sy = 0;
        for (int i = 0; i < xs.length; i++) if (xs[i] >= lo && xs[i] <= hi) { sw += counts[i]; sx += counts[i] * xs[i]; sy += counts[i] * ys[i]; }
        if (sw == 0) return new double[] {1, 0};
        double mx = sx / sw, my = sy / sw, sxx = 0, sxy = 0;
        for (int i = 0; i < xs.length; i++)
            if (xs[i] >= lo && xs[i] <= hi) { double dx = xs[i] - mx; sxx += counts[i] * dx * dx; sxy += counts[i] * dx * (ys[i] - my); }
        double a = sxx > 0 ? sxy / sxx : 1;
        return new double[] {a, my - a * mx};
    }

    // ---------------------------------------------------------------- hysteresis

    private static Hysteresis hysteresis(BinStat[] dir, int nb, double peak) {
        double chi = 0, sumSq = 0, maxDiff = 0, maxAt = 0;
        int k = 0;
        for (int b = 0; b < nb; b++) {
            BinStat r = dir[b], f = dir[nb + b];
            if (r.n < 3 || f.n < 3) continue;
            double at = (r.xMean * r.n + f.xMean * f.n) / (r.n + f.n);
            double diff = r.dAt(at) - f.dAt(at);
            double var = r.seMean * r.seMean + f.seMean * f.seMean + 2 * Math.pow(1e-12 * peak, 2);
            chi += diff * diff / var;
            sumSq += diff * diff;
            if (Math.abs(diff) > maxDiff) { maxDiff = Math.abs(diff); maxAt = at; }
            k++;
        }
        if (k == 0) return new Hysteresis(false, 0, 0, 0, 0, 0);
        double rms = Math.sqrt(sumSq / k);
        double zScore = (chi - k) / Math.sqrt(2.0 * k);
        boolean detected = zScore > 5 && rms > 1e-4 * peak;
        return new Hysteresis(detected, k, chi / k, rms, maxDiff, maxAt);
    }

    // ---------------------------------------------------------------- clipping

    private static SideResult clipSide(int sgn, double[] x, double[] y, double[] xs, double[] ys, double[] gain,
                                       double centralGain, double peak, double width, int h, double tol, double fs) {
        int n = y.length;
        double top = Double.NEGATIVE_INFINITY;
        for (double v : y) top = Math.max(top, sgn * v);
        double thr = top - tol;
        double xMin = Double.POSITIVE_INFINITY, xMax = Double.NEGATIVE_INFINITY, sum = 0;
        int count = 0;
        for (int i = 0; i < n; i++) {
            if (sgn * y[i] >= thr) {
                count++;
                sum += sgn * y[i];
                double xi = sgn * x[i];
                if (xi < xMin) xMin = xi;
                if (xi > xMax) xMax = xi;
            }
        }
        if (count < 3 || !(xMax - xMin > 5 * tol)) return new SideResult(Optional.empty(), Double.POSITIVE_INFINITY);
        double level = sum / count;
        // runs on the flat top, merging gaps of up to 2 samples
        List<int[]> runs = new ArrayList<>();
        int start = -1, last = -10;
        for (int i = 0; i < n; i++) {
            if (sgn * y[i] >= thr) {
                if (start < 0) start = i;
                else if (i - last > 3) { runs.add(new int[] {start, last}); start = i; }
                last = i;
            }
        }
        if (start >= 0) runs.add(new int[] {start, last});
        double onsetSum = 0, recSum = 0;
        int onsetN = 0, recN = 0;
        for (int[] run : runs) {
            int a = run[0], e = run[1];
            if (a == 0 || e == n - 1) continue;
            onsetSum += 0.5 * (sgn * x[a - 1] + sgn * x[a]);
            onsetN++;
            // reference instant: midway between the crossings of 20 % of the level before and after the flat top
            // (a memoryless stage is symmetric about the drive's peak; the fitted ideal is not used because a
            // sticking rail also shifts the fitted fundamental)
            double halfLevel = 0.2 * level;
            int up = a - 1;
            while (up > 0 && sgn * y[up] >= halfLevel) up--;
            int down = e + 1;
            while (down < n - 1 && sgn * y[down] >= halfLevel) down++;
            if (up <= 0 || down >= n - 1 || sgn * y[up + 1] < halfLevel || sgn * y[down - 1] < halfLevel) continue;
            double tUp = up + (halfLevel - sgn * y[up]) / (sgn * y[up + 1] - sgn * y[up]);
            double tDown = down - 1 + (sgn * y[down - 1] - halfLevel) / (sgn * y[down - 1] - sgn * y[down]);
            double tpf = 0.5 * (tUp + tDown);
            double entry = a - 0.5, exit = e + 0.5;
            recSum += (exit - tpf) - (tpf - entry);
            recN++;
        }
        double onset = onsetN > 0 ? onsetSum / onsetN : xMin;
        double recovery = recN > 0 ? Math.max(0, recSum / recN) / fs : 0;
        // knee: walk inwards from the extreme bin until the gain is back above 90 % of the central gain
        int m = xs.length;
        int i = sgn > 0 ? m - 1 : 0;
        int step = sgn > 0 ? -1 : 1;
        while (i >= 0 && i < m && gain[i] < 0.9 * centralGain && sgn * xs[i] > 0) i += step;
        i = Math.max(0, Math.min(m - 1, i));
        double kneeDepth = Math.max(0, sgn * level - sgn * ys[i]);
        double kneeStartIdeal = Math.max(0, sgn * xs[i]);
        ClipSide.Knee knee = kneeDepth <= Math.max(0.05 * Math.abs(level), (h + 2) * width * Math.abs(centralGain))
                ? ClipSide.Knee.HARD : ClipSide.Knee.SOFT;
        ClipSide side = new ClipSide(level * sgn, (double) count / n, onset, recovery, knee, kneeDepth, runs.size());
        return new SideResult(Optional.of(side), Math.min(onset, kneeStartIdeal));
    }

    private static ClippingMetrics clippingMetrics(SideResult pos, SideResult neg, double tol) {
        Optional<ClipSide> p = pos.side, q = neg.side;
        OptionalDouble asym = OptionalDouble.empty();
        ClippingMetrics.FirstSide first = ClippingMetrics.FirstSide.NONE;
        if (p.isPresent() && q.isPresent()) {
            double lp = p.get().levelVolts(), ln = Math.abs(q.get().levelVolts());
            asym = OptionalDouble.of(100 * (lp - ln) / ((lp + ln) / 2));
            double op = p.get().onsetIdealVolts(), on = q.get().onsetIdealVolts();
            if (Math.abs(op - on) <= 0.01 * Math.max(op, on)) first = ClippingMetrics.FirstSide.BOTH;
            else first = op < on ? ClippingMetrics.FirstSide.POSITIVE : ClippingMetrics.FirstSide.NEGATIVE;
        } else if (p.isPresent()) first = ClippingMetrics.FirstSide.POSITIVE;
        else if (q.isPresent()) first = ClippingMetrics.FirstSide.NEGATIVE;
        return new ClippingMetrics(p.isPresent() || q.isPresent(), p, q, asym, first, tol);
    }

    // ---------------------------------------------------------------- crossover

    /**
     * Output span around zero where |normalised gain − 1| exceeds {@code tol}. The binned gain (±h-bin window) finds
     * the bin on each side where the gain is back within the tolerance; the edge is then located with the adaptive
     * raw-sample slope ({@link AdaptiveSlope}, the same rule as the gain at zero): moved outwards while the adaptive
     * gain is still outside the tolerance there, inwards by halving while it is already inside one bin nearer zero (a
     * notch narrower than the bins), then bisected four times and interpolated linearly in |gain − 1|.
     * Returns {width, σ}: each edge's σ is the adaptive gain's σ there (noise and resolution bias) over the rate at
     * which |gain − 1| crosses the tolerance (first-order propagation), the two edges in quadrature.
     */
    private static double[] notchWidth(double[] x, double[] y, double[] xs, double[] ng, double r, double outer, double tol,
                                       double hMax, double noise) {
        if (Math.abs(r - 1) <= tol) return new double[] {0, 0};
        int m = xs.length;
        int jp = firstBack(xs, ng, tol, +1), jn = firstBack(xs, ng, tol, -1);
        double lim = Math.max(Math.abs(xs[Math.min(m - 1, jp + 8)]), Math.abs(xs[Math.max(0, jn - 8)])) + 2 * hMax;
        int c = 0;
        for (double v : x) if (Math.abs(v) <= lim) c++;
        double[] cx = new double[c], cy = new double[c];
        c = 0;
        for (int i = 0; i < x.length; i++) if (Math.abs(x[i]) <= lim) { cx[c] = x[i]; cy[c++] = y[i]; }
        java.util.function.DoubleUnaryOperator excess = v -> {
            Optional<AdaptiveSlope.Estimate> e = AdaptiveSlope.at(cx, cy, v, hMax, noise);
            double g = e.isPresent() ? e.get().slope() / outer : interpolate(xs, ng, v);
            return Math.abs(g - 1) - tol;
        };
        double[] right = notchEdge(+1, jp, xs, r, tol, excess), left = notchEdge(-1, jn, xs, r, tol, excess);
        double se = 0;
        for (double[] e : new double[][] {right, left}) {
            // σ of an edge: σ of the normalised gain there over the rate at which |gain − 1| crosses the tolerance
            Optional<AdaptiveSlope.Estimate> est = e[1] > 0 ? AdaptiveSlope.at(cx, cy, e[2] * e[0], hMax, noise) : Optional.empty();
            double sg = est.map(q -> Math.sqrt(q.totalVariance()) / Math.abs(outer)).orElse(0.0);
            se += e[1] > 0 ? Math.pow(sg / e[1], 2) : 0;
        }
        return new double[] {right[0] + left[0], Math.sqrt(se)};
    }

    /**
     * Notch depth: the largest |deviation from the best line| (y − (a·x + b), {@code line} = {a, b}) for |x| ≤ P/2, read
     * with the adaptive local regression of the raw samples ({@link AdaptiveSlope#valueAt}) rather than from the bin
     * means, which miss a narrow extremum by up to half a bin and the range's end by up to a bin. The binned deviation
     * finds the bin j of the largest |deviation|; on a grid of 9 points over ±1.5 bins around it (clamped to ±P/2),
     * each local maximum of |deviation| is refined by bisection of the adaptive slope against a (the deviation is
     * stationary there, so the location's error enters at second order); the ends ±P/2 are candidates too, and the
     * largest |value| wins. Returns {depth, σ}: σ² = the chosen value's noise variance + its resolution bias² (h⁴
     * ladder, as for the gain at zero) + the squared difference at that point between the binned best line and the
     * line of slope 1 through the ideal output over a whole number of cycles (which it approximates: the line's own
     * resolution, binning and the harmonics' leakage into its intercept over a fractional cycle); when
     * no window holds enough samples, the binned reading is returned with the change to the neighbouring bins as σ.
     */
    private static double[] notchDepth(double[] x, boolean[] rising, double[] y, double[] xs, double[] dev, double[] line, double lLo,
                                       double lHi, double peak, double width, double hMax, double noise) {
        int m = xs.length, j = -1;
        double lim = 0.5 * peak, binned = 0;
        for (int i = 0; i < m; i++) if (Math.abs(xs[i]) < lim && Math.abs(dev[i]) > binned) { binned = Math.abs(dev[i]); j = i; }
        if (j < 0) return new double[] {0, 0};
        double lo = Math.max(-lim, xs[j] - 1.5 * width), hi = Math.min(lim, xs[j] + 1.5 * width);
        // the line of slope 1 through the ideal output over a whole number of cycles (from the first turn of the ideal to
        // the last turn in the same direction), over the same range: the least squares over a fractional number of
        // cycles takes the harmonics' leakage into its intercept (about 1e-5 of peak for 498.5 cycles of a class-B curve)
        int i0 = 1, i1 = -1;
        while (i0 < x.length && rising[i0] == rising[i0 - 1]) i0++;
        for (int i = x.length - 1; i > i0; i--) if (rising[i] != rising[i - 1] && rising[i] == rising[i0]) { i1 = i; break; }
        double bWhole = line[1], sum = 0;
        long cntWhole = 0;
        for (int i = i0; i < i1; i++) if (x[i] >= lLo && x[i] <= lHi) { sum += y[i] - x[i]; cntWhole++; }
        if (cntWhole > 0) bWhole = sum / cntWhole;
        final double bW = bWhole;
        // the raw samples that can enter a window
        int c = 0;
        for (double v : x) if ((v >= lo - hMax && v <= hi + hMax) || Math.abs(Math.abs(v) - lim) <= hMax) c++;
        double[] cx = new double[c], cy = new double[c];
        c = 0;
        for (int i = 0; i < x.length; i++) {
            double v = x[i];
            if ((v >= lo - hMax && v <= hi + hMax) || Math.abs(Math.abs(v) - lim) <= hMax) { cx[c] = v; cy[c++] = y[i]; }
        }
        java.util.function.DoubleFunction<double[]> at = v -> {
            Optional<AdaptiveSlope.ValueEstimate> e = AdaptiveSlope.valueAt(cx, cy, v, hMax, noise);
            if (e.isEmpty()) return null;
            double d = e.get().value() + v - (line[0] * v + line[1]);
            // the line's own uncertainty: against the line of slope 1 through the ideal output over whole cycles (y = x +
            // DC, what the binned least squares approximates; they differ by the binning and the fractional cycle)
            double lineRes = (line[0] - 1) * v + line[1] - bW;
            return new double[] {d, e.get().slope() - line[0], e.get().totalVariance() + lineRes * lineRes};
        };
        final int k = 9;
        double[] gx = new double[k];
        double[][] ge = new double[k][];
        for (int i = 0; i < k; i++) {
            gx[i] = lo + (hi - lo) * i / (k - 1);
            ge[i] = at.apply(gx[i]);
            if (ge[i] == null) {
                double se = 0;
                for (int q = Math.max(0, j - 1); q <= Math.min(m - 1, j + 1); q++) se = Math.max(se, Math.abs(Math.abs(dev[q]) - binned));
                return new double[] {binned, se};
            }
        }
        double[] best = null;
        List<double[]> cands = new ArrayList<>();
        for (double end : new double[] {-lim, lim}) { double[] e = at.apply(end); if (e != null) cands.add(e); }
        int ends = cands.size();
        for (int i = 0; i + 1 < k; i++) {
            // local maximum of |d| between gx[i] and gx[i+1]: sign(d)·slope goes from + to −
            double s0 = Math.signum(ge[i][0]) * ge[i][1], s1 = Math.signum(ge[i + 1][0]) * ge[i + 1][1];
            if (!(s0 > 0 && s1 <= 0) || Math.signum(ge[i][0]) != Math.signum(ge[i + 1][0])) continue;
            double a = gx[i], b = gx[i + 1];
            double[] eb = ge[i + 1];
            for (int it = 0; it < 6; it++) {
                double mid = 0.5 * (a + b);
                double[] em = at.apply(mid);
                if (em == null) break;
                double sm = Math.signum(em[0]) * em[1];
                if (sm > 0) a = mid; else { b = mid; eb = em; }
            }
            double[] er = at.apply(0.5 * (a + b));
            cands.add(er != null ? er : eb);
        }
        if (cands.size() == ends) for (double[] e : ge) cands.add(e); // no interior maximum bracketed: the grid itself
        for (double[] e : cands) if (best == null || Math.abs(e[0]) > Math.abs(best[0])) best = e;
        return new double[] {Math.abs(best[0]), Math.sqrt(best[2])};
    }

    /** Index of the first bin outwards from zero (direction sgn) whose binned normalised gain is within tol. */
    private static int firstBack(double[] xs, double[] ng, double tol, int sgn) {
        int m = xs.length;
        int j = Arrays.binarySearch(xs, 0.0);
        if (j < 0) j = -j - 1;                       // first index with xs > 0
        if (sgn < 0) j--;
        j = Math.max(0, Math.min(m - 1, j));
        while (j >= 0 && j < m && Math.abs(ng[j] - 1) > tol) j += sgn;
        return Math.max(0, Math.min(m - 1, j));
    }

    /**
     * One side (see {@link #notchWidth}); excess(v) = |gain − 1| − tol, positive inside the notch. Returns {|edge|,
     * |d excess/dv| across the final bracket (0 when the edge is not bracketed), sgn}.
     */
    private static double[] notchEdge(int sgn, int j, double[] xs, double r, double tol, java.util.function.DoubleUnaryOperator excess) {
        int m = xs.length;
        double out = xs[j], fo = excess.applyAsDouble(out);
        for (int k = 0; k < 8 && fo > 0; k++) {
            if (j + sgn < 0 || j + sgn >= m) return new double[] {Math.abs(out), 0, sgn}; // the notch reaches the end
            j += sgn;
            out = xs[j];
            fo = excess.applyAsDouble(out);
        }
        if (fo > 0) return new double[] {Math.abs(out), 0, sgn};
        int ji = j - sgn;
        double in = ji >= 0 && ji < m && sgn * xs[ji] > 0 ? xs[ji] : 0.5 * out;
        double fi = excess.applyAsDouble(in);
        for (int k = 0; k < 40 && fi <= 0; k++) { out = in; fo = fi; in *= 0.5; fi = excess.applyAsDouble(in); }
        if (fi <= 0) return new double[] {0, 0, sgn};
        for (int k = 0; k < 4; k++) {
            double mid = 0.5 * (in + out), fm = excess.applyAsDouble(mid);
            if (fm > 0) { in = mid; fi = fm; } else { out = mid; fo = fm; }
        }
        return new double[] {Math.abs(in + (out - in) * fi / (fi - fo)), (fi - fo) / Math.abs(out - in), sgn};
    }

    /** Linear interpolation of v on the curve (xs, ys), clamped at the ends. */
    private static double interpolate(double[] xs, double[] ys, double v) {
        int j = Arrays.binarySearch(xs, v);
        if (j >= 0) return ys[j];
        j = -j - 1;
        if (j == 0) return ys[0];
        if (j == xs.length) return ys[xs.length - 1];
        double t = (v - xs[j - 1]) / (xs[j] - xs[j - 1]);
        return ys[j - 1] + t * (ys[j] - ys[j - 1]);
    }

    /** The start of the explanation when the samples near zero do not cover the crossing. */
    static final String UNOBSERVED = "the samples near zero do not cover the crossing (too few distinct phases: a tone locked to the sample rate, or too short a record)";

    private static CrossoverMetrics verdict(double rDefined, double rDefinedSe, double asymptote, double r, double rSe, double g0,
                                            double outer, double notchWidth, double depth,
                                            double peak, double nzShare, double nzTime, Hysteresis hyst, boolean outerClipped,
                                            double outerFall, double coarseStep, boolean unresolved, StageSettings s,
                                            CrossoverMetrics.Resolution res) {
        double band = s.nearOptimalBand(), k = s.verdictSigmas();
        double lo = 1 - band, hi = 1 + band;
        double pUnder = phi((lo - r), rSe), pOver = phi((r - hi), rSe);
        double pNear = Math.max(0, 1 - pUnder - pOver);
        BiasVerdict v;
        double conf;
        String why;
        String rTxt = Double.isNaN(asymptote)
                ? String.format(java.util.Locale.ROOT, "gain at zero %.4f ± %.1e of the large-signal gain", r, rSe)
                : String.format(java.util.Locale.ROOT, "gain at zero %.4f ± %.1e of the large-current asymptote (%.4f of the outer-swing gain, which is still rising at this level)",
                        r, rSe, rDefined);
        if (unresolved) {
            // first: with the crossing unobserved, the other readings (even hysteresis) come from too few phases
            v = BiasVerdict.UNCLEAR; conf = 0;
            // and the gain at zero read between them has no known uncertainty (the notch may lie between two sample
            // values: 0.98 read against a truth of 0.75 at 1 kHz, 48 kHz; docs/diagnosis.md §5), so no figure is quoted
            why = UNOBSERVED + "; use e.g. 997 Hz at 48 kHz";
        } else if (outerClipped) { // clipping next: it explains a rising/falling difference near the top as well
            v = BiasVerdict.UNCLEAR; conf = 0;
            why = "clipping reaches into the outer swing used as the large-signal reference; lower the level, " + rTxt;
        } else if (hyst.detected()) {
            v = BiasVerdict.UNCLEAR; conf = 0;
            why = "rising and falling halves of the transfer curve differ (the output depends on the direction of travel, "
                    + "e.g. charge storage or heating within the cycle): the curve is not static, " + rTxt;
        } else if (coarseStep > 0) {
            v = BiasVerdict.UNCLEAR; conf = 0;
            why = String.format(java.util.Locale.ROOT, "the capture's resolution (steps of %.4g) is too coarse for the crossover region: the gain there reads the steps, not the stage; use a finer capture (soundcard), ",
                    coarseStep) + rTxt;
        } else if (!Double.isNaN(outerFall)) {
            v = BiasVerdict.UNCLEAR; conf = 0;
            why = String.format(java.util.Locale.ROOT, "the gain falls by %.2f %% from 50 %% to 90 %% of peak: the outer swing is still in the crossover region; measure at a higher level, ",
                    -100 * outerFall) + rTxt;
        } else {
            // the one definition and band of the optimum bias (BiasCriterion), shared with fit and the session advice
            v = BiasCriterion.classify(r, rSe, band, k);
            switch (v) {
                case UNDERBIASED -> { conf = pUnder; why = rTxt + ": the gain dips at the crossing (notch); raise the quiescent current"; }
                case OVERBIASED -> { conf = pOver; why = rTxt + ": the gain rises at the crossing (gm-doubling); lower the quiescent current"; }
                case NEAR_OPTIMAL -> { conf = pNear; why = rTxt + ": within ±" + String.format(java.util.Locale.ROOT, "%.2f", band * 100) + " % of flat"; }
                default -> {
                    conf = Math.max(pNear, Math.max(pUnder, pOver));
                    why = rTxt + ": the uncertainty straddles a threshold; average more cycles or reduce the noise";
                }
            }
        }
        return new CrossoverMetrics(rDefined, rDefinedSe, g0, outer, notchWidth, depth, depth / peak, nzShare, nzTime, v, conf, why,
                asymptote, r, rSe, res);
    }

    /** P(Z ≤ z/σ) for a standard normal Z; a step when σ = 0. */
    static double phi(double z, double sigma) {
        if (!(sigma > 0)) return z > 0 ? 1 : (z < 0 ? 0 : 0.5);
        return 0.5 * erfc(-z / (sigma * Math.sqrt(2)));
    }

    /** Complementary error function (Numerical Recipes 3rd ed. §6.2 Chebyshev fit, |error| &lt; 1.2e-7). */
    static double erfc(double x) {
        double z = Math.abs(x);
        double t = 1 / (1 + 0.5 * z);
        double r = t * Math.exp(-z * z - 1.26551223 + t * (1.00002368 + t * (0.37409196 + t * (0.09678418
                + t * (-0.18628806 + t * (0.27886807 + t * (-1.13520398 + t * (1.48851587
                + t * (-0.82215223 + t * 0.17087277)))))))));
        return x >= 0 ? r : 2 - r;
    }
}

package org.outstage.model;

import java.util.Arrays;
import java.util.Locale;
import org.outstage.Require;
import org.outstage.analysis.TransferCurve;
import org.outstage.analysis.stage.BiasCriterion;

/**
 * Estimates a stage's bias from a measured transfer curve and advises how to change it, by the project's one optimum
 * ({@link BiasCriterion}: the model's crossover ratio, read at the measured peak as the analysis reads a capture, equal
 * to 1 (Oliver 1971), near-optimal within ±0.3 %; docs/model.md §6).
 *
 * <p>The measured curve's input is the ideal output (e.g. the fitted fundamental) and its output the measured
 * output; its incremental gain, normalised to the large-signal gain, is a function of the output voltage. The same
 * normalised gain is computed from the model of the chosen topology (other parameters as given) for a trial bias,
 * and the bias is chosen by least squares: the RMS difference over the measured points is minimised over the bias
 * voltage (a 16-cell scan from Vq = 0.1 mV to 200 mV, then golden-section search, Kiefer 1953).
 *
 * <p>Normalisation (both curves alike): divide by the mean gain over 0.5·P ≤ |Vout| ≤ 0.9·P, P the largest
 * |Vout| measured. Points with |Vout| &gt; 0.95·P are left out of the residual.
 *
 * <p>Refusal rule (our own): no advice when the RMS residual exceeds min(0.5 %, 3 × the measurement's gain noise
 * + 0.05 %), where the noise is the RMS second difference of the measured normalised gain divided by √6 (white
 * noise gives var(y[i−1] − 2y[i] + y[i+1]) = 6σ²).
 *
 * <p>Band (docs/model.md §6): a curve measured on a band-limited capture (a soundcard WAV) is compared with the model's
 * curve passed through the same band ({@link CaptureBand}, {@link #bandLimitedCurve}); without a band the model's
 * curve is used as it is. The optimum is read from the unlimited curve in both cases: it is the stage's own.
 *
 * <p>Assumption: the curve is the open-loop stage's (global feedback would shrink the crossover signature and
 * the fit would read a bias that is too high).
 */
public final class BiasFit {
    /** Former default tolerance for "leave it" (2 mV of Vq); kept for callers, no longer used: the band is {@link BiasCriterion#BAND}. */
    public static final double DEFAULT_TOLERANCE_VOLTS = 0.002;

    private BiasFit() {}

    /**
     * Fits the bias.
     *
     * @param measured       the measured transfer curve
     * @param stage          the stage (its bias is ignored; everything else is used)
     * @param levelVolts     output level of the flattest-gain criterion ({@link StageModel#optimumBias}), reported beside the advice, not used for it
     * @param toleranceVolts no longer used ("leave it" means inside the one near-optimal band, {@link BiasCriterion}); must be &gt; 0
     * @param solver         solver settings
     */
    public static BiasFitResult fit(TransferCurve measured, StageParameters stage, double levelVolts, double toleranceVolts, SolverSettings solver) {
        return fit(measured, stage, levelVolts, toleranceVolts, solver, java.util.Optional.empty());
    }

    /**
     * Fits the bias to a curve measured through a band: the model's curve is passed through the same band before it is
     * compared ({@link #bandLimitedCurve}; docs/model.md §6). Without a band, or with a band holding more than
     * {@link #MAX_BAND_HARMONICS} harmonics of the fundamental, this is {@link #fit(TransferCurve, StageParameters, double,
     * double, SolverSettings)}. The optimum (crossover ratio 1) is the stage's own in both cases: it is not band-limited.
     *
     * @param band the band the capture kept (band edge and the test tone's frequency); empty for a curve without one
     *             (a transfer-curve CSV)
     */
    public static BiasFitResult fit(TransferCurve measured, StageParameters stage, double levelVolts, double toleranceVolts, SolverSettings solver,
                                    java.util.Optional<CaptureBand> band) {
        Require.notNull("measured", measured);
        Require.notNull("band", band);
        int harmonics = band.map(CaptureBand::harmonics).orElse(0);
        Require.that(band.isEmpty() || harmonics >= 1, "capture band: the band edge " + band.map(CaptureBand::bandHz).orElse(0.0)
                + " Hz must reach the fundamental " + band.map(CaptureBand::fundamentalHz).orElse(0.0) + " Hz");
        final int h = band.isPresent() && harmonics <= MAX_BAND_HARMONICS ? harmonics : 0; // 0: the unlimited path
        Require.positive("levelVolts", levelVolts);
        Require.positive("toleranceVolts", toleranceVolts);
        double[] xRaw = measured.outputVolts(), yRaw = measured.incrementalGain();
        int n = xRaw.length;
        Integer[] order = new Integer[n];
        for (int i = 0; i < n; i++) order[i] = i;
        Arrays.sort(order, (a, b) -> Double.compare(xRaw[a], xRaw[b]));
        double[] x = new double[n], y = new double[n];
        int finite = 0;
        for (int i = 0; i < n; i++) {
            double xv = xRaw[order[i]], yv = yRaw[order[i]];
            if (Double.isFinite(xv) && Double.isFinite(yv)) { x[finite] = xv; y[finite] = yv; finite++; }
        }
        x = Arrays.copyOf(x, finite);
        y = Arrays.copyOf(y, finite);
        n = finite;
        double peak = 0;
        for (double v : x) peak = Math.max(peak, Math.abs(v));
        Require.that(peak > 0, "measured curve: the output is zero everywhere");
        final double p = peak;
        double ref = bandMean(x, y, p);
        Require.that(Double.isFinite(ref) && ref > 0, "measured curve: no usable gain between 50 % and 90 % of the peak output " + p + " V");
        double[] yn = new double[n];
        for (int i = 0; i < n; i++) yn[i] = y[i] / ref;
        int used = 0;
        for (double v : x) if (Math.abs(v) <= 0.95 * p) used++;
        Require.that(used >= 10, "measured curve: needs at least 10 points, got " + used);
        double noise = noise(yn);
        Require.that(Double.isFinite(noise), "measured curve: its gain noise cannot be estimated");
        StageModel base = StageModel.of(stage.withBias(new Bias.EmitterDropVolts(0.02)), solver);
        double g0 = stage.loadOhms() / (stage.loadOhms() + stage.emitterOhms());
        double[] vin = StageModel.denseGrid(p / g0 * 1.05);
        double vbLo = base.biasFor(StageModel.MIN_SEARCH_VQ_VOLTS), vbHi = base.biasFor(StageModel.MAX_SEARCH_VQ_VOLTS);
        final double[] xs = x;
        java.util.function.DoubleUnaryOperator cost = vb -> {
            try {
                return rms(h > 0 ? bandLimitedCurve(base, vb, p, h) : base.curveAtBias(vb, vin), xs, yn, p);
            } catch (SolverFailureException e) {
                return Double.POSITIVE_INFINITY;
            }
        };
        double[] best = Search.scanThenGolden(cost, vbLo, vbHi, 16, 1e-6);
        StageModel fitted = StageModel.of(stage.withBias(new Bias.GeneratorVolts(best[0])), solver);
        double vq = fitted.vqVolts();
        // The one optimum (analysis.stage.BiasCriterion, Oliver 1971): the model's crossover ratio, read at the measured
        // peak as the analysis reads it, equals 1; near-optimal within ±0.3 %. The flattest-gain bias at levelVolts is
        // another criterion, reported under its own name.
        final double[] grid = vin;
        java.util.function.DoubleUnaryOperator ratio = vb -> {
            try {
                return modelRatio(base.curveAtBias(vb, grid), p);
            } catch (SolverFailureException e) {
                return Double.NaN;
            }
        };
        double ratioAtFit = ratio.applyAsDouble(best[0]);
        double ratioInBand = Double.NaN;
        if (h > 0) {
            try {
                ratioInBand = modelRatio(bandLimitedCurve(base, best[0], p, h), p);
            } catch (SolverFailureException e) {
                ratioInBand = Double.NaN;
            }
        }
        CrossoverOptimum oliver = oliverOptimum(ratio, vbLo, vbHi, stage, solver, p).orElse(null);
        OptimumBias flattest = fitted.optimumBias(levelVolts);
        double limit = Math.min(0.005, 3 * noise + 0.0005);
        double rms = best[1];
        String advice;
        boolean given;
        if (!(rms <= limit)) {
            given = false;
            advice = String.format(Locale.ROOT, "no advice: the %s model fits the measured gain poorly (RMS residual %.3f %% > limit %.3f %%)",
                    stage.topology().name(), rms * 100, limit * 100);
        } else if (oliver == null) {
            given = false;
            advice = String.format(Locale.ROOT, "no advice: about %s mV across each emitter resistor; the %s model's crossover ratio does not reach 1"
                    + " (gain at zero equal to the large-current gain) between Vq 0.1 and 200 mV", mv(vq), stage.topology().name());
        } else {
            given = true;
            String bandText = String.format(Locale.ROOT, "near-optimal band %s to %s mV: crossover ratio 1 ± %.1f %%, Oliver's optimum %s mV",
                    mv(oliver.bandLowVqVolts()), mv(oliver.bandHighVqVolts()), BiasCriterion.BAND * 100, mv(oliver.vqVolts()));
            if (vq < oliver.bandLowVqVolts())
                advice = String.format(Locale.ROOT, "raise the drop across each emitter resistor by about %s mV (from %s mV to %s mV; %s)",
                        mv(oliver.vqVolts() - vq), mv(vq), mv(oliver.vqVolts()), bandText);
            else if (vq > oliver.bandHighVqVolts())
                advice = String.format(Locale.ROOT, "lower the drop across each emitter resistor by about %s mV (from %s mV to %s mV; %s)",
                        mv(vq - oliver.vqVolts()), mv(vq), mv(oliver.vqVolts()), bandText);
            else
                advice = String.format(Locale.ROOT, "leave it: %s mV across each emitter resistor is in the %s", mv(vq), bandText);
        }
        return new BiasFitResult(vq, best[0], oliver != null ? oliver.vqVolts() : Double.NaN, oliver == null, levelVolts, rms, noise, limit, given, advice, used,
                oliver != null ? oliver.bandLowVqVolts() : Double.NaN, oliver != null ? oliver.bandHighVqVolts() : Double.NaN, ratioAtFit,
                flattest.vqVolts(), flattest.atSearchLimit(), h, ratioInBand);
    }

    /**
     * The one optimum (crossover ratio 1, {@link BiasCriterion}) of a stage whose output swings to ±peakVolts: what the
     * analysis would call near-optimal on a capture at that level. Empty when the ratio never reaches 1 between Vq 0.1
     * and 200 mV.
     */
    public static java.util.Optional<CrossoverOptimum> crossoverOptimum(StageParameters stage, double peakVolts, SolverSettings solver) {
        Require.positive("peakVolts", peakVolts);
        StageModel base = StageModel.of(stage.withBias(new Bias.EmitterDropVolts(0.02)), solver);
        double g0 = stage.loadOhms() / (stage.loadOhms() + stage.emitterOhms());
        double[] vin = StageModel.denseGrid(peakVolts / g0 * 1.05);
        double vbLo = base.biasFor(StageModel.MIN_SEARCH_VQ_VOLTS), vbHi = base.biasFor(StageModel.MAX_SEARCH_VQ_VOLTS);
        java.util.function.DoubleUnaryOperator ratio = vb -> {
            try {
                return modelRatio(base.curveAtBias(vb, vin), peakVolts);
            } catch (SolverFailureException e) {
                return Double.NaN;
            }
        };
        return oliverOptimum(ratio, vbLo, vbHi, stage, solver, peakVolts);
    }

    /**
     * Where the model's crossover ratio crosses 1 and 1 ± band, as Vq: a 24-point scan of the bias voltage, the series
     * handed to {@link BiasCriterion#recommend} (the same function the session advice uses), then each crossing refined
     * by bisection on the bias voltage. Empty when the ratio never enters the band.
     */
    private static java.util.Optional<CrossoverOptimum> oliverOptimum(java.util.function.DoubleUnaryOperator ratio, double vbLo, double vbHi,
                                                                      StageParameters stage, SolverSettings solver, double peak) {
        int cells = 24;
        double[] vbs = new double[cells + 1], vqs = new double[cells + 1], rs = new double[cells + 1];
        int k = 0;
        for (int i = 0; i <= cells; i++) {
            double vb = vbLo + (vbHi - vbLo) * i / cells;
            double r = ratio.applyAsDouble(vb);
            if (!Double.isFinite(r)) continue;
            double vq = StageModel.of(stage.withBias(new Bias.GeneratorVolts(vb)), solver).vqVolts();
            if (k > 0 && !(vq > vqs[k - 1])) continue;
            vbs[k] = vb; vqs[k] = vq; rs[k] = r; k++;
        }
        if (k == 0) return java.util.Optional.empty();
        vbs = Arrays.copyOf(vbs, k); vqs = Arrays.copyOf(vqs, k); rs = Arrays.copyOf(rs, k);
        BiasCriterion.Recommendation rec = BiasCriterion.recommend(vqs, rs);
        if (rec.low().isEmpty()) return java.util.Optional.empty();
        double best = refine(ratio, vbs, vqs, rs, rec.best(), 1, stage, solver);
        double lo = refine(ratio, vbs, vqs, rs, rec.low().getAsDouble(), 1 - BiasCriterion.BAND, stage, solver);
        double hi = refine(ratio, vbs, vqs, rs, rec.high().getAsDouble(), 1 + BiasCriterion.BAND, stage, solver);
        return java.util.Optional.of(new CrossoverOptimum(best, Math.min(lo, best), Math.max(hi, best), peak));
    }

    /** Refines the Vq near {@code nearVq} where the ratio equals target, by bisection on the bias voltage in the scan cell holding it. */
    private static double refine(java.util.function.DoubleUnaryOperator ratio, double[] vbs, double[] vqs, double[] rs, double nearVq, double target,
                                 StageParameters stage, SolverSettings solver) {
        for (int i = 0; i + 1 < vqs.length; i++) {
            if (nearVq < vqs[i] - 1e-15 || nearVq > vqs[i + 1] + 1e-15) continue;
            double a = vbs[i], b = vbs[i + 1], fa = rs[i] - target, fb = rs[i + 1] - target;
            if (fa * fb > 0) continue;
            for (int it = 0; it < 40 && b - a > 1e-7; it++) {
                double m = (a + b) / 2, fm = ratio.applyAsDouble(m) - target;
                if (fa * fm <= 0) { b = m; fb = fm; } else { a = m; fa = fm; }
            }
            return StageModel.of(stage.withBias(new Bias.GeneratorVolts((a + b) / 2)), solver).vqVolts();
        }
        return nearVq; // at an end of the scan: the scan's own value
    }

    /**
     * The model's crossover ratio as the analysis reads a capture (docs/diagnosis.md §5): g(0) against the large-current
     * asymptote from the gains at 50 % and 90 % of the peak p when the outer gain still rises, else against the mean
     * gain over 50–90 % of peak. {@code model} is {vout, gain} on the dense grid (Vin = 0, the rest point, is on it).
     */
    static double modelRatio(double[][] model, double p) {
        double[] mx = model[0], mg = model[1];
        double g0 = Interp.at(mx, mg, 0);
        double gIn = (Interp.at(mx, mg, 0.5 * p) + Interp.at(mx, mg, -0.5 * p)) / 2;
        double gOut = (Interp.at(mx, mg, 0.9 * p) + Interp.at(mx, mg, -0.9 * p)) / 2;
        if (gOut > gIn) return g0 * BiasCriterion.asymptoteCoefficient(0.5 * p, gIn, 0.9 * p, gOut);
        double s = 0;
        int c = 0;
        for (int i = 0; i < mx.length; i++) if (Math.abs(mx[i]) >= 0.5 * p && Math.abs(mx[i]) <= 0.9 * p) { s += mg[i]; c++; }
        return g0 / (c > 0 ? s / c : (gIn + gOut) / 2);
    }

    /**
     * Points per cycle of the band-limited model (at least 4h): the drive a·cos θ is solved at the 1025 distinct inputs
     * of 2048. Enough for harmonics 0…22 of an under-biased pair at 40 W: the model's band-limited crossover ratio at
     * Vq 0.3, 1, 3 and 26 mV is the same to 2e-5 with 512 to 16384 points per cycle (docs/model.md §6).
     */
    static final int CYCLE_POINTS = 2048;

    /**
     * The most harmonics a band may hold and still be applied: above it the fit takes the unlimited model curve. At
     * 1024 harmonics (a 1 MHz band for a 1 kHz tone) the band-limited crossover ratio of the pair at Vq 1 mV and 40 W is
     * the unlimited one within 0.1 % (0.7524 against 0.7516; at 300 harmonics it still reads 0.784) (docs/model.md §6).
     */
    static final int MAX_BAND_HARMONICS = 1024;

    /**
     * The model's curve as a capture through a band of {@code h} harmonics records it, as {vout, gain} on ascending
     * inputs (docs/model.md §6). The model (at bias voltage vb) is driven by a·cos θ, a chosen so that its output
     * peak max(vout(a), −vout(−a)) equals the measured peak p (Newton on a, two solves of ±a); its output over one cycle
     * ({@link #CYCLE_POINTS} points, or 4h when more; the output is even in θ, so only θ ∈ [0, π] is solved) is reduced to harmonics
     * 0…h by the discrete Fourier transform (cosine terms only), and the band-limited curve rebuilt over θ ∈ [0, π]:
     * yb(θ) = Σ c_k cos kθ. With u = cos θ = vin/a, cos kθ = T_k(u) (Chebyshev polynomials; docs/references.md §6.4),
     * so the band-limited curve is the Chebyshev series of the static curve on [−a, a] truncated at degree h, and its
     * incremental gain dyb/dvin = Σ k·c_k·U_{k−1}(u) / a, exact and finite at the ends. The gain is against the drive,
     * as the measurement's is against the fitted fundamental; the two differ by a constant, which the fit's
     * normalisation removes.
     */
    static double[][] bandLimitedCurve(StageModel base, double vb, double p, int h) {
        int n = CYCLE_POINTS;
        while (n < 4 * h) n *= 2;
        return bandLimitedCurve(base, vb, p, h, n);
    }

    /** {@link #bandLimitedCurve(StageModel, double, double, int)} with {@code cyclePoints} (even, &gt; 2h) points per cycle. */
    static double[][] bandLimitedCurve(StageModel base, double vb, double p, int h, int cyclePoints) {
        double[][] r = throughBand(base.atBias(vb), p, h, cyclePoints);
        return new double[][] {r[1], r[2]};
    }

    /** The band-limited curve of the stage {@code at} as it is: {vin, vout, gain} on ascending drive (see above). */
    static double[][] throughBand(StageModel at, double p, int h) {
        int n = CYCLE_POINTS;
        while (n < 4 * h) n *= 2;
        return throughBand(at, p, h, n);
    }

    private static double[][] throughBand(StageModel at, double p, int h, int cyclePoints) {
        double a = driveForPeak(at, p);
        int m = cyclePoints / 2;
        double[] vin = new double[m + 1];
        for (int j = 0; j <= m; j++) vin[j] = a * Math.cos(Math.PI * (m - j) / m); // θ = π(m − j)/m: ascending inputs
        vin[0] = -a;
        vin[m] = a;
        vin[m / 2] = 0;
        double[] y = at.curve(vin)[0];
        double[] cosTable = cyclePoints == CYCLE_POINTS ? COS_TABLE : cosTable(cyclePoints);
        Require.that(cyclePoints % 2 == 0 && cyclePoints > 2 * h, "cyclePoints=" + cyclePoints + " must be even and > 2h = " + 2 * h);
        double[] c = new double[h + 1];
        for (int k = 0; k <= h; k++) {
            // y(θ_i) = y[m − i], θ_i = πi/m; trapezoid over [0, π] = the DFT of the even cycle of 2m points
            double sum = 0.5 * (y[m] + ((k & 1) == 0 ? 1 : -1) * y[0]);
            for (int i = 1; i < m; i++) sum += y[m - i] * cosTable[(int) ((long) k * i % (2L * m))];
            c[k] = (k == 0 ? 1.0 : 2.0) * sum / m;
        }
        int g = Math.max(1024, 8 * h);
        double[] out = new double[g + 1], gain = new double[g + 1];
        for (int j = 0; j <= g; j++) {
            double u = Math.cos(Math.PI * (g - j) / g);
            if (j == 0) u = -1;
            if (j == g) u = 1;
            double tPrev = 1, t = u, uPrev = 0, uCur = 1; // T_0, T_1, U_{-1}, U_0
            double yv = c[0], gv = 0;
            for (int k = 1; k <= h; k++) {
                yv += c[k] * t;
                gv += k * c[k] * uCur;
                double tNext = 2 * u * t - tPrev, uNext = 2 * u * uCur - uPrev;
                tPrev = t; t = tNext; uPrev = uCur; uCur = uNext;
            }
            out[j] = yv;
            gain[j] = gv / a;
        }
        double[] drive = new double[g + 1];
        for (int j = 0; j <= g; j++) drive[j] = a * (j == 0 ? -1 : j == g ? 1 : Math.cos(Math.PI * (g - j) / g));
        return new double[][] {drive, out, gain};
    }

    private static final double[] COS_TABLE = cosTable(CYCLE_POINTS);

    /** cos(2πi/n), i = 0…n−1. */
    private static double[] cosTable(int n) {
        double[] t = new double[n];
        for (int i = 0; i < n; i++) t[i] = Math.cos(2 * Math.PI * i / n);
        return t;
    }

    /** The drive amplitude a at which the model's (unlimited) output peak max(vout(a), −vout(−a)) is p: Newton from p·(RL + Re)/RL. */
    static double driveForPeak(StageModel at, double p) {
        StageParameters s = at.parameters();
        double a = p * (s.loadOhms() + s.emitterOhms()) / s.loadOhms();
        for (int it = 0; it < 4; it++) {
            double[][] r = at.curve(new double[] {-a, a});
            boolean upper = r[0][1] >= -r[0][0];
            double peak = upper ? r[0][1] : -r[0][0], slope = upper ? r[1][1] : r[1][0];
            if (!(slope > 0)) break;
            double next = a + (p - peak) / slope;
            if (Math.abs(next - a) < 1e-9 * a) { a = next; break; }
            a = next;
        }
        return a;
    }

    static String mv(double volts) {
        double m = volts * 1e3;
        return Math.abs(m) >= 3 ? String.format(Locale.ROOT, "%.0f", m) : String.format(Locale.ROOT, "%.1f", m);
    }

    private static double bandMean(double[] x, double[] y, double p) {
        double s = 0;
        int c = 0;
        for (int i = 0; i < x.length; i++) {
            double a = Math.abs(x[i]);
            if (a >= 0.5 * p && a <= 0.9 * p) { s += y[i]; c++; }
        }
        return c == 0 ? Double.NaN : s / c;
    }

    private static double noise(double[] yn) {
        if (yn.length < 3) return 0;
        double s = 0;
        for (int i = 1; i < yn.length - 1; i++) {
            double d = yn[i - 1] - 2 * yn[i] + yn[i + 1];
            s += d * d;
        }
        return Math.sqrt(s / (yn.length - 2) / 6);
    }

    /** RMS of measured minus model normalised gain; model {vout, gain} on its own grid, interpolated at x. */
    private static double rms(double[][] model, double[] x, double[] yn, double p) {
        double[] mx = model[0], mg = model[1];
        for (int k = 1; k < mx.length; k++) if (!(mx[k] > mx[k - 1])) return Double.POSITIVE_INFINITY;
        double[] gm = new double[x.length];
        for (int i = 0; i < x.length; i++) gm[i] = Interp.at(mx, mg, x[i]);
        double ref = bandMean(x, gm, p);
        double s = 0;
        int c = 0;
        for (int i = 0; i < x.length; i++) {
            if (Math.abs(x[i]) > 0.95 * p) continue;
            double d = yn[i] - gm[i] / ref;
            s += d * d;
            c++;
        }
        return Math.sqrt(s / c);
    }
}

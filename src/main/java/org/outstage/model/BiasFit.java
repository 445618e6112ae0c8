package org.outstage.model;

import java.util.Arrays;
import java.util.Locale;
import org.outstage.Require;
import org.outstage.analysis.TransferCurve;

/**
 * Estimates a stage's bias from a measured transfer curve and advises how to change it.
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
 * <p>Assumption: the curve is the open-loop stage's (global feedback would shrink the crossover signature and
 * the fit would read a bias that is too high).
 */
public final class BiasFit {
    /** Default tolerance for "leave it": 2 mV of Vq. */
    public static final double DEFAULT_TOLERANCE_VOLTS = 0.002;

    private BiasFit() {}

    /**
     * Fits the bias.
     *
     * @param measured       the measured transfer curve
     * @param stage          the stage (its bias is ignored; everything else is used)
     * @param levelVolts     output level of the optimum criterion ({@link StageModel#optimumBias})
     * @param toleranceVolts within this distance of the optimum Vq the advice is "leave it"
     * @param solver         solver settings
     */
    public static BiasFitResult fit(TransferCurve measured, StageParameters stage, double levelVolts, double toleranceVolts, SolverSettings solver) {
        Require.notNull("measured", measured);
        Require.positive("levelVolts", levelVolts);
        Require.positive("toleranceVolts", toleranceVolts);
        double[] xRaw = measured.outputVolts(), yRaw = measured.incrementalGain();
        int n = xRaw.length;
        Integer[] order = new Integer[n];
        for (int i = 0; i < n; i++) order[i] = i;
        Arrays.sort(order, (a, b) -> Double.compare(xRaw[a], xRaw[b]));
        double[] x = new double[n], y = new double[n];
        for (int i = 0; i < n; i++) { x[i] = xRaw[order[i]]; y[i] = yRaw[order[i]]; }
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
        StageModel base = StageModel.of(stage.withBias(new Bias.EmitterDropVolts(0.02)), solver);
        double g0 = stage.loadOhms() / (stage.loadOhms() + stage.emitterOhms());
        double[] vin = StageModel.denseGrid(p / g0 * 1.05);
        double vbLo = base.biasFor(StageModel.MIN_SEARCH_VQ_VOLTS), vbHi = base.biasFor(StageModel.MAX_SEARCH_VQ_VOLTS);
        java.util.function.DoubleUnaryOperator cost = vb -> {
            try {
                return rms(base.curveAtBias(vb, vin), x, yn, p);
            } catch (SolverFailureException e) {
                return Double.POSITIVE_INFINITY;
            }
        };
        double[] best = Search.scanThenGolden(cost, vbLo, vbHi, 16, 1e-6);
        StageModel fitted = StageModel.of(stage.withBias(new Bias.GeneratorVolts(best[0])), solver);
        double vq = fitted.vqVolts();
        OptimumBias opt = fitted.optimumBias(levelVolts);
        double limit = Math.min(0.005, 3 * noise + 0.0005);
        double rms = best[1];
        String advice;
        boolean given;
        if (!(rms <= limit)) {
            given = false;
            advice = String.format(Locale.ROOT, "no advice: the %s model fits the measured gain poorly (RMS residual %.3f %% > limit %.3f %%)",
                    stage.topology().name(), rms * 100, limit * 100);
        } else if (opt.atSearchLimit()) {
            given = false;
            advice = String.format(Locale.ROOT, "no advice: about %s mV across each emitter resistor; the %s model's gain flattens steadily with bias "
                    + "and has no crossover optimum below class A", mv(vq), stage.topology().name());
        } else {
            given = true;
            double d = opt.vqVolts() - vq;
            if (Math.abs(d) <= toleranceVolts)
                advice = String.format(Locale.ROOT, "leave it: within %s mV of the optimum (%s mV across each emitter resistor, optimum %s mV)",
                        mv(toleranceVolts), mv(vq), mv(opt.vqVolts()));
            else
                advice = String.format(Locale.ROOT, "%s the drop across each emitter resistor by about %s mV (from %s mV to %s mV)",
                        d > 0 ? "raise" : "lower", mv(Math.abs(d)), mv(vq), mv(opt.vqVolts()));
        }
        return new BiasFitResult(vq, best[0], opt.vqVolts(), opt.atSearchLimit(), levelVolts, rms, noise, limit, given, advice, used);
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

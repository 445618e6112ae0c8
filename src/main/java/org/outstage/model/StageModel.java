package org.outstage.model;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import org.outstage.Require;
import org.outstage.analysis.TransferCurve;

/**
 * A class-AB push-pull output stage, solved. Immutable and thread-safe: each method runs its own solver.
 *
 * <pre>
 *   StageModel m = StageModel.of(StageParameters.builder().topology("cfp").build(), SolverSettings.defaults());
 *   m.quiescent().emitterDropUpperVolts();      // 0.020 (the default Vq)
 *   m.transferCurve(-35, 35, 2001).curve();     // Vout(Vin) with dVout/dVin
 * </pre>
 *
 * Physics: {@link DeviceLaw}; circuits: docs/model.md; solver: damped Newton with continuation and fallbacks.
 */
public final class StageModel {
    /** Points per cycle of the sine used for predicted distortion. */
    public static final int SAMPLES_PER_CYCLE = 1024;

    private final StageParameters params;
    private final SolverSettings settings;
    private final Circuit circuit;
    private final double biasVolts;
    private final double inputOffsetVolts;
    private final double[] quiescentNodes;
    private final OperatingPoint quiescent;
    private final List<String> warnings;
    private final SolveReport resolveReport;

    private StageModel(StageParameters p, SolverSettings s, Circuit c, double vb, double offset, double[] q, SolveReport r) {
        params = p;
        settings = s;
        circuit = c;
        biasVolts = vb;
        inputOffsetVolts = offset;
        quiescentNodes = q;
        resolveReport = r;
        Solver sv = new Solver(c, s, vb, offset);
        quiescent = operatingPoint(sv, 0, q);
        List<String> w = new ArrayList<>(p.warnings());
        double vq = vqOf(q);
        double vtDrop = p.thermalVolts();
        if (vq < 0.01 * vtDrop)
            w.add(String.format(Locale.ROOT, "Vq = %.3g mV: the stage is in deep class B (bias below turn-on)", vq * 1e3));
        if (Math.abs(vb) / 2 >= p.railVolts() - p.driveSaturationVolts())
            throw new IllegalArgumentException("bias: the bias source needs " + StageParameters.fmt(vb) + " V, more than the rails allow (rails="
                    + StageParameters.fmt(p.railVolts()) + ")");
        warnings = List.copyOf(w);
    }

    /**
     * Builds the stage and solves its quiescent point; a bias given as Vq or Iq is converted to the bias
     * voltage by a root search on the quiescent point.
     *
     * @throws IllegalArgumentException when the bias cannot be reached within the rails
     * @throws SolverFailureException   when no operating point is found
     */
    public static StageModel of(StageParameters p, SolverSettings s) {
        Require.notNull("parameters", p);
        Require.notNull("settings", s);
        Circuit c = Circuit.of(p);
        Solver sv = new Solver(c, s, 0);
        double vb;
        double[] q;
        if (p.bias() instanceof Bias.GeneratorVolts g) {
            vb = g.volts();
            sv.biasVolts = vb;
            q = rest(c, sv, sv.quiescent(null));
        } else {
            double target = p.bias() instanceof Bias.EmitterDropVolts e ? e.volts() : ((Bias.QuiescentAmps) p.bias()).amps() * p.emitterOhms();
            double[] res = biasForVq(c, sv, target, p);
            vb = res[0];
            sv.biasVolts = vb;
            sv.inputOffsetVolts = res[1];
            q = rest(c, sv, sv.solve(0, 0, Arrays.copyOfRange(res, 2, res.length)));
        }
        return new StageModel(p, s, c, vb, sv.inputOffsetVolts, q, sv.report());
    }

    /**
     * The rest point: moves the solver's input offset until the output is 0 V at Vin = 0, as an amplifier's global
     * feedback holds it (Vout is monotonic in the input: safeguarded Newton, steps limited to 0.5 V, bisection when a
     * Newton step leaves the bracket). {@code v} is a solution at the present offset; returns the nodes at the new one.
     * A symmetric stage rests at 0 V with no offset; an asymmetric one (quasi) needs a few millivolts.
     */
    static double[] rest(Circuit c, Solver sv, double[] v) {
        double lo = Double.NEGATIVE_INFINITY, hi = Double.POSITIVE_INFINITY;
        for (int it = 0; it < 100; it++) {
            double out = v[c.out];
            if (Math.abs(out) <= REST_TOLERANCE_VOLTS) break;
            double x = sv.inputOffsetVolts;
            if (out > 0) hi = Math.min(hi, x); else lo = Math.max(lo, x);
            if (hi - lo < 1e-13) break;
            double g = sv.gain(v, 0);
            double step = g > 1e-6 ? -out / g : -Math.signum(out) * 0.05;
            step = Math.max(-0.5, Math.min(0.5, step));
            double next = x + step;
            if (!(next > lo && next < hi)) next = Double.isFinite(lo) && Double.isFinite(hi) ? (lo + hi) / 2 : x + step;
            v = sv.solve(next - x, 0, v);
            sv.inputOffsetVolts = next;
            // v was solved with the old offset and input next − x: the same drive as input 0 with the new offset
        }
        return v;
    }

    /** The rest point holds |Vout| below this (the solver's own tolerance is 1 nV). */
    static final double REST_TOLERANCE_VOLTS = 1e-9;

    /** Searches the bias voltage whose quiescent Vq (at the rest point, Vout = 0) equals target; returns {vb, offset, nodes...}. */
    private static double[] biasForVq(Circuit c, Solver sv, double target, StageParameters p) {
        double limit = 2 * (p.railVolts() - p.driveSaturationVolts());
        double lo = 0;
        sv.biasVolts = lo;
        sv.inputOffsetVolts = 0;
        double[] vLo = rest(c, sv, sv.quiescent(null));
        double oLo = sv.inputOffsetVolts;
        double hLo = Math.log(Math.max(vqOf(c, vLo), 1e-300) / target);
        while (hLo > 0) {
            lo -= 0.2;
            sv.biasVolts = lo;
            vLo = rest(c, sv, sv.solve(0, 0, vLo));
            oLo = sv.inputOffsetVolts;
            hLo = Math.log(Math.max(vqOf(c, vLo), 1e-300) / target);
            if (lo < -limit) throw new IllegalArgumentException("vq=" + target + " V must be reachable with a bias source inside the rails");
        }
        double hi = lo;
        double[] vHi = vLo;
        double hHi = hLo, oHi = oLo;
        while (hHi <= 0) {
            lo = hi; vLo = vHi; hLo = hHi; oLo = oHi;
            hi += 0.1;
            if (hi / 2 >= p.railVolts() - p.driveSaturationVolts())
                throw new IllegalArgumentException("vq=" + StageParameters.fmt(target * 1e3) + " mV must be reachable with a bias source inside the rails (rails="
                        + StageParameters.fmt(p.railVolts()) + " V)");
            sv.biasVolts = hi;
            vHi = rest(c, sv, sv.solve(0, 0, vHi));
            oHi = sv.inputOffsetVolts;
            hHi = Math.log(vqOf(c, vHi) / target);
        }
        // Illinois regula falsi on ln(Vq/target), which is smooth and nearly linear in Vbias.
        int side = 0;
        double x = hi;
        double[] vx = vHi;
        double ox = oHi;
        for (int it = 0; it < 200; it++) {
            x = (lo * hHi - hi * hLo) / (hHi - hLo);
            sv.biasVolts = x;
            boolean nearHi = hLo < -hHi;
            sv.inputOffsetVolts = nearHi ? oHi : oLo;
            vx = rest(c, sv, sv.solve(0, 0, nearHi ? vHi : vLo));
            ox = sv.inputOffsetVolts;
            double hx = Math.log(vqOf(c, vx) / target);
            if (Math.abs(hx) < 1e-12 || hi - lo < 1e-13) break;
            if (hx > 0) {
                hi = x; hHi = hx; vHi = vx; oHi = ox;
                if (side == 1) hLo /= 2;
                side = 1;
            } else {
                lo = x; hLo = hx; vLo = vx; oLo = ox;
                if (side == -1) hHi /= 2;
                side = -1;
            }
        }
        double[] r = new double[vx.length + 2];
        r[0] = x;
        r[1] = ox;
        System.arraycopy(vx, 0, r, 2, vx.length);
        return r;
    }

    private static double vqOf(Circuit c, double[] v) {
        double re = c.params.emitterOhms();
        return (Math.abs(c.resistorCurrent(c.emitterResistorTop, v)) + Math.abs(c.resistorCurrent(c.emitterResistorBottom, v))) / 2 * re;
    }

    private double vqOf(double[] v) { return vqOf(circuit, v); }

    private OperatingPoint operatingPoint(Solver sv, double vin, double[] v) {
        double[][] cur = circuit.deviceCurrents(v);
        List<OperatingPoint.DeviceCurrent> d = new ArrayList<>();
        for (int k = 0; k < cur.length; k++) {
            Circuit.Bjt b = circuit.bjts.get(k);
            d.add(new OperatingPoint.DeviceCurrent(b.name(), b.role(), cur[k][0], cur[k][1]));
        }
        double re = params.emitterOhms();
        // Upper: current from the upper half into the output node; lower: out of the output node.
        double up = circuit.resistorCurrent(circuit.emitterResistorTop, v) * re;
        double lowRaw = circuit.resistorCurrent(circuit.emitterResistorBottom, v) * re;
        return new OperatingPoint(vin, v[circuit.out], d, up, -lowRaw, sv.nodeMap(v));
    }

    public StageParameters parameters() { return params; }

    /** The solver settings this model was built with. */
    public SolverSettings solverSettings() { return settings; }

    /** The bias-generator voltage (given, or solved from Vq or Iq). */
    public double biasVolts() { return biasVolts; }

    /**
     * The input offset that holds the output at 0 V at rest, as global feedback does in an amplifier; every input
     * of this model (curves, operating points, the sine of the distortion) is relative to it. Zero for a symmetric
     * stage; a few millivolts for the quasi-complementary one, whose halves differ.
     */
    public double inputOffsetVolts() { return inputOffsetVolts; }

    /** Quiescent current through the upper emitter resistor at the rest point (Vout = 0). */
    public double quiescentUpperAmps() { return quiescent.emitterDropUpperVolts() / params.emitterOhms(); }

    /** Quiescent current through the lower emitter resistor at the rest point (Vout = 0). */
    public double quiescentLowerAmps() { return quiescent.emitterDropLowerVolts() / params.emitterOhms(); }

    /** The quiescent point (Vin = 0). */
    public OperatingPoint quiescent() { return quiescent; }

    /** Vq: the mean quiescent drop across the two emitter resistors. */
    public double vqVolts() { return vqOf(quiescentNodes); }

    /** Quiescent current through each emitter resistor (mean of upper and lower). */
    public double quiescentAmps() { return vqVolts() / params.emitterOhms(); }

    /** Parameter warnings plus the model's own (e.g. deep class B). */
    public List<String> warnings() { return warnings; }

    /** The solver's work to find the bias and quiescent point. */
    public SolveReport resolveReport() { return resolveReport; }

    /** The same stage with another bias. */
    public StageModel withBias(Bias bias) { return of(params.withBias(bias), settings); }

    /** An operating point at one input value (reached by continuation from the quiescent point). */
    public OperatingPoint operatingPoint(double vin) {
        Require.finite("vin", vin);
        Solver sv = new Solver(circuit, settings, biasVolts, inputOffsetVolts);
        double[] v = walk(sv, vin);
        return operatingPoint(sv, vin, v);
    }

    private double[] walk(Solver sv, double vin) {
        return vin == 0 ? sv.solve(0, 0, quiescentNodes) : step(sv, 0, quiescentNodes, vin);
    }

    /**
     * The transfer curve as a capture through {@code band} records it, with the stage driven by a sine to an output
     * peak of {@code outputPeakVolts}: the output over one cycle kept to harmonics 0…H of the tone (H =
     * {@link CaptureBand#harmonics()}) and the curve rebuilt from them, as the bias fit compares it with a band-limited
     * capture (docs/model.md §6). The gain is against the drive, on ascending drive over ±a, a the drive that gives
     * that peak. A band of more than {@link BiasFit#MAX_BAND_HARMONICS} harmonics gives this stage's own curve over
     * the same drive (it is then the same within 0.1 %).
     *
     * @throws IllegalArgumentException when the band does not reach the tone (H = 0) or the peak is not positive
     */
    public TransferCurve curveThroughBand(double outputPeakVolts, CaptureBand band) {
        Require.positive("outputPeakVolts", outputPeakVolts);
        Require.notNull("band", band);
        int h = band.harmonics();
        Require.that(h >= 1, "capture band: the band edge " + band.bandHz() + " Hz must reach the tone " + band.fundamentalHz() + " Hz");
        if (h > BiasFit.MAX_BAND_HARMONICS) {
            double a = BiasFit.driveForPeak(this, outputPeakVolts);
            return transferCurve(-a, a, 1025).curve();
        }
        double[][] r = BiasFit.throughBand(this, outputPeakVolts, h);
        return new TransferCurve(r[0], r[1], r[2], "V");
    }

    /**
     * The static transfer curve on {@code points} equally spaced inputs from vinMin to vinMax: Vout and the
     * incremental gain dVout/dVin, computed from the Jacobian at each converged point (not by differencing).
     */
    public ModelCurve transferCurve(double vinMinVolts, double vinMaxVolts, int points) {
        Require.finite("vinMinVolts", vinMinVolts);
        Require.finite("vinMaxVolts", vinMaxVolts);
        Require.that(vinMaxVolts > vinMinVolts, "vinMaxVolts=" + vinMaxVolts + " must be > vinMinVolts=" + vinMinVolts);
        Require.atLeast("points", points, 2);
        double[] vin = new double[points];
        for (int k = 0; k < points; k++) vin[k] = vinMinVolts + (vinMaxVolts - vinMinVolts) * k / (points - 1);
        vin[points - 1] = vinMaxVolts;
        Solver sv = new Solver(circuit, settings, biasVolts, inputOffsetVolts);
        double[][] r = sweep(sv, vin);
        return new ModelCurve(new TransferCurve(vin, r[0], r[1], "V"), sv.report());
    }

    /** Solves ascending inputs by continuation outwards from 0; returns {vout, gain}. */
    double[][] sweep(Solver sv, double[] vin) {
        int n = vin.length;
        double[] out = new double[n], gain = new double[n];
        int first = 0;
        while (first < n && vin[first] < 0) first++;
        double[] v = quiescentNodes;
        double prev = 0;
        double[] guess = null;
        for (int k = first; k < n; k++) {
            v = guess != null && vin[k] - prev <= 0.5 ? sv.solve(vin[k], prev, v, guess) : step(sv, prev, v, vin[k]);
            out[k] = v[circuit.out];
            gain[k] = sv.gain(v, vin[k]);
            if (k + 1 < n) guess = sv.predict(v, vin[k + 1] - vin[k]);
            prev = vin[k];
        }
        v = quiescentNodes;
        prev = 0;
        guess = null;
        for (int k = first - 1; k >= 0; k--) {
            v = guess != null && prev - vin[k] <= 0.5 ? sv.solve(vin[k], prev, v, guess) : step(sv, prev, v, vin[k]);
            out[k] = v[circuit.out];
            gain[k] = sv.gain(v, vin[k]);
            if (k > 0) guess = sv.predict(v, vin[k - 1] - vin[k]);
            prev = vin[k];
        }
        return new double[][] {out, gain};
    }

    /** Continuation from (from, v) to target in steps of at most 0.5 V. */
    private static double[] step(Solver sv, double from, double[] v, double target) {
        int steps = Math.max(1, (int) Math.ceil(Math.abs(target - from) / 0.5));
        double prev = from;
        for (int k = 1; k <= steps; k++) {
            double x = k == steps ? target : from + (target - from) * k / steps;
            v = sv.solve(x, prev, v);
            prev = x;
        }
        return v;
    }

    /** The clip levels: the output with each half's drive at its limit (rail less the drive saturation). */
    public ClipLevels clipLevels() {
        double vinTop = params.railVolts() - params.driveSaturationVolts() + Math.abs(biasVolts) / 2;
        return new ClipLevels(operatingPoint(vinTop - inputOffsetVolts).outputVolts(), operatingPoint(-vinTop - inputOffsetVolts).outputVolts());
    }

    /**
     * The predicted distortion when the output fundamental has peak {@code outputPeakVolts}: the drive
     * amplitude is adjusted (up to five corrections) until the output fundamental is within 1e-7 of the level.
     */
    public Distortion distortion(double outputPeakVolts) {
        return distortionVersusLevel(new double[] {outputPeakVolts}).get(0);
    }

    /** THD and harmonics at each output level (peak volts). */
    public List<Distortion> distortionVersusLevel(double[] outputPeakVolts) {
        Require.notNull("outputPeakVolts", outputPeakVolts);
        double g = largeSignalGainEstimate(null);
        double maxLevel = 0;
        for (double level : outputPeakVolts) maxLevel = Math.max(maxLevel, Require.positive("outputPeakVolts", level));
        Solver sv = new Solver(circuit, settings, biasVolts, inputOffsetVolts);
        // A curve with exact gains, for cubic Hermite interpolation: finds the drive amplitude cheaply before the exact passes.
        double span = Math.min(maxLevel / g * 1.5 + 1, params.railVolts() + Math.abs(biasVolts));
        double[] gridIn = new double[2001];
        for (int k = 0; k < gridIn.length; k++) gridIn[k] = -span + 2 * span * k / (gridIn.length - 1);
        double[][] grid = sweep(sv, gridIn);
        List<Distortion> r = new ArrayList<>();
        for (double level : outputPeakVolts) r.add(distortion(sv, level, g, gridIn, grid));
        return r;
    }

    private double largeSignalGainEstimate(Solver sv) {
        double rl = params.loadOhms();
        return rl / (rl + params.emitterOhms());
    }

    private Distortion distortion(Solver sv, double level, double gEstimate, double[] gridIn, double[][] grid) {
        int n = SAMPLES_PER_CYCLE;
        double ain = level / gEstimate;
        double[] y = new double[n];
        for (int pass = 0; pass < 8; pass++) {
            double span = gridIn[gridIn.length - 1];
            if (ain >= span) break;
            for (int k = 0; k < n; k++) y[k] = hermite(gridIn, grid[0], grid[1], ain * Math.sin(2 * Math.PI * k / n));
            double a1 = Fft.amplitudes(y)[1];
            if (!(a1 > 0)) break;
            ain *= level / a1;
            if (Math.abs(a1 / level - 1) < 1e-9) break;
        }
        double[] spec = null;
        for (int pass = 0; pass < 6; pass++) {
            y = sineResponse(sv, ain);
            spec = Fft.amplitudes(y);
            double a1 = spec[1];
            if (!(a1 > 0) || Math.abs(a1 / level - 1) < 1e-7 || pass == 5) break;
            ain *= level / a1;
        }
        double a1 = spec[1];
        double sum = 0;
        for (int h = 2; h < n / 2; h++) sum += spec[h] * spec[h];
        double[] ratios = new double[n / 2];
        for (int h = 0; h < n / 2; h++) ratios[h] = spec[h] / a1;
        return new Distortion(a1, ain, ratios, Math.sqrt(sum) / a1);
    }

    /** Cubic Hermite interpolation of y(x) with slopes d on a uniform increasing grid x. */
    private static double hermite(double[] x, double[] y, double[] d, double x0) {
        int n = x.length;
        double h = (x[n - 1] - x[0]) / (n - 1);
        int i = (int) Math.floor((x0 - x[0]) / h);
        if (i < 0) i = 0;
        if (i > n - 2) i = n - 2;
        double t = (x0 - x[i]) / h, t2 = t * t, t3 = t2 * t;
        return (2 * t3 - 3 * t2 + 1) * y[i] + (t3 - 2 * t2 + t) * h * d[i] + (-2 * t3 + 3 * t2) * y[i + 1] + (t3 - t2) * h * d[i + 1];
    }

    /** Output for x_k = A·sin(2πk/N), k = 0..N−1, solving only the distinct inputs (quarter-wave symmetry of the drive). */
    private double[] sineResponse(Solver sv, double amp) {
        int n = SAMPLES_PER_CYCLE, q = n / 4;
        double[] y = new double[n];
        for (int sign = 1; sign >= -1; sign -= 2) {
            double[] v = quiescentNodes, guess = null;
            double prev = 0;
            for (int k = 0; k <= q; k++) {
                double x = sign * amp * Math.sin(2 * Math.PI * k / n);
                v = guess != null && Math.abs(x - prev) <= 0.5 ? sv.solve(x, prev, v, guess) : step(sv, prev, v, x);
                if (k < q) {
                    sv.gain(v, x);
                    guess = sv.predict(v, sign * amp * Math.sin(2 * Math.PI * (k + 1) / n) - x);
                }
                prev = x;
                double out = v[circuit.out];
                if (sign > 0) {
                    y[k] = out;
                    if (k > 0) y[n / 2 - k] = out;
                } else {
                    y[(n / 2 + k) % n] = out;
                    if (k > 0) y[(n - k) % n] = out;
                }
            }
        }
        return y;
    }

    /**
     * The bias with the flattest incremental gain through crossover at this output level (see
     * {@link OptimumBias}): a scan of the bias voltage over Vq from 0.1 mV to 200 mV, then golden-section search.
     */
    public OptimumBias optimumBias(double levelVolts) {
        Require.positive("levelVolts", levelVolts);
        double vbLo = biasFor(MIN_SEARCH_VQ_VOLTS);
        double vbHi = biasFor(MAX_SEARCH_VQ_VOLTS);
        java.util.function.DoubleUnaryOperator dev = vb -> gainDeviation(vb, levelVolts);
        double[] best = Search.scanThenGolden(dev, vbLo, vbHi, 16, 1e-6);
        StageModel at = of(params.withBias(new Bias.GeneratorVolts(best[0])), settings);
        boolean atLimit = best[0] > vbHi - 1e-3 * (vbHi - vbLo);
        return new OptimumBias(at.vqVolts(), best[0], best[1], levelVolts, atLimit);
    }

    /** Lower and upper ends of the bias searched by {@link #optimumBias} and by the fit, as Vq. */
    static final double MIN_SEARCH_VQ_VOLTS = 1e-4, MAX_SEARCH_VQ_VOLTS = 0.2;

    /** The bias voltage that gives this Vq. */
    double biasFor(double vqVolts) { return of(params.withBias(new Bias.EmitterDropVolts(vqVolts)), settings).biasVolts; }

    /** A 301-point input grid dense near zero spanning ±span. */
    static double[] denseGrid(double span) {
        double[] vin = new double[301];
        for (int k = 0; k < vin.length; k++) {
            double u = -1 + 2.0 * k / (vin.length - 1);
            vin[k] = span * (0.25 * u + 0.75 * u * u * u);
        }
        return vin;
    }

    /** {vout, gain} on the given ascending inputs, for this stage at bias voltage vb (package use: the fit). */
    double[][] curveAtBias(double vb, double[] vin) {
        StageModel at = of(params.withBias(new Bias.GeneratorVolts(vb)), settings);
        return at.sweep(new Solver(at.circuit, settings, vb, at.inputOffsetVolts), vin);
    }

    /** This stage at bias voltage vb (package use: the fit, which solves several curves at one bias). */
    StageModel atBias(double vb) { return of(params.withBias(new Bias.GeneratorVolts(vb)), settings); }

    /** {vout, gain} on the given ascending inputs at this stage's own bias (package use: the fit). */
    double[][] curve(double[] vin) { return sweep(new Solver(circuit, settings, biasVolts, inputOffsetVolts), vin); }

    /** max |g/g_L − 1| over |Vout| ≤ level for bias voltage vb (a 301-point curve, dense near zero). */
    double gainDeviation(double vb, double level) {
        StageModel at;
        try {
            at = of(params.withBias(new Bias.GeneratorVolts(vb)), settings);
        } catch (SolverFailureException e) {
            return Double.POSITIVE_INFINITY;
        }
        double g0 = largeSignalGainEstimate(null);
        double span = level / g0 * 1.05;
        double[] vin = denseGrid(span);
        Solver sv = new Solver(at.circuit, settings, vb, at.inputOffsetVolts);
        double[][] r = at.sweep(sv, vin);
        double gp = Interp.at(r[0], r[1], level), gm = Interp.at(r[0], r[1], -level);
        double gl = (gp + gm) / 2;
        double worst = 0;
        for (int k = 0; k < vin.length; k++)
            if (Math.abs(r[0][k]) <= level) worst = Math.max(worst, Math.abs(r[1][k] / gl - 1));
        return worst;
    }

    /**
     * Thermal sensitivity of the quiescent current when the bias generator tracks {@code trackedJunctions}
     * of the bias loop's junctions (see {@link ThermalSensitivity}). dIq/dVbias comes from the Jacobian, with the output
     * held at 0 V at rest (the input offset follows, as global feedback makes it).
     */
    public ThermalSensitivity thermalSensitivity(int trackedJunctions) {
        int loop = params.topology().junctionsInBiasLoop();
        Require.inRange("trackedJunctions", trackedJunctions, 0, loop);
        Solver sv = new Solver(circuit, settings, biasVolts, inputOffsetVolts);
        // With the rest point held at Vout = 0 (global feedback), a change of bias also moves the input offset:
        // dv/dVb|Vout=0 = dv/dVb − dv/dVin · (dVout/dVb)/(dVout/dVin). Zero correction for a symmetric stage.
        double gIn = sv.gain(quiescentNodes, 0);
        double[] dIn = sv.inputSensitivity();
        double dOutdVb = sv.biasDerivative(quiescentNodes, 0);
        double[] dv = sv.lastBiasDerivative.clone();
        if (gIn > 0) for (int k = 0; k < dv.length; k++) dv[k] -= dIn[k] * dOutdVb / gIn;
        Circuit.Resistor rt = circuit.resistors.get(circuit.emitterResistorTop);
        Circuit.Resistor rb = circuit.resistors.get(circuit.emitterResistorBottom);
        double dTop = (dv[rt.a()] - dv[rt.b()]) / rt.ohms();
        double dBot = -(dv[rb.a()] - dv[rb.b()]) / rb.ohms();
        double didv = (dTop + dBot) / 2;
        double perJunction = -ThermalSensitivity.JUNCTION_TEMPCO_VOLTS_PER_KELVIN;
        return new ThermalSensitivity(loop, trackedJunctions, quiescentAmps(), didv, didv * perJunction * loop,
                didv * perJunction * (loop - trackedJunctions));
    }
}

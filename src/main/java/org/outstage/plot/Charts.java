package org.outstage.plot;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import java.util.OptionalDouble;
import org.outstage.Require;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.TransferCurve;

/**
 * Builders of the standard Outstage charts from results. They only arrange numbers that analysis or the
 * model produced (and evaluate a fitted sine at the sample instants); they compute no figure.
 */
public final class Charts {
    private Charts() {}

    /** Time axis values {@code start + i/fs}. */
    static double[] timeAxis(int n, double sampleRateHz, double startSeconds) {
        double[] t = new double[n];
        for (int i = 0; i < n; i++) t[i] = startSeconds + i / sampleRateHz;
        return t;
    }

    /**
     * The waveform with its fitted fundamental overlaid.
     *
     * @param samples      the record (or an excerpt), in {@code unit}
     * @param startSeconds time of the first sample from the start of the record the fit refers to
     * @param fit          the sine fit (t = 0 at the first sample of the record), or empty
     */
    public static ChartSpec waveform(String title, double[] samples, double sampleRateHz, double startSeconds, String unit,
                                     Optional<SineFit> fit) {
        Require.positive("sampleRateHz", sampleRateHz);
        double[] t = timeAxis(samples.length, sampleRateHz, startSeconds);
        List<Series> s = new ArrayList<>();
        s.add(new Series("capture", t, samples, Series.Style.LINE, Series.Role.MEASURED));
        fit.filter(f -> Double.isFinite(f.amplitudePeak())).ifPresent(f -> {
            double[] y = new double[t.length];
            for (int i = 0; i < t.length; i++) y[i] = f.valueAt(t[i]);
            s.add(new Series("fitted fundamental", t, y, Series.Style.LINE, Series.Role.FIT));
        });
        return ChartSpec.of(title, firstCycles(t, fit), Axis.linear("Output", unit), s);
    }

    /** Cycles shown at first on a time chart; zooming out shows the rest of the record. */
    public static final int CYCLES_SHOWN = 4;

    /** Time axis showing the first {@link #CYCLES_SHOWN} cycles of the fitted frequency, or everything without a fit. */
    static Axis firstCycles(double[] t, Optional<SineFit> fit) {
        Axis a = Axis.linear("Time", "s");
        if (t.length < 2 || fit.isEmpty() || !(fit.get().frequencyHz() > 0)) return a;
        double end = t[0] + CYCLES_SHOWN / fit.get().frequencyHz();
        return end < t[t.length - 1] ? a.withRange(t[0], end) : a;
    }

    /**
     * The residual (record minus fitted fundamental), scaled to fill the chart; the title states the
     * magnification relative to the waveform chart (the fundamental's peak over the residual's peak,
     * rounded down to 1, 2 or 5 × 10^k). The time axis starts on the first few cycles of {@code fundamentalHz}
     * (NaN: the whole record), like the waveform chart.
     */
    public static ChartSpec residual(String title, double[] residual, double sampleRateHz, double startSeconds, String unit,
                                     double fundamentalPeak, double fundamentalHz) {
        double[] t = timeAxis(residual.length, sampleRateHz, startSeconds);
        double peak = 0;
        for (double r : residual) if (Double.isFinite(r)) peak = Math.max(peak, Math.abs(r));
        String mag = "";
        if (peak > 0 && Double.isFinite(fundamentalPeak) && fundamentalPeak > peak) {
            double m = fundamentalPeak / peak;
            double p = Math.pow(10, Math.floor(Math.log10(m)));
            double nice = m / p >= 5 ? 5 : m / p >= 2 ? 2 : 1;
            mag = String.format(java.util.Locale.ROOT, " (magnified ×%s)", Ticks.format(nice * p, nice * p).replace("k", " 000").replace("M", " 000 000"));
        }
        return ChartSpec.of(title + mag, fundamentalHz > 0 && Double.isFinite(fundamentalHz)
                        ? firstCycles(t, Optional.of(new SineFit(fundamentalHz, 1, 0, 0, 0, 0, true))) : Axis.linear("Time", "s"),
                Axis.linear("Residual", unit),
                List.of(new Series("capture − fitted fundamental", t, residual, Series.Style.LINE, Series.Role.RESIDUAL)));
    }

    /** Harmonic markers H2…HN from measured orders, frequencies and levels (levels on the spectrum's dB scale). */
    public static List<Marker> harmonicMarkers(int[] orders, double[] frequencyHz, double[] levelDb) {
        Require.that(orders.length == frequencyHz.length && orders.length == levelDb.length, "harmonic arrays differ in length");
        List<Marker> m = new ArrayList<>();
        for (int i = 0; i < orders.length; i++)
            if (Double.isFinite(frequencyHz[i]) && Double.isFinite(levelDb[i]) && frequencyHz[i] > 0)
                m.add(new Marker(frequencyHz[i], levelDb[i], "H" + orders[i]));
        return m;
    }

    /**
     * Spectrum in dB against log frequency with a decade grid, harmonic markers, the measurement band
     * shaded and the noise floor as a line.
     *
     * @param levelUnit "dBV" for a calibrated capture, "dBFS" otherwise, or "dB re fundamental"
     */
    public static ChartSpec spectrum(String title, double[] frequencyHz, double[] levelDb, String levelUnit, List<Marker> harmonics,
                                     Optional<Range> band, OptionalDouble noiseFloorDb) {
        List<Series> s = List.of(new Series("spectrum", frequencyHz, levelDb, Series.Style.LINE, Series.Role.MEASURED));
        List<Band> bands = band.map(b -> List.of(new Band(b.min(), b.max(), "measurement band"))).orElse(List.of());
        List<HorizontalLine> lines = noiseFloorDb.isPresent() && Double.isFinite(noiseFloorDb.getAsDouble())
                ? List.of(new HorizontalLine(noiseFloorDb.getAsDouble(), "noise floor", Series.Role.LIMIT)) : List.of();
        double fMax = 0, fMin = Double.POSITIVE_INFINITY, lMin = Double.POSITIVE_INFINITY, lMax = Double.NEGATIVE_INFINITY;
        for (int i = 0; i < frequencyHz.length; i++) {
            if (frequencyHz[i] > 0) { fMax = Math.max(fMax, frequencyHz[i]); fMin = Math.min(fMin, frequencyHz[i]); }
            if (Double.isFinite(levelDb[i])) { lMin = Math.min(lMin, levelDb[i]); lMax = Math.max(lMax, levelDb[i]); }
        }
        Axis x = Axis.log("Frequency", "Hz");
        if (fMax > 0) x = x.withRange(Math.max(fMin, Math.min(10, fMax / 10)), fMax);
        Axis y = Axis.db("Level", levelUnit);
        if (lMax > lMin) {
            double top = Math.ceil((lMax + 5) / 10) * 10;
            double bottom = Math.max(Math.floor((lMin - 5) / 10) * 10, top - 200);
            y = y.withRange(bottom, top);
        }
        return new ChartSpec(title, x, y, s, harmonics, bands, lines);
    }

    /**
     * Harmonic profile: one bar per harmonic, odd orders and even orders in two colours so the pattern
     * (odd tail = crossover, even = asymmetry) is plain to see. Levels in dB re fundamental (dBc).
     */
    public static ChartSpec harmonicProfile(String title, int[] orders, double[] levelDbc) {
        boolean[] all = new boolean[orders.length];
        java.util.Arrays.fill(all, true);
        return harmonicProfile(title, orders, levelDbc, all);
    }

    /**
     * As {@link #harmonicProfile(String, int[], double[])}, with the harmonics that do not stand above the noise in
     * their bins ({@code resolved[i]} false: the CLI prints them "&lt;", an upper bound) drawn apart: not as bars but
     * as points at their upper bound, in a series named "&lt; not above the noise (upper bound)".
     */
    public static ChartSpec harmonicProfile(String title, int[] orders, double[] levelDbc, boolean[] resolved) {
        Require.that(orders.length == levelDbc.length && orders.length == resolved.length, "orders and levels differ in length");
        List<double[]> below = new ArrayList<>();
        for (int i = 0; i < orders.length; i++)
            if (!resolved[i] && Double.isFinite(levelDbc[i])) below.add(new double[] {orders[i], levelDbc[i]});
        List<double[]> odd = new ArrayList<>(), even = new ArrayList<>();
        double lo = 0;
        int maxOrder = 2;
        for (int i = 0; i < orders.length; i++) {
            if (!Double.isFinite(levelDbc[i])) continue;
            if (resolved[i]) (orders[i] % 2 == 1 ? odd : even).add(new double[] {orders[i], levelDbc[i]});
            lo = Math.min(lo, levelDbc[i]);
            maxOrder = Math.max(maxOrder, orders[i]);
        }
        double bottom = Math.min(-60, Math.floor((lo - 10) / 20) * 20);
        double top = 0;
        for (int i = 0; i < levelDbc.length; i++) if (Double.isFinite(levelDbc[i])) top = Math.max(top, levelDbc[i]);
        top = Math.ceil((top + 1) / 10) * 10;
        List<Series> s = new ArrayList<>();
        s.add(bars("odd harmonics", odd, Series.Role.MEASURED));
        s.add(bars("even harmonics", even, Series.Role.MEASURED_ALT));
        if (!below.isEmpty()) {
            double[] bx = new double[below.size()], by = new double[below.size()];
            for (int i = 0; i < bx.length; i++) { bx[i] = below.get(i)[0]; by[i] = below.get(i)[1]; }
            s.add(new Series("< not above the noise (upper bound)", bx, by, Series.Style.POINTS, Series.Role.RESIDUAL));
        }
        return ChartSpec.of(title, Axis.linear("Harmonic order", "").withRange(1.4, maxOrder + 0.6),
                Axis.db("Level", "dBc").withRange(bottom, Math.max(top, bottom + 10)), s);
    }

    private static Series bars(String name, List<double[]> pts, Series.Role role) {
        double[] x = new double[pts.size()], y = new double[pts.size()];
        for (int i = 0; i < pts.size(); i++) { x[i] = pts.get(i)[0]; y[i] = pts.get(i)[1]; }
        return new Series(name, x, y, Series.Style.BARS, role);
    }

    /**
     * Deviation of a curve's incremental gain from its average gain, in percent, against output voltage:
     * {@code 100·(g(v)/ḡ − 1)} with {@code ḡ = (out_max − out_min)/(in_max − in_min)} (the end-to-end
     * slope). A crossover notch shows as a dip around 0 V, gm-doubling as a bump.
     */
    public static double[][] gainDeviationPercent(TransferCurve c) {
        double[] in = c.inputVolts(), out = c.outputVolts(), g = c.incrementalGain();
        int n = in.length;
        double mean = (out[n - 1] - out[0]) / (in[n - 1] - in[0]);
        double[] dev = new double[n];
        for (int i = 0; i < n; i++) dev[i] = mean != 0 && Double.isFinite(g[i]) ? 100 * (g[i] / mean - 1) : Double.NaN;
        return new double[][] {out, dev};
    }

    /** Measured gain deviation against output voltage, overlaid on a model's prediction when there is one. */
    public static ChartSpec transfer(String title, TransferCurve measured, Optional<TransferCurve> model, String modelName) {
        List<Series> s = new ArrayList<>();
        double[][] m = gainDeviationPercent(measured);
        s.add(new Series("measured", m[0], m[1], Series.Style.LINE, Series.Role.MEASURED));
        model.ifPresent(c -> {
            double[][] p = gainDeviationPercent(c);
            s.add(new Series("model: " + modelName, p[0], p[1], Series.Style.LINE, Series.Role.MODEL));
        });
        return ChartSpec.of(title, Axis.linear("Output", measured.unit()), Axis.linear("Incremental gain deviation", "%"), s);
    }

    /** A model's prediction alone (when no measured curve exists yet). */
    public static ChartSpec transferModelOnly(String title, TransferCurve model, String modelName) {
        double[][] p = gainDeviationPercent(model);
        return ChartSpec.of(title, Axis.linear("Output", model.unit()), Axis.linear("Incremental gain deviation", "%"),
                List.of(new Series("model: " + modelName, p[0], p[1], Series.Style.LINE, Series.Role.MODEL)));
    }

    /**
     * THD and THD+N against output power on log-log axes, with the distortion limit (for example 1 %) as a
     * line. Ratios are given as fractions and shown in percent.
     */
    public static ChartSpec levelSweep(String title, double[] powerWatts, double[] thd, double[] thdN, double limitFraction) {
        return levelSweeps(title, List.of(new SweepLine("", powerWatts, thd, thdN)), limitFraction);
    }

    /** One named level series for {@link #levelSweeps}: power (W), THD and THD+N (fractions), sorted by power. */
    public record SweepLine(String name, double[] powerWatts, double[] thd, double[] thdN) {}

    /**
     * THD and THD+N against output power for several NAMED series, each its own pair of lines (never joined), with
     * a point marker at each capture (a {@link Series.Style#POINTS} twin of each line, after all the lines) and the THD limit as a line.
     * With one series the names are plain "THD" / "THD+N"; with several, "NAME: THD".
     */
    public static ChartSpec levelSweeps(String title, List<SweepLine> lines, double limitFraction) {
        Require.that(!lines.isEmpty(), "a level-sweep chart needs at least one series");
        List<Series> series = new java.util.ArrayList<>(), markers = new java.util.ArrayList<>();
        for (SweepLine l : lines) {
            Require.that(l.powerWatts().length == l.thd().length && l.thd().length == l.thdN().length, "sweep arrays differ in length");
            double[] a = new double[l.thd().length], b = new double[l.thdN().length];
            for (int i = 0; i < a.length; i++) { a[i] = l.thd()[i] * 100; b[i] = l.thdN()[i] * 100; }
            String prefix = lines.size() == 1 ? "" : l.name() + ": ";
            series.add(new Series(prefix + "THD", l.powerWatts(), a, Series.Style.LINE, Series.Role.MEASURED));
            series.add(new Series(prefix + "THD+N", l.powerWatts(), b, Series.Style.LINE, Series.Role.MEASURED_ALT));
            markers.add(new Series(prefix + "THD (captures)", l.powerWatts(), a, Series.Style.POINTS, Series.Role.MEASURED));
            markers.add(new Series(prefix + "THD+N (captures)", l.powerWatts(), b, Series.Style.POINTS, Series.Role.MEASURED_ALT));
        }
        series.addAll(markers);
        String lim = Ticks.withUnit(limitFraction * 100, "%").replaceAll("\\.?0+ %", " %");
        return new ChartSpec(title, Axis.log("Output power", "W"), Axis.log("Distortion", "%"), series,
                List.of(), List.of(), List.of(new HorizontalLine(limitFraction * 100, lim + " limit", Series.Role.LIMIT)));
    }
}

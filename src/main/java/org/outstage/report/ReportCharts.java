package org.outstage.report;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import org.outstage.analysis.stage.LevelSeries;
import org.outstage.logbook.BiasAdvice;
import org.outstage.logbook.StepPoint;
import org.outstage.plot.Axis;
import org.outstage.plot.Band;
import org.outstage.plot.ChartSpec;
import org.outstage.plot.Charts;
import org.outstage.plot.HorizontalLine;
import org.outstage.plot.Series;
import org.outstage.verify.Limit;
import org.outstage.verify.Quantity;
import org.outstage.verify.VerificationResult;

/**
 * The charts of a verification report, described once in {@code plot} (as the workbench draws them) and
 * rendered by {@link SvgRenderer}.
 */
public final class ReportCharts {
    private ReportCharts() {}

    static final int WIDTH = 760;
    static final int HEIGHT = 420;

    /**
     * THD and THD+N against output power, one pair of lines per NAMED level series ({@code series=} in the
     * calibration notes; built by {@link org.outstage.analysis.stage.LevelSeries}), with the power limit's THD
     * threshold (1 % without a power limit) as a line. Captures outside a named series (bias steps, scope exports,
     * generator channels) are never drawn here. Empty when no series has two points.
     */
    public static List<String> forVerification(VerificationResult result, List<LevelSeries.Named> series) {
        Limit power = null;
        for (var r : result.results()) if (r.limit().quantity() == Quantity.POWER) power = r.limit();
        List<Charts.SweepLine> lines = new ArrayList<>();
        for (LevelSeries.Named n : series) {
            var pts = n.sweep().points();
            if (pts.size() < 2) continue;
            double[] p = new double[pts.size()], thd = new double[pts.size()], thdN = new double[pts.size()];
            for (int i = 0; i < p.length; i++) {
                p[i] = pts.get(i).powerWatts();
                thd[i] = pts.get(i).thdRatio();
                thdN[i] = pts.get(i).thdNRatio();
            }
            lines.add(new Charts.SweepLine(n.name(), p, thd, thdN));
        }
        if (lines.isEmpty()) return List.of();
        double threshold = power != null ? power.thdThreshold().getAsDouble() : 0.01;
        return List.of(SvgRenderer.render(Charts.levelSweeps("Distortion against output power", lines, threshold), WIDTH, HEIGHT));
    }

    /**
     * The spec-sheet charts of a verification (issue 12): for each capture reading, the IMD products, the hum lines
     * with the noise level, the swept response (gain with the −3 dB points, phase, THD against frequency).
     */
    public static List<String> forSpecSheet(List<org.outstage.verify.SpecReading> readings) {
        List<String> out = new ArrayList<>();
        for (var r : readings) {
            String name = r.captureName() + " ch" + r.channel();
            r.imd().ifPresent(i -> out.add(SvgRenderer.render(org.outstage.plot.SpecSheetCharts.intermodulation(name, i), WIDTH, HEIGHT)));
            r.noise().ifPresent(n -> out.add(SvgRenderer.render(org.outstage.plot.SpecSheetCharts.hum(name, n, r.unit()), WIDTH, HEIGHT)));
            r.response().ifPresent(f -> {
                out.add(SvgRenderer.render(org.outstage.plot.SpecSheetCharts.responseGain(name, f), WIDTH, HEIGHT));
                out.add(SvgRenderer.render(org.outstage.plot.SpecSheetCharts.responsePhase(name, f), WIDTH, HEIGHT));
                org.outstage.plot.SpecSheetCharts.thdVsFrequency(name, f).ifPresent(c -> out.add(SvgRenderer.render(c, WIDTH, HEIGHT)));
            });
        }
        return out;
    }

    /**
     * The trend of a bias session against the reading: the crossover ratio the advice reads (gain at zero against the
     * large-current gain, {@code KeyFigures.crossoverReading()}; equal readings averaged), drawn as the same interpolant
     * the advice uses (linear in ln(reading) between steps, {@code analysis.stage.BiasCriterion}), so the shaded
     * recommended range ends exactly where the line crosses the band's limits; and THD. Steps in another unit than the
     * advice's are left out. Empty without two readings that carry figures.
     */
    public static List<String> forBiasSession(List<StepPoint> steps, BiasAdvice advice, double tolerance) {
        List<String> out = new ArrayList<>();
        for (ChartSpec c : biasSessionCharts(steps, advice, tolerance)) out.add(SvgRenderer.render(c, WIDTH, HEIGHT));
        return out;
    }

    /** The chart descriptions behind {@link #forBiasSession} (crossover ratio, THD); empty without two readings with figures. */
    public static List<ChartSpec> biasSessionCharts(List<StepPoint> steps, BiasAdvice advice, double tolerance) {
        java.util.TreeMap<Double, double[]> acc = new java.util.TreeMap<>();
        for (StepPoint s : steps) {
            if (s.reading().unit() != advice.unit() || s.figures().isEmpty() || s.figures().get().crossoverReading().isEmpty()) continue;
            double[] a = acc.computeIfAbsent(s.reading().value(), k -> new double[3]);
            a[0] += s.figures().get().crossoverReading().getAsDouble();
            a[1] += s.figures().get().thdRatio() * 100;
            a[2]++;
        }
        if (acc.size() < 2) return List.of();
        int n = acc.size();
        double[] b = new double[n], r = new double[n], thd = new double[n];
        int i = 0;
        boolean log = true;
        for (var e : acc.entrySet()) {
            b[i] = e.getKey();
            r[i] = e.getValue()[0] / e.getValue()[2];
            thd[i] = e.getValue()[1] / e.getValue()[2];
            log &= b[i] > 0;
            i++;
        }
        int sub = 64;
        double[] bx = new double[(n - 1) * sub + 1], ry = new double[bx.length];
        for (int k = 0; k + 1 < n; k++) {
            for (int j = 0; j < sub; j++) {
                double t = (double) j / sub;
                bx[k * sub + j] = log ? Math.exp(Math.log(b[k]) + t * (Math.log(b[k + 1]) - Math.log(b[k]))) : b[k] + t * (b[k + 1] - b[k]);
                ry[k * sub + j] = r[k] + t * (r[k + 1] - r[k]);
            }
        }
        bx[bx.length - 1] = b[n - 1];
        ry[ry.length - 1] = r[n - 1];
        String unit = advice.unit().symbol();
        Axis x = Axis.linear("Bias reading", unit);
        List<Band> bands = advice.low().isPresent()
                ? List.of(new Band(advice.low().getAsDouble(), advice.high().getAsDouble(), "recommended")) : List.of();
        ChartSpec gain = new ChartSpec("Crossover ratio against the bias reading", x, Axis.linear("Crossover ratio (gain at zero / large-current gain)", ""),
                List.of(new Series("crossover ratio", bx, ry, Series.Style.LINE, Series.Role.MEASURED)), List.of(), bands,
                List.of(new HorizontalLine(1 + tolerance, "gm-doubling above", Series.Role.LIMIT),
                        new HorizontalLine(1 - tolerance, "notch below", Series.Role.LIMIT)));
        ChartSpec dist = new ChartSpec("THD against the bias reading", x, Axis.log("THD", "%"),
                List.of(new Series("THD", b, thd, Series.Style.LINE, Series.Role.MEASURED)), List.of(), bands, List.of());
        return List.of(gain, dist);
    }
}

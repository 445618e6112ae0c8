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
     * The trend of a bias session against the reading: gain at zero (with the near-optimal band as lines and the
     * recommended range shaded) and THD. Steps in another unit than the advice's are left out. Empty without
     * two steps that carry figures.
     */
    public static List<String> forBiasSession(List<StepPoint> steps, BiasAdvice advice, double tolerance) {
        List<StepPoint> pts = new ArrayList<>();
        for (StepPoint s : steps) {
            if (s.reading().unit() == advice.unit() && s.figures().isPresent() && s.figures().get().gainAtZero().isPresent()) pts.add(s);
        }
        if (pts.size() < 2) return List.of();
        pts.sort(Comparator.comparingDouble(s -> s.reading().value()));
        double[] b = new double[pts.size()];
        double[] g = new double[pts.size()];
        double[] thd = new double[pts.size()];
        for (int i = 0; i < b.length; i++) {
            b[i] = pts.get(i).reading().value();
            g[i] = pts.get(i).figures().get().gainAtZero().getAsDouble();
            thd[i] = pts.get(i).figures().get().thdRatio() * 100;
        }
        String unit = advice.unit().symbol();
        Axis x = Axis.linear("Bias reading", unit);
        List<Band> bands = advice.low().isPresent()
                ? List.of(new Band(advice.low().getAsDouble(), advice.high().getAsDouble(), "recommended")) : List.of();
        ChartSpec gain = new ChartSpec("Gain at zero against the bias reading", x, Axis.linear("Gain at zero", ""),
                List.of(new Series("gain at zero", b, g, Series.Style.LINE, Series.Role.MEASURED)), List.of(), bands,
                List.of(new HorizontalLine(1 + tolerance, "gm-doubling above", Series.Role.LIMIT),
                        new HorizontalLine(1 - tolerance, "notch below", Series.Role.LIMIT)));
        ChartSpec dist = new ChartSpec("THD against the bias reading", x, Axis.log("THD", "%"),
                List.of(new Series("THD", b, thd, Series.Style.LINE, Series.Role.MEASURED)), List.of(), bands, List.of());
        return List.of(SvgRenderer.render(gain, WIDTH, HEIGHT), SvgRenderer.render(dist, WIDTH, HEIGHT));
    }
}

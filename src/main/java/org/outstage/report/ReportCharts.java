package org.outstage.report;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import org.outstage.logbook.BiasAdvice;
import org.outstage.logbook.StepPoint;
import org.outstage.plot.Axis;
import org.outstage.plot.Band;
import org.outstage.plot.ChartSpec;
import org.outstage.plot.Charts;
import org.outstage.plot.HorizontalLine;
import org.outstage.plot.Series;
import org.outstage.verify.Limit;
import org.outstage.verify.MeasuredChannel;
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
     * THD and THD+N against output power for the captures of the power limit's frequency and load (or all
     * captures with a power when the spec has no power limit), with the THD threshold as a line. Empty when
     * fewer than two captures have a power.
     */
    public static List<String> forVerification(VerificationResult result, List<MeasuredChannel> channels) {
        Limit power = null;
        for (var r : result.results()) if (r.limit().quantity() == Quantity.POWER) power = r.limit();
        List<MeasuredChannel> pts = new ArrayList<>();
        for (MeasuredChannel c : channels) {
            var f = c.figures();
            if (f.powerWatts().isEmpty() || !(f.powerWatts().getAsDouble() > 0) || !(f.thdRatio() > 0) || !(f.thdNRatio() > 0)) continue;
            if (power != null && power.frequencyHz().isPresent()
                    && Math.abs(f.fundamentalHz() - power.frequencyHz().getAsDouble()) > result.spec().frequencyTolerance() * power.frequencyHz().getAsDouble()) {
                continue;
            }
            if (power != null && power.loadOhms().isPresent()
                    && (f.loadOhms().isEmpty() || Math.abs(f.loadOhms().getAsDouble() - power.loadOhms().getAsDouble()) > 0.01 * power.loadOhms().getAsDouble())) {
                continue;
            }
            pts.add(c);
        }
        if (pts.size() < 2) return List.of();
        pts.sort(Comparator.comparingDouble(c -> c.figures().powerWatts().getAsDouble()));
        double[] p = new double[pts.size()];
        double[] thd = new double[pts.size()];
        double[] thdN = new double[pts.size()];
        for (int i = 0; i < p.length; i++) {
            p[i] = pts.get(i).figures().powerWatts().getAsDouble();
            thd[i] = pts.get(i).figures().thdRatio();
            thdN[i] = pts.get(i).figures().thdNRatio();
        }
        double threshold = power != null ? power.thdThreshold().getAsDouble() : 0.01;
        return List.of(SvgRenderer.render(Charts.levelSweep("Distortion against output power", p, thd, thdN, threshold), WIDTH, HEIGHT));
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

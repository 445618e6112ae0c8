package org.outstage.plot;

import java.util.List;
import java.util.Objects;

/**
 * A complete, renderer-neutral description of one chart: the SVG renderer in {@code report} and the
 * canvas in {@code ui} draw the same spec, so the report shows what the screen showed.
 *
 * @param title   chart title
 * @param xAxis   horizontal axis
 * @param yAxis   vertical axis
 * @param series  data series, drawn in order (later ones on top)
 * @param markers labelled points
 * @param bands   shaded x spans (drawn behind the data)
 * @param lines   horizontal reference lines
 */
public record ChartSpec(String title, Axis xAxis, Axis yAxis, List<Series> series, List<Marker> markers,
                        List<Band> bands, List<HorizontalLine> lines) {
    public ChartSpec {
        Objects.requireNonNull(title, "title");
        Objects.requireNonNull(xAxis, "xAxis");
        Objects.requireNonNull(yAxis, "yAxis");
        series = List.copyOf(series);
        markers = List.copyOf(markers);
        bands = List.copyOf(bands);
        lines = List.copyOf(lines);
    }

    /** A chart with series only. */
    public static ChartSpec of(String title, Axis xAxis, Axis yAxis, List<Series> series) {
        return new ChartSpec(title, xAxis, yAxis, series, List.of(), List.of(), List.of());
    }

    /** The x range to draw: the axis's fixed range, or the extent of the data. */
    public Range xRange() {
        if (xAxis.range().isPresent()) return xAxis.range().get();
        Extent e = new Extent(xAxis.scale() == Axis.Scale.LOG10);
        for (Series s : series) e.addAll(s.xRaw());
        for (Marker m : markers) e.add(m.x());
        return e.range(false);
    }

    /** The y range to draw: the axis's fixed range, or the extent of the data (and lines) with a small margin. */
    public Range yRange() {
        if (yAxis.range().isPresent()) return yAxis.range().get();
        Extent e = new Extent(yAxis.scale() == Axis.Scale.LOG10);
        for (Series s : series) {
            e.addAll(s.yRaw());
            if (s.style() == Series.Style.BARS && yAxis.scale() == Axis.Scale.LINEAR) e.add(0);
        }
        for (Marker m : markers) e.add(m.y());
        for (HorizontalLine l : lines) e.add(l.y());
        return e.range(true);
    }

    /** Running min/max of finite values (positive only for a log axis). */
    static final class Extent {
        private final boolean log;
        double min = Double.POSITIVE_INFINITY;
        double max = Double.NEGATIVE_INFINITY;

        Extent(boolean log) { this.log = log; }

        void add(double v) {
            if (!Double.isFinite(v) || (log && v <= 0)) return;
            if (v < min) min = v;
            if (v > max) max = v;
        }

        void addAll(double[] values) { for (double v : values) add(v); }

        Range range(boolean margin) {
            if (min > max) return log ? new Range(1, 10) : new Range(0, 1);
            if (log) {
                double lo = min, hi = max;
                if (hi / lo < 1.0001) { lo /= 2; hi *= 2; }
                if (margin) { lo /= 1.2; hi *= 1.2; }
                return new Range(lo, hi);
            }
            double lo = min, hi = max;
            if (hi - lo <= Math.abs(hi) * 1e-12 || hi == lo) {
                double d = hi == 0 ? 1 : Math.abs(hi) * 0.1;
                lo -= d;
                hi += d;
            }
            if (margin) {
                double pad = (hi - lo) * 0.05;
                lo -= pad;
                hi += pad;
            }
            return new Range(lo, hi);
        }
    }
}

package org.outstage.report;

import java.util.List;
import java.util.Locale;
import org.outstage.Require;
import org.outstage.plot.Axis;
import org.outstage.plot.Band;
import org.outstage.plot.ChartLayout;
import org.outstage.plot.ChartSpec;
import org.outstage.plot.Decimator;
import org.outstage.plot.HorizontalLine;
import org.outstage.plot.Marker;
import org.outstage.plot.Palette;
import org.outstage.plot.Range;
import org.outstage.plot.Series;
import org.outstage.plot.Ticks;
import org.outstage.plot.Viewport;

/**
 * Draws a {@link ChartSpec} as a self-contained SVG 1.1 document (no scripts, no external fonts or
 * styles): plot area, grid (decade grid with 2…9 minor lines on log axes), tick labels with SI prefixes,
 * axis titles with units, shaded bands, series, horizontal lines, markers and a legend. Long series are
 * reduced with {@link Decimator} to two points per pixel column first, so a million-sample waveform
 * becomes a few thousand path points with its peaks intact. Pure and thread-safe.
 */
public final class SvgRenderer {
    private SvgRenderer() {}

    public static String render(ChartSpec spec, int width, int height) {
        Require.atLeast("width", width, 120);
        Require.atLeast("height", height, 100);
        Viewport vp = ChartLayout.viewport(spec, width, height);
        StringBuilder sb = new StringBuilder(64_000);
        sb.append("<svg xmlns=\"http://www.w3.org/2000/svg\" version=\"1.1\" width=\"").append(width)
                .append("\" height=\"").append(height).append("\" viewBox=\"0 0 ").append(width).append(' ').append(height)
                .append("\" font-family=\"DejaVu Sans, Verdana, sans-serif\" font-size=\"").append(f(ChartLayout.FONT_SIZE)).append("\">\n");
        sb.append("<title>").append(esc(spec.title())).append("</title>\n");
        sb.append("<rect width=\"100%\" height=\"100%\" fill=\"").append(Palette.BACKGROUND).append("\"/>\n");
        double l = vp.left(), t = vp.top(), w = vp.width(), h = vp.height();
        sb.append("<rect x=\"").append(f(l)).append("\" y=\"").append(f(t)).append("\" width=\"").append(f(w))
                .append("\" height=\"").append(f(h)).append("\" fill=\"").append(Palette.PLOT_AREA).append("\"/>\n");
        // deterministic, and distinct between charts inlined in one HTML page (same output for the same chart)
        String clip = "plot" + Integer.toHexString(java.util.Objects.hash(spec.title(), width, height, spec.series().size(), spec.xAxis(), spec.yAxis()));
        sb.append("<defs><clipPath id=\"").append(clip).append("\"><rect x=\"").append(f(l)).append("\" y=\"").append(f(t))
                .append("\" width=\"").append(f(w)).append("\" height=\"").append(f(h)).append("\"/></clipPath></defs>\n");

        // bands
        sb.append("<g clip-path=\"url(#").append(clip).append(")\">\n");
        for (Band b : spec.bands()) {
            double x0 = clampPx(vp.px(Math.max(b.fromX(), spec.xAxis().scale() == Axis.Scale.LOG10 ? vp.x().min() : b.fromX())), l, l + w);
            double x1 = clampPx(vp.px(b.toX()), l, l + w);
            if (x1 > x0) sb.append("<rect x=\"").append(f(x0)).append("\" y=\"").append(f(t)).append("\" width=\"").append(f(x1 - x0))
                    .append("\" height=\"").append(f(h)).append("\" fill=\"").append(Palette.BAND).append("\"/>\n");
        }
        sb.append("</g>\n");

        // grid and ticks
        List<Ticks.Tick> xt = Ticks.of(vp.x(), spec.xAxis().scale(), ChartLayout.tickTarget(w, true), spec.xAxis().unit());
        List<Ticks.Tick> yt = Ticks.of(vp.y(), spec.yAxis().scale(), ChartLayout.tickTarget(h, false), spec.yAxis().unit());
        sb.append("<g stroke-width=\"1\">\n");
        for (Ticks.Tick k : xt) {
            double x = vp.px(k.value());
            sb.append("<line x1=\"").append(f(x)).append("\" y1=\"").append(f(t)).append("\" x2=\"").append(f(x)).append("\" y2=\"").append(f(t + h))
                    .append("\" stroke=\"").append(k.major() ? Palette.GRID_MAJOR : Palette.GRID_MINOR).append("\"/>\n");
        }
        for (Ticks.Tick k : yt) {
            double y = vp.py(k.value());
            sb.append("<line x1=\"").append(f(l)).append("\" y1=\"").append(f(y)).append("\" x2=\"").append(f(l + w)).append("\" y2=\"").append(f(y))
                    .append("\" stroke=\"").append(k.major() ? Palette.GRID_MAJOR : Palette.GRID_MINOR).append("\"/>\n");
        }
        sb.append("</g>\n");
        sb.append("<g fill=\"").append(Palette.TEXT).append("\">\n");
        for (Ticks.Tick k : xt) {
            if (k.label().isEmpty()) continue;
            sb.append("<text x=\"").append(f(vp.px(k.value()))).append("\" y=\"").append(f(t + h + 16)).append("\" text-anchor=\"middle\">")
                    .append(esc(k.label())).append("</text>\n");
        }
        for (Ticks.Tick k : yt) {
            if (k.label().isEmpty()) continue;
            sb.append("<text x=\"").append(f(l - 6)).append("\" y=\"").append(f(vp.py(k.value()) + 4)).append("\" text-anchor=\"end\">")
                    .append(esc(k.label())).append("</text>\n");
        }
        sb.append("<text x=\"").append(f(l + w / 2)).append("\" y=\"").append(f(height - 10)).append("\" text-anchor=\"middle\">")
                .append(esc(spec.xAxis().title())).append("</text>\n");
        sb.append("<text transform=\"translate(16,").append(f(t + h / 2)).append(") rotate(-90)\" text-anchor=\"middle\">")
                .append(esc(spec.yAxis().title())).append("</text>\n");
        sb.append("<text x=\"").append(f(l)).append("\" y=\"").append(f(22)).append("\" font-size=\"").append(f(ChartLayout.TITLE_FONT_SIZE))
                .append("\" font-weight=\"bold\">").append(esc(spec.title())).append("</text>\n");
        sb.append("</g>\n");

        // series
        sb.append("<g clip-path=\"url(#").append(clip).append(")\" fill=\"none\" stroke-linejoin=\"round\">\n");
        int[] roleCount = new int[Series.Role.values().length];
        String[] colours = new String[spec.series().size()];
        for (int si = 0; si < spec.series().size(); si++) {
            Series s = spec.series().get(si);
            String colour = Palette.colour(s.role(), roleCount[s.role().ordinal()]++);
            colours[si] = colour;
            drawSeries(sb, s, vp, spec.xAxis().scale(), colour);
        }
        for (HorizontalLine hl : spec.lines()) {
            double y = vp.py(hl.y());
            if (!Double.isFinite(y)) continue;
            sb.append("<line x1=\"").append(f(l)).append("\" y1=\"").append(f(y)).append("\" x2=\"").append(f(l + w)).append("\" y2=\"").append(f(y))
                    .append("\" stroke=\"").append(Palette.colour(hl.role(), 0)).append("\" stroke-width=\"1.4\" stroke-dasharray=\"6 4\"/>\n");
            sb.append("<text x=\"").append(f(l + 6)).append("\" y=\"").append(f(y - 4)).append("\" stroke=\"none\" fill=\"")
                    .append(Palette.colour(hl.role(), 0)).append("\">").append(esc(hl.label())).append("</text>\n");
        }
        List<double[]> labelled = new java.util.ArrayList<>();
        for (Marker m : spec.markers()) {
            double x = vp.px(m.x()), y = vp.py(m.y());
            if (!Double.isFinite(x) || !Double.isFinite(y)) continue;
            sb.append("<path d=\"M").append(f(x)).append(' ').append(f(y - 3)).append("l-4 -7h8z\" fill=\"").append(Palette.MARKER).append("\" stroke=\"none\"/>\n");
            // label above the marker, else below it (so a crowded marker such as H9 beside H8 keeps its name)
            double ly = ChartLayout.labelFits(labelled, x, y - 13) ? y - 13 : ChartLayout.labelFits(labelled, x, y + 16) ? y + 16 : Double.NaN;
            if (Double.isNaN(ly)) continue;
            sb.append("<text x=\"").append(f(x)).append("\" y=\"").append(f(ly)).append("\" text-anchor=\"middle\" stroke=\"none\" fill=\"")
                    .append(Palette.MARKER).append("\" font-size=\"11\">").append(esc(m.label())).append("</text>\n");
        }
        sb.append("</g>\n");

        // frame
        sb.append("<rect x=\"").append(f(l)).append("\" y=\"").append(f(t)).append("\" width=\"").append(f(w)).append("\" height=\"").append(f(h))
                .append("\" fill=\"none\" stroke=\"").append(Palette.AXIS).append("\" stroke-width=\"1\"/>\n");

        // legend
        if (!spec.series().isEmpty()) {
            double lw = 0;
            for (Series s : spec.series()) lw = Math.max(lw, s.name().length() * 6.8);
            double boxW = lw + 40, boxH = spec.series().size() * 17 + 8;
            // the corner whose box covers the fewest data points (top right on a tie), so the legend does not hide curves
            double[][] corners = {{l + w - boxW - 8, t + 8}, {l + 8, t + 8}, {l + w - boxW - 8, t + h - boxH - 8}, {l + 8, t + h - boxH - 8}};
            double bx = corners[0][0], by = corners[0][1];
            long best = Long.MAX_VALUE;
            for (double[] cn : corners) {
                long covered = 0;
                for (Series s : spec.series())
                    for (int i = 0; i < s.size(); i++) {
                        double px = vp.px(s.xAt(i)), py = vp.py(s.yAt(i));
                        if (px >= cn[0] && px <= cn[0] + boxW && py >= cn[1] && py <= cn[1] + boxH) covered++;
                    }
                if (covered < best) { best = covered; bx = cn[0]; by = cn[1]; }
            }
            sb.append("<g><rect x=\"").append(f(bx)).append("\" y=\"").append(f(by)).append("\" width=\"").append(f(boxW)).append("\" height=\"")
                    .append(f(boxH)).append("\" fill=\"#ffffff\" fill-opacity=\"0.88\" stroke=\"").append(Palette.GRID_MAJOR).append("\"/>\n");
            for (int si = 0; si < spec.series().size(); si++) {
                Series s = spec.series().get(si);
                double yy = by + 16 + si * 17;
                if (s.style() == Series.Style.BARS || s.style() == Series.Style.POINTS)
                    sb.append("<rect x=\"").append(f(bx + 8)).append("\" y=\"").append(f(yy - 8)).append("\" width=\"18\" height=\"8\" fill=\"").append(colours[si]).append("\"/>\n");
                else
                    sb.append("<line x1=\"").append(f(bx + 8)).append("\" y1=\"").append(f(yy - 4)).append("\" x2=\"").append(f(bx + 26)).append("\" y2=\"").append(f(yy - 4))
                            .append("\" stroke=\"").append(colours[si]).append("\" stroke-width=\"2\"").append(dashAttr(s.role())).append("/>\n");
                sb.append("<text x=\"").append(f(bx + 32)).append("\" y=\"").append(f(yy)).append("\" fill=\"").append(Palette.TEXT).append("\">")
                        .append(esc(s.name())).append("</text>\n");
            }
            sb.append("</g>\n");
        }
        sb.append("</svg>\n");
        return sb.toString();
    }

    private static void drawSeries(StringBuilder sb, Series s, Viewport vp, Axis.Scale xScale, String colour) {
        double[] x = s.x(), y = s.y();
        Range xr = vp.x();
        if (x.length > 2 * vp.width() + 2 && Decimator.isNonDecreasing(x)) {
            Decimator.Result r = Decimator.minMax(x, y, xr.min(), xr.max(), (int) Math.ceil(vp.width()), xScale);
            x = r.x();
            y = r.y();
        }
        switch (s.style()) {
            case LINE, STEP -> {
                StringBuilder d = new StringBuilder(x.length * 14);
                boolean pen = false;
                double lastY = 0;
                for (int i = 0; i < x.length; i++) {
                    double px = vp.px(x[i]), py = vp.py(y[i]);
                    if (!Double.isFinite(px) || !Double.isFinite(py)) { pen = false; continue; }
                    if (!pen) d.append('M').append(f(px)).append(' ').append(f(py));
                    else if (s.style() == Series.Style.STEP) d.append('H').append(f(px)).append('V').append(f(py));
                    else d.append('L').append(f(px)).append(' ').append(f(py));
                    pen = true;
                    lastY = py;
                }
                if (d.length() > 0)
                    sb.append("<path d=\"").append(d).append("\" stroke=\"").append(colour).append("\" stroke-width=\"")
                            .append(f(Palette.lineWidth(s.role()))).append('"').append(dashAttr(s.role())).append("/>\n");
            }
            case POINTS -> {
                sb.append("<g fill=\"").append(colour).append("\" stroke=\"none\">");
                for (int i = 0; i < x.length; i++) {
                    double px = vp.px(x[i]), py = vp.py(y[i]);
                    if (Double.isFinite(px) && Double.isFinite(py))
                        sb.append("<circle cx=\"").append(f(px)).append("\" cy=\"").append(f(py)).append("\" r=\"2.2\"/>");
                }
                sb.append("</g>\n");
            }
            case BARS -> {
                double base = vp.top() + vp.height();
                if (vp.yScale() == Axis.Scale.LINEAR && vp.y().contains(0)) base = vp.py(0);
                double barW = Math.max(2, Math.min(24, vp.width() / Math.max(1, x.length) * 0.6));
                sb.append("<g fill=\"").append(colour).append("\" stroke=\"none\">");
                for (int i = 0; i < x.length; i++) {
                    double px = vp.px(x[i]), py = vp.py(y[i]);
                    if (!Double.isFinite(px) || !Double.isFinite(py)) continue;
                    double top = Math.min(py, base), hgt = Math.abs(base - py);
                    sb.append("<rect x=\"").append(f(px - barW / 2)).append("\" y=\"").append(f(top)).append("\" width=\"").append(f(barW))
                            .append("\" height=\"").append(f(hgt)).append("\"/>");
                }
                sb.append("</g>\n");
            }
        }
    }

    private static String dashAttr(Series.Role role) {
        double[] d = Palette.dash(role);
        if (d.length == 0) return "";
        StringBuilder sb = new StringBuilder(" stroke-dasharray=\"");
        for (int i = 0; i < d.length; i++) sb.append(i > 0 ? " " : "").append(f(d[i]));
        return sb.append('"').toString();
    }

    private static double clampPx(double v, double lo, double hi) {
        if (Double.isNaN(v)) return lo;
        return Math.max(lo, Math.min(hi, v));
    }

    /** Coordinates with two decimals at most, "." decimal point. */
    static String f(double v) {
        double r = Math.round(v * 100) / 100.0;
        if (r == Math.rint(r) && Math.abs(r) < 1e15) return Long.toString((long) r);
        return String.format(Locale.ROOT, "%.2f", r);
    }

    /** XML text and attribute escaping (the same rules as the HTML report). */
    static String esc(String s) { return HtmlReport.esc(s); }
}

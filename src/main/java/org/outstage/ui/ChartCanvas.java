package org.outstage.ui;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import javafx.geometry.VPos;
import javafx.scene.canvas.Canvas;
import javafx.scene.canvas.GraphicsContext;
import javafx.scene.control.Label;
import javafx.scene.input.MouseButton;
import javafx.scene.input.MouseEvent;
import javafx.scene.input.ScrollEvent;
import javafx.scene.layout.Region;
import javafx.scene.paint.Color;
import javafx.scene.shape.StrokeLineJoin;
import javafx.scene.text.Font;
import javafx.scene.text.FontWeight;
import javafx.scene.text.TextAlignment;
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
 * Our on-screen renderer of a {@link ChartSpec}: a Canvas drawn with the same layout, ticks and colours as
 * the SVG renderer. Long series are reduced to two points per pixel column ({@link Decimator}) before any
 * GraphicsContext call, so a million-sample capture redraws in a few milliseconds.
 *
 * <p>Interaction: mouse wheel zooms around the pointer (both axes; hold Shift for x only); dragging with
 * the primary button draws a zoom box; dragging with the secondary button (or with Ctrl held) pans;
 * double-click returns to the full view. The readout at the top right shows the pointer position in
 * axis units.
 */
public final class ChartCanvas extends Region {
    private static final Font FONT = Font.font("DejaVu Sans", ChartLayout.FONT_SIZE);
    private static final Font SMALL_FONT = Font.font("DejaVu Sans", 11);
    private final Canvas canvas = new Canvas(10, 10);
    private final Label readout = new Label();
    private ChartSpec spec;
    private final List<Prepared> prepared = new ArrayList<>();
    private Range viewX, viewY;
    private double dragX0 = Double.NaN, dragY0, dragX1, dragY1;
    private boolean panning;
    private Viewport lastViewport;
    private String message = "";
    /** What the last draw put on screen: the title as drawn (fitted), its box, and the x tick labels. */
    private String drawnTitle = "";
    private javafx.geometry.Bounds titleBounds = new javafx.geometry.BoundingBox(0, 0, 0, 0);
    private List<String> drawnXTicks = List.of();
    private String fitFor = "";
    private double fitWidth = -1;
    private String[] fitted = {"", "14"};

    /** Series arrays copied once per spec, with whether x is sorted (decimation needs it) and the last reduction. */
    private static final class Prepared {
        final Series series;
        final double[] x, y;
        final boolean sorted;
        final String colour;
        double cachedMin = Double.NaN, cachedMax = Double.NaN;
        int cachedColumns = -1;
        Decimator.Result cached;

        Prepared(Series series, double[] x, double[] y, boolean sorted, String colour) {
            this.series = series; this.x = x; this.y = y; this.sorted = sorted; this.colour = colour;
        }

        /** The reduction for this view, reused while the view does not change (cursor, zoom-box drawing). */
        Decimator.Result reduced(double min, double max, int columns, Axis.Scale scale) {
            if (cached == null || min != cachedMin || max != cachedMax || columns != cachedColumns) {
                cached = Decimator.minMax(x, y, min, max, columns, scale);
                cachedMin = min;
                cachedMax = max;
                cachedColumns = columns;
            }
            return cached;
        }
    }

    public ChartCanvas() {
        getChildren().addAll(canvas, readout);
        readout.getStyleClass().add("chart-readout");
        readout.setStyle("-fx-background-color: rgba(255,255,255,0.85); -fx-padding: 1 4 1 4; -fx-font-size: 11px;");
        readout.setMouseTransparent(true);
        setMinSize(200, 150);
        setPrefSize(800, 420);
        canvas.setOnScroll(this::onScroll);
        canvas.setOnMousePressed(this::onPressed);
        canvas.setOnMouseDragged(this::onDragged);
        canvas.setOnMouseReleased(this::onReleased);
        canvas.setOnMouseMoved(this::onMoved);
        canvas.setOnMouseExited(e -> readout.setText(""));
        canvas.setOnMouseClicked(e -> { if (e.getClickCount() == 2) resetZoom(); });
    }

    /**
     * A chart made ready to draw: series arrays copied and checked once. Building it costs a pass over the
     * data, so the workbench builds it on its worker thread ({@link #prepare}) and hands it to the FX thread.
     */
    public static final class PreparedChart {
        final ChartSpec spec;
        final List<Prepared> series;

        private PreparedChart(ChartSpec spec, List<Prepared> series) { this.spec = spec; this.series = series; }

        public ChartSpec spec() { return spec; }
    }

    /** Prepares {@code s} for drawing; thread-safe, meant for a worker thread. */
    public static PreparedChart prepare(ChartSpec s) {
        List<Prepared> list = new ArrayList<>();
        int[] roleCount = new int[Series.Role.values().length];
        for (Series se : s.series()) {
            double[] x = se.x();
            list.add(new Prepared(se, x, se.y(), Decimator.isNonDecreasing(x), Palette.colour(se.role(), roleCount[se.role().ordinal()]++)));
        }
        return new PreparedChart(s, List.copyOf(list));
    }

    /** Shows {@code s}; the view returns to the spec's own ranges. */
    public void setSpec(ChartSpec s) {
        if (s == null) { setMessage(""); return; }
        setPrepared(prepare(s));
    }

    /** Shows a chart prepared on another thread; the view returns to the spec's own ranges. */
    public void setPrepared(PreparedChart c) {
        this.spec = c.spec;
        this.message = "";
        prepared.clear();
        prepared.addAll(c.series);
        viewX = null;
        viewY = null;
        redraw();
    }

    /** Replaces the series of the current chart but keeps the zoom (used for the live model overlay). */
    public void updateSpec(ChartSpec s) {
        Range vx = viewX, vy = viewY;
        setSpec(s);
        viewX = vx;
        viewY = vy;
        redraw();
    }

    /** Shows a message in place of the chart (bad file, model that did not converge...). */
    public void setMessage(String text) {
        this.spec = null;
        prepared.clear();
        this.message = text;
        redraw();
    }

    public Optional<ChartSpec> spec() { return Optional.ofNullable(spec); }
    public String message() { return message; }

    public void resetZoom() { viewX = null; viewY = null; redraw(); }

    /** The visible x range. */
    public Range visibleX() { return viewX != null ? viewX : spec.xRange(); }
    public Range visibleY() { return viewY != null ? viewY : spec.yRange(); }

    public void zoomTo(Range x, Range y) { viewX = x; viewY = y; redraw(); }

    @Override
    protected void layoutChildren() {
        double w = getWidth(), h = getHeight();
        if (canvas.getWidth() != w || canvas.getHeight() != h) {
            canvas.setWidth(w);
            canvas.setHeight(h);
            redraw();
        }
        readout.autosize();
        // bottom right inside the plot area: clear of the title (top left) and the legend (top right)
        Viewport vp = lastViewport;
        if (vp != null) readout.relocate(Math.max(0, vp.left() + vp.width() - readout.getWidth() - 4),
                Math.max(0, vp.top() + vp.height() - readout.getHeight() - 4));
        else readout.relocate(Math.max(0, w - readout.getWidth() - ChartLayout.MARGIN_RIGHT), h - readout.getHeight() - 6);
    }

    /** The title as the last draw showed it (shortened to fit when the chart is narrow). */
    String drawnTitle() { return drawnTitle; }

    /** Where the last draw put the title, in this region's coordinates. */
    javafx.geometry.Bounds titleBounds() { return titleBounds; }

    /** The labels of the x axis's ticks in the last draw. */
    List<String> drawnXTicks() { return drawnXTicks; }

    /** The readout label (tests check where it sits). */
    Label readout() { return readout; }

    /**
     * The title fitted to {@code width}: the full title at the title font if it fits, else at a smaller font
     * (down to 11 px), else with the start shortened ("…") so the end, which carries what the chart is (for
     * example "residual (magnified ×50)"), stays whole.
     */
    static String[] fitTitle(String title, double width) {
        for (double size = ChartLayout.TITLE_FONT_SIZE; size >= 11; size -= 1)
            if (textWidth(title, size) <= width) return new String[] {title, Double.toString(size)};
        String t = title;
        while (t.length() > 4 && textWidth("…" + t, 11) > width) t = t.substring(1);
        return new String[] {"…" + t.stripLeading(), "11"};
    }

    private static double textWidth(String s, double size) {
        javafx.scene.text.Text t = new javafx.scene.text.Text(s);
        t.setFont(Font.font("DejaVu Sans", FontWeight.BOLD, size));
        return t.getLayoutBounds().getWidth();
    }

    @Override protected double computePrefWidth(double h) { return 800; }
    @Override protected double computePrefHeight(double w) { return 420; }

    /** Redraws the whole chart. */
    public void redraw() {
        draw(canvas.getGraphicsContext2D(), canvas.getWidth(), canvas.getHeight());
    }

    /** Draws the chart into {@code gc} (any canvas of size w × h); public so the benchmark can time it on its own canvas. */
    public void draw(GraphicsContext gc, double w, double h) {
        gc.clearRect(0, 0, w, h);   // a full clear also drops the canvas's queued commands
        gc.setFill(Color.web(Palette.BACKGROUND));
        gc.fillRect(0, 0, w, h);
        if (spec == null || w < 60 || h < 60) {
            if (!message.isEmpty()) {
                gc.setFill(Color.web("#8a2a25"));
                gc.setFont(Font.font(13));
                gc.setTextAlign(TextAlignment.CENTER);
                gc.setTextBaseline(VPos.CENTER);
                gc.fillText(message, w / 2, h / 2, Math.max(50, w - 40));
            }
            lastViewport = null;
            return;
        }
        Viewport vp;
        try {
            vp = ChartLayout.viewport(spec, visibleX(), visibleY(), w, h);
        } catch (IllegalArgumentException e) {
            lastViewport = null;
            return;
        }
        lastViewport = vp;
        double l = vp.left(), t = vp.top(), pw = vp.width(), ph = vp.height();
        gc.setFill(Color.web(Palette.PLOT_AREA));
        gc.fillRect(l, t, pw, ph);
        gc.setLineDashes();
        // bands
        gc.setFill(Color.web(Palette.BAND));
        for (Band b : spec.bands()) {
            double x0 = clamp(vp.px(b.fromX()), l, l + pw), x1 = clamp(vp.px(b.toX()), l, l + pw);
            if (x1 > x0) gc.fillRect(x0, t, x1 - x0, ph);
        }
        // grid
        List<Ticks.Tick> xt = Ticks.of(vp.x(), spec.xAxis().scale(), ChartLayout.tickTarget(pw, true), spec.xAxis().unit());
        List<Ticks.Tick> yt = Ticks.of(vp.y(), spec.yAxis().scale(), ChartLayout.tickTarget(ph, false), spec.yAxis().unit());
        gc.setLineWidth(1);
        for (Ticks.Tick k : xt) {
            double x = Math.round(vp.px(k.value())) + 0.5;
            gc.setStroke(Color.web(k.major() ? Palette.GRID_MAJOR : Palette.GRID_MINOR));
            gc.strokeLine(x, t, x, t + ph);
        }
        for (Ticks.Tick k : yt) {
            double y = Math.round(vp.py(k.value())) + 0.5;
            gc.setStroke(Color.web(k.major() ? Palette.GRID_MAJOR : Palette.GRID_MINOR));
            gc.strokeLine(l, y, l + pw, y);
        }
        // labels
        gc.setFill(Color.web(Palette.TEXT));
        gc.setFont(FONT);
        gc.setTextBaseline(VPos.TOP);
        gc.setTextAlign(TextAlignment.CENTER);
        List<String> xl = new ArrayList<>();
        for (Ticks.Tick k : xt) if (!k.label().isEmpty()) { gc.fillText(k.label(), vp.px(k.value()), t + ph + 4); xl.add(k.label()); }
        drawnXTicks = List.copyOf(xl);
        gc.setTextAlign(TextAlignment.RIGHT);
        gc.setTextBaseline(VPos.CENTER);
        for (Ticks.Tick k : yt) if (!k.label().isEmpty()) gc.fillText(k.label(), l - 6, vp.py(k.value()));
        gc.setTextAlign(TextAlignment.CENTER);
        gc.setTextBaseline(VPos.BOTTOM);
        gc.fillText(spec.xAxis().title(), l + pw / 2, h - 6);
        gc.save();
        gc.translate(16, t + ph / 2);
        gc.rotate(-90);
        gc.setTextBaseline(VPos.CENTER);
        gc.fillText(spec.yAxis().title(), 0, 0);
        gc.restore();
        gc.setTextAlign(TextAlignment.LEFT);
        gc.setTextBaseline(VPos.BASELINE);
        double room = Math.max(40, w - l - 8);
        if (!spec.title().equals(fitFor) || room != fitWidth) { fitted = fitTitle(spec.title(), room); fitFor = spec.title(); fitWidth = room; }
        Font tf = Font.font("DejaVu Sans", FontWeight.BOLD, Double.parseDouble(fitted[1]));
        gc.setFont(tf);
        gc.fillText(fitted[0], l, 22);
        drawnTitle = fitted[0];
        double tw = textWidth(fitted[0], tf.getSize());
        titleBounds = new javafx.geometry.BoundingBox(l, 22 - tf.getSize(), tw, tf.getSize() + 4);
        gc.setFont(FONT);

        // data, clipped to the plot area
        gc.save();
        gc.beginPath();
        gc.rect(l, t, pw, ph);
        gc.clip();
        gc.setLineJoin(StrokeLineJoin.ROUND);
        for (Prepared p : prepared) drawSeries(gc, p, vp);
        for (HorizontalLine hl : spec.lines()) {
            double y = vp.py(hl.y());
            if (!Double.isFinite(y)) continue;
            Color c = Color.web(Palette.colour(hl.role(), 0));
            gc.setStroke(c);
            gc.setLineWidth(1.4);
            gc.setLineDashes(6, 4);
            gc.strokeLine(l, y, l + pw, y);
            gc.setLineDashes();
            gc.setFill(c);
            gc.fillText(hl.label(), l + 6, y - 4);
        }
        gc.setFill(Color.web(Palette.MARKER));
        gc.setTextAlign(TextAlignment.CENTER);
        gc.setFont(SMALL_FONT);
        List<double[]> labelled = new ArrayList<>();
        for (Marker m : spec.markers()) {
            double x = vp.px(m.x()), y = vp.py(m.y());
            if (!Double.isFinite(x) || !Double.isFinite(y)) continue;
            gc.fillPolygon(new double[] {x, x - 4, x + 4}, new double[] {y - 3, y - 10, y - 10}, 3);
            // the label centred over its marker, but shifted to stay inside the plot (a −3 dB point near the edge)
            javafx.scene.text.Text probe = new javafx.scene.text.Text(m.label());
            probe.setFont(SMALL_FONT);
            double half = probe.getLayoutBounds().getWidth() / 2 + 2;
            double lx = pw > 2 * half ? Math.max(l + half, Math.min(l + pw - half, x)) : x;
            if (ChartLayout.labelFits(labelled, lx, y - 13)) gc.fillText(m.label(), lx, y - 13);
        }
        gc.restore();
        gc.setLineDashes();
        gc.setStroke(Color.web(Palette.AXIS));
        gc.setLineWidth(1);
        gc.strokeRect(Math.round(l) + 0.5, Math.round(t) + 0.5, Math.round(pw), Math.round(ph));
        drawLegend(gc, vp);
        // zoom box
        if (!Double.isNaN(dragX0) && !panning) {
            gc.setStroke(Color.web("#444444"));
            gc.setLineDashes(4, 3);
            gc.strokeRect(Math.min(dragX0, dragX1), Math.min(dragY0, dragY1), Math.abs(dragX1 - dragX0), Math.abs(dragY1 - dragY0));
            gc.setLineDashes();
        }
    }

    private void drawSeries(GraphicsContext gc, Prepared p, Viewport vp) {
        double[] x = p.x, y = p.y;
        Series s = p.series;
        if (p.sorted && x.length > 2 * vp.width() + 2 && s.style() != Series.Style.BARS) {
            Decimator.Result r = p.reduced(vp.x().min(), vp.x().max(), (int) Math.ceil(vp.width()), vp.xScale());
            x = r.x();
            y = r.y();
        }
        Color c = Color.web(p.colour);
        switch (s.style()) {
            case LINE, STEP -> {
                gc.setStroke(c);
                gc.setLineWidth(Palette.lineWidth(s.role()));
                double[] dash = Palette.dash(s.role());
                if (dash.length > 0) gc.setLineDashes(dash); else gc.setLineDashes();
                gc.beginPath();
                boolean pen = false;
                double lastPy = 0;
                for (int i = 0; i < x.length; i++) {
                    double px = vp.px(x[i]), py = vp.py(y[i]);
                    if (!Double.isFinite(px) || !Double.isFinite(py)) { pen = false; continue; }
                    py = clamp(py, -1e5, 1e5);
                    px = clamp(px, -1e5, 1e5);
                    if (!pen) gc.moveTo(px, py);
                    else if (s.style() == Series.Style.STEP) { gc.lineTo(px, lastPy); gc.lineTo(px, py); }
                    else gc.lineTo(px, py);
                    pen = true;
                    lastPy = py;
                }
                gc.stroke();
                gc.setLineDashes();
            }
            case POINTS -> {
                gc.setFill(c);
                for (int i = 0; i < x.length; i++) {
                    double px = vp.px(x[i]), py = vp.py(y[i]);
                    if (Double.isFinite(px) && Double.isFinite(py)) gc.fillOval(px - 2.2, py - 2.2, 4.4, 4.4);
                }
            }
            case BARS -> {
                gc.setFill(c);
                double base = vp.top() + vp.height();
                if (vp.yScale() == Axis.Scale.LINEAR && vp.y().contains(0)) base = vp.py(0);
                double barW = Math.max(2, Math.min(24, vp.width() / Math.max(1, spanCount(vp)) * 0.6));
                for (int i = 0; i < x.length; i++) {
                    double px = vp.px(x[i]), py = vp.py(y[i]);
                    if (!Double.isFinite(px) || !Double.isFinite(py)) continue;
                    gc.fillRect(px - barW / 2, Math.min(py, base), barW, Math.abs(base - py));
                }
            }
        }
    }

    /** Number of bar slots across the plot: the x span for an integer axis such as harmonic order. */
    private static double spanCount(Viewport vp) {
        return vp.xScale() == Axis.Scale.LINEAR ? Math.max(1, vp.x().span()) : 20;
    }

    private void drawLegend(GraphicsContext gc, Viewport vp) {
        if (prepared.isEmpty()) return;
        gc.setFont(FONT);
        double lw = 0;
        for (Prepared p : prepared) lw = Math.max(lw, p.series.name().length() * 6.8);
        double boxW = lw + 40, boxH = prepared.size() * 17 + 8;
        double bx = vp.left() + vp.width() - boxW - 8, by = vp.top() + 8;
        gc.setFill(Color.rgb(255, 255, 255, 0.88));
        gc.fillRect(bx, by, boxW, boxH);
        gc.setStroke(Color.web(Palette.GRID_MAJOR));
        gc.setLineWidth(1);
        gc.strokeRect(bx, by, boxW, boxH);
        gc.setTextAlign(TextAlignment.LEFT);
        gc.setTextBaseline(VPos.BASELINE);
        for (int i = 0; i < prepared.size(); i++) {
            Prepared p = prepared.get(i);
            double yy = by + 16 + i * 17;
            Color c = Color.web(p.colour);
            if (p.series.style() == Series.Style.BARS || p.series.style() == Series.Style.POINTS) {
                gc.setFill(c);
                gc.fillRect(bx + 8, yy - 8, 18, 8);
            } else {
                gc.setStroke(c);
                gc.setLineWidth(2);
                double[] dash = Palette.dash(p.series.role());
                if (dash.length > 0) gc.setLineDashes(dash);
                gc.strokeLine(bx + 8, yy - 4, bx + 26, yy - 4);
                gc.setLineDashes();
            }
            gc.setFill(Color.web(Palette.TEXT));
            gc.fillText(p.series.name(), bx + 32, yy);
        }
    }

    private static double clamp(double v, double lo, double hi) {
        if (Double.isNaN(v)) return lo;
        return Math.max(lo, Math.min(hi, v));
    }

    // ---- interaction ------------------------------------------------------------------------------

    private boolean inPlot(double px, double py) {
        Viewport vp = lastViewport;
        return vp != null && px >= vp.left() && px <= vp.left() + vp.width() && py >= vp.top() && py <= vp.top() + vp.height();
    }

    private void onMoved(MouseEvent e) {
        Viewport vp = lastViewport;
        if (vp == null || !inPlot(e.getX(), e.getY())) { readout.setText(""); return; }
        readout.setText(readoutText(e.getX(), e.getY()));
        requestLayout();
    }

    /** Readout text at a pixel position, with units ("x = 1.000 kHz   y = -80.12 dBV"). */
    String readoutText(double px, double py) {
        Viewport vp = lastViewport;
        if (vp == null || spec == null) return "";
        return spec.xAxis().label() + " " + Ticks.withUnit(vp.dataX(px), spec.xAxis().unit()) + "    "
                + spec.yAxis().label() + " " + Ticks.withUnit(vp.dataY(py), spec.yAxis().unit());
    }

    private void onScroll(ScrollEvent e) {
        Viewport vp = lastViewport;
        if (vp == null || e.getDeltaY() == 0) return;
        double factor = e.getDeltaY() > 0 ? 0.8 : 1.25;
        viewX = zoomRange(visibleX(), spec.xAxis().scale(), vp.dataX(e.getX()), factor);
        if (!e.isShiftDown()) viewY = zoomRange(visibleY(), spec.yAxis().scale(), vp.dataY(e.getY()), factor);
        redraw();
        e.consume();
    }

    static Range zoomRange(Range r, Axis.Scale scale, double centre, double factor) {
        if (scale == Axis.Scale.LOG10) {
            double a = Math.log10(r.min()), b = Math.log10(r.max()), c = Math.log10(centre);
            return new Range(Math.pow(10, c - (c - a) * factor), Math.pow(10, c + (b - c) * factor));
        }
        return new Range(centre - (centre - r.min()) * factor, centre + (r.max() - centre) * factor);
    }

    private void onPressed(MouseEvent e) {
        if (lastViewport == null || !inPlot(e.getX(), e.getY())) return;
        dragX0 = dragX1 = e.getX();
        dragY0 = dragY1 = e.getY();
        panning = e.getButton() == MouseButton.SECONDARY || e.isControlDown();
    }

    private void onDragged(MouseEvent e) {
        if (Double.isNaN(dragX0) || lastViewport == null) return;
        if (panning) {
            Viewport vp = lastViewport;
            viewX = shift(visibleX(), spec.xAxis().scale(), vp.dataX(dragX1), vp.dataX(e.getX()));
            viewY = shift(visibleY(), spec.yAxis().scale(), vp.dataY(dragY1), vp.dataY(e.getY()));
        }
        dragX1 = e.getX();
        dragY1 = e.getY();
        redraw();
    }

    private void onReleased(MouseEvent e) {
        if (Double.isNaN(dragX0)) return;
        Viewport vp = lastViewport;
        if (!panning && vp != null && Math.abs(dragX1 - dragX0) > 4 && Math.abs(dragY1 - dragY0) > 4) {
            double xa = vp.dataX(Math.min(dragX0, dragX1)), xb = vp.dataX(Math.max(dragX0, dragX1));
            double ya = vp.dataY(Math.max(dragY0, dragY1)), yb = vp.dataY(Math.min(dragY0, dragY1));
            if (xb > xa && yb > ya) { viewX = new Range(xa, xb); viewY = new Range(ya, yb); }
        }
        dragX0 = Double.NaN;
        panning = false;
        redraw();
    }

    private static Range shift(Range r, Axis.Scale scale, double from, double to) {
        if (scale == Axis.Scale.LOG10) {
            double k = to / from;
            return new Range(r.min() / k, r.max() / k);
        }
        double d = to - from;
        return new Range(r.min() - d, r.max() - d);
    }
}

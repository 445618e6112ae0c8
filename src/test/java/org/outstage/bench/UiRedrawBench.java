package org.outstage.bench;

import java.util.List;
import java.util.Random;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import javafx.application.Platform;
import javafx.scene.canvas.Canvas;
import javafx.scene.canvas.GraphicsContext;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.outstage.plot.Axis;
import org.outstage.plot.ChartSpec;
import org.outstage.plot.Range;
import org.outstage.plot.Series;
import org.outstage.ui.ChartCanvas;

/**
 * Redraw of a view of a 1,000,000-sample capture on our canvas renderer: decimation plus every
 * GraphicsContext call of one frame (grid, labels, two series of 1M points each, legend), 1200 × 700 px,
 * whole record visible (the worst case). Rasterisation happens later on the render thread and is not
 * part of this figure (a snapshot would time that too; see toolchain.md).
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class UiRedrawBench {
    ChartCanvas chart;
    Canvas canvas;
    GraphicsContext gc;

    @Setup
    public void setup() throws Exception {
        System.setProperty("glass.platform", System.getProperty("glass.platform", "Monocle"));
        System.setProperty("monocle.platform", System.getProperty("monocle.platform", "Headless"));
        System.setProperty("prism.order", System.getProperty("prism.order", "sw"));
        System.setProperty("java.awt.headless", "true");
        try { Platform.startup(() -> {}); } catch (IllegalStateException already) { /* running */ }
        int n = 1_000_000;
        double[] t = new double[n], y = new double[n], fit = new double[n];
        Random r = new Random(3);
        for (int i = 0; i < n; i++) {
            t[i] = i / 96_000.0;
            fit[i] = Math.sin(2 * Math.PI * 1000 * t[i]);
            y[i] = fit[i] - 0.01 * Math.tanh(fit[i] / 0.01) + 1e-4 * r.nextGaussian();
        }
        tEnd = t[n - 1];
        ChartSpec spec = ChartSpec.of("bench", Axis.linear("Time", "s"), Axis.linear("Output", "V"),
                List.of(new Series("capture", t, y, Series.Style.LINE, Series.Role.MEASURED),
                        new Series("fitted fundamental", t, fit, Series.Style.LINE, Series.Role.FIT)));
        CompletableFuture<Void> done = new CompletableFuture<>();
        Platform.runLater(() -> {
            chart = new ChartCanvas();
            chart.setSpec(spec);
            canvas = new Canvas(1200, 700);
            gc = canvas.getGraphicsContext2D();
            done.complete(null);
        });
        done.get(30, TimeUnit.SECONDS);
    }

    double tEnd;
    boolean flip;

    /** A new view each time (the x range alternates between two values), so the reduction runs every frame. */
    @Benchmark
    public Canvas redrawMillionSampleView() {
        flip = !flip;
        chart.zoomTo(new Range(0, flip ? tEnd : tEnd * 0.999), new Range(-1.1, 1.1));
        chart.draw(gc, 1200, 700);
        return canvas;
    }

    /** The same view again (cursor moves, zoom-box drawing): the reduction is reused. */
    @Benchmark
    public Canvas redrawSameView() {
        chart.draw(gc, 1200, 700);
        return canvas;
    }
}

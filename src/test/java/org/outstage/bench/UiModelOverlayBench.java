package org.outstage.bench;

import java.util.Optional;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import javafx.application.Platform;
import javafx.scene.canvas.Canvas;
import javafx.scene.canvas.GraphicsContext;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.outstage.analysis.TransferCurve;
import org.outstage.model.Bias;
import org.outstage.model.SolverSettings;
import org.outstage.model.StageModel;
import org.outstage.model.StageParameters;
import org.outstage.plot.Charts;
import org.outstage.ui.ChartCanvas;

/**
 * Model overlay update in the transfer view, as the workbench does it when a parameter changes: build the
 * stage with the new bias and solve its quiescent point, compute the 201-point transfer curve, build the
 * chart description over the measured curve, and redraw the canvas (1000 × 600). The bias alternates
 * between two values so nothing is reused.
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
public class UiModelOverlayBench {
    @Param({"pair", "darlington", "cfp", "quasi"})
    public String topology;

    TransferCurve measured;
    ChartCanvas chart;
    GraphicsContext gc;
    boolean flip;

    @Setup
    public void setup() throws Exception {
        System.setProperty("glass.platform", System.getProperty("glass.platform", "Monocle"));
        System.setProperty("monocle.platform", System.getProperty("monocle.platform", "Headless"));
        System.setProperty("prism.order", System.getProperty("prism.order", "sw"));
        try { Platform.startup(() -> {}); } catch (IllegalStateException already) { /* running */ }
        measured = curve(0.010);
        CompletableFuture<Void> done = new CompletableFuture<>();
        Platform.runLater(() -> { chart = new ChartCanvas(); gc = new Canvas(1000, 600).getGraphicsContext2D(); done.complete(null); });
        done.get(30, TimeUnit.SECONDS);
    }

    TransferCurve curve(double vq) {
        StageParameters p = StageParameters.builder().topology(topology).bias(new Bias.EmitterDropVolts(vq)).build();
        return StageModel.of(p, SolverSettings.defaults()).transferCurve(-20 / 0.97, 20 / 0.97, 201).curve();
    }

    @Benchmark
    public GraphicsContext overlayUpdate() {
        flip = !flip;
        TransferCurve predicted = curve(flip ? 0.020 : 0.021);
        chart.updateSpec(Charts.transfer("Incremental gain against output", measured, Optional.of(predicted), topology));
        chart.draw(gc, 1000, 600);
        return gc;
    }
}

package org.outstage.ui;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import javafx.application.Platform;
import javafx.scene.Scene;
import javafx.stage.Stage;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.condition.EnabledIfSystemProperty;
import org.outstage.capture.WavWriter;

/**
 * Bench runner (not a unit test: the class name does not match surefire's includes and it runs only with
 * {@code -Doutstage.bench=true}): time from asking the workbench to open a 10 s, 96 kHz, 24-bit WAV to the
 * first pulse after its waveform, residual, spectrum and figures are shown. Prints every run and the median.
 * {@code tools/bench-ui-open}.
 */
class UiOpenTimingRun {
    @Test
    @EnabledIfSystemProperty(named = "outstage.bench", matches = "true")
    void openTenSecondCapture() throws Exception {
        Path dir = Files.createTempDirectory("outstage-open");
        double fs = 96_000;
        double[] x = new double[(int) (10 * fs)];
        java.util.Random r = new java.util.Random(5);
        for (int i = 0; i < x.length; i++) {
            double s = 0.7 * Math.sin(2 * Math.PI * 1000 * i / fs);
            x[i] = s - 0.002 * Math.tanh(s / 0.002) + 1e-5 * r.nextGaussian();
        }
        Path wav = dir.resolve("ten-seconds.wav");
        WavWriter.write(wav, 96_000, WavWriter.Encoding.PCM_24, false, x);
        try { Platform.startup(() -> {}); } catch (IllegalStateException running) { /* started */ }
        Platform.setImplicitExit(false);
        int runs = 7;
        long[] ms = new long[runs];
        for (int k = 0; k < runs; k++) {
            WorkbenchPane pane = ScreenshotTool.fx(() -> {
                WorkbenchPane p = Workbench.createPane();
                Stage st = new Stage();
                st.setScene(new Scene(p, 1280, 800));
                st.show();
                return p;
            });
            Thread.sleep(300);
            long t0 = System.nanoTime();
            ScreenshotTool.fx(() -> { pane.openPaths(List.of(wav)); return null; });
            while (!ScreenshotTool.fx(() -> pane.selected() != null && pane.selected().data != null && pane.selected().data == shownData(pane)))
                Thread.sleep(2);
            CompletableFuture<Long> pulse = new CompletableFuture<>();
            ScreenshotTool.fx(() -> {
                Runnable[] l = new Runnable[1];
                l[0] = () -> { pane.getScene().removePostLayoutPulseListener(l[0]); pulse.complete(System.nanoTime()); };
                pane.getScene().addPostLayoutPulseListener(l[0]);
                Platform.requestNextPulse();
                return null;
            });
            ms[k] = TimeUnit.NANOSECONDS.toMillis(pulse.get(30, TimeUnit.SECONDS) - t0);
            System.out.println("open 10 s 96 kHz 24-bit WAV to first complete render: run " + (k + 1) + ": " + ms[k] + " ms");
            ScreenshotTool.fx(() -> { pane.getScene().getWindow().hide(); return null; });
        }
        long[] s = ms.clone();
        Arrays.sort(s);
        System.out.println("open-to-render median of " + runs + ": " + s[runs / 2] + " ms (min " + s[0] + ", max " + s[runs - 1] + ")");
    }

    /**
     * A 10-minute 96 kHz 24-bit WAV (57.6 M samples, written in 10 s pieces): the time to the first complete
     * render, and the longest delay of the FX thread meanwhile, probed every 20 ms (the window must keep
     * responding). Only with {@code -Doutstage.bench.long=true}.
     */
    @Test
    @EnabledIfSystemProperty(named = "outstage.bench.long", matches = "true")
    void openTenMinuteCapture() throws Exception {
        Path dir = Files.createTempDirectory("outstage-long");
        Path wav = dir.resolve("ten-minutes.wav");
        double fs = 96_000;
        int n = (int) (600 * fs);
        double[] x = new double[n];
        java.util.Random r = new java.util.Random(9);
        for (int i = 0; i < n; i++) {
            double s = 0.7 * Math.sin(2 * Math.PI * 1000 * i / fs);
            x[i] = s - 0.002 * Math.tanh(s / 0.002) + 1e-5 * r.nextGaussian();
        }
        WavWriter.write(wav, 96_000, WavWriter.Encoding.PCM_24, false, x);
        x = null;
        try { Platform.startup(() -> {}); } catch (IllegalStateException running) { /* started */ }
        Platform.setImplicitExit(false);
        WorkbenchPane pane = ScreenshotTool.fx(() -> {
            WorkbenchPane p = Workbench.createPane();
            Stage st = new Stage();
            st.setScene(new Scene(p, 1280, 800));
            st.show();
            return p;
        });
        Thread.sleep(300);
        long t0 = System.nanoTime();
        ScreenshotTool.fx(() -> { pane.openPaths(List.of(wav)); return null; });
        long worst = 0;
        while (true) {
            long a = System.nanoTime();
            boolean done = ScreenshotTool.fx(() -> pane.selected() != null && pane.selected().data != null && pane.selected().data == shownData(pane));
            worst = Math.max(worst, System.nanoTime() - a);
            if (done) break;
            Thread.sleep(20);
        }
        long ms = TimeUnit.NANOSECONDS.toMillis(System.nanoTime() - t0);
        System.out.println("open 10 min 96 kHz 24-bit WAV to figures shown: " + ms + " ms; longest FX-thread response meanwhile: "
                + TimeUnit.NANOSECONDS.toMillis(worst) + " ms");
        Files.deleteIfExists(wav);
    }

    /** The data the views show: the waveform chart's spec comes from the selected entry's last result. */
    private static ViewData shownData(WorkbenchPane pane) {
        return pane.waveformChart.spec().isPresent() && !pane.busy() ? pane.selected().data : null;
    }
}

package org.outstage.ui;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.TimeUnit;
import java.util.function.Supplier;
import javafx.application.Platform;
import javafx.embed.swing.SwingFXUtils;
import javafx.scene.Scene;
import javafx.scene.control.Label;
import javafx.scene.control.Tab;
import javafx.scene.image.WritableImage;
import javafx.scene.layout.VBox;
import javafx.stage.Stage;
import javax.imageio.ImageIO;
import org.outstage.capture.Capture;
import org.outstage.capture.SampleUnit;

/**
 * Builds the workbench headless (Monocle, software rendering), loads the sample session (or, when
 * sample-captures/ is missing, a few generated captures of an invented amplifier) and writes one PNG per
 * view to the folder given as the first argument. Run through {@code tools/screenshots}.
 */
public final class ScreenshotTool {
    /**
     * Entry point when run through surefire ({@code tools/screenshots} does this, since surefire already
     * carries the headless JavaFX settings): only with {@code -Doutstage.screenshots=DIR}. The class name
     * does not match surefire's default includes, so normal builds never run it.
     */
    @org.junit.jupiter.api.Test
    @org.junit.jupiter.api.condition.EnabledIfSystemProperty(named = "outstage.screenshots", matches = ".+")
    void writeScreenshots() throws Exception {
        run(Path.of(System.getProperty("outstage.screenshots")), false);
    }

    public static void main(String[] args) throws Exception {
        run(Path.of(args.length > 0 ? args[0] : "docs/screenshots"), true);
    }

    static void run(Path out, boolean standalone) throws Exception {
        Files.createDirectories(out);
        try {
            Platform.startup(() -> {});
        } catch (IllegalStateException alreadyRunning) {
            // started by an earlier test in the same JVM
        }
        Platform.setImplicitExit(false);
        WorkbenchPane pane = fx(() -> {
            WorkbenchPane p = Workbench.createPane();
            Stage stage = new Stage();
            stage.setScene(new Scene(p, 1360, 820));
            stage.show();
            return p;
        });
        var session = WorkbenchLauncher.sampleSession();
        if (session.isPresent()) {
            fx(() -> { pane.openPaths(List.of(session.get()), Workbench.SAMPLE_SESSION); return null; });
        } else {
            fx(() -> {
                for (Capture c : generated()) pane.addCapture(c);
                for (CaptureEntry e : pane.captureList.getItems()) {
                    e.calibration = new Calibration(java.util.OptionalDouble.empty(), java.util.OptionalDouble.empty(), java.util.OptionalDouble.of(8));
                    e.data = null;   // analysed again with the load
                }
                pane.captureList.getSelectionModel().select(0);
                pane.analyzeSelected();
                pane.analyzeAllForSweep();
                return null;
            });
        }
        waitIdle(pane);
        long until = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);   // let the level-sweep analyses of the other captures land
        while (System.nanoTime() < until && fx(() -> pane.captureList.getItems().stream().anyMatch(e -> e.capture != null && e.data == null)))
            Thread.sleep(200);
        waitIdle(pane);
        fx(() -> { if (!pane.captureList.getItems().isEmpty()) pane.captureList.getSelectionModel().select(pickShowcase(pane)); return null; });
        waitIdle(pane);
        // the model at the bias the showcase capture was made with (3 mV across Re), to compare shapes
        fx(() -> { if (pane.transferPanel.values().containsKey("vq_mv")) pane.transferPanel.set("vq_mv", 3); return null; });
        String[][] shots = {{"waveformTab", "waveform-residual.png"}, {"spectrumTab", "spectrum.png"}, {"harmonicsTab", "harmonic-profile.png"},
                {"transferTab", "transfer-model.png"}, {"sweepTab", "level-sweep.png"}};
        for (String[] s : shots) {
            if (s[0].equals("sweepTab")) {
                // with the sample session, one level capture selected: the sweep is the series the notes name "level";
                // generated captures have no notes, so they are selected together
                fx(() -> {
                    var items = pane.captureList.getItems();
                    pane.captureList.getSelectionModel().clearSelection();
                    int focus = -1;
                    for (int i = 0; i < items.size(); i++)
                        if (items.get(i).name.contains("-level-040W")) focus = i;
                    if (focus >= 0) pane.captureList.getSelectionModel().select(focus);
                    else for (int i = 0; i < items.size(); i++) if (items.get(i).name.startsWith("demo-amp")) pane.captureList.getSelectionModel().select(i);
                    return null;
                });
                waitIdle(pane);
            }
            fx(() -> {
                Tab t = pane.views.getTabs().stream().filter(x -> x.getId().equals(s[0])).findFirst().orElseThrow();
                pane.views.getSelectionModel().select(t);
                return null;
            });
            waitIdle(pane);
            Thread.sleep(600);
            if (s[0].equals("sweepTab")) fx(() -> { pointAt(pane.sweepChart, 0.8, 0.25); return null; });   // the readout, clear of the title
            save(fx(() -> pane.getScene().getRoot().snapshot(null, null)), out.resolve(s[1]));
        }
        // the clipping capture: its figures (clip levels and asymmetry) and the wrapped notes
        fx(() -> {
            var items = pane.captureList.getItems();
            for (int i = 0; i < items.size(); i++) if (items.get(i).name.contains("clipping")) pane.captureList.getSelectionModel().clearAndSelect(i);
            pane.views.getSelectionModel().select(0);
            return null;
        });
        waitIdle(pane);
        fx(() -> { pane.figuresTable.getItems().stream().filter(r -> r.id().equals("crossoverValue")).findFirst().ifPresent(pane.figuresTable::scrollTo); return null; });
        Thread.sleep(600);
        save(fx(() -> pane.getScene().getRoot().snapshot(null, null)), out.resolve("figures-clipping.png"));
        // the spec-sheet view of the sample session's two-tone, noise and sweep captures
        String[][] sheets = {{"imd-smpte", "spec-imd.png"}, {"imd-twin", "spec-imd-twin.png"}, {"noise-input", "spec-noise.png"}, {"sweep-gen", "spec-response.png"}};
        for (String[] s : sheets) {
            boolean found = fx(() -> {
                var items = pane.captureList.getItems();
                for (int i = 0; i < items.size(); i++)
                    if (items.get(i).name.contains(s[0])) {
                        pane.captureList.getSelectionModel().clearAndSelect(i);
                        pane.views.getSelectionModel().select(pane.specView.tab());
                        return true;
                    }
                return false;
            });
            if (!found) continue;   // generated captures: no such stimulus
            waitIdle(pane);
            Thread.sleep(600);
            save(fx(() -> pane.getScene().getRoot().snapshot(null, null)), out.resolve(s[1]));
        }
        fx(() -> { pane.captureList.getSelectionModel().clearAndSelect(pickShowcase(pane)); return null; });
        waitIdle(pane);
        // the model sheet: another topology keeps the edited Vq; a value that is not a number says why
        fx(() -> {
            pane.views.getSelectionModel().select(pane.transferView.tab());
            if (pane.transferPanel.topologyChoice.getItems().contains("cfp")) pane.transferPanel.topologyChoice.setValue("cfp");
            return null;
        });
        waitIdle(pane);
        Thread.sleep(400);
        fx(() -> {
            var field = pane.transferPanel.sheet.lookupAll(".text-field").stream().skip(1).findFirst();
            field.ifPresent(f -> ((javafx.scene.control.TextField) f).setText("0,22Ω"));
            return null;
        });
        Thread.sleep(400);
        save(fx(() -> pane.views.snapshot(null, null)), out.resolve("model-entry.png"));
        // the Live view, fed by a synthetic block series (SyntheticLiveSource: an invented stage whose bias trimmer
        // turns up over 30 s of input) through the same listener as a LiveSession: no sound device here
        SyntheticLiveSource synthetic = new SyntheticLiveSource(5, 30, 80);
        LiveView live = fx(() -> {
            LiveView v = new LiveView(synthetic, () -> true, () -> {});
            int i = pane.views.getTabs().indexOf(pane.liveView.tab());
            pane.views.getTabs().set(i, v.tab());
            pane.views.getSelectionModel().select(v.tab());
            v.fullScaleField.setText("40");
            v.loadField.setText("8");
            v.levelField.setText("-20");
            v.biasField.setText("14.5");
            v.sessionField.setText("3");
            v.requestStart();
            return v;
        });
        long liveUntil = System.nanoTime() + TimeUnit.SECONDS.toNanos(120);
        while (System.nanoTime() < liveUntil && fx(() -> live.blocks() < 80)) Thread.sleep(200);
        Thread.sleep(600);
        save(fx(() -> pane.getScene().getRoot().snapshot(null, null)), out.resolve("live.png"));
        fx(() -> { live.stop(); return null; });
        VBox cautions = fx(() -> {
            Label head = new Label(Cautions.TITLE);
            head.setStyle("-fx-font-size: 16px; -fx-font-weight: bold;");
            Label text = new Label(Cautions.TEXT);
            text.setWrapText(true);
            text.setMaxWidth(600);
            VBox b = new VBox(12, head, text);
            b.setStyle("-fx-padding: 18; -fx-background-color: white;");
            Stage st = new Stage();
            b.setPrefWidth(640);
            st.setScene(new Scene(b));
            st.show();
            return b;
        });
        Thread.sleep(300);
        save(fx(() -> cautions.snapshot(null, null)), out.resolve("cautions.png"));
        if (standalone) Platform.exit();
        System.out.println("screenshots written to " + out.toAbsolutePath());
    }

    /** The capture with the most to show: the first one whose name mentions crossover or low bias, else the first. */
    private static int pickShowcase(WorkbenchPane pane) {
        var items = pane.captureList.getItems();
        for (int i = 0; i < items.size(); i++) {
            String n = items.get(i).name.toLowerCase(java.util.Locale.ROOT);
            if (!items.get(i).failed() && (n.contains("bias-03mv") || n.contains("05vpk") || n.contains("crossover") || n.contains("low-bias") || n.contains("underbias"))) return i;
        }
        for (int i = 0; i < items.size(); i++) if (!items.get(i).failed()) return i;
        return 0;
    }

    /**
     * Invented amplifier (used only without sample-captures/): 1 kHz at rising levels into 8 Ω, a small
     * crossover dead band, soft clipping near ±30 V rails, seeded noise.
     */
    static List<Capture> generated() {
        double fs = 96_000;
        double[] levels = {2, 5, 10, 20, 27, 30, 33};
        return java.util.Arrays.stream(levels).mapToObj(peak -> {
            double[] x = new double[(int) fs];
            java.util.Random r = new java.util.Random(7);
            for (int i = 0; i < x.length; i++) {
                double s = peak * Math.sin(2 * Math.PI * 1000 * i / fs);
                double v = s - 0.02 * Math.tanh(s / 0.02);
                x[i] = v / Math.pow(1 + Math.pow(Math.abs(v) / 29, 8), 1 / 8.0);   // smooth limit at ±29 V
                x[i] += 1e-4 * r.nextGaussian();
            }
            return Capture.inMemory(String.format(java.util.Locale.ROOT, "demo-amp-1kHz-%02.0fVpk.wav", peak), fs, SampleUnit.VOLTS, x);
        }).toList();
    }

    /** Moves the pointer (a synthetic mouse-moved event) to a fraction of the chart's width and height. */
    private static void pointAt(ChartCanvas c, double fx, double fy) {
        double x = c.getWidth() * fx, y = c.getHeight() * fy;
        javafx.scene.Node target = c.getChildrenUnmodifiable().get(0);
        javafx.event.Event.fireEvent(target, new javafx.scene.input.MouseEvent(javafx.scene.input.MouseEvent.MOUSE_MOVED, x, y, x, y,
                javafx.scene.input.MouseButton.NONE, 0, false, false, false, false, false, false, false, false, false, false, null));
        c.requestLayout();
    }

    private static void waitIdle(WorkbenchPane pane) throws Exception {
        long end = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
        Thread.sleep(200);
        while (System.nanoTime() < end && fx(pane::busy)) Thread.sleep(100);
    }

    private static void save(WritableImage img, Path file) throws Exception {
        ImageIO.write(SwingFXUtils.fromFXImage(img, null), "png", file.toFile());
        System.out.println("wrote " + file);
    }

    static <T> T fx(Supplier<T> s) throws Exception {
        CompletableFuture<T> f = new CompletableFuture<>();
        Platform.runLater(() -> {
            try { f.complete(s.get()); } catch (Throwable t) { f.completeExceptionally(t); }
        });
        return f.get(60, TimeUnit.SECONDS);
    }

}

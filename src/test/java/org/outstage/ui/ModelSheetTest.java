package org.outstage.ui;

import static org.junit.jupiter.api.Assertions.*;

import java.util.HashMap;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.TimeUnit;
import javafx.scene.Node;
import javafx.scene.Scene;
import javafx.scene.control.TextField;
import javafx.stage.Stage;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.outstage.analysis.TransferCurve;
import org.outstage.plot.Charts;
import org.outstage.plot.Series;
import org.testfx.api.FxRobot;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;
import org.testfx.util.WaitForAsyncUtils;

/** Typing a value into the model's PropertySheet redraws the overlay with the model package's curve for it. */
@ExtendWith(ApplicationExtension.class)
class ModelSheetTest {
    private WorkbenchPane pane;

    @Start
    void start(Stage stage) {
        pane = new WorkbenchPane(new AnalyzerBackend(), new TransferPanel(Optional.of(new ModelStageAdapter())));
        stage.setScene(new Scene(pane, 1280, 800));
        stage.show();
        pane.views.getSelectionModel().select(3);
    }

    @Test
    void typingVq_redrawsOverlayWithThatBias(FxRobot robot) throws Exception {
        // the first editor of the sheet is Vq (mV)
        Node field = robot.lookup("#modelSheet").lookup(".text-field").nth(0).query();
        robot.doubleClickOn(field).eraseText(8).write("5");   // no Enter, no focus change: applied as typed
        Map<String, Double> v = new HashMap<>();
        for (StageModelAdapter.Parameter p : new ModelStageAdapter().parameters("pair")) v.put(p.key(), p.defaultValue());
        v.put("vq_mv", 5.0);
        TransferCurve expected = new ModelStageAdapter().predict("pair", v);
        double[] dev = Charts.gainDeviationPercent(expected)[1];
        WaitForAsyncUtils.waitFor(20, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() ->
                pane.transferPanel.values().get("vq_mv") == 5.0 && pane.transferPanel.lastPrediction().isPresent()
                        && pane.transferPanel.lastPrediction().get().equals(expected)).get());
        Series shown = pane.transferChart.spec().orElseThrow().series().get(0);
        assertEquals(Series.Role.MODEL, shown.role());
        assertArrayEquals(dev, shown.y(), 0.0);
        assertEquals("5", ((TextField) field).getText());
    }

    private void openAndWait(java.nio.file.Path file) throws Exception {
        robot().interact(() -> pane.openPaths(java.util.List.of(file)));
        WaitForAsyncUtils.waitFor(30, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> !pane.busy()
                && pane.captureList.getSelectionModel().getSelectedItem() != null
                && pane.captureList.getSelectionModel().getSelectedItem().data != null).get());
    }

    private static FxRobot robot() { return new FxRobot(); }

    /**
     * A soundcard WAV: the overlay is the model's curve through the capture's band (the edge {@code fit} takes by
     * default, 0.4583 of the sample rate, and the analysed tone), at the measured peak, and the legend says so.
     */
    @Test
    void wavCapture_overlayIsTheModelThroughTheCapturesBand() throws Exception {
        java.nio.file.Path wav = java.nio.file.Path.of(System.getProperty("outstage.project.dir", "."), "sample-captures", "da60-bias-03mV-40W.wav");
        openAndWait(wav);
        CaptureEntry e = pane.captureList.getSelectionModel().getSelectedItem();
        org.outstage.model.CaptureBand band = e.data.captureBand().orElseThrow();
        org.outstage.analysis.Measurement m = org.outstage.analysis.Analyzer.analyze(e.capture, 0,
                AnalyzerBackend.settingsFor(UiSettings.DEFAULT, e.calibration));
        assertEquals(org.outstage.model.CaptureBand.SOUNDCARD_BAND_FRACTION * e.capture.sampleRateHz(), band.bandHz(), 1e-9);
        assertEquals(m.fundamental().frequencyHz(), band.fundamentalHz(), 0.0);
        WaitForAsyncUtils.waitFor(20, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> {
            Map<String, Double> v = pane.transferPanel.values();
            return pane.transferPanel.lastPrediction().isPresent()
                    && pane.transferPanel.lastPrediction().get().equals(new ModelStageAdapter().predict("pair", v, Optional.of(band)));
        }).get());
        Series model = pane.transferChart.spec().orElseThrow().series().stream().filter(x -> x.role() == Series.Role.MODEL).findFirst().orElseThrow();
        assertEquals(48_000, e.capture.sampleRateHz(), 0.0);   // the sample bench: 22 kHz is where its filter passes half
        assertTrue(model.name().contains("through the capture's 22 kHz band"), model.name());
    }

    /** The figures of a clipped soundcard WAV say what the command line says: the clip levels are approximate. */
    @Test
    void clippedWav_clipRowsSayTheFiguresAreApproximate_scopeCsvDoesNot() throws Exception {
        java.nio.file.Path dir = java.nio.file.Path.of(System.getProperty("outstage.project.dir", "."), "sample-captures");
        openAndWait(dir.resolve("da60-level-070W.wav"));
        FigureRow wav = pane.captureList.getSelectionModel().getSelectedItem().data.figure("clipPositiveValue").orElseThrow();
        assertTrue(wav.note().contains(org.outstage.analysis.stage.ClippingMetrics.BAND_LIMITED_NOTE), wav.note());
        robot().interact(() -> pane.captureList.getItems().clear());
        openAndWait(dir.resolve("da60-scope-70W-clipping.csv"));
        FigureRow csv = pane.captureList.getSelectionModel().getSelectedItem().data.figure("clipPositiveValue").orElseThrow();
        assertFalse(csv.note().contains(org.outstage.analysis.stage.ClippingMetrics.BAND_LIMITED_NOTE), csv.note());
    }

    /** A scope CSV keeps its whole band: the overlay is the model's own curve. */
    @Test
    void scopeCsv_overlayIsTheModelsOwnCurve() throws Exception {
        java.nio.file.Path csv = java.nio.file.Path.of(System.getProperty("outstage.project.dir", "."), "sample-captures", "da60-scope-70W-clipping.csv");
        openAndWait(csv);
        CaptureEntry e = pane.captureList.getSelectionModel().getSelectedItem();
        assertTrue(e.data.captureBand().isEmpty());
        WaitForAsyncUtils.waitFor(20, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() ->
                pane.transferPanel.lastPrediction().isPresent()
                        && pane.transferPanel.lastPrediction().get().equals(new ModelStageAdapter().predict("pair", pane.transferPanel.values()))).get());
    }
}

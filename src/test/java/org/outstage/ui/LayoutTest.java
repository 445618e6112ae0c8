package org.outstage.ui;

import static org.junit.jupiter.api.Assertions.*;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import javafx.geometry.Bounds;
import javafx.scene.Node;
import javafx.scene.Scene;
import javafx.scene.control.TableCell;
import javafx.scene.control.TextField;
import javafx.stage.Stage;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.stage.ClippingMetrics;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.capture.CaptureOptions;
import org.outstage.capture.CaptureReader;
import org.testfx.api.FxRobot;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;
import org.testfx.util.WaitForAsyncUtils;

/**
 * Issue 11, finding 12: the layout of the workbench at its usual size (1280 × 800 here, the headless screen).
 * Each test checks one finding on what is on screen; the screenshots in docs/screenshots show the same.
 */
@ExtendWith(ApplicationExtension.class)
class LayoutTest {
    static final Path DIR = Path.of("sample-captures");
    private WorkbenchPane pane;

    @Start
    void start(Stage stage) {
        pane = new WorkbenchPane(new AnalyzerBackend(), new TransferPanel(Optional.of(new ModelStageAdapter())));
        stage.setScene(new Scene(pane, 1280, 800));
        stage.show();
    }

    @BeforeEach
    void samplesPresent() {
        org.junit.jupiter.api.Assertions.assertTrue(Files.isRegularFile(DIR.resolve("bench.txt")), "sample-captures/ is part of the repository");
    }

    private void open(String... names) throws Exception {
        List<Path> files = Stream.of(names).map(DIR::resolve).toList();
        WaitForAsyncUtils.asyncFx(() -> pane.openPaths(files, Calibration.NONE)).get();
        idle();
    }

    private void idle() throws Exception {
        WaitForAsyncUtils.waitFor(30, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> !pane.busy()).get());
        WaitForAsyncUtils.waitForFxEvents();
    }

    private void showTab(FxRobot robot, String id) {
        robot.interact(() -> pane.views.getSelectionModel().select(pane.views.getTabs().stream().filter(t -> t.getId().equals(id)).findFirst().orElseThrow()));
        WaitForAsyncUtils.waitForFxEvents();
    }

    @Test
    void clippingCapture_figuresTableHasClipLevelsAndAsymmetry(FxRobot robot) throws Exception {
        open("da60-scope-70W-clipping.csv");
        FigureRow row = pane.selected().data.figure("clippingValue").orElseThrow(() -> new AssertionError("no clipping row"));
        Measurement m = Analyzer.analyze(CaptureReader.open(DIR.resolve("da60-scope-70W-clipping.csv"), CaptureOptions.none()), 0,
                AnalysisSettings.DEFAULT.withLoadOhms(8));
        ClippingMetrics c = ((StageDiagnosis.Measured) m.stage()).clipping();
        assertTrue(c.detected(), "the scope export is of a clipping cycle");
        assertEquals(AnalyzerBackend.num(c.positive().orElseThrow().levelVolts()), pane.selected().data.figure("clipPositiveValue").orElseThrow().value());
        assertEquals(AnalyzerBackend.num(c.negative().orElseThrow().levelVolts()), pane.selected().data.figure("clipNegativeValue").orElseThrow().value());
        assertEquals("V", pane.selected().data.figure("clipPositiveValue").orElseThrow().unit());
        assertEquals(AnalyzerBackend.num(c.asymmetryPercent().getAsDouble()), row.value());
        assertEquals("%", row.unit());
        assertEquals("clips first: " + c.clipsFirst().label(), row.note());
        assertTrue(pane.figuresTable.getItems().contains(row), "the row is in the table on screen");
    }

    @Test
    void noteColumn_showsTheWholeDiagnosis_wrapped(FxRobot robot) throws Exception {
        open("da60-bias-03mV-40W.wav");
        FigureRow row = pane.selected().data.figure("crossoverValue").orElseThrow();
        assertTrue(row.note().length() > 60, "a diagnosis of some length: " + row.note());
        robot.interact(() -> pane.figuresTable.scrollTo(row));
        WaitForAsyncUtils.waitForFxEvents();
        @SuppressWarnings("unchecked")
        TableCell<FigureRow, String> cell = (TableCell<FigureRow, String>) robot.lookup(".table-cell")
                .match((Node n) -> n instanceof TableCell<?, ?> tc && row.note().equals(tc.getItem())).query();
        // the cell draws the whole note as wrapped text (no ellipsis), inside its column, and the row is tall enough
        javafx.scene.text.Text drawn = (javafx.scene.text.Text) cell.getGraphic();
        assertEquals(row.note(), drawn.getText());
        assertTrue(drawn.getLayoutBounds().getWidth() <= cell.getWidth(), drawn.getLayoutBounds() + " in " + cell.getWidth());
        assertTrue(drawn.getLayoutBounds().getHeight() > 30, "wrapped onto several lines");
        assertTrue(cell.getHeight() >= drawn.getLayoutBounds().getHeight(), cell.getHeight() + " px for " + drawn.getLayoutBounds().getHeight());
        assertEquals(row.note(), cell.getTooltip().getText());
    }

    @Test
    void transferChart_getsTheWidthOfTheView_andItsXAxisSeveralTicks(FxRobot robot) throws Exception {
        open("da60-level-020W.wav");
        showTab(robot, "transferTab");
        WaitForAsyncUtils.waitFor(20, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> pane.transferChart.spec().isPresent()).get());
        WaitForAsyncUtils.waitForFxEvents();
        double viewWidth = pane.views.getWidth();
        assertTrue(pane.transferChart.getWidth() > 0.9 * viewWidth, pane.transferChart.getWidth() + " px of " + viewWidth);
        assertTrue(pane.transferChart.drawnXTicks().size() >= 4, "x ticks " + pane.transferChart.drawnXTicks());
    }

    @Test
    void residualTitle_fitsTheChart_andKeepsTheMagnification(FxRobot robot) throws Exception {
        open("da60-level-020W.wav");
        String full = pane.residualChart.spec().orElseThrow().title();
        assertTrue(full.matches(".*\\(magnified ×[0-9 ]+\\)"), full);
        String drawn = pane.residualChart.drawnTitle();
        assertTrue(drawn.endsWith(full.substring(full.indexOf(" (magnified"))), "the end of the title stays whole: " + drawn);
        assertTrue(pane.residualChart.titleBounds().getMaxX() <= pane.residualChart.getWidth(), "title inside the chart");
        // a narrow chart: the start gives way, the magnification stays
        String[] narrow = ChartCanvas.fitTitle(full, 200);
        assertTrue(narrow[0].startsWith("…") && narrow[0].endsWith(full.substring(full.indexOf("(magnified"))), narrow[0]);
    }

    @Test
    void pointerReadout_staysClearOfTheTitle(FxRobot robot) throws Exception {
        open("da60-level-001W.wav", "da60-level-005W.wav", "da60-level-020W.wav", "da60-level-040W.wav", "da60-level-055W.wav",
                "da60-level-062W.wav", "da60-level-070W.wav");
        showTab(robot, "sweepTab");
        WaitForAsyncUtils.waitFor(60, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> pane.sweepView.result().isPresent()).get());
        WaitForAsyncUtils.waitForFxEvents();
        ChartCanvas c = pane.sweepChart;
        Bounds b = c.localToScreen(c.getBoundsInLocal());
        // near the top right of the plot area, where the readout used to sit on the title
        robot.moveTo(new javafx.geometry.Point2D(b.getMaxX() - 60, b.getMinY() + 60));
        robot.moveBy(-5, 5);
        WaitForAsyncUtils.waitForFxEvents();
        assertFalse(c.readout().getText().isEmpty(), "the readout shows the pointer position");
        assertFalse(c.readout().getBoundsInParent().intersects(c.titleBounds()),
                "readout " + c.readout().getBoundsInParent() + " over title " + c.titleBounds());
    }

    @Test
    void changingTopology_keepsAnEditedVq(FxRobot robot) throws Exception {
        showTab(robot, "transferTab");
        robot.interact(() -> pane.transferPanel.set("vq_mv", 3));
        robot.interact(() -> pane.transferPanel.topologyChoice.setValue("cfp"));
        assertEquals(3.0, pane.transferPanel.values().get("vq_mv"));
        TextField vq = (TextField) robot.lookup("#modelSheet").lookup(".text-field").nth(0).query();
        assertEquals("3", vq.getText());
        // a parameter never edited takes the new topology's default
        double re = new ModelStageAdapter().parameters("cfp").stream().filter(p -> p.key().equals("re")).findFirst().orElseThrow().defaultValue();
        assertEquals(re, pane.transferPanel.values().get("re"));
    }

    @Test
    void invalidModelEntry_saysWhyUnderTheSheet(FxRobot robot) throws Exception {
        showTab(robot, "transferTab");
        TextField vq = (TextField) robot.lookup("#modelSheet").lookup(".text-field").nth(0).query();
        double kept = pane.transferPanel.values().get("vq_mv");
        robot.interact(() -> vq.setText("3,x"));
        assertEquals("Vq per Re (mV): “3,x” is not a number; the model keeps " + TransferPanel.LiveNumberEditor.format(kept),
                pane.transferPanel.modelMessage.getText());
        assertEquals(pane.transferPanel.modelMessage.getText(), vq.getTooltip().getText());
        robot.interact(() -> vq.setText("4"));
        WaitForAsyncUtils.waitFor(20, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> pane.transferPanel.modelMessage.getText().isEmpty()).get());
        assertEquals(4.0, pane.transferPanel.values().get("vq_mv"));
        assertNull(vq.getTooltip());
    }
}

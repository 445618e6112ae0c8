package org.outstage.ui;

import static org.junit.jupiter.api.Assertions.*;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.OptionalInt;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import javafx.scene.Scene;
import javafx.stage.Stage;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Measurement;
import org.outstage.capture.Capture;
import org.outstage.capture.CaptureOptions;
import org.outstage.capture.CaptureReader;
import org.outstage.cli.OutstageCommand;
import org.outstage.json.JsonText;
import org.testfx.api.FxRobot;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;
import org.testfx.util.WaitForAsyncUtils;

/**
 * Issue 11, findings 5, 3 and 4 (workbench side): files and folders opened in the workbench take their folder's
 * calibration notes (sample-captures/bench.txt), the generator channel's role comes from the notes and survives
 * Apply, and the level sweep is the named series, with the same power at 1 % THD as the {@code sweep} command.
 */
@ExtendWith(ApplicationExtension.class)
class CalibrationNotesTest {
    static final Path DIR = Path.of("sample-captures");
    private WorkbenchPane pane;
    private volatile UiSettings lastSettings;

    @Start
    void start(Stage stage) {
        AnalyzerBackend real = new AnalyzerBackend();
        Backend recording = new Backend() {
            @Override public Capture open(Path file, Calibration c) throws Exception { return real.open(file, c); }
            @Override public ViewData analyze(Capture c, int ch, Calibration cal, UiSettings s, java.util.function.DoubleConsumer p,
                                              java.util.function.BooleanSupplier x) {
                lastSettings = s;
                return real.analyze(c, ch, cal, s, p, x);
            }
        };
        pane = new WorkbenchPane(recording, new TransferPanel(Optional.empty()));
        stage.setScene(new Scene(pane, 1280, 800));
        stage.show();
    }

    @BeforeEach
    void samplesPresent() {
        org.junit.jupiter.api.Assertions.assertTrue(Files.isRegularFile(DIR.resolve("bench.txt")), "sample-captures/bench.txt is part of the repository");
    }

    private void idle() throws Exception {
        WaitForAsyncUtils.waitFor(30, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> !pane.busy()).get());
        WaitForAsyncUtils.waitForFxEvents();
    }

    private void allAnalysed() throws Exception {
        idle();
        WaitForAsyncUtils.waitFor(120, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() ->
                pane.captureList.getItems().stream().allMatch(e -> e.failed() || e.data != null)).get());
        WaitForAsyncUtils.waitForFxEvents();
    }

    private int index(String name) {
        for (int i = 0; i < pane.captureList.getItems().size(); i++) if (pane.captureList.getItems().get(i).name.equals(name)) return i;
        throw new AssertionError(name + " not in the list");
    }

    @Test
    void filesGivenByName_takeTheirFoldersNotes_figuresInVoltsWithPower(FxRobot robot) throws Exception {
        // the README's form: gui sample-captures/*.wav (files, no calibration given)
        List<Path> wavs;
        try (Stream<Path> s = Files.list(DIR)) { wavs = s.filter(p -> p.toString().endsWith(".wav")).sorted().toList(); }
        robot.interact(() -> pane.openPaths(wavs, Calibration.NONE));
        idle();
        int i = index("da60-level-040W.wav");
        robot.interact(() -> pane.captureList.getSelectionModel().clearAndSelect(i));
        idle();
        CaptureEntry e = pane.captureList.getItems().get(i);
        assertEquals(new Calibration(java.util.OptionalDouble.of(40), java.util.OptionalDouble.empty(), java.util.OptionalDouble.of(8)), e.calibration,
                "bench.txt: da60-*.wav fs-volts=40 load=8");
        assertEquals(Optional.of("level"), e.series);
        assertEquals("40", pane.fullScaleField.getText());
        assertEquals("8", pane.loadField.getText());
        assertTrue(pane.captureWarnings.getText().contains("bench.txt"), pane.captureWarnings.getText());
        // the figures equal the analysis of the file with the notes' calibration (the bench command's inputs)
        Capture c = CaptureReader.open(DIR.resolve("da60-level-040W.wav"), CaptureOptions.none().withFullScaleVolts(40));
        Measurement m = Analyzer.analyze(c, 0, AnalyzerBackend.settingsFor(UiSettings.DEFAULT, e.calibration));
        assertEquals(AnalyzerBackend.num(m.powerWatts().orElseThrow().totalWatts()) + " W", WorkbenchTest.shown(robot, "powerValue"));
        assertEquals("Level (dBV)", pane.spectrumChart.spec().orElseThrow().yAxis().title());
    }

    @Test
    void folderGiven_scopeCsvTakesItsOwnRule_notTheWavFullScale(FxRobot robot) throws Exception {
        robot.interact(() -> pane.openPaths(List.of(DIR), Calibration.NONE));
        idle();
        CaptureEntry csv = pane.captureList.getItems().get(index("da60-scope-70W-clipping.csv"));
        assertEquals(new Calibration(java.util.OptionalDouble.empty(), java.util.OptionalDouble.empty(), java.util.OptionalDouble.of(8)), csv.calibration,
                "bench.txt: da60-scope-*.csv load=8");
        assertTrue(csv.series.isEmpty());
        CaptureEntry level = pane.captureList.getItems().get(index("da60-level-001W.wav"));
        assertEquals(java.util.OptionalDouble.of(40), level.calibration.fullScaleVolts());
    }

    @Test
    void generatorChannelFromTheNotes_shownInTheReferenceBox_andKeptAfterApply(FxRobot robot) throws Exception {
        Path xy = DIR.resolve("da60-xy-gen-ch1-amp-ch2-10mV-20W.wav");
        robot.interact(() -> pane.openPaths(List.of(xy), Calibration.NONE));
        idle();
        CaptureEntry e = pane.selected();
        assertEquals(OptionalInt.of(0), e.reference, "bench.txt: da60-xy-*.wav reference=1");
        assertEquals(1, e.channel, "the output is the other channel");
        assertEquals("1", pane.referenceChoice.getValue());
        assertEquals(Integer.valueOf(2), pane.channelChoice.getValue());
        assertEquals(OptionalInt.of(0), lastSettings.referenceChannel(), "analysed with the generator as reference");
        assertEquals("1", boxText(robot), "the box shows the notes' reference");
        robot.interact(() -> pane.loadField.setText("8"));
        robot.clickOn("#applyCalibration");
        idle();
        assertEquals("1", pane.referenceChoice.getValue(), "the reference box keeps the role after Apply");
        assertEquals("1", pane.referenceChoice.getSelectionModel().getSelectedItem());
        assertEquals("1", boxText(robot), "the box shows it, not a blank");
        assertEquals(OptionalInt.of(0), lastSettings.referenceChannel());
        assertTrue(pane.selected().data.figure("crossoverValue").isPresent());
        // choosing "none" is a choice for this capture only
        robot.interact(() -> pane.referenceChoice.setValue("none"));
        idle();
        assertEquals(OptionalInt.empty(), pane.selected().reference);
        assertEquals(OptionalInt.empty(), lastSettings.referenceChannel());
    }

    /** The text the reference box shows (its button cell). */
    private String boxText(FxRobot robot) throws Exception {
        return WaitForAsyncUtils.asyncFx(() -> pane.referenceChoice.getButtonCell().getText()).get();
    }

    @Test
    void levelSweep_oneCaptureSelected_isTheNamedSeries_powerAtOnePercentEqualsTheSweepCommand(FxRobot robot) throws Exception {
        robot.interact(() -> pane.openPaths(List.of(DIR), Calibration.NONE));
        allAnalysed();
        int bias = index("da60-bias-03mV-40W.wav");
        robot.interact(() -> pane.captureList.getSelectionModel().clearAndSelect(bias));
        idle();
        WaitForAsyncUtils.waitFor(60, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> pane.sweepView.result().isPresent()).get());
        var r = pane.sweepView.result().orElseThrow();
        List<String> files = r.points().stream().map(p -> p.fileName()).sorted().toList();
        List<String> level;
        try (Stream<Path> s = Files.list(DIR)) {
            level = s.map(p -> p.getFileName().toString()).filter(n -> n.startsWith("da60-level-")).sorted().toList();
        }
        assertEquals(level, files, "only the series named level in bench.txt: no bias, scope or generator capture");
        assertTrue(pane.sweepView.seriesLabel.getText().contains("“level”"), pane.sweepView.seriesLabel.getText());
        // the sweep command on the same files and calibration (fs-volts=40, load=8): the same power at 1 % THD
        List<String> args = new ArrayList<>(List.of("sweep", "--fs-volts", "40", "--load", "8", "--json"));
        for (String f : level) args.add(DIR.resolve(f).toString());
        StringWriter out = new StringWriter(), err = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(out), new PrintWriter(err)).execute(args.toArray(String[]::new));
        assertEquals(0, code, err.toString());
        @SuppressWarnings("unchecked")
        Map<String, Object> json = (Map<String, Object>) JsonText.parse(out.toString());
        double cli = ((Number) json.get("power_at_1pct_thd_w")).doubleValue();
        assertEquals(cli, r.atOnePercent().powerWatts().orElseThrow(), 1e-9 * cli);
        String title = pane.sweepChart.spec().orElseThrow().title();
        assertEquals("THD and THD+N against output power — 1 % THD at " + AnalyzerBackend.num(cli) + " W", title);
    }
}

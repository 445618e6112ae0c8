package org.outstage.ui;

import static org.junit.jupiter.api.Assertions.*;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;
import javafx.scene.Scene;
import javafx.scene.control.Label;
import javafx.scene.control.TabPane;
import javafx.stage.Stage;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.analysis.SineFit;
import org.outstage.analysis.Analyzer;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.TransferCurve;
import org.outstage.capture.Capture;
import org.outstage.capture.SampleUnit;
import org.outstage.plot.Charts;
import org.outstage.plot.Series;
import org.testfx.api.FxRobot;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;
import org.testfx.util.WaitForAsyncUtils;

/**
 * Headless (Monocle) checks that the workbench displays what the backend and the model return, that every
 * view switches, that settings and model parameters take effect, and that an import error is shown in place.
 */
@ExtendWith(ApplicationExtension.class)
class WorkbenchTest {
    private WorkbenchPane pane;
    private final AtomicInteger analyses = new AtomicInteger();
    private volatile UiSettings lastSettings;
    private final List<String> analysed = new java.util.concurrent.CopyOnWriteArrayList<>();

    /** A cubic stage law y = g·(x − a·x³) on [−1, 1]: a small test model whose curve the test can recompute. */
    static final class CubicModel implements StageModelAdapter {
        @Override public List<String> topologies() { return List.of("cubic test law"); }
        @Override public List<Parameter> parameters(String t) {
            return List.of(new Parameter("gain", "Gain", "", 0.95, "small-signal gain"),
                    new Parameter("cubic", "Cubic term", "", 0.02, "a in x − a·x³"));
        }
        @Override public TransferCurve predict(String t, Map<String, Double> v) {
            double g = v.get("gain"), a = v.get("cubic");
            if (g <= 0) throw new IllegalArgumentException("gain must be > 0");
            int n = 101;
            double[] in = new double[n], out = new double[n], d = new double[n];
            for (int i = 0; i < n; i++) { in[i] = -1 + 2.0 * i / (n - 1); out[i] = g * (in[i] - a * Math.pow(in[i], 3)); d[i] = g * (1 - 3 * a * in[i] * in[i]); }
            return new TransferCurve(in, out, d, "V");
        }
    }

    @Start
    void start(Stage stage) {
        AnalyzerBackend fit = new AnalyzerBackend();
        Backend counting = new Backend() {
            @Override public Capture open(Path file, Calibration c) throws Exception { return fit.open(file, c); }
            @Override public ViewData analyze(Capture c, int ch, Calibration cal, UiSettings s, java.util.function.DoubleConsumer p,
                                              java.util.function.BooleanSupplier x) {
                analyses.incrementAndGet();
                analysed.add(c.name());
                lastSettings = s;
                return fit.analyze(c, ch, cal, s, p, x);
            }
        };
        pane = new WorkbenchPane(counting, new TransferPanel(Optional.of(new CubicModel())));
        stage.setScene(new Scene(pane, 1280, 800));
        stage.show();
    }

    /** 0.5 s at 96 kHz of a 997 Hz sine with a small dead band at each crossing and seeded white noise. */
    static Capture sine(String name) {
        double fs = 96_000;
        double[] x = new double[48_000];
        java.util.Random r = new java.util.Random(11);
        for (int i = 0; i < x.length; i++) {
            double s = 2.5 * Math.cos(2 * Math.PI * 997 * i / fs + 0.4);
            x[i] = s - 0.01 * Math.tanh(s / 0.01) + 2e-4 * r.nextGaussian();
        }
        return Capture.inMemory(name, fs, SampleUnit.VOLTS, x);
    }

    static String shown(FxRobot robot, String id) {
        return robot.lookup("#" + id).queryAs(Label.class).getText();
    }

    private void idle() throws Exception {
        WaitForAsyncUtils.waitFor(20, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> !pane.busy()).get());
        WaitForAsyncUtils.waitForFxEvents();
    }

    @Test
    void sineCapture_figuresEqualTheAnalyzersMeasurementAndEveryViewShows(FxRobot robot) throws Exception {
        Capture c = sine("bench sine");
        robot.interact(() -> pane.addCapture(c));
        idle();
        // what the analyzer returns for the same capture and settings
        Measurement m = Analyzer.analyze(c, 0, AnalyzerBackend.settingsFor(UiSettings.DEFAULT, Calibration.NONE));
        assertTrue(m.measured());
        assertEquals(AnalyzerBackend.pct(m.thd().percent()) + " %", shown(robot, "thdValue"));
        assertEquals(AnalyzerBackend.pct(m.thdN().percent()) + " %", shown(robot, "thdnValue"));
        assertEquals(AnalyzerBackend.pct(100 * m.floor().ratio()) + " %", shown(robot, "floorValue"));
        assertEquals(AnalyzerBackend.num(m.fundamental().frequencyHz()) + " Hz", shown(robot, "frequencyValue"));
        FigureRow thdn = pane.figuresTable.getItems().stream().filter(r -> r.id().equals("thdnValue")).findFirst().orElseThrow();
        assertTrue(thdn.note().startsWith("floor "), "floor beside THD+N: " + thdn.note());
        assertEquals(m.harmonics().size(), pane.figuresTable.getItems().stream().filter(r -> r.quantity().matches("H\\d+")).count());
        // the waveform chart shows the capture and the analyzer's fitted fundamental
        SineFit expected = m.sineFit();
        Series fitSeries = pane.waveformChart.spec().orElseThrow().series().get(1);
        assertEquals(expected.valueAt(100 / c.sampleRateHz()), fitSeries.yAt(100), 1e-12);
        assertTrue(pane.residualChart.spec().orElseThrow().title().contains("magnified"));
        // the spectrum is the analyzer's, shifted from dB re fundamental to dBV
        Series spec = pane.spectrumChart.spec().orElseThrow().series().get(0);
        assertEquals(m.spectrum().levelDb()[200] + 20 * Math.log10(m.fundamental().rms()), spec.yAt(200), 1e-9);
        assertEquals("Level (dBV)", pane.spectrumChart.spec().get().yAxis().title());
        assertEquals(m.harmonics().size(), pane.spectrumChart.spec().get().markers().size());
        assertEquals(m.harmonics().get(1).dbc(), pane.harmonicsChart.spec().orElseThrow().series().get(0).yAt(0), 0.0); // H3, first odd bar
        // the spectrum scale switch: dB re fundamental, where a harmonic's marker reads the analyzer's dBc
        robot.interact(() -> pane.spectrumRelativeBox.setSelected(true));
        assertEquals("Level (dB re fundamental)", pane.spectrumChart.spec().orElseThrow().yAxis().title());
        assertEquals(m.spectrum().levelDb()[200], pane.spectrumChart.spec().get().series().get(0).yAt(200), 1e-12);
        assertEquals(m.harmonics().get(1).dbc(), pane.spectrumChart.spec().get().markers().get(1).y(), 1e-12);
        robot.interact(() -> pane.spectrumRelativeBox.setSelected(false));
        assertEquals("Level (dBV)", pane.spectrumChart.spec().orElseThrow().yAxis().title());

        TabPane views = robot.lookup("#views").queryAs(TabPane.class);
        for (String tab : List.of("spectrumTab", "harmonicsTab", "transferTab", "sweepTab", "waveformTab")) {
            robot.interact(() -> views.getSelectionModel().select(views.getTabs().stream().filter(t -> t.getId().equals(tab)).findFirst().get()));
            assertEquals(tab, views.getSelectionModel().getSelectedItem().getId());
        }
        // the level sweep needs several captures with a load: it says so in place
        assertTrue(pane.sweepChart.message().contains("two or more"), pane.sweepChart.message());
        assertTrue(pane.sweepView.seriesLabel.getText().contains("name none"), pane.sweepView.seriesLabel.getText());
    }

    @Test
    void changingABandSetting_reanalysesWithTheNewSettings(FxRobot robot) throws Exception {
        Capture c = sine("s");
        robot.interact(() -> pane.addCapture(c));
        idle();
        String narrow = shown(robot, "thdnValue");
        int before = analyses.get();
        robot.interact(() -> pane.bandChoice.setValue(UiSettings.BandChoice.WIDE_80K));
        idle();
        assertTrue(analyses.get() > before);
        assertEquals(UiSettings.BandChoice.WIDE_80K, lastSettings.band());
        Measurement wide = Analyzer.analyze(c, 0, AnalyzerBackend.settingsFor(lastSettings, Calibration.NONE));
        assertEquals(AnalyzerBackend.pct(wide.thdN().percent()) + " %", shown(robot, "thdnValue"));
        assertNotEquals(narrow, shown(robot, "thdnValue"), "a wider band holds more noise");
        robot.interact(() -> pane.weightingBox.setSelected(true));
        idle();
        Measurement weighted = Analyzer.analyze(c, 0, AnalyzerBackend.settingsFor(lastSettings, Calibration.NONE));
        assertTrue(lastSettings.aWeighting());
        assertEquals(AnalyzerBackend.pct(weighted.thdN().percent()) + " %", shown(robot, "thdnValue"));
        robot.interact(() -> pane.harmonicsSpinner.getValueFactory().setValue(15));
        idle();
        assertEquals(15, lastSettings.harmonics());
    }

    @Test
    void modelParameterChange_redrawsTheOverlayFromTheModelsResult(FxRobot robot) throws Exception {
        TabPane views = robot.lookup("#views").queryAs(TabPane.class);
        robot.interact(() -> views.getSelectionModel().select(3));
        robot.interact(() -> pane.transferPanel.set("cubic", 0.08));
        WaitForAsyncUtils.waitFor(10, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() ->
                pane.transferPanel.values().get("cubic") == 0.08 && pane.transferPanel.lastPrediction().isPresent()
                        && pane.transferChart.spec().isPresent()
                        && pane.transferChart.spec().get().series().get(0).yAt(50) == Charts.gainDeviationPercent(
                        new CubicModel().predict("", Map.of("gain", 0.95, "cubic", 0.08)))[1][50]).get());
        TransferCurve expected = new CubicModel().predict("", Map.of("gain", 0.95, "cubic", 0.08));
        double[][] dev = Charts.gainDeviationPercent(expected);
        Series shown = pane.transferChart.spec().orElseThrow().series().get(0);
        assertEquals(Series.Role.MODEL, shown.role());
        assertArrayEquals(dev[1], shown.y(), 0.0);
        // an impossible value: the model's message appears in place, the window keeps working
        robot.interact(() -> pane.transferPanel.set("gain", -1));
        WaitForAsyncUtils.waitFor(10, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> !pane.transferPanel.modelMessage.getText().isEmpty()).get());
        assertEquals("Model: gain must be > 0", pane.transferPanel.modelMessage.getText());
    }

    @Test
    void unreadableFile_errorShownBesideTheFile(FxRobot robot, @TempDir Path dir) throws Exception {
        Path bad = Files.writeString(dir.resolve("broken.wav"), "not a wav");
        robot.interact(() -> pane.openPaths(List.of(bad)));
        idle();
        CaptureEntry e = pane.captureList.getItems().get(0);
        assertTrue(e.failed());
        assertTrue(e.toString().startsWith("broken.wav  —  "), e.toString());
        assertTrue(pane.importError.getText().startsWith("broken.wav: "), pane.importError.getText());
        assertTrue(pane.waveformChart.message().startsWith("Could not open broken.wav"));
        assertFalse(pane.importError.getText().contains("Exception"), "one plain line, no exception class");
    }

    @Test
    void exports_svgAndCsvComeFromTheSameSpec_pngIsAnImage(FxRobot robot, @TempDir Path dir) throws Exception {
        robot.interact(() -> pane.addCapture(sine("export me")));
        idle();
        Path svg = dir.resolve("s.svg"), csv = dir.resolve("s.csv"), png = dir.resolve("s.png");
        robot.interact(() -> {
            try {
                ChartExport.export(pane.spectrumChart, "svg", svg);
                ChartExport.export(pane.spectrumChart, "csv", csv);
                ChartExport.export(pane.waveformChart, "png", png);
            } catch (java.io.IOException e) {
                throw new java.io.UncheckedIOException(e);
            }
        });
        var spec = pane.spectrumChart.spec().orElseThrow();
        assertEquals(org.outstage.report.SvgRenderer.render(spec, (int) Math.max(320, pane.spectrumChart.getWidth()),
                (int) Math.max(200, pane.spectrumChart.getHeight())), Files.readString(svg));
        assertEquals(org.outstage.plot.CsvExport.toCsv(spec), Files.readString(csv));
        byte[] head = Arrays.copyOf(Files.readAllBytes(png), 8);
        assertArrayEquals(new byte[] {(byte) 0x89, 'P', 'N', 'G', '\r', '\n', 0x1a, '\n'}, head);   // PNG signature (RFC 2083)
        javafx.scene.image.Image img = new javafx.scene.image.Image(png.toUri().toString());
        assertEquals(Math.round(pane.waveformChart.getWidth()), Math.round(img.getWidth()));
    }

    @Test
    void sampleSession_opensCalibrated_figuresAndSweepEqualTheAnalysis(FxRobot robot) throws Exception {
        Path dir = Path.of("sample-captures");
        org.junit.jupiter.api.Assertions.assertTrue(Files.isDirectory(dir), "sample-captures/ is part of the repository");
        robot.interact(() -> pane.openPaths(List.of(dir), Workbench.SAMPLE_SESSION));
        idle();
        long files;
        try (var st = Files.list(dir)) { files = st.filter(WorkbenchPane::isCaptureName).count(); }
        assertEquals(files, pane.captureList.getItems().size());
        assertTrue(pane.captureList.getItems().stream().noneMatch(CaptureEntry::failed),
                () -> pane.captureList.getItems().stream().filter(CaptureEntry::failed).map(CaptureEntry::toString).toList().toString());
        // one level capture: the figures equal the analysis of the same file with the same calibration
        int idx = -1;
        for (int i = 0; i < pane.captureList.getItems().size(); i++) if (pane.captureList.getItems().get(i).name.equals("da60-level-040W.wav")) idx = i;
        int sel = idx;
        robot.interact(() -> pane.captureList.getSelectionModel().clearAndSelect(sel));
        idle();
        Capture c = org.outstage.capture.CaptureReader.open(dir.resolve("da60-level-040W.wav"),
                org.outstage.capture.CaptureOptions.none().withFullScaleVolts(40));
        Measurement m = Analyzer.analyze(c, 0, AnalyzerBackend.settingsFor(UiSettings.DEFAULT, Workbench.SAMPLE_SESSION));
        assertEquals(AnalyzerBackend.pct(m.thd().percent()) + " %", shown(robot, "thdValue"));
        assertEquals(AnalyzerBackend.num(m.powerWatts().orElseThrow().totalWatts()) + " W", shown(robot, "powerValue"));
        // the level sweep over the level series: its title carries the analysis's power at 1 % THD
        WaitForAsyncUtils.waitFor(60, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() ->
                pane.captureList.getItems().stream().allMatch(e -> e.data != null)).get());
        robot.interact(() -> {
            var items = pane.captureList.getItems();
            for (int i = 0; i < items.size(); i++) if (items.get(i).name.contains("-level-")) pane.captureList.getSelectionModel().select(i);
        });
        WaitForAsyncUtils.waitForFxEvents();
        List<org.outstage.analysis.stage.LevelPoint> pts = new java.util.ArrayList<>();
        for (CaptureEntry e : pane.captureList.getItems())
            if (e.name.contains("-level-")) pts.add(e.data.sweepPoint().orElseThrow().point());
        var r = org.outstage.analysis.stage.LevelSweep.analyze(pts);
        String title = pane.sweepChart.spec().orElseThrow().title();
        assertEquals("THD and THD+N against output power — 1 % THD at " + AnalyzerBackend.num(r.atOnePercent().powerWatts().orElseThrow()) + " W", title);
        assertEquals(pts.size(), pane.sweepChart.spec().get().series().get(0).size());
    }

    /** A backend that counts the analyses it is asked for, around the real one. */
    static final class CountingBackend implements Backend {
        final AnalyzerBackend real = new AnalyzerBackend();
        final List<String> analysed = new java.util.concurrent.CopyOnWriteArrayList<>();
        @Override public Capture open(Path file, Calibration c) throws Exception { return real.open(file, c); }
        @Override public ViewData analyze(Capture c, int ch, Calibration cal, UiSettings s, java.util.function.DoubleConsumer p,
                                          java.util.function.BooleanSupplier x) {
            analysed.add(c.name());
            return real.analyze(c, ch, cal, s, p, x);
        }
    }

    /** One sample capture and the sample session's notes, in a folder of their own. */
    private static Path oneSampleCapture(Path dir) throws Exception {
        Files.copy(Path.of("sample-captures", "bench.txt"), dir.resolve("bench.txt"));
        Path wav = dir.resolve("da60-level-040W.wav");
        Files.copy(Path.of("sample-captures", "da60-level-040W.wav"), wav);
        return wav;
    }

    @Test
    void earlyAnalysis_theWindowTakesItAndShowsTheFiguresOfItsOwnRules(FxRobot robot, @TempDir Path dir) throws Exception {
        Path wav = oneSampleCapture(dir);
        CountingBackend early = new CountingBackend();
        EarlyAnalysis a = EarlyAnalysis.start(early, WorkbenchLauncher.firstCapture(new String[] {dir.toString()}).orElseThrow(),
                Calibration.NONE, UiSettings.DEFAULT);
        robot.interact(() -> { pane.adopt(a); pane.openPaths(List.of(dir)); });
        idle();
        // analysed once, early, and not again by the window
        assertEquals(List.of("da60-level-040W.wav"), early.analysed);
        assertFalse(analysed.contains("da60-level-040W.wav"), analysed.toString());
        // the figures are those of the file with its folder's notes (fs-volts=40 load=8), as analyze gives them
        Capture c = org.outstage.capture.CaptureReader.open(wav, org.outstage.capture.CaptureOptions.none().withFullScaleVolts(40));
        Measurement m = Analyzer.analyze(c, 0, AnalyzerBackend.settingsFor(UiSettings.DEFAULT, Workbench.SAMPLE_SESSION),
                org.outstage.analysis.SpecConditions.AUTO);
        assertEquals(AnalyzerBackend.pct(m.thd().percent()) + " %", shown(robot, "thdValue"));
        assertEquals(AnalyzerBackend.num(m.powerWatts().orElseThrow().totalWatts()) + " W", shown(robot, "powerValue"));
    }

    @Test
    void earlyAnalysis_withOtherSettings_theWindowAnalysesItself(FxRobot robot, @TempDir Path dir) throws Exception {
        oneSampleCapture(dir);
        CountingBackend early = new CountingBackend();
        EarlyAnalysis a = EarlyAnalysis.start(early, WorkbenchLauncher.firstCapture(new String[] {dir.toString()}).orElseThrow(),
                Calibration.NONE, UiSettings.DEFAULT.withHarmonics(5));
        robot.interact(() -> { pane.adopt(a); pane.openPaths(List.of(dir)); });
        idle();
        assertEquals(List.of("da60-level-040W.wav"), analysed);
        assertEquals(UiSettings.DEFAULT.harmonics(), lastSettings.harmonics());
        assertFalse(shown(robot, "thdValue").isBlank());
    }

    @Test
    void referenceChannel_transferViewShowsTheXyCurveOfTheAnalysis(FxRobot robot) throws Exception {
        Path xy = Path.of("sample-captures", "da60-xy-gen-ch1-amp-ch2-10mV-20W.wav");
        org.junit.jupiter.api.Assertions.assertTrue(Files.isRegularFile(xy), "sample X-Y capture present");
        robot.interact(() -> pane.openPaths(List.of(xy), Workbench.SAMPLE_SESSION));
        idle();
        robot.interact(() -> pane.channelChoice.setValue(2));
        idle();
        robot.interact(() -> pane.referenceChoice.setValue("1"));
        idle();
        assertEquals(java.util.OptionalInt.of(0), lastSettings.referenceChannel());
        Capture c = org.outstage.capture.CaptureReader.open(xy, org.outstage.capture.CaptureOptions.none().withFullScaleVolts(40));
        Measurement m = Analyzer.analyze(c, 1, AnalyzerBackend.settingsFor(lastSettings, Workbench.SAMPLE_SESSION));
        TransferCurve curve = org.outstage.plot.MeasurementCharts.measuredCurve(m).orElseThrow();
        assertTrue(m.stage() instanceof org.outstage.analysis.stage.StageDiagnosis.Measured d && d.transfer().fromReference());
        Series shown = pane.transferChart.spec().orElseThrow().series().get(0);
        assertEquals(Series.Role.MEASURED, shown.role());
        assertArrayEquals(Charts.gainDeviationPercent(curve)[1], shown.y(), 0.0);
    }

    @Test
    void badCalibrationText_messageInPlace(FxRobot robot) throws Exception {
        robot.interact(() -> pane.addCapture(sine("s")));
        idle();
        robot.interact(() -> { pane.loadField.setText("eight"); });
        robot.clickOn("#applyCalibration");
        WaitForAsyncUtils.waitForFxEvents();
        assertEquals("Load 'eight' is not a number", pane.calibrationError.getText());
    }

    /** Opens one bundled sample capture with its folder's notes, shows the spec-sheet view, and waits for the analysis. */
    private Capture openSample(FxRobot robot, String file) throws Exception {
        Path f = Path.of("sample-captures", file);
        assertTrue(Files.isRegularFile(f), "bundled sample capture present: " + f);
        robot.interact(() -> pane.openPaths(List.of(f), Workbench.SAMPLE_SESSION));
        idle();
        TabPane views = robot.lookup("#views").queryAs(TabPane.class);
        robot.interact(() -> views.getSelectionModel().select(pane.specView.tab()));
        WaitForAsyncUtils.waitForFxEvents();
        // bench.txt: fs-volts=40 for every da60 file
        return org.outstage.capture.CaptureReader.open(f, org.outstage.capture.CaptureOptions.none().withFullScaleVolts(40));
    }

    /** What analyze and verify measure for the same file and settings (no stated stimulus). */
    private static Measurement specAnalysis(Capture c, int channel) {
        return Analyzer.analyze(c, channel, AnalyzerBackend.settingsFor(UiSettings.DEFAULT, Workbench.SAMPLE_SESSION).withLoadOhms(8),
                org.outstage.analysis.SpecConditions.AUTO);
    }

    private FigureRow row(String id) {
        return pane.figuresTable.getItems().stream().filter(r -> r.id().equals(id)).findFirst()
                .orElseThrow(() -> new AssertionError("no figures-table row " + id));
    }

    @Test
    void smpteCapture_specSheetViewShowsTheAnalysisIntermodulation(FxRobot robot) throws Exception {
        Capture c = openSample(robot, "da60-imd-smpte-60Hz-7kHz-10W.wav");
        org.outstage.analysis.Intermodulation imd = specAnalysis(c, 0).imd().orElseThrow();
        assertEquals(org.outstage.analysis.Intermodulation.Method.MODULATION, imd.method());
        assertEquals(AnalyzerBackend.pct(imd.percent()) + " %", shown(robot, "sheetImdValue"));
        assertEquals(AnalyzerBackend.db(imd.db()) + " dB", shown(robot, "sheetImdDbValue"));
        assertEquals(AnalyzerBackend.pct(100 * imd.order(2)) + " %", shown(robot, "sheetImdD2Value"));
        assertEquals(AnalyzerBackend.pct(100 * imd.order(3)) + " %", shown(robot, "sheetImdD3Value"));
        assertEquals("Intermodulation (smpte) — da60-imd-smpte-60Hz-7kHz-10W.wav", pane.specView.kindLabel.getText());
        // the same figures in the figures table, and large in the summary
        assertEquals(AnalyzerBackend.pct(imd.percent()), row("imdValue").value());
        assertEquals(AnalyzerBackend.pct(imd.percent()) + " %", shown(robot, "imdValue"));
        // the chart is the report's: one marker per product, at the analysis' level
        var spec = pane.specView.specChart.spec().orElseThrow();
        assertTrue(spec.title().contains("intermodulation (smpte"), spec.title());
        assertEquals(imd.products().size(), spec.markers().size());
        assertEquals(Math.max(-200, imd.products().get(0).dbc()), spec.markers().get(0).y(), 1e-12);
        assertEquals(1, pane.specView.charts().stream().filter(ch -> ch.getParent() != null && ch.isVisible() && ch.getScene() != null).count());
    }

    @Test
    void twinToneCapture_specSheetViewShowsTheDifferenceFrequencyFigures(FxRobot robot) throws Exception {
        Capture c = openSample(robot, "da60-imd-twin-19k-20k-10W.wav");
        org.outstage.analysis.Intermodulation imd = specAnalysis(c, 0).imd().orElseThrow();
        assertEquals(org.outstage.analysis.Intermodulation.Method.DIFFERENCE_FREQUENCY, imd.method());
        assertEquals(AnalyzerBackend.pct(imd.percent()) + " %", shown(robot, "sheetImdValue"));
        assertEquals(AnalyzerBackend.pct(100 * imd.order(3)) + " %", shown(robot, "sheetImdD3Value"));
    }

    @Test
    void noiseCapture_specSheetViewShowsNoiseHumAndSignalToNoise(FxRobot robot) throws Exception {
        Capture c = openSample(robot, "da60-noise-input-shorted.wav");
        Measurement m = specAnalysis(c, 0);
        org.outstage.analysis.NoiseFigures n = m.noise().orElseThrow();
        assertEquals(AnalyzerBackend.num(n.rms()) + " V", shown(robot, "sheetNoiseValue"));
        assertEquals(AnalyzerBackend.num(n.rmsA()) + " V", shown(robot, "sheetNoiseAValue"));
        assertEquals(AnalyzerBackend.db(n.db()) + " dBV", shown(robot, "sheetNoiseDbValue"));
        assertEquals(AnalyzerBackend.db(n.snrRe1WDb().orElseThrow()) + " dB", shown(robot, "sheetSnrValue"));
        assertEquals(AnalyzerBackend.num(n.mainsHz().orElseThrow()) + " Hz", shown(robot, "sheetHumValue"));
        assertEquals(AnalyzerBackend.num(n.rms()), row("noiseValue").value());
        // the hum line is not a test tone: no THD or power row for it, and no stage figures
        assertTrue(pane.figuresTable.getItems().stream().noneMatch(r -> r.id().equals("thdValue") || r.id().equals("powerValue")));
        assertEquals("not measured", row("crossoverValue").value());
        // the noise spectrum is the analysis' spectrum in dBV, with one marker per hum line at its level and the noise as lines
        var spec = pane.specView.specChart.spec().orElseThrow();
        assertEquals(m.spectrum().levelDb()[100] + org.outstage.plot.MeasurementCharts.spectrumShiftDb(m), spec.series().get(0).yAt(100), 1e-9);
        assertEquals(n.hum().size(), spec.markers().size());
        assertEquals(20 * Math.log10(n.hum().get(0).rms()), spec.markers().get(0).y(), 1e-9);
        assertEquals(n.db(), spec.lines().get(0).y(), 1e-12);
        assertEquals(n.dbA(), spec.lines().get(1).y(), 1e-12);
    }

    @Test
    void sweepWithGeneratorChannel_specSheetViewShowsGainWithMinus3dbPointsAndPhase(FxRobot robot) throws Exception {
        Capture c = openSample(robot, "da60-sweep-gen-ch1-amp-ch2-1W.wav");
        // bench.txt: reference=1, so the output is channel 2
        assertEquals(java.util.OptionalInt.of(0), lastSettings.referenceChannel());
        org.outstage.analysis.FrequencyResponse r = org.outstage.analysis.SweepResponse.measure(c.readChannel(1), c.readChannel(0),
                c.sampleRateHz(), true, org.outstage.analysis.Band.AUDIO_20_20K);
        assertEquals(org.outstage.analysis.Levels.formatHz(r.minus3dbLowHz().orElseThrow()), shown(robot, "sheetResponseLowValue"));
        // the sample amplifier's input high-pass is at 3.5 Hz and nothing rolls off below 22 kHz (sample-captures/README.md)
        assertTrue(r.minus3dbHighHz().isEmpty());
        assertEquals("—", shown(robot, "sheetResponseHighValue"));
        assertTrue(row("responseHighValue").note().startsWith("not reached up to"), row("responseHighValue").note());
        assertEquals(String.format(java.util.Locale.ROOT, "%+.2f / %+.2f dB", r.deviationMaxDb(), r.deviationMinDb()), shown(robot, "sheetDeviationValue"));
        assertEquals(org.outstage.analysis.Levels.formatHz(r.minus3dbLowHz().getAsDouble()), row("responseLowValue").value());
        // a swept capture is not shown as a noise capture
        assertTrue(pane.figuresTable.getItems().stream().noneMatch(x -> x.id().equals("noiseValue")));
        var gain = pane.specView.specChart.spec().orElseThrow();
        assertTrue(gain.title().endsWith("frequency response"), gain.title());
        assertEquals(1, gain.markers().size());
        assertEquals(r.minus3dbLowHz().getAsDouble(), gain.markers().get(0).x(), 0.0);
        assertEquals(r.points().get(10).gainRe1kHzDb(), gain.series().get(0).yAt(10), 0.0);
        var phase = pane.specView.specChart2.spec().orElseThrow();
        assertTrue(phase.title().endsWith("phase"), phase.title());
        assertEquals(r.points().get(10).phaseDeg(), phase.series().get(0).yAt(10), 0.0);
    }

    @Test
    void ordinaryTone_specSheetViewSaysWhatItIsFor(FxRobot robot) throws Exception {
        robot.interact(() -> pane.addCapture(sine("plain tone")));
        idle();
        assertTrue(pane.specView.specChart.message().startsWith("No spec-sheet figures"), pane.specView.specChart.message());
        assertEquals("", pane.specView.kindLabel.getText());
    }
}

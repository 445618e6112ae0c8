package org.outstage.ui;

import static org.junit.jupiter.api.Assertions.*;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import java.util.concurrent.TimeUnit;
import javafx.scene.Scene;
import javafx.scene.control.Label;
import javafx.stage.Stage;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.extension.ExtendWith;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.cli.OutstageCommand;
import org.outstage.live.LiveResult;
import org.outstage.logbook.BiasStep;
import org.outstage.logbook.Logbook;
import org.testfx.api.FxRobot;
import org.testfx.framework.junit5.ApplicationExtension;
import org.testfx.framework.junit5.Start;
import org.testfx.util.WaitForAsyncUtils;

/**
 * The Live view (issue 9): no device said plainly; cautions before the first start; each block's figures as the live
 * package measured them and the strip chart over time, fed by a synthetic block series through the same listener;
 * the start level; stop on window close; calibration from a meter; logging the last block as a logbook step.
 * With PULSE_SERVER set (tools/virtual-soundcard), one test starts and stops the real sound path.
 */
@ExtendWith(ApplicationExtension.class)
class LiveViewTest {
    private WorkbenchPane pane;
    private Stage stage;
    private final SyntheticLiveSource synthetic = new SyntheticLiveSource(40, 6, 400);

    @Start
    void start(Stage stage) {
        this.stage = stage;
        System.setProperty("outstage.config", Path.of("target", "outstage-config-livetest-" + System.nanoTime()).toString());
        pane = new WorkbenchPane(new AnalyzerBackend(), new TransferPanel(Optional.empty()), synthetic);
        stage.setScene(new Scene(pane, 1280, 800));
        stage.show();
    }

    private LiveView live(FxRobot robot) {
        robot.interact(() -> pane.views.getSelectionModel().select(pane.liveView.tab()));
        return pane.liveView;
    }

    private void startPastCautions(FxRobot robot) {
        robot.clickOn("#liveStart");
        WaitForAsyncUtils.waitForFxEvents();
        robot.clickOn("#liveCautionsStart");
        WaitForAsyncUtils.waitForFxEvents();
    }

    private void blocks(LiveView v, int n) throws Exception {
        WaitForAsyncUtils.waitFor(60, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> v.blocks() >= n).get());
        WaitForAsyncUtils.waitForFxEvents();
    }

    private static String shown(FxRobot robot, String id) { return robot.lookup("#" + id).queryAs(Label.class).getText(); }

    @Test
    void noSoundDevice_theViewSaysSoPlainly_andStartStaysOff(FxRobot robot) throws Exception {
        LiveSource none = new LiveSource() {
            @Override public List<String> inputDevices() { return List.of(); }
            @Override public String noDeviceReason() { return LiveSource.soundcard().noDeviceReason(); }
            @Override public Running start(org.outstage.live.LiveSettings s, org.outstage.live.LiveListener l) { throw new AssertionError("must not start"); }
        };
        LiveView v = WaitForAsyncUtils.asyncFx(() -> new LiveView(none, () -> true, () -> {})).get();
        robot.interact(() -> { pane.views.getTabs().add(v.tab()); pane.views.getSelectionModel().select(v.tab()); });
        assertTrue(v.deviceMessage.getText().startsWith("No sound device: Java Sound lists no input"), v.deviceMessage.getText());
        assertTrue(v.startButton.isDisabled());
        robot.interact(v::requestStart);   // even asked directly, nothing starts and nothing throws
        assertFalse(v.isRunning());
    }

    @Test
    void realSoundcardWithoutAServer_saysNoDevice_noCrash(FxRobot robot) throws Exception {
        if (System.getenv("PULSE_SERVER") != null) {
            // a sound server runs here (CI starts the virtual soundcard), so this JVM cannot lose it: the same Java Sound
            // backend is asked in a child JVM whose server address leads nowhere; it must list no device and not fail
            List<String> cmd = List.of(java.nio.file.Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                    "-Djava.awt.headless=true", "-cp", System.getProperty("java.class.path"), "org.outstage.Launcher", "devices", "--json");
            ProcessBuilder pb = new ProcessBuilder(cmd).redirectErrorStream(true);
            pb.environment().put("PULSE_SERVER", "unix:/nonexistent/outstage-no-server");
            Process p = pb.start();
            String out = new String(p.getInputStream().readAllBytes(), java.nio.charset.StandardCharsets.UTF_8);
            assertTrue(p.waitFor(60, java.util.concurrent.TimeUnit.SECONDS), "devices ended");
            assertEquals(0, p.exitValue(), out);
            assertTrue(out.contains("\"inputs\": []") && out.contains("\"outputs\": []"), out);
            return;
        }
        LiveSource real = LiveSource.soundcard();
        Assumptions.assumeTrue(real.inputDevices().isEmpty(), "this machine has a sound input");
        LiveView v = WaitForAsyncUtils.asyncFx(() -> new LiveView(real, () -> true, () -> {})).get();
        robot.interact(() -> { pane.views.getTabs().add(v.tab()); pane.views.getSelectionModel().select(v.tab()); });
        assertTrue(v.deviceMessage.getText().startsWith("No sound device"), v.deviceMessage.getText());
        assertTrue(v.startButton.isDisabled());
    }

    @Test
    void firstStart_cautionsFirst_thenEachBlocksFiguresAndTheStripChart(FxRobot robot) throws Exception {
        LiveView v = live(robot);
        robot.interact(() -> v.fullScaleField.setText("40"));
        robot.clickOn("#liveStart");
        WaitForAsyncUtils.waitForFxEvents();
        assertTrue(v.cautionsBox.isVisible(), "cautions before the first live start");
        String text = robot.lookup("#liveCautionsText").queryAs(Label.class).getText();
        for (String must : List.of("attenuator", "bridged", "dummy load", "-20 dBFS")) assertTrue(text.contains(must), must + " in: " + text);
        assertEquals(0, synthetic.starts, "nothing plays before the cautions are confirmed");
        robot.clickOn("#liveCautionsStart");
        blocks(v, 6);
        robot.clickOn("#liveStop");
        WaitForAsyncUtils.waitForFxEvents();
        assertFalse(synthetic.running.get());
        LiveResult r = v.lastResult().orElseThrow();
        Measurement m = r.measurements().get(0);
        assertEquals("V", m.unit());
        assertEquals(AnalyzerBackend.pct(m.thd().percent()) + " %", shown(robot, "liveThd"));
        assertEquals(AnalyzerBackend.pct(m.thdN().percent()) + " %", shown(robot, "liveThdn"));
        assertEquals(AnalyzerBackend.num(m.powerWatts().orElseThrow().totalWatts()) + " W", shown(robot, "livePower"));
        StageDiagnosis.Measured d = (StageDiagnosis.Measured) m.stage();
        assertEquals(String.format(java.util.Locale.ROOT, "%.4f ± %.2g  %s", d.crossover().gainAtZero(), d.crossover().gainAtZeroStdError(),
                d.crossover().verdict().label()), shown(robot, "liveGain"));
        assertEquals("0", shown(robot, "liveDropped"));
        // the strip chart: one point per block, the last one the last block's gain at zero
        var series = v.gainChart.spec().orElseThrow().series().get(0);
        assertEquals(v.blocks(), series.size());
        // in % of the large-signal gain; a block whose σ exceeds a quarter of it is a gap in the line
        if (d.crossover().gainAtZeroStdError() <= LiveView.STRIP_MAX_STD_ERROR)
            assertEquals(100 * d.crossover().gainAtZero(), series.yAt(series.size() - 1), 1e-12);
        else
            assertTrue(Double.isNaN(series.yAt(series.size() - 1)));
        assertEquals(r.timeSeconds(), series.x()[series.size() - 1], 0.0);
        assertEquals(m.thd().percent(), v.thdChart.spec().orElseThrow().series().get(0).yAt(series.size() - 1), 0.0);
        // a second start in the same run: no cautions again
        robot.clickOn("#liveStart");
        WaitForAsyncUtils.waitForFxEvents();
        assertFalse(v.cautionsBox.isVisible());
        assertTrue(v.isRunning());
        robot.clickOn("#liveStop");
    }

    @Test
    void startAboveMinus20Dbfs_isRefusedInPlace(FxRobot robot) throws Exception {
        LiveView v = live(robot);
        robot.interact(() -> v.levelField.setText("-12"));
        startPastCautions(robot);
        assertFalse(v.isRunning());
        assertEquals(0, synthetic.starts);
        assertEquals("Not started: start at -20 dBFS or below (-12 given); raise the level while it runs", v.status.getText());
    }

    @Test
    void closingTheWindow_stopsPlayback(FxRobot robot) throws Exception {
        LiveView v = live(robot);
        startPastCautions(robot);
        blocks(v, 1);
        assertTrue(synthetic.running.get());
        robot.interact(() -> stage.hide());
        assertFalse(synthetic.running.get(), "playback stops with the window");
        assertFalse(v.isRunning());
    }

    @Test
    void meterReading_givesFullScaleVolts_aSineOfPeakAHasRmsAOverRoot2(FxRobot robot) throws Exception {
        LiveView v = live(robot);
        robot.interact(() -> { v.levelField.setText("-26"); v.fullScaleField.setText(""); });
        startPastCautions(robot);
        blocks(v, 4);
        robot.clickOn("#liveStop");
        robot.interact(() -> v.meterField.setText("1.4"));
        robot.clickOn("#liveMeterButton");
        WaitForAsyncUtils.waitForFxEvents();
        // V_FS = V_meter / (the tone's rms in FS). The synthetic stage passes the drive (peak 10^(-26/20) FS) with a
        // gain below 1 that moves with its bias, so the tone's rms is bounded by its fundamental at the first and at
        // the fully turned bias, each taken by the textbook linear least-squares fit of a cos + b sin + c at the known
        // 997 Hz (normal equations, Cramer's rule), not by the analysis under test.
        double lo = Double.POSITIVE_INFINITY, hi = 0;
        for (double t : new double[] {0, 6}) {
            double[] x = SyntheticLiveSource.block(-26, t, 6, 1);
            double[][] m = new double[3][3];
            double[] r = new double[3];
            for (int i = 0; i < x.length; i++) {
                double ph = 2 * Math.PI * SyntheticLiveSource.TONE_HZ * (t + i / SyntheticLiveSource.RATE_HZ);
                double[] col = {Math.cos(ph), Math.sin(ph), 1};
                for (int j = 0; j < 3; j++) {
                    r[j] += col[j] * x[i];
                    for (int k = 0; k < 3; k++) m[j][k] += col[j] * col[k];
                }
            }
            double det = det3(m);
            double[] ab = new double[2];
            for (int c = 0; c < 2; c++) {
                double[][] mc = {m[0].clone(), m[1].clone(), m[2].clone()};
                for (int j = 0; j < 3; j++) mc[j][c] = r[j];
                ab[c] = det3(mc) / det;
            }
            double rms = Math.hypot(ab[0], ab[1]) / Math.sqrt(2);
            lo = Math.min(lo, rms);
            hi = Math.max(hi, rms);
        }
        double got = Double.parseDouble(v.fullScaleField.getText());
        assertTrue(got >= 1.4 / hi * 0.999 && got <= 1.4 / lo * 1.001, got + " V against " + 1.4 / hi + "…" + 1.4 / lo + " V: " + v.status.getText());
        assertTrue(v.status.getText().startsWith("Full scale "), v.status.getText());
    }

    @Test
    void logLastBlock_addsABiasStepToTheSession(FxRobot robot, @TempDir Path dir) throws Exception {
        Path book = dir.resolve("bench.db");
        StringWriter out = new StringWriter(), err = new StringWriter();
        assertEquals(0, OutstageCommand.commandLine(new PrintWriter(out), new PrintWriter(err))
                .execute("session", "start", "--unit", "DA-60 #11", "--logbook", book.toString()), err.toString());
        long id = Long.parseLong(out.toString().trim());
        LiveView v = live(robot);
        robot.interact(() -> { v.logbook = Optional.of(book); v.fullScaleField.setText("40"); });
        startPastCautions(robot);
        blocks(v, 3);
        robot.clickOn("#liveStop");
        robot.interact(() -> { v.sessionField.setText(Long.toString(id)); v.biasField.setText("12"); });
        robot.clickOn("#liveLog");
        WaitForAsyncUtils.waitFor(60, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> !v.logButton.isDisabled()
                && v.status.getText().startsWith("Logged") || v.status.getText().startsWith("Not logged")).get());
        assertTrue(v.status.getText().startsWith("Logged to session " + id), v.status.getText());
        try (Logbook lb = Logbook.open(book)) {
            List<BiasStep> steps = lb.biasSteps(id);
            assertEquals(1, steps.size());
            assertEquals(12.0, steps.get(0).reading().value(), 0.0);
        }
    }

    @Test
    void virtualSoundcard_startStop_showsFigures(FxRobot robot) throws Exception {
        if (System.getenv("PULSE_SERVER") == null && "true".equals(System.getenv("CI")))
            org.junit.jupiter.api.Assertions.fail("CI=true and no sound server: .ci/run must start tools/virtual-soundcard");
        Assumptions.assumeTrue(System.getenv("PULSE_SERVER") != null, "no sound server (start tools/virtual-soundcard)");
        LiveView v = WaitForAsyncUtils.asyncFx(() -> new LiveView(LiveSource.soundcard(), () -> true, () -> {})).get();
        robot.interact(() -> { pane.views.getTabs().add(v.tab()); pane.views.getSelectionModel().select(v.tab()); });
        assertFalse(v.deviceChoice.getItems().isEmpty(), v.deviceMessage.getText());
        robot.interact(() -> v.levelField.setText("-20"));
        robot.interact(v::requestStart);
        // until a block carries the tone: the first blocks can hold silence or the tone's onset when the output
        // starts late on a loaded machine (such a block is rightly "not measured")
        WaitForAsyncUtils.waitFor(30, TimeUnit.SECONDS, () -> WaitForAsyncUtils.asyncFx(() -> !v.isRunning() || v.blocks() >= 2
                && v.lastResult().map(r -> !r.measurements().isEmpty() && r.measurements().get(0).measured()).orElse(false)).get());
        assertTrue(v.isRunning(), v.status.getText());
        robot.interact(v::stop);
        assertFalse(v.isRunning());
        Measurement m = v.lastResult().orElseThrow().measurements().get(0);
        assertTrue(m.measured(), m.notMeasuredReason().orElse(""));
        assertEquals(997, m.fundamental().frequencyHz(), 1);   // the loopback returns the played sine (the default, 997 Hz)
        assertEquals(AnalyzerBackend.pct(m.thd().percent()) + " %", WaitForAsyncUtils.asyncFx(() ->
                ((Label) v.tab().getContent().lookup("#liveThd")).getText()).get());
    }

    private static double det3(double[][] m) {
        return m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0])
                + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
    }
}

package org.outstage.ui;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import javafx.application.Platform;
import javafx.geometry.Insets;
import javafx.geometry.Orientation;
import javafx.geometry.Pos;
import javafx.scene.control.Button;
import javafx.scene.control.CheckBox;
import javafx.scene.control.ComboBox;
import javafx.scene.control.Label;
import javafx.scene.control.SplitPane;
import javafx.scene.control.Tab;
import javafx.scene.control.TextField;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.FlowPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.VBox;
import org.outstage.analysis.AnalysisSettings;
import org.outstage.analysis.Measurement;
import org.outstage.analysis.stage.StageDiagnosis;
import org.outstage.live.LiveCautions;
import org.outstage.live.LiveListener;
import org.outstage.live.LiveResult;
import org.outstage.live.LiveSettings;
import org.outstage.live.MeterCalibration;
import org.outstage.plot.Axis;
import org.outstage.plot.ChartSpec;
import org.outstage.plot.Series;
import org.outstage.report.ReportDocument;
import org.outstage.stimulus.Generator;
import org.outstage.stimulus.Stimulus;

/**
 * The Live view: plays a test signal into the amplifier, captures its output block by block and shows each block's
 * figures as the live package's {@link org.outstage.live.LiveSession} measured them (the same {@code Analyzer} as a
 * file): level and power, THD, THD+N, gain at zero with the crossover verdict, clipping, dropped frames; and a strip
 * chart of gain at zero and THD against time while the bias trimmer turns. It calibrates from a meter reading
 * ({@link MeterCalibration}) and logs the last block as a bias step of the open logbook session (the {@code session
 * add} command's path). The cautions come before the first start. Nothing is computed here.
 */
final class LiveView implements WorkbenchView {
    static final int HISTORY = 600;

    private final LiveSource source;
    private final Tab tab;
    final ComboBox<String> deviceChoice = new ComboBox<>();
    final ComboBox<String> signalChoice = new ComboBox<>();
    final TextField levelField = new TextField("-30");
    final Button startButton = new Button("Start");
    final Button stopButton = new Button("Stop");
    final Button levelButton = new Button("Set level");
    final TextField fullScaleField = new TextField();
    final TextField loadField = new TextField("8");
    final TextField meterField = new TextField();
    final Button meterButton = new Button("Full scale from meter");
    final TextField biasField = new TextField();
    final ComboBox<String> biasUnit = new ComboBox<>();
    final TextField sessionField = new TextField();
    final Button logButton = new Button("Log last block as a step");
    final Label deviceMessage = new Label();
    final Label status = new Label("Stopped.");
    final VBox cautionsBox = new VBox(8);
    final CheckBox cautionsDontShow = new CheckBox("Do not show these before a live start again");
    final FlowPane figures = new FlowPane(18, 6);
    final ChartCanvas gainChart = WorkbenchView.chart("liveGainChart");
    final ChartCanvas thdChart = WorkbenchView.chart("liveThdChart");
    private final List<double[]> history = new ArrayList<>();   // {time s, gain at zero (NaN if none), THD %, σ of the gain}

    /**
     * A block's gain at zero goes on the strip chart only when its standard error is at most this (a quarter of the
     * large-signal gain): a short block at a low level can read the crossover region too coarsely to say anything, and
     * its value would swing the chart's scale by thousands of percent while the figure row shows it with its σ.
     */
    static final double STRIP_MAX_STD_ERROR = 0.25;
    private final List<Measurement> uncalibrated = new ArrayList<>();
    private LiveSource.Running running;
    private LiveResult last;
    private boolean cautionsAcknowledged;
    private final java.util.function.BooleanSupplier cautionsDismissed;
    private final Runnable dismissCautions;
    private long blocks;
    /** The logbook file; empty for the command's default ($OUTSTAGE_LOGBOOK or the home folder's). */
    Optional<Path> logbook = Optional.ofNullable(System.getProperty("outstage.logbook")).filter(x -> !x.isBlank()).map(Path::of);
    private boolean devicesListed;

    /** The cautions before the first live start: the workbench page's on the soundcard input, the live package's on playing. */
    static final List<String> CAUTIONS = List.of(LiveCautions.TEXT.get(0), ReportDocument.CAUTIONS.get(2), ReportDocument.CAUTIONS.get(3),
            LiveCautions.TEXT.get(3));

    LiveView(LiveSource source, java.util.function.BooleanSupplier cautionsDismissed, Runnable dismissCautions) {
        this.source = source;
        this.cautionsDismissed = cautionsDismissed;
        this.dismissCautions = dismissCautions;
        deviceChoice.setId("liveDevice");
        signalChoice.setId("liveSignal");
        signalChoice.setEditable(true);
        // 997 Hz (AES17 practice): one soundcard plays and records on one clock, and 1 kHz at 48 kHz would repeat
        // 48 sample phases, too few to observe the crossing (docs/diagnosis.md)
        signalChoice.getItems().setAll("sine:997", "sine:1000", "sine:100", "twin:19000,20000", "silence");
        signalChoice.setValue("sine:997");
        levelField.setId("liveLevel");
        levelField.setPrefColumnCount(5);
        startButton.setId("liveStart");
        stopButton.setId("liveStop");
        levelButton.setId("liveSetLevel");
        stopButton.setDisable(true);
        levelButton.setDisable(true);
        startButton.setOnAction(e -> requestStart());
        stopButton.setOnAction(e -> stop());
        levelButton.setOnAction(e -> changeLevel());
        fullScaleField.setId("liveFullScale");
        fullScaleField.setPromptText("V at full scale");
        fullScaleField.setPrefColumnCount(6);
        loadField.setId("liveLoad");
        loadField.setPrefColumnCount(4);
        meterField.setId("liveMeter");
        meterField.setPromptText("V rms");
        meterField.setPrefColumnCount(6);
        meterButton.setId("liveMeterButton");
        meterButton.setOnAction(e -> calibrateFromMeter());
        biasField.setId("liveBias");
        biasField.setPromptText("reading");
        biasField.setPrefColumnCount(5);
        biasUnit.setId("liveBiasUnit");
        biasUnit.getItems().setAll("mV across Re", "mA");
        biasUnit.setValue("mV across Re");
        sessionField.setId("liveSession");
        sessionField.setPromptText("session id");
        sessionField.setPrefColumnCount(5);
        logButton.setId("liveLog");
        logButton.setOnAction(e -> logLastBlock());
        deviceMessage.setId("liveDeviceMessage");
        deviceMessage.setWrapText(true);
        status.setId("liveStatus");
        status.setWrapText(true);
        figures.setId("liveFigures");

        deviceChoice.setPrefWidth(260);
        FlowPane g = new FlowPane(14, 6,
                group("Input", deviceChoice), group("Signal", signalChoice), group("Level (dBFS)", levelField),
                group(null, startButton, stopButton, levelButton),
                group("Full scale (V)", fullScaleField), group("Load (Ω)", loadField), group("Meter reads (V rms)", meterField, meterButton),
                group("Bias reading", biasField, biasUnit), group("Session", sessionField, logButton));

        Label head = new Label("Before the first live start");
        head.setStyle("-fx-font-weight: bold;");
        Label text = new Label(String.join("\n\n", CAUTIONS));
        text.setId("liveCautionsText");
        text.setWrapText(true);
        text.setMaxWidth(760);
        Button go = new Button("Checked: start");
        go.setId("liveCautionsStart");
        go.setOnAction(e -> {
            cautionsAcknowledged = true;
            if (cautionsDontShow.isSelected()) dismissCautions.run();
            cautionsBox.setVisible(false);
            cautionsBox.setManaged(false);
            start();
        });
        Button back = new Button("Not now");
        back.setOnAction(e -> { cautionsBox.setVisible(false); cautionsBox.setManaged(false); });
        cautionsBox.getChildren().setAll(head, text, cautionsDontShow, new HBox(8, go, back));
        cautionsBox.setId("liveCautions");
        cautionsBox.setPadding(new Insets(10));
        cautionsBox.setStyle("-fx-background-color: #fff6e0; -fx-border-color: #c89b3c;");
        cautionsBox.setVisible(false);
        cautionsBox.setManaged(false);

        VBox top = new VBox(6, g, deviceMessage, cautionsBox, status, figures);
        top.setPadding(new Insets(6));
        SplitPane charts = new SplitPane(gainChart, thdChart);
        charts.setOrientation(Orientation.VERTICAL);
        BorderPane p = new BorderPane(charts);
        p.setTop(top);
        tab = WorkbenchView.tab("liveTab", "Live", p);
        deviceMessage.setText("Looking for sound devices when this view opens.");
        startButton.setDisable(true);
        tab.selectedProperty().addListener((o, a, b) -> { if (b && !devicesListed) { devicesListed = true; refreshDevices(); } });
        showFigures(Optional.empty());
        drawStrip();
    }

    /** A label and its controls, kept together when the row wraps; nothing shrinks below its text. */
    private static HBox group(String label, javafx.scene.control.Control... controls) {
        HBox h = new HBox(5);
        h.setAlignment(Pos.CENTER_LEFT);
        if (label != null) h.getChildren().add(new Label(label));
        h.getChildren().addAll(controls);
        for (javafx.scene.Node n : h.getChildren()) if (n instanceof javafx.scene.control.Control c) c.setMinWidth(javafx.scene.control.Control.USE_PREF_SIZE);
        return h;
    }

    @Override public Tab tab() { return tab; }
    @Override public List<ChartCanvas> charts() { return List.of(gainChart, thdChart); }
    @Override public void clear(String message) { /* live does not follow the selected capture */ }

    /** Lists the input devices; without one the view says so and cannot start. */
    void refreshDevices() {
        List<String> d = source.inputDevices();
        deviceChoice.getItems().setAll(d);
        if (!d.isEmpty()) deviceChoice.setValue(d.get(0));
        deviceMessage.setText(d.isEmpty() ? source.noDeviceReason() : "");
        deviceMessage.setManaged(d.isEmpty());
        deviceMessage.setVisible(d.isEmpty());
        deviceMessage.setStyle(d.isEmpty() ? "-fx-text-fill: #a0281e; -fx-font-weight: bold;" : "");
        startButton.setDisable(d.isEmpty() || running != null);
    }

    boolean isRunning() { return running != null; }

    Optional<LiveResult> lastResult() { return Optional.ofNullable(last); }

    /** Blocks shown since the last start. */
    long blocks() { return blocks; }

    /** Start: the cautions first, once per run of the workbench unless dismissed for good. */
    void requestStart() {
        if (running != null) return;
        if (deviceChoice.getItems().isEmpty()) {
            status.setText(deviceMessage.getText().isEmpty() ? source.noDeviceReason() : deviceMessage.getText());
            return;
        }
        if (!cautionsAcknowledged && !cautionsDismissed.getAsBoolean()) {
            cautionsBox.setVisible(true);
            cautionsBox.setManaged(true);
            status.setText("Read the cautions, then start.");
            return;
        }
        start();
    }

    private void start() {
        LiveSettings s;
        try {
            s = settings();
        } catch (IllegalArgumentException ex) {
            status.setText("Not started: " + WorkbenchPane.oneLine(ex));
            return;
        }
        history.clear();
        uncalibrated.clear();
        blocks = 0;
        last = null;
        drawStrip();
        LiveListener l = new LiveListener() {
            @Override public void onBlock(LiveResult r) { Platform.runLater(() -> block(r)); }
            @Override public void onStarted(String in, String out, double first) {
                Platform.runLater(() -> status.setText("Running: input " + in + (out.isEmpty() ? "" : ", output " + out)));
            }
            @Override public void onFailure(String message) { Platform.runLater(() -> { status.setText("Stopped: " + message); stopped(); }); }
        };
        try {
            running = source.start(s, l);
        } catch (Exception ex) {
            status.setText("Not started: " + WorkbenchPane.oneLine(ex));
            running = null;
            return;
        }
        startButton.setDisable(true);
        stopButton.setDisable(false);
        levelButton.setDisable(s.stimulus().isEmpty());
        status.setText("Starting…");
    }

    /** The live settings from the fields; the level must start at or below −20 dBFS. */
    LiveSettings settings() {
        double level = number("Level", levelField.getText(), false);
        if (level > Generator.SAFE_START_DBFS)
            throw new IllegalArgumentException("start at " + fmt(Generator.SAFE_START_DBFS) + " dBFS or below (" + fmt(level)
                    + " given); raise the level while it runs");
        OptionalDouble fs = Calibration.parseField("Full scale", fullScaleField.getText());
        OptionalDouble load = Calibration.parseField("Load", loadField.getText());
        String sig = signalChoice.getEditor() != null && signalChoice.isEditable() ? signalChoice.getEditor().getText() : signalChoice.getValue();
        if (sig == null || sig.isBlank()) sig = signalChoice.getValue();
        Stimulus st = Stimulus.parse(sig);
        AnalysisSettings a = AnalysisSettings.DEFAULT;
        if (load.isPresent()) a = a.withLoadOhms(load.getAsDouble());
        Optional<String> dev = Optional.ofNullable(deviceChoice.getValue());
        return LiveSettings.defaults().withDevices(dev, Optional.empty()).withBlocks(0.5, 0.5)
                .withStimulus(st instanceof Stimulus.Silence ? Optional.empty() : Optional.of(st), level, false)
                .withAnalysis(a, OptionalInt.of(1), OptionalInt.empty()).withFullScaleVolts(fs);
    }

    private void changeLevel() {
        if (running == null) return;
        try {
            double level = number("Level", levelField.getText(), false);
            running.setLevelDbfs(level);
            status.setText("Level " + fmt(level) + " dBFS");
        } catch (RuntimeException ex) {
            status.setText("Level not changed: " + WorkbenchPane.oneLine(ex));
        }
    }

    /** Stops playing and capturing (also when the window closes). */
    void stop() {
        LiveSource.Running r = running;
        if (r != null) r.stop();
        stopped();
        status.setText("Stopped." + (last != null ? " The last block stays for logging." : ""));
    }

    private void stopped() {
        running = null;
        startButton.setDisable(deviceChoice.getItems().isEmpty());
        stopButton.setDisable(true);
        levelButton.setDisable(true);
    }

    /** One analysed block: figures, strip chart. */
    void block(LiveResult r) {
        if (running == null) return;   // a block that was on its way when stop was pressed
        last = r;
        blocks++;
        Optional<Measurement> m = r.measurements().isEmpty() ? Optional.empty() : Optional.of(r.measurements().get(0));
        m.filter(x -> x.measured() && x.unit().equals("FS")).ifPresent(x -> { uncalibrated.add(x); if (uncalibrated.size() > 10) uncalibrated.remove(0); });
        double gain = Double.NaN, thd = Double.NaN, se = Double.NaN;
        if (m.isPresent() && m.get().measured()) {
            thd = m.get().thd().percent();
            if (m.get().stage() instanceof StageDiagnosis.Measured d && org.outstage.analysis.Plausibility.crossoverGiven(m.get())) {
                gain = d.crossover().gainAtZero();
                se = d.crossover().gainAtZeroStdError();
            }
        }
        history.add(new double[] {r.timeSeconds(), gain, thd, se});
        if (history.size() > HISTORY) history.remove(0);
        showFigures(Optional.of(r));
        drawStrip();
    }

    private void showFigures(Optional<LiveResult> r) {
        figures.getChildren().clear();
        Optional<Measurement> m = r.flatMap(x -> x.measurements().isEmpty() ? Optional.empty() : Optional.of(x.measurements().get(0)));
        if (m.isPresent() && !m.get().measured()) {
            figure("liveNotMeasured", "Block " + r.get().block(), "not measured: " + m.get().notMeasuredReason().orElse(""));
        } else if (m.isPresent()) {
            Measurement x = m.get();
            figure("liveLevel", "Level (rms)", AnalyzerBackend.num(x.fundamental().rms()) + " " + x.unit());
            figure("livePower", "Power", x.powerWatts().map(p -> AnalyzerBackend.num(p.totalWatts()) + " W")
                    .orElse(x.unit().equals("V") ? "— (no load)" : "— (uncalibrated)"));
            figure("liveThd", "THD", AnalyzerBackend.pct(x.thd().percent()) + " %");
            figure("liveThdn", "THD+N", AnalyzerBackend.pct(x.thdN().percent()) + " %");
            if (x.stage() instanceof StageDiagnosis.Measured d) {
                Optional<String> notGiven = org.outstage.analysis.Plausibility.crossoverNotGiven(x);
                Label g = figure("liveGain", "Gain at zero", notGiven.isPresent() ? "not given" : gainText(d.crossover()));
                notGiven.ifPresent(why -> g.setTooltip(new javafx.scene.control.Tooltip(why)));
                Label clip = figure("liveClipping", "Clipping", d.clipping().detected() ? "clipping" : "no");
                if (d.clipping().detected()) clip.setStyle(clip.getStyle() + "-fx-text-fill: #a0281e;");
            } else if (x.stage() instanceof StageDiagnosis.NotMeasured n) {
                figure("liveGain", "Gain at zero", "not measured");
            }
        } else {
            figure("liveLevel", "Level (rms)", "—");
        }
        figure("liveDropped", "Dropped frames", r.map(x -> Long.toString(x.droppedFramesTotal())
                + (x.skippedBlocks() > 0 ? " (" + x.skippedBlocks() + " blocks skipped)" : "")).orElse("—"));
        figure("liveBlock", "Block", r.map(x -> x.block() + " at " + AnalyzerBackend.num(x.timeSeconds()) + " s").orElse("—"));
    }

    /** The gain at zero with its standard error and the verdict, e.g. "0.9776 ± 0.0123  optimal". */
    static String gainText(org.outstage.analysis.stage.CrossoverMetrics c) {
        String se = Double.isFinite(c.gainAtZeroStdError()) ? String.format(Locale.ROOT, " ± %.2g", c.gainAtZeroStdError()) : "";
        return String.format(Locale.ROOT, "%.4f", c.gainAtZero()) + se + "  " + c.verdict().label();
    }

    /** Adds a figure (small name above a large value) to the row; the value label carries {@code id}. */
    private Label figure(String id, String name, String value) {
        Label n = new Label(name);
        n.setStyle("-fx-text-fill: #555555; -fx-font-size: 11px;");
        Label v = new Label(value);
        v.setId(id);
        v.setStyle("-fx-font-size: 16px; -fx-font-weight: bold;");
        figures.getChildren().add(new VBox(0, n, v));
        return v;
    }

    private void drawStrip() {
        int n = history.size();
        if (n == 0) {
            gainChart.setMessage("Gain at zero against time appears here while live runs.");
            thdChart.setMessage("THD against time appears here while live runs.");
            return;
        }
        // gain at zero in % of the large-signal gain (a ratio shown as percent at the edge), THD on a log scale
        double[] t = new double[n], g = new double[n], d = new double[n];
        int left = 0;
        for (int i = 0; i < n; i++) {
            double[] h = history.get(i);
            t[i] = h[0];
            d[i] = h[2];
            boolean sure = h[3] <= STRIP_MAX_STD_ERROR;   // false for NaN too
            if (!sure && Double.isFinite(h[1])) left++;
            g[i] = sure ? 100 * h[1] : Double.NaN;   // a gap in the line
        }
        String title = "Gain at zero against time" + (left > 0 ? String.format(Locale.ROOT,
                " (%d of %d blocks left out: standard error above %.0f %%)", left, n, 100 * STRIP_MAX_STD_ERROR) : "");
        gainChart.setSpec(ChartSpec.of(title, Axis.linear("Time", "s"), Axis.linear("Gain at zero", "%"),
                List.of(new Series("gain at zero", t, g, Series.Style.LINE, Series.Role.MEASURED))));
        thdChart.setSpec(ChartSpec.of("THD against time", Axis.linear("Time", "s"), Axis.log("THD", "%"),
                List.of(new Series("THD", t, d, Series.Style.LINE, Series.Role.MEASURED_ALT))));
    }

    /** Full-scale volts from the meter reading and the last uncalibrated blocks ({@link MeterCalibration}). */
    void calibrateFromMeter() {
        try {
            double meter = number("Meter reading", meterField.getText(), true);
            MeterCalibration.Result r = MeterCalibration.fromMeasurements(List.copyOf(uncalibrated), meter);
            fullScaleField.setText(String.format(Locale.ROOT, "%.4g", r.fullScaleVolts()));
            status.setText("Full scale " + String.format(Locale.ROOT, "%.4g", r.fullScaleVolts()) + " V from the meter's "
                    + fmt(meter) + " V rms (median of " + r.blocks() + " blocks); stop and start again to measure in volts.");
        } catch (IllegalArgumentException ex) {
            status.setText("No calibration: " + WorkbenchPane.oneLine(ex) + " (play a steady tone uncalibrated, then enter the meter reading)");
        }
    }

    /**
     * Logs the last block as a bias step of a logbook session: the block goes to a WAV file in full-scale units and
     * through {@code session add ID --bias-mv|--bias-ma X [--fs-volts V] [--load R] FILE}, the command's own path.
     */
    void logLastBlock() {
        LiveResult r = last;
        if (r == null) { status.setText("Nothing to log: no block yet."); return; }
        long session;
        double bias;
        try {
            session = Long.parseLong(sessionField.getText().trim());
            bias = number("Bias reading", biasField.getText(), true);
        } catch (NumberFormatException ex) {
            status.setText("Not logged: the session id '" + sessionField.getText().trim() + "' is not a number");
            return;
        } catch (IllegalArgumentException ex) {
            status.setText("Not logged: " + WorkbenchPane.oneLine(ex));
            return;
        }
        String unitOpt = biasUnit.getValue().startsWith("mA") ? "--bias-ma" : "--bias-mv";
        OptionalDouble fs = Calibration.parseField("Full scale", fullScaleField.getText());
        OptionalDouble load = Calibration.parseField("Load", loadField.getText());
        logButton.setDisable(true);
        Thread th = new Thread(() -> {
            String msg;
            try {
                msg = LiveLog.addStep(r.capture(), session, unitOpt, bias, fs, load, logbook);
            } catch (Exception ex) {
                msg = "Not logged: " + WorkbenchPane.oneLine(ex);
            }
            String m = msg;
            Platform.runLater(() -> { status.setText(m); logButton.setDisable(false); });
        }, "outstage-live-log");
        th.setDaemon(true);
        th.start();
    }

    private static double number(String name, String text, boolean positive) {
        String t = text == null ? "" : text.trim().replace(',', '.').replace('−', '-');
        double v;
        try {
            v = Double.parseDouble(t);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException(name + " '" + (text == null ? "" : text.trim()) + "' is not a number");
        }
        if (!Double.isFinite(v) || (positive && !(v > 0))) throw new IllegalArgumentException(name + " " + t + " must be " + (positive ? "> 0" : "a number"));
        return v;
    }

    private static String fmt(double v) { return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v); }
}

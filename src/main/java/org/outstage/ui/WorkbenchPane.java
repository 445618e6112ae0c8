package org.outstage.ui;

import java.io.File;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import java.util.OptionalDouble;
import java.util.OptionalInt;
import java.util.stream.Stream;
import javafx.beans.value.ChangeListener;
import javafx.collections.FXCollections;
import javafx.concurrent.Task;
import javafx.concurrent.Worker;
import javafx.geometry.Insets;
import javafx.geometry.Pos;
import javafx.scene.Node;
import javafx.scene.control.Button;
import javafx.scene.control.CheckBox;
import javafx.scene.control.ComboBox;
import javafx.scene.control.Label;
import javafx.scene.control.ListCell;
import javafx.scene.control.ListView;
import javafx.scene.control.Menu;
import javafx.scene.control.MenuBar;
import javafx.scene.control.MenuItem;
import javafx.scene.control.ProgressBar;
import javafx.scene.control.SelectionMode;
import javafx.scene.control.Spinner;
import javafx.scene.control.Tab;
import javafx.scene.control.TabPane;
import javafx.scene.control.TableColumn;
import javafx.scene.control.TableView;
import javafx.scene.control.TextField;
import javafx.scene.control.TitledPane;
import javafx.scene.control.Tooltip;
import javafx.scene.input.Clipboard;
import javafx.scene.input.ClipboardContent;
import javafx.scene.input.KeyCode;
import javafx.scene.input.KeyCodeCombination;
import javafx.scene.input.KeyCombination;
import javafx.scene.input.TransferMode;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.FlowPane;
import javafx.scene.layout.GridPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.Priority;
import javafx.scene.layout.Region;
import javafx.scene.layout.VBox;
import javafx.scene.control.cell.PropertyValueFactory;
import javafx.beans.property.ReadOnlyStringWrapper;
import javafx.stage.FileChooser;
import javafx.stage.Window;
import org.outstage.capture.BenchManifest;
import org.outstage.capture.Capture;

/**
 * The workbench window's content: capture list with calibration on the left, views in the middle,
 * settings and figures on the right, progress at the bottom. All analysis runs in {@link Task}s off the
 * FX thread; the views show what the {@link Backend} returns and never compute a figure.
 */
final class WorkbenchPane extends BorderPane {
    private final Backend backend;
    final ListView<CaptureEntry> captureList = new ListView<>();
    final Label importError = new Label();
    final TextField fullScaleField = new TextField();
    final TextField probeField = new TextField();
    final TextField loadField = new TextField();
    final Label calibrationError = new Label();
    final Label captureWarnings = new Label();
    final ComboBox<Integer> channelChoice = new ComboBox<>();
    final ComboBox<UiSettings.BandChoice> bandChoice = new ComboBox<>(FXCollections.observableArrayList(UiSettings.BandChoice.values()));
    final CheckBox weightingBox = new CheckBox("A-weighting (IEC 61672-1)");
    final Spinner<Integer> harmonicsSpinner = new Spinner<>(2, 50, 10);
    final ComboBox<String> referenceChoice = new ComboBox<>();
    final TabPane views = new TabPane();
    final WaveformView waveformView = new WaveformView();
    final SpectrumView spectrumView = new SpectrumView();
    final HarmonicsView harmonicsView = new HarmonicsView();
    final TransferView transferView;
    final LevelSweepView sweepView = new LevelSweepView();
    final SpecSheetView specView = new SpecSheetView();
    final LiveView liveView;
    final ChartCanvas waveformChart = waveformView.waveformChart;
    final ChartCanvas residualChart = waveformView.residualChart;
    final ChartCanvas spectrumChart = spectrumView.spectrumChart;
    final CheckBox spectrumRelativeBox = spectrumView.relativeBox;
    final ChartCanvas harmonicsChart = harmonicsView.harmonicsChart;
    final ChartCanvas transferChart;
    final ChartCanvas sweepChart = sweepView.sweepChart;
    final FiguresPanel figures = new FiguresPanel(t -> this.statusText.setText(t));
    final TableView<FigureRow> figuresTable = figures.figuresTable;
    final FlowPane summary = figures.summary;
    final Label statusText = new Label("Open captures with File ▸ Open, or drop files or folders here.");
    final ProgressBar progress = new ProgressBar(0);
    final Button cancelButton = new Button("Cancel");
    final TransferPanel transferPanel;
    private ChartCanvas currentChart = waveformChart;
    private Node leftSide, rightSide;
    private Task<?> running;
    /** The first capture, opened and analysed while the window was built ({@link EarlyAnalysis}), until it is used. */
    private volatile EarlyAnalysis earlyStart;
    private UiSettings settings = UiSettings.DEFAULT;
    private boolean updatingControls;

    WorkbenchPane(Backend backend, TransferPanel transferPanel) {
        this(backend, transferPanel, LiveSource.soundcard());
    }

    WorkbenchPane(Backend backend, TransferPanel transferPanel, LiveSource live) {
        this.backend = backend;
        org.outstage.live.UserSettings user = org.outstage.live.UserSettings.standard();
        this.liveView = new LiveView(live, user::cautionsDismissed, () -> {
            try { user.dismissCautions(); } catch (IOException | RuntimeException e) { /* shown again next time */ }
        });
        // playback stops when the window closes
        sceneProperty().addListener((o, a, sc) -> {
            if (sc != null) sc.windowProperty().addListener((o2, w0, w) -> {
                if (w != null) w.addEventHandler(javafx.stage.WindowEvent.WINDOW_HIDING, e -> liveView.stop());
            });
        });
        this.transferPanel = transferPanel;
        this.transferView = new TransferView(transferPanel);
        this.transferChart = transferView.transferChart;
        setId("workbench");
        setTop(menus());
        setLeft(captureSide());
        setCenter(viewTabs());
        setRight(settingsSide());
        setBottom(statusBar());
        setOnDragOver(e -> {
            if (e.getDragboard().hasFiles()) e.acceptTransferModes(TransferMode.COPY);
            e.consume();
        });
        setOnDragDropped(e -> {
            boolean ok = e.getDragboard().hasFiles();
            if (ok) openPaths(e.getDragboard().getFiles().stream().map(File::toPath).toList());
            e.setDropCompleted(ok);
            e.consume();
        });
        showNothing();
    }

    // ---- layout -----------------------------------------------------------------------------------

    private MenuBar menus() {
        MenuItem open = new MenuItem("Open captures…");
        open.setAccelerator(new KeyCodeCombination(KeyCode.O, KeyCombination.SHORTCUT_DOWN));
        open.setOnAction(e -> openByDialog());
        MenuItem quit = new MenuItem("Quit");
        quit.setOnAction(e -> { Window w = getScene().getWindow(); if (w != null) w.hide(); });
        Menu file = new Menu("File", null, open, quit);
        MenuItem png = new MenuItem("Export chart as PNG…");
        png.setOnAction(e -> exportByDialog("png"));
        MenuItem svg = new MenuItem("Export chart as SVG…");
        svg.setOnAction(e -> exportByDialog("svg"));
        MenuItem csv = new MenuItem("Export chart data as CSV…");
        csv.setOnAction(e -> exportByDialog("csv"));
        MenuItem reset = new MenuItem("Show whole chart");
        reset.setOnAction(e -> currentChart.resetZoom());
        Menu chart = new Menu("Chart", null, png, svg, csv, reset);
        MenuItem cautions = new MenuItem("Cautions");
        cautions.setOnAction(e -> Workbench.showCautions(getScene().getWindow(), false));
        MenuItem help = new MenuItem("Using the charts");
        help.setOnAction(e -> statusText.setText("Wheel: zoom · drag: zoom box · right-drag or Ctrl-drag: pan · double-click: whole chart"));
        Menu helpMenu = new Menu("Help", null, cautions, help);
        MenuBar bar = new MenuBar(file, chart, helpMenu);
        bar.setId("menuBar");
        return bar;
    }

    private Node captureSide() {
        captureList.setId("captureList");
        captureList.getSelectionModel().setSelectionMode(SelectionMode.MULTIPLE);
        captureList.getSelectionModel().getSelectedItems().addListener((javafx.collections.ListChangeListener<CaptureEntry>) c -> refreshSweep());
        captureList.setCellFactory(v -> new ListCell<>() {
            @Override protected void updateItem(CaptureEntry item, boolean empty) {
                super.updateItem(item, empty);
                setText(empty || item == null ? null : item.toString());
                setStyle(!empty && item != null && item.failed() ? "-fx-text-fill: #a0281e;" : "");
                setTooltip(!empty && item != null && item.failed() ? new Tooltip(item.error) : null);
            }
        });
        captureList.getSelectionModel().selectedItemProperty().addListener((o, a, b) -> {
            if (a != null && a != b && a.data != null) a.data = a.data.light();   // keep charts only for the capture on screen
            onSelect(b);
        });
        captureList.setPrefWidth(250);
        VBox.setVgrow(captureList, Priority.ALWAYS);
        Button openButton = new Button("Open…");
        openButton.setId("openButton");
        openButton.setOnAction(e -> openByDialog());
        importError.setId("importError");
        importError.setWrapText(true);
        importError.setStyle("-fx-text-fill: #a0281e;");
        importError.setMaxWidth(250);

        fullScaleField.setId("fullScaleField");
        fullScaleField.setPromptText("V at full scale");
        probeField.setId("probeField");
        probeField.setPromptText("e.g. 10");
        loadField.setId("loadField");
        loadField.setPromptText("e.g. 8");
        channelChoice.setId("channelChoice");
        Button apply = new Button("Apply");
        apply.setId("applyCalibration");
        apply.setOnAction(e -> applyCalibration(false));
        Button applyAll = new Button("Apply to all");
        applyAll.setId("applyCalibrationAll");
        applyAll.setTooltip(new Tooltip("Use this calibration for every capture in the list (same divider and load)"));
        applyAll.setOnAction(e -> applyCalibration(true));
        calibrationError.setId("calibrationError");
        calibrationError.setWrapText(true);
        calibrationError.setStyle("-fx-text-fill: #a0281e;");
        calibrationError.setMaxWidth(250);
        GridPane g = new GridPane();
        g.setHgap(6);
        g.setVgap(4);
        g.addRow(0, new Label("Full scale (V)"), fullScaleField);
        g.addRow(1, new Label("Probe ratio"), probeField);
        g.addRow(2, new Label("Load (Ω)"), loadField);
        g.addRow(3, new Label("Channel"), channelChoice);
        for (TextField f : List.of(fullScaleField, probeField, loadField)) f.setPrefColumnCount(6);
        g.getColumnConstraints().add(new javafx.scene.layout.ColumnConstraints(96));
        channelChoice.valueProperty().addListener((o, a, b) -> {
            CaptureEntry e = selected();
            if (!updatingControls && e != null && b != null && b - 1 != e.channel) { e.channel = b - 1; analyzeSelected(); }
        });
        captureWarnings.setId("captureWarnings");
        captureWarnings.setWrapText(true);
        captureWarnings.setMaxWidth(250);
        captureWarnings.setStyle("-fx-text-fill: #7a5a00;");
        VBox cal = new VBox(6, g, new HBox(6, apply, applyAll), calibrationError, captureWarnings);
        TitledPane calPane = new TitledPane("Calibration of the selected capture", cal);
        calPane.setCollapsible(false);
        VBox side = new VBox(6, new HBox(6, new Label("Captures"), spacer(), openButton), captureList, importError, calPane);
        side.setPadding(new Insets(6));
        side.setPrefWidth(262);
        return side;
    }

    /** The views in tab order. */
    List<WorkbenchView> allViews() { return List.of(waveformView, spectrumView, harmonicsView, transferView, sweepView, specView, liveView); }

    /** Stops anything live (the window is closing or the application stops). */
    void shutdown() { liveView.stop(); }

    private Node viewTabs() {
        views.setId("views");
        views.setTabClosingPolicy(TabPane.TabClosingPolicy.UNAVAILABLE);
        // seven tabs in the middle column: tighter tab headers, so all titles show without the overflow menu
        views.getStylesheets().add("data:text/css," + java.net.URLEncoder.encode(
                ".tab-pane > .tab-header-area .tab { -fx-padding: 2 3 2 3; } "
                        + ".tab-pane > .tab-header-area .tab .tab-label { -fx-font-size: 11px; }", java.nio.charset.StandardCharsets.UTF_8)
                .replace("+", "%20"));
        for (WorkbenchView v : allViews()) {
            views.getTabs().add(v.tab());
            for (ChartCanvas c : v.charts()) c.addEventFilter(javafx.scene.input.MouseEvent.MOUSE_PRESSED, e -> currentChart = c);
        }
        // Only the chosen view's content joins the scene; each other view joins when first chosen. JavaFX styles and
        // lays out the content of every tab, shown or not: with all seven in the scene the window's first show took
        // about 0.4 s longer on the build machine (docs/performance.md). The views draw their data either way.
        Tab chosen = views.getSelectionModel().getSelectedItem();
        for (Tab t : views.getTabs()) if (t != chosen) deferContent(t);
        views.getSelectionModel().selectedItemProperty().addListener((o, a, b) -> currentChart = primaryChart(b));
        // the Live view is its own task: it takes the whole width (the capture list and figures return with the other views)
        views.getSelectionModel().selectedItemProperty().addListener((o, a, b) -> {
            boolean live = b != null && "liveTab".equals(b.getId());
            if (live && getLeft() != null) { leftSide = getLeft(); rightSide = getRight(); setLeft(null); setRight(null); }
            else if (!live && getLeft() == null && leftSide != null) { setLeft(leftSide); setRight(rightSide); }
        });
        return views;
    }

    /** Keeps a tab's content out of the scene until the tab is first chosen. */
    private static void deferContent(Tab t) {
        Node content = t.getContent();
        if (content == null) return;
        t.setContent(null);
        ChangeListener<Boolean> join = new ChangeListener<>() {
            @Override public void changed(javafx.beans.value.ObservableValue<? extends Boolean> o, Boolean was, Boolean now) {
                if (!now) return;
                t.selectedProperty().removeListener(this);
                t.setContent(content);
            }
        };
        t.selectedProperty().addListener(join);
    }

    private ChartCanvas primaryChart(Tab t) {
        for (WorkbenchView v : allViews()) if (v.tab() == t && !v.charts().isEmpty()) return v.charts().get(0);
        return waveformChart;
    }

    private Node settingsSide() {
        bandChoice.setId("bandChoice");
        bandChoice.setValue(settings.band());
        weightingBox.setId("weightingBox");
        harmonicsSpinner.setId("harmonicsSpinner");
        harmonicsSpinner.setEditable(true);
        harmonicsSpinner.setPrefWidth(80);
        referenceChoice.setId("referenceChoice");
        referenceChoice.setButtonCell(new ListCell<>() {
            @Override protected void updateItem(String item, boolean empty) {
                super.updateItem(item, empty);
                setText(empty || item == null ? null : item);
            }
        });
        referenceChoice.getButtonCell().setId("referenceCell");
        referenceChoice.getItems().setAll("none");
        referenceChoice.setValue("none");
        bandChoice.valueProperty().addListener((o, a, b) -> { if (b != null) changeSettings(settings.withBand(b)); });
        weightingBox.selectedProperty().addListener((o, a, b) -> changeSettings(settings.withAWeighting(b)));
        harmonicsSpinner.valueProperty().addListener((o, a, b) -> { if (b != null) changeSettings(settings.withHarmonics(b)); });
        // the generator channel is a role of the selected capture's channels (from its notes or chosen here)
        referenceChoice.valueProperty().addListener((o, a, b) -> {
            CaptureEntry e = selected();
            if (b == null || updatingControls || e == null) return;
            OptionalInt ref = b.equals("none") ? OptionalInt.empty() : OptionalInt.of(Integer.parseInt(b) - 1);
            if (ref.equals(e.reference)) return;
            e.reference = ref;
            e.data = null;
            analyzeSelected();
        });
        GridPane g = new GridPane();
        g.setHgap(6);
        g.setVgap(4);
        g.addRow(0, new Label("Band"), bandChoice);
        g.addRow(1, new Label("Weighting"), weightingBox);
        g.addRow(2, new Label("Harmonics up to H"), harmonicsSpinner);
        g.addRow(3, new Label("Reference channel"), referenceChoice);
        TitledPane sp = new TitledPane("Measurement settings", g);
        sp.setCollapsible(false);

        VBox side = new VBox(6, sp, new Label("Figures of the selected capture"), summary, figuresTable, figures.copyButton);
        side.setPadding(new Insets(6));
        side.setPrefWidth(470);
        return side;
    }

    private Node statusBar() {
        statusText.setId("statusText");
        progress.setId("progress");
        progress.setPrefWidth(160);
        progress.setVisible(false);
        cancelButton.setId("cancelButton");
        cancelButton.setDisable(true);
        cancelButton.setOnAction(e -> { if (running != null) running.cancel(); });
        // a long status line is cut with an ellipsis, not the Cancel button
        cancelButton.setMinWidth(Region.USE_PREF_SIZE);
        statusText.setMinWidth(0);
        HBox bar = new HBox(8, statusText, spacer(), progress, cancelButton);
        bar.setAlignment(Pos.CENTER_LEFT);
        bar.setPadding(new Insets(3, 6, 3, 6));
        bar.setStyle("-fx-border-color: #c8c8c8 transparent transparent transparent;");
        return bar;
    }

    private static Region spacer() {
        Region r = new Region();
        HBox.setHgrow(r, Priority.ALWAYS);
        return r;
    }

    // ---- opening ----------------------------------------------------------------------------------

    private void openByDialog() {
        FileChooser fc = new FileChooser();
        fc.setTitle("Open captures");
        fc.getExtensionFilters().addAll(new FileChooser.ExtensionFilter("Captures (WAV, CSV)", "*.wav", "*.WAV", "*.csv", "*.CSV", "*.txt"),
                new FileChooser.ExtensionFilter("All files", "*.*"));
        List<File> files = fc.showOpenMultipleDialog(getScene().getWindow());
        if (files != null) openPaths(files.stream().map(File::toPath).toList());
    }

    void openPaths(List<Path> paths) { openPaths(paths, Calibration.NONE); }

    /** Takes the capture and the analysis {@code early} made of a file the next {@link #openPaths} opens. */
    void adopt(EarlyAnalysis early) { this.earlyStart = early; }

    /**
     * Opens files, and the capture files inside folders. Each file takes the calibration notes of its folder
     * ({@code bench.txt}, {@link BenchManifest}): full-scale volts, probe, sample rate, load, the channel roles
     * (output, reference = generator) and the level series; a file no rule of the notes names takes
     * {@code calibration}. Each failure stays beside its file; a bad notes file is reported and its folder opens
     * with {@code calibration}.
     */
    void openPaths(List<Path> paths, Calibration calibration) {
        List<Path> files = new ArrayList<>();
        for (Path p : paths) {
            if (Files.isDirectory(p)) {
                try {
                    files.addAll(captureFilesIn(p));
                } catch (IOException e) {
                    CaptureEntry bad = new CaptureEntry(String.valueOf(p.getFileName()), Optional.of(p));
                    bad.error = "folder cannot be read: " + e.getMessage();
                    captureList.getItems().add(bad);
                }
            } else files.add(p);
        }
        if (files.isEmpty()) return;
        List<CaptureEntry> entries = new ArrayList<>();
        for (Path f : files) {
            CaptureEntry e = new CaptureEntry(String.valueOf(f.getFileName()), Optional.of(f));
            e.calibration = calibration;
            entries.add(e);
        }
        captureList.getItems().addAll(entries);
        record Opened(Object captureOrError, Optional<BenchManifest.Entry> notes, String notesSource) {}
        List<String> notesErrors = new ArrayList<>();
        Task<List<Opened>> t = new Task<>() {
            @Override protected List<Opened> call() {
                java.util.Map<Path, Optional<BenchManifest>> manifests = new java.util.HashMap<>();
                List<Opened> out = new ArrayList<>();
                for (int i = 0; i < entries.size(); i++) {
                    if (isCancelled()) break;
                    CaptureEntry en = entries.get(i);
                    updateMessage("Opening " + en.name + "…");
                    updateProgress(i, entries.size());
                    Path file = en.path.get().toAbsolutePath();
                    Optional<BenchManifest.Entry> notes = notesFor(file, manifests, notesErrors);
                    String source = notes.isPresent() ? BenchManifest.FILE_NAME + " in " + file.getParent().getFileName() : "";
                    Calibration cal = notes.map(Calibration::of).orElse(en.calibration);
                    try {
                        Capture early = earlyStart == null ? null : earlyStart.captureFor(en.path.get(), cal);
                        out.add(new Opened(early != null ? early : backend.open(en.path.get(), cal), notes, source));
                    } catch (Exception e) {
                        out.add(new Opened(oneLine(e), notes, source));
                    }
                }
                return out;
            }
        };
        t.setOnSucceeded(e -> {
            List<Opened> r = t.getValue();
            for (int i = 0; i < r.size(); i++) {
                CaptureEntry en = entries.get(i);
                Opened o = r.get(i);
                if (o.notes().isPresent()) applyNotes(en, o.notes().get(), o.notesSource());
                if (o.captureOrError() instanceof Capture c) {
                    en.capture = c;
                    settleChannels(en, o.notes());
                } else en.error = (String) o.captureOrError();
            }
            captureList.refresh();
            long failed = entries.stream().filter(CaptureEntry::failed).count();
            statusText.setText("Opened " + (entries.size() - failed) + " of " + entries.size() + " file(s)"
                    + (failed > 0 ? "; " + failed + " could not be read (see the list)" : "")
                    + (notesErrors.isEmpty() ? "" : "; calibration notes not used: " + String.join("; ", notesErrors)));
            if (!notesErrors.isEmpty()) importError.setText("Calibration notes not used: " + String.join("; ", notesErrors));
            CaptureEntry first = entries.stream().filter(x -> !x.failed()).findFirst().orElse(entries.get(0));
            if (captureList.getSelectionModel().getSelectedItem() == first) onSelect(first);
            else captureList.getSelectionModel().select(first);
            afterNextPulse(this::analyzeAllForSweep);   // the chosen capture is drawn first
        });
        run(t, "Opening files");
    }

    /** The capture files of a folder, in the order the workbench lists them. */
    static List<Path> captureFilesIn(Path folder) throws IOException {
        try (Stream<Path> s = Files.list(folder)) {
            return s.filter(f -> Files.isRegularFile(f) && isCaptureName(f)).sorted(Comparator.comparing(Path::toString)).toList();
        }
    }

    /**
     * The rule of a file's folder notes that names the file, if any. {@code manifests} keeps each folder's notes
     * for the next file; a notes file that cannot be read is reported once to {@code notesErrors}.
     */
    static Optional<BenchManifest.Entry> notesFor(Path file, java.util.Map<Path, Optional<BenchManifest>> manifests, List<String> notesErrors) {
        Path folder = file.toAbsolutePath().getParent();
        Optional<BenchManifest> man = manifests.computeIfAbsent(folder, d -> {
            try {
                return Optional.of(BenchManifest.forFolder(d));
            } catch (Exception ex) {
                synchronized (notesErrors) { notesErrors.add(folder.resolve(BenchManifest.FILE_NAME) + ": " + oneLine(ex)); }
                return Optional.empty();
            }
        });
        Path f = file.toAbsolutePath();
        return man.flatMap(m -> m.firstPatternFor(f).map(x -> m.entryFor(f)));
    }

    /** Takes a capture's calibration, channel roles and series from its folder's notes. */
    static void applyNotes(CaptureEntry en, BenchManifest.Entry notes, String source) {
        en.calibration = Calibration.of(notes);
        // the generator channel: reference=N or the generator in roles= (the notes' one answer, BenchManifest.Entry)
        OptionalInt gen = notes.generatorChannel();
        en.reference = gen.isPresent() ? OptionalInt.of(gen.getAsInt() - 1) : OptionalInt.empty();
        en.series = notes.series();
        en.notes = "Calibration from " + source;
    }

    /**
     * The channels of an opened capture: the notes' channel and reference (from 1) when they exist in the file;
     * with a reference and no channel, the output is the first other channel (as {@code analyze --reference} does).
     */
    static void settleChannels(CaptureEntry en, Optional<BenchManifest.Entry> notes) {
        int n = en.capture.channelCount();
        if (en.reference.isPresent() && (en.reference.getAsInt() >= n || n < 2)) en.reference = OptionalInt.empty();
        OptionalInt ch = notes.map(BenchManifest.Entry::channel).orElse(OptionalInt.empty());
        if (ch.isPresent() && ch.getAsInt() <= n) en.channel = ch.getAsInt() - 1;
        if (en.reference.isPresent() && en.channel == en.reference.getAsInt()) en.channel = en.reference.getAsInt() == 0 ? 1 : 0;
        if (en.channel >= n) en.channel = 0;
    }

    /** Adds a capture already in memory (tests, generated signals). */
    void addCapture(Capture c) {
        CaptureEntry e = new CaptureEntry(c.name(), Optional.empty());
        e.capture = c;
        captureList.getItems().add(e);
        captureList.getSelectionModel().select(e);
    }

    static boolean isCaptureName(Path f) {
        String n = f.getFileName().toString().toLowerCase(Locale.ROOT);
        return n.endsWith(".wav") || n.endsWith(".wave") || n.endsWith(".rf64") || n.endsWith(".bw64") || n.endsWith(".csv");
    }

    static String oneLine(Throwable e) {
        String m = e.getMessage();
        if (m == null || m.isBlank()) m = e.getClass().getSimpleName();
        int nl = m.indexOf('\n');
        return nl >= 0 ? m.substring(0, nl) : m;
    }

    // ---- selection, settings, analysis -----------------------------------------------------------

    CaptureEntry selected() { return captureList.getSelectionModel().getSelectedItem(); }

    private void onSelect(CaptureEntry e) {
        updatingControls = true;
        try {
            importError.setText(e != null && e.failed() ? e.name + ": " + e.error : "");
            List<String> notes = new ArrayList<>();
            if (e != null && !e.notes.isEmpty()) notes.add(e.notes);
            if (e != null && e.capture != null) notes.addAll(e.capture.warnings());
            captureWarnings.setText(String.join("\n", notes));
            calibrationError.setText("");
            if (e == null) { showNothing(); return; }
            fullScaleField.setText(text(e.calibration.fullScaleVolts()));
            probeField.setText(text(e.calibration.probeRatio()));
            loadField.setText(text(e.calibration.loadOhms()));
            channelChoice.getItems().clear();
            List<String> refs = new ArrayList<>(List.of("none"));
            if (e.capture != null) {
                for (int i = 1; i <= e.capture.channelCount(); i++) { channelChoice.getItems().add(i); refs.add(Integer.toString(i)); }
                channelChoice.setValue(e.channel + 1);
            }
            String ref = e.reference.isPresent() && refs.contains(Integer.toString(e.reference.getAsInt() + 1))
                    ? Integer.toString(e.reference.getAsInt() + 1) : "none";
            // value first cleared, then the items, then the value: a ComboBox whose items are replaced under its
            // value shows a blank box
            referenceChoice.setValue(null);
            referenceChoice.getItems().setAll(refs);
            referenceChoice.setValue(ref);
        } finally {
            updatingControls = false;
        }
        if (e.failed()) { show(ViewData.failed(e.name, "Could not open " + e.name + ": " + e.error)); return; }
        if (e.capture == null) { showNothing(); statusText.setText("Opening " + e.name + "…"); return; }
        if (e.data != null) show(e.data);   // results are dropped when settings or calibration change
        if (e.data != null && e.data.full()) return;
        analyzeSelected();
    }

    private static String text(OptionalDouble v) {
        if (v.isEmpty()) return "";
        double d = v.getAsDouble();
        return d == Math.rint(d) && Math.abs(d) < 1e12 ? Long.toString((long) d) : Double.toString(d);
    }

    private void applyCalibration(boolean toAll) {
        CaptureEntry sel = selected();
        if (sel == null) return;
        Calibration cal;
        try {
            cal = new Calibration(Calibration.parseField("Full scale", fullScaleField.getText()),
                    Calibration.parseField("Probe ratio", probeField.getText()), Calibration.parseField("Load", loadField.getText()));
        } catch (IllegalArgumentException ex) {
            calibrationError.setText(ex.getMessage());
            return;
        }
        calibrationError.setText("");
        List<CaptureEntry> targets = toAll ? List.copyOf(captureList.getItems()) : List.of(sel);
        for (CaptureEntry e : targets) {
            e.calibration = new Calibration(cal.fullScaleVolts(), cal.probeRatio(), cal.loadOhms(), e.calibration.sampleRateHz());
            e.data = null;
            if (!e.notes.isEmpty()) e.notes = "Calibration entered here; channel roles and series from the notes";
        }
        List<CaptureEntry> files = targets.stream().filter(e -> e.path.isPresent()).toList();
        if (files.isEmpty()) { analyzeSelected(); if (toAll) analyzeAllForSweep(); return; }
        Task<List<Object>> t = new Task<>() {
            @Override protected List<Object> call() {
                List<Object> out = new ArrayList<>();
                for (CaptureEntry e : files) {
                    try { out.add(backend.open(e.path.get(), e.calibration)); } catch (Exception ex) { out.add(oneLine(ex)); }
                }
                return out;
            }
        };
        t.setOnSucceeded(x -> {
            for (int i = 0; i < files.size(); i++) {
                CaptureEntry e = files.get(i);
                if (t.getValue().get(i) instanceof Capture c) { e.capture = c; e.error = ""; }
                else { e.capture = null; e.error = (String) t.getValue().get(i); }
            }
            captureList.refresh();
            onSelect(selected());
            analyzeAllForSweep();
        });
        run(t, "Reopening with the new calibration");
    }

    private void changeSettings(UiSettings s) {
        if (s.equals(settings)) return;
        settings = s;
        for (CaptureEntry e : captureList.getItems()) e.data = null;
        analyzeSelected();
    }

    UiSettings settings() { return settings; }

    /** Analyses the selected capture in the background, replacing any analysis still running. */
    void analyzeSelected() {
        CaptureEntry e = selected();
        if (e == null || e.capture == null) return;
        Capture c = e.capture;
        int ch = e.channel;
        Calibration cal = e.calibration;
        UiSettings s = settings.withReference(e.reference);
        EarlyAnalysis early = earlyStart;
        earlyStart = null;   // one use: the first capture shown
        java.util.concurrent.Future<ViewData> done = early == null ? null : early.resultFor(c, ch, cal, s).orElse(null);
        if (early != null && done == null) early.cancel();
        if (done != null && done.isDone()) {
            try {
                analysed(e, done.get());   // ready: shown in this turn, no task needed
                return;
            } catch (java.util.concurrent.ExecutionException | java.util.concurrent.CancellationException | InterruptedException x) {
                done = null;   // analysed again below, and a failure reported as usual
            }
        }
        java.util.concurrent.Future<ViewData> pending = done;
        Task<ViewData> t = new Task<>() {
            @Override protected ViewData call() throws InterruptedException {
                updateMessage("Analysing " + e.name + "…");
                if (pending != null) {
                    try {
                        return pending.get();
                    } catch (java.util.concurrent.ExecutionException x) {
                        if (x.getCause() instanceof RuntimeException r) throw r;
                        if (x.getCause() instanceof Error r) throw r;
                        throw new IllegalStateException(x.getCause());
                    } catch (InterruptedException x) {
                        pending.cancel(true);
                        throw x;
                    }
                }
                return backend.analyze(c, ch, cal, s, f -> updateProgress(f, 1), this::isCancelled);
            }
        };
        t.setOnSucceeded(x -> analysed(e, t.getValue()));
        t.setOnFailed(x -> {
            ViewData d = ViewData.failed(e.name, "Analysis failed: " + oneLine(t.getException()));
            if (selected() == e) show(d);
            statusText.setText(d.notMeasured().get());
        });
        run(t, "Analysing " + e.name);
    }

    private void analysed(CaptureEntry e, ViewData d) {
        e.data = d;
        if (selected() == e) show(e.data);
        statusText.setText(e.data.notMeasured().map(r -> e.name + ": " + r).orElse(e.name + ": analysed"));
        refreshSweep();
    }

    /** Analyses every opened capture that has no result yet (for the level sweep), one after another. */
    void analyzeAllForSweep() {
        List<CaptureEntry> todo = captureList.getItems().stream().filter(x -> x.capture != null && x.data == null && x != selected()).toList();
        if (todo.isEmpty()) return;
        UiSettings s = settings;
        Thread th = new Thread(() -> {
            for (CaptureEntry e : todo) {
                ViewData d;
                try {
                    d = backend.analyze(e.capture, e.channel, e.calibration, s.withReference(e.reference), f -> {}, () -> false);
                } catch (RuntimeException ex) {
                    continue;
                }
                ViewData light = d.light();
                javafx.application.Platform.runLater(() -> {
                    if (e.data == null && settings.equals(s)) { e.data = selected() == e ? d : light; refreshSweep(); }
                });
            }
        }, "outstage-sweep");
        th.setDaemon(true);
        th.start();
    }

    private void run(Task<?> t, String what) {
        if (running != null && running.isRunning()) running.cancel();
        running = t;
        progress.progressProperty().bind(t.progressProperty());
        progress.setVisible(true);
        cancelButton.setDisable(false);
        statusText.setText(what + "…");
        ChangeListener<Worker.State> done = (o, a, b) -> {
            if (b == Worker.State.SUCCEEDED || b == Worker.State.FAILED || b == Worker.State.CANCELLED) {
                if (running == t) {
                    progress.progressProperty().unbind();
                    progress.setVisible(false);
                    cancelButton.setDisable(true);
                    running = null;
                }
                if (b == Worker.State.CANCELLED) statusText.setText(what + ": cancelled");
            }
        };
        t.stateProperty().addListener(done);
        Thread th = new Thread(t, "outstage-analysis");
        th.setDaemon(true);
        th.start();
    }

    /** True while a background task runs (tests wait on it). */
    boolean busy() { return running != null; }

    // ---- showing ----------------------------------------------------------------------------------

    private void showNothing() {
        String m = "Open a capture to see its waveform, residual and figures.";
        for (WorkbenchView v : allViews()) v.clear(m);
        figures.clear();
        refreshSweep();
    }

    void show(ViewData d) {
        for (WorkbenchView v : allViews()) v.show(d);
        figures.show(d);
        Runnable r = afterFirstRender;
        if (r != null && d.notMeasured().isEmpty()) {
            afterFirstRender = null;
            afterNextPulse(r);   // the figures are in the views; the next layout pulse draws them
        }
    }

    /** Runs {@code r} once on the FX thread after the next layout pulse (at once when the pane is in no scene). */
    private void afterNextPulse(Runnable r) {
        javafx.scene.Scene sc = getScene();
        if (sc == null) { r.run(); return; }
        Runnable[] l = new Runnable[1];
        l[0] = () -> { sc.removePostLayoutPulseListener(l[0]); r.run(); };
        sc.addPostLayoutPulseListener(l[0]);
        javafx.application.Platform.requestNextPulse();
    }

    private Runnable afterFirstRender;

    /** Runs {@code r} once, on the FX thread, after the first analysed capture has been drawn. */
    void afterFirstRender(Runnable r) { afterFirstRender = r; }

    /** The level sweep (see {@link LevelSweepView} for which captures it is over). */
    void refreshSweep() {
        sweepView.refresh(List.copyOf(captureList.getSelectionModel().getSelectedItems()), List.copyOf(captureList.getItems()), selected());
    }

    // ---- export -----------------------------------------------------------------------------------

    private void exportByDialog(String kind) {
        ChartCanvas c = currentChart;
        if (c.spec().isEmpty()) { statusText.setText("Nothing to export: this chart is empty"); return; }
        FileChooser fc = new FileChooser();
        fc.setTitle("Export chart");
        fc.setInitialFileName(ChartExport.safeName(c.spec().get().title()) + "." + kind);
        File f = fc.showSaveDialog(getScene().getWindow());
        if (f == null) return;
        try {
            export(c, kind, f.toPath());
            statusText.setText("Wrote " + f);
        } catch (IOException | RuntimeException ex) {
            statusText.setText("Could not write " + f + ": " + oneLine(ex));
        }
    }

    /** Writes the chart as PNG, SVG or CSV ({@link ChartExport}). */
    static void export(ChartCanvas c, String kind, Path file) throws IOException { ChartExport.export(c, kind, file); }
}

package org.outstage.ui;

import java.nio.file.Path;
import java.util.List;
import java.util.Optional;
import javafx.application.Application;
import javafx.scene.Scene;
import javafx.scene.control.Alert;
import javafx.scene.control.ButtonType;
import javafx.scene.control.CheckBox;
import javafx.scene.control.Label;
import javafx.scene.layout.VBox;
import javafx.stage.Stage;
import javafx.stage.Window;

/**
 * The Outstage workbench (JavaFX Application). Start it through {@link WorkbenchLauncher}; the files to
 * open come as the application's parameters.
 */
public final class Workbench extends Application {

    /** The backend the workbench uses in this build. */
    static Backend defaultBackend() { return new AnalyzerBackend(); }

    /** The stage model in this build, if any. */
    static Optional<StageModelAdapter> defaultModel() { return Optional.of(new ModelStageAdapter()); }

    /**
     * Calibration of the bundled sample session: the invented bench of tools/GenerateSampleCaptures.java
     * records through a 1:20 divider with full scale at 40 V peak, into an 8 Ω load.
     */
    static final Calibration SAMPLE_SESSION = new Calibration(java.util.OptionalDouble.of(40), java.util.OptionalDouble.empty(),
            java.util.OptionalDouble.of(8));

    /** Raw parameter that marks the bundled sample session (added by {@link WorkbenchLauncher}). */
    static final String SAMPLE_FLAG = "--outstage-sample-session";

    /**
     * Raw parameter (added by {@link WorkbenchLauncher} for {@code gui --exit-after-first-render}): close the workbench
     * once the first capture is drawn, after printing the time since the JVM started. For smoke tests of an
     * installed image and for measuring a cold start.
     */
    static final String EXIT_FLAG = "--outstage-exit-after-first-render";

    /** Builds the window content (also used by tests and the screenshot tool). */
    static WorkbenchPane createPane() {
        return new WorkbenchPane(defaultBackend(), new TransferPanel(defaultModel()));
    }

    private WorkbenchPane pane;

    /** The first capture's early open and analysis, started by {@link WorkbenchLauncher} before the toolkit. */
    static volatile EarlyAnalysis early;

    @Override
    public void stop() {
        if (pane != null) pane.shutdown();   // no playback outlives the window
    }

    @Override
    public void start(Stage stage) {
        WorkbenchLauncher.toolkitStarted();
        WorkbenchPane pane = createPane();
        this.pane = pane;
        List<String> raw = getParameters().getRaw();
        boolean sample = raw.contains(SAMPLE_FLAG);
        boolean exitAfterFirstRender = raw.contains(EXIT_FLAG);
        List<Path> files = raw.stream().filter(a -> !a.equals(SAMPLE_FLAG) && !a.equals(EXIT_FLAG)).map(Path::of).toList();
        EarlyAnalysis e = early;
        early = null;
        if (e != null) pane.adopt(e);
        // the files open in the background while the window shows (their results come back on this thread after show())
        if (!files.isEmpty()) pane.openPaths(files, sample ? SAMPLE_SESSION : Calibration.NONE);
        Scene scene = new Scene(pane, 1360, 820);
        stage.setTitle("Outstage workbench");
        stage.setScene(scene);
        stage.show();
        if (exitAfterFirstRender) {
            pane.afterFirstRender(() -> {
                long ms = System.currentTimeMillis() - java.lang.management.ManagementFactory.getRuntimeMXBean().getStartTime();
                System.err.println("outstage: workbench first render " + ms + " ms after the JVM started");
                System.err.flush();
                javafx.application.Platform.exit();
            });
        }
        if (!exitAfterFirstRender && !Cautions.dismissed(Cautions.dismissalFile())) showCautions(stage, true);
    }

    /** Shows the cautions; on first start a check box lets the user stop it appearing at start-up. */
    static void showCautions(Window owner, boolean firstStart) {
        Alert a = new Alert(Alert.AlertType.WARNING, "", ButtonType.OK);
        a.initOwner(owner);
        a.setTitle(Cautions.TITLE);
        a.setHeaderText(Cautions.TITLE);
        Label text = new Label(Cautions.TEXT);
        text.setWrapText(true);
        text.setMaxWidth(560);
        text.setId("cautionsText");
        CheckBox dontShow = new CheckBox("Do not show this at start-up again (it stays in the Help menu)");
        VBox box = firstStart ? new VBox(12, text, dontShow) : new VBox(12, text);
        a.getDialogPane().setContent(box);
        a.getDialogPane().setPrefWidth(620);
        a.showAndWait();
        if (firstStart && dontShow.isSelected()) Cautions.rememberDismissal(Cautions.dismissalFile());
    }
}

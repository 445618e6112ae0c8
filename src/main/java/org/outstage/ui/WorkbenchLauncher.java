package org.outstage.ui;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Optional;
import javafx.application.Application;

/**
 * Plain entry point for the workbench (not an Application subclass, so it can be the target of a
 * command in the application jar). With no files it opens the bundled sample session.
 */
public final class WorkbenchLauncher {
    private WorkbenchLauncher() {}

    /**
     * JavaFX logs "Unsupported JavaFX configuration: classes were loaded from 'unnamed module'" at every start when its
     * classes come from the class path, as they do from our application jar and image. That is how the workbench is
     * built, tested and shipped, and the line would only alarm a user at the bench, so JavaFX's logger reports errors
     * only while the toolkit starts ({@link #toolkitStarted()} gives it back its level; its other warnings, such as
     * those of style sheets, stay). Held here: a logger nobody references may be collected, and its level with it.
     */
    private static final java.util.logging.Logger JAVAFX_LOG = java.util.logging.Logger.getLogger("javafx");

    /** Called by the workbench once the toolkit runs: JavaFX's warnings are reported again. */
    static void toolkitStarted() { JAVAFX_LOG.setLevel(null); }

    /** Starts the workbench and returns when its window closes. */
    public static void launch(String[] files) { launch(files, false); }

    /**
     * Starts the workbench and returns when its window closes; with {@code exitAfterFirstRender} it closes itself once
     * the first capture is drawn (smoke tests, cold-start timing).
     */
    public static void launch(String[] files, boolean exitAfterFirstRender) {
        String[] args = files;
        if (files.length == 0) args = sampleSession().map(p -> new String[] {p.toString(), Workbench.SAMPLE_FLAG}).orElse(new String[0]);
        if (exitAfterFirstRender) {
            args = Arrays.copyOf(args, args.length + 1);
            args[args.length - 1] = Workbench.EXIT_FLAG;
        }
        // the second core opens and analyses the first capture while the toolkit starts (the window takes the result);
        // with nothing to open, a synthetic capture warms the analysis path up instead
        Optional<Path> first = firstCapture(args);
        if (first.isPresent()) {
            Calibration fallback = Arrays.asList(args).contains(Workbench.SAMPLE_FLAG) ? Workbench.SAMPLE_SESSION : Calibration.NONE;
            Workbench.early = EarlyAnalysis.start(Workbench.defaultBackend(), first.get(), fallback, UiSettings.DEFAULT);
        } else Warmup.start();
        JAVAFX_LOG.setLevel(java.util.logging.Level.SEVERE);
        Application.launch(Workbench.class, Arrays.copyOf(args, args.length));
    }

    /** The capture the window will show first: the first file named, or the first capture file of the first folder. */
    static Optional<Path> firstCapture(String[] args) {
        for (String a : args) {
            if (a.startsWith("--outstage-")) continue;
            Path p = Path.of(a);
            if (Files.isRegularFile(p)) return Optional.of(p);
            if (Files.isDirectory(p)) {
                try {
                    return WorkbenchPane.captureFilesIn(p).stream().findFirst();
                } catch (java.io.IOException e) {
                    return Optional.empty();
                }
            }
            return Optional.empty();
        }
        return Optional.empty();
    }

    /** The sample-captures folder under {@code $OUTSTAGE_HOME} or the working directory, if it exists. */
    public static Optional<Path> sampleSession() {
        String home = System.getenv("OUTSTAGE_HOME");
        for (Path base : new Path[] {home == null || home.isBlank() ? null : Path.of(home), Path.of("").toAbsolutePath()}) {
            if (base == null) continue;
            Path p = base.resolve("sample-captures");
            if (Files.isDirectory(p)) return Optional.of(p);
        }
        return Optional.empty();
    }
}

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
        Warmup.start();   // the analysis path warms up on the second core while the toolkit starts
        Application.launch(Workbench.class, Arrays.copyOf(args, args.length));
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

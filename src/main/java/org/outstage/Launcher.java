package org.outstage;

import org.outstage.cli.OutstageCommand;

/**
 * Main class of the application jar. It does not extend a JavaFX class, so the command-line path never
 * loads JavaFX; the workbench is started by the {@code gui} command (and by no arguments when a display
 * exists) through {@code org.outstage.ui.Workbench}.
 */
public final class Launcher {
    private Launcher() {}

    public static void main(String[] args) {
        System.exit(OutstageCommand.run(args));
    }
}

package org.outstage;

import org.outstage.cli.OutstageCommand;

/**
 * Main class of the application jar. It does not extend a JavaFX class, so the command-line path never
 * loads JavaFX. With no arguments it runs the main job on the bundled sample session: the workbench when a
 * display exists ({@code gui}), otherwise the analysis printed and the report written ({@code bench}); if
 * the workbench cannot start, it falls back to the latter.
 */
public final class Launcher {
    private Launcher() {}

    public static void main(String[] args) {
        if (args.length == 0) {
            if (hasDisplay()) {
                int code = OutstageCommand.run(new String[] {"gui"});
                if (code == OutstageCommand.EXIT_OK) System.exit(code);
                System.err.println("outstage: analysing the sample session on the command line instead");
            }
            System.exit(OutstageCommand.run(new String[] {"bench"}));
        }
        System.exit(OutstageCommand.run(args));
    }

    /** Whether a display exists for the workbench (and java.awt.headless is not forced). */
    static boolean hasDisplay() {
        return hasDisplay(System.getProperty("os.name", ""), System.getenv(), Boolean.getBoolean("java.awt.headless"));
    }

    /**
     * Windows and macOS always have their desktop (a session without one, such as a service, runs headless); other
     * systems have one when an X11 or Wayland display is set.
     */
    static boolean hasDisplay(String osName, java.util.Map<String, String> env, boolean headless) {
        if (headless) return false;
        if (osName.startsWith("Windows") || osName.startsWith("Mac")) return true;
        String x = env.get("DISPLAY"), w = env.get("WAYLAND_DISPLAY");
        return (x != null && !x.isBlank()) || (w != null && !w.isBlank());
    }
}

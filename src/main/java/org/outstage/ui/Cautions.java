package org.outstage.ui;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * The cautions page: shown on first start (until dismissed, remembered in a small file) and from the Help
 * menu. Our own words for the hazards of the bench.
 */
final class Cautions {
    private Cautions() {}

    static final String TITLE = "Before you measure";

    static final String TEXT = String.join("\n\n",
            "Amplifiers carry mains voltage inside, and their supply rails can exceed ±60 V. Filter capacitors stay charged after "
                    + "the plug is pulled: discharge them and measure before you touch.",
            "Heatsinks and output devices get hot enough to burn. Output transistors can fail short and take the load, the "
                    + "emitter resistors or the speaker with them.",
            "A soundcard input is destroyed by a power amplifier's output. Always connect through an attenuator (divider) and "
                    + "check the level before it reaches the card.",
            "A bridged output has no side at ground. A grounded instrument (scope, soundcard) across it short-circuits the "
                    + "amplifier.",
            "Setting the bias can start thermal runaway. Start from the lowest setting, use a current-limited or bulb-limited "
                    + "supply, raise the current slowly and watch the temperature.",
            "Follow local electrical codes and qualified service practice. Outstage reports measured figures; they do not "
                    + "certify that an amplifier is safe.");

    /** Where the dismissal is remembered: {@code $OUTSTAGE_CONFIG} or {@code ~/.outstage}. */
    static Path dismissalFile() {
        String dir = System.getProperty("outstage.config", System.getenv("OUTSTAGE_CONFIG"));
        Path base = dir != null && !dir.isBlank() ? Path.of(dir) : Path.of(System.getProperty("user.home"), ".outstage");
        return base.resolve("cautions-read");
    }

    static boolean dismissed(Path file) { return Files.isRegularFile(file); }

    /** Remembers the dismissal; a failure to write only means the page shows again next time. */
    static void rememberDismissal(Path file) {
        try {
            Files.createDirectories(file.getParent());
            Files.writeString(file, "cautions read\n");
        } catch (IOException | RuntimeException e) {
            // not fatal: the cautions appear again on the next start
        }
    }
}

package org.outstage.ui;

import org.outstage.report.ReportDocument;
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

    /** The same cautions as every report ({@link ReportDocument#CAUTIONS}), one paragraph each. */
    static final String TEXT = String.join("\n\n", ReportDocument.CAUTIONS);

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

package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.outstage.Launcher;

/** Runs the command line in a child JVM (this test run's class path) and returns the JVM's own class-loading log. */
final class ChildJvm {
    private ChildJvm() {}

    /** The lines of {@code -Xlog:class+load} of one run with these arguments, written below {@code dir}; the run must exit 0. */
    static List<String> classLoadLog(Path dir, String... args) throws Exception {
        Path log = dir.resolve("classes-" + System.nanoTime() + ".log");
        List<String> cmd = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-Xlog:class+load=info:file=" + log, "-Djava.awt.headless=true", "-XX:TieredStopAtLevel=1",
                "-cp", System.getProperty("java.class.path"), Launcher.class.getName()));
        cmd.addAll(List.of(args));
        Process p = new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(ProcessBuilder.Redirect.DISCARD).start();
        assertTrue(p.waitFor(120, TimeUnit.SECONDS));
        assertEquals(0, p.exitValue(), String.join(" ", args));
        return Files.readAllLines(log);
    }
}

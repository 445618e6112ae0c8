package org.outstage;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeFalse;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The JVM options both launchers choose (tools/launch-options.bash, sourced by tools/outstage and by the installed
 * image's bin/outstage): chosen by the work as documented, accepted by this JVM, and silent on stdout. A mistyped
 * option stops every start; a compiler command without {@code quiet} before it prints a line into the JSON.
 */
class LaunchOptionsTest {
    private static final Path RULES = Path.of("tools", "launch-options.bash");

    /** The options the rules append for these command-line arguments, one per element (DISPLAY unset). */
    private static List<String> options(String... args) throws IOException, InterruptedException {
        List<String> cmd = new ArrayList<>(List.of("bash", "-c",
                "source \"$0\"; jvm=(); outstage_mode \"$@\"; outstage_jvm_options \"$mode\" \"$@\"; echo \"mode=$mode\"; printf '%s\\n' \"${jvm[@]}\"",
                RULES.toString()));
        cmd.addAll(List.of(args));
        ProcessBuilder pb = new ProcessBuilder(cmd).redirectErrorStream(true);
        pb.environment().remove("DISPLAY");
        pb.environment().remove("WAYLAND_DISPLAY");
        Process p = pb.start();
        String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        assertTrue(p.waitFor(30, TimeUnit.SECONDS));
        assertEquals(0, p.exitValue(), out);
        return out.lines().toList();
    }

    private static boolean windows() {
        return System.getProperty("os.name", "").startsWith("Windows");
    }

    @Test
    void commandLine_smallCapturesGetTheClientCompiler_liveKeepsBoth() throws Exception {
        assumeFalse(windows(), "the rules are bash (Windows runs tools/outstage.cmd)");
        List<String> analyze = options("analyze", "--json", "sample-captures/da60-level-020W.wav");
        assertEquals("mode=cli", analyze.get(0));
        assertTrue(analyze.contains("-XX:TieredStopAtLevel=1"), analyze.toString());
        List<String> live = options("live", "--seconds", "1");
        assertFalse(live.contains("-XX:TieredStopAtLevel=1"), live.toString());
        assertEquals("mode=gui", options("gui").get(0));
        assertEquals("mode=cli", options().get(0), "no command and no display: the bench job");
    }

    /** More than 256 MB of captures in one run keep both compilers; the sizes of all the files are summed. */
    @Test
    void largeBatch_keepsBothCompilers_bySummedSize(@TempDir Path dir) throws Exception {
        assumeFalse(windows(), "the rules are bash (Windows runs tools/outstage.cmd)");
        Path a = dir.resolve("a.wav"), b = dir.resolve("b b.wav");   // sparse: the size is what counts, not the blocks
        for (Path f : List.of(a, b)) {
            try (java.io.RandomAccessFile r = new java.io.RandomAccessFile(f.toFile(), "rw")) {
                r.setLength(150L * 1024 * 1024);
            }
        }
        assertTrue(options("analyze", a.toString()).contains("-XX:TieredStopAtLevel=1"), "150 MB: client compiler");
        List<String> both = options("analyze", "--json", a.toString(), b.toString(), "missing.wav");
        assertFalse(both.contains("-XX:TieredStopAtLevel=1"), "300 MB in two files: both compilers " + both);
    }

    @Test
    void compilerCommands_comeAfterQuiet() throws Exception {
        assumeFalse(windows(), "the rules are bash (Windows runs tools/outstage.cmd)");
        List<String> o = options("analyze", "x.wav");
        int quiet = o.indexOf("-XX:CompileCommand=quiet");
        assertTrue(quiet > 0, o.toString());
        for (int i = 0; i < o.size(); i++)
            if (o.get(i).startsWith("-XX:CompileCommand=") && i != quiet) assertTrue(i > quiet, o.get(i) + " before quiet");
    }

    /** This JVM starts with every option the rules choose, and `--version` prints its one line and nothing else. */
    @Test
    void theChosenOptions_startThisJvm_andLeaveStdoutClean(@TempDir Path dir) throws Exception {
        assumeFalse(windows(), "the rules are bash (Windows runs tools/outstage.cmd)");
        for (String[] args : new String[][] {{"analyze", "x.wav"}, {"live"}, {"gui"}}) {
            List<String> all = options(args), o = all.subList(1, all.size());   // after the mode line
            List<String> cmd = new ArrayList<>();
            cmd.add(Path.of(System.getProperty("java.home"), "bin", "java").toString());
            cmd.addAll(o);
            cmd.addAll(List.of("-cp", System.getProperty("java.class.path"), "org.outstage.Launcher", "--version"));
            Path err = dir.resolve("err.txt");
            Process p = new ProcessBuilder(cmd).redirectError(err.toFile()).start();
            String out = new String(p.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
            assertTrue(p.waitFor(60, TimeUnit.SECONDS));
            assertEquals(0, p.exitValue(), String.join(" ", o) + ": " + Files.readString(err));
            assertEquals("outstage 0.1.0\n", out, "stdout with " + String.join(" ", o));
        }
    }
}

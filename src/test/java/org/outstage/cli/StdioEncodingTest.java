package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.Charset;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.outstage.Launcher;

/**
 * What the commands print in the POSIX locale, where the platform's encoding is plain ASCII: UTF-8 (the encoding
 * RFC 8259 §8.1 requires of JSON), not a "?" for every "±". Checked on a child JVM started with that encoding.
 */
class StdioEncodingTest {

    @Test
    void asciiPlatform_printsUtf8_otherPlatformsKeepTheirs() {
        assertEquals(StandardCharsets.UTF_8, OutstageCommand.stdioCharset(StandardCharsets.US_ASCII));
        assertEquals(StandardCharsets.ISO_8859_1, OutstageCommand.stdioCharset(StandardCharsets.ISO_8859_1));
        assertEquals(StandardCharsets.UTF_8, OutstageCommand.stdioCharset(StandardCharsets.UTF_8));
    }

    @Test
    void posixLocale_analyzeTextAndJsonKeepThePlusMinusSign() throws Exception {
        Path wav = Path.of(System.getProperty("outstage.project.dir", "."), "sample-captures", "da60-level-020W.wav");
        for (boolean json : new boolean[] {false, true}) {
            List<String> cmd = new java.util.ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                    "-Dfile.encoding=ANSI_X3.4-1968", "-Djava.awt.headless=true", "-XX:TieredStopAtLevel=1",
                    "-cp", System.getProperty("java.class.path"), Launcher.class.getName(), "analyze", "--fs-volts", "40", "--load", "8"));
            if (json) cmd.add("--json");
            cmd.add(wav.toString());
            ProcessBuilder pb = new ProcessBuilder(cmd).redirectError(ProcessBuilder.Redirect.DISCARD);
            pb.environment().remove("LANG");
            pb.environment().remove("LC_ALL");
            pb.environment().remove("LC_CTYPE");
            Process p = pb.start();
            byte[] out = p.getInputStream().readAllBytes();
            assertTrue(p.waitFor(120, TimeUnit.SECONDS));
            assertEquals(0, p.exitValue());
            String text = new String(out, StandardCharsets.UTF_8);
            // the crossover reading's standard error is printed as "± σ": UTF-8 bytes C2 B1, not "?"
            assertTrue(text.contains("±"), (json ? "JSON" : "text") + " output lost the plus-minus sign:\n" + text);
            assertFalse(text.contains("?"), (json ? "JSON" : "text") + " output has a replaced character:\n" + text);
            assertTrue(Charset.forName("ANSI_X3.4-1968").equals(StandardCharsets.US_ASCII), "the child's platform encoding is ASCII");
        }
    }
}

package org.outstage.json;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.outstage.cli.OutstageCommand;

/**
 * Whole reports as the commands print them read back: the same values through {@link JsonText} as through the
 * earlier reader ({@link EarlierJson}), writing the tree again changes no value, and every number in the text is
 * the canonical text of the double it stands for ({@link JsonText#numberText}), so nothing is lost on the way out.
 */
class ReportRoundTripTest {
    private static final Path SAMPLES = Path.of("sample-captures");
    /** A JSON string (RFC 8259 §7), to blank out before looking for number tokens. */
    private static final Pattern STRING = Pattern.compile("\"(?:[^\"\\\\]|\\\\.)*\"");
    /** RFC 8259 §6: number = [ minus ] int [ frac ] [ exp ]. */
    private static final Pattern NUMBER = Pattern.compile("-?(?:0|[1-9][0-9]*)(\\.[0-9]+)?([eE][+-]?[0-9]+)?");

    private static String run(String... args) {
        StringWriter out = new StringWriter(), err = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(out, true), new PrintWriter(err, true)).execute(args);
        assertEquals(0, code, () -> String.join(" ", args) + ": " + err);
        return out.toString();
    }

    @Test
    @SuppressWarnings("unchecked")
    void analyzeJson_ofABundledCapture_readsBackExactly() {
        Path wav = SAMPLES.resolve("da60-level-020W.wav");
        assertTrue(Files.isRegularFile(wav), "the bundled sample captures are part of the repository: " + wav);
        String text = run("analyze", "--json", "--fs-volts", "40", "--load", "8", wav.toString());
        Map<String, Object> root = (Map<String, Object>) assertReadsBack(text);
        Map<String, Object> c = (Map<String, Object>) ((List<Object>) root.get("captures")).get(0);
        // contract keys (docs/cli.md), in the order they are written
        List<String> keys = List.copyOf(c.keySet());
        for (String k : List.of("file", "channel", "sample_rate_hz", "unit", "fundamental", "thd", "thd_n", "harmonics", "crossover", "clipping"))
            assertTrue(keys.contains(k), "missing key " + k);
        assertEquals(List.of("file", "channel", "sample_rate_hz", "unit"), keys.subList(0, 4));
        assertEquals(48000.0, c.get("sample_rate_hz"));
    }

    @Test
    void modelJson_readsBackExactly() {
        assertReadsBack(run("model", "--json"));
    }

    private static Object assertReadsBack(String text) {
        Object tree = JsonText.parse(text);
        assertEquals(EarlierJson.parse(text), tree);   // Double.equals compares bits
        assertEquals(tree, JsonText.parse(JsonText.write(tree)));
        assertEquals(tree, JsonText.parse(JsonText.pretty(tree)));
        Matcher m = NUMBER.matcher(STRING.matcher(text).replaceAll("\"\""));
        int fractional = 0;
        while (m.find()) {
            String token = m.group();
            if (m.group(1) == null && m.group(2) == null) continue;   // an integer (channel numbers, counts)
            fractional++;
            assertEquals(token, JsonText.numberText(Double.parseDouble(token)), "canonical text of " + token);
        }
        assertTrue(fractional > 20, "only " + fractional + " numbers with a fraction or exponent in\n" + text);
        return tree;
    }
}

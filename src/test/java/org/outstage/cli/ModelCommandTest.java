package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.json.JsonText;

/** {@code outstage model}: exit codes and output. */
class ModelCommandTest {
    @TempDir Path dir;

    record Run(int code, String out, String err) {}

    static Run run(String... args) {
        StringWriter o = new StringWriter(), e = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(o), new PrintWriter(e)).execute(args);
        return new Run(code, o.toString(), e.toString());
    }

    @Test
    void defaultSummary_showsTheFiguresAndMarksDefaults() {
        Run r = run("model", "--thd-levels", "1,5");
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().startsWith("Output-stage model: pair (complementary emitter-follower pair)"), r.out());
        for (String s : List.of("Vq per Re             20.00 mV", "Optimum Vq", "Clip levels", "Gain at zero", "1.00 V peak  THD", "Warnings: none"))
            assertTrue(r.out().contains(s), "missing '" + s + "' in\n" + r.out());
        assertTrue(r.out().contains("  re                 0.220000 ohm \n"), "re should be marked defaulted:\n" + r.out());
    }

    @Test
    void json_hasTheStableKeys() {
        Run r = run("model", "--topology", "cfp", "--vq-mv", "12", "--json", "--thd-levels", "2");
        assertEquals(0, r.code(), r.err());
        @SuppressWarnings("unchecked")
        Map<String, Object> j = (Map<String, Object>) JsonText.parse(r.out());
        assertEquals("cfp", j.get("topology"));
        assertEquals(12.0, (Double) j.get("vq_mv"), 1e-9);
        assertEquals(0.012 / 0.22, (Double) j.get("quiescent_current_a"), 1e-9);
        for (String k : List.of("optimum_vq_mv", "clip_positive_v", "clip_negative_v", "gain_at_zero", "thd", "warnings", "parameters"))
            assertTrue(j.containsKey(k), "missing " + k);
        assertTrue((Double) j.get("clip_positive_v") > 33 && (Double) j.get("clip_negative_v") < -33);
    }

    @Test
    void quasiSummary_restsAtZero_namesHalvesRbeSource_andHarmonicsInPercent() {
        // Issue 10 item 4. Physical invariant: global feedback holds the output at 0 V at rest; the summary reports the
        // halves' currents and the gain asymmetry as figures; harmonics in % like THD; the default Rbe's source is named.
        Run r = run("model", "--topology", "quasi", "--vq-mv", "5", "--thd-levels", "5");
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().contains("rest point     output 0.000000 V"), r.out());
        assertTrue(r.out().contains("halves at rest upper ") && r.out().contains("Gain asymmetry"), r.out());
        assertTrue(r.out().matches("(?s).*THD +[0-9.]+ %   H2 +[0-9.]+ %   H3 +[0-9.]+ %.*"), r.out());
        assertTrue(r.out().contains("Rbe: 100 ohm (default; common practice, value from memory"), r.out());
        assertTrue(r.out().contains("Optimum Vq") && r.out().contains("Flattest gain") && r.out().contains("other criterion, not advice"), r.out());
    }

    @Test
    void csv_printsVinVoutGain() {
        Run r = run("model", "--csv", "--points", "11", "--vin-max", "5", "--topology", "darlington");
        assertEquals(0, r.code(), r.err());
        String[] lines = r.out().strip().split("\n");
        assertEquals("vin,vout,gain", lines[0]);
        assertEquals(12, lines.length);
        String[] mid = lines[6].split(",");
        assertEquals(0.0, Double.parseDouble(mid[0]), 0);
        assertEquals(0.0, Double.parseDouble(mid[1]), 1e-9);
    }

    @Test
    void biasOptionsAreMutuallyExclusive_exit2() {
        Run r = run("model", "--vq-mv", "10", "--bias-v", "1.2");
        assertEquals(2, r.code());
        assertTrue(r.err().contains("mutually exclusive"), r.err());
    }

    @Test
    void impossibleParameter_exit2WithOneLine() {
        Run r = run("model", "--re", "-1");
        assertEquals(2, r.code());
        assertEquals("outstage: re=-1.0 must be > 0", r.err().strip());
    }

    @Test
    void starvedSolver_exit1WithOneLine() {
        Run r = run("model", "--max-iterations", "1", "--topology", "darlington");
        assertEquals(1, r.code(), r.out());
        assertTrue(r.err().startsWith("outstage: model: solver failure: no operating point at Vin = "), r.err());
        assertEquals(1, r.err().strip().split("\n").length);
    }

    @Test
    void help_listsTheDocumentedOptions() {
        Run r = run("model", "--help");
        assertEquals(0, r.code());
        for (String o : List.of("--topology", "--vq-mv", "--bias-v", "--iq-a", "--re", "--load", "--rails", "--beta-driver", "--beta-output",
                "--is-driver", "--is-output", "--n", "--temperature-c", "--vin-max", "--points", "--csv", "--json", "--stage", "--max-iterations"))
            assertTrue(r.out().contains(o), "help lacks " + o);
    }

    @Test
    void stageFile_readAndOverriddenByOptions() throws Exception {
        Path f = dir.resolve("bench.stage");
        Files.writeString(f, "# a fictional bench stage\ntopology = darlington\nvq_mv = 15\nre = 0.33   # ohm\nrails = 40\n");
        Run r = run("model", "--stage", f.toString(), "--rails", "45", "--json", "--thd-levels", "1");
        assertEquals(0, r.code(), r.err());
        @SuppressWarnings("unchecked")
        Map<String, Object> j = (Map<String, Object>) JsonText.parse(r.out());
        assertEquals("darlington", j.get("topology"));
        assertEquals(15.0, (Double) j.get("vq_mv"), 1e-9);
        assertTrue(r.out().contains("\"name\": \"rails\",\n      \"value\": 45"), r.out());
    }

    @Test
    void stageFileWithUnknownKey_exit2NamingFileAndLine() throws Exception {
        Path f = dir.resolve("bad.stage");
        Files.writeString(f, "topology = cfp\nbetta = 3\n");
        Run r = run("model", "--stage", f.toString());
        assertEquals(2, r.code());
        assertTrue(r.err().startsWith("outstage: " + f + " line 2: unknown key 'betta'"), r.err());
    }
}

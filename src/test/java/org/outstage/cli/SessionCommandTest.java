package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.json.JsonText;
import org.outstage.logbook.Logbook;

class SessionCommandTest {
    @TempDir Path dir;
    private AutoCloseable fake;
    String out;
    String err;

    @BeforeEach
    void install() { fake = LogbookMeasurers.install(new FakeMeasurer()); }

    @AfterEach
    void restore() throws Exception { fake.close(); }

    int run(String... args) {
        StringWriter o = new StringWriter();
        StringWriter e = new StringWriter();
        int code = OutstageCommand.commandLine(new PrintWriter(o), new PrintWriter(e)).execute(args);
        out = o.toString();
        err = e.toString();
        return code;
    }

    Path capture(String name, String body) throws Exception {
        Path p = dir.resolve(name);
        Files.writeString(p, body);
        return p;
    }

    @SuppressWarnings("unchecked")
    @Test
    void startAddShow_givesStepsAndRecommendation() throws Exception {
        String db = dir.resolve("lb.db").toString();
        assertEquals(0, run("session", "start", "--unit", "DA-60 #3", "--logbook", db, "--json"), err);
        long id = ((Double) ((Map<String, Object>) JsonText.parse(out)).get("session_id")).longValue();
        double[][] steps = {{10, 0.990}, {15, 0.994}, {20, 0.998}, {25, 1.001}, {30, 1.004}, {35, 1.008}};
        for (double[] s : steps) {
            Path c = capture("take_" + s[0] + ".txt", "f=1000\nrms=2.83\nthd=0.0011\ng0=" + s[1] + "\n");
            assertEquals(0, run("session", "add", Long.toString(id), "--bias-mv", Double.toString(s[0]), "--heatsink-c", "31",
                    "--logbook", db, "--load", "8", c.toString()), err);
            assertTrue(out.startsWith("step "), out);
        }
        assertEquals(0, run("session", "show", Long.toString(id), "--logbook", db, "--json"), err);
        Map<String, Object> show = (Map<String, Object>) JsonText.parse(out);
        List<Object> st = (List<Object>) show.get("steps");
        assertEquals(6, st.size());
        Map<String, Object> first = (Map<String, Object>) st.get(0);
        assertEquals(10.0, first.get("bias_mv"));
        assertEquals(0.990, first.get("gain_at_zero"));
        assertEquals(0.11, (Double) first.get("thd_percent"), 1e-12);
        Map<String, Object> rec = (Map<String, Object>) show.get("recommendation");
        // interpolation of the steps linearly in ln(reading) (docs/logbook.md), default band ±0.3 %: g0 = 0.997 between
        // 15 mV (0.994) and 20 mV (0.998) at 15·(20/15)^(0.003/0.004); g0 = 1.003 between 25 mV (1.001) and 30 mV (1.004)
        // at 25·(30/25)^(0.002/0.003)
        assertEquals(15 * Math.pow(20.0 / 15, 0.003 / 0.004), (Double) rec.get("bias_mv_low"), 1e-9);
        assertEquals(25 * Math.pow(30.0 / 25, 0.002 / 0.003), (Double) rec.get("bias_mv_high"), 1e-9);
        assertTrue(((String) rec.get("advice")).contains("less bias"), rec.toString());
        Path page = dir.resolve("session.html");
        assertEquals(0, run("session", "show", Long.toString(id), "--logbook", db, "--report", page.toString()), err);
        String html = Files.readString(page);
        assertTrue(html.contains("<svg") && html.contains("Crossover ratio against the bias reading") && html.contains("@media print"), html);
        assertTrue(html.contains("DA-60 #3") && html.contains("thermal runaway"));
        // the stored capture holds provenance
        try (Logbook lb = Logbook.open(Path.of(db))) {
            var m = lb.biasSteps(id).get(0).measurement().orElseThrow();
            assertEquals("8.0", m.settings().get("load"));
            assertTrue(m.defaulted().contains("bandwidth") && !m.defaulted().contains("load"));
            assertTrue(m.programVersion().startsWith("outstage "));
            assertTrue(lb.capturePath(m.capture().orElseThrow()).isPresent());
        }
    }

    @Test
    void badCapture_exit2_andNothingWritten() throws Exception {
        String db = dir.resolve("lb.db").toString();
        run("session", "start", "--unit", "DA-60", "--logbook", db);
        String id = out.trim();
        Path bad = capture("broken.wav", "garbage");
        assertEquals(2, run("session", "add", id, "--bias-mv", "20", "--logbook", db, bad.toString()));
        assertTrue(err.startsWith("outstage: ") && err.contains("broken.wav") && err.lines().count() == 1, err);
        assertEquals(2, run("session", "add", id, "--bias-mv", "20", "--logbook", db, dir.resolve("missing.wav").toString()));
        try (Logbook lb = Logbook.open(Path.of(db))) {
            assertEquals(0, lb.biasSteps(Long.parseLong(id)).size());
            try (var files = Files.list(lb.capturesDir()).filter(f -> !f.getFileName().toString().equals(".migrating.lock"))) {
                assertEquals(0, files.count());
            }
        }
    }

    @Test
    void notALogbook_exit2_fileUntouched() throws Exception {
        Path f = capture("thesis.db", "my thesis, do not overwrite");
        assertEquals(2, run("session", "list", "--logbook", f.toString()));
        assertTrue(err.contains("not an Outstage logbook"), err);
        assertEquals("my thesis, do not overwrite", Files.readString(f));
    }

    @Test
    void exportImportRoundTrip_throughCli() throws Exception {
        String a = dir.resolve("a.db").toString();
        String b = dir.resolve("b.db").toString();
        run("session", "start", "--unit", "DA-60 #4", "--logbook", a);
        String id = out.trim();
        for (int i = 0; i < 3; i++) {
            Path c = capture("t" + i + ".txt", "f=1000\ng0=" + (0.99 + 0.01 * i) + "\n");
            assertEquals(0, run("session", "add", id, "--bias-ma", Integer.toString(50 + 20 * i), "--logbook", a, c.toString()), err);
        }
        assertEquals(0, run("session", "end", id, "--logbook", a), err);
        for (String fmt : List.of("--csv", "--json")) {
            Path file = dir.resolve("export" + fmt.substring(2));
            assertEquals(0, run("session", "export", id, fmt, "--logbook", a, "-o", file.toString()), err);
            String first = Files.readString(file);
            assertEquals(0, run("session", "import", file.toString(), "--logbook", b), err);
            String newId = out.trim();
            assertEquals(0, run("session", "export", newId, fmt, "--logbook", b), err);
            assertEquals(first, out);
        }
        assertEquals(0, run("session", "list", "--logbook", b, "--json"), err);
        assertTrue(out.contains("DA-60 #4"));
    }

    @Test
    void logbookPathIsAFolder_exit2_oneLine() {
        assertEquals(2, run("session", "list", "--logbook", dir.toString()));
        assertTrue(err.contains("is a folder") && err.lines().count() == 1, err);
    }

    @Test
    void addToUnknownSession_exit2() throws Exception {
        String db = dir.resolve("lb.db").toString();
        Path c = capture("t.txt", "f=1000\n");
        assertEquals(2, run("session", "add", "42", "--bias-mv", "20", "--logbook", db, c.toString()));
        assertTrue(err.contains("no session 42"), err);
        assertFalse(out.contains("step"));
    }
}

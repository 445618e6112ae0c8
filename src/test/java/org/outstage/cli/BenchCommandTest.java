package org.outstage.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.outstage.capture.WavWriter;
import org.outstage.json.JsonText;

class BenchCommandTest {
    @TempDir Path dir;

    private void wav(String name, double a) throws Exception {
        double[] y = new double[48000];
        for (int i = 0; i < y.length; i++) {
            double x = a * Math.cos(2 * Math.PI * 1000 * i / 48000.0);
            y[i] = x + SweepCommandTest.A3 * x * x * x; // Chebyshev oracle as in SweepCommandTest
        }
        WavWriter.write(dir.resolve(name), 48000, WavWriter.Encoding.FLOAT_64, false, y);
    }

    @Test
    @SuppressWarnings("unchecked")
    void folderWithManifest_writesReportWithSeries() throws Exception {
        wav("lvl-1.wav", 0.3);
        wav("lvl-2.wav", 0.9);
        Files.writeString(dir.resolve("bench.txt"), "lvl-*.wav fs-volts=40 load=8 series=drive\n");
        Path out = dir.resolve("rep");
        CliRun r = CliRun.of("bench", dir.toString(), "--out", out.toString());
        assertEquals(0, r.exit(), r.err());
        assertTrue(r.out().contains("level series \"drive\""), r.out());
        String html = Files.readString(out.resolve("report.html"));
        assertTrue(html.startsWith("<!DOCTYPE html>"));
        assertTrue(html.contains("<svg"), "charts are inline SVG");
        assertTrue(html.contains("soundcard input"), "the cautions are in the report");
        Map<String, Object> j = (Map<String, Object>) JsonText.parse(Files.readString(out.resolve("report.json")));
        assertEquals(2, ((List<Object>) j.get("captures")).size());
        Map<String, Object> drive = (Map<String, Object>) ((Map<String, Object>) j.get("series")).get("drive");
        assertEquals(2, ((List<Object>) drive.get("points")).size());
        Map<String, Object> c0 = (Map<String, Object>) ((List<Object>) j.get("captures")).get(0);
        assertEquals("V", c0.get("unit"), "fs-volts from bench.txt applied");
        Map<String, Object> thd = (Map<String, Object>) c0.get("thd");
        assertEquals(SweepCommandTest.thd(0.3), (Double) thd.get("ratio"), 1e-6 * SweepCommandTest.thd(0.3));
    }

    @Test
    void badManifest_exits2NamingLine() throws Exception {
        wav("a.wav", 0.3);
        Files.writeString(dir.resolve("bench.txt"), "*.wav load=eight\n");
        CliRun r = CliRun.of("bench", dir.toString(), "--out", dir.resolve("rep").toString());
        assertEquals(2, r.exit());
        assertTrue(r.err().contains("bench.txt: line 1: load=eight must be a positive number"), r.err());
    }

    @Test
    void emptyFolder_exits2() {
        CliRun r = CliRun.of("bench", dir.toString());
        assertEquals(2, r.exit());
        assertTrue(r.err().contains("no captures"), r.err());
    }
}
